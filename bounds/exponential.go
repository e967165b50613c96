package bounds

import (
	"fmt"
	"math"
)

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
func (e ExponentialFamily) Spatial() Envelope { return e.appendSpatial(nil) }

func (e ExponentialFamily) appendSpatial(dst Envelope) Envelope {
	return append(dst, EnvelopeTerm{Decay: Exponential, Amplitude: 1, Rate: e.Rate})
}

// Spectral is an algebraic term of power 2 with a plateau:
//
//	2a/(a²+ξ²) ≤ (2/a)·min(1, a²/ξ²) = (2/a)·(1 + max(0, |ξ| - a)/a)^{-2},
//
// amplitude 2/a (rounded up), plateau a, width a. The ratio envelope/F is
// 1 at 0 and at infinity and at most 2 (at |ξ| = a). (The plateau-free
// (4/a)(1 + |ξ|/a)^{-2}, from (a+|ξ|)² ≤ 2(a²+ξ²), is 2 at both ends.)
func (e ExponentialFamily) Spectral() Envelope { return e.appendSpectral(nil) }

func (e ExponentialFamily) appendSpectral(dst Envelope) Envelope {
	a := e.Rate
	return append(dst, EnvelopeTerm{Decay: Algebraic, Amplitude: divUp(2, a), Plateau: a, Width: a, Power: 2})
}

// latticeSum encloses the sampled sum of the infinite grid,
// T∞ = h Σ_{k∈Z} f(x_k) e^{-iξx_k}, x_k = s + hk, for every s in shift and
// ξ in xi, in closed form. The samples on either side of the kink at 0
// form two geometric series of ratios w = e^{-ah}e^{-iθ} and w̄, θ = ξh,
// both of modulus e^{-ah} < 1: with t ∈ [0, h) the first sample at or right
// of 0,
//
//	T∞/h = e^{-(a+iξ)t}/(1 - w) + e^{(a-iξ)(t-h)}/(1 - w̄),
//
// and over the common denominator |1 - w|² = 4e^{-ah}(sinh²(ah/2) + sin²(θ/2)),
//
//	T∞ = h·e^{-iξt}·(sinh(a(h-t)) + sinh(at)·e^{iθ}) / (2(sinh²(ah/2) + sin²(θ/2))),
//
// which is h·coth(ah/2) at t = 0, ξ = 0 (DLMF 4.36.3, from memory, read
// through the Poisson formula), and has no cancellation but the one in
// the true value. ok is false when the shifts do not agree on which sample
// is the first at or right of 0, or sinh overflows (a step of hundreds of
// decay lengths): the samples are then summed instead.
func (e ExponentialFamily) latticeSum(h float64, shift, xi Interval) (Complex, bool) {
	a := e.Rate
	k := math.Ceil(-shift.Mid() / h)
	if !(math.Abs(k) < 1<<52) {
		return Complex{}, false
	}
	kp := int64(k)
	t := position(h, kp, shift)
	if t.Lo < 0 {
		kp++
		t = position(h, kp, shift)
	}
	if t.Lo < 0 || position(h, kp-1, shift).Hi >= 0 {
		return Complex{}, false
	}
	H := Point(h)
	theta := xi.Scale(h)
	sinT, cosT := sinCos(theta)
	sh := Sinh(t.Scale(a))               // sinh(at)
	shc := Sinh(H.Sub(t).Scale(a))       // sinh(a(h - t))
	half := Sinh(H.Scale(0.5 * a)).Sqr() // sinh²(ah/2)
	den := half.Add(Sin(theta.Scale(0.5)).Sqr()).Scale(2)
	num := Complex{shc.Add(sh.Mul(cosT)), sh.Mul(sinT)}
	if !num.IsFinite() || !den.IsFinite() {
		return Complex{}, false // sinh overflows: few samples matter, sum them
	}
	T := num.Mul(Cis(xi.Mul(t).Neg())).MulReal(H.Div(den))
	return T, T.IsFinite()
}
