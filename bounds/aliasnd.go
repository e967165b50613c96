package bounds

import (
	"context"
	"fmt"
	"strconv"
	"strings"
)

// AliasSumND computes the sampled sum of a product family on a rectangular
// grid (one Grid per axis) at the angular frequency vector ξ, the exact
// transform and the error, the n-dimensional analogue of AliasSum
// (math.md, "Lattices in n dimensions", diagonal case):
//
//	T = Π_j h_j · Σ_{k ∈ grid} f(x_k) e^{-iξ·x_k},   F = F(ξ),   E = T - F.
//
// The family must implement Factored (Separable, RadialGaussian). Then every
// sum factorises axis by axis, T = Π_j T_j and F = Π_j F_j, where T_j, F_j
// and E_j = T_j - F_j come from AliasSum on axis j. E is formed without
// the cancellation of Π T_j - Π F_j by the recursion
//
//	Q_1 = F_1,  D_1 = E_1,
//	Q_k = Q_{k-1} F_k,
//	D_k = D_{k-1} (F_k + E_k) + Q_{k-1} E_k,
//
// for which D_k = Π_{j≤k} T_j - Π_{j≤k} F_j exactly (expand
// (Q_{k-1} + D_{k-1})(F_k + E_k)), so E = D_n; each term is a product of
// small errors and moderate factors, so E keeps its relative accuracy
// however small it is. The split into aliasing and truncation uses the same
// recursion: the infinite-grid sum is Π_j (F_j + A_j), so
//
//	Alias      = Π_j (F_j + A_j) - Π_j F_j         (recursion with E_j → A_j)
//	Truncation = Π_j T_j - Π_j (F_j + A_j)         (recursion with F_j → F_j + A_j, E_j → R_j)
//
// where A_j and R_j are the per-axis alias and truncation parts.
//
// Settings apply per axis (Tol, Side), except MaxTerms, which is a total
// shared out among the axes: axis j may use the terms the earlier axes left
// over, divided by the number of axes still to go. The Method of the result
// has the per-axis counts summed; Side is the common side, or AutoSide when
// axes used different sides; Remainder is Σ_j r_j Π_{i≠j} |T_i|, the most
// the per-axis unevaluated tails r_j can change the product.
//
// General lattices and families that do not factorise are handled by the
// lattice engine, not here. Errors wrap ErrInvalid (a *ParamError names
// "family", "grids", "grids[j].step", "xi", "xi[j]" or a setting),
// ErrWorkLimit, ErrNotFinite, or the context's error.
func AliasSumND(ctx context.Context, f FamilyND, grids []Grid, xi []float64, set Settings) (SampledSum, error) {
	fac, err := checkAliasNDArgs(f, grids, xi, set)
	if err != nil {
		return SampledSum{}, err
	}
	n := len(fac)
	axes := make([]SampledSum, n)
	total := set.maxTerms()
	var used int64
	for j, fj := range fac {
		s := set
		s.MaxTerms = (total - used) / int64(n-j)
		if s.MaxTerms < 1 {
			return SampledSum{}, workLimitf("settings.max_terms", "%d terms cannot be shared among %d axes", total, n)
		}
		r, err := AliasSum(ctx, fj, grids[j], xi[j], s)
		if err != nil {
			return SampledSum{}, fmt.Errorf("bounds: axis %d: %w", j, err)
		}
		used += r.Method.AliasTerms + r.Method.TruncationTerms
		axes[j] = r
	}
	res := combineAxes(axes)
	if !res.Sampled.IsFinite() || !res.Error.IsFinite() || !res.Exact.IsFinite() {
		return SampledSum{}, fmt.Errorf("bounds: alias sum of %v: %w", f, ErrNotFinite)
	}
	return res, nil
}

// checkAliasNDArgs validates the arguments of AliasSumND and returns the
// factors.
func checkAliasNDArgs(f FamilyND, grids []Grid, xi []float64, set Settings) ([]Family, error) {
	if f == nil {
		return nil, invalidf("family", "missing")
	}
	n := f.Dim()
	if n < 1 || n > MaxDim {
		return nil, invalidf("family", "dimension must be between 1 and %d, got %d", MaxDim, n)
	}
	if v, ok := f.(Validator); ok {
		if err := v.Validate(); err != nil {
			return nil, prefixParam(err, "family")
		}
	}
	if len(grids) != n {
		return nil, invalidf("grids", "need one grid per axis: %d for dimension %d", len(grids), n)
	}
	if len(xi) != n {
		return nil, invalidf("xi", "need one frequency per axis: %d for dimension %d", len(xi), n)
	}
	for j, g := range grids {
		if err := g.Validate("grids[" + strconv.Itoa(j) + "]"); err != nil {
			return nil, err
		}
	}
	for j, v := range xi {
		if !finite(v) {
			return nil, invalidf("xi["+strconv.Itoa(j)+"]", "must be finite, got %g", v)
		}
	}
	if err := set.Validate(); err != nil {
		return nil, err
	}
	ff, ok := f.(Factored)
	if !ok {
		return nil, invalidf("family", "%v does not factorise across axes; sums over general lattices and non-separable families are handled by the lattice engine", f)
	}
	fac := ff.Factors()
	if len(fac) != n {
		return nil, invalidf("family", "%v has %d factors for dimension %d", f, len(fac), n)
	}
	for j, fj := range fac {
		if err := Validate(fj); err != nil {
			return nil, prefixParam(err, "family.factors["+strconv.Itoa(j)+"]")
		}
	}
	return fac, nil
}

// productDiff returns Π_j (base_j + delta_j) - Π_j base_j and Π_j base_j by
// the recursion in AliasSumND; full_j encloses base_j + delta_j (possibly
// more tightly than the sum of the enclosures).
func productDiff(base, delta, full []Complex) (diff, prod Complex) {
	prod, diff = base[0], delta[0]
	for k := 1; k < len(base); k++ {
		diff = diff.Mul(full[k]).Add(prod.Mul(delta[k]))
		prod = prod.Mul(base[k])
	}
	return diff, prod
}

// combineAxes forms the n-dimensional result from the per-axis results.
func combineAxes(axes []SampledSum) SampledSum {
	n := len(axes)
	var buf [6 * MaxDim]Complex // on the stack for n ≤ MaxDim
	all := buf[:]
	if 6*n > len(buf) {
		all = make([]Complex, 6*n)
	}
	F, E, T, A, Tinf, R := all[:n], all[n:2*n], all[2*n:3*n], all[3*n:4*n], all[4*n:5*n], all[5*n:6*n]
	for j, a := range axes {
		F[j], E[j], T[j], A[j], R[j] = a.Exact, a.Error, a.Sampled, a.Alias, a.Truncation
		Tinf[j] = a.Exact.Add(a.Alias)
	}
	var res SampledSum
	res.Error, res.Exact = productDiff(F, E, T)
	res.Alias, _ = productDiff(F, A, Tinf)
	res.Truncation, _ = productDiff(Tinf, R, T)
	// T encloses Π T_j directly and as F + E: both contain the truth.
	direct := T[0]
	for _, t := range T[1:] {
		direct = direct.Mul(t)
	}
	res.Sampled = intersectC(direct, res.Exact.Add(res.Error))
	res.Method = combineMethods(axes)
	return res
}

// intersectC returns z ∩ w, two enclosures of the same number; if rounding
// ever made them disjoint it keeps z.
func intersectC(z, w Complex) Complex {
	re, ok1 := z.Re.Intersect(w.Re)
	im, ok2 := z.Im.Intersect(w.Im)
	if !ok1 || !ok2 {
		return z
	}
	return Complex{re, im}
}

// combineMethods sums the per-axis term counts and weights each axis'
// remainder by the magnitude of the other axes' sums.
func combineMethods(axes []SampledSum) Method {
	var m Method
	from := make([]string, len(axes))
	for j, a := range axes {
		if j == 0 {
			m.Side = a.Method.Side
		} else if a.Method.Side != m.Side {
			m.Side = AutoSide
		}
		m.AliasTerms += a.Method.AliasTerms
		m.TruncationTerms += a.Method.TruncationTerms
		w := a.Method.Remainder
		for i, b := range axes {
			if i != j {
				w = mulUp(w, b.Sampled.Mag())
			}
		}
		if j == 0 {
			m.Remainder = w
		} else {
			m.Remainder = addUp(m.Remainder, w)
		}
		from[j] = a.Method.RemainderFrom
	}
	m.RemainderFrom = strings.Join(from, "; ")
	return m
}
