package bounds

import (
	"context"
	"math"
	"testing"
)

// poissonCase is a family with the steps that take its alias error from
// coarse (|E|/|F| ~ 1e-1) to fine (~1e-30, or as fine as its decay allows
// within the work limit).
type poissonCase struct {
	f     Family
	steps []float64
	tol   float64 // absolute Tol for the spectral side of slowly decaying spectra
	// absolute Tol for the spatial side of slowly decaying functions: an
	// x⁻² tail beyond X is about 1/X, so full accuracy is out of reach
	spatialTol float64
}

func poissonCases() []poissonCase {
	return []poissonCase{
		{f: GaussianFamily{Sigma: 1}, steps: []float64{4, 2.5, 1.5, 0.9, 0.6, 0.45}},
		{f: SechFamily{Width: 1}, steps: []float64{3, 1.5, 0.8, 0.4, 0.2, 0.13}},
		{f: SechSquaredFamily{Width: 1}, steps: []float64{3, 1.5, 0.8, 0.4, 0.2, 0.13}},
		{f: LorentzianFamily{Width: 1}, steps: []float64{3, 1.5, 0.8, 0.4, 0.25, 0.15}, spatialTol: 1e-4},
		{f: WavePacketFamily{Sigma: 1, Omega0: 2}, steps: []float64{2, 1.2, 0.7, 0.5, 0.35}},
		{f: ExponentialFamily{Rate: 1}, steps: []float64{3, 1, 0.3, 0.1}, tol: 1e-6},
		{f: FejerFamily{Omega: 2}, steps: []float64{5, 4, 3.5, 3, 2}, spatialTol: 1e-4},
		{f: BSplineFamily{Order: 4}, steps: []float64{2, 1.3, 0.7, 0.35, 0.2}, tol: 1e-14},
		{f: BSplineFamily{Order: 8}, steps: []float64{2, 1.3, 0.7, 0.35, 0.2}, tol: 1e-16},
		{f: ModulationFamily{Omega0: 1, Of: ShiftFamily{By: 0.3, Of: GaussianFamily{Sigma: 0.8}}}, steps: []float64{3, 1.5, 0.7, 0.4}},
		{f: SumFamily{Terms: []Family{SechFamily{Width: 0.5}, DilationFamily{By: 2, Of: GaussianFamily{Sigma: 1}}}}, steps: []float64{3, 1.2, 0.6, 0.3, 0.15}},
	}
}

// TestPoissonIdentityBothSides checks the Poisson summation formula (math.md,
// "Poisson summation"; Stein & Weiss 1971, Ch. VII, from memory) for every
// family: the spatial sum h Σ f(s+hk) e^{-iξ(s+hk)} and the spectral sum
// Σ_l F(ξ + 2πl/h) e^{i2πls/h}, each computed with its own certified tail,
// must give intersecting enclosures, from coarse to fine steps, with and
// without shift, at ξ = 0 and inside the principal band. Families whose
// transform is not absolutely summable (the box, the Kaiser-Bessel window)
// have only the spatial side and are checked against math/big elsewhere.
func TestPoissonIdentityBothSides(t *testing.T) {
	ctx := context.Background()
	for _, pc := range poissonCases() {
		lo, hi := math.Inf(1), 0.0
		for _, h := range pc.steps {
			for _, s := range []float64{0, 0.31 * h} {
				for _, frac := range []float64{0, 0.4} {
					xi := frac * math.Pi / h
					grid := Grid{Step: h, Shift: s}
					sp, err := AliasSum(ctx, pc.f, grid, xi, Settings{Side: SpatialSide, Tol: pc.spatialTol, MaxTerms: 1 << 22})
					if err != nil {
						t.Fatalf("%v h=%g spatial: %v", pc.f, h, err)
					}
					sc, err := AliasSum(ctx, pc.f, grid, xi, Settings{Side: SpectralSide, Tol: pc.tol, MaxTerms: 1 << 22})
					if err != nil {
						t.Fatalf("%v h=%g spectral: %v", pc.f, h, err)
					}
					_, okRe := sp.Sampled.Re.Intersect(sc.Sampled.Re)
					_, okIm := sp.Sampled.Im.Intersect(sc.Sampled.Im)
					if !okRe || !okIm {
						t.Errorf("%v h=%g s=%g ξ=%g: spatial T = %v and spectral T = %v are disjoint", pc.f, h, s, xi, sp.Sampled, sc.Sampled)
					}
					if F := sc.Exact.Mag(); F > 0 {
						r := sc.Alias.Mag() / F
						if r > 0 {
							lo, hi = math.Min(lo, r), math.Max(hi, r)
						}
					}
				}
			}
		}
		t.Logf("%-70v |E|/|F| from %.2g to %.2g", pc.f, hi, lo)
	}
}

// In two dimensions the identity for a separable product on a rectangular
// grid is the product of the one-dimensional ones; AliasSumND's two sides
// must agree likewise.
func TestPoissonIdentity2D(t *testing.T) {
	ctx := context.Background()
	f, err := NewSeparable(GaussianFamily{Sigma: 1}, SechFamily{Width: 0.7})
	if err != nil {
		t.Fatal(err)
	}
	rg, err := NewRadialGaussian(0.8, []float64{0.2, -0.1})
	if err != nil {
		t.Fatal(err)
	}
	for _, fam := range []FamilyND{f, rg} {
		for _, h := range []float64{2, 1, 0.5, 0.3} {
			grids := []Grid{{Step: h, Shift: 0.1}, {Step: 0.8 * h, Shift: -0.2}}
			for _, xi := range [][]float64{{0, 0}, {0.5, -0.3}} {
				sp, err := AliasSumND(ctx, fam, grids, xi, Settings{Side: SpatialSide})
				if err != nil {
					t.Fatal(err)
				}
				sc, err := AliasSumND(ctx, fam, grids, xi, Settings{Side: SpectralSide})
				if err != nil {
					t.Fatal(err)
				}
				_, okRe := sp.Sampled.Re.Intersect(sc.Sampled.Re)
				_, okIm := sp.Sampled.Im.Intersect(sc.Sampled.Im)
				if !okRe || !okIm {
					t.Errorf("%v h=%g ξ=%v: spatial %v and spectral %v disjoint", fam, h, xi, sp.Sampled, sc.Sampled)
				}
			}
		}
	}
}
