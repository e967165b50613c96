package bounds

import "math"

// accumulator sums intervals with error-free transformations. Each
// endpoint is kept as an unevaluated pair s + e: s is the float sum and e
// collects the exact rounding errors of the additions (TwoSum, Knuth, The
// Art of Computer Programming, Vol. 2, §4.2.2, from memory), itself added
// with directed rounding. The endpoint is rounded once, when the sum is
// read, so N additions widen the result by about one ulp instead of N
// (Ogita, Rump & Oishi, "Accurate sum and dot product", SIAM J. Sci.
// Comput. 26(6), 2005, from memory).
type accumulator struct {
	lo, loErr float64 // lower endpoint: lo + loErr, loErr rounded down
	hi, hiErr float64 // upper endpoint: hi + hiErr, hiErr rounded up
}

// add adds the interval x.
func (a *accumulator) add(x Interval) {
	a.lo, a.loErr = accumulateDown(a.lo, a.loErr, x.Lo)
	a.hi, a.hiErr = accumulateUp(a.hi, a.hiErr, x.Hi)
}

// interval returns the enclosure of the sum so far.
func (a *accumulator) interval() Interval {
	return Interval{addDown(a.lo, a.loErr), addUp(a.hi, a.hiErr)}
}

func accumulateDown(s, e, x float64) (float64, float64) {
	t := s + x
	if math.IsInf(t, 0) || math.IsNaN(t) {
		if math.IsNaN(t) {
			t = math.Inf(-1)
		}
		return t, 0
	}
	return t, addDown(e, twoSumErr(s, x, t))
}

func accumulateUp(s, e, x float64) (float64, float64) {
	t := s + x
	if math.IsInf(t, 0) || math.IsNaN(t) {
		if math.IsNaN(t) {
			t = math.Inf(1)
		}
		return t, 0
	}
	return t, addUp(e, twoSumErr(s, x, t))
}

// complexAccumulator sums complex intervals part by part.
type complexAccumulator struct {
	re, im accumulator
}

func (a *complexAccumulator) add(z Complex) {
	a.re.add(z.Re)
	a.im.add(z.Im)
}

func (a *complexAccumulator) value() Complex {
	return Complex{a.re.interval(), a.im.interval()}
}
