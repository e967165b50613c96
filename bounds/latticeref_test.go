package bounds

import (
	"context"
	"math"
	"math/big"
	"testing"

	"foldbound/internal/bigref"
)

// High-precision references for the containment tests of the families:
// the sampled sum T = h Σ_k f(s+hk)e^{-iξ(s+hk)} summed directly in
// math/big (internal/bigref, 320 bits), with f written out in the test, and
// the closed-form transform F(ξ) evaluated in math/big. Nothing here uses
// the engine's interval arithmetic or its formulas.

// bigFamily is a family's reference: its samples and transform in math/big.
type bigFamily struct {
	// samples returns f(s + hk) for k = lo…hi.
	samples func(h, s float64, lo, hi int64) []bigref.Complex
	// tail bounds h·Σ|f(s+hk)| over k > hi and k < lo (analytic, float64);
	// nil for families whose infinite-grid sums are referenced on the
	// spectral side only.
	tail func(h, s float64, lo, hi int64) float64
	// transform returns F(ξ).
	transform func(xi *big.Float) bigref.Complex
	// specBound, if not nil, is a non-increasing analytic bound
	// |F(ξ)| ≤ specBound(|ξ| - specR) for |ξ| ≥ specR; it lets the
	// reference sum the spectral side of the Poisson formula.
	specBound func(d float64) float64
	specR     float64
	// nonNegative marks f ≥ 0, so that h Σ|f(x_k)| is T at ξ = 0.
	nonNegative bool
}

// bigX returns s + hk exactly (a 53-bit by 64-bit product fits in 320 bits).
func bigX(h, s float64, k int64) *big.Float {
	return bigref.Add(bigref.New(s), bigref.Mul(bigref.New(h), bigref.Int(k)))
}

// phases returns e^{-iξ(s+hk)} for k = lo…hi by the recurrence
// e^{-iξx_{k+1}} = e^{-iξx_k}·e^{-iξh}.
func phases(h, s, xi float64, lo, hi int64) []bigref.Complex {
	out := make([]bigref.Complex, hi-lo+1)
	if xi == 0 {
		for i := range out {
			out[i] = bigref.Real(bigref.Int(1))
		}
		return out
	}
	bxi := bigref.New(xi)
	z := bigref.Cis(bigref.Neg(bigref.Mul(bxi, bigX(h, s, lo))))
	w := bigref.Cis(bigref.Neg(bigref.Mul(bxi, bigref.New(h))))
	for i := range out {
		out[i] = z
		z = z.Mul(w)
	}
	return out
}

// geometricSamples returns e^{-c|x_k - x₀|}, x_k = s + hk, k = lo…hi, for
// c > 0 (x₀ = 0 when nil), by the recurrence
// e^{-c|x_{k±1} - x₀|} = e^{-c|x_k - x₀|}·e^{-ch} on each side of x₀.
func geometricSamples(c, x0 *big.Float, h, s float64, lo, hi int64) []*big.Float {
	out := make([]*big.Float, hi-lo+1)
	if x0 == nil {
		x0 = bigref.Int(0)
	}
	d := func(k int64) *big.Float { return bigref.Sub(bigX(h, s, k), x0) }
	r := bigref.Exp(bigref.Neg(bigref.Mul(c, bigref.New(h))))
	// k0: first index with x_k ≥ x₀.
	k0 := int64(math.Ceil((bigref.Float64(x0) - s) / h))
	for d(k0).Sign() < 0 {
		k0++
	}
	for d(k0-1).Sign() >= 0 {
		k0--
	}
	var e *big.Float
	for k := max(lo, k0); k <= hi; k++ {
		if e == nil {
			e = bigref.Exp(bigref.Neg(bigref.Mul(c, bigref.Abs(d(k)))))
		} else {
			e = bigref.Mul(e, r)
		}
		out[k-lo] = e
	}
	e = nil
	for k := min(hi, k0-1); k >= lo; k-- {
		if e == nil {
			e = bigref.Exp(bigref.Neg(bigref.Mul(c, bigref.Abs(d(k)))))
		} else {
			e = bigref.Mul(e, r)
		}
		out[k-lo] = e
	}
	return out
}

// gaussianSamples returns exp(-x_k²/(2σ²)), k = lo…hi, by the recurrence
// g_{k+1} = g_k·ρ_k, ρ_k = exp(-(2x_k h + h²)/(2σ²)), ρ_{k+1} = ρ_k·e^{-h²/σ²}.
func gaussianSamples(sigma, h, s float64, lo, hi int64) []*big.Float {
	out := make([]*big.Float, hi-lo+1)
	s2 := bigref.Mul(bigref.New(sigma), bigref.New(sigma))
	twoS2 := bigref.Mul(s2, bigref.Int(2))
	bh := bigref.New(h)
	x := bigX(h, s, lo)
	g := bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(x, x), twoS2)))
	rhoArg := bigref.Add(bigref.Mul(bigref.Mul(x, bh), bigref.Int(2)), bigref.Mul(bh, bh))
	rho := bigref.Exp(bigref.Neg(bigref.Quo(rhoArg, twoS2)))
	q := bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(bh, bh), s2)))
	for i := range out {
		out[i] = g
		g = bigref.Mul(g, rho)
		rho = bigref.Mul(rho, q)
	}
	return out
}

// cisSamples returns e^{iω(s+hk)}, k = lo…hi.
func cisSamples(omega, h, s float64, lo, hi int64) []bigref.Complex {
	return phases(h, s, -omega, lo, hi)
}

func realSamples(v []*big.Float) []bigref.Complex {
	out := make([]bigref.Complex, len(v))
	for i, x := range v {
		out[i] = bigref.Real(x)
	}
	return out
}

// bigSum is a reference sampled sum.
type bigSum struct {
	T      bigref.Complex // h Σ f(x_k)e^{-iξx_k}
	err    float64        // bound on |T - exact| (omitted tails and rounding)
	absSum float64        // h Σ |f(x_k)|, for the cancellation criterion
	side   string         // "spatial" or "spectral", how T was summed
	// On the spectral side, alias is Σ_{0<|l|≤L} F(ξ+lP)e^{ilPs} itself,
	// known to high relative accuracy even when T - F cancels.
	alias    *bigref.Complex
	aliasErr float64
}

// roundingErr bounds the rounding error of a math/big sum of n terms of
// total modulus abs: each term and addition errs by far less than 2⁻³⁰⁰
// relative at 320 bits.
func roundingErr(n int64, abs float64) float64 { return float64(n+16) * abs * 0x1p-300 }

// latticeDirectSum returns h Σ_{k=lo}^{hi} f(x_k)e^{-iξx_k}; tail is the bound on
// the samples outside lo…hi (0 for a finite grid).
func latticeDirectSum(ref bigFamily, h, s, xi float64, lo, hi int64, tail float64) bigSum {
	fs := ref.samples(h, s, lo, hi)
	ph := phases(h, s, xi, lo, hi)
	T := bigref.C(0, 0)
	abs := 0.0
	for i := range fs {
		T = T.Add(fs[i].Mul(ph[i]))
		abs += absf(fs[i])
	}
	bh := bigref.New(h)
	return bigSum{T: T.Scale(bh), absSum: abs * h, err: tail + roundingErr(hi-lo+1, abs*h), side: "spatial"}
}

// gridWindow returns the index range of a finite grid, or for an infinite
// grid a window whose analytic tail bound is below 10⁻⁹⁰ of the sum of
// moduli near the centre, and that bound.
func gridWindow(t *testing.T, ref bigFamily, g Grid) (lo, hi int64, tail float64) {
	if !g.Infinite() {
		lo, hi = g.Indices()
		return lo, hi, 0
	}
	c := int64(math.Round(-g.Shift / g.Step))
	head := directAbs(ref, g.Step, g.Shift, c-2, c+2)
	for m := int64(8); ; m *= 2 {
		lo, hi = c-m, c+m
		tail = ref.tail(g.Step, g.Shift, lo, hi)
		if tail <= 1e-90*head {
			return lo, hi, tail
		}
		if m > 1<<20 {
			t.Fatalf("reference window too large for %+v", g)
		}
	}
}

// absf returns |z| in float64 (for sums of moduli, which only the
// cancellation criterion and relative error bounds use).
func absf(z bigref.Complex) float64 {
	return math.Hypot(bigref.Float64(z.Re), bigref.Float64(z.Im))
}

func directAbs(ref bigFamily, h, s float64, lo, hi int64) float64 {
	abs := 0.0
	for _, f := range ref.samples(h, s, lo, hi) {
		abs += absf(f)
	}
	return h * abs
}

// infiniteAbsSum returns h Σ_{k∈Z} |f(s+hk)| (approximately: only the
// cancellation criterion uses it).
func infiniteAbsSum(t *testing.T, ref bigFamily, g Grid) float64 {
	inf := Grid{Step: g.Step, Shift: g.Shift}
	if ref.tail != nil {
		lo, hi, tail := gridWindow(t, ref, inf)
		return directAbs(ref, g.Step, g.Shift, lo, hi) + tail
	}
	return bigref.Float64(spectralSide(t, ref, g.Step, g.Shift, 0).T.Re)
}

// spectralSide returns the reference T on the infinite grid from the other
// side of the Poisson formula (Stein & Weiss, Ch. VII, from memory; the
// families here satisfy its hypotheses: f and F continuous and O(|x|^{-2})),
//
//	T = Σ_{|l|≤L} F(ξ + 2πl/h)·e^{i2πls/h} + R,
//
// with L chosen so that the analytic bound Σ_{|l|>L} specBound(|ξ+lP| - R₀)
// on |R| is below 10⁻¹⁰⁰ of the partial sum's modulus (or underflows).
func spectralSide(t *testing.T, ref bigFamily, h, s, xi float64) bigSum {
	P := 2 * math.Pi / h
	tailFrom := func(L int64) float64 {
		sum := 0.0
		for l := L + 1; ; l++ {
			d := float64(l)*P - math.Abs(xi) - ref.specR
			if d < 0 {
				return math.Inf(1)
			}
			b := 2 * ref.specBound(d)
			sum += b
			if b == 0 || b < 1e-30*sum {
				return sum * (1 + 1e-20)
			}
			if l-L > 1<<20 {
				t.Fatalf("spectral reference tail does not converge")
			}
		}
	}
	bP := bigref.Quo(bigref.Mul(bigref.Pi(), bigref.Int(2)), bigref.New(h))
	bxi := bigref.New(xi)
	// e^{ilθ}, θ = 2πs/h, by the recurrence e^{i(l+1)θ} = e^{ilθ}·e^{iθ}.
	step := bigref.Cis(bigref.Mul(bP, bigref.New(s)))
	ph := bigref.C(1, 0)
	F0 := ref.transform(bxi)
	alias := bigref.C(0, 0)
	for L := int64(1); ; L++ {
		ph = ph.Mul(step)
		lp := bigref.Mul(bP, bigref.Int(L))
		right := ref.transform(bigref.Add(bxi, lp)).Mul(ph)
		left := ref.transform(bigref.Sub(bxi, lp)).Mul(bigref.Complex{Re: ph.Re, Im: bigref.Neg(ph.Im)})
		alias = alias.Add(right).Add(left)
		if float64(L)*P < math.Abs(xi)+ref.specR {
			continue
		}
		T := alias.Add(F0)
		mag, amag := absf(T), absf(alias)
		if tl := tailFrom(L); tl <= 1e-100*mag || tl == 0 || (tl < 1e-300 && L > 4) {
			return bigSum{T: T, err: tl + roundingErr(2*L+1, mag), side: "spectral",
				alias: &alias, aliasErr: tl + roundingErr(2*L+1, amag)}
		}
		if L > 1<<16 {
			t.Fatalf("spectral reference needs more than %d copies", L)
		}
	}
}

// containCase is one AliasSum call checked against the reference.
type containCase struct {
	g   Grid
	xi  float64
	set Settings
}

// containStats collects the figures the tests report.
type containStats struct {
	cases        int
	worstWidthT  float64 // largest relative width of Sampled where checked
	worstWidthE  float64 // largest relative width of Error where checked
	checkedWidth int
	longSums     int // cases with more than maxWidthTerms terms (no width check)
	spectralRefs int // cases referenced on the spectral side
	unresolved   int // cases whose reference error is not small against the enclosure
}

// maxWidthTerms is the largest number of summed terms for which the
// containment tests require relative widths ≤ 1e-12.
const maxWidthTerms = 4096

// relWidth returns the width of the complex enclosure z relative to |v|.
func relWidth(z Complex, v float64) float64 {
	return math.Max(z.Re.Width(), z.Im.Width()) / v
}

// checkContainment calls AliasSum for each case and checks that the
// reference values lie in the enclosures Sampled, Exact and Error (and, for
// infinite grids, Alias). The reference T is the direct spatial sum in
// math/big; on infinite grids its omitted tail is bounded analytically. Where
// that bound, or the 320-bit rounding of a sum that cancels to a tiny value,
// is not small against the enclosure (or the family has no spatial tail
// bound: algebraic decay), T is instead summed on the spectral side in
// math/big with an analytic tail bound (spectralSide). A reference whose own
// error bound e is not below 10⁻³ of the enclosure's width is checked only
// for overlap (the ball of radius e must meet the enclosure) and counted as
// unresolved.
//
// It also checks that enclosures are narrow, relative width ≤ 1e-12,
// wherever the value is not tiny (> 1e-300) and not dominated by
// cancellation among the parts the engine computed it from, which we take
// to mean, with S = h Σ_k |f(x_k)| over the grid and, when the spectral side
// was used, S also at least |F|, |Alias|, |Truncation| and, for a finite
// grid, h Σ_{k∈Z} |f(x_k)| (the truncation part sums the omitted samples):
//
//	Sampled  |T| ≥ 0.1·S
//	Error    |E| ≥ 0.1·max(S, |F|), or the spectral side summed an infinite
//	         grid at shift 0, where the alias copies of our non-negative
//	         transforms all add up, and |E| ≥ 10⁻³⁰·|T| (far smaller
//	         aliasing errors are values like e^{-u}, u > 70, whose relative
//	         width is u times that of u, however they are summed),
//
// and where the engine summed at most maxWidthTerms terms: the width of a
// sum of N terms grows like N ulps, one outward rounding per addition in
// Interval.Add, which is the engine's summation, not the family's
// enclosures (see TestSummationWidthGrowth).
func checkContainment(t *testing.T, fam Family, ref bigFamily, cases []containCase) containStats {
	t.Helper()
	var st containStats
	for _, tc := range cases {
		res, err := AliasSum(context.Background(), fam, tc.g, tc.xi, tc.set)
		if err != nil {
			t.Errorf("AliasSum(%v, %+v, ξ=%g, %+v): %v", fam, tc.g, tc.xi, tc.set, err)
			continue
		}
		st.cases++
		g := tc.g
		halfWidth := 0.5 * math.Min(math.Max(res.Sampled.Re.Width(), res.Sampled.Im.Width()),
			math.Max(res.Error.Re.Width(), res.Error.Im.Width()))
		var ts bigSum
		if !g.Infinite() || ref.tail != nil {
			lo, hi, tail := gridWindow(t, ref, g)
			ts = latticeDirectSum(ref, g.Step, g.Shift, tc.xi, lo, hi, tail)
		}
		if g.Infinite() && ref.specBound != nil && (ref.tail == nil || ts.err > 1e-3*halfWidth) {
			S := ts.absSum
			ts = spectralSide(t, ref, g.Step, g.Shift, tc.xi)
			if ref.tail == nil {
				if !ref.nonNegative {
					t.Fatal("no spatial sum of moduli for the width criterion")
				}
				S = bigref.Float64(spectralSide(t, ref, g.Step, g.Shift, 0).T.Re)
			}
			ts.absSum = S
			st.spectralRefs++
		}
		F := ref.transform(bigref.New(tc.xi))
		E, eErr := ts.T.Sub(F), ts.err
		if ts.alias != nil && ts.aliasErr < eErr {
			E, eErr = *ts.alias, ts.aliasErr
		}
		weak := false
		in := func(name string, z Complex, v bigref.Complex, e float64) {
			if e > 1e-3*0.5*math.Max(z.Re.Width(), z.Im.Width()) {
				weak = true
			}
			if !v.In(z.Re.Lo-e, z.Re.Hi+e, z.Im.Lo-e, z.Im.Hi+e) {
				t.Errorf("%v, %+v, ξ=%g: %s = %v, want it to contain %.20g + i%.20g ± %.2g (math/big %s reference), engine side %v",
					fam, g, tc.xi, name, z, v.Re, v.Im, e, ts.side, res.Method.Side)
			}
		}
		in("Sampled", res.Sampled, ts.T, ts.err)
		in("Exact", res.Exact, F, 0)
		in("Error", res.Error, E, eErr)
		if g.Infinite() {
			in("Alias", res.Alias, E, eErr)
		}
		if weak {
			st.unresolved++
			t.Logf("unresolved: %v, %+v, ξ=%g: Sampled %v, Error %v; reference T ± %.2g, E = %.6g ± %.2g (%s)",
				fam, g, tc.xi, res.Sampled, res.Error, ts.err, bigref.Float64(E.Re), eErr, ts.side)
		}
		if n := res.Method.AliasTerms + res.Method.TruncationTerms; n > maxWidthTerms {
			st.longSums++
			continue
		}
		tAbs := bigref.Float64(ts.T.Abs())
		fAbs := bigref.Float64(F.Abs())
		eAbs := bigref.Float64(E.Abs())
		S := ts.absSum
		if res.Method.Side == SpectralSide {
			S = math.Max(S, math.Max(fAbs, math.Max(res.Alias.Mag(), res.Truncation.Mag())))
			if !g.Infinite() {
				// The truncation part sums every omitted sample.
				S = math.Max(S, infiniteAbsSum(t, ref, g))
			}
		}
		if tAbs > 1e-300 && tAbs >= 0.1*S {
			w := relWidth(res.Sampled, tAbs)
			st.worstWidthT = math.Max(st.worstWidthT, w)
			st.checkedWidth++
			if w > 1e-12 {
				t.Errorf("%v, %+v, ξ=%g: Sampled = %v, relative width %.3g > 1e-12", fam, g, tc.xi, res.Sampled, w)
			}
		}
		zeroShift := math.Mod(g.Shift, g.Step) == 0
		spectralExact := res.Method.Side == SpectralSide && g.Infinite() && zeroShift && eAbs >= 1e-30*tAbs
		if eAbs > 1e-300 && (eAbs >= 0.1*math.Max(S, fAbs) || spectralExact) {
			w := relWidth(res.Error, eAbs)
			st.worstWidthE = math.Max(st.worstWidthE, w)
			st.checkedWidth++
			if w > 1e-12 {
				t.Errorf("%v, %+v, ξ=%g: Error = %v, relative width %.3g > 1e-12 (engine side %v)", fam, g, tc.xi, res.Error, w, res.Method.Side)
			}
		}
	}
	t.Logf("%v: %d cases (%d spectral-side references, %d unresolved, %d longer than %d terms), %d width checks, worst relative width: Sampled %.2g, Error %.2g",
		fam, st.cases, st.spectralRefs, st.unresolved, st.longSums, maxWidthTerms, st.checkedWidth, st.worstWidthT, st.worstWidthE)
	return st
}

// standardCases returns at least 40 grids and frequencies for a family of
// length scale L (spatial) : steps from coarse (2L) to fine (L/16), shifts
// 0, fractions of h and offsets of a few L, frequencies from 0 to beyond
// the Nyquist frequency π/h, infinite grids and finite ones of 1 to 81
// samples.
func standardCases(L float64) []containCase {
	var out []containCase
	steps := []float64{2 * L, L, 0.5 * L, 0.3 * L, 0.125 * L, L / 16}
	for i, h := range steps {
		nyq := math.Pi / h
		out = append(out,
			containCase{g: Grid{Step: h}},
			containCase{g: Grid{Step: h, Shift: 0.3 * h}, xi: 0.5 * nyq},
			containCase{g: Grid{Step: h, Shift: -1.7 * L}, xi: 0.9 * nyq},
			containCase{g: Grid{Step: h, Shift: 0.5 * h}, xi: 1.3 * nyq},
			containCase{g: Grid{Step: h, Shift: 2.2 * L, Count: 1}, xi: 0.2 * nyq},
			containCase{g: Grid{Step: h, Count: int64(5 + 8*i)}},
			containCase{g: Grid{Step: h, Shift: 0.37 * h, Count: int64(4 + 15*i)}, xi: 0.7 * nyq},
			containCase{g: Grid{Step: h, Shift: -0.8 * L, Count: 81}, xi: 1.0 / L},
		)
	}
	return out
}

// expTail returns a tail bound for |f(x)| ≤ A·e^{-α|x - c|}:
//
//	h·Σ_{k>hi} A e^{-α(x_k - c)} = hA·e^{-α(x_{hi+1} - c)}/(1 - e^{-αh})
//
// on the right (when x_{hi+1} ≥ c) and its mirror on the left; +Inf when
// the window does not yet cover c.
func expTail(A, c, alpha float64) func(h, s float64, lo, hi int64) float64 {
	return func(h, s float64, lo, hi int64) float64 {
		r, l := s+h*float64(hi+1)-c, c-(s+h*float64(lo-1))
		if r < 0 || l < 0 {
			return math.Inf(1)
		}
		return h * A * (math.Exp(-alpha*r) + math.Exp(-alpha*l)) / -math.Expm1(-alpha*h)
	}
}

// gaussTail returns a tail bound for |f(x)| ≤ A·exp(-(x-c)²/(2σ²)): the
// terms beyond x_{hi+1} ≥ c have consecutive ratios at most
// ρ = exp(-(2(x_{hi+1}-c)h + h²)/(2σ²)), so the ray sums to at most
// h·g(x_{hi+1})/(1 - ρ) (math.md, "Envelopes and their bounds"); the same on
// the left.
func gaussTail(A, c, sigma float64) func(h, s float64, lo, hi int64) float64 {
	ray := func(d, h float64) float64 {
		g := math.Exp(-d * d / (2 * sigma * sigma))
		rho := math.Exp(-(2*d*h + h*h) / (2 * sigma * sigma))
		return h * A * g / (1 - rho)
	}
	return func(h, s float64, lo, hi int64) float64 {
		r, l := s+h*float64(hi+1)-c, c-(s+h*float64(lo-1))
		if r < 0 || l < 0 {
			return math.Inf(1)
		}
		return ray(r, h) + ray(l, h)
	}
}

// pointSamples evaluates a reference function sample by sample.
func pointSamples(f func(x *big.Float) bigref.Complex) func(h, s float64, lo, hi int64) []bigref.Complex {
	return func(h, s float64, lo, hi int64) []bigref.Complex {
		out := make([]bigref.Complex, hi-lo+1)
		for k := lo; k <= hi; k++ {
			out[k-lo] = f(bigX(h, s, k))
		}
		return out
	}
}
