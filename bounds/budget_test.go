package bounds

import (
	"context"
	"errors"
	"math"
	"sort"
	"testing"

	"foldbound/internal/bigref"
)

// naiveSum computes h Σ f(x_k) e^{-iξx_k} the way a user's code would: in
// float64, recursive summation.
func naiveGaussianSum(sigma float64, g Grid, xi float64) complex128 {
	lo, hi := g.Indices()
	var re, im float64
	for k := lo; k <= hi; k++ {
		x := g.Shift + g.Step*float64(k)
		v := math.Exp(-x * x / (2 * sigma * sigma))
		sn, cs := math.Sincos(xi * x)
		re += v * cs
		im -= v * sn
	}
	return complex(g.Step*re, g.Step*im)
}

// The budget's total must cover the actual error of a float64 computation
// of the sum against the exact transform — aliasing, truncation and
// rounding together — for the grid's shift, and with AnyShift for every
// shift within half a step. The reference is math/big.
func TestFamilyBudgetCoversActualError(t *testing.T) {
	ctx := context.Background()
	var ratios []float64
	for _, sigma := range []float64{0.6, 1, 1.7} {
		for _, h := range []float64{0.3, 0.7, 1.2} {
			for _, n := range []int64{7, 16, 31} {
				for _, xi := range []float64{0, 0.9} {
					g := GaussianFamily{Sigma: sigma}
					grid := Grid{Step: h, Shift: 0.05, Count: n}
					b, err := FamilyBudget(ctx, g, grid, Band{Center: xi}, BudgetOptions{})
					if err != nil {
						t.Fatal(err)
					}
					ba, err := FamilyBudget(ctx, g, grid, Band{Center: xi}, BudgetOptions{AnyShift: true})
					if err != nil {
						t.Fatal(err)
					}
					F := gaussianTransformBig(sigma, xi)
					for i, s := range []float64{0.05, 0.05 - h/2, 0.05 + h/2, 0.05 + 0.3*h, 0.05 - 0.41*h} {
						gs := grid
						gs.Shift = s
						got := naiveGaussianSum(sigma, gs, xi)
						diff := bigref.C(real(got), imag(got)).Sub(bigref.Real(F)).Abs()
						if i == 0 {
							if !bigref.In(0, b.Total, diff) {
								t.Errorf("σ=%g h=%g N=%d ξ=%g: |error| = %g > budget %g", sigma, h, n, xi, bigref.Float64(diff), b.Total)
							}
							if d := bigref.Float64(diff); d > 1e-13 {
								ratios = append(ratios, b.Total/d)
							}
						}
						if !bigref.In(0, ba.Total, diff) {
							t.Errorf("σ=%g h=%g N=%d ξ=%g shift %g: |error| = %g > any-shift budget %g", sigma, h, n, xi, s, bigref.Float64(diff), ba.Total)
						}
					}
				}
			}
		}
	}
	sort.Float64s(ratios)
	t.Logf("family budget / actual error at the grid's shift: median %.4g, max %.4g (%d cases)", ratios[len(ratios)/2], ratios[len(ratios)-1], len(ratios))
}

// The rounding item alone must cover the floating-point error of the sum:
// the float64 sum against the exact finite sum in math/big.
func TestRoundingBoundCoversFloatSum(t *testing.T) {
	ctx := context.Background()
	for _, n := range []int64{11, 101, 1001} {
		for _, xi := range []float64{0, 3.3} {
			g := GaussianFamily{Sigma: float64(n) / 20}
			grid := Grid{Step: 0.37, Shift: 0.1, Count: n}
			b, err := FamilyBudget(ctx, g, grid, Band{Center: xi}, BudgetOptions{})
			if err != nil {
				t.Fatal(err)
			}
			lo, hi := grid.Indices()
			exact := gaussianSampledBig(g.Sigma, grid.Step, grid.Shift, xi, lo, hi)
			got := naiveGaussianSum(g.Sigma, grid, xi)
			diff := bigref.C(real(got), imag(got)).Sub(exact).Abs()
			if !bigref.In(0, b.Rounding, diff) {
				t.Errorf("N=%d ξ=%g: rounding error %g > bound %g", n, xi, bigref.Float64(diff), b.Rounding)
			}
			t.Logf("N=%d ξ=%g: rounding error %.3g, bound %.3g", n, xi, bigref.Float64(diff), b.Rounding)
		}
	}
}

// Over a band, the certified sup must exceed the error at every frequency
// of a dense set (computed exactly by AliasSum), and not by much.
func TestFamilyBudgetBandSup(t *testing.T) {
	ctx := context.Background()
	g := GaussianFamily{Sigma: 1}
	grid := Grid{Step: 0.9, Shift: 0.2, Count: 15}
	band := Band{Center: 0.3, HalfWidth: 2}
	b, err := FamilyBudget(ctx, g, grid, band, BudgetOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var worstA, worstT float64
	for i := 0; i <= 400; i++ {
		xi := band.Center - band.HalfWidth + 2*band.HalfWidth*float64(i)/400
		r, err := AliasSum(ctx, g, grid, xi, Settings{})
		if err != nil {
			t.Fatal(err)
		}
		worstA = math.Max(worstA, r.Alias.Mig())
		worstT = math.Max(worstT, r.Truncation.Mig())
	}
	if worstA > b.Aliasing || worstT > b.Truncation {
		t.Errorf("band sup: aliasing %g (bound %g), truncation %g (bound %g)", worstA, b.Aliasing, worstT, b.Truncation)
	}
	t.Logf("band sup over %d pieces: aliasing bound/observed %.4g, truncation %.4g", b.Pieces, b.Aliasing/worstA, b.Truncation/worstT)
	if b.Aliasing > 1.05*worstA {
		t.Errorf("aliasing sup %g is more than 5%% above the dense-set maximum %g", b.Aliasing, worstA)
	}
}

// An envelope budget holds for any function under the envelopes; for the
// Gaussian family, whose envelopes are the function and its transform, it
// must cover the family's exact budget items.
func TestEnvelopeBudgetCoversFamily(t *testing.T) {
	ctx := context.Background()
	g := GaussianFamily{Sigma: 1.3}
	for _, grid := range []Grid{{Step: 0.8, Shift: 0.1, Count: 9}, {Step: 1.4, Shift: -0.3, Count: 12}, {Step: 0.5}} {
		for _, band := range []Band{{}, {Center: 0.4}, {HalfWidth: 1.5}} {
			for _, any := range []bool{false, true} {
				opt := BudgetOptions{AnyShift: any}
				fb, err := FamilyBudget(ctx, g, grid, band, opt)
				if err != nil {
					t.Fatal(err)
				}
				eb, err := EnvelopeBudget(ctx, g.Spatial(), g.Spectral(), grid, band, opt)
				if err != nil {
					t.Fatal(err)
				}
				if eb.Aliasing < fb.Aliasing*(1-1e-12) || eb.Truncation < fb.Truncation*(1-1e-12) {
					t.Errorf("grid %+v band %+v any=%v: envelope %+v below family %+v", grid, band, any, eb, fb)
				}
			}
		}
	}
}

func TestBudgetBadInput(t *testing.T) {
	ctx := context.Background()
	g := GaussianFamily{Sigma: 1}
	_, err := FamilyBudget(ctx, g, Grid{Step: 1, Count: 5}, Band{HalfWidth: -1}, BudgetOptions{})
	if !errors.Is(err, ErrInvalid) {
		t.Errorf("negative half-width: %v", err)
	}
	_, err = FamilyBudget(ctx, g, Grid{Step: 1, Count: 5}, Band{}, BudgetOptions{SampleUlps: math.Inf(1)})
	if !errors.Is(err, ErrInvalid) {
		t.Errorf("infinite sample ulps: %v", err)
	}
	spec := Envelope{{Decay: Algebraic, Amplitude: 1, Width: 1, Power: 1}}
	_, err = EnvelopeBudget(ctx, g.Spatial(), spec, Grid{Step: 1, Count: 5}, Band{}, BudgetOptions{})
	var pe *ParamError
	if !errors.As(err, &pe) || pe.Param != "spectral" {
		t.Errorf("unsummable spectrum: %v, want a ParamError naming spectral", err)
	}
}

func BenchmarkEnvelopeBudget(b *testing.B) {
	ctx := context.Background()
	spat := Envelope{{Decay: Exponential, Amplitude: 2, Rate: 1}}
	spec := Envelope{{Decay: Exponential, Amplitude: 3, Rate: 0.8}}
	for _, tt := range []struct {
		name string
		opt  BudgetOptions
		band Band
	}{
		{"integral", BudgetOptions{}, Band{}},
		{"integral/any-shift", BudgetOptions{AnyShift: true}, Band{}},
		{"band/any-shift", BudgetOptions{AnyShift: true}, Band{HalfWidth: 2}},
	} {
		b.Run(tt.name, func(b *testing.B) {
			b.ReportAllocs()
			var sink Budget
			for i := 0; i < b.N; i++ {
				sink, _ = EnvelopeBudget(ctx, spat, spec, Grid{Step: 0.5, Count: 64}, tt.band, tt.opt)
			}
			_ = sink
		})
	}
}
