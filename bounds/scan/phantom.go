package scan

import (
	"fmt"
	"math"
)

// Blob is a 2-D Gaussian bump
//
//	f(x) = A·exp(−½ (x−c)ᵀ Σ⁻¹ (x−c)),  Σ = Q diag(σu², σv²) Qᵀ,
//
// centred at c = (X, Y), with standard deviations σu and σv along the axes
// u = (cos ψ, sin ψ) and v = (−sin ψ, cos ψ), ψ = Angle. σu = σv gives an
// isotropic blob. Its Radon transform (line integral over x·θ = s) is a 1-D
// Gaussian with the variance of Σ in the direction θ:
//
//	Rf(θ, s) = A·√(2π)·σu σv/σθ · exp(−(s − c·θ)²/(2σθ²)),
//	σθ² = θᵀΣθ = σu² cos²(φ−ψ) + σv² sin²(φ−ψ),  θ = (cos φ, sin φ)
//
// (integrate the Gaussian along the line; for σu = σv = σ this is
// A·σ√(2π)·exp(−(s − c·θ)²/(2σ²))). The tests check it against numerical
// line integrals (gonum integrate/quad).
type Blob struct {
	X, Y           float64 // centre c
	SigmaU, SigmaV float64 // σu, σv > 0
	Angle          float64 // ψ, radians
	Amplitude      float64 // A
}

// Phantom is a sum of Gaussian blobs: an analytic test object whose
// projections are known in closed form.
type Phantom struct {
	Blobs []Blob
}

// MaxBlobs bounds the size of a phantom.
const MaxBlobs = 1 << 12

// Validate checks every blob; errors name "phantom.blobs[i].field".
func (p Phantom) Validate() error {
	if len(p.Blobs) == 0 || len(p.Blobs) > MaxBlobs {
		return invalid("phantom.blobs", "need 1 to %d blobs, got %d", MaxBlobs, len(p.Blobs))
	}
	for i, b := range p.Blobs {
		path := fmt.Sprintf("phantom.blobs[%d].", i)
		for _, f := range []struct {
			name string
			v    float64
		}{{"x", b.X}, {"y", b.Y}, {"angle", b.Angle}, {"amplitude", b.Amplitude}} {
			if !finite(f.v) {
				return invalid(path+f.name, "must be finite, got %g", f.v)
			}
		}
		if err := positive(path+"sigma_u", b.SigmaU); err != nil {
			return err
		}
		if err := positive(path+"sigma_v", b.SigmaV); err != nil {
			return err
		}
	}
	return nil
}

// Value returns f(x, y).
func (p Phantom) Value(x, y float64) float64 {
	var sum float64
	for _, b := range p.Blobs {
		sum += b.value(x, y)
	}
	return sum
}

func (b Blob) value(x, y float64) float64 {
	c, s := math.Cos(b.Angle), math.Sin(b.Angle)
	dx, dy := x-b.X, y-b.Y
	u := (c*dx + s*dy) / b.SigmaU
	v := (-s*dx + c*dy) / b.SigmaV
	return b.Amplitude * math.Exp(-0.5*(u*u+v*v))
}

// Projection returns the Radon transform Rf(θ, s) = ∫_{x·θ=s} f, with
// θ = (cos φ, sin φ).
func (p Phantom) Projection(phi, s float64) float64 {
	c, sn := math.Cos(phi), math.Sin(phi)
	var sum float64
	for _, b := range p.Blobs {
		sum += b.projection(phi, c, sn, s)
	}
	return sum
}

func (b Blob) projection(phi, c, sn, s float64) float64 {
	return b.view(phi, c, sn).at(s)
}

// blobView is the projection of one blob at one view angle φ, a 1-D
// Gaussian amp·exp(−(s − centre)²/(2σθ²)); the sinograms compute it once
// per view.
type blobView struct {
	centre float64 // c·θ
	inv2v  float64 // 1/(2σθ²)
	amp    float64 // A·√(2π)·σu σv/σθ
}

func (b Blob) view(phi, c, sn float64) blobView {
	cu, su := math.Cos(phi-b.Angle), math.Sin(phi-b.Angle)
	v := b.SigmaU*b.SigmaU*cu*cu + b.SigmaV*b.SigmaV*su*su
	return blobView{
		centre: b.X*c + b.Y*sn,
		inv2v:  1 / (2 * v),
		amp:    b.Amplitude * math.Sqrt(2*math.Pi) * b.SigmaU * b.SigmaV / math.Sqrt(v),
	}
}

func (v blobView) at(s float64) float64 {
	d := s - v.centre
	return v.amp * math.Exp(-d*d*v.inv2v)
}

// Extent returns a radius ρ and an essential bandwidth Ω of the phantom at
// relative level ε ∈ (0, 1): every blob is below ε·A outside the disc of
// radius ρ, and its transform, A·2πσuσv·exp(−½ ξᵀΣξ), is below ε times its
// value at ξ = 0 for |ξ| > Ω. With t = √(2 ln(1/ε)),
//
//	ρ = max |c| + t·max(σu, σv),   Ω = t / min(σu, σv).
func (p Phantom) Extent(eps float64) (rho, omega float64, err error) {
	if err := p.Validate(); err != nil {
		return 0, 0, err
	}
	if !(eps > 0 && eps < 1) {
		return 0, 0, invalid("phantom.eps", "must lie in (0, 1), got %g", eps)
	}
	t := math.Sqrt(-2 * math.Log(eps))
	for _, b := range p.Blobs {
		rho = math.Max(rho, math.Hypot(b.X, b.Y)+t*math.Max(b.SigmaU, b.SigmaV))
		omega = math.Max(omega, t/math.Min(b.SigmaU, b.SigmaV))
	}
	return rho, omega, nil
}

// DemoPhantom returns invented demonstration data: a cross-section of a
// 40 mm test cylinder (ρ = 20 mm, units mm) holding five soft Gaussian
// blobs of various sizes, one of them elongated, placed so that several sit
// near the rim where angular undersampling shows first. It models no real
// object or patient.
func DemoPhantom() Phantom {
	return Phantom{Blobs: []Blob{
		{X: 0, Y: 0, SigmaU: 4, SigmaV: 4, Amplitude: 1},
		{X: 12, Y: 5, SigmaU: 0.6, SigmaV: 0.6, Amplitude: 0.8},
		{X: -8, Y: 13, SigmaU: 1.2, SigmaV: 0.5, Angle: 0.6, Amplitude: 0.7},
		{X: -14, Y: -9, SigmaU: 0.5, SigmaV: 0.5, Amplitude: 0.9},
		{X: 5, Y: -15, SigmaU: 0.8, SigmaV: 0.8, Amplitude: -0.5},
	}}
}
