package bounds

import (
	"context"
	"math"
	"math/big"
	"testing"

	"foldbound/internal/bigref"
)

// TestBSplineAliasBlock checks the closed-form bound of a block of alias
// copies of a B-spline transform against the copies summed in 256-bit
// arithmetic at the ends of the intervals of x0 and P (points the bound
// must cover), F(ξ) = (sin(ξ/2)/(ξ/2))^m (de Boor 1978, from memory), at the
// steps of the partition of unity (h = 1, 1/2: P/2 a multiple of π, where
// every copy at ξ = 0 vanishes) and at other steps.
func TestBSplineAliasBlock(t *testing.T) {
	tests := []struct {
		h, xi float64
		J     int64
	}{
		{1, 0, 1}, {1, 0, 50}, {0.5, 0, 60}, {1, 0.3, 40}, {1, 1e-9, 60},
		{0.7, 0, 30}, {1.3, 0.2, 30}, {0.25, 0, 40}, {1 + 0x1p-40, 0, 60},
	}
	for _, m := range []int{2, 3, 4, 8} {
		b := BSplineFamily{Order: m}
		for _, tt := range tests {
			P := TwoPi.Div(Point(tt.h))
			for _, x0 := range []Interval{Point(tt.xi).Add(P), P.Sub(Point(tt.xi))} {
				got := b.aliasBlock(x0, P, tt.J)
				for _, x := range []float64{x0.Lo, x0.Hi} {
					for _, p := range []float64{P.Lo, P.Hi} {
						sum := bigBSplineCopies(m, x, p, tt.J)
						if !bigref.In(0, got, sum) {
							t.Errorf("m=%d h=%g ξ=%g J=%d: block bound %g below Σ|F(x0 + jP)| = %g at x0 = %g, P = %g",
								m, tt.h, tt.xi, tt.J, got, bigref.Float64(sum), x, p)
						}
					}
				}
			}
		}
	}
	// At the partition of unity the bound is negligible.
	if v := (BSplineFamily{Order: 4}).aliasBlock(TwoPi, TwoPi, 1<<20); v > 1e-40 {
		t.Errorf("block of 2^20 copies at h = 1, ξ = 0: %g, want negligible", v)
	}
}

// noBlock hides a family's aliasBlock, so that the alias copies are summed
// one by one.
type noBlock struct{ Family }

// TestBSplineBlockBudget checks that the alias bound of FamilyBudget with
// the block and ray bounds is at most, up to rounding, the bound with every
// copy summed, and within the tolerance.
func TestBSplineBlockBudget(t *testing.T) {
	ctx := context.Background()
	for _, m := range []int{3, 4, 6, 8} {
		b := BSplineFamily{Order: m}
		for _, g := range []Grid{{Step: 1, Count: int64(m)}, {Step: 1, Shift: -0.5, Count: int64(m) + 3}, {Step: 0.5, Count: 2 * int64(m)}} {
			for _, tol := range []float64{1e-6, 1e-10} {
				opt := BudgetOptions{AnyShift: true, Settings: Settings{Tol: tol, Side: SpectralSide, MaxTerms: 1 << 24}}
				got, err := FamilyBudget(ctx, b, g, Band{}, opt)
				if err != nil {
					t.Fatal(err)
				}
				want, err := FamilyBudget(ctx, noBlock{b}, g, Band{}, opt)
				if err != nil {
					t.Fatal(err)
				}
				// The ray bound (aliasRay) may be far below the summed
				// copies, whose envelope remainder is about tol.
				if got.Aliasing > want.Aliasing*(1+1e-12) || got.Aliasing > tol {
					t.Errorf("m=%d %+v tol %g: aliasing %g, summed copies %g", m, g, tol, got.Aliasing, want.Aliasing)
				}
			}
		}
	}
}

// bigBSplineCopies returns Σ_{j<J} |F(x + jp)| for the order-m B-spline,
// F(ξ) = (sin(ξ/2)/(ξ/2))^m (de Boor 1978, from memory), in 320-bit
// arithmetic.
func bigBSplineCopies(m int, x, p float64, J int64) *big.Float {
	sum := bigref.Int(0)
	for j := int64(0); j < J; j++ {
		xj := bigref.Add(bigref.New(x), bigref.Mul(bigref.Int(j), bigref.New(p)))
		u := bigref.Quo(xj, bigref.Int(2))
		s := bigref.Abs(bigref.Quo(bigref.Sin(u), u))
		f := bigref.Int(1)
		for k := 0; k < m; k++ {
			f = bigref.Mul(f, s)
		}
		sum = bigref.Add(sum, f)
	}
	return sum
}

// TestBSplineAliasRay checks the closed-form bound of a whole ray of alias
// copies against its first 300 copies summed in 320-bit arithmetic (a
// lower bound of the ray the bound must exceed), at the steps of the
// partition of unity and elsewhere, and reports how far above it is.
func TestBSplineAliasRay(t *testing.T) {
	tests := []struct{ h, xi float64 }{
		{1, 0}, {0.5, 0}, {1.0 / 3, 0}, {1, 0.3}, {1, 1e-9}, {0.7, 0}, {1.3, 0.2}, {8.0 / 7, 0}, {1 + 0x1p-40, 0},
	}
	for _, m := range []int{2, 3, 4, 8} {
		b := BSplineFamily{Order: m}
		for _, tt := range tests {
			P := TwoPi.Div(Point(tt.h))
			for _, x0 := range []Interval{Point(tt.xi).Add(P), P.Sub(Point(tt.xi))} {
				got := b.aliasRay(x0, P)
				worst := 0.0
				for _, x := range []float64{x0.Lo, x0.Hi} {
					for _, p := range []float64{P.Lo, P.Hi} {
						sum := bigBSplineCopies(m, x, p, 300)
						if !bigref.In(0, got, sum) {
							t.Errorf("m=%d h=%g ξ=%g: ray bound %g below the first 300 copies %g at x0 = %g, P = %g", m, tt.h, tt.xi, got, bigref.Float64(sum), x, p)
						}
						worst = math.Max(worst, bigref.Float64(sum))
					}
				}
				if testing.Verbose() && x0.Lo > P.Lo {
					t.Logf("m=%d h=%.6g ξ=%g: ray bound %.3g, first 300 copies %.3g", m, tt.h, tt.xi, got, worst)
				}
			}
		}
	}
}

// TestBSplineRayBudget checks FamilyBudget's aliasing for every shift
// against the exact error of the infinite grid, |h Σ_k M_m(s + hk) - 1|
// (the integral of M_m is 1; de Boor 1978, from memory), summed in 320-bit
// arithmetic at 33 shifts across the cell: at the steps of the partition of
// unity (h = 1, 1/2, 1/3) the error is 0 and the bound must be of the
// order of rounding; elsewhere the bound must not be below the error (up
// to the reference's own rounding, 2^-300).
func TestBSplineRayBudget(t *testing.T) {
	ctx := context.Background()
	for m := 2; m <= MaxBSplineOrder; m++ {
		b := BSplineFamily{Order: m}
		for _, h := range []float64{1, 0.5, 1.0 / 3, 0.7, 1.3, 8.0 / 7} {
			g := Grid{Step: h, Shift: 0.1}
			bud, err := FamilyBudget(ctx, b, g, Band{}, BudgetOptions{AnyShift: true, Settings: Settings{Tol: 1e-14}})
			if err != nil {
				t.Fatalf("m=%d h=%g: %v", m, h, err)
			}
			worst := 0.0
			for i := 0; i <= 32; i++ {
				s := g.Shift - h/2 + h*float64(i)/32
				sum := bigref.Int(0)
				reach := int(float64(m)/2/h) + 2
				for k := -reach - 1; k <= reach+1; k++ {
					x := bigref.Add(bigref.New(s), bigref.Mul(bigref.Int(int64(k)), bigref.New(h)))
					sum = bigref.Add(sum, bigBSpline(m, x))
				}
				e := bigref.Sub(bigref.Mul(bigref.New(h), sum), bigref.Int(1))
				worst = math.Max(worst, math.Abs(bigref.Float64(e)))
			}
			// The reference's own rounding: about ten 320-bit terms.
			if !(bud.Aliasing >= worst-0x1p-300) {
				t.Errorf("m=%d h=%g: aliasing bound %g below the exact error %g", m, h, bud.Aliasing, worst)
			}
			if h == 1 || h == 0.5 {
				if bud.Aliasing > 1e-15 {
					t.Errorf("m=%d h=%g (partition of unity): aliasing bound %g, want below 1e-15", m, h, bud.Aliasing)
				}
			}
			if testing.Verbose() {
				t.Logf("m=%d h=%.6g: aliasing bound %.3g, exact worst error over 33 shifts %.3g", m, h, bud.Aliasing, worst)
			}
		}
	}
}

// TestPlanBSplinePartitionOfUnity checks the plans of the B-splines at the
// steps of their partition of unity: Σ_k M_m(s + k) = 1 for every s (de
// Boor 1978, from memory), so the trapezoidal rule with h = 1 and a window
// covering the support is exact up to rounding, for every shift or a fixed
// one. The plan may not need more samples than that grid (m for every
// shift, m + 1 for a fixed shift) at any tolerance, and its actual error,
// summed in 320-bit arithmetic, must be within the tolerance.
func TestPlanBSplinePartitionOfUnity(t *testing.T) {
	ctx := context.Background()
	for m := 2; m <= MaxBSplineOrder; m++ {
		b := BSplineFamily{Order: m}
		for _, tol := range []float64{1e-4, 1e-8, 1e-12, 1e-14} {
			for _, fixed := range []bool{false, true} {
				req := PlanRequest{Family: b, Tol: tol, FixedShift: fixed, Shift: 0.37}
				p, err := PlanGrid(ctx, req)
				if err != nil {
					t.Errorf("m=%d tol=%g fixed=%v: %v", m, tol, fixed, err)
					continue
				}
				limit := int64(m)
				if fixed {
					limit++
				}
				if p.Grid.Count > limit {
					t.Errorf("m=%d tol=%g fixed=%v: planned %d samples at h = %g, want ≤ %d (h = 1)", m, tol, fixed, p.Grid.Count, p.Grid.Step, limit)
				}
				shifts := []float64{p.Grid.Shift}
				if !fixed {
					for i := 0; i <= 8; i++ {
						shifts = append(shifts, p.Grid.Shift-p.Grid.Step/2+p.Grid.Step*float64(i)/8)
					}
				}
				for _, s := range shifts {
					g := p.Grid
					g.Shift = s
					sum := bigref.Int(0)
					for k := -(g.Count - 1) / 2; k <= g.Count/2; k++ {
						x := bigref.Add(bigref.New(s), bigref.Mul(bigref.Int(k), bigref.New(g.Step)))
						sum = bigref.Add(sum, bigBSpline(m, x))
					}
					e := math.Abs(bigref.Float64(bigref.Sub(bigref.Mul(bigref.New(g.Step), sum), bigref.Int(1))))
					if e > tol {
						t.Errorf("m=%d tol=%g fixed=%v: grid %+v has error %g", m, tol, fixed, g, e)
					}
				}
			}
		}
	}
}
