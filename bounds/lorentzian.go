package bounds

import "fmt"

// LorentzianFamily is f(x) = 1/(a² + x²), whose transform is
//
//	F(ξ) = (π/a)·e^{-a|ξ|}
//
// (Gradshteyn & Ryzhik 3.723.2, ∫₀^∞ cos(ξx)/(a²+x²) dx = (π/2a)e^{-a|ξ|},
// from memory; math.md, catalogue). f decays only like x⁻² but is analytic
// in the strip |Im x| < a, so F decays exponentially: alias sums converge
// fast on the spectral side. At shift 0 the exponential-envelope alias bound
// 2B·cosh(βξ)/(e^{2πβ/h} - 1) is an equality for this family (math.md).
type LorentzianFamily struct {
	Width float64 // a > 0, the half-width at half maximum
}

// NewLorentzian returns the Lorentzian of half-width a.
func NewLorentzian(a float64) (LorentzianFamily, error) {
	l := LorentzianFamily{Width: a}
	return l, l.Validate()
}

// Validate reports whether a is finite, positive and within the range where
// the envelopes are finite.
func (l LorentzianFamily) Validate() error {
	if !finite(l.Width) || l.Width <= 0 {
		return invalidf("lorentzian.width", "must be finite and > 0, got %g", l.Width)
	}
	return checkEnvelopeRange(l, "lorentzian.width", l.Width)
}

func (l LorentzianFamily) String() string { return fmt.Sprintf("lorentzian(width=%g)", l.Width) }

// Value encloses 1/(a² + x²), decreasing in |x|.
func (l LorentzianFamily) Value(x Interval) Complex {
	den := Point(l.Width).Sqr().Add(x.Sqr())
	r := den.Recip()
	if r.Lo < 0 {
		r.Lo = 0
	}
	return RealC(r)
}

// Transform encloses (π/a)·e^{-a|ξ|}, decreasing in |ξ|.
func (l LorentzianFamily) Transform(xi Interval) Complex {
	a := l.Width
	return RealC(Exp(xi.Abs().Scale(-a)).Mul(divPos(Pi, a)))
}

// Spatial is an algebraic term of power 2 with a plateau:
//
//	1/(a²+x²) ≤ min(1/a², 1/x²) = (1/a²)·(1 + max(0, |x| - a)/a)^{-2},
//
// amplitude 1/a² (rounded up), plateau a, width a. The ratio envelope/f
// is 1 at 0 and at infinity and at most 2 (at |x| = a). (The plateau-free
// (2/a²)(1 + |x|/a)^{-2}, from (a+|x|)² ≤ 2(a²+x²), is 2 at both ends, and
// the far tail decides how many samples the engine sums.)
func (l LorentzianFamily) Spatial() Envelope { return l.appendSpatial(nil) }

func (l LorentzianFamily) appendSpatial(dst Envelope) Envelope {
	a := l.Width
	return append(dst, EnvelopeTerm{Decay: Algebraic, Amplitude: Point(a).Sqr().Recip().Hi, Plateau: a, Width: a, Power: 2})
}

// Spectral is F itself: an exponential term of amplitude π/a (rounded up)
// and rate a.
func (l LorentzianFamily) Spectral() Envelope { return l.appendSpectral(nil) }

func (l LorentzianFamily) appendSpectral(dst Envelope) Envelope {
	return append(dst, EnvelopeTerm{Decay: Exponential, Amplitude: divUp(Pi.Hi, l.Width), Rate: l.Width})
}
