package bounds

import "math"

// Convex tails. A family whose modulus |f| is convex on the half-lines
// x ≤ c - d and x ≥ c + d has a truncation in modulus that is convex in
// the shift while every omitted sample stays on them: each omitted sample
// x_k = s + hk moves affinely with s, a convex function of an affine
// argument is convex, and so is a sum of convex functions. Its sup over a
// range of shifts is then attained at one of the range's ends
// (absTruncation), which two evaluations at points bound exactly instead
// of a cover of the range by pieces.
//
// The inflection points, from f'' = 0:
//
//	Gaussian e^{-x²/(2σ²)}    f'' = (x²/σ⁴ - 1/σ²)·f            d = σ
//	e^{-a|x|}                 convex on each side of 0          d = 0
//	sech(x/w)                 f'' = sech u (tanh²u - sech²u)/w²  d = w·asinh(1) = w·0.88137…
//	sech²(x/w)                f'' = 2 sech²u (3tanh²u - 1)/w²    d = w·atanh(1/√3) = w·0.65847…
//	1/(a² + x²)               f'' = (6x² - 2a²)/(a² + x²)³       d = a/√3 = a·0.57735…
//	B-spline M_m, m ≥ 2       (m/2 - |x|)_+^{m-1}/(m-1)! beyond   d = m/2 - 1
//	                          |x| = m/2 - 1 (de Boor, A Practical Guide to
//	                          Splines, 1978, ch. IX, from memory)
//
// (u = x/w; derivatives by the chain rule with sech' = -sech·tanh and
// tanh' = sech²). Each d is rounded up, which only shrinks the half-lines.

// convexTailer is implemented by families whose modulus is known to be
// convex on the half-lines x ≤ c - d and x ≥ c + d.
type convexTailer interface {
	// convexTails returns c and d ≥ 0, or ok = false when the family
	// cannot name such half-lines.
	convexTails() (c, d float64, ok bool)
}

// convexTails returns the half-lines of f on which |f| is convex
// (convexTailer), or ok = false.
func convexTails(f Family) (c, d float64, ok bool) {
	if t, is := f.(convexTailer); is {
		return t.convexTails()
	}
	return 0, 0, false
}

// Upper bounds of the inflection constants (40 digits: asinh 1 =
// ln(1+√2) = 0.8813735870195430252…, atanh(1/√3) = ln((1+√3)/√2) =
// 0.6584789484624083543…, 1/√3 = 0.5773502691896257645…), each a float64
// above the true value.
const (
	asinhOneUp      = 0.88137358701954305
	atanhInvSqrt3Up = 0.65847894846240838
	invSqrt3Up      = 0.57735026918962580
)

func (g GaussianFamily) convexTails() (float64, float64, bool) { return 0, g.Sigma, true }

func (e ExponentialFamily) convexTails() (float64, float64, bool) { return 0, 0, true }

func (s SechFamily) convexTails() (float64, float64, bool) {
	return 0, mulUp(s.Width, asinhOneUp), true
}

func (s SechSquaredFamily) convexTails() (float64, float64, bool) {
	return 0, mulUp(s.Width, atanhInvSqrt3Up), true
}

func (l LorentzianFamily) convexTails() (float64, float64, bool) {
	return 0, mulUp(l.Width, invSqrt3Up), true
}

func (b BSplineFamily) convexTails() (float64, float64, bool) {
	if b.Order < 2 || b.Order > MaxBSplineOrder {
		return 0, 0, false // the box jumps at its edges
	}
	return 0, float64(b.Order)/2 - 1, true // exact: small integers and halves
}

// |c·f| = |c|·|f| and |f·e^{iω₀x}| = |f|: the half-lines of f.

func (a AmplitudeFamily) convexTails() (float64, float64, bool) { return convexTails(a.Of) }

func (m ModulationFamily) convexTails() (float64, float64, bool) { return convexTails(m.Of) }

// convexTails of f(x - b) are those of f moved by b; the rounding error of
// the new centre, exact by TwoSum, widens d.
func (s ShiftFamily) convexTails() (float64, float64, bool) {
	c, d, ok := convexTails(s.Of)
	if !ok {
		return 0, 0, false
	}
	nc := c + s.By
	return nc, addUp(d, math.Abs(twoSumErr(c, s.By, nc))), true
}

// convexTails of f(x/a) are |x - ac| ≥ |a|·d; the rounding error of the
// new centre widens d.
func (dl DilationFamily) convexTails() (float64, float64, bool) {
	c, d, ok := convexTails(dl.Of)
	if !ok {
		return 0, 0, false
	}
	cb := Point(c).Scale(dl.By)
	nc := cb.Mid()
	rad := math.Max(addUp(cb.Hi, -nc), addUp(nc, -cb.Lo))
	return nc, addUp(mulUp(d, math.Abs(dl.By)), rad), true
}

// inConvexTails reports whether x ≥ c + d for every point of right and
// x ≤ c - d for every point of left, rounding on the safe side.
func inConvexTails(c, d float64, left, right Interval) bool {
	return addDown(right.Lo, -c) >= d && addUp(left.Hi, -c) <= -d
}
