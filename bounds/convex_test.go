package bounds

import (
	"context"
	"math"
	"math/cmplx"
	"testing"
)

// convexCase is a family with convex tails and its modulus written here
// from the closed forms of the catalogue (math.md), not through the engine.
type convexCase struct {
	fam Family
	abs func(x float64) float64
}

func convexCases() []convexCase {
	gauss := func(s float64) func(float64) float64 {
		return func(x float64) float64 { return math.Exp(-x * x / (2 * s * s)) }
	}
	sech := func(w float64) func(float64) float64 {
		return func(x float64) float64 { return 1 / math.Cosh(x/w) }
	}
	bspline4 := func(x float64) float64 {
		// M_4 (de Boor 1978, ch. IX, from memory): 2/3 - x² + |x|³/2 on
		// |x| ≤ 1, (2 - |x|)³/6 on 1 ≤ |x| ≤ 2.
		a := math.Abs(x)
		switch {
		case a <= 1:
			return 2.0/3 - a*a + a*a*a/2
		case a <= 2:
			return (2 - a) * (2 - a) * (2 - a) / 6
		}
		return 0
	}
	return []convexCase{
		{GaussianFamily{Sigma: 1}, gauss(1)},
		{GaussianFamily{Sigma: 0.3}, gauss(0.3)},
		{ExponentialFamily{Rate: 2}, func(x float64) float64 { return math.Exp(-2 * math.Abs(x)) }},
		{SechFamily{Width: 1}, sech(1)},
		{SechFamily{Width: 0.7}, sech(0.7)},
		{SechSquaredFamily{Width: 1.3}, func(x float64) float64 { c := math.Cosh(x / 1.3); return 1 / (c * c) }},
		{LorentzianFamily{Width: 0.8}, func(x float64) float64 { return 1 / (0.64 + x*x) }},
		{BSplineFamily{Order: 4}, bspline4},
		{BSplineFamily{Order: 2}, func(x float64) float64 { return math.Max(0, 1-math.Abs(x)) }},
		{ShiftFamily{By: 0.37, Of: SechFamily{Width: 1}}, func(x float64) float64 { return sech(1)(x - 0.37) }},
		{DilationFamily{By: -1.7, Of: ShiftFamily{By: 0.2, Of: GaussianFamily{Sigma: 0.6}}},
			func(x float64) float64 { return gauss(0.6)(x/-1.7 - 0.2) }},
		{AmplitudeFamily{Re: 0.6, Im: -0.8, Of: ModulationFamily{Omega0: 5, Of: SechFamily{Width: 1}}}, sech(1)},
	}
}

// TestConvexTails checks the half-lines of convexTails against the
// modulus: its second differences are ≥ 0 on them (convexity), and the
// half-lines are close to the inflection points of the closed forms (the
// second difference just inside them is negative where a family has an
// inflection point, so d is not a gross overestimate).
func TestConvexTails(t *testing.T) {
	for _, tt := range convexCases() {
		c, d, ok := convexTails(tt.fam)
		if !ok {
			t.Errorf("%v: no convex tails", tt.fam)
			continue
		}
		const delta = 1e-3
		second := func(x float64) float64 { return tt.abs(x-delta) - 2*tt.abs(x) + tt.abs(x+delta) }
		for i := 0; i <= 2000; i++ {
			for _, x := range []float64{c + d + delta + 0.005*float64(i), c - d - delta - 0.005*float64(i)} {
				// Allow the rounding of the three values, a few ulps of the
				// largest.
				if s := second(x); s < -8e-16*tt.abs(x-delta) {
					t.Errorf("%v: second difference at %g = %g, want ≥ 0 (c = %g, d = %g)", tt.fam, x, s, c, d)
				}
			}
		}
		if d > 0 {
			for _, x := range []float64{c + 0.98*d - delta, c - 0.98*d + delta} {
				if s := second(x); s >= 0 {
					t.Logf("%v: second difference at %g = %g inside the half-lines (d = %g)", tt.fam, x, s, d)
				}
			}
		}
	}
	for _, f := range []Family{BSplineFamily{Order: 1}, WavePacketFamily{Sigma: 1, Omega0: 3}, FejerFamily{Omega: 1},
		SumFamily{Terms: []Family{GaussianFamily{Sigma: 1}, SechFamily{Width: 1}}}, ShiftFamily{By: 1, Of: FejerFamily{Omega: 2}}} {
		if _, _, ok := convexTails(f); ok {
			t.Errorf("%v: convex tails claimed for a modulus that oscillates, jumps or is a sum", f)
		}
	}
}

// TestConvexTruncation checks FamilyBudget's truncation for every shift,
// computed at the ends of the shift range when the omitted samples lie on
// the convex tails, against the direct worst omitted sum h Σ_omitted |f|
// over 257 shifts of the range, with grids both inside and outside the
// convex tails, and reports its tightness.
func TestConvexTruncation(t *testing.T) {
	ctx := context.Background()
	grids := []Grid{
		{Step: 0.8, Count: 15},
		{Step: 0.5, Count: 20, Shift: -0.25},
		{Step: 1.1, Count: 7, Shift: 0.3},
		{Step: 0.3, Count: 4, Shift: 0.1}, // omitted samples near the centre
		{Step: 0.05, Count: 301, Shift: 0.01},
	}
	for _, tt := range convexCases() {
		for _, g := range grids {
			b, err := FamilyBudget(ctx, tt.fam, g, Band{}, BudgetOptions{AnyShift: true})
			if err != nil {
				t.Fatal(err)
			}
			lo, hi := g.Indices()
			worst := 0.0
			for i := 0; i <= 256; i++ {
				sh := g.Shift + g.Step*(float64(i)/256-0.5)
				sum := 0.0
				for k := int64(1); k < 4000; k++ {
					sum += tt.abs(sh+g.Step*float64(hi+k)) + tt.abs(sh+g.Step*float64(lo-k))
				}
				worst = math.Max(worst, g.Step*sum)
			}
			if amp, ok := tt.fam.(AmplitudeFamily); ok {
				worst *= cmplx.Abs(complex(amp.Re, amp.Im))
			}
			if b.Truncation < worst*(1-1e-12) {
				t.Errorf("%v %+v: truncation bound %g below the worst omitted sum %g", tt.fam, g, b.Truncation, worst)
			}
			if worst > 1e-300 {
				t.Logf("%v %+v: bound/worst %.6f (pieces %d)", tt.fam, g, b.Truncation/worst, b.Pieces)
			}
		}
	}
}
