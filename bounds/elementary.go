package bounds

import "math"

// Interval versions of the elementary functions. Each evaluates Go's math
// function at the endpoints that bound the range (using monotonicity or the
// location of extrema) and widens the result as described under "Accuracy"
// in the package documentation.
//
// Defects of Go's math package (Go 1.26, amd64) found by the math/big tests
// and avoided here:
//
//   - math.Exp returns +Inf for 709.437 ≲ x ≤ ln MaxFloat64 ≈ 709.7827,
//     where e^x is finite; math.Sinh and math.Cosh inherit this (and
//     overflow anyway up to ln(2·MaxFloat64) ≈ 710.4759). See expBounds.
//   - math.Expm1(709.782712893384) = +Inf, though e^x - 1 < MaxFloat64
//     there. See expm1Bounds.
//   - math.Log of a subnormal argument is wrong by up to 35 (Go issue
//     56600); math.Pow inherits this for fractional exponents, which is
//     one more reason not to use it. See logBounds.

// Interval constants, each a rigorous enclosure of the named number.
var (
	// Pi encloses π; math.Pi = RN(π) lies below π (π = 3.14159265358979323846…).
	Pi = Interval{math.Pi, nextUp(math.Pi)}
	// TwoPi encloses 2π.
	TwoPi = Pi.Scale(2)
	// SqrtPi encloses √π.
	SqrtPi = Sqrt(Pi)
	// SqrtTwoPi encloses √(2π).
	SqrtTwoPi = Sqrt(TwoPi)
)

// Sqrt returns {√v : v in x, v ≥ 0}; negative parts of x are ignored.
func Sqrt(x Interval) Interval {
	return Interval{sqrtDown(x.Lo), sqrtUp(x.Hi)}
}

// e and e² enclose Euler's number and its square
// (e = 2.71828182845904523536…; math.E = RN(e) lies below e).
var (
	eLo, eHi   = math.E, nextUp(math.E)
	e2Lo, e2Hi = mulDown(eLo, eLo), mulUp(eHi, eHi)
)

// expDirect is the largest argument for which we use math.Exp directly.
// On amd64 (assembly) math.Exp returns +Inf for v ≳ 709.437, where v·log₂e
// rounds to 1024, although e^v < MaxFloat64 up to v = ln MaxFloat64 ≈
// 709.7827; above expDirect we compute e^v = e^(v-2)·e² instead (v-2 is
// exact there).
const expDirect = 709

// expBounds returns lo ≤ e^v ≤ hi. For v > ln MaxFloat64 it returns
// (MaxFloat64, +Inf).
func expBounds(v float64) (lo, hi float64) {
	switch {
	case v <= expDirect:
		r := math.Exp(v)
		return fmax(0, widenDown(r)), widenUp(r)
	case v > 711: // e^711 > 2·MaxFloat64
		return math.MaxFloat64, math.Inf(1)
	}
	r := math.Exp(v - 2)
	// A product that rounds to +Inf gives (MaxFloat64, +Inf).
	return mulDown(widenDown(r), e2Lo), mulUp(widenUp(r), e2Hi)
}

// halfExpBounds returns lo ≤ e^v/2 ≤ hi for v ≥ 0.
func halfExpBounds(v float64) (lo, hi float64) {
	switch {
	case v <= expDirect:
		lo, hi = expBounds(v)
		return 0.5 * lo, 0.5 * hi // exact: e^v ≥ 1
	case v > 711:
		return math.MaxFloat64, math.Inf(1)
	}
	r := math.Exp(v - 2)
	return mulDown(widenDown(r), 0.5*e2Lo), mulUp(widenUp(r), 0.5*e2Hi)
}

// Exp returns e^x. Where e^x exceeds MaxFloat64 the result is
// [MaxFloat64, +Inf].
//
// A thin interval, of width d ≤ 2⁻²⁶ (a point computed in interval
// arithmetic), takes one call to math.Exp, at the lower end:
//
//	e^{x.Hi} = e^{x.Lo}·e^d ≤ e^{x.Lo}·(1 + d + d²) ≤ e^{x.Lo}·(1 + d·(1 + 2⁻²⁶))   (d ≤ 2⁻²⁶),
//
// from e^d = 1 + d + d²(1/2 + d/6 + …) with the bracket at most e - 2 < 1;
// d² ≤ 2⁻⁵² keeps this within about an ulp of two calls.
func Exp(x Interval) Interval {
	if x.Lo == x.Hi {
		lo, hi := expBounds(x.Lo)
		return Interval{lo, hi}
	}
	if d := addUp(x.Hi, -x.Lo); d <= 0x1p-26 && x.Hi <= expDirect {
		lo, hi := expBounds(x.Lo)
		// 1 + d + d² ≤ 1 + d·(1 + 2⁻²⁶) for d ≤ 2⁻²⁶.
		return Interval{lo, mulUp(hi, addUp(1, mulUp(d, 1+0x1p-26)))}
	}
	lo, _ := expBounds(x.Lo)
	_, hi := expBounds(x.Hi)
	return Interval{lo, hi}
}

// Expm1 returns e^x - 1, accurate near 0.
//
// Above expDirect e^x - 1 is computed from Exp: math.Expm1 returns +Inf at
// x = 709.782712893384 (its overflow test is ≥, not >), where e^x - 1 is
// still below MaxFloat64.
func Expm1(x Interval) Interval {
	lo, _ := expm1Bounds(x.Lo)
	_, hi := expm1Bounds(x.Hi)
	return Interval{lo, hi}
}

// expm1Bounds returns lo ≤ e^v - 1 ≤ hi.
func expm1Bounds(v float64) (lo, hi float64) {
	if v <= expDirect {
		r := math.Expm1(v)
		return fmax(-1, widenDown(r)), widenUp(r)
	}
	// e^v ≥ e^709 has an ulp far above 1: one step down covers the -1.
	lo, hi = expBounds(v)
	return nextDown(lo), hi
}

// ln2 encloses ln 2 = 0.693147180559945309417…; math.Ln2 = RN(ln 2) lies
// below it.
var ln2Lo, ln2Hi = math.Ln2, nextUp(math.Ln2)

// logBounds returns lo ≤ ln v ≤ hi for v > 0.
//
// math.Log on amd64 does not normalize subnormal arguments (Go issue
// 56600: Log(5e-324) = -709.09, not -744.44), so they are scaled first:
//
//	ln v = ln(v·2⁵⁴) - 54 ln 2
func logBounds(v float64) (lo, hi float64) {
	if v >= 0x1p-1022 {
		r := math.Log(v)
		return widenDown(r), widenUp(r)
	}
	r := math.Log(v * 0x1p54) // exact scaling into the normal range
	return addDown(widenDown(r), -mulUp(54, ln2Hi)), addUp(widenUp(r), -mulDown(54, ln2Lo))
}

// Log returns ln x. Where x reaches 0 or below, the lower endpoint is -∞;
// if x lies wholly at or below 0 the result is Entire.
func Log(x Interval) Interval {
	if x.Hi <= 0 {
		return entire
	}
	if x.Lo == x.Hi {
		lo, hi := logBounds(x.Lo)
		return Interval{lo, hi}
	}
	lo := math.Inf(-1)
	if x.Lo > 0 {
		lo, _ = logBounds(x.Lo)
	}
	_, hi := logBounds(x.Hi)
	return Interval{lo, hi}
}

// Log1p returns ln(1 + x).
func Log1p(x Interval) Interval {
	if x.Hi <= -1 {
		return entire
	}
	lo := math.Inf(-1)
	if x.Lo > -1 {
		lo = widenDown(math.Log1p(x.Lo))
	}
	return Interval{lo, widenUp(math.Log1p(x.Hi))}
}

// Pow returns x^p for real p. Parts of x below 0 are ignored; for p > 0
// the value at 0 is 0, for p < 0 it is +∞ (an x wholly at or below 0 then
// gives [MaxFloat64, +Inf]). A NaN p gives Entire.
//
// Integer p uses IntPow and half-integer p uses Sqrt and IntPow; other p
// are computed as exp(p·ln x) in interval arithmetic, so that no accuracy
// claim about math.Pow is needed.
func Pow(x Interval, p float64) Interval {
	switch {
	case p != p:
		return entire
	case p == 0:
		return Point(1)
	case x.Hi <= 0:
		if p > 0 {
			return Point(0)
		}
		return Interval{math.MaxFloat64, math.Inf(1)}
	}
	x.Lo = fmax(x.Lo, 0)
	const maxIntPow = 1 << 30
	switch {
	case p == math.Trunc(p) && math.Abs(p) <= maxIntPow:
		return nonNegIntPow(x, int(p))
	case 2*p == math.Trunc(2*p) && math.Abs(p) <= maxIntPow:
		return nonNegIntPow(Sqrt(x), int(2*p))
	}
	r := Exp(Log(x).Scale(p))
	if x.Lo == 0 {
		if p > 0 {
			r.Lo = 0
		} else {
			r.Hi = math.Inf(1)
		}
	}
	return r
}

// nonNegIntPow returns x^n for x ⊆ [0, ∞) and n ≠ 0, with x^n = +∞ at 0 for
// n < 0.
func nonNegIntPow(x Interval, n int) Interval {
	if n < 0 && x.Lo == 0 {
		return Interval{divDown(1, powPoint(x.Hi, -n).Hi), math.Inf(1)}
	}
	return x.IntPow(n)
}

// Argument reduction in math.Sin, math.Cos and math.Sincos (Go 1.26,
// src/math/sin.go, trig_reduce.go) and the error we allow for it.
//
// For |v| < 2²⁹ Go uses Cody–Waite reduction by π/4 split in three parts
// PI4A+PI4B+PI4C: y·PI4A and y·PI4B are exact (23 and 21 significant bits,
// y < 2³⁰), the first two subtractions are exact, and the reduced argument
// z = v - y·π/4 carries an absolute error of at most
//
//	y·|π/4 - PI4A - PI4B - PI4C| + ½ulp(y·PI4C) ≤ y·(2⁻¹⁰² + 2⁻¹⁰¹·⁴) < |v|·2⁻⁹⁹
//
// besides the rounding of the last subtraction (relative to z, part of
// the ulp error). We allow |v|·trigRelCW, a factor 2¹⁹ more.
//
// For |v| ≥ 2²⁹ Go uses Payne–Hanek reduction with 4/π to 1217 bits
// (Ng, "Argument reduction for huge arguments: good to the last bit", 1992):
// the fraction of v·4/π is exact to about 2⁻¹²⁰ but truncated to 53 bits,
// and subtracting 1 for odd octants rounds once more, an absolute error
// below 2⁻⁵² in z. We allow trigAbsPH = 2⁻⁵⁰.
//
// The largest excess error measured against math/big (elementary_test.go)
// is far below both allowances.
const (
	trigThreshold = 1 << 29
	trigRelCW     = 0x1p-80
	trigAbsPH     = 0x1p-50
)

// trigAbsErr returns the absolute error we allow for argument reduction at v.
func trigAbsErr(v float64) float64 {
	a := math.Abs(v)
	if a < trigThreshold {
		return a * trigRelCW
	}
	return trigAbsPH
}

// trigWiden encloses a value computed as r by math.Sin or math.Cos at a
// point whose reduction error is at most e.
func trigWiden(r, e float64) Interval {
	e += libmAbs
	return Interval{fmax(-1, widenDownBy(r, e)), fmin(1, widenUpBy(r, e))}
}

var unitInterval = Interval{-1, 1}

// sinPoint returns an enclosure of sin(v).
func sinPoint(v float64) Interval {
	if math.IsInf(v, 0) || v != v {
		return unitInterval
	}
	return trigWiden(math.Sin(v), trigAbsErr(v))
}

// cosPoint returns an enclosure of cos(v).
func cosPoint(v float64) Interval {
	if math.IsInf(v, 0) || v != v {
		return unitInterval
	}
	return trigWiden(math.Cos(v), trigAbsErr(v))
}

// sincosPoint returns enclosures of sin(v) and cos(v) with one call to
// math.Sincos (the same reduction and polynomials as math.Sin, math.Cos).
func sincosPoint(v float64) (sin, cos Interval) {
	if math.IsInf(v, 0) || v != v {
		return unitInterval, unitInterval
	}
	s, c := math.Sincos(v)
	e := trigAbsErr(v)
	return trigWiden(s, e), trigWiden(c, e)
}

// mayHitPhase reports whether x may contain a point 2π(k + phase) for an
// integer k. It errs on the side of true.
func mayHitPhase(x Interval, phase float64) bool {
	u := Point(x.Lo).Div(TwoPi).AddFloat(-phase)
	v := Point(x.Hi).Div(TwoPi).AddFloat(-phase)
	return math.Ceil(u.Lo) <= math.Floor(v.Hi)
}

// sinCos returns enclosures of {sin v} and {cos v} over v in x.
//
// Intervals of radius up to 2⁻²⁰ (phases computed in interval arithmetic)
// take one call to math.Sincos at the midpoint (see sinCosThin). Wider ones
// are enclosed by the hull of their values at the endpoints, plus ±1
// where x may contain an extremum. For x narrower than 3 (< π) the
// extrema of sin are the zeros of cos and vice versa, at most one of each
// in x; if the enclosures of cos at both endpoints have the same strict
// sign, cos has no zero in x and sin is monotone on it. Otherwise the
// extrema are located by mayHitPhase.
func sinCos(x Interval) (sin, cos Interval) {
	if x.Lo == x.Hi {
		return sincosPoint(x.Lo)
	}
	if !x.IsFinite() || x.Hi-x.Lo >= 6.28 {
		return unitInterval, unitInterval
	}
	m := x.Mid()
	if r := fmax(addUp(x.Hi, -m), addUp(m, -x.Lo)); r <= thinRadius {
		return sinCosThin(m, r)
	}
	s1, c1 := sincosPoint(x.Lo)
	s2, c2 := sincosPoint(x.Hi)
	sin, cos = s1.Hull(s2), c1.Hull(c2)
	thin := x.Width() <= 3
	if !thin || !sameStrictSign(c1, c2) {
		if mayHitPhase(x, 0.25) {
			sin.Hi = 1
		}
		if mayHitPhase(x, 0.75) {
			sin.Lo = -1
		}
	}
	if !thin || !sameStrictSign(s1, s2) {
		if mayHitPhase(x, 0) {
			cos.Hi = 1
		}
		if mayHitPhase(x, 0.5) {
			cos.Lo = -1
		}
	}
	return sin, cos
}

// thinRadius is the largest radius of an interval for which sinCos uses
// the Taylor form around the midpoint.
const thinRadius = 0x1p-20

// sinCosThin encloses sin and cos over [m-r, m+r] with one call to
// math.Sincos, by Taylor's theorem with the Lagrange remainder:
//
//	sin(m+δ) = sin m + δ cos m - (δ²/2) sin ξ
//	cos(m+δ) = cos m - δ sin m - (δ²/2) cos ξ,   |δ| ≤ r
//
// as tight as the endpoint values to first order.
func sinCosThin(m, r float64) (sin, cos Interval) {
	s, c := sincosPoint(m)
	// |c|·r + r²/2 ≤ (|c| + 2⁻²¹)·r, as r ≤ thinRadius = 2⁻²⁰.
	es := mulUp(addUp(c.Mag(), 0x1p-21), r)
	ec := mulUp(addUp(s.Mag(), 0x1p-21), r)
	sLo, sHi := addOut(s.Lo, -es, s.Hi, es)
	cLo, cHi := addOut(c.Lo, -ec, c.Hi, ec)
	return Interval{fmax(-1, sLo), fmin(1, sHi)}, Interval{fmax(-1, cLo), fmin(1, cHi)}
}

// cosThin is Cos with one call to math.Cos for an interval of radius
// r ≤ thinRadius about its midpoint m (else it is Cos):
// |cos x - cos m| ≤ |sin m|·r + r²/2 ≤ r + r²/2 (Taylor, |cos”| ≤ 1).
func cosThin(x Interval) Interval {
	if !x.IsFinite() {
		return Cos(x)
	}
	m := x.Mid()
	r := fmax(addUp(x.Hi, -m), addUp(m, -x.Lo))
	if r > thinRadius {
		return Cos(x)
	}
	c := cosPoint(m)
	if r == 0 {
		return c
	}
	e := mulUp(r, 1+0x1p-20) // ≥ r + r²/2, as r ≤ 2⁻²⁰
	lo, hi := addOut(c.Lo, -e, c.Hi, e)
	return Interval{fmax(-1, lo), fmin(1, hi)}
}

// sameStrictSign reports whether a and b lie both in (0, ∞) or both in
// (-∞, 0).
func sameStrictSign(a, b Interval) bool {
	return a.Lo > 0 && b.Lo > 0 || a.Hi < 0 && b.Hi < 0
}

// Sin returns sin x (see sinCos for the method).
func Sin(x Interval) Interval {
	if x.Lo == x.Hi {
		return sinPoint(x.Lo)
	}
	s, _ := sinCos(x)
	return s
}

// Cos returns cos x (see sinCos for the method).
func Cos(x Interval) Interval {
	if x.Lo == x.Hi {
		return cosPoint(x.Lo)
	}
	_, c := sinCos(x)
	return c
}

// hypDirect is the largest |v| for which math.Sinh and math.Cosh are used
// directly; above it they call math.Exp(v)/2, which overflows early on
// amd64 (see expDirect) and everywhere for ln MaxFloat64 < v ≤ ln(2·MaxFloat64).
const hypDirect = 21

// sinhBounds returns lo ≤ sinh v ≤ hi.
//
//	sinh v = sign(v)·(e^|v|/2)·(1 - e^(-2|v|)),  e^(-2|v|) < 2⁻⁶⁰ for |v| > 21
func sinhBounds(v float64) (lo, hi float64) {
	if math.Abs(v) <= hypDirect {
		r := math.Sinh(v)
		return widenDown(r), widenUp(r)
	}
	lo, hi = halfExpBounds(math.Abs(v))
	lo = nextDown(lo) // ≤ lo·(1 - 2⁻⁵³)
	if v < 0 {
		return -hi, -lo
	}
	return lo, hi
}

// coshBounds returns lo ≤ cosh a ≤ hi for a ≥ 0.
//
//	cosh a = (e^a/2)·(1 + e^(-2a))
func coshBounds(a float64) (lo, hi float64) {
	if a <= hypDirect {
		r := math.Cosh(a)
		return fmax(1, widenDown(r)), widenUp(r)
	}
	lo, hi = halfExpBounds(a)
	return lo, nextUp(hi)
}

// sechBounds returns lo ≤ sech a ≤ hi for a ≥ 0.
//
//	sech a = 2e^(-a)/(1 + e^(-2a))
func sechBounds(a float64) (lo, hi float64) {
	if a <= hypDirect {
		clo, chi := coshBounds(a)
		return divDown(1, chi), fmin(1, divUp(1, clo))
	}
	lo, hi = expBounds(-a)
	// 2·lo and 2·hi are exact; one step down covers the factor 1/(1+e^(-2a)).
	return fmax(0, nextDown(2*lo)), 2 * hi
}

// Sinh returns sinh x (increasing). Where sinh x exceeds MaxFloat64 the
// bound is ±Inf.
func Sinh(x Interval) Interval {
	lo, _ := sinhBounds(x.Lo)
	_, hi := sinhBounds(x.Hi)
	return Interval{lo, hi}
}

// Cosh returns cosh x (even, least value 1 at 0).
func Cosh(x Interval) Interval {
	a := x.Abs()
	lo, _ := coshBounds(a.Lo)
	_, hi := coshBounds(a.Hi)
	return Interval{lo, hi}
}

// Tanh returns tanh x (increasing).
func Tanh(x Interval) Interval {
	return Interval{fmax(-1, widenDown(math.Tanh(x.Lo))), fmin(1, widenUp(math.Tanh(x.Hi)))}
}

// Sech returns sech x = 1/cosh x (even, decreasing in |x|, 1 at 0).
//
// A thin interval (width d ≤ 2⁻⁴⁰, a point computed in interval
// arithmetic) takes one evaluation, at a.Lo: sech
// decreases on [0, ∞) with |d ln sech/dx| = tanh x ≤ 1, so
// sech(a.Hi) ≥ sech(a.Lo)·e^{-d} ≥ sech(a.Lo)·(1 - d).
func Sech(x Interval) Interval {
	a := x.Abs()
	if d := addUp(a.Hi, -a.Lo); d <= 0x1p-40 {
		lo, hi := sechBounds(a.Lo)
		if d > 0 {
			lo = mulDown(lo, addDown(1, -d))
		}
		return Interval{lo, hi}
	}
	_, hi := sechBounds(a.Lo)
	lo, _ := sechBounds(a.Hi)
	return Interval{lo, hi}
}

// Erfc returns the complementary error function (decreasing).
func Erfc(x Interval) Interval {
	return Interval{fmax(0, widenDown(math.Erfc(x.Hi))), fmin(2, widenUp(math.Erfc(x.Lo)))}
}

// Erf returns the error function (increasing).
func Erf(x Interval) Interval {
	return Interval{fmax(-1, widenDown(math.Erf(x.Lo))), fmin(1, widenUp(math.Erf(x.Hi)))}
}
