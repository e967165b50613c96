package bounds

import (
	"fmt"
	"math"
)

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
	return RealC(fejerSinc(x.Scale(0.5 * f.Omega)).Sqr())
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
func (f FejerFamily) Spatial() Envelope {
	w := divUp(2, f.Omega)
	return Envelope{{Decay: Algebraic, Amplitude: 1, Plateau: w, Width: w, Power: 2}}
}

// Spectral is the band limit: F ≤ 2π/Ω (rounded up) on |ξ| ≤ Ω, 0 beyond.
func (f FejerFamily) Spectral() Envelope {
	return Envelope{{Decay: Compact, Amplitude: divUp(TwoPi.Hi, f.Omega), Width: f.Omega}}
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

// fejerSinc encloses sinc u = sin(u)/u (sinc 0 = 1) over the interval u.
// sinc is even; on |u| ≤ u₁ it is decreasing in |u| and is evaluated at the
// endpoints; beyond, sin(u)/u is enclosed by interval division and
// intersected with |sinc u| ≤ 1/|u|.
func fejerSinc(u Interval) Interval {
	a := u.Abs()
	switch {
	case a.Hi <= fejerSincMono:
		return Interval{fejerSincPoint(a.Hi).Lo, fejerSincPoint(a.Lo).Hi}
	case a.Lo <= fejerSincMono:
		// The interval covers the decreasing piece [a.Lo, u₁] and reaches
		// beyond it, where |sinc| ≤ 1/u₁.
		return Interval{fejerSincMin, math.Max(fejerSincPoint(a.Lo).Hi, fejerSincBeyond)}
	}
	r := Sin(a).Div(a)
	m := divUp(1, a.Lo)
	return Interval{math.Max(r.Lo, -m), math.Min(r.Hi, m)}
}

// fejerSincCoef encloses the Taylor coefficients (-1)ⁿ/(2n+1)!, n = 0…4,
// of sinc.
var fejerSincCoef = [5]Interval{
	Point(1),
	Point(-1).Div(Point(6)),
	Point(1).Div(Point(120)),
	Point(-1).Div(Point(5040)),
	Point(1).Div(Point(362880)),
}

// fejerSincPoint encloses sinc t for t ≥ 0. For t ≤ 1/16 it sums the
// alternating series (DLMF 4.19.1, from memory)
//
//	sinc t = 1 - t²/3! + t⁴/5! - t⁶/7! + t⁸/9! - R,  0 ≤ R ≤ t¹⁰/11! < 3·10⁻²⁰,
//
// whose terms decrease in magnitude for t < √6; beyond, it divides an
// enclosure of sin t by t.
func fejerSincPoint(t float64) Interval {
	if t > fejerSincSeries {
		r := divPos(Sin(Point(t)), t)
		return Interval{math.Max(-1, r.Lo), math.Min(1, r.Hi)}
	}
	u2 := Point(t).Sqr()
	p := fejerSincCoef[4]
	for i := 3; i >= 0; i-- {
		p = p.Mul(u2).Add(fejerSincCoef[i])
	}
	// p = 1 - t²/6 + t⁴/120 - t⁶/5040 + t⁸/362880; the next term is
	// -t¹⁰/11! and the remainder lies between it and 0.
	rem := divUp(mulUp(mulUp(u2.Hi, u2.Hi), mulUp(mulUp(u2.Hi, u2.Hi), u2.Hi)), 39916800)
	return Interval{addDown(p.Lo, -rem), math.Min(1, p.Hi)}
}
