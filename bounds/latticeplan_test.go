package bounds

import (
	"context"
	"fmt"
	"math"
	"testing"
)

// TestPetersenMiddletonSavings reproduces the density savings of the
// optimal sampling lattices for an isotropic band limit Ω.
//
// Derivation (Petersen & Middleton, Information and Control 5, 1962, from
// memory): reconstruction of the whole band needs every dual point m ≠ 0
// at |m| > 2Ω, that is, the balls of radius Ω about the dual points form a
// packing; the samples per unit volume are covol(L*)/(2π)ⁿ, least when
// the dual is the densest lattice packing. The density ratio of two
// lattices is the inverse ratio of the packing densities of their duals:
// square Z² (π/4) against hexagonal (π/(2√3)) gives √3/2, a saving of
// 1 - √3/2 ≈ 13.4%; cubic Z³ (π/6) against face-centred cubic (π/(3√2),
// the dual of BCC) gives 1/√2, a saving of ≈ 29.3%; against BCC (π√3/8,
// the dual of FCC) 4/(3√3), a saving of ≈ 23.0%; D4 (dual similar to D4,
// π²/16) against Z⁴ (π²/32) halves the samples (packing densities from
// Conway & Sloane, Sphere Packings, Lattices and Groups, 1988, Table 1.2,
// from memory). The integral (ξ = 0 only) needs |m| > Ω instead: the same
// ratios, with 2ⁿ times fewer samples.
//
// Tolerance: the plans locate the critical scale to a relative 2⁻⁴⁰, so
// savings agree to 1e-9.
func TestPetersenMiddletonSavings(t *testing.T) {
	const omega = 3.0
	band := Envelope{{Decay: Compact, Amplitude: 1, Width: omega}}
	recon, err := ReconstructionTarget(band, 1e-12)
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		dim    int
		name   string
		saving float64
		best   bool
	}{
		{2, "hexagonal", 1 - math.Sqrt(3)/2, true},
		{3, "bcc", 1 - 1/math.Sqrt2, true},
		{3, "fcc", 1 - 4/(3*math.Sqrt(3)), false},
		{4, "D4", 0.5, true},
	}
	for _, target := range []struct {
		name string
		tg   LatticeTarget
		// Nyquist scale of the cubic grid per axis (math.md, band limit):
		// h = 2π/Ω for the integral, π/Ω for the whole band.
		cubicScale float64
	}{
		{"integral", IntegralTarget(band, 1e-12), 2 * math.Pi / omega},
		{"reconstruction", recon, math.Pi / omega},
	} {
		for _, tt := range tests {
			cmp, err := CompareLattices(context.Background(), tt.dim, target.tg, nil, Settings{})
			if err != nil {
				t.Fatal(err)
			}
			if got := cmp.Reference.Scale; math.Abs(got-target.cubicScale) > 1e-9*target.cubicScale {
				t.Errorf("%s dim %d: cubic scale = %.12g, want %.12g", target.name, tt.dim, got, target.cubicScale)
			}
			var found bool
			for i, p := range cmp.Plans {
				if p.Lattice.Name() != tt.name {
					continue
				}
				found = true
				if math.Abs(p.Saving-tt.saving) > 1e-9 {
					t.Errorf("%s %s: saving = %.12f, want %.12f", target.name, tt.name, p.Saving, tt.saving)
				}
				if tt.best && i != 0 {
					t.Errorf("%s %s: ranked %d, want first", target.name, tt.name, i)
				}
				if p.Aliasing > target.tg.Tol {
					t.Errorf("%s %s: aliasing %g above the tolerance", target.name, tt.name, p.Aliasing)
				}
				t.Logf("%s %-9s scale %.10f density %.10f saving %.10f", target.name, tt.name, p.Scale, p.Density.Mid(), p.Saving)
			}
			if !found {
				t.Errorf("%s dim %d: %s not among the plans", target.name, tt.dim, tt.name)
			}
		}
	}
}

// trueEnvelopeSum sums Σ_{m≠0} P(|m| - band) over the dual of a·L directly:
// the dual generator 2π(W⁻¹)ᵀ/a from the test's own float64 inverse, every
// point out to a radius where the profile is below 1e-30 of the tolerance
// (Gaussian and exponential profiles only).
func trueEnvelopeSum(lat Lattice, a float64, term EnvelopeTerm, band, far float64) float64 {
	w := lat.Generator()
	n := len(w)
	inv := invFloat(w)
	d := make([][]float64, n)
	for i := range d {
		d[i] = make([]float64, n)
		for j := range d[i] {
			d[i][j] = 2 * math.Pi * inv[j][i] / a
		}
	}
	zero := make([]float64, n)
	sum := 0.0
	forEachPoint(d, zero, zero, far, func(k []int64, x []float64) {
		if isZero(k) {
			return
		}
		r := 0.0
		for _, v := range x {
			r += v * v
		}
		sum += profileValue(term, math.Max(0, math.Sqrt(r)-band))
	})
	return sum
}

// TestPlanCertifiedGaussian checks that each plan for a Gaussian or
// exponential spectral envelope meets its tolerance by the true envelope
// sum, and reports the price of certification: the largest scale whose
// true envelope sum meets the tolerance, found by the test's own
// bisection, against the planned scale.
func TestPlanCertifiedGaussian(t *testing.T) {
	z2, _ := IntegerLattice(2)
	z3, _ := IntegerLattice(3)
	tests := []struct {
		lat  Lattice
		term EnvelopeTerm
		band float64
		tol  float64
	}{
		{z2, EnvelopeTerm{Decay: Gaussian, Amplitude: 1, Width: 1}, 0, 1e-10},
		{Hexagonal(), EnvelopeTerm{Decay: Gaussian, Amplitude: 1, Width: 1}, 0, 1e-10},
		{Hexagonal(), EnvelopeTerm{Decay: Gaussian, Amplitude: 1, Width: 1}, 2, 1e-10},
		{Hexagonal(), EnvelopeTerm{Decay: Exponential, Amplitude: 1, Rate: 1}, 0, 1e-8},
		{z3, EnvelopeTerm{Decay: Gaussian, Amplitude: 1, Width: 1}, 0, 1e-12},
		{BodyCentredCubic(), EnvelopeTerm{Decay: Gaussian, Amplitude: 1, Width: 1}, 1, 1e-12},
		{D4(), EnvelopeTerm{Decay: Exponential, Amplitude: 2, Rate: 2}, 0, 1e-8},
	}
	for _, tt := range tests {
		target := LatticeTarget{Spectral: Envelope{tt.term}, Band: tt.band, Tol: tt.tol}
		p, err := PlanLattice(context.Background(), tt.lat, target, Settings{})
		if err != nil {
			t.Fatal(err)
		}
		// Radius where the profile falls below 1e-30·tol, plus the band.
		far := tt.band + 70*tt.term.Width
		if tt.term.Decay == Exponential {
			far = tt.band + (math.Log(tt.term.Amplitude/tt.tol)+70)/tt.term.Rate
		}
		sum := func(a float64) float64 { return trueEnvelopeSum(tt.lat, a, tt.term, tt.band, far) }
		if s := sum(p.Scale); s > tt.tol {
			t.Errorf("%v %v: true envelope sum %g at the planned scale %g exceeds %g", tt.lat, tt.term.Decay, s, p.Scale, tt.tol)
		}
		if p.Aliasing > tt.tol || p.Aliasing < sum(p.Scale)*(1-1e-9) {
			t.Errorf("%v: plan aliasing %g, true %g, tol %g", tt.lat, p.Aliasing, sum(p.Scale), tt.tol)
		}
		lo, hi := p.Scale, 2*p.Scale
		for sum(hi) <= tt.tol {
			hi *= 2
		}
		for i := 0; i < 50; i++ {
			m := (lo + hi) / 2
			if sum(m) <= tt.tol {
				lo = m
			} else {
				hi = m
			}
		}
		n := float64(tt.lat.Dim())
		t.Logf("%-9s %-11v band %g tol %g: planned scale %.6g, true largest %.6g: samples ×%.4f for certification (bound/true at plan %.3g)",
			tt.lat.Name(), tt.term.Decay, tt.band, tt.tol, p.Scale, lo, math.Pow(lo/p.Scale, n), p.Aliasing/sum(p.Scale))
	}
}

func TestLatticeAliasBoundCovers(t *testing.T) {
	// The bound covers the alias sum of a radial Gaussian at frequencies
	// |ξ| ≤ Band and several shifts, each computed as an enclosure by
	// LatticeAliasSum and checked there against direct sums
	// (TestLatticePoissonIdentity); and it covers the true envelope sum.
	for _, lat := range []Lattice{Hexagonal(), BodyCentredCubic()} {
		n := lat.Dim()
		g := newRadialGaussianND(n, 0.4, nil, nil)
		spec := g.Spectral()
		const band = 1.5
		b, err := LatticeAliasBound(context.Background(), lat, LatticeTarget{Spectral: spec.Profile, Band: band, Tol: 1}, Settings{})
		if err != nil {
			t.Fatal(err)
		}
		worst := 0.0
		for _, xs := range [][2]float64{{0, 0}, {band, 0}, {0.7, 0.3}, {-band / math.Sqrt2, 0.5}} {
			xi := make([]float64, n)
			shift := make([]float64, n)
			xi[0], xi[1] = xs[0], 0
			if xs[0] < 0 {
				xi[0], xi[1] = xs[0], xs[0]
			}
			shift[n-1] = xs[1]
			r, err := LatticeAliasSum(context.Background(), g, lat, shift, xi, Settings{Side: SpectralSide})
			if err != nil {
				t.Fatal(err)
			}
			if r.Alias.Mag() > b.Aliasing {
				t.Errorf("%v ξ=%v s=%v: |alias| ≤ %g above the bound %g", lat, xi, shift, r.Alias.Mag(), b.Aliasing)
			}
			worst = math.Max(worst, r.Alias.Mag())
		}
		t.Logf("%v: bound %.4g, largest alias found %.4g (ratio %.3g), %d dual points, remainder %.3g",
			lat, b.Aliasing, worst, b.Aliasing/worst, b.Points, b.Remainder)
	}
}

func TestLatticePlanErrors(t *testing.T) {
	ctx := context.Background()
	band := Envelope{{Decay: Compact, Amplitude: 1, Width: 3}}
	gauss := Envelope{{Decay: Gaussian, Amplitude: 1, Width: 1}}
	if _, err := ReconstructionTarget(gauss, 1e-9); err == nil {
		t.Error("ReconstructionTarget of a Gaussian envelope: want an error")
	} else {
		checkParamErr(t, err, ErrInvalid, "target.spectral[0]")
	}
	tests := []struct {
		name     string
		target   LatticeTarget
		extra    []Lattice
		dim      int
		set      Settings
		sentinel error
		param    string
	}{
		{"tol 0", IntegralTarget(band, 0), nil, 2, Settings{}, ErrInvalid, "target.tol"},
		{"band NaN", LatticeTarget{Spectral: band, Band: math.NaN(), Tol: 1}, nil, 2, Settings{}, ErrInvalid, "target.band"},
		{"empty", LatticeTarget{Tol: 1}, nil, 2, Settings{}, ErrInvalid, "target.spectral"},
		{"zero amplitude", IntegralTarget(Envelope{{Decay: Gaussian, Width: 1}}, 1), nil, 2, Settings{}, ErrInvalid, "target.spectral"},
		{"unsummable", IntegralTarget(Envelope{{Decay: Algebraic, Amplitude: 1, Width: 1, Power: 2}}, 1e-3), nil, 2, Settings{}, ErrInvalid, "target.spectral"},
		{"dimension 9", IntegralTarget(band, 1), nil, 9, Settings{}, ErrInvalid, "lattice.dim"},
		{"wrong candidate", IntegralTarget(band, 1), []Lattice{BodyCentredCubic()}, 2, Settings{}, ErrInvalid, "candidates[0]"},
		{"zero candidate", IntegralTarget(band, 1), []Lattice{{}}, 2, Settings{}, ErrInvalid, "candidates[0]"},
		{"work limit", IntegralTarget(gauss, 1e-300), nil, 4, Settings{MaxTerms: 50}, ErrWorkLimit, "settings.max_terms"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := CompareLattices(ctx, tt.dim, tt.target, tt.extra, tt.set)
			checkParamErr(t, err, tt.sentinel, tt.param)
		})
	}
}

func ExampleCompareLattices() {
	// Whole-band reconstruction of an isotropic band limit Ω = 1 in 2-D,
	// with a caller-given candidate: a rectangular grid with aspect 2.
	band := Envelope{{Decay: Compact, Amplitude: 1, Width: 1}}
	target, _ := ReconstructionTarget(band, 1e-9)
	rect, _ := NewLattice([][]float64{{1, 0}, {0, 2}})
	cmp, err := CompareLattices(context.Background(), 2, target, []Lattice{rect.Named("rect-1x2")}, Settings{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, p := range cmp.Plans {
		fmt.Printf("%-10s scale %.4f  samples/area %.4f  saving %5.1f%%\n", p.Lattice.Name(), p.Scale, p.Density.Mid(), 100*p.Saving)
	}
	// Output:
	// hexagonal  scale 3.6276  samples/area 0.0877  saving  13.4%
	// square     scale 3.1416  samples/area 0.1013  saving   0.0%
	// rect-1x2   scale 1.5708  samples/area 0.2026  saving -100.0%
}
