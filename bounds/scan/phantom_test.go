package scan

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"foldbound/bounds"
)

// lineIntegral integrates f along the line x·θ = s with gonum's
// Gauss–Legendre rule on 400 panels of [−60, 60] (the demo blobs vanish to
// below 1e-40 beyond |t| = 60).
func lineIntegral(p Phantom, phi, s float64) float64 {
	c, sn := math.Cos(phi), math.Sin(phi)
	f := func(t float64) float64 { return p.Value(s*c-t*sn, s*sn+t*c) }
	const panels, half = 400, 60.0
	var sum float64
	for i := range panels {
		lo := -half + 2*half*float64(i)/panels
		hi := -half + 2*half*float64(i+1)/panels
		sum += quad.Fixed(f, lo, hi, 12, quad.Legendre{}, 0)
	}
	return sum
}

// TestProjectionMatchesLineIntegrals checks the closed-form Radon transform
// of isotropic and anisotropic Gaussian blobs against numerical line
// integrals (gonum integrate/quad, reference library).
func TestProjectionMatchesLineIntegrals(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name string
		p    Phantom
	}{
		{"isotropic", Phantom{Blobs: []Blob{{X: 1.5, Y: -2, SigmaU: 0.7, SigmaV: 0.7, Amplitude: 2}}}},
		{"anisotropic", Phantom{Blobs: []Blob{{X: -3, Y: 4, SigmaU: 2.5, SigmaV: 0.4, Angle: 1.1, Amplitude: -0.6}}}},
		{"demo", DemoPhantom()},
	}
	for _, tt := range tests {
		for _, phi := range []float64{0, 0.3, 1.2, math.Pi / 2, 2.9, 4.4} {
			for _, s := range []float64{-17, -5.5, -1, 0, 0.25, 3, 12.5} {
				got := tt.p.Projection(phi, s)
				want := lineIntegral(tt.p, phi, s)
				if math.Abs(got-want) > 1e-12*(1+math.Abs(want)) {
					t.Errorf("%s: Projection(%g, %g) = %.15g, want %.15g (quadrature)", tt.name, phi, s, got, want)
				}
			}
		}
	}
}

// TestIsotropicProjection checks the isotropic special case
// a·σ√(2π)·exp(−(s − c·θ)²/(2σ²)) stated in the brief (the Gaussian
// integral ∫ e^{−t²/(2σ²)} dt = σ√(2π), DLMF 7.4.2 with a change of variable).
func TestIsotropicProjection(t *testing.T) {
	t.Parallel()
	const a, sg, cx, cy = 1.7, 0.9, 2.0, -1.0
	p := Phantom{Blobs: []Blob{{X: cx, Y: cy, SigmaU: sg, SigmaV: sg, Angle: 0.4, Amplitude: a}}}
	for _, phi := range []float64{0, 1, 2, 3} {
		for _, s := range []float64{-2, 0, 1.5} {
			d := s - (cx*math.Cos(phi) + cy*math.Sin(phi))
			want := a * sg * math.Sqrt(2*math.Pi) * math.Exp(-d*d/(2*sg*sg))
			if got := p.Projection(phi, s); math.Abs(got-want) > 1e-14*math.Abs(want)+1e-300 {
				t.Errorf("Projection(%g, %g) = %.16g, want %.16g", phi, s, got, want)
			}
		}
	}
}

func TestPhantomExtent(t *testing.T) {
	t.Parallel()
	rho, omega, err := DemoPhantom().Extent(1e-3)
	if err != nil {
		t.Fatal(err)
	}
	// The demo phantom is built to fit a 40 mm cylinder (invented scenario).
	if rho > 20 {
		t.Errorf("Extent radius = %g, want ≤ 20 mm", rho)
	}
	// Smallest σ = 0.5 mm: Ω = √(2 ln 1000)/0.5.
	if want := math.Sqrt(2*math.Log(1000)) / 0.5; math.Abs(omega-want) > 1e-12*want {
		t.Errorf("Extent bandwidth = %g, want %g", omega, want)
	}
}

func TestPhantomInvalid(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name  string
		p     Phantom
		param string
	}{
		{"empty", Phantom{}, "phantom.blobs"},
		{"nan x", Phantom{Blobs: []Blob{{X: math.NaN(), SigmaU: 1, SigmaV: 1}}}, "phantom.blobs[0].x"},
		{"zero sigma", Phantom{Blobs: []Blob{{SigmaU: 1, SigmaV: 1}, {SigmaU: 0, SigmaV: 1}}}, "phantom.blobs[1].sigma_u"},
		{"inf amplitude", Phantom{Blobs: []Blob{{SigmaU: 1, SigmaV: 1, Amplitude: math.Inf(1)}}}, "phantom.blobs[0].amplitude"},
	}
	for _, tt := range tests {
		err := tt.p.Validate()
		var pe *bounds.ParamError
		if !errors.As(err, &pe) || pe.Param != tt.param || !errors.Is(err, bounds.ErrInvalid) {
			t.Errorf("%s: Validate() = %v, want ParamError %q wrapping ErrInvalid", tt.name, err, tt.param)
		}
	}
}
