package gridding

import (
	"math"

	"foldbound/bounds"
)

// The bounding function of a kernel (doc.go, steps 2-4): for every mode
// frequency θ = 2πk/M and every point position,
//
//	|deapodized error| ≤ (A(θ) + T(θ)) / φ̂(θ)
//
// with A the aliasing part and T the truncation part (Gaussian: the grid
// points cut off; Kaiser-Bessel: the jump at the edges). parts encloses
// the three pieces for every θ in an interval, estimate computes them in
// float64 for the optimisation of β.

// parts holds enclosures of the aliasing part, the truncation part and the
// transform at the deapodization frequency. Every unevaluated tail is
// included in alias as [0, tail] so that alias.Lo is a value the bounding
// function reaches or exceeds.
type parts struct {
	alias, trunc, den bounds.Interval
}

// shape computes the bounding function of one kernel. It is built once per
// kernel (the truncation part of the Gaussian does not depend on θ).
type shape struct {
	k     Kernel
	w     float64
	gauss bounds.GaussianFamily
	trunc bounds.Interval // Gaussian: constant truncation part
}

func newShape(k Kernel) *shape {
	s := &shape{k: k, w: float64(k.Width)}
	if k.Type == Gaussian {
		s.gauss = bounds.GaussianFamily{Sigma: k.Sigma()}
		s.trunc = s.gaussTruncation()
	}
	return s
}

// maxCopies limits the alias copies summed explicitly on each side.
const maxCopies = 64

// tailGoal is the size of an unevaluated tail, relative to the partial
// sum, at which summation stops; the tail is still included.
const tailGoal = 1e-3

var twoPi = bounds.TwoPi

// enclose returns the parts for every θ in theta (0 ≤ theta.Lo).
func (s *shape) enclose(theta bounds.Interval) parts {
	if s.k.Type == Gaussian {
		return s.gaussParts(theta)
	}
	return s.kaiserParts(theta)
}

// gaussParts: A(θ) = Σ_{l≠0} φ̂(θ + 2πl) for the untruncated Gaussian, all
// terms positive. For l > L both sides are bounded by the copies at
// ω ≥ ω0 = 2π(L+1) - θ: the ratio of consecutive copies,
// exp(-2πs²(ω + π)), decreases in ω, so
//
//	Σ_{l>L} [φ̂(θ+2πl) + φ̂(θ-2πl)] ≤ 2φ̂(ω0)/(1 - exp(-2πs²(ω0 + π))).
func (s *shape) gaussParts(theta bounds.Interval) parts {
	g := s.gauss
	var sum bounds.Interval
	tail := math.Inf(1)
	for l := 1; l <= maxCopies; l++ {
		lp := twoPi.Scale(float64(l))
		sum = sum.Add(g.Transform(theta.Add(lp)).Re.Abs()).Add(g.Transform(theta.Sub(lp)).Re.Abs())
		w0 := bounds.Point(lp.Lo).Add(twoPi).Sub(bounds.Point(theta.Hi)).Lo
		tail = s.gaussAliasTail(w0)
		if tail <= tailGoal*sum.Lo || tail == 0 {
			break
		}
	}
	return parts{
		alias: sum.Add(bounds.Interval{Lo: 0, Hi: tail}),
		trunc: s.trunc,
		den:   g.Transform(theta).Re,
	}
}

// gaussAliasTail bounds the copies at ω ≥ w0 > 0 on both sides.
func (s *shape) gaussAliasTail(w0 float64) float64 {
	sg := s.gauss.Sigma
	first := s.gauss.Transform(bounds.Point(w0)).Re
	r := bounds.Exp(bounds.Point(w0).Add(bounds.Pi).Mul(bounds.Point(sg).Sqr()).Mul(twoPi).Neg())
	return first.Scale(2).Div(bounds.Point(1).Sub(r)).Hi
}

// gaussTruncation bounds the points cut off by the window [-W/2, W/2):
// with the first kept point at -W/2 + t, t in [0, 1), they sit at
// W/2 + t + j and -(W/2 + 1 - t + j), j ≥ 0. Each Gaussian term is convex
// in t beyond the inflection point s ≤ W/2, so the sum is largest at t = 0:
//
//	T ≤ φ(W/2) + 2 Σ_{j≥1} φ(W/2 + j),
//
// summed until the geometric majorant of the rest, with ratio
// exp(-(2y+1)/(2s²)) decreasing in y, is negligible.
func (s *shape) gaussTruncation() bounds.Interval {
	g := s.gauss
	a := s.w / 2
	sum := g.Value(bounds.Point(a)).Re
	tail := math.Inf(1)
	for j := 1; j < 1000; j++ {
		y := a + float64(j)
		sum = sum.Add(g.Value(bounds.Point(y)).Re.Scale(2))
		// Σ_{i>j} φ(a+i) ≤ φ(y+1)/(1 - exp(-(2(y+1)+1)/(2s²))).
		next := g.Value(bounds.Point(y + 1)).Re
		r := bounds.Exp(bounds.Point(2*(y+1) + 1).Div(bounds.Point(g.Sigma).Sqr().Scale(2)).Neg())
		tail = next.Scale(2).Div(bounds.Point(1).Sub(r)).Hi
		if tail <= 1e-6*sum.Lo || tail == 0 {
			break
		}
	}
	return sum.Add(bounds.Interval{Lo: 0, Hi: tail})
}

// estimate computes the bounding function's pieces at θ in float64 (not
// a bound), for the optimisation of β.
func (s *shape) estimate(theta float64) (alias, trunc, den float64) {
	k := s.k
	den = k.transform(theta)
	switch k.Type {
	case Gaussian:
		for l := 1; l <= maxCopies; l++ {
			lp := 2 * math.Pi * float64(l)
			a := k.transform(theta+lp) + k.transform(theta-lp)
			alias += a
			if a <= 1e-6*alias {
				break
			}
		}
		trunc = s.trunc.Mid()
	default:
		alias, trunc = s.kaiserEstimate(theta)
	}
	return alias, trunc, den
}

// ratioEstimate returns the float64 estimate of (A + T)/φ̂ at θ.
func (s *shape) ratioEstimate(theta float64) float64 {
	a, t, d := s.estimate(theta)
	if !(d > 0) {
		return math.Inf(1)
	}
	return (a + t) / d
}
