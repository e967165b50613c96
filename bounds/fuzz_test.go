package bounds

import (
	"context"
	"math"
	"testing"
)

// FuzzAliasSum feeds arbitrary parameters to AliasSum and FamilyBudget:
// they must return an error or finite enclosures, never panic or NaN; the
// two sides of the Poisson formula must give intersecting enclosures of
// the sampled sum, and the budget must cover the exact error.
// The seed corpus runs in every `go test`.
func FuzzAliasSum(f *testing.F) {
	f.Add(1.0, 0.5, 0.0, 0.0, int64(0))
	f.Add(1.0, 0.5, 0.1, 0.7, int64(21))
	f.Add(0.3, 2.0, -0.4, 3.0, int64(4))
	f.Add(5.0, 0.01, 1e3, -2.0, int64(1001))
	f.Add(1e-300, 1e300, 0.0, 0.0, int64(1))
	f.Add(math.NaN(), 1.0, 0.0, 0.0, int64(3))
	f.Add(1.0, math.Inf(1), 0.0, 0.0, int64(3))
	f.Add(1.0, 1.0, 1e20, 1e20, int64(-5))
	f.Add(1.0, 1e-9, 0.0, 0.0, int64(1<<40))
	f.Fuzz(func(t *testing.T, sigma, h, s, xi float64, n int64) {
		ctx := context.Background()
		set := Settings{MaxTerms: 20000}
		g := GaussianFamily{Sigma: sigma}
		grid := Grid{Step: h, Shift: s, Count: n}
		auto, err := AliasSum(ctx, g, grid, xi, set)
		if err != nil {
			return
		}
		for _, z := range []Complex{auto.Sampled, auto.Exact, auto.Error, auto.Alias, auto.Truncation} {
			if !z.IsFinite() || z.Re.Lo > z.Re.Hi || z.Im.Lo > z.Im.Hi {
				t.Fatalf("AliasSum(σ=%g, %+v, ξ=%g) = %+v: not a finite enclosure", sigma, grid, xi, auto)
			}
		}
		for _, side := range []Side{SpatialSide, SpectralSide} {
			set.Side = side
			other, err := AliasSum(ctx, g, grid, xi, set)
			if err != nil {
				continue
			}
			_, okRe := auto.Sampled.Re.Intersect(other.Sampled.Re)
			_, okIm := auto.Sampled.Im.Intersect(other.Sampled.Im)
			if !okRe || !okIm {
				t.Fatalf("σ=%g %+v ξ=%g: %v side T = %v disjoint from auto T = %v", sigma, grid, xi, side, other.Sampled, auto.Sampled)
			}
		}
		b, err := FamilyBudget(ctx, g, grid, Band{Center: xi}, BudgetOptions{Settings: Settings{MaxTerms: 20000}})
		if err != nil {
			return
		}
		if math.IsNaN(b.Total) || b.Total < auto.Error.Mig() {
			t.Fatalf("σ=%g %+v ξ=%g: budget %+v below |error| ≥ %g", sigma, grid, xi, b, auto.Error.Mig())
		}
	})
}
