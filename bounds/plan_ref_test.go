package bounds_test

// Independent references for the planner's acceptance tests: closed forms
// of catalogue functions and their transforms in plain float64, and a
// brute-force search for the least sample count under the certified budget,
// written here from the formulas of math.md without the engine's code.

import (
	"math"
	"math/cmplx"
)

// refFamily is a catalogue function with its transform in closed form,
// evaluated independently of the engine.
type refFamily struct {
	name   string
	f      func(x float64) complex128  // f(x)
	F      func(xi float64) complex128 // F(ξ) = ∫ f(x) e^{-iξx} dx
	center float64                     // windows are centred here
	reach  float64                     // |f| is 0 beyond center ± reach (0: unbounded support)
	source string
}

// gaussRef is exp(-(x-c)²/(2σ²)), F(ξ) = σ√(2π)·exp(-σ²ξ²/2)·e^{-iξc}
// (the Gaussian integral ∫e^{-ax²-iξx}dx = √(π/a)e^{-ξ²/(4a)}, DLMF 7.4.2
// with a change of variable, from memory; shift rule of math.md).
func gaussRef(sigma, c float64) refFamily {
	return refFamily{
		name: "gaussian",
		f: func(x float64) complex128 {
			u := (x - c) / sigma
			return complex(math.Exp(-0.5*u*u), 0)
		},
		F: func(xi float64) complex128 {
			a := sigma * math.Sqrt(2*math.Pi) * math.Exp(-0.5*sigma*sigma*xi*xi)
			return complex(a, 0) * cmplx.Exp(complex(0, -xi*c))
		},
		center: c,
		source: "DLMF 7.4.2 (from memory)",
	}
}

const unitRoundoffRef = 0x1p-53

// refAliasAbs returns Σ_{l≠0} |F(ξ + 2πl/h)|, summed until the terms are
// negligible: the aliasing of every shift.
func refAliasAbs(r refFamily, h, xi float64) float64 {
	P := 2 * math.Pi / h
	s := 0.0
	small := 0
	for l := 1; l < 1<<22; l++ {
		t := cmplx.Abs(r.F(xi+float64(l)*P)) + cmplx.Abs(r.F(xi-float64(l)*P))
		s += t
		if t <= 1e-18*s || t < 1e-300 {
			small++
			if small > 3 {
				break
			}
		} else {
			small = 0
		}
	}
	return s
}

// refAliasAt returns Σ_{l≠0} F(ξ + 2πl/h) e^{i2πls/h}, the error of the
// infinite grid of shift s (Poisson summation, math.md).
func refAliasAt(r refFamily, h, s, xi float64) complex128 {
	P := 2 * math.Pi / h
	var sum complex128
	small := 0
	for l := 1; l < 1<<22; l++ {
		ph := cmplx.Exp(complex(0, 2*math.Pi*float64(l)*s/h))
		a := r.F(xi+float64(l)*P) * ph
		b := r.F(xi-float64(l)*P) * cmplx.Conj(ph)
		sum += a + b
		if cmplx.Abs(a)+cmplx.Abs(b) <= 1e-18*cmplx.Abs(sum) || cmplx.Abs(a)+cmplx.Abs(b) < 1e-300 {
			small++
			if small > 3 {
				break
			}
		} else {
			small = 0
		}
	}
	return sum
}

// gridIndices returns the indices of a finite grid of n samples,
// -⌊(n-1)/2⌋ … ⌊n/2⌋ (the Grid convention).
func gridIndices(n int) (lo, hi int) {
	if n == 0 {
		return 1, 0 // no samples: the sums over "omitted" samples cover the lattice
	}
	return -((n - 1) / 2), n / 2
}

// refOmitted returns, for the grid s + hk of n samples, h·Σ_{k omitted}
// |f(x_k)| and the signed omitted sum h·Σ_{k omitted} f(x_k)e^{-iξx_k},
// summed outward until the terms are negligible.
func refOmitted(r refFamily, h, s float64, n int, xi float64) (abs float64, signed complex128) {
	lo, hi := gridIndices(n)
	side := func(k0, dir int) {
		prev := math.Inf(1)
		for j := 0; j < 1<<24; j++ {
			k := k0 + dir*j
			x := s + h*float64(k)
			if r.reach > 0 && math.Abs(x-r.center) > r.reach {
				return
			}
			v := r.f(x)
			t := h * cmplx.Abs(v)
			abs += t
			signed += complex(h, 0) * v * cmplx.Exp(complex(0, -xi*x))
			// Stop when the rest, bounded as a geometric series with the
			// last ratio, is negligible.
			ratio := t / prev
			prev = t
			if j > 2 && ratio < 1 && t*ratio/(1-ratio) < 1e-20 {
				return
			}
			if t == 0 && j > 2 && r.reach == 0 {
				return
			}
		}
	}
	side(hi+1, 1)
	side(lo-1, -1)
	return abs, signed
}

// refWindowAbs returns h·Σ_{k in grid} |f(x_k)|.
func refWindowAbs(r refFamily, h, s float64, n int) float64 {
	lo, hi := gridIndices(n)
	sum := 0.0
	for k := lo; k <= hi; k++ {
		sum += cmplx.Abs(r.f(s + h*float64(k)))
	}
	return h * sum
}

// refShifts returns m shifts spread over the range [s0 - h/2, s0 + h/2]
// covered by a plan for every shift, s0 = c for odd n and c - h/2 for even
// n (the window's centre then stays within h/2 of c).
func refShifts(c, h float64, n, m int) []float64 {
	s0 := c
	if n%2 == 0 {
		s0 = c - h/2
	}
	out := make([]float64, m)
	for i := range out {
		out[i] = s0 - h/2 + h*float64(i)/float64(m-1)
	}
	return out
}

// refRounding is the rounding bound of an n-term sum in double precision
// with correctly rounded samples at ξ = 0,
// (γ_{n+3} + u)·S, γ_m = mu/(1 - mu) (Higham, Accuracy and Stability of
// Numerical Algorithms, 2nd ed., 2002, §3.1, from memory).
func refRounding(n int, S float64) float64 {
	nu := float64(n+3) * unitRoundoffRef
	return (nu/(1-nu) + unitRoundoffRef) * S
}

// refShiftSet returns m shifts spread over the range [s0 - h/2, s0 + h/2]
// for both parities: odd counts use s0 = c, even counts s0 = c - h/2.
// refShifts gives one parity; this pairs them.
func refShiftSet(c, h float64, m int) (odd, even []float64) {
	return refShifts(c, h, 1, m), refShifts(c, h, 2, m)
}

// refCertifiedAt returns, for one step h, the certified budget of n
// samples at ξ = 0 for every shift: the aliasing of every shift, the worst
// truncation over the shifts and the rounding with the worst window sum
// (the window sum is the lattice sum less the omitted part). The second
// result reports that rounding alone exceeds tol, so that larger counts
// cannot help.
func refCertifiedAt(r refFamily, h float64, shifts int, tol float64) func(n int) (float64, bool) {
	a := refAliasAbs(r, h, 0)
	odd, even := refShiftSet(r.center, h, shifts)
	full := func(ss []float64) []float64 {
		out := make([]float64, len(ss))
		for i, s := range ss {
			t, _ := refOmitted(r, h, s, 0, 0) // n = 0: every sample is "omitted"
			out[i] = t
		}
		return out
	}
	fullOdd, fullEven := full(odd), full(even)
	return func(n int) (float64, bool) {
		ss, fs := odd, fullOdd
		if n%2 == 0 {
			ss, fs = even, fullEven
		}
		tr, S := 0.0, 0.0
		for i, s := range ss {
			t, _ := refOmitted(r, h, s, n, 0)
			tr = math.Max(tr, t)
			S = math.Max(S, fs[i]-t)
		}
		rd := refRounding(n, S)
		return a + tr + rd, rd > tol
	}
}

// refCertified is refCertifiedAt for one grid.
func refCertified(r refFamily, h float64, n, shifts int) float64 {
	v, _ := refCertifiedAt(r, h, shifts, math.Inf(1))(n)
	return v
}

// refActualAt returns, for one step h, the worst actual error
// max_s |T - F(0)| of n samples over the shifts, T - F = alias(s) -
// omitted(s) exactly (Poisson summation), without rounding.
func refActualAt(r refFamily, h float64, shifts int) func(n int) (float64, bool) {
	odd, even := refShiftSet(r.center, h, shifts)
	al := func(ss []float64) []complex128 {
		out := make([]complex128, len(ss))
		for i, s := range ss {
			out[i] = refAliasAt(r, h, s, 0)
		}
		return out
	}
	alOdd, alEven := al(odd), al(even)
	return func(n int) (float64, bool) {
		ss, as := odd, alOdd
		if n%2 == 0 {
			ss, as = even, alEven
		}
		worst := 0.0
		for i, s := range ss {
			_, om := refOmitted(r, h, s, n, 0)
			worst = math.Max(worst, cmplx.Abs(as[i]-om))
		}
		return worst, false
	}
}

// refActual is refActualAt for one grid.
func refActual(r refFamily, h float64, n, shifts int) float64 {
	v, _ := refActualAt(r, h, shifts)(n)
	return v
}

// bruteMin searches the steps hs exhaustively and returns the least count n
// with budget(h)(n) ≤ tol for some h, and that h. For each step the counts
// are scanned upward from the previous step's answer less a few, up to
// the best count so far, or until the budget reports that larger counts
// cannot help.
func bruteMin(hs []float64, tol float64, maxN int, budget func(h float64) func(n int) (float64, bool)) (int, float64) {
	best, bestH := math.MaxInt, 0.0
	start := 1
	for _, h := range hs {
		b := budget(h)
		n := max(1, start-3)
		found := false
		for ; n <= maxN && n < best; n++ {
			v, stop := b(n)
			if v <= tol {
				found = true
				break
			}
			if stop {
				break
			}
		}
		if found {
			best, bestH = n, h
			start = n
		}
	}
	return best, bestH
}

// logSteps returns m steps spaced geometrically over [lo, hi].
func logSteps(lo, hi float64, m int) []float64 {
	out := make([]float64, m)
	r := math.Log(hi / lo)
	for i := range out {
		out[i] = lo * math.Exp(r*float64(i)/float64(m-1))
	}
	return out
}

// refStepForAlias returns about the largest step whose aliasing of every
// shift at ξ = 0 is within eps, by bisection (it assumes the aliasing
// grows with the step, as it does for decreasing |F|).
func refStepForAlias(r refFamily, eps float64) float64 {
	lo, hi := 1e-6, 1e3
	for i := 0; i < 200 && hi/lo > 1+1e-12; i++ {
		m := math.Sqrt(lo * hi)
		if refAliasAbs(r, m, 0) <= eps {
			lo = m
		} else {
			hi = m
		}
	}
	return lo
}
