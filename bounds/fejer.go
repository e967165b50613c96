package bounds

import "fmt"

// FejerFamily is the band-limited Fejér function
// f(x) = (sin(Ωx/2)/(Ωx/2))², whose transform is the triangle
//
//	F(ξ) = (2π/Ω)·max(0, 1 - |ξ|/Ω)
//
// (the triangle is the self-convolution of the band indicator of
// half-width Ω/2, whose inverse transform is a sinc; convolution theorem;
// math.md, catalogue). F vanishes for |ξ| ≥ Ω, so on an infinite grid with
// step h ≤ 2π/(Ω + |ξ|) there is no aliasing error at all; f decays only
// like x⁻².
type FejerFamily struct {
	Omega float64 // Ω > 0, the band limit (angular)
}

// NewFejer returns the Fejér function of band limit Ω.
func NewFejer(omega float64) (FejerFamily, error) {
	f := FejerFamily{Omega: omega}
	return f, f.Validate()
}

// Validate reports whether Ω is finite, positive and within the range where
// the envelopes are finite.
func (f FejerFamily) Validate() error {
	if !finite(f.Omega) || f.Omega <= 0 {
		return invalidf("fejer.omega", "must be finite and > 0, got %g", f.Omega)
	}
	return checkEnvelopeRange(f, "fejer.omega", f.Omega)
}

func (f FejerFamily) String() string { return fmt.Sprintf("fejer(omega=%g)", f.Omega) }

// Value encloses sinc²(Ωx/2), sinc u = sin(u)/u.
func (f FejerFamily) Value(x Interval) Complex {
	return RealC(Sinc(x.Scale(0.5 * f.Omega)).Sqr())
}

// Transform encloses (2π/Ω)·max(0, 1 - |ξ|/Ω), even and non-increasing in
// |ξ|.
func (f FejerFamily) Transform(xi Interval) Complex {
	t := Point(1).Sub(divPos(xi.Abs(), f.Omega)).Max(Point(0))
	return RealC(t.Mul(divPos(TwoPi, f.Omega)))
}

// Spatial bounds f by an algebraic term of power 2 with a plateau:
//
//	sinc²(u) ≤ min(1, u⁻²) = (1 + max(0, |u| - 1))^{-2},  u = Ωx/2,
//
// amplitude 1, plateau and width 2/Ω (both rounded up). The envelope
// touches f at 0 and near the crests of the side lobes, |u| ≈ (k+½)π.
// (The plateau-free 4(1+|u|)^{-2} ≥ min(1, u⁻²) is 4 times f at 0 and at
// the far crests.)
func (f FejerFamily) Spatial() Envelope { return f.appendSpatial(nil) }

func (f FejerFamily) appendSpatial(dst Envelope) Envelope {
	w := divUp(2, f.Omega)
	return append(dst, EnvelopeTerm{Decay: Algebraic, Amplitude: 1, Plateau: w, Width: w, Power: 2})
}

// Spectral is the band limit: F ≤ 2π/Ω (rounded up) on |ξ| ≤ Ω, 0 beyond.
func (f FejerFamily) Spectral() Envelope { return f.appendSpectral(nil) }

func (f FejerFamily) appendSpectral(dst Envelope) Envelope {
	return append(dst, EnvelopeTerm{Decay: Compact, Amplitude: divUp(TwoPi.Hi, f.Omega), Width: f.Omega})
}

// Constants for fejerSinc. sinc decreases on [0, u₁], u₁ = 4.4934… the
// first positive root of tan u = u (sinc'(u) = (u cos u - sin u)/u²), where
// it takes its least value cos u₁ = -0.21723362821…; for |u| ≥ fejerSincMono,
// |sinc u| ≤ 1/|u|.
const (
	fejerSincMono   = 4.49     // < u₁
	fejerSincMin    = -0.21724 // < cos u₁
	fejerSincSeries = 0x1p-4   // largest |u| summed as a series
)

// fejerSincBeyond is an upper bound of 1/fejerSincMono.
var fejerSincBeyond = divUp(1, fejerSincMono)

// fejerSincCoef encloses the Taylor coefficients (-1)ⁿ/(2n+1)!, n = 0…4,
// of sinc.
var fejerSincCoef = [5]Interval{
	Point(1),
	Point(-1).Div(Point(6)),
	Point(1).Div(Point(120)),
	Point(-1).Div(Point(5040)),
	Point(1).Div(Point(362880)),
}
