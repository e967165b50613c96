package bounds_test

import (
	"context"
	"errors"
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"foldbound/bounds"
)

// sumRef is the reference of a finite sum of reference families (the
// transform is linear).
func sumRef(name string, coef []float64, parts ...refFamily) refFamily {
	return refFamily{
		name: name,
		f: func(x float64) complex128 {
			var s complex128
			for i, p := range parts {
				s += complex(coef[i], 0) * p.f(x)
			}
			return s
		},
		F: func(xi float64) complex128 {
			var s complex128
			for i, p := range parts {
				s += complex(coef[i], 0) * p.F(xi)
			}
			return s
		},
	}
}

// actualWorst returns the worst actual error of the grid of step h and n
// samples over shifts across the cell and the given frequencies:
// |T - F(ξ)| = |Σ_{l≠0} F(ξ+lP)e^{i2πls/h} - h Σ_omitted f(x_k)e^{-iξx_k}|,
// exactly by the Poisson formula, without rounding.
func actualWorst(r refFamily, h float64, n, shifts int, xis []float64) float64 {
	worst := 0.0
	for _, s := range refShifts(r.center, h, n, shifts) {
		for _, xi := range xis {
			_, om := refOmitted(r, h, s, n, xi)
			worst = math.Max(worst, cmplx.Abs(refAliasAt(r, h, s, xi)-om))
		}
	}
	return worst
}

// TestPlanEnvelopeHoldsForFamilies plans from a pair of envelopes only and
// checks the plan against several concrete functions within them: their
// worst actual errors over shifts (exact, by the Poisson formula) must be
// within the plan's aliasing + truncation, and so within the tolerance.
// The envelopes are |f(x)| ≤ e^{-x²/2} and |F(ξ)| ≤ √(2π)e^{-(0.8ξ)²/2},
// which hold for the Gaussians e^{-x²/(2σ²)} with 0.8 ≤ σ ≤ 1 (F =
// σ√(2π)e^{-σ²ξ²/2}, DLMF 7.4.2, from memory), their convex combinations
// and negatives, and a slow wave packet; each is also checked against the
// envelopes on a dense grid before use.
func TestPlanEnvelopeHoldsForFamilies(t *testing.T) {
	ctx := context.Background()
	spatial := bounds.Envelope{{Decay: bounds.Gaussian, Amplitude: 1, Width: 1}}
	spectral := bounds.Envelope{{Decay: bounds.Gaussian, Amplitude: math.Sqrt(2 * math.Pi), Width: 1.25}}
	g08, g09, g1 := gaussRef(0.8, 0), gaussRef(0.9, 0), gaussRef(1, 0)
	g08.name, g09.name, g1.name = "gaussian(0.8)", "gaussian(0.9)", "gaussian(1)"
	concrete := []refFamily{
		g08, g09, g1,
		sumRef("mix", []float64{0.5, 0.5}, g08, g1),
		sumRef("neg", []float64{-1}, g09),
		wavePacketRef(0.9, 0.3),
	}
	concrete[5].name = "wavepacket(0.9,0.3)"
	for _, c := range concrete {
		for i := 0; i <= 2000; i++ {
			x := -12 + 24*float64(i)/2000
			if cmplx.Abs(c.f(x)) > math.Exp(-x*x/2)*(1+1e-12) {
				t.Fatalf("%s violates the spatial envelope at %g", c.name, x)
			}
			xi := -30 + 60*float64(i)/2000
			if cmplx.Abs(c.F(xi)) > math.Sqrt(2*math.Pi)*math.Exp(-0.32*xi*xi)*(1+1e-12) {
				t.Fatalf("%s violates the spectral envelope at %g", c.name, xi)
			}
		}
	}
	tests := []struct {
		tol  float64
		band bounds.Band
	}{
		{1e-4, bounds.Band{}},
		{1e-8, bounds.Band{}},
		{1e-12, bounds.Band{}},
		{1e-6, bounds.Band{HalfWidth: 1.5}},
	}
	for _, tt := range tests {
		plan, err := bounds.PlanGrid(ctx, bounds.PlanRequest{Spatial: spatial, Spectral: spectral, Tol: tt.tol, Band: tt.band})
		if err != nil {
			t.Fatalf("tol %g: %v", tt.tol, err)
		}
		if plan.Budget.Exact || plan.Budget.Total > tt.tol {
			t.Errorf("tol %g: certificate %+v", tt.tol, plan.Budget)
		}
		xis := []float64{0}
		if tt.band.HalfWidth > 0 {
			xis = nil
			for i := 0; i <= 24; i++ {
				xis = append(xis, -tt.band.HalfWidth+2*tt.band.HalfWidth*float64(i)/24)
			}
		}
		bound := plan.Budget.Aliasing + plan.Budget.Truncation
		for _, c := range concrete {
			act := actualWorst(c, plan.Grid.Step, int(plan.Grid.Count), 33, xis)
			if act > bound {
				t.Errorf("tol %g, %s: actual error %g exceeds the plan's aliasing + truncation %g", tt.tol, c.name, act, bound)
			}
			t.Logf("tol %g band %g, N = %d: %-22s actual %.3g, bound/actual %.3g", tt.tol, tt.band.HalfWidth, plan.Grid.Count, c.name, act, bound/act)
		}
	}
}

// TestPlanBand checks band plans: the maximum actual error over a dense set
// of frequencies of the band and shifts across the cell, computed exactly
// by the Poisson formula with the alias sums of the closed-form transforms,
// stays within the tolerance; the window meets the resolution N·h ≥ 2π/Δξ.
func TestPlanBand(t *testing.T) {
	ctx := context.Background()
	wp, err := bounds.NewWavePacket(1, 3)
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		fam  bounds.Family
		ref  refFamily
		band bounds.Band
		res  float64
		tol  float64
	}{
		{"gaussian", mustGaussian(t, 1), gaussRef(1, 0), bounds.Band{HalfWidth: 2}, 0, 1e-8},
		{"gaussian-res", mustGaussian(t, 1), gaussRef(1, 0), bounds.Band{HalfWidth: 3}, 0.05, 1e-10},
		{"wavepacket", wp, wavePacketRef(1, 3), bounds.Band{Center: 3, HalfWidth: 1}, 0, 1e-6},
	}
	for _, tt := range tests {
		plan, err := bounds.PlanGrid(ctx, bounds.PlanRequest{Family: tt.fam, Tol: tt.tol, Band: tt.band, Resolution: tt.res})
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		n := int(plan.Grid.Count)
		if tt.res > 0 && float64(n)*plan.Grid.Step < 2*math.Pi/tt.res {
			t.Errorf("%s: span %g below 2π/Δξ = %g", tt.name, float64(n)*plan.Grid.Step, 2*math.Pi/tt.res)
		}
		var xis []float64
		for i := 0; i <= 64; i++ {
			xis = append(xis, tt.band.Center-tt.band.HalfWidth+2*tt.band.HalfWidth*float64(i)/64)
		}
		act := actualWorst(tt.ref, plan.Grid.Step, n, 17, xis)
		if act > tt.tol {
			t.Errorf("%s: worst error over the band %g exceeds tol %g", tt.name, act, tt.tol)
		}
		if plan.Budget.Total > tt.tol || act > plan.Budget.Aliasing+plan.Budget.Truncation {
			t.Errorf("%s: certificate %+v, actual %g", tt.name, plan.Budget, act)
		}
		t.Logf("%s: N = %d, h = %.5g, span %.4g, certificate %.3g, worst actual %.3g", tt.name, n, plan.Grid.Step, float64(n)*plan.Grid.Step, plan.Budget.Total, act)
	}
}

// TestPlanFixedShift checks a plan for one shift: its actual error at that
// shift is within the tolerance and it needs no more samples than the plan
// for every shift.
func TestPlanFixedShift(t *testing.T) {
	ctx := context.Background()
	g := mustGaussian(t, 1)
	ref := gaussRef(1, 0)
	for _, tol := range []float64{1e-4, 1e-9, 1e-13} {
		anyPlan, err := bounds.PlanGrid(ctx, bounds.PlanRequest{Family: g, Tol: tol})
		if err != nil {
			t.Fatal(err)
		}
		fixed, err := bounds.PlanGrid(ctx, bounds.PlanRequest{Family: g, Tol: tol, FixedShift: true, Shift: 0})
		if err != nil {
			t.Fatal(err)
		}
		if fixed.AnyShift || fixed.Grid.Shift != 0 {
			t.Errorf("tol %g: fixed plan %+v", tol, fixed.Grid)
		}
		if fixed.Grid.Count > anyPlan.Grid.Count {
			t.Errorf("tol %g: fixed shift needs %d samples, any shift %d", tol, fixed.Grid.Count, anyPlan.Grid.Count)
		}
		_, om := refOmitted(ref, fixed.Grid.Step, 0, int(fixed.Grid.Count), 0)
		act := cmplx.Abs(refAliasAt(ref, fixed.Grid.Step, 0, 0) - om)
		if act > tol || fixed.Budget.Total > tol {
			t.Errorf("tol %g: actual %g, certificate %g", tol, act, fixed.Budget.Total)
		}
		t.Logf("tol %g: any shift N = %d, shift 0 N = %d", tol, anyPlan.Grid.Count, fixed.Grid.Count)
	}
}

// TestPlanErrors checks that absurd and infeasible requests get errors of
// the right kind, with messages that say what is achievable.
func TestPlanErrors(t *testing.T) {
	ctx := context.Background()
	g := mustGaussian(t, 1)
	kb, err := bounds.NewKaiserBessel(4, 10)
	if err != nil {
		t.Fatal(err)
	}
	env := bounds.Envelope{{Decay: bounds.Gaussian, Amplitude: 1, Width: 1}}
	tests := []struct {
		name string
		req  bounds.PlanRequest
		want error
		msg  string
	}{
		{"nan", bounds.PlanRequest{Family: g, Tol: math.NaN()}, bounds.ErrInvalid, "tol"},
		{"zero", bounds.PlanRequest{Family: g, Tol: 0}, bounds.ErrInvalid, "tol"},
		{"negative", bounds.PlanRequest{Family: g, Tol: -1}, bounds.ErrInvalid, "tol"},
		{"inf", bounds.PlanRequest{Family: g, Tol: math.Inf(1)}, bounds.ErrInvalid, "tol"},
		{"nothing", bounds.PlanRequest{Tol: 1e-6}, bounds.ErrInvalid, "spatial"},
		{"both", bounds.PlanRequest{Family: g, Spatial: env, Spectral: env, Tol: 1e-6}, bounds.ErrInvalid, "not both"},
		{"band", bounds.PlanRequest{Family: g, Tol: 1e-6, Band: bounds.Band{HalfWidth: -1}}, bounds.ErrInvalid, "band.half_width"},
		{"resolution", bounds.PlanRequest{Family: g, Tol: 1e-6, Resolution: math.NaN()}, bounds.ErrInvalid, "resolution"},
		{"unsummable", bounds.PlanRequest{Family: kb, Tol: 1e-6}, bounds.ErrInvalid, "unbounded"},
		{"below rounding", bounds.PlanRequest{Family: g, Tol: 1e-17}, bounds.ErrInfeasible, "smallest certifiable tolerance is about"},
		{"count limit", bounds.PlanRequest{Family: g, Tol: 1e-12, MaxCount: 8}, bounds.ErrWorkLimit, "achievable"},
	}
	for _, tt := range tests {
		_, err := bounds.PlanGrid(ctx, tt.req)
		var pe *bounds.ParamError
		if !errors.Is(err, tt.want) || !errors.As(err, &pe) || !strings.Contains(err.Error(), tt.msg) {
			t.Errorf("%s: err = %v, want %v mentioning %q", tt.name, err, tt.want, tt.msg)
		}
	}
	cancelled, cancel := context.WithCancel(ctx)
	cancel()
	if _, err := bounds.PlanGrid(cancelled, bounds.PlanRequest{Family: g, Tol: 1e-6}); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled context: %v", err)
	}
}

// TestPlanSmoothSizes checks the FFT-friendly cost model: the count is
// 7-smooth, certified, and the least 7-smooth number at or above the
// plain plan's count (for these functions the budget only falls as samples
// are added at this size).
func TestPlanSmoothSizes(t *testing.T) {
	ctx := context.Background()
	s, err := bounds.NewSech(1)
	if err != nil {
		t.Fatal(err)
	}
	for _, fam := range []bounds.Family{mustGaussian(t, 1), s} {
		for _, tol := range []float64{1e-5, 1e-10} {
			plain, err := bounds.PlanGrid(ctx, bounds.PlanRequest{Family: fam, Tol: tol})
			if err != nil {
				t.Fatal(err)
			}
			smooth, err := bounds.PlanGrid(ctx, bounds.PlanRequest{Family: fam, Tol: tol, Cost: bounds.CostModel{Sizes: bounds.SmoothSizes}})
			if err != nil {
				t.Fatal(err)
			}
			want := bounds.CostModel{Sizes: bounds.SmoothSizes}.Next(plain.Grid.Count)
			if smooth.Grid.Count != want || smooth.Budget.Total > tol {
				t.Errorf("%v tol %g: smooth N = %d (certificate %g), want %d (plain %d)", fam, tol, smooth.Grid.Count, smooth.Budget.Total, want, plain.Grid.Count)
			}
		}
	}
}

// TestSmoothCounts checks Next and Prev of the smooth sizes against a plain
// enumeration of the numbers 2^a·3^b·5^c·7^d (their definition).
func TestSmoothCounts(t *testing.T) {
	const top = 200000
	smooth := make([]bool, top+1)
	for p2 := 1; p2 <= top; p2 *= 2 {
		for p3 := p2; p3 <= top; p3 *= 3 {
			for p5 := p3; p5 <= top; p5 *= 5 {
				for p7 := p5; p7 <= top; p7 *= 7 {
					smooth[p7] = true
				}
			}
		}
	}
	c := bounds.CostModel{Sizes: bounds.SmoothSizes}
	next := 0
	for n := top; n >= 1; n-- {
		if smooth[n] {
			next = n
		}
		if next == 0 {
			continue
		}
		if got := c.Next(int64(n)); got != int64(next) {
			t.Fatalf("Next(%d) = %d, want %d", n, got, next)
		}
	}
	prev := 0
	for n := 1; n <= top; n++ {
		if smooth[n] {
			prev = n
		}
		if got := c.Prev(int64(n)); got != int64(prev) {
			t.Fatalf("Prev(%d) = %d, want %d", n, got, prev)
		}
		if c.Admissible(int64(n)) != smooth[n] {
			t.Fatalf("Admissible(%d) = %v", n, !smooth[n])
		}
	}
}

// TestCostModel checks the price formula PerSample·M + PerTransform·M·log₂M
// and its default (the sample count).
func TestCostModel(t *testing.T) {
	tests := []struct {
		c    bounds.CostModel
		m    float64
		want float64
	}{
		{bounds.CostModel{}, 100, 100},
		{bounds.CostModel{PerSample: 3}, 100, 300},
		{bounds.CostModel{PerSample: 1, PerTransform: 0.5}, 1024, 1024 + 0.5*1024*10},
		{bounds.CostModel{PerTransform: 2}, 8, 2 * 8 * 3},
	}
	for _, tt := range tests {
		if got := tt.c.Cost(tt.m); math.Abs(got-tt.want) > 1e-9*tt.want {
			t.Errorf("%+v.Cost(%g) = %g, want %g", tt.c, tt.m, got, tt.want)
		}
	}
	if err := (bounds.CostModel{PerSample: -1}).Validate("cost"); !errors.Is(err, bounds.ErrInvalid) {
		t.Errorf("negative price: %v", err)
	}
}

// TestPlanBatch checks that a batch returns, in request order, what the
// requests give one by one, and that a cancelled batch reports the
// context's error for what it did not start.
func TestPlanBatch(t *testing.T) {
	ctx := context.Background()
	s, err := bounds.NewSech(1)
	if err != nil {
		t.Fatal(err)
	}
	var reqs []bounds.PlanRequest
	for i, tol := range []float64{1e-3, 1e-6, 1e-9, 1e-12, 1e-17, 1e-4, 1e-7} {
		fam := mustGaussian(t, 1)
		if i%2 == 1 {
			fam = s
		}
		reqs = append(reqs, bounds.PlanRequest{Family: fam, Tol: tol})
	}
	got := bounds.PlanBatch(ctx, reqs, 3)
	if len(got) != len(reqs) {
		t.Fatalf("%d results for %d requests", len(got), len(reqs))
	}
	for i, r := range reqs {
		want, werr := bounds.PlanGrid(ctx, r)
		if (werr == nil) != (got[i].Err == nil) || got[i].Plan.Grid != want.Grid {
			t.Errorf("request %d: batch %+v %v, alone %+v %v", i, got[i].Plan.Grid, got[i].Err, want.Grid, werr)
		}
	}
	cancelled, cancel := context.WithCancel(ctx)
	cancel()
	for i, r := range bounds.PlanBatch(cancelled, reqs, 2) {
		if !errors.Is(r.Err, context.Canceled) {
			t.Errorf("cancelled batch, request %d: %v", i, r.Err)
		}
	}
}
