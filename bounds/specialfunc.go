package bounds

import "math"

// Special functions built on the elementary ones: the cardinal sine and its
// hyperbolic relatives, which appear in the transforms of B-splines,
// hyperbolic-secant families and the Kaiser–Bessel window, and the modified
// Bessel function I₀ that normalizes that window. Each is an interval
// function: the result contains f(v) for every v in the argument.

// seriesRadius is the largest |z| at which the power series
//
//	S(z) = Σ_{k≥0} z^k/(2k+1)!
//
// is used instead of the closed forms; there |z|^k/(2k+1)! falls below
// 2⁻⁶⁰ within 10 terms.
const seriesRadius = 1

// sinhcPowerSeries returns an enclosure of S(z) = Σ_{k≥0} z^k/(2k+1)! for
// z ⊆ [-1, 1]. S(x²) = sinh(x)/x and S(-x²) = sin(x)/x (DLMF 4.33.1 and
// 4.19.1, the Maclaurin series of sinh and sin, from memory).
//
// With m = max|z|, the first n terms are summed, n the least with
// t_n = m^n/(2n+1)! < 2⁻⁶⁰; the ratio of consecutive terms is at most
// m/((2n+2)(2n+3)) ≤ 1/2, so the rest is at most R = 2t_n. The polynomial
// P(z) = Σ_{k<n} z^k/(2k+1)! is evaluated by Horner's rule with directed
// rounding at z.Lo, which gives both bounds of P(z.Lo). S and P increase
// on [-1, 1] (their derivatives are at least 1/6 - Σ_{k≥2} k/(2k+1)! > 0)
// and S' ≤ Σ_{k≥1} k/(2k+1)! < 1/5 there, so
//
//	S(z) ⊆ [P(z.Lo) - R, P(z.Lo) + (z.Hi - z.Lo)/5 + R].
func sinhcPowerSeries(z Interval) Interval {
	m := fmax(math.Abs(z.Lo), math.Abs(z.Hi))
	if !(m <= 1) {
		return entire // z outside [-1, 1] or NaN: not reached from this file
	}
	if m == 0 {
		return Point(1) // S(0) = 1 exactly: transforms at ξ = 0 stay exact
	}
	// The least n with m ≤ sinhcReach[n], so that t_n < 2⁻⁶⁰ and R ≤ 2⁻⁵⁹.
	n := 1
	for m > sinhcReach[n] {
		n++
	}
	const rest = 0x1p-59
	x := z.Lo
	lo, hi := sinhcCoef[n-1].Lo, sinhcCoef[n-1].Hi
	for k := n - 2; k >= 0; k-- {
		c := sinhcCoef[k]
		if x >= 0 {
			lo, hi = addDown(c.Lo, mulDown(x, lo)), addUp(c.Hi, mulUp(x, hi))
		} else {
			lo, hi = addDown(c.Lo, mulDown(x, hi)), addUp(c.Hi, mulUp(x, lo))
		}
	}
	if w := addUp(z.Hi, -z.Lo); w > 0 {
		hi = addUp(hi, mulUp(w, 0.2))
	}
	return Interval{addDown(lo, -rest), addUp(hi, rest)}
}

// sinhcReach[n] is a float64 r ≤ 1 with r^n/(2n+1)! < 2⁻⁶⁰, checked in
// directed rounding; sinhcReach[10] = 1 (1/21! < 2⁻⁶⁰).
var sinhcReach = func() (r [len(sinhcCoef)]float64) {
	below := func(m float64, n int) bool { // m^n·c_n < 2⁻⁶⁰, rounded up
		p := sinhcCoef[n].Hi
		for range n {
			p = mulUp(p, m)
		}
		return p < 0x1p-60
	}
	for n := 1; n < len(r); n++ {
		m := math.Min(1, math.Exp((math.Log(0x1p-60)-math.Log(sinhcCoef[n].Hi))/float64(n)))
		for !below(m, n) {
			m *= 1 - 0x1p-20
		}
		r[n] = m
	}
	return r
}()

// sinhcCoef[k] encloses 1/(2k+1)!, for k up to the last term
// sinhcPowerSeries can need at |z| = 1 (1/21! < 2⁻⁶⁰ ≤ 1/19!).
var sinhcCoef = func() (c [11]Interval) {
	c[0] = Point(1)
	for k := 1; k < len(c); k++ {
		c[k] = c[k-1].Div(Point(float64((2 * k) * (2*k + 1))))
	}
	return c
}()

// sinhcPoint encloses sinh(v)/v at a point (1 at 0).
func sinhcPoint(v float64) Interval {
	a := math.Abs(v)
	if a <= seriesRadius {
		return sinhcPowerSeries(Point(a).Sqr())
	}
	return Sinh(Point(a)).Div(Point(a))
}

// Sinhc returns sinh(x)/x, with value 1 at x = 0 (even, increasing in |x|):
//
//	sinh(x)/x = Σ_{k≥0} x^(2k)/(2k+1)!   (DLMF 4.33.1, from memory)
//
// The series is used for |x| ≤ 1, sinh(x)/x in interval arithmetic beyond.
func Sinhc(x Interval) Interval {
	a := x.Abs()
	if a.Lo == a.Hi {
		return sinhcPoint(a.Lo)
	}
	return Interval{sinhcPoint(a.Lo).Lo, sinhcPoint(a.Hi).Hi}
}

// sincFirstMin is a point below t₁ ≈ 4.4934, the first positive root of
// tan t = t, where sin(x)/x has its least value cos t₁ ≈ -0.21723; sin(x)/x
// decreases on [0, t₁] (its derivative is cos x·(x - tan x)/x² < 0 there).
const (
	sincFirstMin = 4.49
	sincMinValue = -0.2173 // below cos t₁ = -0.2172336282…
)

// sincPoint encloses sin(v)/v at a point (1 at 0).
func sincPoint(v float64) Interval {
	a := math.Abs(v)
	if a <= seriesRadius {
		return sinhcPowerSeries(Point(a).Sqr().Neg())
	}
	return Sin(Point(a)).Div(Point(a))
}

// Sinc returns sin(x)/x, with value 1 at x = 0 (the unnormalized cardinal
// sine; even):
//
//	sin(x)/x = Σ_{k≥0} (-1)^k x^(2k)/(2k+1)!   (DLMF 4.19.1, from memory)
//
// The series is used for |x| ≤ 1, sin(x)/x in interval arithmetic beyond.
// On |x| ≤ 4.49 the function decreases in |x| and is evaluated at the
// endpoints; beyond, the enclosure is sin(x)/x in interval arithmetic
// intersected with [max(-0.2173, -1/|x|), 1/|x|].
func Sinc(x Interval) Interval {
	a := x.Abs()
	var r Interval
	have := false
	switch {
	case a.Lo == a.Hi && a.Lo <= sincFirstMin:
		return sincPoint(a.Lo)
	case a.Lo <= sincFirstMin:
		r = Interval{sincPoint(fmin(a.Hi, sincFirstMin)).Lo, sincPoint(a.Lo).Hi}
		have = true
	}
	if a.Hi > sincFirstMin {
		b := Interval{fmax(a.Lo, sincFirstMin), a.Hi}
		env := divUp(1, b.Lo)
		s := Interval{fmax(sincMinValue, -env), env}
		if b.IsFinite() {
			if t, ok := Sin(b).Div(b).Intersect(s); ok {
				s = t
			}
		}
		if have {
			r = r.Hull(s)
		} else {
			r = s
		}
	}
	return r
}

// xOverSinhPoint encloses v/sinh(v) at a point (1 at 0).
//
//	x/sinh x = 2|x| e^(-|x|)/(1 - e^(-2|x|))
func xOverSinhPoint(v float64) Interval {
	a := math.Abs(v)
	switch {
	case a <= seriesRadius:
		return sinhcPowerSeries(Point(a).Sqr()).Recip()
	case a > 700:
		// 2a e^(-a/2) ≤ 1 - e^(-2a) here, so x/sinh x ≤ e^(-a/2).
		_, hi := expBounds(-a / 2)
		return Interval{0, hi}
	}
	eLo, eHi := expBounds(-a)
	lo := divDown(mulDown(2*a, eLo), addUp(1, -mulDown(eLo, eLo)))
	hi := divUp(mulUp(2*a, eHi), addDown(1, -mulUp(eHi, eHi)))
	return Interval{lo, fmin(1, hi)}
}

// XOverSinh returns x/sinh(x), with value 1 at x = 0 (even, decreasing in
// |x|; the transform of sech² is πξ/2 / sinh(πξ/2) times 2). It is
// 1/Sinhc(x), evaluated by the series of Sinhc for |x| ≤ 1 and as
// 2|x| e^(-|x|)/(1 - e^(-2|x|)) beyond, which does not overflow.
//
// A thin interval (width d ≤ 2⁻⁴⁰, a point computed in interval
// arithmetic) takes one evaluation, at a.Lo: on
// (0, ∞), d ln(x/sinh x)/dx = 1/x - coth x lies in (-1, 0) (the Langevin
// function coth x - 1/x is between 0 and 1), so the value at a.Hi is at
// least the value at a.Lo times e^{-d} ≥ 1 - d.
func XOverSinh(x Interval) Interval {
	a := x.Abs()
	if d := addUp(a.Hi, -a.Lo); d <= 0x1p-40 {
		v := xOverSinhPoint(a.Lo)
		if d > 0 {
			v.Lo = mulDown(v.Lo, addDown(1, -d))
		}
		return v
	}
	return Interval{xOverSinhPoint(a.Hi).Lo, xOverSinhPoint(a.Lo).Hi}
}

// sinhcSqrtMonotone is a bound below which sinhc(√z) increases in z on
// [sinhcSqrtMonotone, ∞): for z < 0 it is sin(t)/t with t = √-z ≤ √20 < t₁.
const sinhcSqrtMonotone = -20

// sinhcSqrtPoint encloses sinh(√z)/√z (sin(√-z)/√-z for z < 0) at a point.
func sinhcSqrtPoint(z float64) Interval {
	switch {
	case math.Abs(z) <= seriesRadius:
		return sinhcPowerSeries(Point(z))
	case z > 0:
		return Sinhc(Sqrt(Point(z)))
	}
	return Sinc(Sqrt(Point(-z)))
}

// SinhcSqrt returns sinh(√z)/√z for z ≥ 0, continued to z < 0 as
// sin(√-z)/√-z: the entire function
//
//	Σ_{k≥0} z^k/(2k+1)!   (DLMF 4.33.1 and 4.19.1 with x = √±z, from memory)
//
// It appears in the Fourier transform of the Kaiser–Bessel window,
// W·sinh(√(β² - (Wξ/2)²))/√(β² - (Wξ/2)²), whose argument changes sign at
// |ξ| = 2β/W. The series is used for |z| ≤ 1, Sinhc(√z) or Sinc(√-z)
// beyond. The function increases in z on [-20, ∞).
func SinhcSqrt(z Interval) Interval {
	if z.Lo >= sinhcSqrtMonotone {
		return Interval{sinhcSqrtPoint(z.Lo).Lo, sinhcSqrtPoint(z.Hi).Hi}
	}
	neg := Interval{z.Lo, fmin(z.Hi, sinhcSqrtMonotone)}
	r := Sinc(Sqrt(neg.Neg()))
	if z.Hi > sinhcSqrtMonotone {
		r = r.Hull(Interval{sinhcSqrtPoint(sinhcSqrtMonotone).Lo, sinhcSqrtPoint(z.Hi).Hi})
	}
	return r
}

// besselI0Overflow is an argument beyond which I₀ exceeds MaxFloat64
// (I₀(715) ≈ 1.6·10³⁰⁸; checked in the tests).
const besselI0Overflow = 715

// besselI0Bounds returns lo ≤ I₀(a) ≤ hi for a ≥ 0 by the power series
//
//	I₀(a) = Σ_{k≥0} q^k/(k!)²,  q = a²/4   (DLMF 10.25.2 with ν = 0, from memory)
//
// All terms are positive. The lower bound sums the terms rounded down; the
// upper bound sums them rounded up and adds the remainder after term n,
// at most t_n/(1 - ρ) with ρ = q/(n+1)² < 1 the largest later ratio of
// consecutive terms.
func besselI0Bounds(a float64) (lo, hi float64) {
	if !(a <= besselI0Overflow) { // also NaN
		return math.MaxFloat64, math.Inf(1)
	}
	return besselI0Quarter(mulDown(mulDown(a, a), 0.25), mulUp(mulUp(a, a), 0.25))
}

// besselI0Quarter bounds I₀ given q = a²/4 in [qLo, qHi], qLo ≥ 0: the
// series of besselI0Bounds in q, for callers (the Kaiser-Bessel window)
// that can form q without squaring a root.
//
// Up to q = besselI0Reach[len-1] (about 560, a ≈ 47) a polynomial of
// tabulated length is evaluated instead, by Horner's rule: n is the least
// with qHi ≤ besselI0Reach[n], so that t_n = q^n/(n!)² < 2⁻⁶⁰ and the ratio
// of later terms is at most q/(n+1)² ≤ 1/2; the rest is then below
// 2·t_n < 2⁻⁵⁹ ≤ 2⁻⁵⁹·I₀. All coefficients are positive and q ≥ 0, so the
// lower bound is Horner's rule at qLo rounded down and the upper bound at
// qHi rounded up.
func besselI0Quarter(qLo, qHi float64) (lo, hi float64) {
	if qHi <= besselI0Reach[len(besselI0Reach)-1] {
		n := 1
		for qHi > besselI0Reach[n] {
			n++
		}
		lo, hi = besselI0Coef[n-1].Lo, besselI0Coef[n-1].Hi
		for k := n - 2; k >= 0; k-- {
			lo = addDown(besselI0Coef[k].Lo, mulDown(qLo, lo))
			hi = addUp(besselI0Coef[k].Hi, mulUp(qHi, hi))
		}
		return lo, addUp(hi, 0x1p-59)
	}
	tLo, tHi := 1.0, 1.0
	lo, hi = 1, 1
	// a ≤ 715 needs fewer than 600 terms; the cap only guards the loop.
	for k := 1; k < 4096; k++ {
		kk := float64(k) * float64(k) // exact
		// t_k = t_(k-1)·(q/k²); the ratio first, so that no intermediate
		// product overflows.
		tLo = mulDown(tLo, divDown(qLo, kk))
		tHi = mulUp(tHi, divUp(qHi, kk))
		lo = addDown(lo, tLo)
		hi = addUp(hi, tHi)
		if math.IsInf(hi, 1) {
			return lo, hi
		}
		next := float64(k+1) * float64(k+1)
		if rho := divUp(qHi, next); rho <= 0.5 && tHi <= lo*0x1p-60 {
			// Remainder Σ_{j>k} t_j ≤ t_k·ρ/(1-ρ) ≤ t_k (ρ ≤ 1/2).
			return lo, addUp(hi, mulUp(tHi, divUp(rho, addDown(1, -rho))))
		}
	}
	return lo, math.Inf(1)
}

// besselI0Coef[k] encloses 1/(k!)², the coefficient of q^k in I₀.
var besselI0Coef = func() (c [81]Interval) {
	c[0] = Point(1)
	for k := 1; k < len(c); k++ {
		c[k] = c[k-1].Div(Point(float64(k * k)))
	}
	return c
}()

// besselI0Reach[n] is a float64 r with r^n/(n!)² < 2⁻⁶⁰ and r ≤ (n+1)²/2,
// checked in directed rounding (besselI0Reach[0] = 0).
var besselI0Reach = func() (r [len(besselI0Coef)]float64) {
	below := func(q float64, n int) bool { // q^n·c_n < 2⁻⁶⁰, rounded up
		p := besselI0Coef[n].Hi
		for range n {
			p = mulUp(p, q)
		}
		return p < 0x1p-60
	}
	for n := 1; n < len(r); n++ {
		q := math.Min(float64((n+1)*(n+1))/2, math.Exp((math.Log(0x1p-60)-math.Log(besselI0Coef[n].Hi))/float64(n)))
		for !below(q, n) {
			q *= 1 - 0x1p-20
		}
		r[n] = q
	}
	return r
}()

// BesselI0 returns the modified Bessel function of the first kind of order
// zero (even, increasing in |x|, I₀(0) = 1), which normalizes the
// Kaiser–Bessel window:
//
//	I₀(x) = Σ_{k≥0} (x²/4)^k/(k!)²   (DLMF 10.25.2, from memory)
//
// summed in outward-rounded arithmetic with a certified geometric bound on
// the remainder. The relative width grows like |x|·2⁻⁵¹ (the rounding of
// about |x|/2 terms). Beyond |x| = 715, where I₀ exceeds MaxFloat64, the
// result is [MaxFloat64, +Inf].
func BesselI0(x Interval) Interval {
	a := x.Abs()
	if !(a.Hi <= besselI0Overflow) { // also NaN
		lo, _ := besselI0Bounds(a.Lo)
		return Interval{lo, math.Inf(1)}
	}
	// One series: its lower bound at a.Lo, its upper bound at a.Hi.
	lo, hi := besselI0Quarter(mulDown(mulDown(a.Lo, a.Lo), 0.25), mulUp(mulUp(a.Hi, a.Hi), 0.25))
	return Interval{lo, hi}
}
