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

// ndActual returns the worst actual error of the n-D integral of a
// separable function on the planned grid, |Π_j T_j - Π_j F_j(0)|, over the
// ends and middle of each axis's shift range, with each T_j = F_j(0) +
// alias_j(s_j) - omitted_j(s_j) exact by the Poisson formula (no
// rounding).
func ndActual(refs []refFamily, plan bounds.PlanND) float64 {
	n := len(refs)
	shifts := make([][]float64, n)
	for j, ax := range plan.Axes {
		g := ax.Grid
		shifts[j] = []float64{g.Shift - g.Step/2, g.Shift, g.Shift + g.Step/2}
	}
	worst := 0.0
	idx := make([]int, n)
	for {
		T, F := complex(1, 0), complex(1, 0)
		for j, r := range refs {
			g := plan.Axes[j].Grid
			s := shifts[j][idx[j]]
			_, om := refOmitted(r, g.Step, s, int(g.Count), 0)
			Fj := r.F(0)
			T *= Fj + refAliasAt(r, g.Step, s, 0) - om
			F *= Fj
		}
		worst = math.Max(worst, cmplx.Abs(T-F))
		j := 0
		for ; j < n; j++ {
			idx[j]++
			if idx[j] < 3 {
				break
			}
			idx[j] = 0
		}
		if j == n {
			return worst
		}
	}
}

// TestPlanNDCertificate checks n-D plans of separable functions: the worst
// actual error over shifts (exact, per axis by the Poisson formula, then
// multiplied out) stays within the composed aliasing + truncation, and the
// certificate within the tolerance.
func TestPlanNDCertificate(t *testing.T) {
	ctx := context.Background()
	s, err := bounds.NewSech(1)
	if err != nil {
		t.Fatal(err)
	}
	b4, err := bounds.NewBSpline(4)
	if err != nil {
		t.Fatal(err)
	}
	g := mustGaussian(t, 1)
	tests := []struct {
		name string
		fams []bounds.Family
		refs []refFamily
	}{
		{"gauss×sech", []bounds.Family{g, s}, []refFamily{gaussRef(1, 0), sechRef(1)}},
		{"gauss³", []bounds.Family{g, g, g}, []refFamily{gaussRef(1, 0), gaussRef(1, 0), gaussRef(1, 0)}},
		{"gauss×bspline4", []bounds.Family{g, b4}, []refFamily{gaussRef(1, 0), bsplineRef(4)}},
	}
	for _, tt := range tests {
		for _, tol := range []float64{1e-4, 1e-8} {
			var axes []bounds.AxisRequest
			for _, f := range tt.fams {
				axes = append(axes, bounds.AxisRequest{Family: f})
			}
			plan, err := bounds.PlanGridND(ctx, bounds.PlanNDRequest{Axes: axes, Tol: tol})
			if err != nil {
				t.Fatalf("%s tol %g: %v", tt.name, tol, err)
			}
			act := ndActual(tt.refs, plan)
			bound := plan.Budget.Aliasing + plan.Budget.Truncation
			if act > bound || plan.Budget.Total > tol {
				t.Errorf("%s tol %g: actual %g, aliasing+truncation %g, certificate %g", tt.name, tol, act, bound, plan.Budget.Total)
			}
			counts := make([]int64, len(plan.Axes))
			prod := int64(1)
			for j, a := range plan.Axes {
				counts[j] = a.Grid.Count
				prod *= a.Grid.Count
			}
			if prod != plan.Count {
				t.Errorf("%s tol %g: count %d, product of %v", tt.name, tol, plan.Count, counts)
			}
			t.Logf("%s tol %g: counts %v (total %d), certificate %.3g, worst actual %.3g", tt.name, tol, counts, plan.Count, plan.Budget.Total, act)
		}
	}
}

// TestPlanNDSplit checks how the tolerance is split: in 2-D with a fast
// (Gaussian) and a slow (two-sided exponential, F ~ ξ⁻²) axis, the planned
// product must not exceed the best product over a fine scan of splits
// θ·tol : (1-θ)·tol, each axis planned alone for its share weighted by
// the other axis's integral (the first-order composition, documented at
// PlanGridND), by more than 5% — and it must beat the even split. The 1-D
// planner used for the scan is itself checked against a brute force in
// TestPlanNearBruteForce.
func TestPlanNDSplit(t *testing.T) {
	ctx := context.Background()
	e, err := bounds.NewExponential(1)
	if err != nil {
		t.Fatal(err)
	}
	s, err := bounds.NewSech(1)
	if err != nil {
		t.Fatal(err)
	}
	g := mustGaussian(t, 1)
	tests := []struct {
		name string
		a, b bounds.Family
		tol  float64
	}{
		{"gauss×exponential", g, e, 1e-3},
		{"sech×exponential", s, e, 1e-3},
		{"gauss×sech", g, s, 1e-8},
	}
	for _, tt := range tests {
		plan, err := bounds.PlanGridND(ctx, bounds.PlanNDRequest{Axes: []bounds.AxisRequest{{Family: tt.a}, {Family: tt.b}}, Tol: tt.tol})
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		Ia := real(tt.a.Transform(bounds.Point(0)).Mid()) // ∫f_a, the weight of axis b
		Ib := real(tt.b.Transform(bounds.Point(0)).Mid())
		count := func(f bounds.Family, eps float64) int64 {
			p, err := bounds.PlanGrid(ctx, bounds.PlanRequest{Family: f, Tol: eps})
			if err != nil {
				return math.MaxInt32
			}
			return p.Grid.Count
		}
		best, even := int64(math.MaxInt64), int64(0)
		for i := 1; i < 200; i++ {
			th := float64(i) / 200
			// Leave 1% for the second-order terms and the rounding.
			p := count(tt.a, 0.99*th*tt.tol/Ib) * count(tt.b, 0.99*(1-th)*tt.tol/Ia)
			best = min(best, p)
			if i == 100 {
				even = p
			}
		}
		if float64(plan.Count) > 1.05*float64(best) || plan.Count > even {
			t.Errorf("%s: planned product %d, best scanned split %d, even split %d", tt.name, plan.Count, best, even)
		}
		t.Logf("%s tol %g: planned %d×%d = %d, best scanned split %d (ratio %.3f), even split %d, shares %.3g",
			tt.name, tt.tol, plan.Axes[0].Grid.Count, plan.Axes[1].Grid.Count, plan.Count, best, float64(plan.Count)/float64(best), even, plan.Shares)
	}
}

// TestPlanNDEnvelopes plans from per-axis envelopes and checks the plan on
// separable functions within them (products of Gaussians with
// 0.8 ≤ σ ≤ 1, see TestPlanEnvelopeHoldsForFamilies).
func TestPlanNDEnvelopes(t *testing.T) {
	ctx := context.Background()
	axis := bounds.AxisRequest{
		Spatial:  bounds.Envelope{{Decay: bounds.Gaussian, Amplitude: 1, Width: 1}},
		Spectral: bounds.Envelope{{Decay: bounds.Gaussian, Amplitude: math.Sqrt(2 * math.Pi), Width: 1.25}},
	}
	plan, err := bounds.PlanGridND(ctx, bounds.PlanNDRequest{Axes: []bounds.AxisRequest{axis, axis}, Tol: 1e-6})
	if err != nil {
		t.Fatal(err)
	}
	if plan.Budget.Exact || plan.Budget.Total > 1e-6 {
		t.Errorf("certificate %+v", plan.Budget)
	}
	for _, pair := range [][2]float64{{1, 1}, {0.8, 1}, {0.9, 0.8}} {
		act := ndActual([]refFamily{gaussRef(pair[0], 0), gaussRef(pair[1], 0)}, plan)
		if act > plan.Budget.Aliasing+plan.Budget.Truncation {
			t.Errorf("σ = %v: actual %g above %g", pair, act, plan.Budget.Aliasing+plan.Budget.Truncation)
		}
	}
}

// TestPlanNDErrors checks the n-D request's validation and the message of
// an infeasible tolerance.
func TestPlanNDErrors(t *testing.T) {
	ctx := context.Background()
	g := mustGaussian(t, 1)
	ok := bounds.AxisRequest{Family: g}
	tests := []struct {
		name string
		req  bounds.PlanNDRequest
		want error
		msg  string
	}{
		{"no axes", bounds.PlanNDRequest{Tol: 1e-6}, bounds.ErrInvalid, "axes"},
		{"nine axes", bounds.PlanNDRequest{Axes: make([]bounds.AxisRequest, 9), Tol: 1e-6}, bounds.ErrInvalid, "axes"},
		{"bad band", bounds.PlanNDRequest{Axes: []bounds.AxisRequest{ok, {Family: g, Band: bounds.Band{HalfWidth: -1}}}, Tol: 1e-6}, bounds.ErrInvalid, "axes[1].band"},
		{"nan tol", bounds.PlanNDRequest{Axes: []bounds.AxisRequest{ok}, Tol: math.NaN()}, bounds.ErrInvalid, "tol"},
		{"rounding", bounds.PlanNDRequest{Axes: []bounds.AxisRequest{ok, ok, ok}, Tol: 1e-13}, bounds.ErrInfeasible, "smallest certifiable tolerance is about"},
	}
	for _, tt := range tests {
		_, err := bounds.PlanGridND(ctx, tt.req)
		if !errors.Is(err, tt.want) || !strings.Contains(err.Error(), tt.msg) {
			t.Errorf("%s: err = %v, want %v mentioning %q", tt.name, err, tt.want, tt.msg)
		}
	}
}
