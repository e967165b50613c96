package bounds

import (
	"context"
	"fmt"
	"math"
)

// Band is a set of angular frequencies |ξ - Center| ≤ HalfWidth. A zero
// HalfWidth is the single frequency Center; the integral is Band{}.
type Band struct {
	Center    float64
	HalfWidth float64
}

// Validate checks the band; path names it in errors.
func (b Band) Validate(path string) error {
	if !finite(b.Center) {
		return invalidf(path+".center", "must be finite, got %g", b.Center)
	}
	if !finite(b.HalfWidth) || b.HalfWidth < 0 {
		return invalidf(path+".half_width", "must be finite and ≥ 0, got %g", b.HalfWidth)
	}
	return nil
}

// Interval returns the band as an enclosure of its frequencies.
func (b Band) Interval() Interval {
	return Interval{addDown(b.Center, -b.HalfWidth), addUp(b.Center, b.HalfWidth)}
}

// BudgetOptions qualify an error budget.
type BudgetOptions struct {
	// AnyShift asks for a budget valid for every shift in
	// [Shift - Step/2, Shift + Step/2], that is, wherever the samples fall
	// within a cell, instead of for the grid's Shift only.
	AnyShift bool
	// SampleUlps is the error of each computed sample value f(x_k), in units
	// of the unit roundoff u = 2⁻⁵³; 0 means 1 (correctly rounded samples).
	SampleUlps float64
	Settings
}

// Budget is an itemised, certified bound on the error of a sampled sum:
// |computed T - F(ξ)| ≤ Total for every frequency of the band (and every
// shift, with AnyShift).
type Budget struct {
	// Aliasing bounds |Σ_{l≠0} F(ξ + 2πl/h) e^{i2πls/h}|, the error of the
	// infinite grid.
	Aliasing float64
	// Truncation bounds |h Σ_{k omitted} f(x_k) e^{-iξx_k}|, the error of
	// cutting the grid to its Count samples (0 for an infinite grid).
	Truncation float64
	// Rounding bounds the floating-point error of computing the N-term sum
	// in double precision (0 for an infinite grid, which cannot be summed).
	Rounding float64
	// Total is the sum of the three, rounded upward.
	Total float64
	// Exact is true when aliasing and truncation come from enclosures of
	// the exact error terms of a family, false when they come from
	// envelopes.
	Exact bool
	// Pieces is the number of frequency and shift subintervals the sups
	// were taken over (1 for a single frequency and shift).
	Pieces int
}

func (b *Budget) total() {
	b.Total = addUp(addUp(b.Aliasing, b.Truncation), b.Rounding)
}

const unitRoundoff = 0x1p-53

// roundingBound bounds the floating-point error of computing
// T = h Σ_k f_k e^{-iξx_k} over N samples by recursive summation:
//
//	|fl(T) - T| ≤ (γ_{N+3} + c_f·u + u·(|ξ|·X + 4))·S,   γ_n = nu/(1-nu),
//
// where S = h Σ_k |f(x_k)|, X = max_k |x_k|, c_f·u bounds the relative error
// of each sample, u(|ξ|X + 4) that of each phase factor e^{-iξx_k} (the
// rounding of ξx_k, and a few ulps for sin, cos and the complex product),
// and γ_{N+3} the N-1 additions plus the products by h and the phase
// (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., 2002,
// §3.1 and §4.2, from memory).
func roundingBound(n int64, sampleUlps, xiMag, xMag, S float64) float64 {
	if n == 0 || S == 0 {
		return 0
	}
	nu := Point(float64(n + 3)).Scale(unitRoundoff)
	gamma := nu.Div(Point(1).Sub(nu))
	phase := Point(xiMag).Mul(Point(xMag)).AddFloat(4).Scale(unitRoundoff)
	if xiMag == 0 {
		phase = Point(0)
	}
	rel := gamma.Add(Point(sampleUlps * unitRoundoff)).Add(phase)
	return rel.Mul(Point(S)).Hi
}

func (o BudgetOptions) sampleUlps() float64 {
	if o.SampleUlps == 0 {
		return 1
	}
	return o.SampleUlps
}

func (o BudgetOptions) validate() error {
	if !finite(o.SampleUlps) || o.SampleUlps < 0 {
		return invalidf("options.sample_ulps", "must be finite and ≥ 0, got %g", o.SampleUlps)
	}
	return o.Settings.Validate()
}

// shiftRange returns the shifts a budget covers.
func shiftRange(g Grid, anyShift bool) Interval {
	if !anyShift {
		return Point(g.Shift)
	}
	return Interval{addDown(g.Shift, -g.Step/2), addUp(g.Shift, g.Step/2)}
}

// shiftPieces is the number of subintervals the shift range is cut into
// when a truncation bound must hold for every shift: the sup of a sum over
// a piece is bounded by the sum of its terms' sups, which overestimates by
// little when the pieces are short.
const shiftPieces = 16

// windowSum bounds S = h Σ_{k in grid} |f(x_k)| through the spatial
// envelope, for every shift: S ≤ Σ_terms h Σ_{k∈Z} term(x_k), each term's
// lattice sum bounded in closed form by latticeTermSum.
func windowSum(env Envelope, g Grid, shifts Interval) float64 {
	s := 0.0
	for _, t := range env {
		s = addUp(s, latticeTermSum(t, g.Step))
	}
	return s
}

// latticeTermSum bounds h Σ_{k∈Z} g(s + hk) for one envelope term g, for
// every shift s, by the least of the bounds that apply:
//
//	any term (unimodal):        ∫g + h·A
//	Gaussian, no plateau:       Aσ√(2π)·(1 + 2e^{-a}/(1 - e^{-3a})),  a = 2π²σ²/h²
//	exponential, no plateau:    A·h·(1 + e^{-αh})/(1 - e^{-αh})
//
// The first is the integral comparison for a function that increases up to
// its plateau and decreases beyond it: every sample but one is covered by
// its own cell of width h on the rising or the falling side, and the cell
// between the two samples around the top holds at least the smaller of
// them. The second is the Poisson summation formula for the Gaussian,
// h Σ_k g(s+hk) = Aσ√(2π) Σ_l e^{-a l²} cos(2πl(s-c)/h), with
// a l² ≥ a + 3a(l-1) for l ≥ 1 (Jacobi's imaginary transformation of θ₃,
// DLMF 20.7.32, from memory). The third is the geometric series at the
// worst shift, a sample at the centre: the sum (e^{-αt} + e^{-α(h-t)})/
// (1 - e^{-αh}) over the offset t ∈ [0, h] is convex with equal ends.
// The integrals are those of termIntegral: 2pA plus A·σ√(2π), 2A/α,
// 2Aℓ/(q-1) or 2AR for the four decays.
func latticeTermSum(t EnvelopeTerm, h float64) float64 {
	A := Point(t.Amplitude)
	if t.Amplitude == 0 {
		return 0
	}
	H := Point(h)
	flat := A.Mul(Point(t.Plateau)).Scale(2)
	var integral Interval
	switch t.Decay {
	case Exponential:
		integral = A.Scale(2).Div(Point(t.Rate))
	case Gaussian:
		integral = A.Mul(SqrtTwoPi).Scale(t.Width)
	case Algebraic:
		if t.Power <= 1 {
			return math.Inf(1)
		}
		integral = A.Scale(2).Scale(t.Width).Div(Point(t.Power).AddFloat(-1))
	case Compact:
		integral = A.Scale(2).Scale(t.Width)
	default:
		return math.Inf(1)
	}
	best := flat.Add(integral).Add(A.Mul(H)).Hi
	if t.Plateau == 0 {
		switch t.Decay {
		case Gaussian:
			s := Point(t.Width)
			a := Pi.Sqr().Mul(s.Sqr()).Scale(2).Div(H.Sqr()) // 2π²σ²/h²
			ea := Exp(a.Neg())
			den := Expm1(a.Scale(-3)).Neg() // 1 - e^{-3a}
			theta := Point(1).Add(ea.Scale(2).Div(den))
			best = math.Min(best, integral.Mul(theta).Hi)
		case Exponential:
			ah := H.Scale(t.Rate)
			num := Point(1).Add(Exp(ah.Neg()))
			den := Expm1(ah.Neg()).Neg() // 1 - e^{-αh}
			best = math.Min(best, A.Mul(H).Mul(num).Div(den).Hi)
		}
	}
	return best
}

// maxAbsX bounds max_k |x_k| over the window for every shift.
func maxAbsX(g Grid, shifts Interval) float64 {
	lo, hi := g.Indices()
	a := Point(g.Step).Scale(float64(lo)).Add(shifts)
	b := Point(g.Step).Scale(float64(hi)).Add(shifts)
	return math.Max(a.Mag(), b.Mag())
}

// EnvelopeBudget bounds the error of the sampled sum of any function whose
// modulus and transform satisfy the given envelopes, |f| ≤ spatial and
// |F| ≤ spectral, on grid g over the band (math.md, "Envelopes and their
// bounds"):
//
//	aliasing    ≤ Σ_{l≠0} spectral(ξ + 2πl/h)        (any shift)
//	truncation  ≤ h Σ_{k omitted} spatial(x_k)
//	rounding    as for roundingBound, with S ≤ h Σ_{k∈Z} spatial(x_k)
//
// Each ray of omitted points or alias copies is bounded in closed form
// (EnvelopeTerm.tail), with the nearest omitted points on either side at
// their true distances from the centre, so shifted grids are bounded
// correctly. Over a band and over shifts the bounds take their worst case.
// Errors wrap ErrInvalid (a *ParamError names the field) when an envelope
// is not summable on the side it is needed.
func EnvelopeBudget(ctx context.Context, spatial, spectral Envelope, g Grid, band Band, opt BudgetOptions) (Budget, error) {
	if err := ctx.Err(); err != nil {
		return Budget{}, fmt.Errorf("bounds: envelope budget: %w", err)
	}
	if err := spatial.Validate("spatial"); err != nil {
		return Budget{}, err
	}
	if err := spectral.Validate("spectral"); err != nil {
		return Budget{}, err
	}
	if err := g.Validate("grid"); err != nil {
		return Budget{}, err
	}
	if err := band.Validate("band"); err != nil {
		return Budget{}, err
	}
	if err := opt.validate(); err != nil {
		return Budget{}, err
	}
	xi := band.Interval()
	P := TwoPi.Div(Point(g.Step))
	var b Budget
	// Over a band, the right-hand copies are worst at its upper end and the
	// left-hand ones at its lower end; cutting the band into pieces takes
	// the sup of their sum rather than the sum of their sups.
	bandPieces := 1
	if xi.Lo != xi.Hi {
		bandPieces = envelopeBandPieces
	}
	for i := 0; i < bandPieces; i++ {
		x := subinterval(xi, i, bandPieces)
		a := addUp(spectral.RayTail(x.Add(P), 1, P.Lo), spectral.RayTail(x.Sub(P), -1, P.Lo))
		b.Aliasing = math.Max(b.Aliasing, a)
	}
	b.Pieces = bandPieces
	if math.IsInf(b.Aliasing, 1) {
		return Budget{}, invalidf("spectral", "envelope is not summable over the alias copies (algebraic power must exceed 1)")
	}
	shifts := shiftRange(g, opt.AnyShift)
	if !g.Infinite() {
		lo, hi := g.Indices()
		pieces := 1
		if opt.AnyShift {
			pieces = shiftPieces
		}
		for i := 0; i < pieces; i++ {
			sh := subinterval(shifts, i, pieces)
			xr := Point(g.Step).Scale(float64(hi + 1)).Add(sh)
			xl := Point(g.Step).Scale(float64(lo - 1)).Add(sh)
			t := mulUp(g.Step, addUp(spatial.RayTail(xr, 1, g.Step), spatial.RayTail(xl, -1, g.Step)))
			b.Truncation = math.Max(b.Truncation, t)
		}
		b.Pieces = max(pieces, bandPieces)
		if math.IsInf(b.Truncation, 1) {
			return Budget{}, invalidf("spatial", "envelope is not summable over the omitted samples (algebraic power must exceed 1)")
		}
		S := windowSum(spatial, g, shifts)
		b.Rounding = roundingBound(g.Count, opt.sampleUlps(), xi.Mag(), maxAbsX(g, shifts), S)
	}
	b.total()
	if !finite(b.Total) {
		return Budget{}, fmt.Errorf("bounds: envelope budget: %w", ErrNotFinite)
	}
	return b, nil
}

// envelopeBandPieces is the number of pieces a band is cut into for an
// envelope's aliasing bound.
const envelopeBandPieces = 16

// subinterval returns piece i of n equal pieces of x, rounded outward.
func subinterval(x Interval, i, n int) Interval {
	if n == 1 {
		return x
	}
	w := (x.Hi - x.Lo) / float64(n)
	lo := x.Lo + w*float64(i)
	hi := x.Lo + w*float64(i+1)
	if i == 0 {
		lo = x.Lo
	} else {
		lo = nextDown(lo)
	}
	if i == n-1 {
		hi = x.Hi
	} else {
		hi = nextUp(hi)
	}
	return Interval{lo, hi}
}

// bandPieces limits the subdivision of a band when its sup is taken.
const bandPieces = 64

// FamilyBudget bounds the error of the sampled sum of the family f on grid
// g over the band from enclosures of its exact error terms (see AliasSum):
//
//	aliasing    ≤ sup |Σ_{l≠0} F(ξ + 2πl/h) e^{i2πls/h}|, or, with
//	              AnyShift, Σ_{l≠0} |F(ξ + 2πl/h)|, its sup over shifts;
//	truncation  ≤ sup |h Σ_{k omitted} f(x_k) e^{-iξx_k}|, or, over a band
//	              or with AnyShift, h Σ_{k omitted} |f(x_k)|;
//	rounding    as for roundingBound.
//
// Over a band the sups are certified: the band is cut into subintervals,
// each evaluated in interval arithmetic, and the subinterval with the
// largest bound is bisected until the bound is within 1% of a value
// attained at a point, or bandPieces subintervals are used.
//
// Errors are those of AliasSum.
func FamilyBudget(ctx context.Context, f Family, g Grid, band Band, opt BudgetOptions) (Budget, error) {
	if err := checkAliasArgs(f, g, band.Center, opt.Settings); err != nil {
		return Budget{}, err
	}
	if err := validateEnvelopes(f.Spatial(), f.Spectral()); err != nil {
		return Budget{}, err
	}
	if err := band.Validate("band"); err != nil {
		return Budget{}, err
	}
	if err := opt.validate(); err != nil {
		return Budget{}, err
	}
	if err := ctx.Err(); err != nil {
		return Budget{}, fmt.Errorf("bounds: family budget: %w", err)
	}
	shifts := shiftRange(g, opt.AnyShift)
	fb := familyBudgeter{ctx: ctx, f: f, g: g, shifts: shifts, opt: opt, spat: f.Spatial(), spec: f.Spectral()}
	var b Budget
	var err error
	if band.HalfWidth == 0 {
		b, err = fb.at(band.Interval())
		b.Pieces = fb.pieces
	} else {
		b, err = fb.overBand(band.Interval())
	}
	if err != nil {
		return Budget{}, err
	}
	b.Exact = true
	// The envelope bounds are valid too, and can be tighter where the
	// band's branch and bound stopped early because the other item
	// dominated: keep the smaller of each pair. (At a single frequency
	// nothing stops early, and the envelope bounds are not computed.)
	if band.HalfWidth > 0 {
		if eb, err := EnvelopeBudget(ctx, fb.spat, fb.spec, g, band, opt); err == nil {
			b.Aliasing = math.Min(b.Aliasing, eb.Aliasing)
			b.Truncation = math.Min(b.Truncation, eb.Truncation)
		}
	}
	S := windowSum(fb.spat, g, shifts)
	b.Rounding = roundingBound(g.Count, opt.sampleUlps(), band.Interval().Mag(), maxAbsX(g, shifts), S)
	b.total()
	if !finite(b.Total) {
		return Budget{}, fmt.Errorf("bounds: family budget of %v: %w", f, ErrNotFinite)
	}
	return b, nil
}

type familyBudgeter struct {
	ctx    context.Context
	f      Family
	g      Grid
	shifts Interval
	opt    BudgetOptions
	pieces int
	// The truncation bound in modulus does not depend on the frequency;
	// absTruncation computes it once.
	truncDone   bool
	trunc       float64
	truncPieces int
	// The family's envelopes, fetched once.
	spat, spec Envelope
}

// summer returns a summer for the family with its cached envelopes
// (newSummer fetches them anew).
func (fb *familyBudgeter) summer(g Grid, xi, shift Interval, abs bool, set Settings) *aliasSummer {
	return &aliasSummer{ctx: fb.ctx, f: fb.f, g: g, xi: xi, shift: shift, abs: abs, set: set,
		spec: fb.spec, spat: fb.spat}
}

// at bounds the aliasing and truncation for every frequency in xi (a
// single frequency or a short piece of a band).
func (fb *familyBudgeter) at(xi Interval) (Budget, error) {
	var b Budget
	var err error
	if b.Aliasing, err = fb.aliasing(xi); err != nil {
		return Budget{}, err
	}
	fb.pieces = 1
	if !fb.g.Infinite() {
		if fb.opt.AnyShift || xi.Lo != xi.Hi {
			t, err := fb.absTruncation()
			if err != nil {
				return Budget{}, err
			}
			b.Truncation = t
			fb.pieces = fb.truncPieces
		} else {
			st := fb.summer(fb.g, xi, fb.shifts, false, fb.opt.Settings)
			trunc, _, _, _, err := st.omittedSum(fb.f.Transform(xi).Mag(), truncationCap)
			if err != nil {
				return Budget{}, err
			}
			b.Truncation = trunc.Mag()
		}
	}
	return b, nil
}

// aliasing bounds the aliasing |Σ_{l≠0} F(ξ + lP) e^{i2πls/h}| for every
// frequency in xi and every shift of the range.
func (fb *familyBudgeter) aliasing(xi Interval) (float64, error) {
	anyShift := fb.opt.AnyShift
	s := fb.summer(fb.g, xi, fb.shifts, anyShift, fb.opt.Settings)
	F := fb.f.Transform(xi)
	P := TwoPi.Div(Point(fb.g.Step))
	// A family that bounds whole rays of copies in closed form (the
	// B-splines near the zeros of their transform) bounds the aliasing
	// for every shift at once by Σ_{l≠0} |F(ξ + lP)| (for a fixed shift
	// too: the phases have modulus 1). Where that meets the
	// goal it is the answer; elsewhere it may still beat the sums below.
	ray := math.Inf(1)
	if bl, ok := fb.f.(aliasBlocker); ok && xi.Mag() < P.Lo {
		ray = addUp(bl.aliasRay(xi.Add(P), P), bl.aliasRay(P.Sub(xi), P))
		if ray <= s.goal(0x1p-60*F.Mag()) {
			return ray, nil
		}
	}
	side := fb.opt.Side
	limit := int64(math.MaxInt64)
	if side == AutoSide {
		var L int64
		side, L = s.chooseSide(F, P)
		limit = max(4*L, 64)
	}
	aliasing := 0.0
	if side == SpectralSide {
		alias, _, done, err := s.spectralAlias(P, F, limit)
		switch {
		case err != nil && fb.opt.Side == SpectralSide:
			if finite(ray) {
				return ray, nil // the copies are too many to sum; the ray bound holds
			}
			return 0, err
		case err == nil && done:
			aliasing = alias.Mag()
		default:
			side = SpatialSide // the automatic choice fell short: see AliasSum
		}
	}
	if side == SpatialSide {
		// Spatial side: the error of the infinite grid is T∞ - F, taken at
		// each shift piece.
		pieces := 1
		if anyShift {
			pieces = shiftPieces
		}
		for i := 0; i < pieces; i++ {
			sp := fb.summer(Grid{Step: fb.g.Step}, xi, subinterval(fb.shifts, i, pieces), false, fb.opt.Settings)
			T, _, err := sp.spatialInfinite(F.Mag())
			if err != nil {
				return 0, err
			}
			aliasing = math.Max(aliasing, T.Sub(F).Mag())
		}
	}
	return math.Min(aliasing, ray), nil
}

// truncPieces is the number of subintervals the shift range is cut into
// for the explicit terms of absTruncation.
const truncPieces = 16

// absTruncation bounds the truncation in modulus, sup over the shift range
// of h Σ_{k omitted} |f(s + hk)|, which does not depend on the frequency.
// The m omitted samples nearest the window on each side are summed
// explicitly in interval arithmetic over each of truncPieces subintervals
// of the shift range (the sup of a sum over a piece is at most the sum of
// its terms' sups, and for a tail that decreases away from the window each
// sup sits at the piece's inner end); the samples beyond them are bounded
// once, for the whole range, by the spatial envelope (RayTail). m
// doubles until that remainder meets omittedSum's goal: at most
// max(Settings.Tol, 2⁻⁶⁰ of the explicit sum), the first pair always
// summed unless the remainder is itself within Settings.Tol.
func (fb *familyBudgeter) absTruncation() (float64, error) {
	if fb.truncDone {
		return fb.trunc, nil
	}
	g := fb.g
	h := g.Step
	lo, hi := g.Indices()
	env := fb.spat
	whole := fb.summer(g, Point(0), fb.shifts, true, fb.opt.Settings)
	mid := *whole
	mid.shift = Point(fb.shifts.Mid())
	rem := func(m int64) float64 {
		r := env.RayTail(whole.at(hi+m+1), 1, h)
		l := env.RayTail(whole.at(lo-m-1), -1, h)
		return mulUp(h, addUp(r, l))
	}
	if !summable(env, 1) {
		return 0, invalidf("family", "%v: spatial envelope is not summable; the truncation error is unbounded", fb.f)
	}
	var m int64
	// The whole truncation is bounded by the envelope alone when a float64
	// estimate says that this may be within Settings.Tol.
	r := math.Inf(1)
	x0 := whole.at(hi + 1)
	x1 := whole.at(lo - 1)
	if est := h * (env.RayEstimate(x0.Lo, 1, h) + env.RayEstimate(x1.Hi, -1, h)); est <= 2*fb.opt.Tol || est == 0 {
		r = rem(0)
	}
	pieces := 1
	best := 0.0
	if r > 0 && r > fb.opt.Tol {
		// Leave room in the work limit for the pieces, as omittedSum
		// leaves it for the grid.
		cap := min(int64(truncationCap), (fb.opt.maxTerms()-1)/(2*(truncPieces+1)))
		if c, d, ok := convexTails(fb.f); ok && inConvexTails(c, d, x1, x0) {
			return fb.convexTruncation(whole, rem, cap)
		}
		// A lower bound of the explicit sum, at the middle shift, sets
		// the goal.
		est := 0.0
		for {
			next := max(1, 2*m)
			if next > cap {
				break // the remainder stays as it is: still rigorous
			}
			if err := mid.spend(2*(next-m), "truncation sum"); err != nil {
				return 0, err
			}
			for k := m + 1; k <= next; k++ {
				est = addDown(est, addDown(mid.absTerm(hi+k).Lo, mid.absTerm(lo-k).Lo))
			}
			m = next
			r = rem(m)
			if r <= whole.goal(est) {
				break
			}
		}
		if math.IsInf(r, 1) {
			r = rem(m)
		}
		pieces = truncPieces
		sp := *whole
		for i := 0; i < pieces; i++ {
			sp.shift = subinterval(fb.shifts, i, pieces)
			if err := whole.spend(2*m, "truncation sum"); err != nil {
				return 0, err
			}
			var sum Interval
			for k := int64(1); k <= m; k++ {
				sum = sum.Add(sp.absTerm(hi + k)).Add(sp.absTerm(lo - k))
			}
			best = math.Max(best, sum.Hi)
		}
	}
	fb.trunc = addUp(best, r)
	fb.truncPieces = pieces
	fb.truncDone = true
	return fb.trunc, nil
}

// convexTruncation is absTruncation for omitted samples that lie, for
// every shift, where |f| is convex (convexTails): the explicit part of the
// sum is convex in the shift, so its sup over the shift range is the
// larger of its values at the two ends, each enclosed at a point. The
// samples beyond the m explicit pairs are bounded as in absTruncation,
// once for the whole range, and m doubles until that remainder meets the
// goal, set by the explicit sums at the ends (lower bounds of the sup).
func (fb *familyBudgeter) convexTruncation(whole *aliasSummer, rem func(int64) float64, cap int64) (float64, error) {
	lo, hi := fb.g.Indices()
	ends := [2]aliasSummer{*whole, *whole}
	ends[0].shift = Point(fb.shifts.Lo)
	ends[1].shift = Point(fb.shifts.Hi)
	n := 2
	if fb.shifts.Lo == fb.shifts.Hi {
		n = 1
	}
	var sums [2]Interval
	var m int64
	r := math.Inf(1)
	for {
		next := max(1, 2*m)
		if next > cap {
			break // the remainder stays as it is: still rigorous
		}
		if err := whole.spend(int64(2*n)*(next-m), "truncation sum"); err != nil {
			return 0, err
		}
		for e := 0; e < n; e++ {
			for k := m + 1; k <= next; k++ {
				sums[e] = sums[e].Add(ends[e].absTerm(hi + k)).Add(ends[e].absTerm(lo - k))
			}
		}
		m = next
		r = rem(m)
		if r <= whole.goal(math.Max(sums[0].Lo, sums[n-1].Lo)) {
			break
		}
	}
	if math.IsInf(r, 1) {
		r = rem(m)
	}
	fb.trunc = addUp(math.Max(sums[0].Hi, sums[n-1].Hi), r)
	fb.truncPieces = 1
	fb.truncDone = true
	return fb.trunc, nil
}

// absTerm encloses h·|f(x_k)|, the term of an abs-mode sum, taking the
// modulus of the real part alone when the value is real.
func (s *aliasSummer) absTerm(k int64) Interval {
	v := s.f.Value(s.at(k))
	var a Interval
	if v.Im.Lo == 0 && v.Im.Hi == 0 {
		a = v.Re.Abs()
	} else {
		a = v.Abs()
	}
	return a.Scale(s.g.Step)
}

// overBand takes the sups of aliasing and truncation over the band by
// branch and bound on the frequency.
func (fb *familyBudgeter) overBand(band Interval) (Budget, error) {
	type piece struct {
		xi Interval
		b  Budget
	}
	eval := func(xi Interval) (piece, error) {
		b, err := fb.at(xi)
		return piece{xi, b}, err
	}
	// A lower bound of the sup: the budget at a point is attained up to its
	// own enclosure width.
	lower := 0.0
	point := func(x float64) error {
		b, err := fb.at(Point(x))
		if err != nil {
			return err
		}
		lower = math.Max(lower, b.Aliasing+b.Truncation)
		return nil
	}
	first, err := eval(band)
	if err != nil {
		return Budget{}, err
	}
	if err := point(band.Mid()); err != nil {
		return Budget{}, err
	}
	pieces := []piece{first}
	for len(pieces) < bandPieces {
		if err := fb.ctx.Err(); err != nil {
			return Budget{}, fmt.Errorf("bounds: family budget over a band: %w", err)
		}
		// The piece with the largest bound decides the sup.
		worst := 0
		for i, p := range pieces {
			if p.b.Aliasing+p.b.Truncation > pieces[worst].b.Aliasing+pieces[worst].b.Truncation {
				worst = i
			}
		}
		w := pieces[worst]
		if w.b.Aliasing+w.b.Truncation <= 1.01*lower {
			break
		}
		m := w.xi.Mid()
		l, err := eval(Interval{w.xi.Lo, m})
		if err != nil {
			return Budget{}, err
		}
		r, err := eval(Interval{m, w.xi.Hi})
		if err != nil {
			return Budget{}, err
		}
		if err := point(m); err != nil {
			return Budget{}, err
		}
		pieces[worst] = l
		pieces = append(pieces, r)
	}
	var b Budget
	for _, p := range pieces {
		b.Aliasing = math.Max(b.Aliasing, p.b.Aliasing)
		b.Truncation = math.Max(b.Truncation, p.b.Truncation)
	}
	b.Pieces = len(pieces)
	if fb.opt.AnyShift {
		b.Pieces *= shiftPieces
	}
	return b, nil
}
