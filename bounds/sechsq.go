package bounds

import "fmt"

// SechSquaredFamily is f(x) = sech²(x/w), whose transform is
//
//	F(ξ) = πw²ξ / sinh(πwξ/2) = 2w·q(πwξ/2),  q(v) = v/sinh v,  F(0) = 2w
//
// (the residues of e^{-iξx}sech²x at its double poles x = iπ(k+½), from
// memory; math.md, catalogue, with w = 1). f and F are both analytic in
// strips and decay exponentially; F decays like |ξ|·e^{-πw|ξ|/2}.
type SechSquaredFamily struct {
	Width float64 // w > 0
}

// NewSechSquared returns sech²(x/w).
func NewSechSquared(w float64) (SechSquaredFamily, error) {
	s := SechSquaredFamily{Width: w}
	return s, s.Validate()
}

// Validate reports whether w is finite, positive and within the range where
// the envelopes are finite.
func (s SechSquaredFamily) Validate() error {
	if !finite(s.Width) || s.Width <= 0 {
		return invalidf("sech2.width", "must be finite and > 0, got %g", s.Width)
	}
	return checkEnvelopeRange(s, "sech2.width", s.Width)
}

func (s SechSquaredFamily) String() string { return fmt.Sprintf("sech2(width=%g)", s.Width) }

// Value encloses sech²(x/w).
func (s SechSquaredFamily) Value(x Interval) Complex {
	return RealC(Sech(divPos(x, s.Width)).Sqr())
}

// Transform encloses 2w·q(πwξ/2) with q(v) = v/sinh v.
func (s SechSquaredFamily) Transform(xi Interval) Complex {
	w := s.Width
	v := xi.Mul(Pi.Scale(w)).Scale(0.5)
	return RealC(XOverSinh(v).Scale(2 * w))
}

// Spatial bounds f by the square of the bound of sech (see SechFamily):
//
//	sech²(u) ≤ min(1, 4e^{-2|u|}) = e^{-2·max(0, |u| - ln 2)},  u = x/w:
//
// amplitude 1, rate 2/w, plateau w·ln 2; ratio envelope/f ≤ 25/16.
func (s SechSquaredFamily) Spatial() Envelope { return s.appendSpatial(nil) }

func (s SechSquaredFamily) appendSpatial(dst Envelope) Envelope {
	return append(dst, cappedExponential(1, mulUp(2, ln2.Hi), divDown(2, s.Width)))
}

// Spectral bounds F = 2w·q(v), v = πw|ξ|/2, by an exponential of rate
// slightly below πw/2:
//
//	2v/(1 - e^{-2v}) ≤ 2v + 1                 ((2v+1)e^{-2v} ≤ 1)
//	q(v) = 2v e^{-v}/(1 - e^{-2v}) ≤ (2v + 1)·e^{-v}
//	q(v)·e^{31v/32} ≤ (2v + 1)·e^{-v/32} ≤ B = 64·e^{-63/64} ≈ 23.9   (maximum at v = 31.5)
//	|F(ξ)| ≤ 2w·min(1, B·e^{-(31/32)·πw|ξ|/2})
//
// an exponential term of amplitude 2w, rate (31/64)πw and plateau
// ln(B)/rate, ln B = 6 ln 2 - 63/64. The ratio envelope/|F| is 1.016 at
// v = 31.5 and at most 1.64 for 10 ≤ v ≤ 60, the range where aliasing
// errors of double-precision interest (e^{-60} to e^{-10}) arise; it peaks
// at about 4 where the plateau ends (v ≈ 3.3).
func (s SechSquaredFamily) Spectral() Envelope { return s.appendSpectral(nil) }

func (s SechSquaredFamily) appendSpectral(dst Envelope) Envelope {
	w := s.Width
	rate := Pi.Scale(31.0 / 64).Scale(w).Lo
	lnB := ln2.Scale(6).AddFloat(-63.0 / 64).Hi
	return append(dst, cappedExponential(mulUp(2, w), lnB, rate))
}

// xOverSinhCoef encloses the Taylor coefficients c₁…c₅ of
//
//	v/sinh v = 1 + Σ_{n≥1} c_n v^{2n} = 1 + 2·Σ_{n≥1} (-1)ⁿ η(2n)·(v/π)^{2n}
//	         = 1 - v²/6 + 7v⁴/360 - 31v⁶/15120 + 127v⁸/604800 - 73v¹⁰/3421440 + …
//
// where η is the Dirichlet eta function, 0 < η(2n) ≤ 1; the series follows
// from the partial fractions v/sinh v = 1 + 2v²·Σ_{k≥1} (-1)^k/(v² + k²π²)
// (DLMF 4.36, from memory) and converges for |v| < π.
var xOverSinhCoef = [5]Interval{
	Point(-1).Div(Point(6)),
	Point(7).Div(Point(360)),
	Point(-31).Div(Point(15120)),
	Point(127).Div(Point(604800)),
	Point(-73).Div(Point(3421440)),
}

// xOverSinhSeries is the largest |v| at which q is summed as a series.
const xOverSinhSeries = 0x1p-4
