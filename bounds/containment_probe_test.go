package bounds

// Containment probes of the fast paths (rounding helpers, thin-argument
// shortcuts, tabulated series, the Gaussian alias path, B-spline pieces and
// ray bounds): random and edge inputs, every enclosure checked against an
// outside reference (exact math/big arithmetic, or foldbound/internal/bigref
// and series written here at 320 bits and more).

import (
	"context"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"foldbound/internal/bigref"
)

// exactBig returns x exactly (float64 needs at most 1100 bits of a big.Float
// to hold sums exactly: we use 2200).
func exactBig(x float64) *big.Float { return new(big.Float).SetPrec(2200).SetFloat64(x) }

func inBigExact(lo, hi float64, v *big.Float) bool {
	if math.IsNaN(lo) || math.IsNaN(hi) {
		return false
	}
	if !math.IsInf(lo, -1) && exactBig(lo).Cmp(v) > 0 {
		return false
	}
	if !math.IsInf(hi, 1) && v.Cmp(exactBig(hi)) > 0 {
		return false
	}
	return true
}

// probeFloat draws edge-heavy float64 values: subnormals, ±0, near
// MaxFloat64, near minExact, random bits.
func probeFloat(r *rand.Rand) float64 {
	switch r.IntN(8) {
	case 0:
		return math.Copysign(0, randSign(r))
	case 1:
		return randNear(r, randSign(r)*0x1p-968, 3)
	case 2:
		v := randNear(r, randSign(r)*math.MaxFloat64, 2)
		if math.IsInf(v, 0) {
			v = math.Copysign(math.MaxFloat64, v)
		}
		return v
	case 3:
		return randNear(r, randSign(r)*math.SmallestNonzeroFloat64, 3)
	}
	return randFloat(r)
}

// TestProbeRoundingPrimitives checks addOut, subOut, mulOut, scale2,
// mulPos and nextUp against exact big.Float arithmetic (and
// math.Nextafter), on finite inputs of every magnitude.
func TestProbeRoundingPrimitives(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 11))
	n := 30000
	for i := 0; i < n; i++ {
		a, b, c, d := probeFloat(r), probeFloat(r), probeFloat(r), probeFloat(r)
		if i%3 == 0 {
			c, d = a, b
		}
		lo, hi := addOut(a, b, c, d)
		if s := new(big.Float).SetPrec(2200).Add(exactBig(a), exactBig(b)); !inBigExact(lo, math.Inf(1), s) {
			t.Fatalf("addOut lo: %g + %g ≥ %g fails", a, b, lo)
		}
		if s := new(big.Float).SetPrec(2200).Add(exactBig(c), exactBig(d)); !inBigExact(math.Inf(-1), hi, s) {
			t.Fatalf("addOut hi: %g + %g ≤ %g fails", c, d, hi)
		}
		lo, hi = subOut(a, b, c, d)
		if s := new(big.Float).SetPrec(2200).Sub(exactBig(a), exactBig(b)); !inBigExact(lo, math.Inf(1), s) {
			t.Fatalf("subOut lo: %g - %g ≥ %g fails", a, b, lo)
		}
		if s := new(big.Float).SetPrec(2200).Sub(exactBig(c), exactBig(d)); !inBigExact(math.Inf(-1), hi, s) {
			t.Fatalf("subOut hi: %g - %g ≤ %g fails", c, d, hi)
		}
		lo, hi = mulOut(a, b, c, d)
		if s := new(big.Float).SetPrec(2200).Mul(exactBig(a), exactBig(b)); !inBigExact(lo, math.Inf(1), s) {
			t.Fatalf("mulOut lo: %g · %g ≥ %g fails", a, b, lo)
		}
		if s := new(big.Float).SetPrec(2200).Mul(exactBig(c), exactBig(d)); !inBigExact(math.Inf(-1), hi, s) {
			t.Fatalf("mulOut hi: %g · %g ≤ %g fails", c, d, hi)
		}
		if got, want := nextUp(a), math.Nextafter(a, math.Inf(1)); got != want && !(a == 0 && got == math.SmallestNonzeroFloat64) {
			t.Fatalf("nextUp(%g) = %g, want %g", a, got, want)
		}
		if got, want := nextDown(a), math.Nextafter(a, math.Inf(-1)); got != want && !(a == 0 && got == -math.SmallestNonzeroFloat64) {
			t.Fatalf("nextDown(%g) = %g, want %g", a, got, want)
		}
		x := Interval{math.Min(a, b), math.Max(a, b)}
		for _, k := range []float64{0.5, -0.5, 2, -2} {
			y := x.scale2(k)
			for _, v := range []float64{x.Lo, x.Hi} {
				p := new(big.Float).SetPrec(2200).Mul(exactBig(v), exactBig(k))
				if !inBigExact(y.Lo, y.Hi, p) {
					t.Fatalf("%v.scale2(%g) = %v misses %g·%g", x, k, y, v, k)
				}
			}
		}
		if x.Lo >= 0 {
			z := Interval{math.Abs(c), math.Abs(c)}
			if math.Abs(d) > z.Hi {
				z.Hi = math.Abs(d)
			} else {
				z.Lo = math.Abs(d)
			}
			y := x.mulPos(z)
			for _, v := range [][2]float64{{x.Lo, z.Lo}, {x.Hi, z.Hi}} {
				if v[0] == 0 && math.IsInf(v[1], 0) || v[1] == 0 && math.IsInf(v[0], 0) {
					continue
				}
				p := new(big.Float).SetPrec(2200).Mul(exactBig(v[0]), exactBig(v[1]))
				if !inBigExact(y.Lo, y.Hi, p) {
					t.Fatalf("%v.mulPos(%v) = %v misses %g·%g", x, z, y, v[0], v[1])
				}
			}
		}
	}
	// Infinite operands.
	inf := math.Inf(1)
	for _, v := range []float64{inf, -inf, 0, 1, -1, math.MaxFloat64} {
		for _, w := range []float64{inf, -inf, 0, 1, -1, math.MaxFloat64} {
			lo, hi := addOut(v, w, v, w)
			if lo > v+w || hi < v+w && !math.IsNaN(v+w) {
				t.Errorf("addOut(%g, %g) = [%g, %g]", v, w, lo, hi)
			}
			lo, hi = mulOut(v, w, v, w)
			p := v * w
			if math.IsNaN(p) {
				p = 0
			}
			if lo > p || hi < p {
				t.Errorf("mulOut(%g, %g) = [%g, %g]", v, w, lo, hi)
			}
		}
	}
}

// probeSinhcSeriesBig returns Σ_{k≥0} z^k/(2k+1)! (sinh(√z)/√z, sin(√-z)/√-z) at
// 320 bits by its Maclaurin series (DLMF 4.33.1, 4.19.1), for |z| ≤ 50.
func probeSinhcSeriesBig(z *big.Float) *big.Float {
	p := uint(bigref.Prec + 64)
	sum := new(big.Float).SetPrec(p).SetInt64(1)
	term := new(big.Float).SetPrec(p).SetInt64(1)
	eps := new(big.Float).SetPrec(p).SetMantExp(big.NewFloat(1), -int(p)-8)
	for k := int64(1); k < 400; k++ {
		term.Mul(term, z)
		term.Quo(term, new(big.Float).SetPrec(p).SetInt64((2*k)*(2*k+1)))
		sum.Add(sum, term)
		if new(big.Float).Abs(term).Cmp(eps) < 0 && k > 30 {
			break
		}
	}
	return sum
}

// probeSpecialArgs returns arguments near the switches of the special
// functions: √sinhcReach[n] (where the series length changes, in x for
// Sinc/Sinhc, and sinhcReach[n] itself in z for SinhcSqrt), the series
// radius 1, sincFirstMin, 700, 0, -0 and subnormals.
func probeSpecialArgs(r *rand.Rand) []float64 {
	var xs []float64
	for n := 1; n < len(sinhcReach); n++ {
		for k := 0; k < 6; k++ {
			xs = append(xs, randNear(r, math.Sqrt(sinhcReach[n]), 4), randNear(r, sinhcReach[n], 4))
		}
	}
	for _, c := range []float64{1, sincFirstMin, 700, 0x1p-26, 0x1p-40, 21, 4.4934, 715} {
		for k := 0; k < 20; k++ {
			xs = append(xs, randNear(r, c, 6))
		}
	}
	xs = append(xs, 0, math.Copysign(0, -1), math.SmallestNonzeroFloat64, 0x1p-1022, 1e-300, 1e-160, 1e-10)
	for k := 0; k < 40; k++ {
		switch k % 4 {
		case 0:
			xs = append(xs, randUniform(r, 0, 1.2))
		case 1:
			xs = append(xs, randUniform(r, 0, 12))
		case 2:
			xs = append(xs, math.Abs(randLog(r, -80, 5)))
		default:
			xs = append(xs, randUniform(r, 0.9, 1.1))
		}
	}
	return xs
}

// TestProbeSpecialFunctions checks Sinc, Sinhc, XOverSinh, Sech, SinhcSqrt
// and BesselI0 at points and on thin and wider intervals (endpoints and
// interior points) against math/big: the Maclaurin series of sinh and sin
// (DLMF 4.33.1, 4.19.1), bigref.Sinh/Sin/Sech, and the power series of I₀
// (DLMF 10.25.2, bigref.BesselI0).
func TestProbeSpecialFunctions(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 5))
	xs := probeSpecialArgs(r)
	sinc := func(v float64) *big.Float {
		if v == 0 {
			return bigref.Int(1)
		}
		if math.Abs(v) <= 6 {
			b := bigref.New(v)
			return probeSinhcSeriesBig(bigref.Neg(bigref.Mul(b, b)))
		}
		return bigref.Quo(bigref.Sin(bigref.New(v)), bigref.New(v))
	}
	sinhc := func(v float64) *big.Float {
		if math.Abs(v) <= 6 {
			b := bigref.New(v)
			return probeSinhcSeriesBig(bigref.Mul(b, b))
		}
		return bigref.Quo(bigref.Sinh(bigref.New(v)), bigref.New(v))
	}
	xOverSinh := func(v float64) *big.Float { return bigref.Quo(bigref.Int(1), sinhc(v)) }
	sech := func(v float64) *big.Float { return bigref.Sech(bigref.New(v)) }
	sinhcSqrt := func(z float64) *big.Float {
		if math.Abs(z) <= 40 {
			return probeSinhcSeriesBig(bigref.New(z))
		}
		if z > 0 {
			s := bigref.Sqrt(bigref.New(z))
			return bigref.Quo(bigref.Sinh(s), s)
		}
		s := bigref.Sqrt(bigref.New(-z))
		return bigref.Quo(bigref.Sin(s), s)
	}
	type fn struct {
		name string
		f    func(Interval) Interval
		ref  func(float64) *big.Float
		max  float64 // largest |argument| probed
		neg  bool    // probe negative arguments too
	}
	fns := []fn{
		{"Sinc", Sinc, sinc, 1e6, true},
		{"Sinhc", Sinhc, sinhc, 700, true},
		{"XOverSinh", XOverSinh, xOverSinh, 700, true},
		{"Sech", Sech, sech, 700, true},
		{"SinhcSqrt", SinhcSqrt, sinhcSqrt, 1e4, true},
		{"BesselI0", BesselI0, func(v float64) *big.Float { return bigref.BesselI0(bigref.New(v)) }, 700, true},
	}
	cases := 0
	for _, f := range fns {
		for i, x0 := range xs {
			if math.Abs(x0) > f.max {
				continue
			}
			if f.neg && i%2 == 1 {
				x0 = -x0
			}
			if f.name == "BesselI0" && i%3 != 0 {
				// Near the reach of the tabulated Horner: a = 2√q.
				n := 1 + r.IntN(len(besselI0Reach)-1)
				x0 = randNear(r, 2*math.Sqrt(besselI0Reach[n]), 3)
			}
			widths := []float64{0, 0x1p-52 * math.Max(1, math.Abs(x0)), 0x1p-40, 0x1p-39, 0x1p-26, 0.3}
			for _, w := range widths {
				x := Interval{x0, x0 + w}
				if w > 0 && r.IntN(3) == 0 {
					x = Interval{x0 - w, x0} // straddles 0 for tiny x0
				}
				got := f.f(x)
				pts := []float64{x.Lo, x.Hi}
				if w > 0 {
					pts = append(pts, x.Lo+(x.Hi-x.Lo)*r.Float64(), x.Mid())
					if x.Lo < 0 && x.Hi > 0 {
						pts = append(pts, 0)
					}
				}
				for _, v := range pts {
					if math.Abs(v) > f.max*1.01 {
						continue
					}
					cases++
					want := f.ref(v)
					if !bigref.In(got.Lo, got.Hi, want) {
						t.Errorf("%s(%v) = %v does not contain f(%.17g) = %.20g", f.name, x, got, v, bigref.Float64(want))
					}
				}
			}
		}
	}
	t.Logf("%d point checks", cases)
}

// TestProbeGaussianFastPath checks the dedicated Gaussian path
// (gaussianAliasSum) on random edge cases against the sampled sum in
// math/big (gaussianLatticeBig: the spatial side summed directly at 320
// bits) and F(ξ) = σ√(2π) exp(-σ²ξ²/2) e^{-iξc} (math.md, catalogue; DLMF
// 7.7.6 by substitution): σ from 2⁻¹⁰⁰⁰ to 2¹⁰⁰⁰ (the ends of the range
// the path takes), steps from 0.3σ (many copies, where the path may hand
// over to the general one) to 8σ, ξ = 0, ξ at and next to ±P/2, subnormal
// σξ, shifts up to 1e9 steps and at half steps, centres off zero and on a
// sample, finite grids down to one sample, and loose tolerances with few
// terms allowed (the remainder left in the enclosure).
func TestProbeGaussianFastPath(t *testing.T) {
	ctx := context.Background()
	r := rand.New(rand.NewPCG(21, 23))
	n := 500
	taken, finiteTaken, checks := 0, 0, 0
	for i := 0; i < n; i++ {
		var sigma float64
		switch i % 5 {
		case 0:
			sigma = math.Abs(randLog(r, -990, -900))
		case 1:
			sigma = math.Abs(randLog(r, 900, 990))
		case 2:
			sigma = randNear(r, []float64{0x1p-1000, 0x1p1000}[r.IntN(2)], 2)
		default:
			sigma = math.Abs(randLog(r, -20, 20))
		}
		ratio := randUniform(r, 0.3, 8)
		if i%7 == 0 {
			ratio = randUniform(r, 0.3, 0.6) // many copies: near the switch to the general path
		}
		h := ratio * sigma
		P := 2 * math.Pi / h
		var xi float64
		switch i % 6 {
		case 0:
			xi = 0
		case 1:
			xi = randNear(r, randSign(r)*math.Pi/h, 3) // ±P/2
		case 2:
			xi = randSign(r) * math.Pi / h * (1 - 1e-12*r.Float64())
		case 3:
			xi = randLog(r, -1074, -900) / sigma
		default:
			xi = randUniform(r, -0.5, 0.5) * P
		}
		var s float64
		switch i % 4 {
		case 0:
			s = 0
		case 1:
			s = h * (float64(r.IntN(2e6)) - 1e6 + 0.5) // half steps far out
		case 2:
			s = h * randUniform(r, -1e9, 1e9)
		default:
			s = h * randUniform(r, -1, 1)
		}
		c := 0.0
		if i%3 == 0 {
			c = sigma * randUniform(r, -3, 3)
			if i%9 == 0 {
				c = s + h*float64(r.IntN(5)-2) // on a sample
			}
		}
		var count int64
		switch i % 8 {
		case 1:
			count = 1 + int64(r.IntN(3))
		case 2, 3:
			count = int64(float64(r.IntN(80)+1) / ratio)
		}
		var f Family = GaussianFamily{Sigma: sigma}
		if c != 0 {
			f = shiftedGaussian{sigma: sigma, center: c}
		}
		g := Grid{Step: h, Shift: s, Count: count}
		if !finite(h) || !finite(s) || h <= 0 {
			continue
		}
		var set Settings
		if i%4 == 2 {
			// A loose tolerance: the path stops early and leaves its
			// remainder in the enclosure; few terms allowed.
			set = Settings{Tol: sigma * randLog(r, -40, 0), MaxTerms: int64(2 + r.IntN(40))}
		}
		got, ok := fastAliasSum(ctx, f, g, xi, set)
		if !ok {
			continue
		}
		taken++
		if count > 0 {
			finiteTaken++
		}
		lo, hi := g.Indices()
		Tinf := probeGaussianLatticeBig(sigma, c, h, s, xi, 1, 0)
		Fb := bigref.Real(gaussianTransformBig(sigma, xi))
		if c != 0 {
			Fb = Fb.Mul(bigref.Cis(bigref.Neg(bigref.Mul(bigref.New(xi), bigref.New(c)))))
		}
		T := Tinf
		if count > 0 {
			T = probeGaussianLatticeBig(sigma, c, h, s, xi, lo, hi)
		}
		slack := 1e-85 * sigma
		for _, ch := range []struct {
			name string
			got  Complex
			want bigref.Complex
		}{
			{"F", got.Exact, Fb},
			{"T", got.Sampled, T},
			{"T - F", got.Error, T.Sub(Fb)},
			{"alias", got.Alias, Tinf.Sub(Fb)},
			{"truncation", got.Truncation, T.Sub(Tinf)},
		} {
			checks++
			if !inCRef(ch.got, ch.want, slack) {
				t.Errorf("σ=%v c=%v h=%v s=%v ξ=%v N=%d: %s = %v, want %.17g%+.17gi (method %+v)", sigma, c, h, s, xi, count, ch.name, ch.got,
					bigref.Float64(ch.want.Re), bigref.Float64(ch.want.Im), got.Method)
			}
		}
	}
	t.Logf("fast path taken in %d of %d cases (%d finite grids), %d checks", taken, n, finiteTaken, checks)
}

// probeGaussianLatticeBig is gaussianLatticeBig with the window of the
// infinite grid (|x_k - c| ≤ 40σ, plus two samples) placed in math/big, so
// that shifts of up to 1e9 steps from the centre need no care.
func probeGaussianLatticeBig(sigma, c, h, s, xi float64, lo, hi int64) bigref.Complex {
	if lo > hi {
		// k with |s + hk - c| ≤ 40σ, computed in big.
		q := bigref.Quo(bigref.Sub(bigref.New(c), bigref.New(s)), bigref.New(h))
		k0, _ := q.Int64()
		w := int64(math.Ceil(40*sigma/h)) + 2
		lo, hi = k0-w, k0+w
	}
	return gaussianLatticeBig(sigma, c, h, s, xi, lo, hi)
}

// probeAbsSinBig returns |sin θ| at about 380 bits: θ reduced modulo π with
// bigref.Pi (Machin's formula), then the Maclaurin series of sin.
func probeAbsSinBig(theta *big.Float) *big.Float {
	p := uint(bigref.Prec + 64)
	pi := bigref.Pi()
	q := new(big.Float).SetPrec(p).Quo(theta, pi)
	k, _ := q.Int(nil)
	rr := new(big.Float).SetPrec(p).Sub(theta, new(big.Float).SetPrec(p).Mul(new(big.Float).SetPrec(p).SetInt(k), pi))
	// rr in [0, π) (or (-π, 0]): |sin| is unchanged by multiples of π.
	r2 := new(big.Float).SetPrec(p).Mul(rr, rr)
	term := new(big.Float).SetPrec(p).Set(rr)
	sum := new(big.Float).SetPrec(p).Set(rr)
	for k := int64(1); k < 200; k += 2 {
		term.Mul(term, r2)
		term.Quo(term, new(big.Float).SetPrec(p).SetInt64(-(k+1)*(k+2)))
		sum.Add(sum, term)
		if term.Sign() == 0 || term.MantExp(nil) < sum.MantExp(nil)-int(p)-8 {
			break
		}
	}
	return sum.Abs(sum)
}

// probeRayBig returns Σ_{j<n} |sin(θ_j)/θ_j|^m, θ_j = (x0 + jP)/2 with
// x0 = ±ξ + P and P = 2π/h exactly (in math/big): a lower bound of the
// whole ray of |F| for the B-spline of order m (math.md, catalogue).
func probeRayBig(m int, h, xi float64, sign int, n int) *big.Float {
	p := uint(bigref.Prec + 64)
	P := new(big.Float).SetPrec(p).Quo(new(big.Float).SetPrec(p).Mul(bigref.Pi(), big.NewFloat(2)), bigref.New(h))
	x0 := new(big.Float).SetPrec(p).Add(P, new(big.Float).SetPrec(p).Mul(bigref.New(xi), big.NewFloat(float64(sign))))
	sum := new(big.Float).SetPrec(p)
	x := new(big.Float).SetPrec(p).Set(x0)
	for j := 0; j < n; j++ {
		th := new(big.Float).SetPrec(p).Quo(x, big.NewFloat(2))
		v := new(big.Float).SetPrec(p).Quo(probeAbsSinBig(th), th)
		pw := new(big.Float).SetPrec(p).SetInt64(1)
		for range m {
			pw.Mul(pw, v)
		}
		sum.Add(sum, pw)
		x.Add(x, P)
	}
	return sum
}

// TestProbeBSplineRay checks BSplineFamily.aliasRay and aliasBlock (the
// closed-form ray bound of budget.go and blockAlias) against the first
// copies of the ray summed in math/big (|F(ξ)| = |sin(ξ/2)/(ξ/2)|^m,
// math.md, catalogue): at the steps of the partition of unity h = 1/k,
// next to them (relative offsets 1e-16 … 1e-3), and at random steps, for
// ξ = 0, tiny ξ and ξ across the band, for orders 2 … 8.
func TestProbeBSplineRay(t *testing.T) {
	r := rand.New(rand.NewPCG(31, 37))
	n := 24
	checks := 0
	for i := 0; i < n; i++ {
		m := 2 + r.IntN(MaxBSplineOrder-1)
		k := 1 + r.IntN(6)
		h := 1 / float64(k)
		switch i % 4 {
		case 1:
			h = randNear(r, h, 4)
		case 2:
			h *= 1 + randLog(r, -53, -10)
		case 3:
			h = randUniform(r, 0.05, 3)
		}
		P := TwoPi.Div(Point(h))
		var xi float64
		switch i % 3 {
		case 1:
			xi = randLog(r, -60, -20)
		case 2:
			xi = randUniform(r, -0.999, 0.999) * P.Lo
		}
		b := BSplineFamily{Order: m}
		X := Point(xi)
		for sign, x0 := range map[int]Interval{1: X.Add(P), -1: P.Sub(X)} {
			ray := b.aliasRay(x0, P)
			nj := 400
			ref := probeRayBig(m, h, xi, sign, nj)
			checks++
			if !bigref.In(math.Inf(-1), ray, ref) {
				t.Errorf("order %d h=%v ξ=%v side %d: aliasRay = %g below the first %d copies %.17g", m, h, xi, sign, ray, nj, bigref.Float64(ref))
			}
			for _, J := range []int64{1, 2, 7, 50, 400} {
				blk := b.aliasBlock(x0, P, J)
				refJ := probeRayBig(m, h, xi, sign, int(J))
				checks++
				if !bigref.In(math.Inf(-1), blk, refJ) {
					t.Errorf("order %d h=%v ξ=%v side %d: aliasBlock(J=%d) = %g below the copies %.17g", m, h, xi, sign, J, blk, bigref.Float64(refJ))
				}
			}
		}
	}
	t.Logf("%d checks", checks)
}

// TestProbeBSplineValue checks the Horner pieces of bsplineValue against
// exact rationals at knots, next to knots, at 0 and ±0, on intervals across
// knots and in random places.
func TestProbeBSplineValue(t *testing.T) {
	r := rand.New(rand.NewPCG(41, 43))
	checks := 0
	for m := 1; m <= MaxBSplineOrder; m++ {
		for i := 0; i < 400; i++ {
			var x float64
			switch i % 4 {
			case 0:
				x = randNear(r, float64(r.IntN(2*m+3)-m-1)/2, 3) // knots and half-knots
			case 1:
				x = randUniform(r, -float64(m)/2-0.5, float64(m)/2+0.5)
			case 2:
				x = randLog(r, -1074, 0)
			default:
				x = math.Copysign(0, randSign(r))
			}
			w := []float64{0, 0x1p-52, 1e-9, 0.3}[r.IntN(4)]
			iv := Interval{x, x + w}
			got := bsplineValue(m, iv)
			for _, v := range []float64{iv.Lo, iv.Hi, iv.Mid()} {
				checks++
				want := bsplineRat(m, v) // exact rationals, bspline_test.go
				lo, hi := new(big.Rat).SetFloat64(got.Lo), new(big.Rat).SetFloat64(got.Hi)
				if lo == nil || hi == nil || lo.Cmp(want) > 0 || hi.Cmp(want) < 0 {
					fw, _ := want.Float64()
					t.Errorf("M_%d(%v) = %v does not contain M_%d(%.17g) = %.17g", m, iv, got, m, v, fw)
				}
			}
		}
	}
	t.Logf("%d checks", checks)
}

// TestProbeGaussianFewSamples checks the truncation part of the Gaussian
// path on grids of 1 to 6 samples around the centre, with the centre at a
// sample, between samples and just inside the window's ends, against the
// finite and infinite sums in math/big (probeGaussianLatticeBig).
func TestProbeGaussianFewSamples(t *testing.T) {
	ctx := context.Background()
	r := rand.New(rand.NewPCG(71, 73))
	taken := 0
	for i := 0; i < 400; i++ {
		sigma := math.Abs(randLog(r, -10, 10))
		h := sigma * randUniform(r, 1.5, 9)
		count := int64(1 + r.IntN(6))
		s := h * randUniform(r, -0.5, 0.5)
		g := Grid{Step: h, Shift: s, Count: count}
		lo, hi := g.Indices()
		var c float64
		switch i % 4 {
		case 0:
			c = s + h*float64(lo+int64(r.IntN(int(count)))) // at a sample
		case 1:
			c = randNear(r, s+h*(float64(hi)+1), 3) // next to the first omitted sample (right)
		case 2:
			c = randNear(r, s+h*(float64(lo)-1), 3) // (left)
		default:
			c = s + h*randUniform(r, float64(lo)-1, float64(hi)+1)
		}
		xi := []float64{0, randUniform(r, -1, 1) * math.Pi / h, randNear(r, math.Pi/h, 2)}[i%3]
		f := shiftedGaussian{sigma: sigma, center: c}
		got, ok := fastAliasSum(ctx, f, g, xi, Settings{})
		if !ok {
			continue
		}
		taken++
		T := probeGaussianLatticeBig(sigma, c, h, s, xi, lo, hi)
		Tinf := probeGaussianLatticeBig(sigma, c, h, s, xi, 1, 0)
		slack := 1e-85 * sigma
		if !inCRef(got.Truncation, T.Sub(Tinf), slack) || !inCRef(got.Sampled, T, slack) {
			t.Errorf("σ=%v c=%v h=%v s=%v ξ=%v N=%d: truncation %v, sampled %v; want %.17g%+.17gi, %.17g%+.17gi", sigma, c, h, s, xi, count,
				got.Truncation, got.Sampled, bigref.Float64(T.Sub(Tinf).Re), bigref.Float64(T.Sub(Tinf).Im), bigref.Float64(T.Re), bigref.Float64(T.Im))
		}
	}
	t.Logf("fast path taken in %d of 400 cases", taken)
}
