package bounds

import (
	"context"
	"math"
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
						sum := bigref.Int(0)
						for j := int64(0); j < tt.J; j++ {
							xj := bigref.Add(bigref.New(x), bigref.Mul(bigref.Int(j), bigref.New(p)))
							u := bigref.Quo(xj, bigref.Int(2))
							s := bigref.Abs(bigref.Quo(bigref.Sin(u), u))
							f := bigref.Int(1)
							for k := 0; k < m; k++ {
								f = bigref.Mul(f, s)
							}
							sum = bigref.Add(sum, f)
						}
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
// the block bound equals, up to rounding, the bound with every copy summed,
// and that both contain the true aliasing 0 of the partition of unity.
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
				if math.Abs(got.Aliasing-want.Aliasing) > 1e-12*want.Aliasing || got.Aliasing > tol {
					t.Errorf("m=%d %+v tol %g: aliasing %g, summed copies %g", m, g, tol, got.Aliasing, want.Aliasing)
				}
			}
		}
	}
}
