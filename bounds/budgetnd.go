package bounds

import (
	"context"
	"fmt"
	"math"
)

// BudgetAxis is one axis of a rectangular n-dimensional grid: the factor
// f_j of a separable function f(x) = Π_j f_j(x_j), given exactly (Family)
// or by its envelopes, with the axis's grid and band.
type BudgetAxis struct {
	Family            Family
	Spatial, Spectral Envelope
	Grid              Grid
	Band              Band
}

// FamilyBudgetND bounds the error of the sampled sum of a separable
// function on a rectangular grid, T = Π_j T_j against F = Π_j F_j, from the
// axes' one-dimensional budgets (FamilyBudget or EnvelopeBudget):
//
//	|T∞ - F| = |Π_j (F_j + α_j) - Π_j F_j| ≤ Π_j (M_j + a_j) - Π_j M_j
//	|T∞ - T| = |Π_j (T_j + τ_j) - Π_j T_j| ≤ Π_j (W_j + t_j) - Π_j W_j
//
// (expand the products and use the triangle inequality; both right-hand
// sides grow with every argument), where a_j and t_j are the axis's
// certified aliasing and truncation, M_j ≥ sup_band |F_j|, and
// W_j ≥ |T_j| is the smaller of S_j ≥ h_j Σ_k |f_j(x_k)| and
// M_j + a_j + t_j. Axes given by envelopes bound every function — separable
// or not — with |f(x)| ≤ Π_j spatial_j(x_j) and |F(ξ)| ≤ Π_j spectral_j(ξ_j);
// for them W_j = S_j. The rounding of the sum of N = Π_j N_j terms is
// bounded by recursive summation as in one dimension (roundingBoundND).
//
// Errors are those of FamilyBudget and EnvelopeBudget, with parameter paths
// prefixed by the axis ("axes[1].grid.step").
func FamilyBudgetND(ctx context.Context, axes []BudgetAxis, opt BudgetOptions) (Budget, error) {
	n := len(axes)
	if n < 1 || n > MaxDim {
		return Budget{}, invalidf("axes", "must have between 1 and %d axes, got %d", MaxDim, n)
	}
	if err := opt.validate(); err != nil {
		return Budget{}, err
	}
	parts := make([]axisParts, n)
	for j, a := range axes {
		var (
			b   Budget
			err error
		)
		if a.Family != nil {
			b, err = FamilyBudget(ctx, a.Family, a.Grid, a.Band, opt)
		} else {
			b, err = EnvelopeBudget(ctx, a.Spatial, a.Spectral, a.Grid, a.Band, opt)
		}
		if err != nil {
			return Budget{}, prefixParam(err, fmt.Sprintf("axes[%d]", j))
		}
		spatial, spectral := a.Spatial, a.Spectral
		if a.Family != nil {
			spatial, spectral = a.Family.Spatial(), a.Family.Spectral()
		}
		parts[j] = newAxisParts(a.Family, spatial, spectral, a.Grid, a.Band, opt.AnyShift, b)
	}
	b := composeND(parts, opt.sampleUlps())
	if !finite(b.Total) {
		return Budget{}, fmt.Errorf("bounds: n-d budget: %w", ErrNotFinite)
	}
	return b, nil
}

// axisParts are the certified sizes of one axis that the n-D composition
// needs (see FamilyBudgetND).
type axisParts struct {
	budget Budget  // the axis's own certificate: a_j, t_j
	S      float64 // S_j ≥ h_j Σ_k |f_j(x_k)| (and ≥ ∫ spatial_j ≥ |F_j|)
	M      float64 // M_j ≥ sup_band |F_j|
	W      float64 // W_j ≥ |T_j|
	count  int64
	phase  float64 // |ξ_j|max · X_j, for the rounding of the phases
}

// newAxisParts computes an axis's sizes from its grid, envelopes and
// one-dimensional budget b; f is nil for an axis given by envelopes.
func newAxisParts(f Family, spatial, spectral Envelope, g Grid, band Band, anyShift bool, b Budget) axisParts {
	shifts := shiftRange(g, anyShift)
	S := windowSum(spatial, g, shifts)
	M := math.Min(supTransform(f, spectral, band), S)
	W := S
	if f != nil {
		W = math.Min(S, Point(M).AddFloat(b.Aliasing).AddFloat(b.Truncation).Hi)
	}
	p := axisParts{budget: b, S: S, M: M, W: W, count: g.Count}
	if xm := band.Interval().Mag(); xm != 0 {
		p.phase = Point(xm).Mul(Point(maxAbsX(g, shifts))).Hi
	}
	return p
}

// supTransform bounds sup |F| over the band: the family's transform in
// interval arithmetic over eight pieces of the band, or the spectral
// envelope, whichever is smaller.
func supTransform(f Family, spectral Envelope, band Band) float64 {
	b := band.Interval()
	env := spectral.At(b)
	if f == nil {
		return env
	}
	pieces := 1
	if b.Lo != b.Hi {
		pieces = 8
	}
	m := 0.0
	for i := 0; i < pieces; i++ {
		m = math.Max(m, f.Transform(subinterval(b, i, pieces)).Mag())
	}
	return math.Min(m, env)
}

// composeND is the composition of FamilyBudgetND.
func composeND(parts []axisParts, sampleUlps float64) Budget {
	A, Mp, T, Wp, S := Point(1), Point(1), Point(1), Point(1), Point(1)
	count := int64(1)
	var phase Interval
	anyXi := false
	var b Budget
	b.Exact = true
	for _, p := range parts {
		A = A.Mul(Point(p.M).AddFloat(p.budget.Aliasing))
		Mp = Mp.Mul(Point(p.M))
		T = T.Mul(Point(p.W).AddFloat(p.budget.Truncation))
		Wp = Wp.Mul(Point(p.W))
		S = S.Mul(Point(p.S))
		count *= p.count
		if p.phase != 0 {
			anyXi = true
			phase = phase.AddFloat(p.phase)
		}
		b.Exact = b.Exact && p.budget.Exact
		b.Pieces = max(b.Pieces, p.budget.Pieces)
	}
	b.Aliasing = A.Sub(Mp).Hi
	b.Truncation = T.Sub(Wp).Hi
	b.Rounding = roundingBoundND(count, len(parts), sampleUlps, anyXi, phase, S)
	b.total()
	return b
}

// roundingBoundND bounds the rounding of the n-D sum of N = Π_j N_j terms,
// each a sample times the n steps and the phase e^{-iξ·x}, by recursive
// summation:
//
//	(γ_{N+n+2} + c_f·u + [γ_n·Σ_j |ξ_j| X_j + 4u])·Π_j S_j,
//
// X_j = max |x_j| over the window, the phase terms only when some ξ_j ≠ 0
// (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., 2002,
// §3.1 and §4.2, from memory; the 1-D bound of roundingBound with the dot
// product ξ·x in place of ξx). An infinite grid has no rounding term.
func roundingBoundND(count int64, n int, sampleUlps float64, anyXi bool, phase Interval, S Interval) float64 {
	if count == 0 {
		return 0
	}
	u := Point(unitRoundoff)
	nu := Point(float64(count)).AddFloat(float64(n + 2)).Mul(u)
	rel := nu.Div(Point(1).Sub(nu)).Add(Point(sampleUlps).Mul(u))
	if anyXi {
		gn := Point(float64(n)).Mul(u)
		gn = gn.Div(Point(1).Sub(gn))
		rel = rel.Add(gn.Mul(phase)).Add(u.Scale(4))
	}
	return rel.Mul(S).Hi
}
