package bounds

import (
	"fmt"
	"math"
)

// Complex is a rectangular complex interval {a + ib : a in Re, b in Im}.
// Its operations round outward like those of Interval.
type Complex struct {
	Re, Im Interval
}

// RealC returns the complex interval x + i·0.
func RealC(x Interval) Complex { return Complex{Re: x} }

// PointC returns the degenerate complex interval at z.
func PointC(z complex128) Complex {
	return Complex{Point(real(z)), Point(imag(z))}
}

// String formats z as re + i·im with interval parts.
func (z Complex) String() string {
	return fmt.Sprintf("%v + i%v", z.Re, z.Im)
}

// IsFinite reports whether all four endpoints are finite.
func (z Complex) IsFinite() bool { return z.Re.IsFinite() && z.Im.IsFinite() }

// Contains reports whether w lies in z.
func (z Complex) Contains(w complex128) bool {
	return z.Re.Contains(real(w)) && z.Im.Contains(imag(w))
}

// Mid returns a point of z near its centre.
func (z Complex) Mid() complex128 { return complex(z.Re.Mid(), z.Im.Mid()) }

// Add returns z + w.
func (z Complex) Add(w Complex) Complex { return Complex{z.Re.Add(w.Re), z.Im.Add(w.Im)} }

// Sub returns z - w.
func (z Complex) Sub(w Complex) Complex { return Complex{z.Re.Sub(w.Re), z.Im.Sub(w.Im)} }

// Neg returns -z.
func (z Complex) Neg() Complex { return Complex{z.Re.Neg(), z.Im.Neg()} }

// Conj returns the complex conjugate of z.
func (z Complex) Conj() Complex { return Complex{z.Re, z.Im.Neg()} }

// Mul returns z·w.
func (z Complex) Mul(w Complex) Complex {
	return Complex{
		z.Re.Mul(w.Re).Sub(z.Im.Mul(w.Im)),
		z.Re.Mul(w.Im).Add(z.Im.Mul(w.Re)),
	}
}

// MulReal returns x·z for a real interval x.
func (z Complex) MulReal(x Interval) Complex { return Complex{z.Re.Mul(x), z.Im.Mul(x)} }

// Scale returns v·z for a float64 v.
func (z Complex) Scale(v float64) Complex { return Complex{z.Re.Scale(v), z.Im.Scale(v)} }

// Hull returns the smallest rectangle containing z and w.
func (z Complex) Hull(w Complex) Complex { return Complex{z.Re.Hull(w.Re), z.Im.Hull(w.Im)} }

// Mag returns an upper bound on |w| over w in z.
func (z Complex) Mag() float64 { return hypotUp(z.Re.Mag(), z.Im.Mag()) }

// Mig returns a lower bound on |w| over w in z.
func (z Complex) Mig() float64 { return hypotDown(z.Re.Mig(), z.Im.Mig()) }

// Scaling for hypotUp and hypotDown: operands beyond 2^±500 are scaled by
// the exact power 2^∓600 so that squaring neither overflows nor underflows.
const (
	hypotBig   = 0x1p500
	hypotSmall = 0x1p-500
	hypotDown2 = 0x1p-600
	hypotUp2   = 0x1p600
)

// hypotUp returns an upper bound on √(a² + b²) for a, b ≥ 0.
func hypotUp(a, b float64) float64 {
	m := fmax(a, b)
	switch {
	case math.IsInf(m, 1):
		return m
	case m > hypotBig:
		return mulUp(hypotUp(mulUp(a, hypotDown2), mulUp(b, hypotDown2)), hypotUp2)
	case m < hypotSmall && m > 0:
		return mulUp(hypotUp(a*hypotUp2, b*hypotUp2), hypotDown2)
	}
	return sqrtUp(addUp(mulUp(a, a), mulUp(b, b)))
}

// hypotDown returns a lower bound on √(a² + b²) for a, b ≥ 0.
func hypotDown(a, b float64) float64 {
	m := fmax(a, b)
	switch {
	case math.IsInf(m, 1):
		return m
	case m > hypotBig:
		return mulDown(hypotDown(mulDown(a, hypotDown2), mulDown(b, hypotDown2)), hypotUp2)
	case m < hypotSmall && m > 0:
		return mulDown(hypotDown(a*hypotUp2, b*hypotUp2), hypotDown2)
	}
	return sqrtDown(addDown(mulDown(a, a), mulDown(b, b)))
}

// Abs returns an enclosure of {|w| : w in z}.
func (z Complex) Abs() Interval { return Interval{z.Mig(), z.Mag()} }

// Inflate returns z widened by r in every direction (a disc of radius r is
// inside the result), used to add a bounded but unknown term.
func (z Complex) Inflate(r float64) Complex {
	r = math.Abs(r)
	reLo, reHi := addOut(z.Re.Lo, -r, z.Re.Hi, r)
	imLo, imHi := addOut(z.Im.Lo, -r, z.Im.Hi, r)
	return Complex{Interval{reLo, reHi}, Interval{imLo, imHi}}
}

// Cis returns e^{iθ} = cos θ + i sin θ. A point or thin θ costs one call
// to math.Sincos (see sinCos).
func Cis(theta Interval) Complex {
	s, c := sinCos(theta)
	return Complex{c, s}
}
