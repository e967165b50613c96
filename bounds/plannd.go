package bounds

import (
	"context"
	"fmt"
	"math"
	"reflect"
	"sort"
)

// AxisRequest is one axis of a rectangular n-dimensional plan: the factor
// f_j of a separable function f(x) = Π_j f_j(x_j), given exactly or by
// envelopes, with the axis's band, resolution and shift (see
// PlanRequest).
//
// With envelopes, the plan holds for every function — separable or not —
// with |f(x)| ≤ Π_j spatial_j(x_j) and |F(ξ)| ≤ Π_j spectral_j(ξ_j).
type AxisRequest struct {
	Family            Family
	Spatial, Spectral Envelope
	Band              Band
	Resolution        float64
	FixedShift        bool
	Shift             float64
}

// PlanNDRequest asks for the cheapest rectangular grid in n = len(Axes)
// dimensions (1 ≤ n ≤ MaxDim) whose certified error is at most Tol
// (PlanGridND).
type PlanNDRequest struct {
	Axes []AxisRequest
	Tol  float64
	// Cost prices the whole grid (its product of counts) and restricts
	// each axis's count.
	Cost       CostModel
	SampleUlps float64
	// MaxCount caps the total sample count (the product); 0 means
	// DefaultPlanMaxCount.
	MaxCount int64
	MaxTerms int64
}

// PlanND is a planned rectangular grid with its certificate.
type PlanND struct {
	// Axes holds each axis's grid with the one-dimensional certificate of
	// its factor (Budget.Rounding there is that of the axis alone; the
	// grid's rounding is in Budget below).
	Axes []Plan
	// Count is the total number of samples, the product of the axes'
	// counts.
	Count int64
	// Cost is the price of the grid under the request's cost model.
	Cost float64
	// Budget is the certificate of the whole grid, composed from the
	// axes' certificates (see PlanGridND).
	Budget Budget
	// Shares are the parts of the tolerance the split gave each axis:
	// the axis's weighted aliasing and truncation, w_A·a_j + w_T·t_j, in
	// the model at the chosen grid.
	Shares []float64
}

// PlanGridND returns the cheapest rectangular grid, one step, count and
// shift per axis, whose certified error is at most req.Tol.
//
// # Composition
//
// On a rectangular grid the sampled sum of a separable function is the
// product of the axes' sums, T = Π_j T_j, and F = Π_j F_j. Writing
// T_j∞ = F_j + α_j (α_j the axis's alias sum) and T_j∞ = T_j + τ_j (τ_j the
// omitted samples), the error T - F = (T∞ - F) - (T∞ - T) is bounded by
//
//	|T∞ - F| = |Π_j (F_j + α_j) - Π_j F_j| ≤ Π_j (M_j + a_j) - Π_j M_j
//	|T∞ - T| = |Π_j (T_j + τ_j) - Π_j T_j| ≤ Π_j (W_j + t_j) - Π_j W_j
//
// (expand the products and use the triangle inequality; both right-hand
// sides grow with every argument), where a_j and t_j are the axis's
// certified aliasing and truncation (FamilyBudget or EnvelopeBudget, for
// every shift unless the axis fixes it), M_j ≥ sup_band |F_j|, and W_j ≥
// |T_j| is the smaller of S_j ≥ h_j Σ_k |f_j(x_k)| (the window-sum bound of
// the rounding) and M_j + a_j + t_j ≥ |F_j| + |T_j - F_j|. The same bounds
// hold for a non-separable f under product envelopes (any axis given by
// envelopes), by summing the envelopes over the lattice and its dual, with
// W_j = S_j. To first order the error is
// Σ_j (w_Aj a_j + w_Tj t_j) with the weights w_Aj = Π_{i≠j} M_i and
// w_Tj = Π_{i≠j} W_i.
//
// The rounding of the n-D sum of N = Π N_j terms, each a sample times the
// n steps and the phase e^{-iξ·x}, by recursive summation is at most
//
//	(γ_{N+n+2} + c_f·u + γ_n·Σ_j |ξ_j| X_j + 4u)·Π_j S_j,
//
// X_j = max |x_j| over the window, the phase terms only when some ξ_j ≠ 0
// (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., 2002,
// §3.1 and §4.2, from memory; the 1-D bound of the budget with the dot
// product ξ·x in place of ξx).
//
// # Split
//
// The tolerance is split so that the product of the counts is least, not
// evenly: minimising Σ_j log N_j subject to Σ_j e_j = τ gives shares in
// proportion to the elasticities -d log N_j / d log e_j, which are large
// for slowly converging axes (algebraic decay) and small for fast ones.
// The planner estimates them from each axis's model, plans each axis for
// its share, and then moves samples between axes and spends the slack
// left by rounding the counts up, while the modelled total stays within
// the tolerance. Each axis is then certified and the composed certificate
// checked; if it exceeds the tolerance, the axis with the largest
// weighted error gets the next admissible count.
//
// Errors are those of PlanGrid, with parameter paths such as
// "axes[1].band".
func PlanGridND(ctx context.Context, req PlanNDRequest) (PlanND, error) {
	if err := req.validate(); err != nil {
		return PlanND{}, err
	}
	if err := ctx.Err(); err != nil {
		return PlanND{}, fmt.Errorf("bounds: plan: %w", err)
	}
	p := newPlannerND(ctx, req)
	return p.plan()
}

func (r PlanNDRequest) validate() error {
	n := len(r.Axes)
	if n < 1 || n > MaxDim {
		return invalidf("axes", "must have between 1 and %d axes, got %d", MaxDim, n)
	}
	if math.IsNaN(r.Tol) || math.IsInf(r.Tol, 0) || r.Tol <= 0 {
		return invalidf("tol", "must be finite and > 0, got %g", r.Tol)
	}
	if r.MaxCount < 0 || r.MaxCount > MaxCount {
		return invalidf("max_count", "must be between 0 (default) and 2^53, got %d", r.MaxCount)
	}
	for j := range r.Axes {
		if err := r.axis(j).validate(fmt.Sprintf("axes[%d].", j)); err != nil {
			return err
		}
	}
	return nil
}

// axis returns the 1-D request of axis j (its tolerance is set later).
func (r PlanNDRequest) axis(j int) PlanRequest {
	a := r.Axes[j]
	return PlanRequest{
		Family: a.Family, Spatial: a.Spatial, Spectral: a.Spectral,
		Tol: r.Tol, Band: a.Band, Resolution: a.Resolution,
		FixedShift: a.FixedShift, Shift: a.Shift,
		Cost: r.Cost, SampleUlps: r.SampleUlps, MaxCount: r.maxCount(), MaxTerms: r.MaxTerms,
	}
}

func (r PlanNDRequest) maxCount() int64 {
	if r.MaxCount == 0 {
		return DefaultPlanMaxCount
	}
	return r.MaxCount
}

// axisState is the planner's view of one distinct axis.
type axisState struct {
	p *planner1
	// M and S are model estimates of sup_band |F_j| and of the window-sum
	// bound S_j.
	M, S float64
	// errs caches the least modelled error e(N) = min_h (w_A a + w_T t)
	// and its step.
	errs map[int64]axisErr
	// hMax is the largest step whose weighted aliasing is within the
	// whole tolerance.
	hMax float64
	// parts caches the unweighted model aliasing, truncation and window
	// sum that composed needs at a count's chosen step: the local search
	// of improve composes the same few counts many times.
	parts []axisPartsMemo
}

// axisPartsMemo is one entry of axisState.parts, with what it depends on
// besides the planModel's fixed fields.
type axisPartsMemo struct {
	n                 int64
	h, remGoal        float64
	cap               int
	alias, trunc, sum float64
}

// axisPartsMemoSize bounds the entries of axisState.parts.
const axisPartsMemoSize = 64

// modelParts returns the model's aliasing (with the alias term cap cap)
// and truncation of n samples of step h, and the window-sum bound S at h,
// from the memo when they were computed before under the same remainder
// goal.
func (a *axisState) modelParts(n int64, h float64, cap int) (alias, trunc, sum float64) {
	m := &a.p.m
	for i := len(a.parts) - 1; i >= 0; i-- {
		e := &a.parts[i]
		if e.n == n && e.h == h && e.cap == cap && e.remGoal == m.remGoal {
			return e.alias, e.trunc, e.sum
		}
	}
	m.aliasCap = cap
	alias = m.alias(h)
	m.aliasCap = 0
	trunc = m.trunc(h, n)
	for _, t := range m.spatial {
		sum += latticeTermSumFloat(t, h)
	}
	if len(a.parts) >= axisPartsMemoSize {
		a.parts = a.parts[:copy(a.parts, a.parts[axisPartsMemoSize/2:])]
	}
	a.parts = append(a.parts, axisPartsMemo{n: n, h: h, remGoal: m.remGoal, cap: cap, alias: alias, trunc: trunc, sum: sum})
	return alias, trunc, sum
}

// wMax is the larger of the axis's two weights.
func (a *axisState) wMax() float64 { return math.Max(weight(a.p.m.wA), weight(a.p.m.wT)) }

// plannerND holds one n-D planning run. Identical axes share one state.
type plannerND struct {
	ctx   context.Context
	req   PlanNDRequest
	tol   float64
	axes  []*axisState // distinct axes
	of    []int        // axis j uses axes[of[j]]
	limit int64
	// separable is true when every axis is a family: the function is
	// then the product of the axes' families.
	separable bool
	// hs is scratch space for composed.
	hs []float64
}

func newPlannerND(ctx context.Context, req PlanNDRequest) *plannerND {
	p := &plannerND{ctx: ctx, req: req, tol: req.Tol, limit: req.maxCount(), separable: true}
	for _, a := range req.Axes {
		if a.Family == nil {
			p.separable = false
		}
	}
	p.of = make([]int, len(req.Axes))
	for j := range req.Axes {
		found := -1
		for i := 0; i < j; i++ {
			if reflect.DeepEqual(req.Axes[i], req.Axes[j]) {
				found = p.of[i]
				break
			}
		}
		if found >= 0 {
			p.of[j] = found
			continue
		}
		ar := req.axis(j)
		ap := newPlanner1(ctx, ar)
		ap.m.noRound = true
		// The axes of an n-D plan are searched for several shares of
		// the tolerance.
		ap.memo = make([]modelValue, 0, 8*memoStart)
		st := &axisState{p: ap, errs: map[int64]axisErr{}}
		p.of[j] = len(p.axes)
		p.axes = append(p.axes, st)
	}
	return p
}

// estimateSizes sets each axis's M (largest |F| over the band samples, or
// the spectral envelope there) and S (window-sum bound at step h).
func (a *axisState) estimateSizes(h float64) {
	m := &a.p.m
	M := 0.0
	for _, xi := range m.xis {
		var v float64
		if m.absTr != nil {
			v = m.absTr(xi)
		} else {
			v = m.spectral.At(Point(xi))
		}
		M = math.Max(M, v)
	}
	S := 0.0
	for _, t := range m.spatial {
		S += latticeTermSumFloat(t, h)
	}
	a.M, a.S = math.Min(M, S), S
}

// setWeights gives every axis the products of the other axes' sizes as
// the weights of its aliasing and truncation.
func (p *plannerND) setWeights() {
	for k, a := range p.axes {
		wA, wT := 1.0, 1.0
		self := false
		for j := range p.req.Axes {
			b := p.axes[p.of[j]]
			if p.of[j] == k && !self {
				self = true // one factor is the axis itself
				continue
			}
			wA *= b.M
			if p.separable {
				wT *= math.Min(b.S, b.M)
			} else {
				wT *= b.S
			}
		}
		if a.p.m.wA != wA || a.p.m.wT != wT {
			a.errs = map[int64]axisErr{}
		}
		a.p.m.wA, a.p.m.wT = wA, wT
		a.p.m.remGoal = p.tol * verifyFraction / a.wMax()
		a.hMax = a.p.stepForAlias(p.tol, 1e-5)
		if math.IsInf(a.hMax, 1) || a.hMax <= 0 {
			a.hMax = math.Max(2*envReach(a.p.m.spatial, a.p.m.center, p.tol*verifyFraction), math.SmallestNonzeroFloat64)
		}
	}
}

// countFor returns the least admissible count of an axis whose weighted
// aliasing and truncation in the model are within eps (0 if none up to
// limit), with its step.
func (a *axisState) countFor(eps float64, limit int64) (int64, float64) {
	p := a.p
	p.tol = eps
	p.m.remGoal = eps * verifyFraction / a.wMax()
	p.hMax = p.stepForAlias(eps, 1e-5)
	if p.hMax <= 0 {
		return 0, 0
	}
	if math.IsInf(p.hMax, 1) {
		p.hMax = math.Max(2*envReach(p.m.spatial, p.m.center, eps*verifyFraction), math.SmallestNonzeroFloat64)
		if p.req.Resolution > 0 {
			p.hMax = math.Max(p.hMax, 2*math.Pi/p.req.Resolution)
		}
	}
	searchLimit := limit
	cn, ch := p.compactCandidates(min(limit, compactCounts) + 1)
	if cn > 0 {
		searchLimit = p.req.Cost.Prev(cn - 1)
	}
	var n int64
	if searchLimit >= 1 {
		n, _, _, _ = p.searchCount(searchLimit)
	}
	if n == 0 {
		return cn, ch
	}
	h, _ := p.minTotal(n, eps*finalMargin)
	return n, h
}

// axisErr is the least modelled weighted error of a count, its step and
// the alias term cap the model used there.
type axisErr struct {
	e, h float64
	cap  int
}

// errAt returns the least modelled weighted error of n samples and its
// step (cached). For compact support it also tries the step W/n that
// spans the support (see compactCandidates).
func (a *axisState) errAt(n int64) (float64, float64) {
	r := a.errFull(n)
	return r.e, r.h
}

func (a *axisState) errFull(n int64) axisErr {
	if v, ok := a.errs[n]; ok {
		return v
	}
	p := a.p
	p.tol = 0 // no early exit
	p.hMax = a.hMax
	h, e := p.minTotal(n, 0)
	r := axisErr{e: e, h: h}
	if W := p.compactWidth(); W > 0 && n <= compactCounts {
		hc := W / float64(n)
		if hc >= p.hRes(n) {
			for _, hh := range [...]float64{hc, hc * (1 + 0x1p-40), hc * (1 + 0x1p-20)} {
				p.m.capped = 0
				v := p.m.total(hh, n)
				if v < r.e {
					r = axisErr{e: v, h: hh}
				}
				// More copies only help where the copies summed vanish
				// and the envelope's remainder dominates.
				if p.m.capped == 0 || v-p.m.capped*weight(p.m.wA) > r.e/2 {
					continue
				}
				p.m.aliasCap = compactAliasTerms
				if v := p.m.total(hh, n); v < r.e {
					r = axisErr{e: v, h: hh, cap: compactAliasTerms}
				}
				p.m.aliasCap = 0
			}
		}
	}
	a.errs[n] = r
	return r
}

// roundingND is the model of the n-D rounding bound for counts ns, steps
// hs and the axes' window-sum bounds sums.
func (p *plannerND) roundingND(ns []int64, hs, sums []float64) float64 {
	const u = unitRoundoff
	N := 1.0
	S := 1.0
	phase := 0.0
	anyXi := false
	for j := range ns {
		N *= float64(ns[j])
		m := &p.axes[p.of[j]].p.m
		S *= sums[j]
		if m.xiMag != 0 {
			anyXi = true
			x := math.Abs(m.gridShift(hs[j], ns[j])) + hs[j]*float64(ns[j]/2+1)
			phase += m.xiMag * x
		}
	}
	n := float64(len(ns))
	nu := (N + n + 2) * u
	rel := nu/(1-nu) + p.req.sampleUlps()*u
	if anyXi {
		gn := n * u / (1 - n*u)
		rel += gn*phase + 4*u
	}
	return rel * S
}

func (r PlanNDRequest) sampleUlps() float64 {
	if r.SampleUlps == 0 {
		return 1
	}
	return r.SampleUlps
}

// composed returns the model of the whole n-D budget for counts ns: the
// composition of the axes' least errors and the rounding. The steps it
// returns are in p.hs, valid until the next call.
func (p *plannerND) composed(ns []int64) (float64, []float64) {
	n := len(ns)
	if cap(p.hs) < 4*n {
		p.hs = make([]float64, 4*n)
	}
	buf := p.hs[:4*n]
	hs, alias, trunc, sums := buf[:n:n], buf[n:2*n:2*n], buf[2*n:3*n:3*n], buf[3*n:]
	clear(hs)
	for j := range ns {
		a := p.axes[p.of[j]]
		r := a.errFull(ns[j])
		if math.IsInf(r.e, 1) {
			return math.Inf(1), hs
		}
		hs[j] = r.h
		alias[j], trunc[j], sums[j] = a.modelParts(ns[j], r.h, r.cap)
	}
	pa, pm, pt, ps := 1.0, 1.0, 1.0, 1.0
	for j := range ns {
		a := p.axes[p.of[j]]
		s := sums[j]
		M := math.Min(a.M, s)
		W := s
		if p.separable {
			W = math.Min(s, M+alias[j]+trunc[j])
		}
		pa *= M + alias[j]
		pm *= M
		pt *= W + trunc[j]
		ps *= W
	}
	return (pa - pm) + (pt - ps) + p.roundingND(ns, hs, sums), hs
}

func (p *plannerND) plan() (PlanND, error) {
	n := len(p.req.Axes)
	// Sizes at the aliasing-limited step for the whole tolerance.
	for _, a := range p.axes {
		a.p.tol = p.tol
		a.p.m.wA, a.p.m.wT = 1, 1
		h := a.p.stepForAlias(p.tol, 1e-3)
		if math.IsInf(h, 1) || h <= 0 {
			h = 1
		}
		a.estimateSizes(h)
	}
	p.setWeights()
	// A first guess of the rounding: a few units of the window sums.
	tau := p.tol * (1 - 0x1p-8)
	// Elasticities from two tolerances per distinct axis.
	eps0 := tau / float64(n)
	eta := make([]float64, len(p.axes))
	ns0 := make([]int64, len(p.axes))
	for k, a := range p.axes {
		n0, h0 := a.countFor(eps0, p.limit)
		n1, _ := a.countFor(eps0/8, p.limit)
		if n0 == 0 || n1 == 0 {
			return PlanND{}, p.axisInfeasible(k)
		}
		a.estimateSizes(h0)
		ns0[k] = n0
		eta[k] = math.Max(math.Log(float64(n1)/float64(n0))/math.Log(8), 1e-3)
	}
	p.setWeights()
	// Shares in proportion to the elasticities (per axis, counting
	// repeated axes).
	sumEta := 0.0
	for j := range p.req.Axes {
		sumEta += eta[p.of[j]]
	}
	ns := make([]int64, n)
	floor, prev := math.Inf(1), math.Inf(1)
	for iter := 0; ; iter++ {
		per := make([]int64, len(p.axes))
		for k, a := range p.axes {
			eps := tau * eta[k] / sumEta
			nk, _ := a.countFor(eps, p.limit)
			if nk == 0 {
				return PlanND{}, p.axisInfeasible(k)
			}
			per[k] = nk
		}
		for j := range ns {
			ns[j] = per[p.of[j]]
		}
		total, _ := p.composed(ns)
		if total <= p.tol {
			break
		}
		floor = math.Min(floor, total)
		if total >= prev || iter >= 12 {
			// More samples no longer help: rounding grows with the count.
			return PlanND{}, &ParamError{Param: "tol", Err: ErrInfeasible,
				Reason: fmt.Sprintf("the tolerance %.3g is below what double precision can certify for this grid: the smallest certifiable tolerance is about %.2g (rounding grows with the %d-dimensional count)", p.tol, floor, n)}
		}
		prev = total
		// Rounding or second-order terms used up the margin: shrink.
		tau *= math.Min(0.5, p.tol/total)
	}
	// Local improvement of the product.
	ns = p.improve(ns)
	if err := p.checkLimit(ns); err != nil {
		return PlanND{}, err
	}
	return p.certify(ns)
}

// improve moves samples between axes and spends the slack while the
// modelled composed total stays within the tolerance: it tries lowering
// each count by one admissible step, then exchanging one step between two
// axes, keeping changes that lower the product.
func (p *plannerND) improve(ns []int64) []int64 {
	cost := p.req.Cost
	best := append([]int64(nil), ns...)
	prod := func(v []int64) float64 {
		r := 1.0
		for _, x := range v {
			r *= float64(x)
		}
		return r
	}
	ok := func(v []int64) bool {
		t, _ := p.composed(v)
		return t <= p.tol*finalMargin
	}
	if !ok(best) {
		// Raise the counts of the axes with the largest errors until the
		// model fits.
		for it := 0; it < 64 && !ok(best); it++ {
			j := p.worstAxis(best)
			next := cost.Next(best[j] + 1)
			if next == 0 {
				break
			}
			best[j] = next
		}
	}
	for pass := 0; pass < 8; pass++ {
		changed := false
		// Lower single counts, the largest relative saving first.
		order := make([]int, len(best))
		for j := range order {
			order[j] = j
		}
		sort.Slice(order, func(a, b int) bool { return best[order[a]] < best[order[b]] })
		for _, j := range order {
			for {
				prev := cost.Prev(best[j] - 1)
				if prev < 1 {
					break
				}
				v := append([]int64(nil), best...)
				v[j] = prev
				if !ok(v) {
					break
				}
				best = v
				changed = true
			}
		}
		// Exchanges: one step down on axis j, one up on axis k.
		for j := range best {
			for k := range best {
				if j == k {
					continue
				}
				down := cost.Prev(best[j] - 1)
				up := cost.Next(best[k] + 1)
				if down < 1 || up == 0 {
					continue
				}
				v := append([]int64(nil), best...)
				v[j], v[k] = down, up
				if prod(v) < prod(best) && ok(v) {
					best = v
					changed = true
				}
			}
		}
		if !changed {
			break
		}
	}
	return best
}

// worstAxis returns the axis whose weighted modelled error is largest.
func (p *plannerND) worstAxis(ns []int64) int {
	worst, we := 0, -1.0
	for j := range ns {
		e, _ := p.axes[p.of[j]].errAt(ns[j])
		if e > we {
			worst, we = j, e
		}
	}
	return worst
}

func (p *plannerND) checkLimit(ns []int64) error {
	total := 1.0
	for _, x := range ns {
		total *= float64(x)
	}
	if total > float64(p.limit) {
		return &ParamError{Param: "max_count", Err: ErrWorkLimit,
			Reason: fmt.Sprintf("the tolerance %.3g needs about %.3g samples in total, more than the limit %d", p.tol, total, p.limit)}
	}
	return nil
}

func (p *plannerND) axisInfeasible(k int) error {
	j := 0
	for j = range p.of {
		if p.of[j] == k {
			break
		}
	}
	// The 1-D planner says what one axis alone can reach.
	r := p.req.axis(j)
	_, err := PlanGrid(p.ctx, r)
	if err == nil {
		err = &ParamError{Param: "tol", Err: ErrInfeasible,
			Reason: fmt.Sprintf("the tolerance %.3g cannot be split over the axes: axis %d alone needs most of it", p.tol, j)}
	}
	return fmt.Errorf("bounds: plan of axis %d: %w", j, err)
}

// certify certifies each axis and composes the n-D certificate. If it
// exceeds the tolerance, the axis with the largest weighted error gets the
// next admissible count, a few times.
func (p *plannerND) certify(ns []int64) (PlanND, error) {
	var last Budget
	for try := 0; try < 6; try++ {
		res, err := p.certifyOnce(ns)
		if err != nil {
			return PlanND{}, err
		}
		if res.Budget.Total <= p.tol {
			return res, nil
		}
		last = res.Budget
		j := p.worstAxis(ns)
		next := p.req.Cost.Next(ns[j] + 1)
		if next == 0 {
			break
		}
		ns = append([]int64(nil), ns...)
		ns[j] = next
		if err := p.checkLimit(ns); err != nil {
			return PlanND{}, err
		}
	}
	return PlanND{}, &ParamError{Param: "tol", Err: ErrInfeasible,
		Reason: fmt.Sprintf("the certified error of the best grid found stays above the tolerance %.3g (last certified total %.3g); a tolerance of about %.1g is certifiable", p.tol, last.Total, 2*last.Total)}
}

func (p *plannerND) certifyOnce(ns []int64) (PlanND, error) {
	n := len(ns)
	_, hs := p.composed(ns)
	hs = append([]float64(nil), hs...)
	res := PlanND{Axes: make([]Plan, n), Shares: make([]float64, n)}
	type key struct {
		k int
		n int64
	}
	done := map[key]Plan{}
	parts := make([]axisParts, n)
	for j := range ns {
		k := p.of[j]
		a := p.axes[k]
		pl, ok := done[key{k, ns[j]}]
		if !ok {
			var err error
			// The axis's remainders may reach its share of the
			// tolerance's fraction, in unweighted units.
			a.p.tol = p.tol / a.wMax()
			pl, err = a.p.certify(hs[j], ns[j], a.errFull(ns[j]).cap)
			if err != nil {
				return PlanND{}, fmt.Errorf("bounds: axis %d: %w", j, err)
			}
			done[key{k, ns[j]}] = pl
		}
		res.Axes[j] = pl
		e, _ := a.errAt(ns[j])
		res.Shares[j] = e
		// Under product envelopes |T_j| is bounded by the window sum alone
		// (newAxisParts with no family).
		var f Family
		if p.separable {
			f = a.p.req.Family
		}
		parts[j] = newAxisParts(f, a.p.m.spatial, a.p.m.spectral, pl.Grid, a.p.req.Band, !a.p.req.FixedShift, pl.Budget)
	}
	b := composeND(parts, p.req.sampleUlps())
	if !finite(b.Total) {
		return PlanND{}, fmt.Errorf("bounds: n-d plan: %w", ErrNotFinite)
	}
	count := int64(1)
	for _, pl := range res.Axes {
		count *= pl.Grid.Count
	}
	res.Budget = b
	res.Count = count
	res.Cost = p.req.Cost.Cost(float64(count))
	return res, nil
}
