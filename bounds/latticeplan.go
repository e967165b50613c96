package bounds

import (
	"context"
	"fmt"
	"math"
	"sort"
)

// LatticeTarget is what an alias bound on a lattice must cover: an
// isotropic spectral envelope, the frequencies of interest and a
// tolerance. For every frequency |ξ| ≤ Band and every shift s, the alias
// sum of any f with |F(ξ)| ≤ Spectral.At(|ξ|) obeys
//
//	|Σ_{m∈L*, m≠0} F(ξ+m) e^{im·s}| ≤ Σ_{m≠0} P(|m| - Band),
//
// P the profile (P(d) = P(0) for d < 0), because |ξ + m| ≥ |m| - |ξ| and P
// is non-increasing. Two targets are the usual ones:
//
//   - the integral (IntegralTarget, Band = 0): only ξ = 0. For a band
//     limit Ω the alias sum vanishes when every dual point m ≠ 0 has
//     |m| > Ω: the copies F(· + m) must miss the origin.
//   - reconstruction of the whole band (ReconstructionTarget, Band = Ω):
//     every |ξ| ≤ Ω. The copies of the disc |ξ| ≤ Ω must not overlap it,
//     |m| > 2Ω: the balls of radius Ω about the dual points must be a
//     packing. The sampling lattice of least density is then the dual of
//     the densest lattice packing (Petersen & Middleton, Information and
//     Control 5, 1962, from memory): hexagonal in 2-D, body-centred cubic
//     (dual of face-centred cubic) in 3-D.
//
// For a band limit both targets rank lattices alike (the densities differ
// by 2ⁿ); for decaying spectra they differ.
type LatticeTarget struct {
	// Spectral bounds |F| as a function of |ξ|; terms should be centred at
	// 0 (a centre c is folded into the plateau, |ξ| - |c|).
	Spectral Envelope
	// Band is the radius Ξ ≥ 0 of the frequencies covered; 0 for ξ = 0.
	Band float64
	// Tol > 0 is the largest alias bound accepted by a plan.
	Tol float64
}

// IntegralTarget returns the target for the integral, ξ = 0.
func IntegralTarget(spectral Envelope, tol float64) LatticeTarget {
	return LatticeTarget{Spectral: spectral, Tol: tol}
}

// ReconstructionTarget returns the target for the whole band of a
// band-limited spectrum: Band = Ω, the band limit of the envelope (the
// largest |centre| + plateau + half-width of its compact terms). Errors
// wrap ErrInvalid if the envelope has a term that is not compact.
func ReconstructionTarget(spectral Envelope, tol float64) (LatticeTarget, error) {
	omega := 0.0
	for i, t := range spectral {
		if t.Decay != Compact {
			return LatticeTarget{}, invalidf(fmt.Sprintf("target.spectral[%d]", i), "not band-limited (%v); give the band explicitly", t.Decay)
		}
		omega = math.Max(omega, addUp(addUp(math.Abs(t.Center), t.Plateau), t.Width))
	}
	return LatticeTarget{Spectral: spectral, Band: omega, Tol: tol}, nil
}

// Validate checks the target.
func (t LatticeTarget) Validate() error {
	if len(t.Spectral) == 0 {
		return invalidf("target.spectral", "empty envelope: nothing aliases")
	}
	if err := t.Spectral.Validate("target.spectral"); err != nil {
		return err
	}
	if !finite(t.Band) || t.Band < 0 {
		return invalidf("target.band", "must be finite and ≥ 0, got %g", t.Band)
	}
	if !finite(t.Tol) || t.Tol <= 0 {
		return invalidf("target.tol", "must be finite and > 0, got %g", t.Tol)
	}
	zero := true
	for _, term := range t.Spectral {
		if term.Amplitude > 0 {
			zero = false
		}
	}
	if zero {
		return invalidf("target.spectral", "every amplitude is 0: nothing aliases")
	}
	return nil
}

// profile is the centred profile shifted by the band: P(d - Band).
func (t LatticeTarget) profile() Envelope { return radialProfile(t.Spectral, t.Band) }

// LatticeBudget is a certified alias bound on a lattice for a target.
type LatticeBudget struct {
	// Aliasing bounds the alias sum for every |ξ| ≤ Band and every shift.
	Aliasing float64
	// Points counts the dual points enumerated.
	Points int64
	// Radius is the radius within which every dual point was enumerated.
	Radius float64
	// Remainder bounds the envelope over the dual points beyond Radius
	// (counting bound); it is part of Aliasing.
	Remainder float64
}

// LatticePlan is the coarsest scaling of a candidate lattice that meets a
// target.
type LatticePlan struct {
	// Lattice is the candidate at unit scale.
	Lattice Lattice
	// Scale is the largest scale a found (to a relative 2⁻⁴⁰) at which
	// the lattice a·L meets the target with a certified bound.
	Scale float64
	// Density encloses the samples per unit volume of a·L,
	// 1/(aⁿ |det W|).
	Density Interval
	// Aliasing is the certified alias bound at Scale, at most Tol.
	Aliasing float64
	// Saving is 1 - Density/Density(Zⁿ plan), the fraction of samples saved
	// against the rectangular (cubic) grid under the same target (computed
	// from the midpoints of the densities).
	Saving float64
	// Points counts the dual points enumerated for the plan.
	Points int64
}

// LatticeComparison ranks candidate lattices for a target.
type LatticeComparison struct {
	Target LatticeTarget
	// Reference is the plan of the cubic grid Zⁿ.
	Reference LatticePlan
	// Plans holds every candidate's plan, fewest samples per unit volume
	// first.
	Plans []LatticePlan
}

// dualList is the dual lattice enumerated once about the origin, to
// evaluate the alias bound at many scales: at scale a the dual of a·L is
// (2π/a)·B·Zⁿ with B the unscaled reduced dual basis.
type dualList struct {
	ps    *pointSet
	norms []Interval // unscaled |Bc| of the nonzero points enumerated
	R0    float64    // every point with unscaled norm ≤ R0 is listed
	lam1  Interval   // the shortest nonzero unscaled norm, enclosed
}

// enumerateDual lists the nonzero dual points of unscaled norm ≤ R0.
func enumerateDual(ps *pointSet, R0 float64, w *work) (*dualList, error) {
	dl := &dualList{ps: ps, R0: R0, lam1: Interval{math.Inf(1), math.Inf(1)}}
	tau := make([]Interval, ps.n)
	wk := walker{ps: ps, tau: tau, rho2: Point(R0).Sqr().Hi, prev2: -1, w: w,
		visit: func(c []int64, d2 Interval) error {
			if isZero(c) {
				return nil
			}
			nm := Sqrt(d2)
			dl.norms = append(dl.norms, nm)
			dl.lam1 = dl.lam1.Min(nm)
			return nil
		}}
	if err := wk.run(); err != nil {
		return nil, err
	}
	sort.Slice(dl.norms, func(i, j int) bool { return dl.norms[i].Lo < dl.norms[j].Lo })
	return dl, nil
}

// longestBasis returns an upper bound of the longest reduced basis vector
// (unscaled); a ball of that radius holds a shortest nonzero vector.
func (ps *pointSet) longestBasis() float64 {
	m := 0.0
	for j := 0; j < ps.n; j++ {
		s := Point(0)
		for i := 0; i < ps.n; i++ {
			s = s.Add(ps.basis[i][j].Sqr())
		}
		m = math.Max(m, Sqrt(s).Hi)
	}
	return m
}

// dualScale encloses 2π/a, the length factor of the dual of a·L.
func dualScale(a float64) Interval { return TwoPi.Div(Point(a)) }

// bound returns an upper bound of Σ_{m≠0} P(|m|) over the dual of a·L:
// the listed points at their smallest possible distances plus the
// counting-bound tail beyond the listed radius.
func (dl *dualList) bound(prof Envelope, a float64) float64 {
	k := dualScale(a)
	Ract := mulDown(dl.R0, k.Lo)
	nIn := 1.0 // the origin
	sum := 0.0
	for _, nm := range dl.norms {
		sum = addUpNZ(sum, upperAt(prof, mulDown(nm.Lo, k.Lo)))
		if mulUp(nm.Hi, k.Hi) <= Ract {
			nIn++
		}
	}
	return addUpNZ(sum, dl.ps.counter(k).tail(prof, Ract, nIn))
}

// aliasLower returns a lower bound of Σ_{m≠0} P(|m|) over the dual of a·L:
// the shortest vectors come in pairs ±v, and N(r) - 1 points lie within r
// of the origin besides it.
func (dl *dualList) aliasLower(prof Envelope, a float64) float64 {
	k := dualScale(a)
	lower := func(d float64) float64 {
		s := 0.0
		for _, t := range prof {
			s = addDown(s, t.lowerAt(d))
		}
		return s
	}
	r1 := mulUp(dl.lam1.Hi, k.Hi)
	best := mulDown(2, lower(r1))
	pc := dl.ps.counter(k)
	for j, r := 0, r1; j < 24; j, r = j+1, r*2 {
		best = math.Max(best, mulDown(lower(r), addDown(pc.lower(r), -1)))
	}
	return best
}

// LatticeAliasBound returns a certified bound on the alias sum of the
// lattice L for the target (its Tol is not used): for every |ξ| ≤ Band and
// every shift,
//
//	|Σ_{m∈L*, m≠0} F(ξ+m) e^{im·s}| ≤ Σ_{m≠0} P(|m| - Band),
//
// the dual points enumerated about the origin and the rest bounded by the
// counting bound (see pointCounter.tail). The remainder is pushed below
// set.Tol or 2⁻⁶⁰ of the nearest copy's bound. Errors wrap ErrInvalid (a
// *ParamError names the field), ErrWorkLimit, or the context's error.
func LatticeAliasBound(ctx context.Context, lat Lattice, target LatticeTarget, set Settings) (LatticeBudget, error) {
	if err := lat.Validate("lattice"); err != nil {
		return LatticeBudget{}, err
	}
	if err := target.Validate(); err != nil {
		return LatticeBudget{}, err
	}
	if err := set.Validate(); err != nil {
		return LatticeBudget{}, err
	}
	if err := ctx.Err(); err != nil {
		return LatticeBudget{}, fmt.Errorf("bounds: lattice alias bound: %w", err)
	}
	prof := target.profile()
	n := lat.Dim()
	if !summable(prof, n) {
		return LatticeBudget{}, invalidf("target.spectral", "envelope is not summable in %d dimensions (algebraic power must exceed %d)", n, n)
	}
	ps := lat.d.dual
	k := ps.scale
	pc := ps.counter(k)
	first := upperAt(prof, pc.shortest())
	goal := math.Max(set.Tol, math.Max(relGoal*first, 0x1p-1022))
	w := &work{ctx: ctx, limit: set.maxTerms(), what: "lattice alias bound"}
	R, ok := pc.radiusFor(prof, goal, float64(w.limit))
	if !ok {
		return LatticeBudget{}, workLimitf("settings.max_terms", "lattice alias bound needs more than %d lattice points", w.limit)
	}
	R0 := math.Max(Point(R).Div(k).Hi, ps.longestBasis())
	dl, err := enumerateDual(ps, R0, w)
	if err != nil {
		return LatticeBudget{}, err
	}
	total := dl.bound(prof, 1)
	kk := dualScale(1)
	Ract := mulDown(R0, kk.Lo)
	nIn := 1.0
	for _, nm := range dl.norms {
		if mulUp(nm.Hi, kk.Hi) <= Ract {
			nIn++
		}
	}
	rem := ps.counter(kk).tail(prof, Ract, nIn)
	if !finite(total) {
		return LatticeBudget{}, fmt.Errorf("bounds: lattice alias bound: %w", ErrNotFinite)
	}
	return LatticeBudget{Aliasing: total, Points: int64(len(dl.norms)), Radius: Ract, Remainder: rem}, nil
}

// PlanLattice returns the largest scale a at which the lattice a·L meets
// the target with a certified alias bound, and its density. The bound is
// increasing in a (the dual points move inward), so a is found by
// bisection between a scale that meets the target and one where even a
// lower bound of the envelope sum exceeds Tol; the dual lattice is
// enumerated once, to the radius the coarsest scale needs.
//
// Errors wrap ErrInvalid (a *ParamError names the field), ErrWorkLimit,
// ErrInfeasible (no scale meets the target), or the context's error.
func PlanLattice(ctx context.Context, lat Lattice, target LatticeTarget, set Settings) (LatticePlan, error) {
	if err := lat.Validate("lattice"); err != nil {
		return LatticePlan{}, err
	}
	if err := target.Validate(); err != nil {
		return LatticePlan{}, err
	}
	if err := set.Validate(); err != nil {
		return LatticePlan{}, err
	}
	return planLattice(ctx, lat, target, set)
}

func planLattice(ctx context.Context, lat Lattice, target LatticeTarget, set Settings) (LatticePlan, error) {
	if err := ctx.Err(); err != nil {
		return LatticePlan{}, fmt.Errorf("bounds: lattice plan: %w", err)
	}
	prof := target.profile()
	n := lat.Dim()
	if !summable(prof, n) {
		return LatticePlan{}, invalidf("target.spectral", "envelope is not summable in %d dimensions (algebraic power must exceed %d)", n, n)
	}
	ps := lat.d.dual
	tol := target.Tol
	w := &work{ctx: ctx, limit: set.maxTerms(), what: "lattice plan of " + lat.name}
	// A first list holds the shortest dual vectors.
	dl, err := enumerateDual(ps, ps.longestBasis(), w)
	if err != nil {
		return LatticePlan{}, err
	}
	// aHi: a scale at which even a lower bound exceeds Tol.
	aHi := 1.0
	steps := 0
	if dl.aliasLower(prof, aHi) > tol {
		for dl.aliasLower(prof, aHi/2) > tol {
			aHi /= 2
			if steps++; steps > 2100 {
				return LatticePlan{}, infeasiblef("target.tol", "no scale of %v meets %g", lat, tol)
			}
		}
	} else {
		for dl.aliasLower(prof, aHi) <= tol {
			aHi *= 2
			if steps++; steps > 2100 || math.IsInf(aHi, 0) {
				return LatticePlan{}, infeasiblef("target.tol", "the alias bound of %v stays below %g at every scale", lat, tol)
			}
		}
	}
	// Enumerate to the radius that the coarsest scale aHi needs for a tail
	// far below Tol; smaller scales need less.
	kHi := dualScale(aHi)
	pcHi := ps.counter(kHi)
	Ract, ok := pcHi.radiusFor(prof, tol/1024, float64(w.limit))
	if !ok {
		return LatticePlan{}, workLimitf("settings.max_terms", "lattice plan of %v needs more than %d lattice points", lat, w.limit)
	}
	R0 := math.Max(Point(Ract).Div(kHi).Hi, ps.longestBasis())
	if R0 > dl.R0 {
		if dl, err = enumerateDual(ps, R0, w); err != nil {
			return LatticePlan{}, err
		}
	}
	lo, hi := aHi/2, aHi
	for steps = 0; dl.bound(prof, lo) > tol; steps++ {
		if steps > 2100 || lo == 0 {
			return LatticePlan{}, infeasiblef("target.tol", "no scale of %v meets %g", lat, tol)
		}
		if err := ctx.Err(); err != nil {
			return LatticePlan{}, fmt.Errorf("bounds: lattice plan: %w", err)
		}
		hi, lo = lo, lo/2
	}
	for i := 0; i < 80 && hi-lo > 0x1p-40*hi; i++ {
		if err := ctx.Err(); err != nil {
			return LatticePlan{}, fmt.Errorf("bounds: lattice plan: %w", err)
		}
		m := lo + (hi-lo)/2
		if dl.bound(prof, m) <= tol {
			lo = m
		} else {
			hi = m
		}
	}
	b := dl.bound(prof, lo)
	dens := Point(lo).IntPow(n).Mul(lat.d.covol).Recip()
	return LatticePlan{Lattice: lat, Scale: lo, Density: dens, Aliasing: b, Points: int64(len(dl.norms))}, nil
}

// CompareLattices plans every built-in lattice of dimension dim and every
// extra candidate for the target and ranks them by samples per unit
// volume, fewest first, each with its saving against the cubic grid Zⁿ.
//
// Errors wrap ErrInvalid (a *ParamError names the field, e.g.
// "candidates[1]" for a candidate of another dimension), ErrWorkLimit,
// ErrInfeasible, or the context's error.
func CompareLattices(ctx context.Context, dim int, target LatticeTarget, extra []Lattice, set Settings) (LatticeComparison, error) {
	builtins, err := BuiltinLattices(dim)
	if err != nil {
		return LatticeComparison{}, err
	}
	if err := target.Validate(); err != nil {
		return LatticeComparison{}, err
	}
	if err := set.Validate(); err != nil {
		return LatticeComparison{}, err
	}
	for i, l := range extra {
		p := fmt.Sprintf("candidates[%d]", i)
		if err := l.Validate(p); err != nil {
			return LatticeComparison{}, err
		}
		if l.Dim() != dim {
			return LatticeComparison{}, invalidf(p, "has dimension %d, want %d", l.Dim(), dim)
		}
	}
	cands := append(builtins, extra...)
	cmp := LatticeComparison{Target: target, Plans: make([]LatticePlan, 0, len(cands))}
	for _, l := range cands {
		p, err := planLattice(ctx, l, target, set)
		if err != nil {
			return LatticeComparison{}, err
		}
		cmp.Plans = append(cmp.Plans, p)
	}
	cmp.Reference = cmp.Plans[0] // Zⁿ comes first among the built-ins
	ref := cmp.Reference.Density.Mid()
	for i := range cmp.Plans {
		cmp.Plans[i].Saving = 1 - cmp.Plans[i].Density.Mid()/ref
	}
	cmp.Reference.Saving = 0
	sort.SliceStable(cmp.Plans, func(i, j int) bool {
		return cmp.Plans[i].Density.Mid() < cmp.Plans[j].Density.Mid()
	})
	return cmp, nil
}
