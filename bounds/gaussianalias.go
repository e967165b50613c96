package bounds

import (
	"context"
	"math"
)

// A dedicated path of AliasSum for the Gaussian f(x) = exp(-(x-c)²/(2σ²))
// (GaussianFamily, c = 0, and the factors of RadialGaussian). It sums the
// same series as the general path, to the same goals, but evaluates the
// terms of each series by a ratio recurrence instead of one interval
// exponential per term, bounds the tails by the geometric series of the
// recurrence, and needs no envelopes. Its tail bound is at least as tight
// as the envelope's, so it may stop one copy earlier; Method reports what
// it summed.
//
// The recurrence. For reals y and δ > 0 let e_j = exp(-(y + jδ)²/2). Then
//
//	e_{j+1} = e_j·r_j,   r_j = exp(-δ(y + jδ) - δ²/2),   r_{j+1} = r_j·q,   q = exp(-δ²)
//
// (expand (y + (j+1)δ)² = (y + jδ)² + 2δ(y + jδ) + δ²). The ratios r_j fall
// with j, so for every J with r_J < 1
//
//	Σ_{j≥J} e_j ≤ e_J·(1 + r_J + r_J² + …) = e_J/(1 - r_J).               (G)
//
// Every step is an interval product, so each e_j encloses the exact term;
// its relative width grows by a few ulps per step, and the series stop
// after a handful of steps.
//
// Spectral side (the alias part). With a = σξ and b = σP, P = 2π/h, the
// copies are F(ξ ± lP) = C·exp(-(lb ± a)²/2), C = σ√(2π) (math.md,
// catalogue): the recurrence with y = ±a + b, δ = b, starting from copy 1.
// For |a| ≤ b/2 every copy l ≥ 1 lies at lb ± a ≥ (l - 1/2)b > 0, and the
// ratio from copy L+1 to copy L+2, exp(-b((L+1)b ± a) - b²/2), is at most
// exp(-(L+1)b²) < 1, so (G) bounds the copies beyond L on each side by
// copy L+1 over one minus that ratio, both carried by the recurrence.
// The phases e^{±i2πlu}, u = (s-c)/h, are e^{i2πu} (one sine and cosine),
// its square by the double-angle formulas, and products beyond.

// Spatial side (the truncation part of a finite grid). The omitted samples
// to the right of the grid are at normalised distances y_j = y_0 + jδ from
// the centre, y_0 = (x_{hi+1} - c)/σ > 0, δ = h/σ, and those to the left
// likewise with y_0 = (c - x_{lo-1})/σ > 0; the terms and their phases
// e^{-iξx} (multiplied by e^{∓iξh} per step) follow the recurrence, and (G)
// with the current ratio bounds the rest of each ray.

// gaussianAliasCopies is how many copies on each side the fast path sums
// at most, as many as the general path tries before it weighs the sides.
const gaussianAliasCopies = autoSpectralCopies

// gaussianOmittedTerms is how many omitted samples on each side the fast
// path sums at most before it leaves a finite grid to the general path.
const gaussianOmittedTerms = 64

// fastAliasSum returns AliasSum's result by a dedicated path for the
// families that have one, or ok = false. The arguments have been checked.
// It declines (ok = false) whenever the general path might do something
// else: another side forced, a cancelled context, envelopes the general
// path would reject, a frequency outside the Nyquist band, or a series that
// does not end within the fast path's small limits.
func fastAliasSum(ctx context.Context, f Family, g Grid, xi float64, set Settings) (SampledSum, bool) {
	if set.Side == SpatialSide {
		return SampledSum{}, false
	}
	switch f := f.(type) {
	case GaussianFamily:
		return gaussianAliasSum(ctx, f.Sigma, 0, g, xi, set)
	case shiftedGaussian:
		return gaussianAliasSum(ctx, f.sigma, f.center, g, xi, set)
	}
	return SampledSum{}, false
}

// gaussianAliasSum is the fast path for exp(-(x-c)²/(2σ²)) (see above).
func gaussianAliasSum(ctx context.Context, sigma, c float64, g Grid, xi float64, set Settings) (SampledSum, bool) {
	if ctx.Err() != nil {
		return SampledSum{}, false
	}
	// The general path validates the envelopes (amplitude σ√(2π), widths σ
	// and 1/σ); near the ends of the float64 range, let it report.
	if !(sigma >= 0x1p-1000 && sigma <= 0x1p1000) {
		return SampledSum{}, false
	}
	C := SqrtTwoPi.Scale(sigma) // σ√(2π)
	h := g.Step
	A := Point(xi).Scale(sigma)                          // a = σξ
	B := TwoPi.Div(Point(h)).Scale(sigma)                // b = σP
	if !(B.Lo > 0) || !(A.Mag() <= mulDown(0.5, B.Lo)) { // |ξ| ≤ P/2
		return SampledSum{}, false
	}
	E0 := Point(1) // exp(-a²/2), exactly 1 at ξ = 0
	F := RealC(C)
	if xi != 0 {
		E0 = Exp(A.Sqr().scale2(-0.5))
		F = RealC(E0.mulPos(C))
	}
	Fmag := F.Re.Mag()
	var phase Complex // e^{-iξc} for a shifted Gaussian
	if c != 0 && xi != 0 {
		phase = Cis(Point(xi).Scale(c).Neg())
		F = F.Mul(phase)
	}
	maxTerms := set.maxTerms()

	// Phase of copy l: e^{i2πl(s-c)/h}, with (s-c)/h reduced modulo 1.
	sc := Point(g.Shift)
	if c != 0 {
		sc = sc.AddFloat(-c)
	}
	u := sc.Div(Point(h))
	u = u.AddFloat(-math.Round(u.Mid()))
	alias, L, tail, ok := gaussianCopies(C, E0, A, B, u, Fmag, min(int64(gaussianAliasCopies), maxTerms/2), set.Tol)
	if !ok {
		return SampledSum{}, false
	}
	if c != 0 && xi != 0 {
		alias = alias.Mul(phase)
	}
	res := SampledSum{Exact: F, Alias: alias,
		Method: Method{Side: SpectralSide, AliasTerms: 2 * L, Remainder: tail, RemainderFrom: "gaussian"}}
	if !g.Infinite() {
		budget := min(int64(2*gaussianOmittedTerms), maxTerms-2*L)
		trunc, n, rem, ok := gaussianOmitted(sigma, c, g, xi, Fmag, budget, set.Tol)
		if !ok {
			return SampledSum{}, false
		}
		res.Truncation = trunc
		res.Method.TruncationTerms = n
		res.Method.Remainder = addUp(res.Method.Remainder, rem)
	}
	res.Error = res.Alias
	if !g.Infinite() {
		res.Error = res.Alias.Add(res.Truncation)
	}
	res.Sampled = F.Add(res.Error)
	if !res.Sampled.IsFinite() || !res.Error.IsFinite() || !res.Exact.IsFinite() {
		return SampledSum{}, false
	}
	return res, true
}

// gaussianCopies sums the copies l = ±1, …, ±L of C·exp(-(lb ± a)²/2),
// E0 = exp(-a²/2), with the phases e^{±i2πlu} (spectral side, see above),
// adding copies until the tail bound meets the goal of the general path
// (spectralAlias): 2⁻⁶⁰ of the copies summed so far, at least 2⁻⁶⁰ of
// 2⁻⁶⁰|F|, or Tol. It returns the enclosure with the tail included, L, the
// tail bound and whether it ended within limit copies on each side. It
// needs 0 < b and |a| ≤ b/2.
//
// The copies follow the recurrence with y = ±a, δ = b: copy l+1 is copy l
// times r_l, r_0 = exp(∓ab - b²/2), r_{l+1} = r_l·q, and the product
// r_0⁺·r_0⁻ = exp(-b²) = q needs no exponential of its own; at ξ = 0
// (a = 0) the two sides are equal, copy 1 is r_0 = exp(-b²/2) and q = r_0².
// Copy 1 = E0·r_0 is as tight as one exponential for small |a|; otherwise
// it is evaluated directly.
//
// Every exponential, E0, C and their products are intervals in [0, ∞), so
// their products are formed by mulPos.
func gaussianCopies(C, E0, A, B, u Interval, Fmag float64, limit int64, tol float64) (Complex, int64, float64, bool) {
	mirror := A.Lo == 0 && A.Hi == 0 // ξ = 0: the copies ±l are equal
	zeroShift := u.Lo == 0 && u.Hi == 0
	half := B.Sqr().scale2(0.5) // b²/2
	var cR, cL, rR, rL, q Interval
	switch {
	case mirror:
		cR = Exp(half.Neg()) // copy 1 = r_0 = exp(-b²/2)
		q = cR.mulPos(cR)
		rR = cR.mulPos(q)
		cL, rL = cR, rR
	case A.Mag() <= 1:
		// Copy 1 = E0·r_0: the exponents -a²/2 and ∓ab - b²/2 have the
		// sign of their sum, so the product is as tight as one exponential.
		ab := A.Mul(B)
		r0R, r0L := Exp(ab.Add(half).Neg()), Exp(ab.Sub(half))
		q = r0R.mulPos(r0L)
		cR, cL = E0.mulPos(r0R), E0.mulPos(r0L)
		rR, rL = r0R.mulPos(q), r0L.mulPos(q)
	default:
		// For larger |a| the exponents of E0 and r_0 cancel, and their
		// widths (mostly the enclosure of π in b) would add up: evaluate
		// copy 1 and its ratio r_1 = exp(-b(b ± a) - b²/2) directly.
		bR, bL := B.Add(A), B.Sub(A) // b + a, b - a
		cR, cL = Exp(bR.Sqr().scale2(-0.5)), Exp(bL.Sqr().scale2(-0.5))
		rR, rL = Exp(B.Mul(bR).Add(half).Neg()), Exp(B.Mul(bL).Add(half).Neg())
		q = Exp(B.Sqr().Neg())
	}
	floor := relGoal * Fmag
	var re, im Interval // Σ of the copies over C times their phases
	var ph, ph1 Complex // e^{i2πlu} for the copy l summed next, and e^{i2πu}
	var sumAbs float64  // Σ C·|copies| summed, for the relative goal
	var first float64
	for L := int64(0); ; L++ {
		// cR, cL are the copies L+1 and rR, rL the ratios to copies L+2,
		// which fall with L: (G) bounds copies L+1, L+2, … on each side.
		// The tail in float64 first (not a bound); the rigorous bound is
		// the same expression rounded upward, so it is computed only when
		// the estimate is near or below the goal.
		est := math.Inf(1)
		if rR.Hi < 1 && rL.Hi < 1 {
			est = C.Hi * (cR.Hi/(1-rR.Hi) + cL.Hi/(1-rL.Hi))
		}
		if L == 0 {
			first = est
		}
		scale := sumAbs
		if scale == 0 {
			scale = relGoal * first
		}
		goal := fmax(tol, fmax(relGoal*fmax(scale, floor), 0x1p-1022))
		tail := est
		if est <= 2*goal {
			if mirror {
				tail = mulUp(C.Hi, 2*geomUp(cR.Hi, rR.Hi)) // 2x is exact (or +Inf)
			} else {
				tail = mulUp(C.Hi, addUp(geomUp(cR.Hi, rR.Hi), geomUp(cL.Hi, rL.Hi)))
			}
		}
		if tail <= goal && (L > 0 || tail == 0 || tail <= tol) {
			sum := Complex{Re: re.Mul(C)} // C > 0, re of either sign
			if !mirror && !zeroShift {
				sum.Im = im.Mul(C)
			}
			return sum.Inflate(tail), L, tail, true
		}
		if L >= limit {
			return Complex{}, 0, 0, false
		}
		sumAbs += C.Hi * (cR.Hi + cL.Hi) // for the goal only
		if zeroShift {
			re = re.Add(cR.Add(cL))
		} else {
			// e^{i2πlu}: reduce lu modulo 1 before multiplying by the
			// enclosure of 2π. right·e^{iθ} + left·e^{-iθ}
			// = (right + left)·cos θ + i·(right - left)·sin θ.
			var sin, cos Interval
			switch {
			case mirror && L == 0:
				// At ξ = 0 only the cosines are needed (the sines cancel).
				ph1 = Complex{Re: cosThin(TwoPi.Mul(u))}
				ph = ph1
			case mirror && L == 1:
				// cos 2θ = 2cos²θ - 1 (DLMF 4.21.36, from memory)
				ph = Complex{Re: ph1.Re.Sqr().scale2(2).AddFloat(-1)}
			case mirror:
				v := u.Scale(float64(L + 1))
				ph = Complex{Re: cosThin(TwoPi.Mul(v.AddFloat(-math.Round(v.Mid()))))}
			case L == 0:
				ph1 = Cis(TwoPi.Mul(u))
				ph = ph1
			case L == 1:
				// cos 2θ = 1 - 2 sin²θ, sin 2θ = 2 sinθ cosθ (DLMF 4.21.35, 4.21.36, from memory)
				ph = Complex{Interval{1, 1}.Sub(ph1.Im.Sqr().scale2(2)), ph1.Im.Mul(ph1.Re).scale2(2)}
			default:
				ph = ph.Mul(ph1) // e^{i(l+1)θ} = e^{ilθ}·e^{iθ}
			}
			sin, cos = ph.Im, ph.Re
			if mirror { // the sine parts cancel exactly
				re = re.Add(cR.Mul(cos).scale2(2))
			} else {
				re = re.Add(cR.Add(cL).Mul(cos))
				im = im.Add(cR.Sub(cL).Mul(sin))
			}
		}
		if mirror {
			cR = cR.mulPos(rR)
			rR = rR.mulPos(q)
			cL, rL = cR, rR
			continue
		}
		cR, cL = cR.mulPos(rR), cL.mulPos(rL)
		rR, rL = rR.mulPos(q), rL.mulPos(q)
	}
}

// geomUp returns an upper bound of c/(1 - r), the geometric bound (G) for a
// leading term c ≥ 0 and ratio bound 0 ≤ r < 1; for r ≤ 1/2 it uses
// 1/(1 - r) = 1 + r/(1 - r) ≤ 1 + 2r,
// which saves a division.
func geomUp(c, r float64) float64 {
	if r <= 0.5 {
		return mulUp(c, addUp(1, mulUp(2, r)))
	}
	return divUp(c, addDown(1, -r))
}

// gaussianOmitted returns the truncation part -h Σ_{k omitted} f(x_k)e^{-iξx_k}
// of a finite grid for f(x) = exp(-(x-c)²/(2σ²)), walking outward on both
// sides by the ratio recurrence until (G) bounds the rest below the goal of
// the general path (omittedSum). It returns the enclosure with the rest
// included, the number of samples summed, the bound on the rest and whether
// it ended within budget samples. It needs c strictly inside the grid's
// window (y_0 > 0 on both sides).
func gaussianOmitted(sigma, c float64, g Grid, xi float64, Fmag float64, budget int64, tol float64) (Complex, int64, float64, bool) {
	h := g.Step
	lo, hi := g.Indices()
	S := Point(sigma)
	shift := Point(g.Shift)
	xr := position(h, hi+1, shift) // first omitted sample on the right
	xl := position(h, lo-1, shift) // and on the left
	D := Point(h).Div(S)           // δ = h/σ
	yr := xr.AddFloat(-c).Div(S)
	yl := xl.AddFloat(-c).Neg().Div(S)
	if !(yr.Lo > 0) || !(yl.Lo > 0) {
		return Complex{}, 0, 0, false
	}
	half := D.Sqr().scale2(0.5)
	q := Exp(D.Sqr().Neg())
	er := Exp(yr.Sqr().scale2(-0.5))
	el := Exp(yl.Sqr().scale2(-0.5))
	rr := Exp(D.Mul(yr).Add(half).Neg())
	rl := Exp(D.Mul(yl).Add(half).Neg())
	withPhase := xi != 0
	var pr, pl, w Complex
	if withPhase {
		X := Point(xi)
		pr = Cis(X.Mul(xr).Neg())
		pl = Cis(X.Mul(xl).Neg())
		w = Cis(X.Scale(h).Neg()) // e^{-iξh}: one step right
	}
	floor := relGoal * Fmag
	var re, im Interval
	var n int64
	for {
		// Rest of each ray by (G), times h: estimated in float64, then
		// bounded (the same expression rounded upward) when the estimate
		// is near or below the goal.
		rest := math.Inf(1)
		if rr.Hi < 1 && rl.Hi < 1 {
			rest = h * (er.Hi/(1-rr.Hi) + el.Hi/(1-rl.Hi))
		}
		sumMag := h * math.Sqrt(re.Mag()*re.Mag()+im.Mag()*im.Mag()) // |sum|, for the goal only
		goal := fmax(tol, fmax(relGoal*fmax(sumMag, floor), 0x1p-1022))
		if rest <= 2*goal {
			rest = mulUp(h, addUp(geomUp(er.Hi, rr.Hi), geomUp(el.Hi, rl.Hi)))
		}
		if rest <= goal && (n > 0 || rest == 0 || rest <= tol) {
			sum := Complex{re.Scale(-h), im.Scale(-h)}.Inflate(rest)
			return sum, n, rest, true
		}
		if n+2 > budget {
			return Complex{}, 0, 0, false
		}
		if withPhase {
			re = re.Add(pr.Re.Mul(er)).Add(pl.Re.Mul(el))
			im = im.Add(pr.Im.Mul(er)).Add(pl.Im.Mul(el))
			pr = pr.Mul(w)
			pl = pl.Mul(w.Conj())
		} else {
			re = re.Add(er).Add(el)
		}
		n += 2
		er, el = er.mulPos(rr), el.mulPos(rl)
		rr, rl = rr.mulPos(q), rl.mulPos(q)
	}
}
