package bounds_test

// Independent references for the planner's acceptance tests: closed forms
// of catalogue functions and their transforms in plain float64, and a
// brute-force search for the least sample count under the certified budget,
// written here from the formulas of math.md without the engine's code.

import (
	"math"
	"math/cmplx"

	"foldbound/bounds"
)

// refFamily is a catalogue function with its transform in closed form,
// evaluated independently of the engine.
type refFamily struct {
	// power > 1 and envF(ξ) ≥ |F(ξ)| describe an algebraic decay
	// |F| ≤ C|ξ|^{-power}, used to end the alias sums.
	power float64
	envF  func(xi float64) float64

	// aliasAbs and aliasAt, when set, replace the summation of the
	// alias copies by a closed form (for transforms that decay slowly).
	aliasAbs func(h float64) float64
	aliasAt  func(h, s float64) complex128
	// omitted, when set, replaces the summation of the omitted samples by
	// a closed form (ξ = 0): h Σ_{k omitted} |f(x_k)| for the grid s + hk
	// of n samples.
	omitted func(h, s float64, n int) float64

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

// sechRef is sech(x/w), F(ξ) = πw·sech(πwξ/2) (Gradshteyn & Ryzhik
// 3.981.3, from memory; math.md, catalogue).
func sechRef(w float64) refFamily {
	return refFamily{
		name:   "sech",
		f:      func(x float64) complex128 { return complex(1/math.Cosh(x/w), 0) },
		F:      func(xi float64) complex128 { return complex(math.Pi*w/math.Cosh(math.Pi*w*xi/2), 0) },
		source: "Gradshteyn & Ryzhik 3.981.3 (from memory)",
	}
}

// sechSqRef is sech²(x), F(ξ) = πξ/sinh(πξ/2), 2 at ξ = 0 (math.md,
// catalogue; residues at the double poles iπ(k+½)).
func sechSqRef() refFamily {
	return refFamily{
		name: "sech2",
		f:    func(x float64) complex128 { c := math.Cosh(x); return complex(1/(c*c), 0) },
		F: func(xi float64) complex128 {
			if xi == 0 {
				return 2
			}
			return complex(math.Pi*xi/math.Sinh(math.Pi*xi/2), 0)
		},
		source: "math.md catalogue (residue theorem)",
	}
}

// expRef is e^{-a|x|}, F(ξ) = 2a/(a² + ξ²) (DLMF 1.14(iii) Laplace
// transform of cos, from memory). F decays like ξ⁻², so the alias sums at
// ξ = 0 use closed forms: all copies are positive, and
//
//	Σ_{l≠0} 2a/(a² + (2πl/h)²) = h·coth(ah/2) - 2/a
//
// from the partial fractions coth z = 1/z + 2z Σ_{l≥1} 1/(z² + l²π²)
// (DLMF 4.36.3, from memory), and with the phase of shift s the sum is the
// infinite grid's error, h Σ_k e^{-a|s+hk|} - 2/a = h(e^{-at} +
// e^{-a(h-t)})/(1 - e^{-ah}) - 2/a, t = s mod h (a geometric series).
func expRef(a float64) refFamily {
	return refFamily{
		name:     "exponential",
		f:        func(x float64) complex128 { return complex(math.Exp(-a*math.Abs(x)), 0) },
		F:        func(xi float64) complex128 { return complex(2*a/(a*a+xi*xi), 0) },
		aliasAbs: func(h float64) float64 { return h/math.Tanh(a*h/2) - 2/a },
		aliasAt: func(h, s float64) complex128 {
			t := s - h*math.Floor(s/h)
			return complex(h*(math.Exp(-a*t)+math.Exp(-a*(h-t)))/-math.Expm1(-a*h)-2/a, 0)
		},
		omitted: func(h, s float64, n int) float64 {
			// Geometric series from the nearest omitted sample on each
			// side of a window that holds the centre.
			lo, hi := gridIndices(n)
			xr, xl := s+h*float64(hi+1), s+h*float64(lo-1)
			return h * (math.Exp(-a*xr) + math.Exp(a*xl)) / -math.Expm1(-a*h)
		},
		source: "DLMF §1.14(iii), 4.36.3 (from memory)",
	}
}

// wavePacketRef is e^{-x²/(2σ²)}cos(ω₀x), F(ξ) = σ√(π/2)[e^{-σ²(ξ-ω₀)²/2} +
// e^{-σ²(ξ+ω₀)²/2}] (the Gaussian with the modulation rule, math.md).
func wavePacketRef(sigma, w0 float64) refFamily {
	return refFamily{
		name: "wavepacket",
		f: func(x float64) complex128 {
			u := x / sigma
			return complex(math.Exp(-0.5*u*u)*math.Cos(w0*x), 0)
		},
		F: func(xi float64) complex128 {
			a, b := sigma*(xi-w0), sigma*(xi+w0)
			return complex(sigma*math.Sqrt(math.Pi/2)*(math.Exp(-0.5*a*a)+math.Exp(-0.5*b*b)), 0)
		},
		source: "DLMF 7.4.2 with the modulation rule (from memory)",
	}
}

// bsplineRef is the centred cardinal B-spline of order m by the
// truncated-power formula M_m(x) = 1/(m-1)! Σ_j (-1)^j C(m,j)(x + m/2 - j)_+^{m-1}
// (de Boor, A Practical Guide to Splines, 1978, ch. IX, from memory),
// F(ξ) = (sin(ξ/2)/(ξ/2))^m.
func bsplineRef(m int) refFamily {
	r := refFamily{
		name: "bspline",
		f: func(x float64) complex128 {
			y := -math.Abs(x)
			s, c := 0.0, 1.0
			for j := 0; j <= m; j++ {
				t := y + float64(m)/2 - float64(j)
				if t > 0 {
					s += c * math.Pow(t, float64(m-1))
				}
				c = -c * float64(m-j) / float64(j+1)
			}
			for k := 2; k < m; k++ {
				s /= float64(k)
			}
			return complex(math.Max(s, 0), 0)
		},
		F: func(xi float64) complex128 {
			if xi == 0 {
				return 1
			}
			return complex(math.Pow(math.Sin(xi/2)/(xi/2), float64(m)), 0)
		},
		reach:  float64(m) / 2,
		power:  float64(m),
		envF:   func(xi float64) float64 { return math.Pow(2/math.Abs(xi), float64(m)) },
		source: "de Boor 1978 ch. IX (from memory)",
	}
	// The error of the infinite grid is a finite spatial sum (compact
	// support): h Σ_k M_m(s + hk) - 1, the Poisson formula read from the
	// left (F(0) = 1).
	r.aliasAt = func(h, s float64) complex128 {
		sum := 0.0
		k0 := int(math.Floor((-r.reach - s) / h))
		for k := k0; s+h*float64(k) <= r.reach; k++ {
			sum += real(r.f(s + h*float64(k)))
		}
		return complex(h*sum-1, 0)
	}
	return r
}

const unitRoundoffRef = 0x1p-53

// refAliasAbs returns Σ_{l≠0} |F(ξ + 2πl/h)|, summed until the terms are
// negligible: the aliasing of every shift.
func refAliasAbs(r refFamily, h, xi float64) float64 {
	if r.aliasAbs != nil && xi == 0 {
		return r.aliasAbs(h)
	}
	P := 2 * math.Pi / h
	s := 0.0
	small := 0
	for l := 1; l < 1<<22; l++ {
		t := cmplx.Abs(r.F(xi+float64(l)*P)) + cmplx.Abs(r.F(xi-float64(l)*P))
		s += t
		if r.power > 1 {
			// |F| ≤ C|ξ|^{-q}: the rest is at most about the last
			// envelope term times l/(q-1); stop when that is negligible.
			env := r.envF(xi + float64(l)*P)
			// The rest is added as a bound: negligible below 1e-20 (the
			// tolerances are ≥ 1e-14), and at most a few 1e-18 once
			// 2^17 copies are summed for the decays used here.
			if rest := 2 * env * float64(l) / (r.power - 1); rest <= 1e-9*s || rest < 1e-20 || l >= 1<<17 {
				return s + rest
			}
			continue
		}
		if t <= 1e-18*s || t < 1e-40 {
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
	if r.aliasAt != nil && xi == 0 {
		return r.aliasAt(h, s)
	}
	P := 2 * math.Pi / h
	var sum complex128
	abs := 0.0
	small := 0
	for l := 1; l < 1<<22; l++ {
		ph := cmplx.Exp(complex(0, 2*math.Pi*float64(l)*s/h))
		a := r.F(xi+float64(l)*P) * ph
		b := r.F(xi-float64(l)*P) * cmplx.Conj(ph)
		sum += a + b
		abs += cmplx.Abs(a) + cmplx.Abs(b)
		if cmplx.Abs(a)+cmplx.Abs(b) <= 1e-18*abs || cmplx.Abs(a)+cmplx.Abs(b) < 1e-40 {
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
	if r.omitted != nil && xi == 0 && n > 0 && s+h*float64(hi+1) >= r.center && s+h*float64(lo-1) <= r.center {
		v := r.omitted(h, s, n)
		return v, complex(v, 0)
	}
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

// refEnvelopeSum is the engine's documented bound S on h Σ_k |f(x_k)| for
// every shift, from the spatial envelope (bounds.Budget, Rounding; the
// closed forms of the window sum in budget.go), written here again: per
// term of amplitude A and plateau p the least of ∫g + h·A, for a Gaussian
// without plateau Aσ√(2π)(1 + 2e^{-a}/(1 - e^{-3a})), a = 2π²σ²/h², and
// for an exponential without plateau A·h(1 + e^{-αh})/(1 - e^{-αh}).
func refEnvelopeSum(env bounds.Envelope, h float64) float64 {
	S := 0.0
	for _, t := range env {
		A, p := t.Amplitude, t.Plateau
		var integral float64
		switch t.Decay {
		case bounds.Exponential:
			integral = 2 * A / t.Rate
		case bounds.Gaussian:
			integral = A * t.Width * math.Sqrt(2*math.Pi)
		case bounds.Algebraic:
			integral = 2 * A * t.Width / (t.Power - 1)
		case bounds.Compact:
			integral = 2 * A * t.Width
		}
		best := 2*p*A + integral + h*A
		if p == 0 && t.Decay == bounds.Gaussian {
			a := 2 * math.Pi * math.Pi * t.Width * t.Width / (h * h)
			best = math.Min(best, integral*(1+2*math.Exp(-a)/-math.Expm1(-3*a)))
		}
		if p == 0 && t.Decay == bounds.Exponential {
			best = math.Min(best, A*h*(1+math.Exp(-t.Rate*h))/-math.Expm1(-t.Rate*h))
		}
		S += best
	}
	return S
}

// refCertifiedAt returns, for one step h, the certified budget of n
// samples at ξ = 0 for every shift: the aliasing of every shift
// Σ_{l≠0}|F(2πl/h)|, the worst truncation over the shifts
// h Σ_omitted |f|, both from the closed forms, and the engine's rounding
// term (γ_{n+3} + u)·S with S from the spatial envelope (refEnvelopeSum).
// The second result reports that rounding alone exceeds tol, so that
// larger counts cannot help.
func refCertifiedAt(r refFamily, env bounds.Envelope, h float64, shifts int, tol float64) func(n int) (float64, bool) {
	a := refAliasAbs(r, h, 0)
	odd, even := refShiftSet(r.center, h, shifts)
	S := refEnvelopeSum(env, h)
	return func(n int) (float64, bool) {
		ss := odd
		if n%2 == 0 {
			ss = even
		}
		tr := 0.0
		for _, s := range ss {
			t, _ := refOmitted(r, h, s, n, 0)
			tr = math.Max(tr, t)
		}
		rd := refRounding(n, S)
		return a + tr + rd, rd > tol
	}
}

// refCertified is refCertifiedAt for one grid.
func refCertified(r refFamily, env bounds.Envelope, h float64, n, shifts int) float64 {
	v, _ := refCertifiedAt(r, env, h, shifts, math.Inf(1))(n)
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
// ≤ maxN with budget(h)(n) ≤ tol for some h, and that h. For each step it
// asks whether the best count so far less one is feasible; if so, it
// bisects for the least feasible count below it (the truncation falls as
// samples are added, and the rounding grows, so the feasible counts of a
// step form an interval whose upper end is then at least that count).
func bruteMin(hs []float64, tol float64, maxN int, budget func(h float64) func(n int) (float64, bool)) (int, float64) {
	best, bestH := maxN+1, 0.0
	for _, h := range hs {
		b := budget(h)
		ok := func(n int) bool { v, _ := b(n); return v <= tol }
		var lo, hi int
		if best <= maxN {
			hi = best - 1
			if hi < 1 || !ok(hi) {
				continue
			}
		} else {
			// No count found yet: gallop up until one is feasible, or
			// until rounding alone exceeds the tolerance.
			found := false
			for n := 1; n <= maxN; n += max(1, n/8) {
				v, stop := b(n)
				if v <= tol {
					lo, hi, found = n-max(1, n/8), n, true
					break
				}
				if stop {
					break
				}
			}
			if !found {
				continue
			}
		}
		for hi-lo > 1 {
			mid := lo + (hi-lo)/2
			if ok(mid) {
				hi = mid
			} else {
				lo = mid
			}
		}
		best, bestH = hi, h
	}
	if best > maxN {
		return math.MaxInt, 0
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
