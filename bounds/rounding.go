package bounds

import "math"

// Directed rounding without access to the FPU rounding mode.
//
// Go rounds every +, -, *, / and math.Sqrt to nearest (IEEE 754), so the
// exact result lies within half an ulp of the computed one r. Stepping one
// ulp outward with nextUp/nextDown therefore gives a correct directed bound.
// Where the rounding error of r can be computed exactly, r itself is kept
// when it already lies on the correct side:
//
//	a + b = s + e exactly, s = RN(a+b)  (TwoSum; Knuth, TAOCP vol. 2, 4.2.2, Thm B)
//	a · b = p + e exactly, e = RN(a·b - p) by one fused multiply-add,
//	        provided |p| ≥ 2⁻⁹⁶⁸ so that e is representable
//	        (Muller et al., Handbook of Floating-Point Arithmetic, 2nd ed. 2018, 4.4.2 — from memory)
//	a = s² + e exactly, e = RN(a - s·s), s = RN(√a), for a ≥ 2⁻⁹⁶⁸ (same source, 4.7)
//
// so that sums, products and square roots round exactly as true directed
// rounding would; quotients do too, by their exact remainder (see divUp).
// Below those ranges (underflow) results step one ulp outward. Overflow to
// ±Inf is handled: a sum or product of finite numbers that rounds to +Inf
// exceeds MaxFloat64, so MaxFloat64 is a valid lower bound.

// nextUp returns the least float64 greater than x (x itself for +Inf, NaN).
// The cases are tested on the bits, most common first: +0 and positive
// finite numbers step up by one unit of their bits (+0 becomes the least
// subnormal), negative ones down by one (-Inf becomes -MaxFloat64).
func nextUp(x float64) float64 {
	b := math.Float64bits(x)
	switch {
	case b < 0x7FF0000000000000: // +0 or positive finite
		return math.Float64frombits(b + 1)
	case b > 0x8000000000000000 && b <= 0xFFF0000000000000: // negative, not -0, not NaN
		return math.Float64frombits(b - 1)
	case b == 0x8000000000000000: // -0
		return math.SmallestNonzeroFloat64
	}
	return x // +Inf, NaN
}

// nextDown returns the greatest float64 less than x (x itself for -Inf, NaN).
func nextDown(x float64) float64 { return -nextUp(-x) }

// minExact is the least magnitude of a rounded product or radicand for which
// the error term computed by a fused multiply-add is exact: the exact
// product of two float64 has its last bit at 2^(qa+qb) with qa+qb > log2|p| - 106.
const minExact = 0x1p-968

// addUp returns an upper bound on a + b: RN(a+b) if that is already above
// the exact sum, else the next float64. +Inf + -Inf gives +Inf.
// (Too large for the inliner with its slow path; interval operations use
// addOut, one call for both endpoints.)
func addUp(a, b float64) float64 {
	s := a + b
	// TwoSum error e = (a+b) - s; NaN when s or an operand is infinite.
	// An infinite e could only come from an intermediate overflow and is
	// not trusted.
	bb := s - a
	if e := (a - (s - bb)) + (b - bb); e <= 0 && e >= -math.MaxFloat64 {
		return s
	}
	return stepUp(s)
}

// addDown returns a lower bound on a + b, the mirror of addUp.
func addDown(a, b float64) float64 {
	s := a + b
	bb := s - a
	if e := (a - (s - bb)) + (b - bb); e >= 0 && e <= math.MaxFloat64 {
		return s
	}
	return stepDown(s)
}

// addOut returns addDown(a, b) and addUp(c, d) in one call: the endpoints
// of an interval sum. Interval operations call it (and mulOut) so that
// they cost one function call, not two, and are small enough to inline.
func addOut(a, b, c, d float64) (lo, hi float64) {
	lo, hi = a+b, c+d
	bb := lo - a
	if e := (a - (lo - bb)) + (b - bb); !(e >= 0 && e <= math.MaxFloat64) {
		lo = stepDown(lo)
	}
	dd := hi - c
	if e := (c - (hi - dd)) + (d - dd); !(e <= 0 && e >= -math.MaxFloat64) {
		hi = stepUp(hi)
	}
	return lo, hi
}

// subOut returns addDown(a, -b) and addUp(c, -d) in one call (see addOut).
func subOut(a, b, c, d float64) (lo, hi float64) {
	return addOut(a, -b, c, -d)
}

// mulOut returns mulDown(a, b) and mulUp(c, d) in one call (see addOut).
func mulOut(a, b, c, d float64) (lo, hi float64) {
	lo, hi = a*b, c*d
	if !(math.FMA(a, b, -lo) >= 0 && math.Abs(lo) >= minExact) {
		lo = mulDownSlow(a, b, lo)
	}
	if !(math.FMA(c, d, -hi) <= 0 && math.Abs(hi) >= minExact) {
		hi = mulUpSlow(c, d, hi)
	}
	return lo, hi
}

// stepUp returns nextUp(s), and +Inf for a NaN s (from +Inf + -Inf).
func stepUp(s float64) float64 {
	if s != s {
		return math.Inf(1)
	}
	return nextUp(s)
}

// stepDown returns nextDown(s), and -Inf for a NaN s.
func stepDown(s float64) float64 {
	if s != s {
		return math.Inf(-1)
	}
	return nextDown(s)
}

// mulUp and mulDown treat 0 times ±Inf as 0 (IEEE 1788) and are exact when
// a factor is 0 or the product is exact; other products round outward.
// The fast path is |a·b| ≥ 2⁻⁹⁶⁸ with the FMA error on the right side;
// interval operations use mulOut, one call for both endpoints.
func mulUp(a, b float64) float64 {
	p := a * b
	// e = a·b - p; -Inf when a finite product overflowed to +Inf, NaN when
	// an operand is infinite or 0·Inf.
	if e := math.FMA(a, b, -p); e <= 0 && math.Abs(p) >= minExact {
		return p
	}
	return mulUpSlow(a, b, p)
}

func mulUpSlow(a, b, p float64) float64 {
	switch {
	case a == 0 || b == 0:
		return 0
	case p == 0 && (a < 0) != (b < 0):
		return 0 // a negative product underflowed
	}
	return nextUp(p)
}

func mulDown(a, b float64) float64 {
	p := a * b
	if e := math.FMA(a, b, -p); e >= 0 && math.Abs(p) >= minExact {
		return p
	}
	return mulDownSlow(a, b, p)
}

func mulDownSlow(a, b, p float64) float64 {
	switch {
	case a == 0 || b == 0:
		return 0
	case p == 0 && (a < 0) == (b < 0):
		return 0 // a positive product underflowed
	}
	return nextDown(p)
}

// divUp and divDown return outward bounds on a / b for b ≠ 0; 0/b is 0.
// The remainder a - q·b of q = RN(a/b) is exact (one fused multiply-add)
// when |a|, |q| ≥ 2⁻⁹⁶⁸ (Muller et al., Handbook of Floating-Point
// Arithmetic, 2nd ed. 2018, 4.4.3 — from memory); its sign relative to b
// tells on which side of a/b q lies. ±Inf/±Inf has no limit: the bound is
// the infinity on the bound's side.
func divUp(a, b float64) float64 {
	if a == 0 {
		return 0
	}
	q := a / b
	if math.Abs(a) >= minExact && math.Abs(q) >= minExact && math.Abs(q) <= math.MaxFloat64 {
		// a/b - q = rem/b ≤ 0?
		if rem := math.FMA(-q, b, a); rem == 0 || (rem < 0) != (b < 0) {
			return q
		}
		return nextUp(q)
	}
	switch {
	case q != q:
		return math.Inf(1)
	case q == 0 && (a < 0) != (b < 0):
		return 0 // a negative quotient underflowed
	}
	return nextUp(q)
}

func divDown(a, b float64) float64 {
	if a == 0 {
		return 0
	}
	q := a / b
	if math.Abs(a) >= minExact && math.Abs(q) >= minExact && math.Abs(q) <= math.MaxFloat64 {
		// a/b - q = rem/b ≥ 0?
		if rem := math.FMA(-q, b, a); rem == 0 || (rem < 0) == (b < 0) {
			return q
		}
		return nextDown(q)
	}
	switch {
	case q != q:
		return math.Inf(-1)
	case q == 0 && (a < 0) == (b < 0):
		return 0 // a positive quotient underflowed
	}
	return nextDown(q)
}

// sqrtUp and sqrtDown bound √a for a ≥ 0; they return 0 for a ≤ 0.
func sqrtUp(a float64) float64 {
	if a <= 0 {
		return 0
	}
	s := math.Sqrt(a)
	// e = a - s² exactly; e ≤ 0 means s ≥ √a.
	if a >= minExact && a <= math.MaxFloat64 && math.FMA(-s, s, a) <= 0 {
		return s
	}
	return nextUp(s)
}

func sqrtDown(a float64) float64 {
	if a <= 0 {
		return 0
	}
	s := math.Sqrt(a)
	if a >= minExact && a <= math.MaxFloat64 && math.FMA(-s, s, a) >= 0 {
		return s
	}
	return nextDown(s)
}

// Elementary-function widening. See "Accuracy" in the package
// documentation: we assume every math function we call is within libmUlps
// ulps of the exact value, and widen each result r to
//
//	[r - |r|·libmRel - libmAbs, r + |r|·libmRel + libmAbs].
//
// libmRel = 2⁻⁴⁹ is at least 8 ulps of r for every normal r (an ulp is at
// most 2⁻⁵² |r|), so after the rounding of the widening itself at least 7
// ulps remain; libmAbs = 2⁻¹⁰⁶⁰ is 2¹⁴ units of the subnormal spacing and
// covers results that underflow.
//
// Measured against math/big references on amd64 (elementary_test.go,
// 30 000 inputs per function): the largest errors are 2.44 ulps
// (math.Sinh near 0) and 2.36 ulps (math.Erfc near 5 and 26), 1.7 ulps or
// less for Exp, Expm1, Log, Log1p, Sin, Cos, Cosh, Tanh, Erf, 0.5 for
// Sqrt, and below one subnormal unit for results that underflow — where
// the functions return a value at all: their known defects (overflow to
// +Inf below ln MaxFloat64, Log of subnormals) are avoided in
// elementary.go.
const (
	libmUlps = 4
	libmRel  = 0x1p-49
	libmAbs  = 0x1p-1060
)

// widenUp returns an upper bound on a quantity computed as r by a math
// function accurate to libmUlps ulps, plus an absolute error libmAbs:
//
//	r·(1 ± libmRel) + libmAbs, rounded to nearest, then one ulp up.
//
// The two roundings to nearest lose at most half an ulp of r against the
// final step, so at least 7 of the 8 ulps of libmRel remain. It must only
// see +Inf from a math function whose exact value overflowed (exceeds
// MaxFloat64); -Inf gives -MaxFloat64 (the exact value is below it).
func widenUp(r float64) float64 { return widenUpBy(r, libmAbs) }

// widenDown returns a lower bound, the mirror of widenUp: +Inf gives
// MaxFloat64.
func widenDown(r float64) float64 { return widenDownBy(r, libmAbs) }

// widenUpBy is widenUp with the absolute error e ≥ libmAbs.
func widenUpBy(r, e float64) float64 {
	if r >= 0 {
		return nextUp(r*(1+libmRel) + e)
	}
	return nextUp(r*(1-libmRel) + e)
}

// widenDownBy is widenDown with the absolute error e ≥ libmAbs.
func widenDownBy(r, e float64) float64 {
	if r >= 0 {
		return nextDown(r*(1-libmRel) - e)
	}
	return nextDown(r*(1+libmRel) - e)
}

// fmax and fmin are math.Max and math.Min without the NaN and signed-zero
// handling, which intervals do not need (and which costs a call on amd64).
func fmax(a, b float64) float64 {
	if a > b {
		return a
	}
	return b
}

func fmin(a, b float64) float64 {
	if a < b {
		return a
	}
	return b
}
