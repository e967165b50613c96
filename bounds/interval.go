package bounds

import (
	"fmt"
	"math"
)

// Interval is a closed interval [Lo, Hi] of real numbers. Every operation on
// intervals rounds outward, so the result contains the exact result of the
// operation applied to any points of the operands (see "Accuracy" in the
// package documentation).
//
// The zero value is the point 0. An interval with Lo > Hi, or with a NaN
// endpoint, is not valid; operations never produce one from valid operands.
// Endpoints may be infinite after overflow; IsFinite reports this.
type Interval struct {
	Lo, Hi float64
}

// Point returns the degenerate interval [x, x].
func Point(x float64) Interval { return Interval{x, x} }

// Span returns the interval [lo, hi], swapping the endpoints if needed.
func Span(lo, hi float64) Interval {
	if lo > hi {
		lo, hi = hi, lo
	}
	return Interval{lo, hi}
}

// Entire is the interval (-∞, +∞).
var entire = Interval{math.Inf(-1), math.Inf(1)}

// Entire returns the interval (-∞, +∞), the result of operations whose
// range cannot be bounded, such as division by an interval containing zero.
func Entire() Interval { return entire }

// String formats x as [lo, hi] with 17 significant digits.
func (x Interval) String() string {
	return fmt.Sprintf("[%.17g, %.17g]", x.Lo, x.Hi)
}

// IsFinite reports whether both endpoints are finite numbers.
func (x Interval) IsFinite() bool {
	// A NaN fails both comparisons.
	return math.Abs(x.Lo) <= math.MaxFloat64 && math.Abs(x.Hi) <= math.MaxFloat64
}

// Contains reports whether v lies in x.
func (x Interval) Contains(v float64) bool { return x.Lo <= v && v <= x.Hi }

// ContainsInterval reports whether y ⊆ x.
func (x Interval) ContainsInterval(y Interval) bool { return x.Lo <= y.Lo && y.Hi <= x.Hi }

// ContainsZero reports whether 0 lies in x.
func (x Interval) ContainsZero() bool { return x.Lo <= 0 && 0 <= x.Hi }

// Mid returns a point of x near its middle (exactly representable).
func (x Interval) Mid() float64 {
	if x.Lo == x.Hi {
		return x.Lo
	}
	m := 0.5*x.Lo + 0.5*x.Hi
	if math.IsInf(m, 0) || math.IsNaN(m) {
		switch {
		case math.IsInf(x.Lo, -1) && math.IsInf(x.Hi, 1):
			return 0
		case math.IsInf(x.Lo, -1):
			return -math.MaxFloat64
		case math.IsInf(x.Hi, 1):
			return math.MaxFloat64
		}
	}
	return m
}

// Width returns an upper bound on Hi - Lo.
func (x Interval) Width() float64 { return addUp(x.Hi, -x.Lo) }

// Mag returns max |v| over v in x (the magnitude), an exact value.
func (x Interval) Mag() float64 { return fmax(math.Abs(x.Lo), math.Abs(x.Hi)) }

// Mig returns min |v| over v in x (the mignitude), an exact value.
func (x Interval) Mig() float64 {
	if x.ContainsZero() {
		return 0
	}
	return fmin(math.Abs(x.Lo), math.Abs(x.Hi))
}

// RelWidth returns an upper bound on the width of x relative to its
// magnitude, (Hi-Lo)/Mag; 0 for the point 0.
func (x Interval) RelWidth() float64 {
	m := x.Mag()
	switch {
	case m == 0:
		return 0
	case math.IsInf(m, 1):
		return math.Inf(1)
	}
	return divUp(x.Width(), m)
}

// Hull returns the smallest interval containing x and y.
func (x Interval) Hull(y Interval) Interval {
	return Interval{fmin(x.Lo, y.Lo), fmax(x.Hi, y.Hi)}
}

// Intersect returns x ∩ y and whether it is non-empty.
func (x Interval) Intersect(y Interval) (Interval, bool) {
	z := Interval{fmax(x.Lo, y.Lo), fmin(x.Hi, y.Hi)}
	return z, z.Lo <= z.Hi
}

// Neg returns -x (exact).
func (x Interval) Neg() Interval { return Interval{-x.Hi, -x.Lo} }

// Abs returns {|v| : v in x} (exact).
func (x Interval) Abs() Interval {
	switch {
	case x.Lo >= 0:
		return x
	case x.Hi <= 0:
		return x.Neg()
	default:
		return Interval{0, fmax(-x.Lo, x.Hi)}
	}
}

// Add returns x + y.
func (x Interval) Add(y Interval) Interval {
	lo, hi := addOut(x.Lo, y.Lo, x.Hi, y.Hi)
	return Interval{lo, hi}
}

// Sub returns x - y.
func (x Interval) Sub(y Interval) Interval {
	lo, hi := subOut(x.Lo, y.Hi, x.Hi, y.Lo)
	return Interval{lo, hi}
}

// AddFloat returns x + v.
func (x Interval) AddFloat(v float64) Interval {
	lo, hi := addOut(x.Lo, v, x.Hi, v)
	return Interval{lo, hi}
}

// Mul returns x * y. A zero endpoint times an infinite one counts as zero,
// as in IEEE 1788 interval arithmetic, so no NaN arises. The endpoints are
// chosen by the signs of x and y (two products, four when both contain 0).
func (x Interval) Mul(y Interval) Interval {
	switch {
	case x.Lo >= 0:
		switch {
		case y.Lo >= 0:
			return mulIv(x.Lo, y.Lo, x.Hi, y.Hi)
		case y.Hi <= 0:
			return mulIv(x.Hi, y.Lo, x.Lo, y.Hi)
		default:
			return mulIv(x.Hi, y.Lo, x.Hi, y.Hi)
		}
	case x.Hi <= 0:
		switch {
		case y.Lo >= 0:
			return mulIv(x.Lo, y.Hi, x.Hi, y.Lo)
		case y.Hi <= 0:
			return mulIv(x.Hi, y.Hi, x.Lo, y.Lo)
		default:
			return mulIv(x.Lo, y.Hi, x.Lo, y.Lo)
		}
	}
	// x contains 0 in its interior.
	switch {
	case y.Lo >= 0:
		return mulIv(x.Lo, y.Hi, x.Hi, y.Hi)
	case y.Hi <= 0:
		return mulIv(x.Hi, y.Lo, x.Lo, y.Lo)
	}
	return Interval{
		fmin(mulDown(x.Lo, y.Hi), mulDown(x.Hi, y.Lo)),
		fmax(mulUp(x.Lo, y.Lo), mulUp(x.Hi, y.Hi)),
	}
}

// mulPos returns x·y for x, y ⊆ [0, ∞] (the caller's invariant): Mul
// without its sign cases, one call.
func (x Interval) mulPos(y Interval) Interval {
	lo, hi := mulOut(x.Lo, y.Lo, x.Hi, y.Hi)
	return Interval{lo, hi}
}

// mulIv is the interval [mulDown(a, b), mulUp(c, d)].
func mulIv(a, b, c, d float64) Interval {
	lo, hi := mulOut(a, b, c, d)
	return Interval{lo, hi}
}

// Scale returns v * x for a float64 v; a NaN v gives Entire.
func (x Interval) Scale(v float64) Interval {
	var lo, hi float64
	switch {
	case v >= 0:
		lo, hi = mulOut(x.Lo, v, x.Hi, v)
	case v < 0:
		lo, hi = mulOut(x.Hi, v, x.Lo, v)
	default:
		return entire
	}
	return Interval{lo, hi}
}

// scale2 returns k·x for k = ±2^j (as 0.5, -0.5, 2): exact, with no
// rounding to direct, unless an endpoint is subnormal-small or the product
// overflows; then it is Scale.
func (x Interval) scale2(k float64) Interval {
	lo, hi := x.Lo*k, x.Hi*k
	if k < 0 {
		lo, hi = hi, lo
	}
	if (x.Lo == 0 || math.Abs(x.Lo) >= 0x1p-1020) && (x.Hi == 0 || math.Abs(x.Hi) >= 0x1p-1020) &&
		math.Abs(lo) <= math.MaxFloat64 && math.Abs(hi) <= math.MaxFloat64 {
		return Interval{lo, hi}
	}
	return x.Scale(k)
}

// Sqr returns {v² : v in x}, tighter than x.Mul(x) when x contains 0.
func (x Interval) Sqr() Interval {
	a := x.Abs()
	lo, hi := mulOut(a.Lo, a.Lo, a.Hi, a.Hi)
	return Interval{lo, hi}
}

// Div returns x / y. If y contains 0 the result is Entire.
//
// The endpoints are chosen by the signs of x and y (IEEE 1788, Table 3 —
// from memory), so that no ∞/∞ arises from valid operands.
func (x Interval) Div(y Interval) Interval {
	switch {
	case y.Lo > 0:
		switch {
		case x.Lo >= 0:
			return Interval{divDown(x.Lo, y.Hi), divUp(x.Hi, y.Lo)}
		case x.Hi <= 0:
			return Interval{divDown(x.Lo, y.Lo), divUp(x.Hi, y.Hi)}
		default:
			return Interval{divDown(x.Lo, y.Lo), divUp(x.Hi, y.Lo)}
		}
	case y.Hi < 0:
		switch {
		case x.Lo >= 0:
			return Interval{divDown(x.Hi, y.Hi), divUp(x.Lo, y.Lo)}
		case x.Hi <= 0:
			return Interval{divDown(x.Hi, y.Lo), divUp(x.Lo, y.Hi)}
		default:
			return Interval{divDown(x.Hi, y.Hi), divUp(x.Lo, y.Hi)}
		}
	}
	return entire
}

// Recip returns 1 / x. If x contains 0 the result is Entire.
func (x Interval) Recip() Interval {
	if x.ContainsZero() {
		return entire
	}
	return Interval{divDown(1, x.Hi), divUp(1, x.Lo)}
}

// Max returns {max(u, v) : u in x, v in y}.
func (x Interval) Max(y Interval) Interval {
	return Interval{fmax(x.Lo, y.Lo), fmax(x.Hi, y.Hi)}
}

// Min returns {min(u, v) : u in x, v in y}.
func (x Interval) Min(y Interval) Interval {
	return Interval{fmin(x.Lo, y.Lo), fmin(x.Hi, y.Hi)}
}

// IntPow returns x^n for an integer n. The power is monotone on each side
// of 0, so it is evaluated at the endpoints by repeated squaring in interval
// arithmetic. x^0 is 1 (also for x containing 0 or ∞); for n < 0 the result
// is 1/x^|n|, Entire if x contains 0.
func (x Interval) IntPow(n int) Interval {
	switch {
	case n == 0:
		return Point(1)
	case n < 0:
		if n == math.MinInt {
			// |n| is not an int; x^n = (x^(n/2))².
			return x.IntPow(n / 2).Sqr()
		}
		return x.IntPow(-n).Recip()
	case x.Lo == x.Hi:
		if n%2 == 0 {
			return powPoint(math.Abs(x.Lo), n)
		}
		return powPoint(x.Lo, n)
	case n%2 == 0:
		a := x.Abs()
		return Interval{powPoint(a.Lo, n).Lo, powPoint(a.Hi, n).Hi}
	}
	return Interval{powPoint(x.Lo, n).Lo, powPoint(x.Hi, n).Hi}
}

// powPoint encloses v^n by binary powering.
func powPoint(v float64, n int) Interval {
	r := Point(1)
	b := Point(v)
	for {
		if n&1 == 1 {
			r = r.Mul(b)
		}
		n >>= 1
		if n == 0 {
			return r
		}
		b = b.Mul(b)
	}
}
