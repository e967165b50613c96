package bounds

import "math"

// Interval special functions used by the window families (B-splines,
// Kaiser-Bessel). Each returns an enclosure valid for every point of its
// interval argument; series are summed in interval arithmetic and their
// remainders are bounded explicitly, so no accuracy claim about a library
// routine is needed beyond the ones in elementary.go.

// seriesGoal is the remainder, relative to the partial sum, at which the
// series below stop: far below the rounding of the sum itself.
const seriesGoal = 0x1p-62

// sinc returns sin(x)/x, with sinc(0) = 1.
//
// Near 0 (|x| ≤ 1) it sums the Maclaurin series (DLMF 4.19.1 divided by
// x, from memory)
//
//	sin(x)/x = Σ_{k≥0} (-1)^k x^{2k}/(2k+1)!
//
// whose terms decrease in modulus for |x| ≤ 1 and alternate, so the
// remainder is at most the first omitted term (Leibniz). sinc is even and
// decreasing on [0, 1] (indeed on [0, 4.49]), so an interval inside
// [-1, 1] is bounded by the series at the endpoints of |x|. For |x| ≥ 1 it
// is sin/x in interval arithmetic (sincLarge).
func sinc(x Interval) Interval {
	a := x.Abs()
	switch {
	case a.Hi <= 1:
		return Interval{sincSeries(a.Hi).Lo, sincSeries(a.Lo).Hi}
	case a.Lo >= 1:
		return sincLarge(a)
	default:
		near := Interval{sincSeries(1).Lo, sincSeries(a.Lo).Hi}
		return near.Hull(sincLarge(Interval{1, a.Hi}))
	}
}

// sincLarge encloses sin(x)/x for x in a, 1 ≤ a.Lo. A narrow interval
// (the usual case: a point carried through a few roundings) takes one sine
// at a point m of a and the mean-value bound |sin x - sin m| ≤ |x - m|;
// a wide one takes Sin(a).
func sincLarge(a Interval) Interval {
	var s Interval
	if a.Hi-a.Lo <= 0x1p-20*a.Lo {
		m := a.Mid()
		d := math.Max(addUp(m, -a.Lo), addUp(a.Hi, -m))
		s = sinPoint(m)
		s = Interval{math.Max(-1, addDown(s.Lo, -d)), math.Min(1, addUp(s.Hi, d))}
	} else {
		s = Sin(a)
	}
	// s / a with a > 0: the extreme quotients use a.Hi for the endpoint
	// of s nearer 0 and a.Lo for the farther.
	lo, hi := divDown(s.Lo, a.Lo), divUp(s.Hi, a.Lo)
	if s.Lo >= 0 {
		lo = divDown(s.Lo, a.Hi)
	}
	if s.Hi <= 0 {
		hi = divUp(s.Hi, a.Hi)
	}
	return Interval{lo, hi}
}

// sincSeries encloses sin(v)/v for 0 ≤ v ≤ 1 by the series in sinc.
func sincSeries(v float64) Interval {
	x2 := Point(v).Sqr()
	sum := Point(1)
	term := Point(1)
	for k := 1; k < 30; k++ {
		// term_k = v^{2k}/(2k+1)! = term_{k-1}·v²/((2k)(2k+1))
		term = term.Mul(x2).Div(Point(float64(2 * k * (2*k + 1))))
		if term.Hi <= seriesGoal {
			// Alternating series with decreasing terms: the remainder
			// from term k on is at most term_k.
			return Interval{addDown(sum.Lo, -term.Hi), math.Min(1, addUp(sum.Hi, term.Hi))}
		}
		if k%2 == 1 {
			sum = sum.Sub(term)
		} else {
			sum = sum.Add(term)
		}
	}
	// Unreachable for v ≤ 1 (1/21! < 2⁻⁶²); the crude bound keeps it safe.
	return Interval{-1, 1}
}

// besselI0 returns the modified Bessel function of the first kind and
// order zero,
//
//	I0(x) = Σ_{k≥0} (x²/4)^k / (k!)²                      (DLMF 10.25.2)
//
// It is besselI0Quarter(x²/4); see there for the remainder.
func besselI0(x Interval) Interval {
	return besselI0Quarter(x.Sqr().Scale(0.25))
}

// besselI0Quarter returns I0(x) given y = x²/4 ≥ 0 (negative parts of y are
// ignored): Σ_k y^k/(k!)². Every term is positive and increasing in y, so
// the interval sum is a tight enclosure over y. The ratio of consecutive
// terms is t_{j+1}/t_j = y/(j+1)² ≤ r = y/(k+1)² for j ≥ k, so after
// summing terms 0..k the remainder satisfies
//
//	0 ≤ Σ_{j>k} t_j ≤ t_k·r/(1-r)        (r < 1; geometric majorant).
//
// The loop stops when that bound is below seriesGoal times the sum; for
// y ≤ 700²/4 this takes fewer than 700 terms. The result is +∞ above if it
// overflows.
func besselI0Quarter(y Interval) Interval {
	lo, hi := math.Max(y.Lo, 0), math.Max(y.Hi, 0)
	// Every quantity below is ≥ 0, so directed rounding of the endpoints
	// needs no sign cases: [tLo, tHi] encloses the term, [sLo, sHi] the sum.
	tLo, tHi := 1.0, 1.0
	sLo, sHi := 1.0, 1.0
	for k := 1; k < 4096; k++ {
		kk := float64(k * k) // exact
		tLo = divDown(mulDown(tLo, lo), kk)
		tHi = divUp(mulUp(tHi, hi), kk)
		sLo = addDown(sLo, tLo)
		sHi = addUp(sHi, tHi)
		if math.IsInf(sHi, 1) {
			break
		}
		kn := float64(k+1) * float64(k+1)
		if hi < 0.5*kn { // r = y/(k+1)² < 1/2
			r := divUp(hi, kn)
			tail := divUp(mulUp(tHi, r), addDown(1, -r))
			if tail <= mulDown(seriesGoal, sLo) {
				return Interval{sLo, addUp(sHi, tail)}
			}
		}
	}
	return Interval{sLo, math.Inf(1)}
}

// sinhcSqrt returns the entire function
//
//	S(z) = sinh(√z)/√z    (z > 0)
//	     = sin(√-z)/√-z   (z < 0)
//	     = Σ_{k≥0} z^k/(2k+1)!   (all z; S(0) = 1)
//
// (the series are DLMF 4.33.1 for sinh(t)/t with t² = z and DLMF 4.19.1
// for sin(t)/t with t² = -z; equation numbers from memory). For |z| ≤ 1
// it sums the series in interval arithmetic: |t_{j+1}/t_j| =
// |z|/((2j+2)(2j+3)) ≤ r = |z|/((2k+2)(2k+3)) for j ≥ k, so the remainder
// after term k is at most |t_k|·r/(1-r). For
// z ≥ 1, S is increasing and evaluated at the endpoints by Sinh and Sqrt;
// for z ≤ -1 it is sinc(√-z). An interval spanning several of these ranges
// is split and the pieces joined.
func sinhcSqrt(z Interval) Interval {
	var r Interval
	have := false
	join := func(v Interval) {
		if have {
			r = r.Hull(v)
		} else {
			r, have = v, true
		}
	}
	if mid, ok := z.Intersect(Interval{-1, 1}); ok {
		join(sinhcSeries(mid))
	}
	if pos, ok := z.Intersect(Interval{1, math.Inf(1)}); ok {
		lo := Point(pos.Lo)
		hi := Point(pos.Hi)
		vlo := Sinh(Sqrt(lo)).Div(Sqrt(lo)).Lo
		vhi := Sinh(Sqrt(hi)).Div(Sqrt(hi)).Hi
		if math.IsInf(pos.Hi, 1) {
			vhi = math.Inf(1)
		}
		join(Interval{vlo, vhi})
	}
	if neg, ok := z.Intersect(Interval{math.Inf(-1), -1}); ok {
		join(sinc(Sqrt(neg.Neg())))
	}
	if !have {
		// z has a NaN endpoint: refuse to bound.
		return entire
	}
	return r
}

// sinhcSeries encloses Σ_k z^k/(2k+1)! for z within [-1, 1].
func sinhcSeries(z Interval) Interval {
	zm := z.Mag()
	sum := Point(1)
	term := Point(1)
	for k := 1; k < 30; k++ {
		kk := float64(k)
		term = term.Mul(z).Div(Point((2 * kk) * (2*kk + 1)))
		sum = sum.Add(term)
		r := divUp(zm, (2*kk+2)*(2*kk+3))
		tail := divUp(mulUp(term.Mag(), r), addDown(1, -r))
		if tail <= seriesGoal {
			return Interval{addDown(sum.Lo, -tail), addUp(sum.Hi, tail)}
		}
	}
	// Unreachable for |z| ≤ 1.
	return entire
}
