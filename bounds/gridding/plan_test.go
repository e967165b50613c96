package gridding

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"

	"foldbound/bounds"
)

// optimisedBound returns the certified one-axis bound of the kernel of
// type t and width w with its optimised shape, for N = 256 and M = σN.
func optimisedBound(t *testing.T, typ KernelType, sigma float64, w int) (Kernel, float64) {
	t.Helper()
	base := Setup{Modes: 256, Grid: int(sigma * 256)}
	theta := base.thetaMax()
	beta, _ := optimiseBeta(typ, w, func(b float64) float64 {
		return estimateSup(Kernel{Type: typ, Width: w, Beta: b}, theta)
	})
	s := base
	s.Kernel = Kernel{Type: typ, Width: w, Beta: beta}
	b, err := Bound(context.Background(), s, 1)
	if err != nil {
		t.Fatal(err)
	}
	return s.Kernel, b.Total
}

// Published anchors, all from memory, tested for their shape rather than
// their constants:
//
//   - Beatty, Nishimura & Pauly (2005): for σ = 2, Kaiser-Bessel widths
//     W ≈ 4-6 give errors of about 1e-3 down to 1e-6, with
//     β = π√(W²/σ²(σ-½)² - 0.8) near the best shape. Here: the certified
//     bound at W = 4 lies in [1e-4, 1e-2] and at W = 6 in [1e-6, 1e-4], and
//     the optimised β is within 3% of that formula for W = 5..16 and
//     σ = 1.25, 1.5, 2.
//   - Greengard & Lee (2004): the Gaussian with M_sp = 12 points on each
//     side at R = 2 gives about 12 digits, with τ = πM_sp/(M²R(R-½)). Here:
//     W = 24, σ = 2 with that τ has a certified bound in [1e-13, 1e-10],
//     and the optimised shape is within 5% of it for W = 8..32.
//   - The rates derived in doc.go, step 7 (derived here, not published):
//     the bound falls per grid cell of width by about e^{-π√(1-1/σ)} for
//     Kaiser-Bessel and e^{-π(σ-1)/(2σ-1)} for the Gaussian; measured
//     rates over W = 6..12 lie within 15% of them.
func TestPlanAnchors(t *testing.T) {
	ctx := context.Background()
	_, b4 := optimisedBound(t, KaiserBessel, 2, 4)
	_, b6 := optimisedBound(t, KaiserBessel, 2, 6)
	if b4 < 1e-4 || b4 > 1e-2 {
		t.Errorf("Kaiser-Bessel σ=2 W=4: bound %.3g, want within [1e-4, 1e-2] (Beatty et al. 2005, from memory)", b4)
	}
	if b6 < 1e-6 || b6 > 1e-4 {
		t.Errorf("Kaiser-Bessel σ=2 W=6: bound %.3g, want within [1e-6, 1e-4] (Beatty et al. 2005, from memory)", b6)
	}
	t.Logf("Kaiser-Bessel σ=2: W=4 bound %.3g, W=6 bound %.3g", b4, b6)
	for _, sigma := range []float64{1.25, 1.5, 2} {
		for _, w := range []int{5, 8, 12, 16} {
			k, _ := optimisedBound(t, KaiserBessel, sigma, w)
			pub := beattyBeta(sigma, w)
			if math.Abs(k.Beta/pub-1) > 0.03 {
				t.Errorf("Kaiser-Bessel σ=%g W=%d: optimised β = %.4g, Beatty's formula %.4g (more than 3%% apart)", sigma, w, k.Beta, pub)
			}
		}
		for _, w := range []int{8, 16, 24, 32} {
			k, _ := optimisedBound(t, Gaussian, sigma, w)
			pub := greengardLeeBeta(sigma, w)
			if math.Abs(k.Beta/pub-1) > 0.05 {
				t.Errorf("Gaussian σ=%g W=%d: optimised β = %.4g, Greengard-Lee %.4g (more than 5%% apart)", sigma, w, k.Beta, pub)
			}
		}
	}
	gl := Setup{Modes: 256, Grid: 512, Kernel: Kernel{Gaussian, 24, greengardLeeBeta(2, 24)}}
	b, err := Bound(ctx, gl, 1)
	if err != nil {
		t.Fatal(err)
	}
	if b.Total < 1e-13 || b.Total > 1e-10 {
		t.Errorf("Gaussian M_sp=12 R=2: bound %.3g, want within [1e-13, 1e-10] (Greengard & Lee 2004, from memory)", b.Total)
	}
	t.Logf("Gaussian M_sp=12, R=2, Greengard-Lee τ: bound %.3g", b.Total)
	for _, tt := range []struct {
		typ   KernelType
		sigma float64
		rate  float64
	}{
		{KaiserBessel, 2, math.Pi * math.Sqrt(0.5)},
		{KaiserBessel, 1.25, math.Pi * math.Sqrt(0.2)},
		{Gaussian, 2, math.Pi / 3},
		{Gaussian, 1.5, math.Pi * 0.5 / 2},
	} {
		_, lo := optimisedBound(t, tt.typ, tt.sigma, 6)
		_, hi := optimisedBound(t, tt.typ, tt.sigma, 12)
		got := math.Log(lo/hi) / 6
		if math.Abs(got/tt.rate-1) > 0.15 {
			t.Errorf("%v σ=%g: rate %.3f per cell, derived %.3f", tt.typ, tt.sigma, got, tt.rate)
		}
		t.Logf("%v σ=%g: measured rate %.3f per cell of width, derived %.3f", tt.typ, tt.sigma, got, tt.rate)
	}
}

// Each option meets the tolerance, and one cell less with the best shape
// the optimiser finds does not (certified).
func TestPlanMinimalWidth(t *testing.T) {
	ctx := context.Background()
	for _, typ := range []KernelType{KaiserBessel, Gaussian} {
		for _, tol := range []float64{1e-4, 1e-8, 1e-11} {
			res, err := Plan(ctx, Request{Modes: 256, Tolerance: tol, Kernel: typ})
			if err != nil {
				t.Fatal(err)
			}
			for _, o := range res.Options {
				if o.Total > tol || o.Bound.Total+o.Rounding > o.Total {
					t.Errorf("%v tol=%g σ=%g: total %.3g (bound %.3g + rounding %.3g) does not meet the tolerance", typ, tol, o.Oversampling, o.Total, o.Bound.Total, o.Rounding)
				}
				w := o.Setup.Kernel.Width - 1
				if w < MinWidth {
					continue
				}
				base := Setup{Modes: 256, Grid: o.Setup.Grid}
				beta, _ := optimiseBeta(typ, w, func(b float64) float64 {
					k := Kernel{Type: typ, Width: w, Beta: b}
					s := base
					s.Kernel = k
					return estimateSup(k, base.thetaMax()) + RoundingEstimate(s, 1)
				})
				s := base
				s.Kernel = Kernel{Type: typ, Width: w, Beta: beta}
				b, err := Bound(ctx, s, 1)
				if err != nil {
					t.Fatal(err)
				}
				if b.Total+RoundingEstimate(s, 1) <= tol {
					t.Errorf("%v tol=%g σ=%g: width %d also meets the tolerance (%.3g), plan chose %d", typ, tol, o.Oversampling, w, b.Total, w+1)
				}
			}
		}
	}
}

// The recommendation follows the cost model: with many points per mode
// spreading dominates and the narrowest kernel wins; with few points the
// smallest grid wins.
func TestPlanCostModel(t *testing.T) {
	ctx := context.Background()
	many, err := Plan(ctx, Request{Modes: 256, Tolerance: 1e-9, Kernel: KaiserBessel, Points: 1e9})
	if err != nil {
		t.Fatal(err)
	}
	few, err := Plan(ctx, Request{Modes: 256, Tolerance: 1e-9, Kernel: KaiserBessel, Points: 1})
	if err != nil {
		t.Fatal(err)
	}
	for _, o := range many.Options {
		if o.Setup.Kernel.Width < many.Best.Setup.Kernel.Width {
			t.Errorf("many points: recommended W=%d, but σ=%g has W=%d", many.Best.Setup.Kernel.Width, o.Oversampling, o.Setup.Kernel.Width)
		}
	}
	for _, o := range few.Options {
		if o.Setup.Grid < few.Best.Setup.Grid {
			t.Errorf("few points: recommended M=%d, but σ=%g has M=%d", few.Best.Setup.Grid, o.Oversampling, o.Setup.Grid)
		}
	}
	o := many.Best
	m := float64(o.Setup.Grid)
	if want := DefaultCostModel.Spread*1e9*float64(o.Setup.Kernel.Width) + DefaultCostModel.FFT*m*math.Log2(m); math.Abs(o.Cost-want) > 1e-9*want {
		t.Errorf("cost = %g, want %g", o.Cost, want)
	}
	for i := 1; i < len(many.Options); i++ {
		if many.Options[i].Cost < many.Options[i-1].Cost {
			t.Errorf("options not sorted by cost: %g after %g", many.Options[i].Cost, many.Options[i-1].Cost)
		}
	}
}

// More dimensions need the per-axis bound ε with (1 + ε)^d - 1 ≤ tol.
func TestPlanDimensions(t *testing.T) {
	ctx := context.Background()
	var widths []int
	for d := 1; d <= 3; d++ {
		res, err := Plan(ctx, Request{Modes: 64, Dim: d, Tolerance: 1e-9, Kernel: KaiserBessel, Oversampling: []float64{2}})
		if err != nil {
			t.Fatal(err)
		}
		o := res.Best
		if got := dimTotal(o.Bound.PerAxis, d); got != o.Bound.Total {
			t.Errorf("d=%d: Bound.Total = %g, want (1+ε)^d - 1 = %g", d, o.Bound.Total, got)
		}
		if o.Total > 1e-9 {
			t.Errorf("d=%d: total %g above the tolerance", d, o.Total)
		}
		widths = append(widths, o.Setup.Kernel.Width)
	}
	if widths[0] > widths[1] || widths[1] > widths[2] {
		t.Errorf("widths for d = 1, 2, 3: %v, want non-decreasing", widths)
	}
}

func TestPlanInfeasible(t *testing.T) {
	ctx := context.Background()
	tests := []struct {
		name string
		req  Request
	}{
		{"below double precision", Request{Modes: 256, Tolerance: 1e-15}},
		{"rounding of positions for 2^30 modes", Request{Modes: 1 << 30, Tolerance: 1e-10, Kernel: Gaussian}},
		{"gaussian at σ = 1.25 only", Request{Modes: 256, Tolerance: 1e-12, Kernel: Gaussian, Oversampling: []float64{1.25}}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := Plan(ctx, tt.req)
			var pe *bounds.ParamError
			if !errors.As(err, &pe) || !errors.Is(err, bounds.ErrInfeasible) || pe.Param != "plan.tolerance" {
				t.Fatalf("error = %v, want ErrInfeasible naming plan.tolerance", err)
			}
			if !strings.Contains(err.Error(), "smallest certified error") {
				t.Errorf("message %q does not say what is achievable", err)
			}
			t.Log(err)
		})
	}
}

func TestPlanBadInput(t *testing.T) {
	ctx := context.Background()
	nan := math.NaN()
	ok := Request{Modes: 64, Tolerance: 1e-6}
	with := func(f func(*Request)) Request { r := ok; f(&r); return r }
	tests := []struct {
		name  string
		req   Request
		param string
		want  error
	}{
		{"zero modes", with(func(r *Request) { r.Modes = 0 }), "plan.modes", bounds.ErrInvalid},
		{"negative modes", with(func(r *Request) { r.Modes = -5 }), "plan.modes", bounds.ErrInvalid},
		{"absurd modes", with(func(r *Request) { r.Modes = 1 << 50 }), "plan.modes", bounds.ErrWorkLimit},
		{"NaN tolerance", with(func(r *Request) { r.Tolerance = nan }), "plan.tolerance", bounds.ErrInvalid},
		{"zero tolerance", with(func(r *Request) { r.Tolerance = 0 }), "plan.tolerance", bounds.ErrInvalid},
		{"negative tolerance", with(func(r *Request) { r.Tolerance = -1e-6 }), "plan.tolerance", bounds.ErrInvalid},
		{"tolerance 1", with(func(r *Request) { r.Tolerance = 1 }), "plan.tolerance", bounds.ErrInvalid},
		{"dimension 4", with(func(r *Request) { r.Dim = 4 }), "plan.dim", bounds.ErrInvalid},
		{"negative dimension", with(func(r *Request) { r.Dim = -1 }), "plan.dim", bounds.ErrInvalid},
		{"unknown kernel", with(func(r *Request) { r.Kernel = 9 }), "kernel.type", bounds.ErrInvalid},
		{"empty candidates", with(func(r *Request) { r.Oversampling = []float64{} }), "kernel.oversampling", bounds.ErrInvalid},
		{"oversampling 1", with(func(r *Request) { r.Oversampling = []float64{2, 1} }), "kernel.oversampling[1]", bounds.ErrInvalid},
		{"oversampling below 1", with(func(r *Request) { r.Oversampling = []float64{0.5} }), "kernel.oversampling[0]", bounds.ErrInvalid},
		{"NaN oversampling", with(func(r *Request) { r.Oversampling = []float64{1.5, 2, nan} }), "kernel.oversampling[2]", bounds.ErrInvalid},
		{"absurd oversampling", with(func(r *Request) { r.Oversampling = []float64{100} }), "kernel.oversampling[0]", bounds.ErrInvalid},
		{"NaN points", with(func(r *Request) { r.Points = nan }), "plan.points", bounds.ErrInvalid},
		{"negative points", with(func(r *Request) { r.Points = -1 }), "plan.points", bounds.ErrInvalid},
		{"absurd points", with(func(r *Request) { r.Points = 1e30 }), "plan.points", bounds.ErrWorkLimit},
		{"negative spread weight", with(func(r *Request) { r.Cost.Spread = -1 }), "cost.spread", bounds.ErrInvalid},
		{"NaN FFT weight", with(func(r *Request) { r.Cost.FFT = nan }), "cost.fft", bounds.ErrInvalid},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := Plan(ctx, tt.req)
			var pe *bounds.ParamError
			if !errors.As(err, &pe) || !errors.Is(err, tt.want) || pe.Param != tt.param {
				t.Errorf("error = %v, want %v naming %q", err, tt.want, tt.param)
			}
		})
	}
}

// nextSmooth against a brute-force search over 2^a·3^b·5^c.
func TestNextSmooth(t *testing.T) {
	smooth := func(n int) bool {
		for _, p := range []int{2, 3, 5} {
			for n%p == 0 {
				n /= p
			}
		}
		return n == 1
	}
	for n := 1; n < 3000; n++ {
		want := n
		for !smooth(want) {
			want++
		}
		if got := nextSmooth(n); got != want {
			t.Fatalf("nextSmooth(%d) = %d, want %d", n, got, want)
		}
	}
}

// Verify reports the observed error of a planned setup within its total.
func TestVerify(t *testing.T) {
	ctx := context.Background()
	res, err := Plan(ctx, Request{Modes: 128, Tolerance: 1e-7, Kernel: KaiserBessel})
	if err != nil {
		t.Fatal(err)
	}
	ch, err := Verify(ctx, res.Best.Setup, 2000, 9)
	if err != nil {
		t.Fatal(err)
	}
	if !(ch.Observed > 0) || ch.Observed > ch.Total || ch.Total > 1e-7 {
		t.Errorf("observed %.3g, total %.3g: want 0 < observed ≤ total ≤ 1e-7", ch.Observed, ch.Total)
	}
	t.Logf("Verify %v: observed %.3g at mode %d, bound %.3g, tightness %.3f", ch.Setup.Kernel, ch.Observed, ch.ObservedMode, ch.Bound.Total, ch.Tightness())
}
