package bounds

import (
	"context"
	"fmt"
	"math"
	"sort"
	"testing"
)

// envelopeClassFamilies lists the families whose envelopes are exercised;
// every catalogue family should appear here.
func envelopeClassFamilies() []Family {
	return []Family{
		GaussianFamily{Sigma: 0.7},
		GaussianFamily{Sigma: 1.6},
		ExponentialFamily{Rate: 1.3},
		LorentzianFamily{Width: 0.8},
		SechFamily{Width: 0.9},
		SechSquaredFamily{Width: 1.2},
		WavePacketFamily{Sigma: 1, Omega0: 2.5},
		FejerFamily{Omega: 3},
		BSplineFamily{Order: 3},
		BSplineFamily{Order: 6},
		KaiserBesselFamily{Width: 4, Beta: 9},
		ShiftFamily{By: 0.4, Of: SechFamily{Width: 0.6}},
		ModulationFamily{Omega0: 1.5, Of: LorentzianFamily{Width: 1.1}},
	}
}

// TestEnvelopeBoundsCoverExactErrors is the check that the envelope bounds
// of math.md ("Envelopes and their bounds") are never below the true error
// for functions that satisfy the envelopes, over a parameter grid of
// steps, shifts, counts and frequencies. The true errors are AliasSum's
// exact alias and truncation enclosures (themselves checked against math/big
// references elsewhere); the bound must exceed their upper ends. It logs
// the tightness bound/true error per envelope class: median and max.
func TestEnvelopeBoundsCoverExactErrors(t *testing.T) {
	ctx := context.Background()
	ratios := map[string][]float64{}
	for _, f := range envelopeClassFamilies() {
		spat, spec := f.Spatial(), f.Spectral()
		summable := spec.RayTail(Point(100), 1, 1) < 1e300
		for _, h := range []float64{0.25, 0.5, 0.9, 1.4, 2.2} {
			for _, shift := range []float64{0, 0.13, -0.37} {
				for _, n := range []int64{0, 5, 12, 25} {
					for _, xi := range []float64{0, 0.6} {
						grid := Grid{Step: h, Shift: shift * h, Count: n}
						r, err := AliasSum(ctx, f, grid, xi, Settings{MaxTerms: 1 << 22})
						if err != nil {
							t.Fatalf("%v %+v ξ=%g: %v", f, grid, xi, err)
						}
						b, err := EnvelopeBudget(ctx, spat, spec, grid, Band{Center: xi}, BudgetOptions{})
						if err != nil {
							if !summable {
								continue // an unsummable spectrum has no aliasing bound
							}
							t.Fatalf("%v %+v ξ=%g: %v", f, grid, xi, err)
						}
						if a := r.Alias.Mag(); b.Aliasing < r.Alias.Mig() {
							t.Errorf("%v %+v ξ=%g: aliasing bound %g < |alias| %g", f, grid, xi, b.Aliasing, a)
						} else if m := r.Alias.Mig(); m > 1e-300 && summable {
							key := "aliasing, spectral " + spec.Kinds()
							ratios[key] = append(ratios[key], b.Aliasing/m)
						}
						if b.Truncation < r.Truncation.Mig() {
							t.Errorf("%v %+v ξ=%g: truncation bound %g < |truncation| %g", f, grid, xi, b.Truncation, r.Truncation.Mig())
						} else if m := r.Truncation.Mig(); m > 1e-300 {
							key := "truncation, spatial " + spat.Kinds()
							ratios[key] = append(ratios[key], b.Truncation/m)
						}
					}
				}
			}
		}
	}
	logRatios(t, ratios)
}

// logRatios prints median and max of each class's ratios, sorted by class.
func logRatios(t *testing.T, ratios map[string][]float64) {
	t.Helper()
	keys := make([]string, 0, len(ratios))
	for k := range ratios {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		r := ratios[k]
		sort.Float64s(r)
		t.Log(fmt.Sprintf("bound/true %-40s median %9.4g  max %9.4g  (%d cases)", k, r[len(r)/2], r[len(r)-1], len(r)))
	}
}

// For the Lorentzian 1/(a²+x²) at shift 0 the exponential-envelope alias
// bound 2B·cosh(βξ)/(e^{2πβ/h} - 1) is an equality (math.md; the spectral
// envelope (π/a)e^{-a|ξ|} is the transform itself and every copy has the
// same phase), for |ξ| ≤ π/h: EnvelopeBudget's aliasing must equal the
// exact alias sum to 1e-12.
func TestLorentzianEnvelopeBoundIsTight(t *testing.T) {
	ctx := context.Background()
	for _, a := range []float64{0.5, 1, 2} {
		f := LorentzianFamily{Width: a}
		for _, h := range []float64{0.3, 0.8, 1.5, 3} {
			for _, frac := range []float64{0, 0.3, 0.9} {
				xi := frac * math.Pi / h
				grid := Grid{Step: h}
				r, err := AliasSum(ctx, f, grid, xi, Settings{})
				if err != nil {
					t.Fatal(err)
				}
				b, err := EnvelopeBudget(ctx, f.Spatial(), f.Spectral(), grid, Band{Center: xi}, BudgetOptions{})
				if err != nil {
					t.Fatal(err)
				}
				exact := r.Alias.Re.Mid()
				if ratio := b.Aliasing / exact; ratio < 1 || ratio > 1+1e-12 {
					t.Errorf("a=%g h=%g ξ=%g: envelope bound / exact alias = %.17g, want 1 to 1e-12", a, h, xi, ratio)
				}
			}
		}
	}
}
