package bounds

import (
	"context"
	"fmt"
	"math"
	"math/big"
)

// pointSet is one lattice, the primal L or the dual L*, prepared for
// enumeration: an LLL-reduced basis and its Gram-Schmidt data, computed
// exactly and enclosed. Lengths are stored unscaled and multiplied by
// scale (1 for L, 2π for L*), so that the dual of W is handled exactly
// although 2π is not a float64.
type pointSet struct {
	n       int
	scale   Interval     // actual lengths = scale × unscaled lengths
	basis   [][]Interval // basis[i][j]: component i of reduced vector j, unscaled
	mu      [][]Interval // Gram-Schmidt coefficients mu[i][j], j < i
	beta    []Interval   // |b_i*|², unscaled
	coords  [][]Interval // coordinates τ = coords·t/scale of a point t
	covol   Interval     // unscaled covolume
	u       [][]int64    // original coordinates k = u·c of reduced coordinates c
	reduced bool
}

// newPointSet reduces the basis b0 (columns, exact) whose inverse is b0inv
// and absolute determinant covol.
func newPointSet(b0, b0inv ratMat, covol *big.Rat, scale Interval) (*pointSet, error) {
	n := len(b0)
	res, err := lllReduce(b0, LLLDelta)
	if err != nil {
		return nil, err
	}
	b := b0.mul(ratFromInts(res.u))
	mu, beta, ok := gramSchmidt(b.transpose().mul(b))
	if !ok {
		return nil, invalidf("lattice.generator", "reduced basis is degenerate")
	}
	uinv, ok := invertUnimodular(res.u)
	if !ok {
		return nil, invalidf("lattice.generator", "basis reduction lost unimodularity")
	}
	ps := &pointSet{
		n:       n,
		scale:   scale,
		basis:   b.intervals(),
		mu:      mu.intervals(),
		beta:    make([]Interval, n),
		coords:  ratFromInts(uinv).mul(b0inv).intervals(),
		covol:   ratInterval(covol),
		u:       res.u,
		reduced: res.reduced,
	}
	for i, v := range beta {
		ps.beta[i] = ratInterval(v)
		if !ps.beta[i].IsFinite() || ps.beta[i].Lo <= 0 {
			return nil, invalidf("lattice.generator", "reduced basis lengths are outside the float64 range")
		}
	}
	for i := range ps.basis {
		for j := range ps.basis[i] {
			if !ps.basis[i][j].IsFinite() || !ps.coords[i][j].IsFinite() {
				return nil, invalidf("lattice.generator", "reduced basis is outside the float64 range")
			}
		}
	}
	if !ps.covol.IsFinite() || ps.covol.Lo <= 0 {
		return nil, invalidf("lattice.generator", "covolume is outside the float64 range")
	}
	return ps, nil
}

// point encloses the point k·B·c (k a scale factor) into dst.
func (ps *pointSet) point(dst []Interval, c []int64, k Interval) {
	for i := 0; i < ps.n; i++ {
		var s Interval
		for j := 0; j < ps.n; j++ {
			if c[j] != 0 {
				s = s.Add(ps.basis[i][j].Scale(float64(c[j])))
			}
		}
		dst[i] = s.Mul(k)
	}
}

// targetCoords encloses the coordinates τ of the point t in the reduced
// basis scaled by k: t = k·B·τ.
func (ps *pointSet) targetCoords(t []Interval, k Interval) []Interval {
	tau := make([]Interval, ps.n)
	for i := 0; i < ps.n; i++ {
		var s Interval
		for j := 0; j < ps.n; j++ {
			s = s.Add(ps.coords[i][j].Mul(t[j]))
		}
		tau[i] = s.Div(k)
	}
	return tau
}

// work counts enumeration nodes against the caller's limit and polls the
// context.
type work struct {
	ctx   context.Context
	limit int64
	used  int64
	what  string
}

func (w *work) spend(n int64) error {
	before := w.used
	w.used += n
	if w.used > w.limit {
		return workLimitf("settings.max_terms", "%s needs more than %d lattice points", w.what, w.limit)
	}
	if before>>12 != w.used>>12 {
		if err := w.ctx.Err(); err != nil {
			return fmt.Errorf("bounds: %s: %w", w.what, err)
		}
	}
	return nil
}

// walker enumerates the integer vectors c with |B(c - τ)| ≤ ρ, unscaled,
// by the method of Fincke & Pohst ("Improved methods for calculating
// vectors of short length in a lattice", Math. Comp. 44, 1985, from
// memory), in interval arithmetic. With the Gram-Schmidt decomposition
//
//	|B(c - τ)|² = Σ_j β_j (c_j - z_j)²,   z_j = τ_j - Σ_{i>j} μ_ij (c_i - τ_i),
//
// the coordinates are chosen from the last to the first, each within
// z_j ± √((ρ² - Σ_{i>j} β_i (c_i - z_i)²)/β_j). Every quantity is
// enclosed, every range is rounded outward and every partial sum is taken
// at its lower bound, so the walk visits a superset of the vectors in the
// ball: none is missed whatever the rounding.
//
// Points already visited by a walk of the smaller squared radius prev2 are
// skipped (growing shells): that walk's choices are a deterministic
// function of c and the radius, repeated here alongside.
type walker struct {
	ps    *pointSet
	tau   []Interval
	rho2  float64 // squared radius, unscaled, an upper bound
	prev2 float64 // squared radius of the previous walk, or -1
	w     *work
	visit func(c []int64, d2 Interval) error

	c []int64
}

func (wk *walker) run() error {
	wk.c = make([]int64, wk.ps.n)
	return wk.level(wk.ps.n-1, Point(0), wk.prev2 >= 0)
}

// rangeAt returns the integer range of coordinate j given the centre z and
// the lower bound part of the levels above, for squared radius r2; ok is
// false if it is empty.
func (wk *walker) rangeAt(j int, z Interval, part, r2 float64) (lo, hi float64, ok bool, err error) {
	rem := addUp(r2, -part)
	if rem < 0 {
		return 0, 0, false, nil
	}
	half := sqrtUp(divUp(rem, wk.ps.beta[j].Lo))
	lo = math.Ceil(addDown(z.Lo, -half))
	hi = math.Floor(addUp(z.Hi, half))
	if lo > hi {
		return 0, 0, false, nil
	}
	if math.Abs(lo) > 1<<52 || math.Abs(hi) > 1<<52 || !(hi-lo < float64(wk.w.limit)) {
		return 0, 0, false, workLimitf("settings.max_terms", "%s needs more than %d lattice points", wk.w.what, wk.w.limit)
	}
	return lo, hi, true, nil
}

// level chooses coordinate j; part encloses Σ_{i>j} β_i (c_i - z_i)² and
// inPrev says whether the walk of radius prev2 reached this node.
func (wk *walker) level(j int, part Interval, inPrev bool) error {
	ps := wk.ps
	z := wk.tau[j]
	for i := j + 1; i < ps.n; i++ {
		z = z.Sub(ps.mu[i][j].Mul(Point(float64(wk.c[i])).Sub(wk.tau[i])))
	}
	lo, hi, ok, err := wk.rangeAt(j, z, part.Lo, wk.rho2)
	if err != nil || !ok {
		return err
	}
	var plo, phi float64
	if inPrev {
		plo, phi, inPrev, err = wk.rangeAt(j, z, part.Lo, wk.prev2)
		if err != nil {
			return err
		}
	}
	for v := lo; v <= hi; v++ {
		if err := wk.w.spend(1); err != nil {
			return err
		}
		d := Point(v).Sub(z)
		next := part.Add(d.Sqr().Mul(ps.beta[j]))
		if next.Lo > wk.rho2 {
			continue
		}
		childPrev := inPrev && v >= plo && v <= phi && next.Lo <= wk.prev2
		wk.c[j] = int64(v)
		if j == 0 {
			if !childPrev {
				if err := wk.visit(wk.c, next); err != nil {
					return err
				}
			}
			continue
		}
		if err := wk.level(j-1, next, childPrev); err != nil {
			return err
		}
	}
	wk.c[j] = 0
	return nil
}
