package bounds

import "math"

// Directed rounding without access to the FPU rounding mode.
//
// Go rounds every +, -, *, / and math.Sqrt to nearest (IEEE 754), so the
// exact result lies within half an ulp of the computed one. Stepping one ulp
// outward with nextUp/nextDown therefore gives a correct directed bound.
// This costs at most one ulp of width per operation against true directed
// rounding.

// nextUp returns the least float64 greater than x (x itself for +Inf, NaN).
func nextUp(x float64) float64 {
	switch {
	case x != x || x == math.Inf(1):
		return x
	case x == 0:
		return math.SmallestNonzeroFloat64
	case x > 0:
		return math.Float64frombits(math.Float64bits(x) + 1)
	default:
		return math.Float64frombits(math.Float64bits(x) - 1)
	}
}

// nextDown returns the greatest float64 less than x (x itself for -Inf, NaN).
func nextDown(x float64) float64 { return -nextUp(-x) }

func addUp(a, b float64) float64   { return nextUp(a + b) }
func addDown(a, b float64) float64 { return nextDown(a + b) }

// mulUp and mulDown treat 0 times ±Inf as 0 (IEEE 1788) and are exact when
// a factor is 0; other products step one ulp outward.
func mulUp(a, b float64) float64 {
	if a == 0 || b == 0 {
		return 0
	}
	return nextUp(a * b)
}

func mulDown(a, b float64) float64 {
	if a == 0 || b == 0 {
		return 0
	}
	return nextDown(a * b)
}

func divUp(a, b float64) float64 {
	if a == 0 {
		return 0
	}
	return nextUp(a / b)
}

func divDown(a, b float64) float64 {
	if a == 0 {
		return 0
	}
	return nextDown(a / b)
}

func sqrtUp(a float64) float64 {
	if a <= 0 {
		return 0
	}
	return nextUp(math.Sqrt(a))
}

func sqrtDown(a float64) float64 {
	if a <= 0 {
		return 0
	}
	return nextDown(math.Sqrt(a))
}

// Elementary-function widening. See "Accuracy" in doc.go: we assume every
// math function we call is within libmUlps ulps of the exact value, and widen
// each result r to [r - |r|·libmRel - libmAbs, r + |r|·libmRel + libmAbs].
// libmRel = 2⁻⁴⁹ is at least 8 ulps of r for every normal r (an ulp is at
// most 2⁻⁵² |r|), so after the final rounding at least 7 ulps remain; libmAbs
// = 2⁻¹⁰⁶⁰ is 2¹⁴ ulps of the subnormal spacing and covers results that
// underflow.
const (
	libmUlps = 4
	libmRel  = 0x1p-49
	libmAbs  = 0x1p-1060
)

// widenUp returns an upper bound on a quantity computed as r by a math
// function accurate to libmUlps ulps.
func widenUp(r float64) float64 {
	switch {
	case math.IsInf(r, 1):
		return r
	case math.IsInf(r, -1):
		// The exact value overflowed below: it is at most -MaxFloat64.
		return -math.MaxFloat64
	}
	return nextUp(r + math.Abs(r)*libmRel + libmAbs)
}

// widenDown returns a lower bound, the mirror of widenUp.
func widenDown(r float64) float64 {
	switch {
	case math.IsInf(r, -1):
		return r
	case math.IsInf(r, 1):
		// The exact value overflowed: it is at least MaxFloat64.
		return math.MaxFloat64
	}
	return nextDown(r - math.Abs(r)*libmRel - libmAbs)
}
