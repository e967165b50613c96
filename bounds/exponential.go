package bounds

import "fmt"

// ExponentialFamily is the two-sided exponential f(x) = e^{-a|x|}, whose
// transform is
//
//	F(ξ) = 2a/(a² + ξ²)
//
// (twice the Laplace transform of cos, ∫₀^∞ e^{-ax}cos(ξx) dx = a/(a²+ξ²),
// DLMF §1.14(iii), from memory; math.md, catalogue). f has a kink at 0, so F
// decays only like ξ⁻²: its alias sums converge slowly on the spectral side
// and fast on the spatial side.
type ExponentialFamily struct {
	Rate float64 // a > 0
}

// NewExponential returns the two-sided exponential of rate a.
func NewExponential(a float64) (ExponentialFamily, error) {
	e := ExponentialFamily{Rate: a}
	return e, e.Validate()
}

// Validate reports whether a is finite, positive and within the range where
// the envelopes are finite.
func (e ExponentialFamily) Validate() error {
	if !finite(e.Rate) || e.Rate <= 0 {
		return invalidf("exponential.rate", "must be finite and > 0, got %g", e.Rate)
	}
	return checkEnvelopeRange(e, "exponential.rate", e.Rate)
}

func (e ExponentialFamily) String() string { return fmt.Sprintf("exponential(rate=%g)", e.Rate) }

// Value encloses e^{-a|x|}, decreasing in |x|.
func (e ExponentialFamily) Value(x Interval) Complex {
	return RealC(Exp(x.Abs().Scale(-e.Rate)))
}

// Transform encloses 2a/(a² + ξ²), decreasing in |ξ|.
func (e ExponentialFamily) Transform(xi Interval) Complex {
	a := e.Rate
	den := Point(a).Sqr().Add(xi.Sqr())
	r := Point(2 * a).Div(den)
	if r.Lo < 0 {
		r.Lo = 0
	}
	return RealC(r)
}

// Spatial is f itself: one exponential term of amplitude 1 and rate a.
func (e ExponentialFamily) Spatial() Envelope {
	return Envelope{{Decay: Exponential, Amplitude: 1, Rate: e.Rate}}
}

// Spectral is an algebraic term of power 2 with a plateau:
//
//	2a/(a²+ξ²) ≤ (2/a)·min(1, a²/ξ²) = (2/a)·(1 + max(0, |ξ| - a)/a)^{-2},
//
// amplitude 2/a (rounded up), plateau a, width a. The ratio envelope/F is
// 1 at 0 and at infinity and at most 2 (at |ξ| = a). (The plateau-free
// (4/a)(1 + |ξ|/a)^{-2}, from (a+|ξ|)² ≤ 2(a²+ξ²), is 2 at both ends.)
func (e ExponentialFamily) Spectral() Envelope {
	a := e.Rate
	return Envelope{{Decay: Algebraic, Amplitude: divUp(2, a), Plateau: a, Width: a, Power: 2}}
}
