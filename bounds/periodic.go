package bounds

import (
	"context"
	"fmt"
	"math"
)

// PeriodicSum is the answer of PeriodicRule for the 2π-periodic function
//
//	f_per(θ) = Σ_{n∈Z} f(θ + 2πn),   with Fourier coefficients c_k = F(k)/(2π),
//
// sampled at the N points θ_j = 2πj/N of one period. Coefficient is the
// discrete Fourier coefficient
//
//	c_k^(N) = (1/N) Σ_{j=0}^{N-1} f_per(θ_j) e^{-ikθ_j} = Σ_{m∈Z} c_{k+mN},
//
// Exact is c_k, and Alias = c_k^(N) - c_k = Σ_{m≠0} c_{k+mN}: the aliasing of
// Fourier coefficients (Trefethen & Weideman, "The exponentially convergent
// trapezoidal rule", SIAM Review 56(3), 2014, §3, from memory). For k = 0,
// 2π·Coefficient is the N-point trapezoidal rule for ∫_0^{2π} f_per and
// 2π·Exact the integral F(0).
type PeriodicSum struct {
	Coefficient Complex
	Exact       Complex
	Alias       Complex
	Method      Method
}

// PeriodicRule computes the aliasing of the Fourier coefficient c_k of the
// periodization of f on N equispaced points. The copies c_{k+mN} are summed
// on the spectral side until the spectral envelope bounds the rest; the
// period is exactly 2π, so no step is rounded. Errors wrap ErrInvalid (n < 1,
// |k| ≥ 2^52, a bad family or an unsummable spectral envelope),
// ErrWorkLimit, ErrNotFinite or the context's error.
func PeriodicRule(ctx context.Context, f Family, n, k int64, set Settings) (PeriodicSum, error) {
	if err := Validate(f); err != nil {
		return PeriodicSum{}, err
	}
	if n < 1 || n > MaxCount {
		return PeriodicSum{}, invalidf("count", "must be between 1 and 2^53, got %d", n)
	}
	if k > 1<<52 || k < -(1<<52) {
		return PeriodicSum{}, invalidf("coefficient", "|k| must be below 2^52, got %d", k)
	}
	if err := set.Validate(); err != nil {
		return PeriodicSum{}, err
	}
	if err := ctx.Err(); err != nil {
		return PeriodicSum{}, fmt.Errorf("bounds: periodic rule: %w", err)
	}
	s := newSummer(ctx, f, Grid{}, Point(0), Point(0), false, set)
	spec := s.spec
	twoPi := TwoPi
	kk := Point(float64(k))
	N := Point(float64(n))
	tail := func(M int64) float64 {
		next := N.Scale(float64(M + 1))
		return addUp(spec.RayTail(kk.Add(next), 1, float64(n)), spec.RayTail(kk.Sub(next), -1, float64(n)))
	}
	exact := f.Transform(kk)
	var sum Complex
	var M int64
	t := tail(0)
	if math.IsInf(t, 1) {
		return PeriodicSum{}, invalidf("family", "%v: spectral envelope is not summable; the periodic alias sum diverges", f)
	}
	for t > s.goal(math.Max(sum.Mag(), 0x1p-60*exact.Mag())) || (M == 0 && t > set.Tol && t > 0) {
		M++
		if err := s.spend(2, "periodic alias sum"); err != nil {
			return PeriodicSum{}, err
		}
		mN := N.Scale(float64(M))
		sum = sum.Add(f.Transform(kk.Add(mN))).Add(f.Transform(kk.Sub(mN)))
		t = tail(M)
	}
	alias := sum.Inflate(t)
	inv := Point(1).Div(twoPi)
	res := PeriodicSum{
		Exact:  exact.MulReal(inv),
		Alias:  alias.MulReal(inv),
		Method: Method{Side: SpectralSide, AliasTerms: 2 * M, Remainder: divUp(t, twoPi.Lo), RemainderFrom: spec.Kinds()},
	}
	res.Coefficient = res.Exact.Add(res.Alias)
	if !res.Coefficient.IsFinite() {
		return PeriodicSum{}, fmt.Errorf("bounds: periodic rule of %v: %w", f, ErrNotFinite)
	}
	return res, nil
}

// StripBound bounds the aliasing of the N-point rule for a 2π-periodic
// function analytic and bounded by M in the strip |Im θ| < a. Its Fourier
// coefficients then satisfy |c_k| ≤ M e^{-a|k|} (shift the contour of
// c_k = (1/2π)∫ f e^{-ikθ} dθ to Im θ = ∓a), so for |k| < N
//
//	|c_k^(N) - c_k| ≤ Σ_{m≠0} M e^{-a|k+mN|} = M (e^{-a(N-|k|)} + e^{-a(N+|k|)}) / (1 - e^{-aN}),
//
// and for the rule itself (k = 0, times 2π)
//
//	|I_N - I| ≤ 4πM / (e^{aN} - 1)
//
// (Trefethen & Weideman 2014, Thm 3.2, from memory). StripBound returns the
// coefficient bound; multiply by 2π for the rule. Errors wrap ErrInvalid.
func StripBound(m, a float64, n, k int64) (float64, error) {
	switch {
	case !finite(m) || m < 0:
		return 0, invalidf("strip.bound", "must be finite and ≥ 0, got %g", m)
	case !finite(a) || a <= 0:
		return 0, invalidf("strip.half_width", "must be finite and > 0, got %g", a)
	case n < 1 || n > MaxCount:
		return 0, invalidf("count", "must be between 1 and 2^53, got %d", n)
	case k <= -n || k >= n:
		return 0, invalidf("coefficient", "|k| must be below the count %d, got %d", n, k)
	}
	A := Point(a)
	ak := Point(math.Abs(float64(k)))
	N := Point(float64(n))
	num := Exp(A.Mul(N.Sub(ak)).Neg()).Add(Exp(A.Mul(N.Add(ak)).Neg()))
	den := Expm1(A.Mul(N).Neg()).Neg()
	r := num.Div(den).Scale(m)
	if !r.IsFinite() {
		return 0, fmt.Errorf("bounds: strip bound: %w", ErrNotFinite)
	}
	return r.Hi, nil
}
