package bounds

import (
	"context"
	"errors"
	"fmt"
	"math"
)

// PlanRequest asks for the cheapest one-dimensional grid whose certified
// error is at most Tol (PlanGrid). The function is given either exactly, as
// a Family, or only by its decay, as a pair of envelopes; exactly one of
// the two must be set.
//
// The error is that of the sampled sum
//
//	T = h Σ_{k=lo}^{hi} f(s + hk) e^{-iξ(s+hk)}   against   F(ξ),
//
// computed in double precision, for every frequency ξ of Band (Band{} asks
// for the integral, ξ = 0) and, unless FixedShift is set, for every shift
// (see Plan for the shift convention).
type PlanRequest struct {
	// Family is the function, known exactly; nil for an envelope plan.
	Family Family
	// Spatial and Spectral bound |f| and |F| when Family is nil. The plan
	// then holds for every function within both envelopes.
	Spatial, Spectral Envelope
	// Tol is the tolerance on the absolute error, > 0.
	Tol float64
	// Band is the set of frequencies |ξ - Center| ≤ HalfWidth where the
	// sampled transform must be within Tol; Band{} is the integral.
	Band Band
	// Resolution, if > 0, is the frequency spacing Δξ the sampled transform
	// must resolve: the window must span N·h ≥ 2π/Δξ (the spacing of a
	// discrete Fourier transform of N samples of step h is 2π/(N·h)).
	Resolution float64
	// FixedShift asks for a plan that holds for the one shift Shift instead
	// of every shift: the samples are then exactly Shift + h·k.
	FixedShift bool
	Shift      float64
	// Cost prices the grid and restricts its count (CostModel).
	Cost CostModel
	// SampleUlps is the error of each computed sample f(x_k) in units of the
	// unit roundoff 2⁻⁵³; 0 means 1 (correctly rounded samples).
	SampleUlps float64
	// MaxCount caps the sample count; 0 means DefaultPlanMaxCount. A request
	// that needs more fails with an error wrapping ErrWorkLimit.
	MaxCount int64
	// MaxTerms caps the terms of each interval evaluation (Settings.MaxTerms).
	MaxTerms int64
}

// DefaultPlanMaxCount is the sample limit of a plan when the request sets
// none (2⁴⁰, about 10¹²).
const DefaultPlanMaxCount = 1 << 40

// Plan is a planned grid with its certificate.
//
// Shift convention: the grid is Grid{Step: h, Count: N, Shift: s} with the
// samples s + h·k, k = -⌊(N-1)/2⌋, …, ⌊N/2⌋ (see Grid), so the window
// [first, last] is centred on s for odd N and on s + h/2 for even N. By
// default (any shift) the planner centres the window on the function's
// centre c — the midpoint of the centres of its spatial envelope — by
// taking s = c for odd N and s = c - h/2 for even N, and the certificate
// holds for every shift in [s - h/2, s + h/2]: wherever the samples fall,
// as long as the window's centre stays within h/2 of c. With a fixed shift
// s is the requested shift and the certificate holds for it alone.
type Plan struct {
	Grid Grid
	// Window encloses the first and last sample positions.
	Window Interval
	// Span is N·h; 2π/Span is the frequency spacing of the sampled
	// transform.
	Span float64
	// AnyShift is true when Budget holds for every shift in
	// [Grid.Shift - h/2, Grid.Shift + h/2].
	AnyShift bool
	// Cost is the price of the grid under the request's cost model.
	Cost float64
	// Budget is the certificate: the itemised error bound computed for
	// this grid by FamilyBudget or EnvelopeBudget in interval arithmetic,
	// with Budget.Total ≤ Tol.
	Budget Budget
	// Model is the float64 model's estimate of Budget.Total that the
	// search used.
	Model float64
	// Verifications counts the interval evaluations made (1 unless the
	// first candidate failed its certificate).
	Verifications int
}

// PlanGrid returns the cheapest grid (step, count, shift) whose error
// budget — aliasing + truncation + rounding, certified in interval
// arithmetic — is at most req.Tol over req.Band, by default for every
// shift.
//
// The search runs on a float64 model of the budget (planModel): for each
// count N it finds the step that minimises the modelled total, and it looks
// for the least admissible N whose minimum is within the tolerance. For
// functions of compact support it also tries the steps W/n that make n
// samples span the support W exactly (these make the B-splines' alias sum
// vanish). The chosen grid is then certified with FamilyBudget (exact
// alias and truncation terms) or EnvelopeBudget; if the certificate
// exceeds the tolerance, the next admissible count is tried.
//
// Errors are *ParamError values wrapping ErrInvalid (a bad request),
// ErrInfeasible (a tolerance below what double precision can certify for
// this function; the message gives the smallest certifiable tolerance) or
// ErrWorkLimit (more than MaxCount samples needed; the message gives the
// smallest tolerance within the limit), or the context's error.
func PlanGrid(ctx context.Context, req PlanRequest) (Plan, error) {
	if err := req.validate(""); err != nil {
		return Plan{}, err
	}
	if err := ctx.Err(); err != nil {
		return Plan{}, fmt.Errorf("bounds: plan: %w", err)
	}
	p := newPlanner1(ctx, req)
	return p.plan()
}

func (r PlanRequest) validate(path string) error {
	if math.IsNaN(r.Tol) || math.IsInf(r.Tol, 0) || r.Tol <= 0 {
		return invalidf(path+"tol", "must be finite and > 0, got %g", r.Tol)
	}
	if r.Family != nil {
		if len(r.Spatial) > 0 || len(r.Spectral) > 0 {
			return invalidf(path+"family", "give a family or envelopes, not both")
		}
		if err := Validate(r.Family); err != nil {
			return err
		}
	} else {
		if len(r.Spatial) == 0 {
			return invalidf(path+"spatial", "missing: give a family or a spatial envelope")
		}
		if len(r.Spectral) == 0 {
			return invalidf(path+"spectral", "missing: give a family or a spectral envelope")
		}
		if err := r.Spatial.Validate(path + "spatial"); err != nil {
			return err
		}
		if err := r.Spectral.Validate(path + "spectral"); err != nil {
			return err
		}
	}
	spatial, spectral := r.envelopes()
	for i, t := range spatial {
		if t.Decay == Algebraic && t.Power <= 1 {
			return invalidf(fmt.Sprintf("%sspatial[%d].power", path, i), "the truncation error is unbounded for algebraic decay of power %g ≤ 1", t.Power)
		}
	}
	for i, t := range spectral {
		if t.Decay == Algebraic && t.Power <= 1 {
			return invalidf(fmt.Sprintf("%sspectral[%d].power", path, i), "the aliasing error is unbounded for algebraic decay of power %g ≤ 1", t.Power)
		}
	}
	if err := r.Band.Validate(path + "band"); err != nil {
		return err
	}
	if !finite(r.Resolution) || r.Resolution < 0 {
		return invalidf(path+"resolution", "must be finite and ≥ 0, got %g", r.Resolution)
	}
	if !finite(r.Shift) {
		return invalidf(path+"shift", "must be finite, got %g", r.Shift)
	}
	if err := r.Cost.Validate(path + "cost"); err != nil {
		return err
	}
	if !finite(r.SampleUlps) || r.SampleUlps < 0 {
		return invalidf(path+"sample_ulps", "must be finite and ≥ 0, got %g", r.SampleUlps)
	}
	if r.MaxCount < 0 || r.MaxCount > MaxCount {
		return invalidf(path+"max_count", "must be between 0 (default) and 2^53, got %d", r.MaxCount)
	}
	if r.MaxTerms < 0 {
		return invalidf(path+"max_terms", "must be ≥ 0, got %d", r.MaxTerms)
	}
	return nil
}

// envelopes returns the spatial and spectral envelopes the plan uses.
func (r PlanRequest) envelopes() (Envelope, Envelope) {
	if r.Family != nil {
		return r.Family.Spatial(), r.Family.Spectral()
	}
	return r.Spatial, r.Spectral
}

func (r PlanRequest) maxCount() int64 {
	if r.MaxCount == 0 {
		return DefaultPlanMaxCount
	}
	return r.MaxCount
}

func (r PlanRequest) sampleUlps() float64 {
	if r.SampleUlps == 0 {
		return 1
	}
	return r.SampleUlps
}

// planner1 holds the state of one 1-D planning run.
type planner1 struct {
	ctx context.Context
	req PlanRequest
	m   planModel
	tol float64
	// hMax is the largest step whose modelled aliasing alone is within
	// the tolerance (0 before it is known).
	hMax float64
	// hint is the best step found so far, a starting point for the next
	// minimisation.
	hint float64
	// evals counts model evaluations.
	evals int
	// memo holds the model totals computed by minTotal: searches for
	// neighbouring counts and the second search after a certificate
	// that fell short revisit the same steps.
	memo []modelValue
}

// modelValue is a memo entry of the model: its unweighted parts and what
// they depend on besides the planModel's fixed fields.
type modelValue struct {
	h, remGoal float64
	n          int64
	// alias, trunc and round are the model's unweighted aliasing (which
	// depends on the step alone), truncation and rounding (0 when the
	// model leaves it out).
	alias, trunc, round float64
}

// modelTotal is a model total with its weighted aliasing and truncation.
type modelTotal struct{ a, t, v float64 }

// memoSize bounds the model totals a planner keeps.
const memoSize = 256

// cachedTotal returns p.m.total(h, n), from the memo when it was computed
// before under the same remainder goal.
func (p *planner1) cachedTotal(h float64, n int64) float64 {
	return p.modelParts(h, n).v
}

// modelParts returns the model at (h, n) under the current weights, from
// the memo when its parts were computed before. The aliasing of a step is
// computed once for every count.
func (p *planner1) modelParts(h float64, n int64) modelTotal {
	m := &p.m
	var same *modelValue // an entry of the same step, for its aliasing
	for i := len(p.memo) - 1; i >= 0; i-- {
		e := &p.memo[i]
		if e.h != h || e.remGoal != m.remGoal {
			continue
		}
		if e.n != n {
			if same == nil {
				same = e
			}
			continue
		}
		a, t, v := m.weighParts(e.alias, e.trunc, e.round)
		return modelTotal{a, t, v}
	}
	p.evals++
	var alias float64
	if same != nil {
		alias = same.alias
	} else {
		alias = m.alias(h)
	}
	trunc := m.trunc(h, n)
	round := 0.0
	if !m.noRound {
		round = m.rounding(h, n)
	}
	if len(p.memo) >= memoSize {
		p.memo = p.memo[:copy(p.memo, p.memo[memoSize/2:])]
	}
	p.memo = append(p.memo, modelValue{h: h, remGoal: m.remGoal, n: n, alias: alias, trunc: trunc, round: round})
	a, t, v := m.weighParts(alias, trunc, round)
	return modelTotal{a, t, v}
}

// cannotReach reports whether the modelled total of n samples stays above
// enough for every step in [lo, hi], given steps lo ≤ x ≤ hi already
// evaluated (lo = 0 for no lower limit): the aliasing grows with the step
// and the truncation falls with it (the window widens), so the total is at
// least the aliasing at lo plus the truncation at x on [lo, x], and the
// aliasing at x plus the truncation at hi on [x, hi]. The aliasing grows
// with the step only in modulus (any shift, or a band) and for transforms
// that decrease away from their centre beyond the nearest copy (steady);
// the comparison keeps a margin of 1/16 for tails that are not monotone.
func (p *planner1) cannotReach(n int64, lo, x, hi, enough float64) bool {
	if enough <= 0 || !p.m.steady || 2*math.Pi/hi <= p.m.xiMag+p.m.steadyAbove {
		return false
	}
	a := 0.0 // the aliasing vanishes as the step does
	if lo > 0 {
		a = p.modelParts(lo, n).a
	}
	mid := p.modelParts(x, n)
	t := p.modelParts(hi, n).t
	return math.Min(a+mid.t, mid.a+t) > enough*(1+1.0/16)
}

// finalMargin is the share of the tolerance the model must meet at the
// step chosen for the certificate: the interval evaluation exceeds the
// model by the remainders it leaves (up to verifyFraction of the
// tolerance each) and a few parts in 10⁵.
const finalMargin = 1 - 0x1p-8

// verifyFraction is the share of the tolerance below which the interval
// evaluation may leave the remainders of its infinite sums as bounds
// (Settings.Tol of the certificate).
const verifyFraction = 0x1p-10

func newPlanner1(ctx context.Context, req PlanRequest) *planner1 {
	spatial, spectral := req.envelopes()
	m := planModel{
		spatial:  spatial,
		spectral: spectral,
		center:   envelopeCenter(spatial),
		anyShift: !req.FixedShift,
		shift:    req.Shift,
		ulps:     req.sampleUlps(),
		remGoal:  req.Tol * verifyFraction,
		wide:     req.Band.HalfWidth > 0,
	}
	if req.Family != nil {
		m.val, m.absTr, m.tr = pointEvaluators(req.Family)
		m.rayVal, m.rayTr = pointRays(req.Family)
		m.blockTr, m.blockRay = pointBlock(req.Family)
		m.convexC, m.convexD, m.convex = convexTails(req.Family)
		switch req.Family.(type) {
		case GaussianFamily, ExponentialFamily, LorentzianFamily, SechFamily, SechSquaredFamily, BSplineFamily:
			// Even about 0, where their envelopes are centred, and
			// decreasing in |x|.
			m.monotone, m.even = true, m.center == 0
		case WavePacketFamily, FejerFamily:
			// Even about 0, where their envelopes are centred; |f|
			// oscillates.
			m.even = m.center == 0
		}
	}
	// Aliasing in modulus that grows with the step: copies of a transform
	// that decreases away from its centre (a wave packet's two bumps once
	// the copies start beyond them: see cannotReach), or of an envelope.
	if m.anyShift || req.Band.HalfWidth > 0 {
		switch f := req.Family.(type) {
		case nil, GaussianFamily, ExponentialFamily, LorentzianFamily, SechFamily, SechSquaredFamily, FejerFamily:
			m.steady = true
		case WavePacketFamily:
			m.steadyAbove = math.Abs(f.Omega0)
			m.steady = true
		}
	}
	b := req.Band
	m.xiMag = b.Interval().Mag()
	if b.HalfWidth == 0 {
		m.xis = []float64{b.Center}
	} else {
		w := b.HalfWidth
		m.xis = []float64{b.Center - w, b.Center - w/2, b.Center, b.Center + w/2, b.Center + w}
	}
	return &planner1{ctx: ctx, req: req, m: m, tol: req.Tol, memo: make([]modelValue, 0, memoStart)}
}

// memoStart is the memo capacity a planner starts with: a 1-D plan
// typically evaluates the model a few dozen times.
const memoStart = 16

// hRes is the least step that N samples may have under the resolution
// requirement N·h ≥ 2π/Δξ.
func (p *planner1) hRes(n int64) float64 {
	if p.req.Resolution <= 0 {
		return 0
	}
	span := 2 * math.Pi / p.req.Resolution
	h := span / float64(n)
	for float64(n)*h < span {
		h = nextUp(h)
	}
	return h
}

// stepForAlias returns about the largest step h whose modelled aliasing is
// at most eps, by bracketing and bisection on log h. It returns +Inf when
// the aliasing stays below eps for every step tried (a function so small
// that any grid aliases within eps).
func (p *planner1) stepForAlias(eps, rel float64) float64 {
	spec := p.m.spectral
	omega := envReach(spec, 0, eps/4) + p.m.xiMag
	h := 1.0
	if omega > 0 && finite(omega) {
		h = 2 * math.Pi / omega
	}
	// The bracket's ends and their aliasing, kept for the first step of
	// the regula falsi.
	lo, hi := 0.0, 0.0
	var alo, ahi float64
	if a := p.m.weightedAlias(h); a <= eps {
		lo, alo = h, a
		for i := 0; ; i++ {
			h *= 2
			if i > 60 {
				return math.Inf(1)
			}
			a := p.m.weightedAlias(h)
			if a > eps {
				hi, ahi = h, a
				break
			}
			lo, alo = h, a
		}
	} else {
		hi, ahi = h, a
		for i := 0; ; i++ {
			h /= 2
			if i > 200 {
				return 0
			}
			a := p.m.weightedAlias(h)
			if a <= eps {
				lo, alo = h, a
				break
			}
			hi, ahi = h, a
		}
	}
	// Regula falsi with the Illinois modification on log(alias) against
	// log h, falling back to bisection where the aliasing vanishes.
	le := math.Log(eps)
	g := func(h float64) float64 { return math.Log(p.m.weightedAlias(h)) - le }
	glo, ghi := math.Log(alo)-le, math.Log(ahi)-le
	side := 0
	for hi/lo > 1+rel {
		ulo, uhi := math.Log(lo), math.Log(hi)
		u := 0.5 * (ulo + uhi)
		if finite(glo) && finite(ghi) && ghi > glo {
			u = ulo - glo*(uhi-ulo)/(ghi-glo)
			// Keep the trial well inside the bracket.
			w := uhi - ulo
			u = math.Min(math.Max(u, ulo+w*1e-3), uhi-w*1e-3)
		}
		mid := math.Exp(u)
		gm := g(mid)
		if gm <= 0 {
			lo, glo = mid, gm
			if side == -1 {
				ghi /= 2
			}
			side = -1
		} else {
			hi, ghi = mid, gm
			if side == 1 {
				glo /= 2
			}
			side = 1
		}
	}
	return lo
}

// minTotal minimises the modelled total over the step for N samples,
// returning as soon as a step with total ≤ enough is found (enough = 0
// asks for the minimum). It returns the step and the total (+Inf if no
// admissible step exists).
func (p *planner1) minTotal(n int64, enough float64) (float64, float64) {
	hHi := p.hMax
	hLo := p.hRes(n)
	if hLo > hHi {
		return hLo, math.Inf(1)
	}
	f := func(h float64) float64 { return p.cachedTotal(h, n) }
	const ratio = 1.02
	if hHi <= hLo*ratio {
		// A sliver of admissible steps: its ends decide.
		fl, fh := f(hLo), f(hHi)
		if fl < fh {
			return hLo, fl
		}
		return hHi, fh
	}
	// Start from the hint, clipped into [hLo, hHi].
	h0 := p.hint
	if h0 <= 0 || h0 > hHi {
		h0 = hHi
	}
	h0 = math.Max(h0, hLo)
	f0 := f(h0)
	if f0 <= enough {
		return h0, f0
	}
	if enough > 0 && p.m.steady {
		// The truncation at the largest step bounds the total below.
		if fh := f(hHi); fh <= enough || p.cannotReach(n, hLo, hHi, hHi, enough) {
			if fh <= enough {
				return hHi, fh
			}
			return hHi, math.Min(fh, f0)
		}
	}
	// Bracket a minimum on log h by walking downhill with growing steps.
	a, fa := h0, f0
	b := h0 * ratio
	if b > hHi {
		b = h0 / ratio
	}
	fb := f(b)
	if fb > fa {
		// Walk the other way.
		a, b = b, a
		fa, fb = fb, fa
	}
	// Now fb ≤ fa; continue from b away from a.
	up := b > a
	step := ratio
	for i := 0; i < 200; i++ {
		if fb <= enough {
			return b, fb
		}
		var c float64
		if up {
			c = math.Min(b*step, hHi)
		} else {
			c = math.Max(b/step, hLo)
		}
		if c == b {
			// b is an end of the admissible steps and f falls towards
			// it: the minimum lies between a and b.
			return p.towardEnd(f, n, a, b, fb, enough)
		}
		fc := f(c)
		if fc >= fb {
			return p.brent(f, n, a, b, c, fb, enough)
		}
		a, fa = b, fb
		b, fb = c, fc
		step = math.Min(step*step, 4)
	}
	return b, fb
}

// towardEnd finds the minimum of f between an inner point a and an end b
// of the admissible steps with f(b) ≤ f(a): it halves the gap (in log h)
// until a point below f(b) brackets an inner minimum, or the gap closes
// on the end.
func (p *planner1) towardEnd(f func(float64) float64, n int64, a, b, fb, enough float64) (float64, float64) {
	for i := 0; i < 60 && math.Abs(math.Log(b/a)) > 1e-7; i++ {
		m := math.Sqrt(a * b)
		fm := f(m)
		if fm <= enough {
			return m, fm
		}
		if fm < fb {
			return p.brent(f, n, a, m, b, fm, enough)
		}
		// A feasibility question is settled when the values keep rising
		// away from an end that already misses the target.
		if enough > 0 && fb > enough && i >= 2 {
			break
		}
		a = m
	}
	return b, fb
}

// brent minimises f on the bracket (a, b, c), f(b) ≤ f(a), f(c), in log
// coordinates by golden-section steps with parabolic interpolation (Brent,
// Algorithms for Minimization without Derivatives, 1973, Ch. 5, from
// memory), to a relative step tolerance of 1e-6.
func (p *planner1) brent(f func(float64) float64, n int64, a, b, c, fb float64, enough float64) (float64, float64) {
	const cgold = 0.3819660112501051
	// The steps of the bracket's ends and of x, as evaluated.
	loH, hiH, xh := math.Min(a, c), math.Max(a, c), b
	lo, hi := math.Log(loH), math.Log(hiH)
	x := math.Log(b)
	w, v := x, x
	fx := fb
	fw, fv := fx, fx
	var d, e float64
	for it := 0; it < 60; it++ {
		if fx <= enough || p.cannotReach(n, loH, xh, hiH, enough) {
			break
		}
		// A feasibility question (enough > 0) is settled once the
		// bracket is narrow and the least value well above the target.
		if enough > 0 && fx > 2*enough && hi-lo < 1e-3 {
			break
		}
		m := 0.5 * (lo + hi)
		tol1 := 1e-6 + 1e-9*math.Abs(x)
		if math.Abs(x-m) <= 2*tol1-0.5*(hi-lo) {
			break
		}
		golden := true
		if math.Abs(e) > tol1 {
			r := (x - w) * (fx - fv)
			q := (x - v) * (fx - fw)
			pp := (x-v)*q - (x-w)*r
			q = 2 * (q - r)
			if q > 0 {
				pp = -pp
			}
			q = math.Abs(q)
			etemp := e
			e = d
			if math.Abs(pp) < math.Abs(0.5*q*etemp) && pp > q*(lo-x) && pp < q*(hi-x) {
				d = pp / q
				u := x + d
				if u-lo < 2*tol1 || hi-u < 2*tol1 {
					d = math.Copysign(tol1, m-x)
				}
				golden = false
			}
		}
		if golden {
			if x >= m {
				e = lo - x
			} else {
				e = hi - x
			}
			d = cgold * e
		}
		u := x + d
		if math.Abs(d) < tol1 {
			u = x + math.Copysign(tol1, d)
		}
		uh := math.Exp(u)
		fu := f(uh)
		if fu <= fx {
			if u >= x {
				lo, loH = x, xh
			} else {
				hi, hiH = x, xh
			}
			v, fv = w, fw
			w, fw = x, fx
			x, fx, xh = u, fu, uh
		} else {
			if u < x {
				lo, loH = u, uh
			} else {
				hi, hiH = u, uh
			}
			if fu <= fw || w == x {
				v, fv = w, fw
				w, fw = u, fu
			} else if fu <= fv || v == x || v == w {
				v, fv = u, fu
			}
		}
	}
	return math.Exp(x), fx
}

// feasible reports whether N admissible samples can meet the tolerance in
// the model, returning the step found and the modelled total (the
// minimum over steps when infeasible).
func (p *planner1) feasible(n int64) (bool, float64, float64) {
	h, v := p.minTotal(n, p.tol)
	if v <= p.tol {
		p.hint = h
		return true, h, v
	}
	return false, h, v
}

// searchCount finds the least admissible count up to limit that the model
// deems feasible. It returns the count, or 0 with the least modelled total seen
// and the count where it was seen when the tolerance is out of reach.
func (p *planner1) searchCount(limit int64) (n int64, floor float64, floorAt int64, err error) {
	// A first guess from the aliasing-limited step and the spatial reach.
	// A step a little below the aliasing limit, where the optimum usually
	// lies.
	h1 := 0.97 * p.hMax
	if h1 <= 0 {
		return 0, math.Inf(1), 0, nil
	}
	p.hint = h1
	reach := envReach(p.m.spatial, p.m.center, p.tol*h1/8)
	guess := int64(1)
	if g := 2 * reach / h1; g > 1 && g < float64(limit) {
		guess = int64(math.Ceil(g))
	} else if g >= float64(limit) {
		guess = limit
	}
	if r := p.hRes(1); r > 0 {
		// N ≥ 2π/(Δξ·h) with h ≤ hMax.
		if g := 2 * math.Pi / (p.req.Resolution * p.hMax); g > float64(guess) && g < float64(limit) {
			guess = int64(math.Ceil(g))
		}
	}
	return p.searchFrom(guess, 0, limit)
}

// searchFrom finds the least admissible count in [least, limit] that the
// model deems feasible, galloping from the count guess (the next admissible
// one) and then bisecting; least = 0 means no lower limit. It returns as
// searchCount does.
func (p *planner1) searchFrom(guess, least, limit int64) (n int64, floor float64, floorAt int64, err error) {
	cost := p.req.Cost
	floor = math.Inf(1)
	// The two largest infeasible counts seen and their least modelled
	// totals, for the interpolation of the bisection.
	var miss [2]countTotal
	note := func(n int64, v float64) {
		if v < floor {
			floor, floorAt = v, n
		}
		if v > p.tol && finite(v) && n > miss[1].n {
			miss[0], miss[1] = miss[1], countTotal{n, v}
		}
	}
	// Gallop: find lo infeasible, hi feasible.
	lo, hi := int64(0), int64(0)
	cur := cost.Next(guess)
	if cur == 0 || cur > limit {
		cur = cost.Prev(limit)
	}
	ok, _, v := p.feasible(cur)
	note(cur, v)
	if ok {
		hi = cur
		if hi <= least {
			return hi, floor, floorAt, nil
		}
		d := max(hi/8, 1)
		for {
			if err := p.ctx.Err(); err != nil {
				return 0, 0, 0, fmt.Errorf("bounds: plan: %w", err)
			}
			c := cost.Prev(hi - d)
			if c < max(least, 1) {
				lo = max(least-1, 0)
				break
			}
			ok, _, v := p.feasible(c)
			note(c, v)
			if !ok {
				lo = c
				break
			}
			hi = c
			d *= 2
		}
	} else {
		lo = cur
		prevV := v
		d := max(lo/8, 1)
		for {
			if err := p.ctx.Err(); err != nil {
				return 0, 0, 0, fmt.Errorf("bounds: plan: %w", err)
			}
			if lo >= limit {
				return 0, floor, floorAt, nil
			}
			// The modelled rounding grows with the count and bounds every
			// total below: once it reaches the least total seen, no larger
			// count is feasible or lowers that least total.
			if p.roundingFloor(lo) >= floor {
				return 0, floor, floorAt, nil
			}
			c := cost.Next(min(lo+d, limit))
			if c == 0 || c > limit {
				c = cost.Prev(limit)
				if c <= lo {
					return 0, floor, floorAt, nil
				}
			}
			ok, _, v := p.feasible(c)
			note(c, v)
			if ok {
				hi = c
				break
			}
			// Rounding grows with N: once the modelled minimum stops
			// falling, more samples cannot help.
			if v >= prevV && d >= 4*max(lo, 1) {
				return 0, floor, floorAt, nil
			}
			prevV = math.Min(prevV, v)
			lo = c
			d *= 2
		}
	}
	// Bisect between lo (infeasible or 0) and hi (feasible). Where the
	// least total falls steadily with the count — tails that decrease away
	// from the centre, taken over every shift — split where the least
	// totals of the two largest infeasible counts, joined on log-log axes,
	// reach the tolerance (regula falsi; a plain halving after two such
	// splits in a row that only lowered hi). Elsewhere (a fixed shift, an
	// oscillating tail) the feasible counts need not form a half-line, and
	// plain halving keeps the counts it visits those of earlier versions.
	interpolate := p.m.monotone && p.m.anyShift
	highSplits := 0
	for {
		if err := p.ctx.Err(); err != nil {
			return 0, 0, 0, fmt.Errorf("bounds: plan: %w", err)
		}
		mid := cost.Next(lo + (hi-lo)/2)
		split := false
		if interpolate && highSplits < 2 && miss[0].n > 0 && miss[1].n == lo {
			if est, ok := crossing(miss[0], miss[1], p.tol); ok {
				g := int64(math.Min(math.Ceil(est), float64(hi-1)))
				mid, split = cost.Next(max(g, lo+1)), true
			}
		}
		if mid <= lo {
			mid = cost.Next(lo + 1)
		}
		if mid >= hi {
			if split {
				// The split fell on hi: take the count below it.
				mid = cost.Prev(hi - 1)
			}
			if mid <= lo || mid >= hi {
				return hi, floor, floorAt, nil
			}
		}
		ok, _, v := p.feasible(mid)
		note(mid, v)
		switch {
		case ok && split:
			hi = mid
			highSplits++
		case ok:
			hi = mid
			highSplits = 0
		default:
			lo = mid
			highSplits = 0
		}
	}
}

// countTotal is a count with its least modelled total.
type countTotal struct {
	n int64
	v float64
}

// crossing returns where the line through a and b (a.n < b.n, a.v > b.v >
// tol) on log-log axes reaches tol.
func crossing(a, b countTotal, tol float64) (float64, bool) {
	if !(a.n < b.n && a.v > b.v && b.v > tol) {
		return 0, false
	}
	x0, x1 := math.Log(float64(a.n)), math.Log(float64(b.n))
	y0, y1, yt := math.Log(a.v), math.Log(b.v), math.Log(tol)
	x := x1 + (yt-y1)*(x1-x0)/(y1-y0)
	if !finite(x) || x > 60 {
		return 0, false
	}
	return math.Exp(x), true
}

// roundingFloor returns a lower bound of the modelled rounding of more than
// n samples at any step, 0 when the model leaves the rounding out: the
// factor of the window-sum bound grows with the count, and the window-sum
// bound of each envelope term is at least its integral (latticeTermSumFloat;
// the margin covers the roundings of that comparison).
func (p *planner1) roundingFloor(n int64) float64 {
	if p.m.noRound {
		return 0
	}
	const u = unitRoundoff
	nu := float64(n+3) * u
	rel := nu/(1-nu) + p.m.ulps*u
	s := 0.0
	for _, t := range p.m.spatial {
		s += termIntegral(t)
	}
	if !finite(s) {
		return 0
	}
	return rel * s * (1 - 0x1p-20)
}

// compactCandidates tries, for a family of compact support of width W,
// the counts below best with the steps h = W/n at which n intervals span
// the support (slightly above, so that no sample of the support is
// omitted for any shift). By default the count is n; with a fixed shift
// the samples s + h·k do not sit where a window centred on the support
// would put them, so the counts n + 1 and n + 2 at the same step are tried
// as well. It returns the least feasible count and its step, or 0.
func (p *planner1) compactCandidates(best int64) (int64, float64) {
	W := p.compactWidth()
	if W == 0 {
		return 0, 0
	}
	extra := int64(0)
	if !p.m.anyShift {
		extra = 2
	}
	limit := min(best-1, compactCounts)
	for c := int64(1); c <= limit; c++ {
		if !p.req.Cost.Admissible(c) {
			continue
		}
		for n := c; n >= max(1, c-extra); n-- {
			if h, ok := p.compactFits(W/float64(n), c); ok {
				return c, h
			}
		}
	}
	return 0, 0
}

// compactFits reports whether c samples at a step at or just above h meet
// the tolerance in the model, and at which step.
func (p *planner1) compactFits(h float64, c int64) (float64, bool) {
	if h < p.hRes(c) {
		return 0, false
	}
	for _, hh := range [...]float64{h, h * (1 + 0x1p-40), h * (1 + 0x1p-20)} {
		p.evals++
		rest := p.m.trunc(hh, c) * weight(p.m.wT)
		if !p.m.noRound {
			rest += p.m.rounding(hh, c)
		}
		if rest > p.tol {
			continue
		}
		p.m.capped = 0
		p.m.stopAbove = (p.tol - rest) / weight(p.m.wA)
		a := p.m.weightedAlias(hh)
		p.m.stopAbove = 0
		if a+rest <= p.tol {
			return hh, true
		}
		// The alias sums of such families may vanish at these steps
		// (the B-splines' partition of unity); then only the
		// envelope's remainder after the copies summed bounds them,
		// and more copies may bring it within the tolerance.
		if p.m.capped == 0 || a-p.m.capped*weight(p.m.wA) > p.tol/2 {
			continue
		}
		p.m.aliasCap = compactAliasTerms
		a = p.m.weightedAlias(hh)
		p.m.aliasCap = 0
		if a+rest <= p.tol {
			return hh, true
		}
	}
	return 0, false
}

// compactWidth returns the width W of the smallest window centred on the
// centre that holds a family's compact support, or 0 if the family is not
// known to have compact support.
func (p *planner1) compactWidth() float64 {
	if p.m.val == nil {
		return 0
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, t := range p.m.spatial {
		if t.Decay != Compact {
			return 0
		}
		lo = math.Min(lo, t.Center-t.Plateau-t.Width)
		hi = math.Max(hi, t.Center+t.Plateau+t.Width)
	}
	W := 2 * math.Max(hi-p.m.center, p.m.center-lo)
	if !(W > 0) || !finite(W) {
		return 0
	}
	return W
}

// compactCounts is the largest count tried by compactCandidates.
const compactCounts = 1024

// compactAliasTerms caps the alias copies the model sums at the steps
// that span a compact support exactly.
const compactAliasTerms = 1 << 14

func (p *planner1) plan() (Plan, error) {
	limit := p.req.maxCount()
	p.hMax = p.stepForAlias(p.tol, 1e-5)
	if p.hMax <= 0 {
		return Plan{}, p.infeasible(math.Inf(1), 0)
	}
	if math.IsInf(p.hMax, 1) {
		// Aliasing never matters: bound the step by the spatial extent.
		p.hMax = math.Max(2*envReach(p.m.spatial, p.m.center, p.tol*verifyFraction), math.SmallestNonzeroFloat64)
		if p.req.Resolution > 0 {
			p.hMax = math.Max(p.hMax, 2*math.Pi/p.req.Resolution)
		}
	}
	// For compact support, the steps that span the support exactly come
	// first: the search then only looks for fewer samples.
	verifications := 0
	var compact Plan
	searchLimit := limit
	if cn, ch := p.compactCandidates(min(limit, compactCounts) + 1); cn > 0 {
		plan, err := p.certify(ch, cn, compactAliasTerms)
		verifications++
		switch {
		case err == nil && plan.Budget.Total <= p.tol:
			compact = plan
			searchLimit = p.req.Cost.Prev(cn - 1)
		case err != nil && !errors.Is(err, ErrWorkLimit):
			return Plan{}, err
		}
	}
	var n, floorAt int64
	floor := math.Inf(1)
	if searchLimit >= 1 {
		var err error
		n, floor, floorAt, err = p.searchCount(searchLimit)
		if err != nil {
			return Plan{}, err
		}
	}
	if n == 0 && compact.Grid.Count > 0 {
		compact.Verifications = verifications
		return compact, nil
	}
	if n == 0 {
		return Plan{}, p.infeasible(floor, floorAt)
	}
	h, _ := p.minTotal(n, p.tol*finalMargin)
	// Certify. If the certificate exceeds the tolerance, the model was
	// optimistic by the ratio certificate/model: search again for the
	// tolerance divided by that ratio.
	var last Budget
	tol := p.tol
	defer func() { p.tol = tol }()
	for try := 0; try < 4; try++ {
		if compact.Grid.Count > 0 && n >= compact.Grid.Count {
			break
		}
		plan, err := p.certify(h, n, 0)
		verifications++
		if err != nil {
			return Plan{}, err
		}
		if plan.Budget.Total <= tol {
			plan.Verifications = verifications
			return plan, nil
		}
		last = plan.Budget
		ratio := plan.Budget.Total / plan.Model
		if !(ratio > 1) || math.IsInf(ratio, 1) {
			ratio = 1 + 0x1p-8
		}
		p.tol = math.Min(p.tol, tol/ratio) * finalMargin
		p.hint = h
		var next int64
		if p.m.monotone && p.m.anyShift {
			// The least total falls steadily with the count (see
			// searchFrom) and the tolerance only fell: the least feasible
			// count is at least n.
			p.hint = 0.97 * p.hMax
			next, _, _, err = p.searchFrom(n, n, limit)
		} else {
			next, _, _, err = p.searchCount(limit)
		}
		if err != nil {
			return Plan{}, err
		}
		if next == 0 {
			break
		}
		n = max(n, next)
		h, _ = p.minTotal(n, p.tol*finalMargin)
	}
	p.tol = tol
	if compact.Grid.Count > 0 {
		compact.Verifications = verifications
		return compact, nil
	}
	return Plan{}, &ParamError{Param: "tol", Err: ErrInfeasible,
		Reason: fmt.Sprintf("the certified error of the best grid found stays above the tolerance %.3g (last certified total %.3g after %d tries); a tolerance of about %.1g is certifiable",
			p.tol, last.Total, verifications, 2*last.Total)}
}

// certify evaluates the budget of the grid in interval arithmetic. The
// model is evaluated first, with the alias term cap aliasCap, so that the
// interval evaluation may leave the same remainders as the model did.
func (p *planner1) certify(h float64, n int64, aliasCap int) (Plan, error) {
	g := Grid{Step: h, Count: n, Shift: p.m.gridShift(h, n)}
	p.m.capped = 0
	p.m.aliasCap = aliasCap
	model := p.m.total(h, n)
	p.m.aliasCap = 0
	remGoal := math.Max(p.tol*verifyFraction, p.m.capped)
	opt := BudgetOptions{
		AnyShift:   !p.req.FixedShift,
		SampleUlps: p.req.SampleUlps,
		Settings:   Settings{Tol: remGoal, MaxTerms: p.req.MaxTerms},
	}
	var b Budget
	var err error
	if p.req.Family != nil {
		opt.Side = SpectralSide
		b, err = FamilyBudget(p.ctx, p.req.Family, g, p.req.Band, opt)
	} else {
		b, err = EnvelopeBudget(p.ctx, p.req.Spatial, p.req.Spectral, g, p.req.Band, opt)
	}
	if err != nil {
		return Plan{}, fmt.Errorf("bounds: certifying a grid of %d samples: %w", n, err)
	}
	return Plan{
		Grid:     g,
		Window:   g.Window(),
		Span:     mulUp(float64(n), h),
		AnyShift: !p.req.FixedShift,
		Cost:     p.req.Cost.Cost(float64(n)),
		Budget:   b,
		Model:    model,
	}, nil
}

// infeasible builds the error for a tolerance out of reach.
func (p *planner1) infeasible(floor float64, at int64) error {
	limit := p.req.maxCount()
	if math.IsInf(floor, 1) || math.IsNaN(floor) {
		return &ParamError{Param: "tol", Err: ErrInfeasible,
			Reason: fmt.Sprintf("no grid reaches the tolerance %.3g: the modelled error does not fall below it for any step", p.tol)}
	}
	if at >= p.req.Cost.Prev(limit) {
		return &ParamError{Param: "max_count", Err: ErrWorkLimit,
			Reason: fmt.Sprintf("the tolerance %.3g needs more than %d samples; with %d samples about %.2g is achievable", p.tol, limit, at, floor)}
	}
	return &ParamError{Param: "tol", Err: ErrInfeasible,
		Reason: fmt.Sprintf("the tolerance %.3g is below what double precision can certify for this request: the smallest certifiable tolerance is about %.2g (with %d samples; rounding grows with the count)", p.tol, floor, at)}
}

// isPlanInfeasible reports whether err says the tolerance is out of reach.
func isPlanInfeasible(err error) bool {
	return errors.Is(err, ErrInfeasible) || errors.Is(err, ErrWorkLimit)
}
