package bounds

import (
	"math"
	"math/cmplx"
)

// planModel is the plain float64 model of a certified error budget that the
// planner searches with. It mirrors what FamilyBudget and EnvelopeBudget
// compute — the same alias copies, the same omitted samples, the same
// envelope remainders and the same rounding bound — without interval
// arithmetic, so that one evaluation costs a few dozen floating-point
// operations. It only steers the search: every plan is certified
// afterwards by the interval evaluation.
//
// For a family the model sums exact moduli |F(ξ + 2πl/h)| and |f(x_k)|;
// for envelopes it sums the envelopes. Remainders of the infinite sums use
// the closed forms of EnvelopeTerm.rayFrom in float64.
type planModel struct {
	val   func(x float64) float64     // |f|, nil for envelope plans
	absTr func(xi float64) float64    // |F|, nil for envelope plans
	tr    func(xi float64) complex128 // F, nil for envelope plans
	// rayVal and rayTr sum |f| and |F| along rays in closed form
	// (pointRays), for some even families centred at 0; nil otherwise.
	rayVal, rayTr func(x, h float64) float64
	// blockTr bounds J copies of |F| along the ray x0 + jP in float64
	// (aliasBlocker), for the families that have it; nil otherwise.
	blockTr func(x0, P float64, J int) float64
	// blockRay bounds a whole ray of copies of |F| (aliasRay) in float64.
	blockRay func(x0, P float64) float64
	// prefix is scratch space for absAlias.
	prefix []float64
	// stopAbove, when > 0, lets absAlias return any value above it as soon
	// as its partial sum exceeds it (a caller that only compares).
	stopAbove float64
	// |f| is convex on x ≤ convexC - convexD and x ≥ convexC + convexD
	// when convex is set (convexTails).
	convex           bool
	convexC, convexD float64
	spatial          Envelope
	spectral         Envelope
	center           float64   // the point windows are centred on
	xis              []float64 // frequencies at which the band's aliasing is sampled
	xiMag            float64   // max |ξ| over the band
	wide             bool      // a band of positive width
	anyShift         bool
	shift            float64 // the fixed shift (anyShift false)
	ulps             float64 // sample error in units of u
	remGoal          float64 // remainders below this are not refined (the verification's Settings.Tol)
	capped           float64 // largest remainder accepted only because a term limit was hit
	aliasCap         int     // term cap of the alias sums (modelTerms when 0)
	monotone         bool    // |f| is known to decrease away from the centre
	// steady says that the aliasing model grows with the step while the
	// copies stay beyond |ξ| + steadyAbove (planner1.cannotReach).
	steady      bool
	steadyAbove float64
	even        bool    // f is known to be even about the centre
	sH, sVal    float64 // the last step and its window-sum bound S
	// Weights of the aliasing and the truncation in the total, and whether
	// the rounding is left out (an axis of an n-D plan: PlanGridND weighs
	// each axis's errors by the other axes' sizes and adds the rounding of
	// the whole grid itself). Zero weights mean 1.
	wA, wT  float64
	noRound bool
}

// modelTerms caps the explicit terms one model sum may add before it takes
// the envelope remainder as it is.
const modelTerms = 64

// pointEvaluators returns plain float64 evaluators of |f|, |F| and F.
// Families with a closed form known here get a direct formula; the others
// are evaluated through their interval methods at a point.
func pointEvaluators(f Family) (absVal, absTr func(float64) float64, tr func(float64) complex128) {
	switch g := f.(type) {
	case GaussianFamily:
		s := g.Sigma
		inv := 1 / (2 * s * s)
		amp := s * math.Sqrt(2*math.Pi)
		ss := 0.5 * s * s
		return withReal(func(x float64) float64 { return math.Exp(-x * x * inv) },
			func(xi float64) float64 { return amp * math.Exp(-ss*xi*xi) })
	case ExponentialFamily:
		a := g.Rate
		return withReal(func(x float64) float64 { return math.Exp(-a * math.Abs(x)) },
			func(xi float64) float64 { return 2 * a / (a*a + xi*xi) })
	case LorentzianFamily:
		a := g.Width
		return withReal(func(x float64) float64 { return 1 / (a*a + x*x) },
			func(xi float64) float64 { return math.Pi / a * math.Exp(-a*math.Abs(xi)) })
	case SechFamily:
		w := g.Width
		return withReal(func(x float64) float64 { return sechFloat(x / w) },
			func(xi float64) float64 { return math.Pi * w * sechFloat(math.Pi*w*xi/2) })
	case SechSquaredFamily:
		w := g.Width
		return withReal(func(x float64) float64 { s := sechFloat(x / w); return s * s },
			func(xi float64) float64 {
				v := math.Abs(math.Pi * w * xi / 2)
				switch {
				case v < 1e-8:
					return 2 * w
				case v > 700:
					return 4 * w * v * math.Exp(-v)
				}
				return 2 * w * v / math.Sinh(v)
			})
	case FejerFamily:
		om := g.Omega
		return withReal(func(x float64) float64 {
			u := om * x / 2
			if u == 0 {
				return 1
			}
			s := math.Sin(u) / u
			return s * s
		}, func(xi float64) float64 { return 2 * math.Pi / om * math.Max(0, 1-math.Abs(xi)/om) })
	case WavePacketFamily:
		s, w0 := g.Sigma, g.Omega0
		inv := 1 / (2 * s * s)
		amp := s * math.Sqrt(math.Pi/2)
		return withReal(func(x float64) float64 { return math.Exp(-x*x*inv) * math.Abs(math.Cos(w0*x)) },
			func(xi float64) float64 {
				a, b := xi-w0, xi+w0
				return amp * (math.Exp(-0.5*s*s*a*a) + math.Exp(-0.5*s*s*b*b))
			})
	case BSplineFamily:
		m := g.Order
		if m >= 1 && m <= MaxBSplineOrder {
			absTr = func(xi float64) float64 {
				u := xi / 2
				if u == 0 {
					return 1
				}
				return math.Abs(intPowFloat(math.Sin(u)/u, m))
			}
			b := newBSplineEval(m)
			return b.at, absTr,
				func(xi float64) complex128 {
					u := xi / 2
					if u == 0 {
						return 1
					}
					return complex(intPowFloat(math.Sin(u)/u, m), 0)
				}
		}
	}
	tr = func(xi float64) complex128 { return f.Transform(Point(xi)).Mid() }
	return func(x float64) float64 { return cmplx.Abs(f.Value(Point(x)).Mid()) },
		func(xi float64) float64 { return cmplx.Abs(tr(xi)) }, tr
}

// withReal returns |f|, |F| and F for a real transform F.
func withReal(absVal, F func(float64) float64) (func(float64) float64, func(float64) float64, func(float64) complex128) {
	return absVal, func(xi float64) float64 { return math.Abs(F(xi)) },
		func(xi float64) complex128 { return complex(F(xi), 0) }
}

// sechFloat returns sech x without overflow.
func sechFloat(x float64) float64 {
	x = math.Abs(x)
	if x > 700 {
		return 2 * math.Exp(-x)
	}
	return 1 / math.Cosh(x)
}

// intPowFloat returns v^n for n ≥ 0 by repeated multiplication.
func intPowFloat(v float64, n int) float64 {
	r := 1.0
	for ; n > 0; n-- {
		r *= v
	}
	return r
}

// bsplineEval evaluates the centred cardinal B-spline of one order m ≥ 1
// in float64 (see BSplineFamily), with its coefficients computed once: the
// signed binomial coefficients (-1)^j C(m, j) and (m-1)!.
type bsplineEval struct {
	m    int
	c    []float64
	fact float64
}

func newBSplineEval(m int) *bsplineEval {
	b := &bsplineEval{m: m, c: make([]float64, m+1), fact: 1}
	c := 1.0
	for j := 0; j <= m; j++ {
		b.c[j] = c
		c = -c * float64(m-j) / float64(j+1)
	}
	for k := 2; k < m; k++ {
		b.fact *= float64(k)
	}
	return b
}

// at returns the B-spline at x by the truncated-power formula at -|x|.
func (b *bsplineEval) at(x float64) float64 {
	m := b.m
	half := float64(m) / 2
	y := -math.Abs(x)
	if -y > half {
		return 0
	}
	if m == 1 {
		if -y == half {
			return 0.5
		}
		return 1
	}
	sum := 0.0
	for j := 0; j <= m; j++ {
		t := y + half - float64(j)
		if t <= 0 {
			break
		}
		sum += b.c[j] * intPowFloat(t, m-1)
	}
	return math.Max(sum/b.fact, 0)
}

// envelopeCenter returns the midpoint of the hull of the centres (widened
// by plateaus) of an envelope's terms, 0 for an empty envelope.
func envelopeCenter(e Envelope) float64 {
	if len(e) == 0 {
		return 0
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, t := range e {
		lo = math.Min(lo, t.Center-t.Plateau)
		hi = math.Max(hi, t.Center+t.Plateau)
	}
	return 0.5*lo + 0.5*hi
}

// termRay returns Σ_{j≥0} g(d + j·h) for one envelope term, where d is the
// signed distance of the first point from the term's centre measured along
// the ray (negative while the ray still approaches the centre). It is the
// float64 counterpart of EnvelopeTerm.rayFrom, extended to rays that cross
// the centre.
func termRay(t EnvelopeTerm, d, h float64) float64 {
	if t.Amplitude == 0 {
		return 0
	}
	s := 0.0
	if d < 0 {
		// Points before the centre: at most modelTerms explicitly, then the
		// integral comparison of a unimodal profile.
		n := math.Ceil(-d / h)
		if n > modelTerms {
			s += termIntegral(t)/h + t.Amplitude
			d += n * h
		} else {
			for ; d < 0; d += h {
				s += termAt(t, -d)
			}
		}
	}
	dp := d - t.Plateau
	if dp < 0 {
		n := math.Floor(-dp/h) + 1
		s += n * t.Amplitude
		dp += n * h
	}
	return s + termRayFrom(t, dp, h)
}

// termAt returns g at distance d ≥ 0 from the centre.
func termAt(t EnvelopeTerm, d float64) float64 {
	d -= t.Plateau
	if d < 0 {
		d = 0
	}
	A := t.Amplitude
	switch t.Decay {
	case Exponential:
		return A * math.Exp(-t.Rate*d)
	case Gaussian:
		u := d / t.Width
		return A * math.Exp(-0.5*u*u)
	case Algebraic:
		return A * math.Pow(1+d/t.Width, -t.Power)
	case Compact:
		if d > t.Width {
			return 0
		}
		return A
	}
	return math.Inf(1)
}

// termIntegral returns ∫ g over the line.
func termIntegral(t EnvelopeTerm) float64 {
	A := t.Amplitude
	flat := 2 * t.Plateau * A
	switch t.Decay {
	case Exponential:
		return flat + 2*A/t.Rate
	case Gaussian:
		return flat + A*t.Width*math.Sqrt(2*math.Pi)
	case Algebraic:
		if t.Power <= 1 {
			return math.Inf(1)
		}
		return flat + 2*A*t.Width/(t.Power-1)
	case Compact:
		return flat + 2*A*t.Width
	}
	return math.Inf(1)
}

// termRayFrom is rayFrom in float64 for a reduced distance x0 ≥ 0 beyond
// the plateau.
func termRayFrom(t EnvelopeTerm, x0, h float64) float64 {
	A := t.Amplitude
	switch t.Decay {
	case Exponential:
		return A * math.Exp(-t.Rate*x0) / -math.Expm1(-t.Rate*h)
	case Gaussian:
		s := t.Width
		u := x0 / s
		g0 := math.Exp(-0.5 * u * u)
		e := (2*x0*h + h*h) / (2 * s * s)
		b1 := g0 / -math.Expm1(-e)
		if e > 2 {
			// b1 is within 16% of g0 ≤ b2: skip the integral bound.
			return A * b1
		}
		b2 := g0 + s*math.Sqrt(math.Pi/2)*math.Erfc(u/math.Sqrt2)/h
		return A * math.Min(b1, b2)
	case Algebraic:
		if t.Power <= 1 {
			return math.Inf(1)
		}
		a := 1 + x0/t.Width
		c := h / t.Width
		first := math.Pow(a, -t.Power)
		return A * (first + a*first/(c*(t.Power-1)))
	case Compact:
		if x0 > t.Width {
			return 0
		}
		return A * (math.Floor((t.Width-x0)/h) + 1)
	}
	return math.Inf(1)
}

// envRay returns Σ_{j≥0} env(x0 + dir·j·h) in float64.
func envRay(e Envelope, x0 float64, dir int, h float64) float64 {
	s := 0.0
	for _, t := range e {
		d := x0 - t.Center
		if dir < 0 {
			d = -d
		}
		s += termRay(t, d, h)
	}
	return s
}

// envReach returns the largest distance from c at which the envelope may
// still exceed eps: beyond it every term is below eps.
func envReach(e Envelope, c, eps float64) float64 {
	r := 0.0
	for _, t := range e {
		var d float64
		A := t.Amplitude
		switch {
		case A <= eps:
			d = 0
		case t.Decay == Exponential:
			d = math.Log(A/eps) / t.Rate
		case t.Decay == Gaussian:
			d = t.Width * math.Sqrt(2*math.Log(A/eps))
		case t.Decay == Algebraic:
			d = t.Width * (math.Pow(A/eps, 1/t.Power) - 1)
		case t.Decay == Compact:
			d = t.Width
		}
		r = math.Max(r, math.Abs(t.Center-c)+t.Plateau+d)
	}
	return r
}

// alias returns the model of the aliasing bound for step h: the sup over
// the sampled frequencies of Σ_{l≠0} |F(ξ + lP)| (any shift) or of
// |Σ_{l≠0} F(ξ + lP) e^{i2πls/h}| (fixed shift), P = 2π/h, with the
// envelope remainder added.
func (m *planModel) alias(h float64) float64 {
	P := 2 * math.Pi / h
	worst := 0.0
	for _, xi := range m.xis {
		var a float64
		if m.tr == nil {
			a = envRay(m.spectral, xi+P, 1, P) + envRay(m.spectral, xi-P, -1, P)
		} else {
			a = m.exactAlias(xi, P, h)
		}
		worst = math.Max(worst, a)
	}
	return worst
}

func (m *planModel) exactAlias(xi, P, h float64) float64 {
	if m.blockRay != nil && math.Abs(xi) < P {
		// As FamilyBudget: the ray bound covers every copy for any
		// phases; where it meets the goal it is the answer, elsewhere the
		// smaller of it and the copies summed.
		R := m.blockRay(P+math.Abs(xi), P) + m.blockRay(P-math.Abs(xi), P)
		if R <= m.remGoal {
			return R
		}
		capped := m.capped
		if v := m.exactAliasSummed(xi, P, h); v < R {
			return v
		}
		m.capped = capped
		return R
	}
	return m.exactAliasSummed(xi, P, h)
}

// exactAliasSummed is exactAlias by the copies, summed or bounded in
// blocks, with the envelope's remainder.
func (m *planModel) exactAliasSummed(xi, P, h float64) float64 {
	fixed := !m.anyShift && !m.wide
	if !fixed && m.rayTr != nil && math.Abs(xi) <= P {
		return m.rayAlias(xi, P)
	}
	if !fixed && m.blockTr != nil && math.Abs(xi) < P {
		if v, ok := m.blockAlias(xi, P); ok {
			return v
		}
	}
	if !fixed {
		return m.absAlias(xi, P)
	}
	var ph complex128
	if fixed {
		u := m.shift / h
		u -= math.Round(u)
		ph = cmplx.Exp(complex(0, 2*math.Pi*u))
	}
	var sum complex128
	abs := 0.0
	rot := complex(1, 0)
	for l := 1; ; l++ {
		if fixed {
			r := m.tr(xi + float64(l)*P)
			lf := m.tr(xi - float64(l)*P)
			rot *= ph
			sum += r*rot + lf*cmplx.Conj(rot)
		} else {
			abs += m.absTr(xi+float64(l)*P) + m.absTr(xi-float64(l)*P)
		}
		next := float64(l + 1)
		rem := envRay(m.spectral, xi+next*P, 1, P) + envRay(m.spectral, xi-next*P, -1, P)
		cur := abs
		if fixed {
			cur = cmplx.Abs(sum)
		}
		if rem <= m.remGoal || rem <= 0x1p-60*cur || rem == 0 {
			return cur + rem
		}
		if l >= max(m.aliasCap, modelTerms) {
			m.capped = math.Max(m.capped, rem)
			return cur + rem
		}
	}
}

// absAlias is exactAlias in modulus, the sum Σ_{l≠0} |F(ξ + lP)| taken, as
// in the certificate, up to the first count of copies on each side at which
// the envelope's remainder meets the goal, or to the cap. The remainder
// falls and the sum grows with the count, so that count is found by
// doubling and bisection over prefix sums instead of a remainder per copy.
func (m *planModel) absAlias(xi, P float64) float64 {
	L := max(m.aliasCap, modelTerms)
	rem := func(l int) float64 {
		next := float64(l + 1)
		return envRay(m.spectral, xi+next*P, 1, P) + envRay(m.spectral, xi-next*P, -1, P)
	}
	// pre[l-1] = Σ_{j=1}^{l} (|F(ξ + jP)| + |F(ξ - jP)|).
	pre := m.prefix[:0]
	done := func(l int) (float64, bool) {
		r := rem(l)
		return r, r <= m.remGoal || r <= 0x1p-60*pre[l-1] || r == 0
	}
	lo := 0 // a count that misses the goal (0: none tried)
	for k := 1; ; k = min(2*k, L) {
		for l := len(pre) + 1; l <= k; l++ {
			v := m.absTr(xi+float64(l)*P) + m.absTr(xi-float64(l)*P)
			if l > 1 {
				v += pre[l-2]
			}
			pre = append(pre, v)
		}
		m.prefix = pre
		if m.stopAbove > 0 && pre[k-1] > m.stopAbove {
			return pre[k-1] // already above what the caller asks about
		}
		r, ok := done(k)
		if ok {
			// The first count that meets the goal lies in (lo, k].
			hi, rHi := k, r
			for hi-lo > 1 {
				mid := lo + (hi-lo)/2
				if r, ok := done(mid); ok {
					hi, rHi = mid, r
				} else {
					lo = mid
				}
			}
			return pre[hi-1] + rHi
		}
		if k >= L {
			m.capped = math.Max(m.capped, r)
			return pre[k-1] + r
		}
		lo = k
	}
}

// blockAlias is exactAlias in modulus for copies that blockTr bounds as
// negligible (a B-spline at the steps of its partition of unity): the
// explicit loop would add copies of about nothing until the envelope's
// remainder meets the goal, so the result is that remainder at the first
// count where it does, found by bisection, or at the cap.
func (m *planModel) blockAlias(xi, P float64) (float64, bool) {
	L := max(m.aliasCap, modelTerms)
	ax := math.Abs(xi)
	B := m.blockTr(P+ax, P, L) + m.blockTr(P-ax, P, L)
	if !(B <= 0x1p-60*m.remGoal) {
		return 0, false
	}
	rem := func(l int) float64 {
		next := float64(l + 1)
		return envRay(m.spectral, xi+next*P, 1, P) + envRay(m.spectral, xi-next*P, -1, P)
	}
	done := func(r float64) bool { return r <= m.remGoal || r == 0 }
	if r := rem(L); !done(r) {
		m.capped = math.Max(m.capped, r)
		return B + r, true
	}
	lo, hi := 0, L // rem(hi) meets the goal; lo = 0 or a count that misses it
	for hi-lo > 1 {
		mid := lo + (hi-lo)/2
		if done(rem(mid)) {
			hi = mid
		} else {
			lo = mid
		}
	}
	return B + rem(hi), true
}

// rayAlias is exactAlias in modulus by rayTr: the copies ξ ± lP of an even
// transform form the rays from P + |ξ| and P - |ξ|. As exactAlias, it
// takes the envelope's remainder after max(aliasCap, modelTerms) copies on
// each side when that remainder misses the goal (capped).
func (m *planModel) rayAlias(xi, P float64) float64 {
	ax := math.Abs(xi)
	var cur float64
	if ax == 0 {
		cur = 2 * m.rayTr(P, P)
	} else {
		cur = m.rayTr(P+ax, P) + m.rayTr(P-ax, P)
	}
	L := float64(max(m.aliasCap, modelTerms))
	if envFast(m.spectral, P-ax, P, int(L)) {
		return cur
	}
	d := L * P
	tail := m.rayTr(P+ax+d, P) + m.rayTr(P-ax+d, P)
	if tail <= m.remGoal/16 || tail <= 0x1p-64*cur {
		return cur
	}
	next := d + P
	rem := envRay(m.spectral, xi+next, 1, P) + envRay(m.spectral, xi-next, -1, P)
	if rem <= m.remGoal || rem <= 0x1p-60*(cur-tail) || rem == 0 {
		return cur
	}
	m.capped = math.Max(m.capped, rem)
	return cur - tail + rem
}

// trunc returns the model of the truncation bound for N samples of step h:
// the sup over the sampled shifts of h·Σ_{k omitted} |f(x_k)|.
func (m *planModel) trunc(h float64, n int64) float64 {
	if !m.anyShift {
		t := m.shift - m.center
		if n%2 == 0 {
			t += h / 2
		}
		return m.truncAt(h, n, t, false)
	}
	// The omitted samples nearest the window over every shift.
	M := float64(n+1) / 2
	xr := m.center - h/2 + M*h
	xl := m.center + h/2 - M*h
	capFree := m.raysCapFree(h, xr, xl)
	if m.convex && xr-m.convexC >= m.convexD && m.convexC-xl >= m.convexD {
		// Convex tails: the sup over shifts is at an end of the range
		// (absTruncation); for an even function the two ends mirror each
		// other.
		b := m.truncAt(h, n, h/2, capFree)
		if !m.even {
			b = math.Max(b, m.truncAt(h, n, -h/2, capFree))
		}
		return b
	}
	if m.monotone {
		// Tails that decrease away from the centre are worst at the ends
		// of the shift range; the middle covers a maximum inside. For an
		// even function the two ends mirror each other.
		b := m.truncAt(h, n, h/2, capFree)
		c := m.truncAt(h, n, 0, capFree)
		if !m.even {
			b = math.Max(b, m.truncAt(h, n, -h/2, capFree))
		}
		return math.Max(b, c)
	}
	// For an even function about the centre the window at shift -t
	// mirrors that at t (the shifts sampled are symmetric, exactly in
	// float64): the shifts t ≥ 0 suffice.
	first := 0
	if m.even {
		first = oscillatingShifts / 2
	}
	worst := 0.0
	for i := first; i <= oscillatingShifts; i++ {
		t := h * (float64(i)/oscillatingShifts - 0.5)
		worst = math.Max(worst, m.truncAt(h, n, t, capFree))
	}
	return worst
}

// oscillatingShifts is the number of pieces the shift range is sampled in
// for functions whose modulus may oscillate.
const oscillatingShifts = 16

// truncAt is the truncation for a window centred at center + t: the
// omitted samples lie at center + t ± h·((N+1)/2 + i), i ≥ 0. capFree
// (raysCapFree) says that the explicit terms of the model would never reach
// modelTerms.
func (m *planModel) truncAt(h float64, n int64, t float64, capFree bool) float64 {
	M := float64(n+1) / 2
	xr := m.center + t + M*h
	xl := m.center + t - M*h
	if m.val == nil {
		return h * (envRay(m.spatial, xr, 1, h) + envRay(m.spatial, xl, -1, h))
	}
	if m.rayVal != nil && xr >= 0 && xl <= 0 {
		return m.rayTrunc(h, xr, xl, capFree)
	}
	// As in the certificate (absTruncation): the first pair is always
	// summed, and the count of explicit pairs doubles until the envelope's
	// remainder beyond them meets the goal.
	rem := func(k int) float64 {
		d := float64(k) * h
		return h * (envRay(m.spatial, xr+d, 1, h) + envRay(m.spatial, xl-d, -1, h))
	}
	sum := 0.0
	done := 0
	for k := 1; ; k *= 2 {
		for ; done < k; done++ {
			d := float64(done) * h
			sum += h * (m.val(xr+d) + m.val(xl-d))
		}
		r := rem(k)
		if r == 0 || r <= m.remGoal || r <= 0x1p-60*sum {
			return sum + r
		}
		if k >= modelTerms {
			m.capped = math.Max(m.capped, r)
			return sum + r
		}
	}
}

// raysCapFree reports whether the ray sums of rayTrunc may skip the check
// for the cap of the explicit model: the tails beyond modelTerms samples
// of the nearest omitted samples over every shift, xr and xl, are far
// below the remainder goal.
func (m *planModel) raysCapFree(h, xr, xl float64) bool {
	if m.rayVal == nil || xr < 0 || xl > 0 {
		return false
	}
	if envFast(m.spatial, xr, h, modelTerms) && envFast(m.spatial, -xl, h, modelTerms) {
		return true
	}
	d := modelTerms * h
	return h*m.rayPair(xr+d, -xl+d, h) <= m.remGoal/16
}

// envFast reports whether every term of an envelope even about its centre
// falls by more than 2⁻⁶⁰ over k steps of h along the ray from its
// distance x ≥ 0 from the term's centre, from the decay parameters alone:
// the ratio of consecutive terms is at most e^{-αh} (exponential) or
// e^{-(2dh + h²)/(2σ²)} at distance d beyond the plateau (Gaussian), and a
// compact term ends at its width. Then the remainder after k steps is
// negligible and the model's caps cannot apply.
func envFast(e Envelope, x, h float64, k int) bool {
	const ln60 = 60 * math.Ln2
	for _, t := range e {
		d := math.Abs(x-t.Center) - t.Plateau
		if x-t.Center < 0 || d < 0 {
			return false
		}
		switch t.Decay {
		case Exponential:
			if float64(k)*t.Rate*h < ln60 {
				return false
			}
		case Gaussian:
			if float64(k)*(2*d*h+h*h)/(2*t.Width*t.Width) < ln60 {
				return false
			}
		case Compact:
			if d+float64(k)*h <= t.Width {
				return false
			}
		default:
			return false
		}
	}
	return true
}

// rayTrunc is truncAt by rayVal, for a window around the centre 0 of an
// even family. As truncAt, it takes the envelope's remainder after
// modelTerms pairs when that remainder misses the goal (capped), unless
// capFree says it cannot.
func (m *planModel) rayTrunc(h, xr, xl float64, capFree bool) float64 {
	sum := h * m.rayPair(xr, -xl, h)
	if capFree {
		return sum
	}
	d := modelTerms * h
	tail := h * m.rayPair(xr+d, -xl+d, h)
	if tail <= m.remGoal/16 || tail <= 0x1p-64*sum {
		return sum
	}
	r := h * (envRay(m.spatial, xr+d, 1, h) + envRay(m.spatial, xl-d, -1, h))
	if r == 0 || r <= m.remGoal || r <= 0x1p-60*(sum-tail) {
		return sum
	}
	m.capped = math.Max(m.capped, r)
	return sum - tail + r
}

// rayPair returns rayVal(x, h) + rayVal(y, h), summing one ray twice
// when the window is centred on the centre (x = y).
func (m *planModel) rayPair(x, y, h float64) float64 {
	r := m.rayVal(x, h)
	if y == x {
		return r + r
	}
	return r + m.rayVal(y, h)
}

// rounding returns the rounding bound of the engine for N samples of step
// h (roundingBound with the window sum of the budget).
func (m *planModel) rounding(h float64, n int64) float64 {
	const u = unitRoundoff
	nu := float64(n+3) * u
	rel := nu/(1-nu) + m.ulps*u
	if m.xiMag != 0 {
		// max |x_k|: the window's farther end, plus h/2 for any shift.
		x := math.Abs(m.gridShift(h, n)) + h*float64(n/2)
		if m.anyShift {
			x += h / 2
		}
		rel += u * (m.xiMag*x + 4)
	}
	if h != m.sH {
		m.sH = h
		m.sVal = 0
		for _, t := range m.spatial {
			m.sVal += latticeTermSumFloat(t, h)
		}
	}
	return rel * m.sVal
}

// latticeTermSumFloat is latticeTermSum in float64.
func latticeTermSumFloat(t EnvelopeTerm, h float64) float64 {
	A := t.Amplitude
	best := termIntegral(t) + h*A
	if t.Plateau == 0 {
		switch t.Decay {
		case Gaussian:
			a := 2 * math.Pi * math.Pi * t.Width * t.Width / (h * h)
			theta := 1 + 2*math.Exp(-a)/-math.Expm1(-3*a)
			best = math.Min(best, A*t.Width*math.Sqrt(2*math.Pi)*theta)
		case Exponential:
			ah := t.Rate * h
			best = math.Min(best, A*h*(1+math.Exp(-ah))/-math.Expm1(-ah))
		}
	}
	return best
}

// gridShift returns the shift of the planned grid: the centre for odd N
// and the centre less h/2 for even N (any shift), or the fixed shift.
func (m *planModel) gridShift(h float64, n int64) float64 {
	if !m.anyShift {
		return m.shift
	}
	if n%2 == 0 {
		return m.center - h/2
	}
	return m.center
}

// total returns the model of the whole budget.
func (m *planModel) total(h float64, n int64) float64 {
	v := m.weightedAlias(h) + m.trunc(h, n)*weight(m.wT)
	if !m.noRound {
		v += m.rounding(h, n)
	}
	return v
}

// weighParts returns the weighted aliasing and truncation of unweighted
// parts and the total with the rounding (left out when noRound), formed as
// total forms them.
func (m *planModel) weighParts(alias, trunc, round float64) (a, t, v float64) {
	a = alias * weight(m.wA)
	t = trunc * weight(m.wT)
	v = a + t
	if !m.noRound {
		v += round
	}
	return a, t, v
}

// weightedAlias returns the aliasing model times its weight.
func (m *planModel) weightedAlias(h float64) float64 { return m.alias(h) * weight(m.wA) }

func weight(w float64) float64 {
	if w == 0 {
		return 1
	}
	return w
}
