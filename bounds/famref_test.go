package bounds

import (
	"math"
	"math/big"
	"testing"

	"foldbound/internal/bigref"
)

// Reference sampled sums in math/big (bigref.Prec = 320 bits) for the
// containment tests of AliasSum and AliasSumND: the sums are taken
// directly on the spatial side, term by term, and the exact transforms are
// evaluated from their closed forms in math/big; nothing here uses the
// engine's interval arithmetic.
//
// Sample positions x_k = s + hk are exact in 320 bits. Phases e^{-iξx_k}
// and Gaussian values are advanced by exact recurrences
// (e^{-iξx_{k+1}} = e^{-iξx_k}·e^{-iξh}; g(x_{k+1}) = g(x_k)·A·B^k with
// A, B from bigref.Exp), each step rounding to 320 bits, so after n ≤ 10⁴
// steps the relative error is below n·2⁻³¹⁸ < 1e-91. Gaussian sums are cut
// where |x - c| > 20σ: by integral comparison the omitted part is at most
// 2(h + σ√(π/2))e^{-200} < 1e-86·(1 + h/σ)·σ√(2π). So every reference is
// within refSlack·S of the truth (S the scale below, at most 3 axes,
// h ≤ 4σ), and containment is checked for the enclosure widened by that
// much: a real check for every value above 1e-80·S. (Alias sums smaller
// than that, on the spectral side, are checked to 1e-31 against θ3 in
// theta_test.go.)

// refAxis is one axis of a reference computation: a real family with its
// value and transform in math/big, and the x-range outside which it is 0
// (compact) or negligible.
type refAxis struct {
	name      string
	value     func(x *big.Float) *big.Float // nil for Gaussians (recurrence)
	transform func(xi float64) bigref.Complex
	lo, hi    float64
	// Gaussian exp(-(x-c)²/(2σ²)), summed by recurrence when sigma > 0.
	sigma, center float64
}

func refGaussian(sigma, c float64) refAxis {
	return refAxis{
		name: "gaussian", sigma: sigma, center: c, lo: c - 20*sigma, hi: c + 20*sigma,
		transform: func(xi float64) bigref.Complex {
			// σ√(2π) e^{-σ²ξ²/2} e^{-iξc}
			s := bigref.New(sigma)
			x := bigref.New(xi)
			amp := bigref.Mul(s, bigref.Sqrt(bigref.Mul(bigref.Int(2), bigref.Pi())))
			sx := bigref.Mul(s, x)
			amp = bigref.Mul(amp, bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(sx, sx), bigref.Int(2)))))
			if c == 0 || xi == 0 {
				return bigref.Real(amp)
			}
			return bigref.Cis(bigref.Neg(bigref.Mul(x, bigref.New(c)))).Scale(amp)
		},
	}
}

func refBSpline(m int) refAxis {
	h := float64(m) / 2
	return refAxis{
		name: "bspline", lo: -h, hi: h,
		value: func(x *big.Float) *big.Float { return bigBSplineDP(m, x) },
		transform: func(xi float64) bigref.Complex {
			if xi == 0 {
				return bigref.Real(bigref.Int(1))
			}
			u := bigref.New(xi / 2) // exact
			s := bigref.Quo(bigref.Sin(u), u)
			p := bigref.Int(1)
			for j := 0; j < m; j++ {
				p = bigref.Mul(p, s)
			}
			return bigref.Real(p)
		},
	}
}

func refKaiserBessel(w, beta float64) refAxis {
	return refAxis{
		name: "kaiser_bessel", lo: -w / 2, hi: w / 2,
		value: func(x *big.Float) *big.Float { return bigKaiserBessel(w, beta, x) },
		transform: func(xi float64) bigref.Complex {
			return bigref.Real(bigKaiserBesselTransform(w, beta, xi))
		},
	}
}

// bigBSplineDP is the recurrence of bsplineRecur (de Boor) evaluated
// bottom-up: order m - j is needed at the j+1 points x + i - j/2,
// i = 0..j, so the work is O(m²) instead of 2^m.
func bigBSplineDP(m int, x *big.Float) *big.Float {
	// Order 1 at the m points x + i - (m-1)/2.
	vals := make([]*big.Float, m)
	for i := range vals {
		vals[i] = bigBSpline(1, bigref.Add(x, bigref.New(float64(i)-float64(m-1)/2)))
	}
	for order := 2; order <= m; order++ {
		j := m - order // points x + i - j/2, i = 0..j
		hh := bigref.New(float64(order) / 2)
		next := make([]*big.Float, j+1)
		for i := 0; i <= j; i++ {
			y := bigref.Add(x, bigref.New(float64(i)-float64(j)/2))
			// M_order(y) from M_{order-1}(y ± 1/2) = vals[i+1], vals[i].
			a := bigref.Mul(bigref.Add(hh, y), vals[i+1])
			b := bigref.Mul(bigref.Sub(hh, y), vals[i])
			next[i] = bigref.Quo(bigref.Add(a, b), bigref.Int(int64(order-1)))
		}
		vals = next
	}
	return vals[0]
}

// axisTerms returns the terms h·f(x_k)·e^{-iξx_k} for k = k0..k1, and
// Σ_k h|f(x_k)|.
func (a refAxis) terms(g Grid, xi float64, k0, k1 int64) ([]bigref.Complex, *big.Float) {
	n := int(k1 - k0 + 1)
	if n <= 0 {
		return nil, bigref.Int(0)
	}
	h := bigref.New(g.Step)
	x0 := bigref.Add(bigref.New(g.Shift), bigref.Mul(h, bigref.Int(k0)))
	out := make([]bigref.Complex, n)
	abs := bigref.Int(0)
	// Values.
	vals := make([]*big.Float, n)
	if a.sigma > 0 {
		s2 := bigref.Mul(bigref.New(a.sigma), bigref.New(a.sigma))
		twoS2 := bigref.Mul(bigref.Int(2), s2)
		d := bigref.Sub(x0, bigref.New(a.center))
		v := bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(d, d), twoS2)))
		// ratio g(x_{k+1})/g(x_k) = exp(-(2dh + h²)/(2σ²)), times B = exp(-h²/σ²) per step
		A := bigref.Exp(bigref.Neg(bigref.Quo(bigref.Add(bigref.Mul(bigref.Int(2), bigref.Mul(d, h)), bigref.Mul(h, h)), twoS2)))
		B := bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(h, h), s2)))
		for i := 0; i < n; i++ {
			vals[i] = v
			v = bigref.Mul(v, A)
			A = bigref.Mul(A, B)
		}
	} else {
		x := x0
		for i := 0; i < n; i++ {
			vals[i] = a.value(x)
			x = bigref.Add(x, h)
		}
	}
	var ph, w bigref.Complex
	if xi != 0 {
		ph = bigref.Cis(bigref.Neg(bigref.Mul(bigref.New(xi), x0)))
		w = bigref.Cis(bigref.Neg(bigref.Mul(bigref.New(xi), h)))
	}
	for i := 0; i < n; i++ {
		hv := bigref.Mul(h, vals[i])
		abs = bigref.Add(abs, bigref.Abs(hv))
		if xi == 0 {
			out[i] = bigref.Real(hv)
		} else {
			out[i] = ph.Scale(hv)
			ph = ph.Mul(w)
		}
	}
	return out, abs
}

// window returns the indices k0..k1 of the infinite grid whose samples may
// be non-zero (non-negligible), with a margin of one.
func (a refAxis) window(g Grid) (int64, int64) {
	return int64(math.Floor((a.lo-g.Shift)/g.Step)) - 1, int64(math.Ceil((a.hi-g.Shift)/g.Step)) + 1
}

// refResult holds a reference SampledSum and its scale
// S = Π_j max(h_j Σ_{k∈Z} |f_j(x_k)|, |F_j(ξ_j)|).
type refResult struct {
	sampled, exact, err, alias, trunc bigref.Complex
	scale                             *big.Float
}

// refSum computes the reference for a product of axes on rectangular grids.
// The n-D sums are taken directly over all index tuples when there are at
// most maxDirect of them; otherwise (fine grids only) as the product of the
// one-dimensional sums, which equals the n-D sum of a product of finite
// sums exactly (distributivity).
func refSum(axes []refAxis, grids []Grid, xi []float64, maxDirect int) refResult {
	n := len(axes)
	infTerms := make([][]bigref.Complex, n)
	finTerms := make([][]bigref.Complex, n)
	scale := bigref.Int(1)
	exact := bigref.Real(bigref.Int(1))
	count := 1
	for j, a := range axes {
		k0, k1 := a.window(grids[j])
		all, abs := a.terms(grids[j], xi[j], k0, k1)
		infTerms[j] = all
		count *= len(all)
		finTerms[j] = all
		if !grids[j].Infinite() {
			lo, hi := grids[j].Indices()
			f0, f1 := max(lo, k0), min(hi, k1)
			finTerms[j] = nil
			if f0 <= f1 {
				finTerms[j] = all[f0-k0 : f1-k0+1]
			}
		}
		F := a.transform(xi[j])
		if FA := F.Abs(); FA.Cmp(abs) > 0 {
			abs = FA
		}
		scale = bigref.Mul(scale, abs)
		exact = exact.Mul(F)
	}
	sum := func(ts [][]bigref.Complex) bigref.Complex {
		if count <= maxDirect {
			return directSum(ts)
		}
		p := bigref.Real(bigref.Int(1))
		for _, t := range ts {
			s := bigref.Real(bigref.Int(0))
			for _, v := range t {
				s = s.Add(v)
			}
			p = p.Mul(s)
		}
		return p
	}
	tinf := sum(infTerms)
	tfin := sum(finTerms)
	return refResult{
		sampled: tfin, exact: exact, err: tfin.Sub(exact),
		alias: tinf.Sub(exact), trunc: tfin.Sub(tinf), scale: scale,
	}
}

// directSum returns Σ over all index tuples of Π_j ts[j][k_j], adding
// every term separately (the partial products of the leading factors are
// reused, which changes nothing but the work).
func directSum(ts [][]bigref.Complex) bigref.Complex {
	total := bigref.Real(bigref.Int(0))
	var walk func(j int, prefix bigref.Complex)
	walk = func(j int, prefix bigref.Complex) {
		for _, v := range ts[j] {
			p := prefix.Mul(v)
			if j == len(ts)-1 {
				total = total.Add(p)
			} else {
				walk(j+1, p)
			}
		}
	}
	walk(0, bigref.Real(bigref.Int(1)))
	return total
}

// widthStats collects the worst enclosure widths of a containment test.
type widthStats struct {
	worstRel  float64 // worst relative width among non-tiny components
	worstAbs  float64 // worst width relative to the scale S, all components
	contained int
}

// Width criterion of the containment tests. A component z is "not tiny"
// when |z| ≥ notTiny·S, S = Π_j max(h_j Σ_{k∈Z} |f_j(x_k)|, |F_j(ξ_j)|)
// the sum's natural scale (the size of the terms that enter it, over the
// infinite grid); there its enclosure must have relative width ≤ relTol.
// Every component's width must be ≤ absTol·S, whatever its size: a
// spatial-side sum cannot resolve an error far below the rounding of its
// own terms (about 1e-16·S per term).
const (
	refSlack = 1e-80
	notTiny  = 0.1
	relTol   = 1e-12
	absTol   = 1e-12
)

// checkSum checks that every part of got contains its reference and meets
// the width criterion, and records the widths in st.
func checkSum(t *testing.T, name string, got SampledSum, ref refResult, st *widthStats) {
	t.Helper()
	S := bigref.Float64(ref.scale)
	parts := []struct {
		what string
		z    Complex
		want bigref.Complex
	}{
		{"sampled", got.Sampled, ref.sampled},
		{"exact", got.Exact, ref.exact},
		{"error", got.Error, ref.err},
		{"alias", got.Alias, ref.alias},
		{"truncation", got.Truncation, ref.trunc},
	}
	for _, p := range parts {
		d := refSlack * S
		if !p.want.In(p.z.Re.Lo-d, p.z.Re.Hi+d, p.z.Im.Lo-d, p.z.Im.Hi+d) {
			t.Errorf("%s: %s = %v, want it to contain %.17g%+.17gi", name, p.what, p.z,
				bigref.Float64(p.want.Re), bigref.Float64(p.want.Im))
			continue
		}
		st.contained++
		w := math.Max(p.z.Re.Width(), p.z.Im.Width())
		mag := bigref.Float64(p.want.Abs())
		if S > 0 {
			st.worstAbs = math.Max(st.worstAbs, w/S)
			if w > absTol*S {
				t.Errorf("%s: %s = %v: width %.3g exceeds %.0e of the scale %.3g", name, p.what, p.z, w, absTol, S)
			}
		}
		if mag >= notTiny*S && mag > 0 {
			st.worstRel = math.Max(st.worstRel, w/mag)
			if w > relTol*mag {
				t.Errorf("%s: %s = %v: relative width %.3g, want ≤ %.0e", name, p.what, p.z, w/mag, relTol)
			}
		}
	}
}
