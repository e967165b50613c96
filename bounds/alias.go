package bounds

import (
	"context"
	"fmt"
	"math"
)

// SampledSum is the answer of AliasSum: the sampled sum of a family on a
// grid at one frequency, the exact transform, and their difference split
// into its two causes, each as a complex enclosure.
//
//	Sampled     T = h Σ_{k in grid} f(x_k) e^{-iξx_k}
//	Exact       F(ξ)
//	Error       T - F = Alias + Truncation
//	Alias       Σ_{l≠0} F(ξ + 2πl/h) e^{i2πls/h}   (error of the infinite grid)
//	Truncation  -h Σ_{k not in grid} f(x_k) e^{-iξx_k}   (0 for an infinite grid)
//
// With ξ = 0, T is the trapezoidal rule and F the integral of f.
type SampledSum struct {
	Sampled    Complex
	Exact      Complex
	Error      Complex
	Alias      Complex
	Truncation Complex
	Method     Method
}

// Method says how a SampledSum was computed.
type Method struct {
	// Side is the side of the Poisson formula that gave the alias part.
	Side Side
	// AliasTerms counts the terms summed for the alias part: aliased
	// copies of F (spectral side) or samples of f (spatial side).
	AliasTerms int64
	// TruncationTerms counts the omitted samples summed explicitly for the
	// truncation part (finite grids summed on the spectral side).
	TruncationTerms int64
	// Remainder bounds the modulus of every unevaluated tail; it is already
	// included in the enclosures.
	Remainder float64
	// RemainderFrom names the envelope that bounded the remainder.
	RemainderFrom string
}

// AliasSum computes the sampled sum of f on the grid g at angular frequency
// ξ, the exact transform F(ξ) and the error T - F, by the Poisson summation
// formula (math.md, "Poisson summation"):
//
//	h Σ_k f(s+hk) e^{-iξ(s+hk)} = Σ_l F(ξ + 2πl/h) e^{i2πls/h}.
//
// The alias part is summed on the spectral side when the spectral envelope
// of f makes that affordable, which keeps its relative accuracy however
// small it is against F; otherwise T is summed on the spatial side and the
// error is T - F. On a finite grid the truncation part is the sum over the
// omitted samples, summed explicitly with an envelope bound on the rest, or,
// when the whole grid is summed directly, part of T - F. Every remainder is
// bounded by the family's envelopes and included in the enclosures.
//
// The errors returned wrap ErrInvalid (bad family, grid, frequency or
// settings: a *ParamError names the field), ErrWorkLimit (more terms than
// set.MaxTerms), ErrNotFinite, or the context's error.
func AliasSum(ctx context.Context, f Family, g Grid, xi float64, set Settings) (SampledSum, error) {
	env, err := checkAliasArgsEnv(f, g, xi, set)
	if err != nil {
		return SampledSum{}, err
	}
	if res, ok := fastAliasSum(ctx, f, g, xi, set); ok {
		return res, nil
	}
	return aliasSumGeneral(ctx, f, g, xi, set, env)
}

// familyEnvelopes holds a family's envelopes once built (ok).
type familyEnvelopes struct {
	spat, spec Envelope
	ok         bool
}

// aliasSumGeneral is AliasSum by the general path (aliasSummer), for every
// family, after the arguments have been checked; env are f's envelopes if
// the check built them.
func aliasSumGeneral(ctx context.Context, f Family, g Grid, xi float64, set Settings, env familyEnvelopes) (SampledSum, error) {
	// The envelopes are built once, into one slice for a catalogue family.
	// (The summer passes its family to interface calls, so escape analysis
	// cannot keep what the summer points to on the stack.)
	if !env.ok {
		env.spat, env.spec = envelopesOf(f)
	}
	s := newSummerEnv(ctx, f, g, Point(xi), Point(g.Shift), false, set, env.spat, env.spec)
	if err := validateEnvelopes(s.spat, s.spec); err != nil {
		return SampledSum{}, err
	}
	res, err := s.run()
	if err != nil {
		return SampledSum{}, err
	}
	if !res.Sampled.IsFinite() || !res.Error.IsFinite() || !res.Exact.IsFinite() {
		return SampledSum{}, fmt.Errorf("bounds: alias sum of %v: %w", f, ErrNotFinite)
	}
	return res, nil
}

// checkAliasArgs checks the arguments of AliasSum.
func checkAliasArgs(f Family, g Grid, xi float64, set Settings) error {
	_, err := checkAliasArgsEnv(f, g, xi, set)
	return err
}

// checkAliasArgsEnv is checkAliasArgs that also returns a composed family's
// envelopes, which its validation needs: they are built once.
func checkAliasArgsEnv(f Family, g Grid, xi float64, set Settings) (familyEnvelopes, error) {
	var env familyEnvelopes
	if _, ok := f.(composite); ok {
		// Validate would build the envelopes of the whole tree for its
		// range check, and the sum again: check them once here, and take
		// the path-naming validation only if something is wrong.
		if _, valid := composedValid(f, 1); valid {
			env.spat, env.spec = envelopesOf(f)
			env.ok = envelopeInRange(env.spat) && envelopeInRange(env.spec)
		}
	}
	if !env.ok {
		if err := validateParams(f); err != nil {
			return env, err
		}
	}
	if err := g.Validate("grid"); err != nil {
		return env, err
	}
	if !finite(xi) {
		return env, invalidf("xi", "must be finite, got %g", xi)
	}
	return env, set.Validate()
}

// aliasSummer holds the state of one alias-sum computation. The frequency
// and the shift are intervals: an enclosure computed with them holds for
// every frequency and shift in them. In abs mode the summer adds moduli of
// the terms instead of the terms, which bounds the sums for every phase,
// that is, for every shift.
type aliasSummer struct {
	ctx   context.Context
	f     Family
	g     Grid     // step and count; the shift is in shift
	xi    Interval // ξ
	shift Interval // s
	abs   bool
	set   Settings
	terms int64 // terms summed so far, against the work limit

	spec, spat Envelope // the family's envelopes, fetched once

	first     float64 // spectralEstimate(P, 0), once computed
	haveFirst bool
}

// newSummer returns a summer for f on g at frequencies xi and shifts shift.
func newSummer(ctx context.Context, f Family, g Grid, xi, shift Interval, abs bool, set Settings) aliasSummer {
	return newSummerEnv(ctx, f, g, xi, shift, abs, set, f.Spatial(), f.Spectral())
}

// newSummerEnv is newSummer with f's envelopes given by the caller.
func newSummerEnv(ctx context.Context, f Family, g Grid, xi, shift Interval, abs bool, set Settings, spat, spec Envelope) aliasSummer {
	return aliasSummer{ctx: ctx, f: f, g: g, xi: xi, shift: shift, abs: abs, set: set,
		spec: spec, spat: spat}
}

// at encloses the sample positions s + h·k for every s in the shift.
func (s *aliasSummer) at(k int64) Interval {
	return position(s.g.Step, k, s.shift)
}

// goal returns the remainder we accept for a sum whose magnitude is about
// scale: the caller's Tol, or 2⁻⁶⁰ of the scale, never below the smallest
// normal number (so that sums that are exactly zero terminate).
func (s *aliasSummer) goal(scale float64) float64 {
	return math.Max(s.set.Tol, math.Max(relGoal*scale, 0x1p-1022))
}

// spend counts n more terms against the work limit and polls the context
// every few thousand terms.
func (s *aliasSummer) spend(n int64, what string) error {
	before := s.terms
	s.terms += n
	if s.terms > s.set.maxTerms() {
		return workLimitf("settings.max_terms", "%s needs more than %d terms", what, s.set.maxTerms())
	}
	if before>>12 != s.terms>>12 {
		if err := s.ctx.Err(); err != nil {
			return fmt.Errorf("bounds: %s: %w", what, err)
		}
	}
	return nil
}

func (s *aliasSummer) run() (SampledSum, error) {
	if err := s.ctx.Err(); err != nil {
		return SampledSum{}, fmt.Errorf("bounds: alias sum: %w", err)
	}
	F := s.f.Transform(s.xi)
	scale := F.Mag()
	P := TwoPi.Div(Point(s.g.Step)) // 2π/h, the period of the spectral copies

	var res SampledSum
	res.Exact = F
	side := s.set.Side
	var alias Complex
	var m Method
	if side != SpatialSide {
		// Try the spectral side first with a few copies, unless the
		// envelope already says they will not do: for most families and
		// grids it converges at once, and it keeps the alias part's relative
		// accuracy. Only when it does not is the cheaper side estimated.
		limit := int64(math.MaxInt64)
		if side == AutoSide {
			limit = 0
			if s.trialWorthwhile(P, F) {
				limit = autoSpectralCopies
			}
		}
		var done bool
		var err error
		if limit > 0 {
			alias, m, done, err = s.spectralAlias(P, F, limit)
			if err != nil && side == SpectralSide {
				return res, err
			}
		}
		switch {
		case err == nil && done:
			side = SpectralSide
		case side == AutoSide:
			var L int64
			side, L = s.chooseSide(F, P)
			if side == SpectralSide {
				// The estimate assumed copies as large as their envelope;
				// if they are much smaller (copies near zeros of F) the
				// relative goal needs more, so cap the work and fall back
				// to the spatial side.
				s.terms = 0
				alias, m, done, err = s.spectralAlias(P, F, max(4*L, 64))
				if err != nil || !done {
					side = SpatialSide
					s.terms = 0
				}
			}
		}
	}
	switch {
	case side == SpectralSide:
		res.Alias = alias
		res.Method = m
		if !s.g.Infinite() {
			trunc, n, rem, ok, err := s.omittedSum(scale, truncationCap)
			if err != nil {
				return res, err
			}
			res.Method.TruncationTerms = n
			res.Method.Remainder = addUp(res.Method.Remainder, rem)
			if !ok && s.terms+s.g.Count <= s.set.maxTerms() {
				// The omitted samples decay too slowly to sum to the goal:
				// sum the grid itself, so that T and T - F are exact, and
				// let the truncation part be what the alias part leaves.
				T, err := s.finiteSum()
				if err != nil {
					return res, err
				}
				res.Sampled = T
				res.Error = T.Sub(F)
				res.Truncation = res.Error.Sub(res.Alias)
				res.Method.AliasTerms += s.g.Count
				return res, nil
			}
			res.Truncation = trunc
		}
		res.Error = res.Alias.Add(res.Truncation)
		res.Sampled = F.Add(res.Error)
	case s.g.Infinite():
		T, m, err := s.spatialInfinite(scale)
		if err != nil {
			return res, err
		}
		res.Sampled = T
		res.Method = m
		res.Error = T.Sub(F)
		res.Alias = res.Error
	default:
		// The finite grid summed directly: T exactly, and the error split
		// into truncation (summed over the omitted samples) and alias = rest.
		T, err := s.finiteSum()
		if err != nil {
			return res, err
		}
		trunc, n, rem, _, err := s.omittedSum(scale, truncationCap)
		if err != nil {
			return res, err
		}
		res.Sampled = T
		res.Error = T.Sub(F)
		res.Truncation = trunc
		res.Alias = res.Error.Sub(trunc)
		res.Method = Method{Side: SpatialSide, AliasTerms: s.g.Count, TruncationTerms: n,
			Remainder: rem, RemainderFrom: s.spat.Kinds()}
	}
	return res, nil
}

// truncationCap is how many omitted samples omittedSum sums at most before
// it settles for the envelope's bound on the rest.
const truncationCap = 1 << 14

// autoSpectralCopies is how many alias copies on each side AliasSum tries
// before it estimates which side of the Poisson formula is cheaper.
const autoSpectralCopies = 32

// trialWorthwhile reports whether autoSpectralCopies copies on each side
// may reach the goal, by the float64 estimate of the tail after them.
func (s *aliasSummer) trialWorthwhile(P Interval, F Complex) bool {
	first := s.firstCopies(P)
	if math.IsInf(first, 1) {
		return false
	}
	if !s.spec.hasDecay(Algebraic) {
		// Gaussian and exponential copies fall off geometrically or faster
		// and band limits end: the trial is cheap whatever it finds.
		return true
	}
	goal := s.goal(math.Max(first, 0x1p-60*F.Mag()))
	return first <= goal || s.spectralEstimate(P, autoSpectralCopies) <= goal
}

// chooseSide picks the spectral side when its alias sum needs no more
// terms than a few times the spatial sum, or when the alias error is so
// small against F that T - F would lose it to rounding. It also returns the
// estimated number of copies on each side for the spectral side.
func (s *aliasSummer) chooseSide(F Complex, P Interval) (Side, int64) {
	spec := s.spec
	first := spec.At(s.xi.Add(P)) + spec.At(s.xi.Sub(P))
	goal := s.goal(math.Max(first, 0x1p-60*F.Mag()))
	var K int64
	if _, ok := s.f.(closedFormLattice); ok && s.g.Infinite() && !s.abs {
		K = 4 // two geometric series in closed form
	} else {
		K = s.spatialTermsEstimate(F.Mag())
	}
	if s.g.Count > 0 && s.g.Count < K {
		K = s.g.Count
	}
	// The spectral side is worth up to four times the spatial terms (it
	// keeps relative accuracy); one estimate at that many copies decides.
	enough := max(int64(64), min(4*K, s.set.maxTerms()))
	if 2*s.spectralEstimate(P, enough) <= goal {
		return SpectralSide, enough
	}
	if first < 1e-8*F.Mag() {
		// T - F would lose a tiny alias error to rounding: take the
		// spectral side if it fits the work limit at all.
		if L := s.spectralTermsEstimate(P, goal); L <= s.set.maxTerms() {
			return SpectralSide, L
		}
	}
	return SpatialSide, enough
}

// spectralTail bounds Σ_{|l|>L} |F(ξ + lP)|.
func (s *aliasSummer) spectralTail(P Interval, L int64) float64 {
	spec := s.spec
	next := P.Scale(float64(L + 1))
	if s.xi.Lo == 0 && s.xi.Hi == 0 && spec.centred() {
		// At ξ = 0 an envelope centred at 0 sees both rays alike.
		return mulUp(2, spec.RayTail(s.xi.Add(next), 1, P.Lo))
	}
	return spec.rayTails(s.xi.Add(next), s.xi.Sub(next), P.Lo)
}

// firstCopies returns spectralEstimate(P, 0), computed once per summer.
func (s *aliasSummer) firstCopies(P Interval) float64 {
	if !s.haveFirst {
		s.first = s.spectralEstimate(P, 0)
		s.haveFirst = true
	}
	return s.first
}

// spectralEstimate approximates spectralTail in float64 (not a bound).
func (s *aliasSummer) spectralEstimate(P Interval, L int64) float64 {
	p := P.Mid()
	next := p * float64(L+1)
	x := s.xi.Mid()
	right := s.spec.RayEstimate(x+next, 1, p)
	if x == 0 && s.spec.centred() {
		return 2 * right
	}
	return right + s.spec.RayEstimate(x-next, -1, p)
}

// spectralTermsEstimate returns the number of alias copies on each side
// needed for a tail below goal, or MaxInt64 if the limit is exceeded.
func (s *aliasSummer) spectralTermsEstimate(P Interval, goal float64) int64 {
	// Float estimates only: this decides a side, the sum itself is
	// certified by the rigorous tail.
	tail := func(L int64) float64 { return 2 * s.spectralEstimate(P, L) }
	limit := s.set.maxTerms()
	if tail(0) <= goal {
		return 0
	}
	hi := int64(1)
	for tail(hi) > goal {
		if hi > limit {
			return math.MaxInt64
		}
		hi *= 2
	}
	lo := hi / 2 // tail(lo) > goal (or lo = 0)
	for hi-lo > 1 {
		mid := lo + (hi-lo)/2
		if tail(mid) <= goal {
			hi = mid
		} else {
			lo = mid
		}
	}
	return hi
}

// aliasBlocker is implemented by families with an even |F| that can bound
// a block of alias copies in closed form, far below the copies' envelope
// where the copies sit at zeros of F (BSplineFamily at the steps of its
// partition of unity).
type aliasBlocker interface {
	// aliasBlock returns an upper bound of Σ_{j=0}^{J-1} |F(x0 + jP)| for
	// every x0 in the interval, given x0.Lo > 0 and P.Lo > 0, or +Inf.
	aliasBlock(x0, P Interval, J int64) float64
	// aliasRay returns an upper bound of Σ_{j≥0} |F(x0 + jP)|, every
	// copy of the ray, under the same conditions, or +Inf.
	aliasRay(x0, P Interval) float64
}

// blockAlias is spectralAlias in abs mode for a family that bounds blocks
// of copies (aliasBlocker). It takes the number of copies L on each side
// as spectralAlias would, the least whose rigorous tail meets the goal, but
// bounds the copies ±1 … ±L by two blocks instead of summing them; the
// enclosure is [0, blocks] widened by the tail. ok is false when the
// blocks are not far below the goal: then the copies must be summed.
func (s *aliasSummer) blockAlias(bl aliasBlocker, P Interval, F Complex, limit int64) (Complex, Method, bool) {
	if s.xi.Mag() >= P.Lo {
		return Complex{}, Method{}, false
	}
	goal := s.goal(0x1p-60 * F.Mag())
	// Every copy at once, where the ray bound is small enough.
	if R := addUp(bl.aliasRay(s.xi.Add(P), P), bl.aliasRay(P.Sub(s.xi), P)); R <= goal {
		return RealC(Interval{0, R}), Method{Side: SpectralSide, Remainder: R, RemainderFrom: "zeros of the transform (closed form)"}, true
	}
	enough := func(L int64) bool { return 2*s.spectralEstimate(P, L) <= goal }
	// The least L ≥ 1 the estimate accepts, by doubling and bisection.
	hi := int64(1)
	for !enough(hi) {
		if hi >= limit {
			return Complex{}, Method{}, false
		}
		hi = min(2*hi, limit)
	}
	lo := hi / 2 // 0, or a count the estimate rejects
	for hi-lo > 1 {
		mid := lo + (hi-lo)/2
		if enough(mid) {
			hi = mid
		} else {
			lo = mid
		}
	}
	L := hi
	tail := s.spectralTail(P, L)
	for tail > goal {
		if L >= limit {
			return Complex{}, Method{}, false
		}
		L = min(2*L, limit)
		tail = s.spectralTail(P, L)
	}
	// Right copies ξ + lP and, |F| being even, left copies |F(lP - ξ)|.
	B := addUp(bl.aliasBlock(s.xi.Add(P), P, L), bl.aliasBlock(P.Sub(s.xi), P, L))
	if !(B <= goal/16) {
		return Complex{}, Method{}, false
	}
	sum := RealC(Interval{0, B}).Inflate(tail)
	rem := addUp(B, tail)
	return sum, Method{Side: SpectralSide, AliasTerms: 2 * L, Remainder: rem, RemainderFrom: s.spec.Kinds()}, true
}

// spectralAlias sums the aliased copies l = ±1, …, ±L of F with the phase
// e^{i2πls/h}, adding copies until the envelope bounds the rest below the
// goal.
func (s *aliasSummer) spectralAlias(P Interval, F Complex, limit int64) (Complex, Method, bool, error) {
	tail := 2 * s.firstCopies(P)
	if math.IsInf(tail, 1) {
		return Complex{}, Method{}, false, invalidf("family", "%v: spectral envelope is not summable; the spectral side cannot be used", s.f)
	}
	if bl, ok := s.f.(aliasBlocker); ok && s.abs {
		if sum, m, ok := s.blockAlias(bl, P, F, limit); ok {
			return sum, m, true, nil
		}
	}
	// Phase e^{i2πs/h}: reduce s/h modulo 1 first so that large shifts keep
	// an accurate phase.
	u := s.shift.Div(Point(s.g.Step))
	u = u.AddFloat(-math.Round(u.Mid()))
	zeroShift := u.Lo == 0 && u.Hi == 0

	// The remainder goal is relative to the size of the copies summed so
	// far (not only to their sum, which may be 0 when every copy sits on a
	// zero of F); before any copy is summed, to the estimate of the first.
	first := tail / 2
	floor := 0x1p-60 * F.Mag()
	// At ξ = 0 the copies of an even transform come in equal pairs.
	mirror := s.xi.Lo == 0 && s.xi.Hi == 0 && isEven(s.f)
	var sum Complex
	var sumAbs float64 // Σ |copies| ≥ |sum|, up to a factor √2
	var L int64
	rigorous := false // whether tail is the rigorous bound or an estimate
	var goal float64
	for {
		scale := sumAbs
		if scale == 0 {
			scale = 0x1p-60 * first
		}
		goal = s.goal(math.Max(scale, floor))
		if tail <= goal && (L > 0 || tail == 0 || tail <= s.set.Tol) {
			if rigorous {
				break
			}
			// The estimate says enough: confirm with the rigorous tail.
			tail = s.spectralTail(P, L)
			rigorous = true
			if tail <= goal {
				break
			}
		}
		if L >= limit {
			return Complex{}, Method{}, false, nil
		}
		L++
		if err := s.spend(2, "spectral alias sum"); err != nil {
			return Complex{}, Method{}, false, err
		}
		lp := P.Scale(float64(L))
		right := s.f.Transform(s.xi.Add(lp))
		left := right
		if !mirror {
			left = s.f.Transform(s.xi.Sub(lp))
		}
		sumAbs += right.Re.Mag() + right.Im.Mag() + left.Re.Mag() + left.Im.Mag()
		switch {
		case s.abs:
			sum = sum.Add(RealC(right.Abs().Add(left.Abs())))
		case zeroShift:
			sum = sum.Add(right).Add(left)
		default:
			// e^{i2πuL}: reduce uL modulo 1 before multiplying by the
			// enclosure of 2π, so that π's width is not multiplied by L.
			v := u.Scale(float64(L))
			v = v.AddFloat(-math.Round(v.Mid()))
			ph := Cis(TwoPi.Mul(v))
			switch {
			case mirror:
				// F e^{iθ} + F e^{-iθ} = 2F cos θ.
				sum = sum.Add(right.MulReal(ph.Re.Scale(2)))
			case right.Im == Interval{} && left.Im == Interval{}:
				// Real copies (even real f): R e^{iθ} + L e^{-iθ}
				// = (R + L) cos θ + i (R - L) sin θ.
				sum = sum.Add(Complex{right.Re.Add(left.Re).Mul(ph.Re), right.Re.Sub(left.Re).Mul(ph.Im)})
			default:
				sum = sum.Add(right.Mul(ph)).Add(left.Mul(ph.Conj()))
			}
		}
		// Estimate first (cheap); twice the estimate must meet the goal
		// before the rigorous tail is computed. An estimate already far
		// below the goal stands for the next (the estimates fall with L).
		if rigorous || tail > 0x1p-20*goal {
			tail = 2 * s.spectralEstimate(P, L)
		}
		rigorous = false
	}
	sum = sum.Inflate(tail)
	return sum, Method{Side: SpectralSide, AliasTerms: 2 * L, Remainder: tail, RemainderFrom: s.spec.Kinds()}, true, nil
}

// term encloses h·f(x_k)·e^{-iξx_k}.
func (s *aliasSummer) term(k int64) Complex {
	return s.sample(k).Scale(s.g.Step)
}

// sample encloses f(x_k)·e^{-iξx_k} (|f(x_k)| in abs mode), the term
// without the factor h, which sums multiply once.
func (s *aliasSummer) sample(k int64) Complex {
	x := s.at(k)
	v := s.f.Value(x)
	if s.abs {
		return RealC(v.Abs())
	}
	if s.xi.Lo == 0 && s.xi.Hi == 0 || v == (Complex{}) {
		return v
	}
	ph := Cis(s.xi.Mul(x).Neg())
	if v.Im.Lo == 0 && v.Im.Hi == 0 {
		// A real value (most families): two products instead of four.
		return Complex{ph.Re.Mul(v.Re), ph.Im.Mul(v.Re)}
	}
	return v.Mul(ph)
}

// spatialRays bounds h·Σ|f| over the samples beyond index hi (rightward)
// and below index lo (leftward).
func (s *aliasSummer) spatialRays(lo, hi int64) float64 {
	env := s.spat
	h := s.g.Step
	r := env.RayTail(s.at(hi+1), 1, h)
	l := env.RayTail(s.at(lo-1), -1, h)
	return mulUp(h, addUp(r, l))
}

// spatialEstimate approximates spatialRays in float64 (not a bound).
func (s *aliasSummer) spatialEstimate(lo, hi int64) float64 {
	h := s.g.Step
	return h * (s.spat.RayEstimate(s.at(hi+1).Mid(), 1, h) + s.spat.RayEstimate(s.at(lo-1).Mid(), -1, h))
}

// spatialTermsEstimate returns the number of samples an infinite-grid
// spatial sum needs, or MaxInt64 if it exceeds the limit.
func (s *aliasSummer) spatialTermsEstimate(scale float64) int64 {
	lo, hi, ok := s.spatialWindow(s.goal(scale), false)
	if !ok {
		return math.MaxInt64
	}
	return hi - lo + 1
}

// spatialWindow finds indices [lo, hi] covering every envelope centre such
// that the samples outside contribute at most goal: by the float estimate
// of the rays, then, if rigorous, by their certified bound.
func (s *aliasSummer) spatialWindow(goal float64, rigorous bool) (lo, hi int64, ok bool) {
	env := s.spat
	if len(env) == 0 {
		return 0, -1, true
	}
	// The window starts at the centres (widened by the plateaus), or for
	// compact terms at the whole support, so that a compactly supported f
	// is summed over exactly the samples where it may be non-zero.
	cmin, cmax := math.Inf(1), math.Inf(-1)
	for _, t := range env {
		r := t.Plateau
		if t.Decay == Compact {
			r = addUp(r, t.Width)
		}
		cmin = math.Min(cmin, addDown(t.Center, -r))
		cmax = math.Max(cmax, addUp(t.Center, r))
	}
	h := s.g.Step
	limit := float64(s.set.maxTerms())
	base0 := math.Floor((cmin - s.shift.Hi) / h)
	base1 := math.Ceil((cmax - s.shift.Lo) / h)
	if math.Abs(base0) > 1<<62 || math.Abs(base1) > 1<<62 {
		return 0, 0, false
	}
	var m int64
	for {
		lo, hi = int64(base0)-m, int64(base1)+m
		if float64(hi-lo+1) > limit {
			return 0, 0, false
		}
		if s.spatialEstimate(lo, hi) <= goal/2 && (!rigorous || s.spatialRays(lo, hi) <= goal) {
			return lo, hi, true
		}
		if m == 0 {
			m = 1
		} else {
			m *= 2
		}
	}
}

// closedFormLattice is implemented by families whose sampled sum over an
// infinite grid has a closed form (ExponentialFamily: two geometric
// series).
type closedFormLattice interface {
	// latticeSum encloses h Σ_{k∈Z} f(s + hk) e^{-iξ(s+hk)} for every s in
	// shift and ξ in xi, or returns ok = false where it cannot tightly.
	latticeSum(h float64, shift, xi Interval) (T Complex, ok bool)
}

// spatialInfinite sums T over an infinite grid on the spatial side.
func (s *aliasSummer) spatialInfinite(scale float64) (Complex, Method, error) {
	if ls, ok := s.f.(closedFormLattice); ok && !s.abs {
		if T, ok := ls.latticeSum(s.g.Step, s.shift, s.xi); ok {
			return T, Method{Side: SpatialSide, RemainderFrom: "closed form"}, nil
		}
	}
	lo, hi, ok := s.spatialWindow(s.goal(scale), true)
	if !ok {
		if math.IsInf(s.spatialRays(0, 0), 1) {
			return Complex{}, Method{}, invalidf("family", "%v: spatial envelope is not summable; the spatial side cannot be used", s.f)
		}
		return Complex{}, Method{}, workLimitf("settings.max_terms", "spatial sum of %v needs more than %d samples", s.f, s.set.maxTerms())
	}
	var acc complexAccumulator
	for k := lo; k <= hi; k++ {
		if err := s.spend(1, "spatial sum"); err != nil {
			return Complex{}, Method{}, err
		}
		acc.add(s.sample(k))
	}
	rem := s.spatialRays(lo, hi)
	T := acc.value().Scale(s.g.Step).Inflate(rem)
	return T, Method{Side: SpatialSide, AliasTerms: hi - lo + 1, Remainder: rem, RemainderFrom: s.spat.Kinds()}, nil
}

// finiteSum sums T over the samples of a finite grid.
func (s *aliasSummer) finiteSum() (Complex, error) {
	lo, hi := s.g.Indices()
	var acc complexAccumulator
	for k := lo; k <= hi; k++ {
		if err := s.spend(1, "finite grid sum"); err != nil {
			return Complex{}, err
		}
		acc.add(s.sample(k))
	}
	return acc.value().Scale(s.g.Step), nil
}

// omittedSum returns the truncation part -h Σ_{k omitted} f(x_k)e^{-iξx_k}
// of a finite grid: the omitted samples nearest the grid are summed
// explicitly, walking outward on both sides, until the envelope bounds the
// rest below the goal or cap samples have been summed. It returns the
// enclosure (always rigorous: the remainder is included), the number of
// samples summed, the remainder bound and whether the goal was met.
func (s *aliasSummer) omittedSum(scale float64, cap int64) (Complex, int64, float64, bool, error) {
	lo, hi := s.g.Indices()
	var sum Complex
	var n int64
	a, b := lo, hi // samples a..b are accounted for
	// Leave room in the work limit for summing the grid itself.
	cap = min(cap, s.set.maxTerms()-s.terms-s.g.Count)
	for {
		goal := s.goal(math.Max(sum.Mag(), 0x1p-60*scale))
		// The rigorous remainder costs far more than a term: take it when
		// the float estimate says the goal is met, and at doubling counts.
		est := s.spatialEstimate(a, b)
		if n == 0 || 2*est <= goal || n&(n-1) == 0 || n >= cap {
			rem := s.spatialRays(a, b)
			if math.IsInf(rem, 1) {
				return Complex{}, 0, 0, false, invalidf("family", "%v: spatial envelope is not summable; the truncation error is unbounded", s.f)
			}
			// Sum at least the nearest omitted pair, so that a small
			// truncation part is known to relative accuracy, not only
			// bounded.
			if rem <= goal && (n > 0 || rem == 0 || rem <= s.set.Tol) {
				return sum.Neg().Inflate(rem), n, rem, true, nil
			}
			if n >= cap {
				return sum.Neg().Inflate(rem), n, rem, false, nil
			}
		}
		if err := s.spend(2, "truncation sum"); err != nil {
			return Complex{}, 0, 0, false, err
		}
		a--
		b++
		sum = sum.Add(s.term(a)).Add(s.term(b))
		n += 2
	}
}
