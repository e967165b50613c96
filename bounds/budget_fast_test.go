package bounds

// Tests of the faster paths of budget.go: the closed-form window sum of
// the rounding bound (latticeTermSum) and the truncation in modulus over
// every shift (absTruncation). Both must stay valid bounds: they are
// checked here against sums computed directly in the test.

import (
	"context"
	"math"
	"testing"
)

// directLatticeSum returns max over m shifts s ∈ [0, h) of h Σ_k g(s + hk)
// for one envelope term, summed directly in float64 over |x - c| ≤ X, with
// X far enough that the rest is negligible for the decays used here.
func directLatticeSum(t EnvelopeTerm, h float64, m int) float64 {
	var X float64
	switch t.Decay {
	case Compact:
		X = t.Plateau + t.Width + h
	case Exponential:
		X = t.Plateau + 60/t.Rate
	case Gaussian:
		X = t.Plateau + 40*t.Width
	case Algebraic:
		X = t.Plateau + 1000*t.Width
	}
	worst := 0.0
	for i := 0; i < m; i++ {
		s := h * float64(i) / float64(m)
		sum := 0.0
		for k := math.Floor((-X - s) / h); s+h*k <= X; k++ {
			d := math.Max(0, math.Abs(s+h*k-t.Center)-t.Plateau)
			var g float64
			switch t.Decay {
			case Exponential:
				g = math.Exp(-t.Rate * d)
			case Gaussian:
				g = math.Exp(-0.5 * d * d / (t.Width * t.Width))
			case Algebraic:
				g = math.Pow(1+d/t.Width, -t.Power)
			case Compact:
				if d <= t.Width {
					g = 1
				}
			}
			sum += t.Amplitude * g
		}
		worst = math.Max(worst, h*sum)
	}
	return worst
}

// TestLatticeTermSum checks the closed-form window-sum bound of each decay,
// with and without a plateau, against the direct lattice sum at the worst
// of 257 shifts (the algebraic tail beyond the summed range is bounded by
// its integral, added to the direct sum), and reports its tightness.
func TestLatticeTermSum(t *testing.T) {
	terms := []EnvelopeTerm{
		{Decay: Gaussian, Amplitude: 1, Width: 1},
		{Decay: Gaussian, Amplitude: 2.5, Width: 0.3, Plateau: 0.7},
		{Decay: Exponential, Amplitude: 1, Rate: 1},
		{Decay: Exponential, Amplitude: 1, Rate: 3, Plateau: 0.69},
		{Decay: Algebraic, Amplitude: 1, Width: 1, Power: 2, Plateau: 1},
		{Decay: Algebraic, Amplitude: 0.5, Width: 2, Power: 4},
		{Decay: Compact, Amplitude: 0.667, Width: 2},
	}
	for _, term := range terms {
		for _, h := range []float64{0.05, 0.3, 0.9, 2.5} {
			got := latticeTermSum(term, h)
			want := directLatticeSum(term, h, 257)
			if term.Decay == Algebraic {
				// Σ over |x| > X of A(1 + (x-p)/ℓ)^{-q} ≤ 2A ℓ/(q-1)·(1 + (X-p)/ℓ - h/ℓ)^{1-q}/h·h
				X := term.Plateau + 1000*term.Width
				want += 2 * term.Amplitude * term.Width / (term.Power - 1) * math.Pow(1+(X-term.Plateau-h)/term.Width, 1-term.Power)
			}
			if got < want*(1-1e-12) {
				t.Errorf("%v h=%g: bound %g below the lattice sum %g", term, h, got, want)
			}
			t.Logf("%v h=%g: bound/sum %.4f", term, h, got/want)
		}
	}
}

// TestAbsTruncation checks FamilyBudget's truncation for every shift
// against the direct worst omitted sum h Σ_omitted |f| over 513 shifts of
// the cell, for a Gaussian, a sech and a wave packet, and reports its
// tightness (the closed forms of f are those of the catalogue in math.md).
func TestAbsTruncation(t *testing.T) {
	ctx := context.Background()
	g := GaussianFamily{Sigma: 1}
	s := SechFamily{Width: 1}
	w := WavePacketFamily{Sigma: 1, Omega0: 3}
	fs := []struct {
		fam Family
		f   func(float64) float64
	}{
		{g, func(x float64) float64 { return math.Exp(-x * x / 2) }},
		{s, func(x float64) float64 { return 1 / math.Cosh(x) }},
		{w, func(x float64) float64 { return math.Abs(math.Exp(-x*x/2) * math.Cos(3*x)) }},
	}
	for _, tt := range fs {
		for _, grid := range []Grid{{Step: 0.8, Count: 15}, {Step: 0.5, Count: 20, Shift: -0.25}, {Step: 1.1, Count: 7, Shift: 0.3}} {
			for _, tol := range []float64{0, 1e-12} {
				b, err := FamilyBudget(ctx, tt.fam, grid, Band{}, BudgetOptions{AnyShift: true, Settings: Settings{Tol: tol}})
				if err != nil {
					t.Fatal(err)
				}
				lo, hi := grid.Indices()
				worst := 0.0
				for i := 0; i <= 512; i++ {
					sh := grid.Shift + grid.Step*(float64(i)/512-0.5)
					sum := 0.0
					for k := int64(1); k < 400; k++ {
						sum += tt.f(sh+grid.Step*float64(hi+k)) + tt.f(sh+grid.Step*float64(lo-k))
					}
					worst = math.Max(worst, grid.Step*sum)
				}
				if b.Truncation < worst*(1-1e-12) {
					t.Errorf("%v %+v: truncation bound %g below the worst omitted sum %g", tt.fam, grid, b.Truncation, worst)
				}
				t.Logf("%v %+v tol %g: bound/worst %.4f", tt.fam, grid, tol, b.Truncation/worst)
			}
		}
	}
}
