package bounds

import (
	"context"
	"fmt"
	"math"
	"testing"

	"foldbound/internal/bigref"
)

// gaussianLatticeBig sums h Σ_k exp(-(x_k - c)²/(2σ²)) e^{-iξx_k},
// x_k = s + hk, in math/big over the indices k in [lo, hi] (lo ≤ hi), or,
// with lo > hi, over every k with |x_k - c| ≤ 40σ (the rest is below
// e^{-800} of the largest term, far below 2⁻³⁰⁰: the infinite grid). The
// phases follow e^{-iξx_{k+1}} = e^{-iξx_k}·e^{-iξh} at 320 bits. This is
// the spatial side of the Poisson formula summed directly, independent of
// the engine's spectral sums.
func gaussianLatticeBig(sigma, c, h, s, xi float64, lo, hi int64) bigref.Complex {
	if lo > hi {
		lo = int64(math.Floor((c - 40*sigma - s) / h))
		hi = int64(math.Ceil((c + 40*sigma - s) / h))
	}
	bh, bx, bc := bigref.New(h), bigref.New(xi), bigref.New(c)
	twoS2 := bigref.Mul(bigref.Int(2), bigref.Mul(bigref.New(sigma), bigref.New(sigma)))
	x := bigref.Add(bigref.New(s), bigref.Mul(bh, bigref.Int(lo)))
	ph := bigref.Cis(bigref.Neg(bigref.Mul(bx, x)))
	step := bigref.Cis(bigref.Neg(bigref.Mul(bx, bh)))
	sum := bigref.C(0, 0)
	for k := lo; k <= hi; k++ {
		d := bigref.Sub(x, bc)
		v := bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(d, d), twoS2)))
		sum = sum.Add(ph.Scale(v))
		x = bigref.Add(x, bh)
		ph = ph.Mul(step)
	}
	return sum.Scale(bh)
}

// gaussianCase is one parameter point of the fast-path tests.
type gaussianCase struct {
	sigma, center, h, s, xi float64
	n                       int64
}

func (c gaussianCase) family() Family {
	if c.center == 0 {
		return GaussianFamily{Sigma: c.sigma}
	}
	return shiftedGaussian{sigma: c.sigma, center: c.center}
}

func (c gaussianCase) String() string {
	return fmt.Sprintf("σ=%g c=%g h=%g s=%g ξ=%g N=%d", c.sigma, c.center, c.h, c.s, c.xi, c.n)
}

// gaussianFastCases spans tiny and huge σ, coarse and fine steps (h/σ from
// 4 down to 0.35, alias errors from about 0.3 F to below 1e-30 F), shifted
// grids, ξ = 0 and ξ ≠ 0 up to the Nyquist edge π/h, centred and shifted
// Gaussians, infinite and finite grids.
func gaussianFastCases() []gaussianCase {
	var cases []gaussianCase
	i := 0
	for _, sigma := range []float64{1e-3, 0.37, 1, 7.5, 2e3} {
		for _, r := range []float64{4, 2.5, 1.5, 1, 0.6, 0.35} {
			for _, sh := range []float64{0, 0.3, -0.77, 5.1} {
				i++
				h := r * sigma
				xiH := []float64{0, 0.4, -0.9 * math.Pi, math.Pi, 2}[i%5]
				center := []float64{0, 0, 0.3, -1.7}[i%4] * sigma
				n := []int64{0, 0, 9, 24, 41}[(i/3)%5]
				if n > 0 && float64(n)*r < 12 {
					n = 0 // a window too short for the centre to be inside with a small truncation
				}
				cases = append(cases, gaussianCase{sigma, center, h, sh * h, xiH / h, n})
			}
		}
	}
	return cases
}

// TestGaussianFastPathContainsBigSum checks the dedicated Gaussian path of
// AliasSum (gaussianalias.go) against the sampled sum in math/big (the
// spatial side summed directly, gaussianLatticeBig) and F(ξ) = σ√(2π)
// exp(-σ²ξ²/2) in math/big (DLMF 7.7.6 by substitution; math.md,
// catalogue), for the centred Gaussian and the shifted one of
// RadialGaussian: T, F, T - F, the alias part (infinite-grid sum minus F)
// and the truncation part (finite minus infinite grid) must be enclosed.
// It also checks that the fast path was taken where it should be, that the
// enclosures overlap those of the general path forced to the spectral side
// and to the spatial side, and reports the tightness of the error.
func TestGaussianFastPathContainsBigSum(t *testing.T) {
	ctx := context.Background()
	taken := 0
	worstRel := 0.0
	for _, tt := range gaussianFastCases() {
		f := tt.family()
		g := Grid{Step: tt.h, Shift: tt.s, Count: tt.n}
		got, err := AliasSum(ctx, f, g, tt.xi, Settings{})
		if err != nil {
			t.Fatalf("%v: %v", tt, err)
		}
		if _, ok := fastAliasSum(ctx, f, g, tt.xi, Settings{}); ok {
			taken++
		} else if math.Abs(tt.xi) <= 0.49*2*math.Pi/tt.h && tt.n == 0 {
			t.Errorf("%v: fast path declined an infinite grid inside the Nyquist band", tt)
		}

		Tinf := gaussianLatticeBig(tt.sigma, tt.center, tt.h, tt.s, tt.xi, 1, 0)
		Fb := bigref.Real(gaussianTransformBig(tt.sigma, tt.xi))
		if tt.center != 0 {
			Fb = Fb.Mul(bigref.Cis(bigref.Neg(bigref.Mul(bigref.New(tt.xi), bigref.New(tt.center)))))
		}
		T := Tinf
		if tt.n > 0 {
			lo, hi := g.Indices()
			T = gaussianLatticeBig(tt.sigma, tt.center, tt.h, tt.s, tt.xi, lo, hi)
		}
		// The math/big sums carry rounding of about 2^-300 of their terms.
		slack := 1e-85 * tt.sigma
		checks := []struct {
			name string
			got  Complex
			want bigref.Complex
		}{
			{"F", got.Exact, Fb},
			{"T", got.Sampled, T},
			{"T - F", got.Error, T.Sub(Fb)},
			{"alias", got.Alias, Tinf.Sub(Fb)},
			{"truncation", got.Truncation, T.Sub(Tinf)},
		}
		for _, c := range checks {
			if !inCRef(c.got, c.want, slack) {
				t.Errorf("%v: %s = %v, want %.17g%+.17gi", tt, c.name, c.got, bigref.Float64(c.want.Re), bigref.Float64(c.want.Im))
			}
		}
		m := got.Method
		if m.Side != SpectralSide && m.Side != SpatialSide || m.Remainder < 0 || m.AliasTerms < 0 || m.TruncationTerms < 0 {
			t.Errorf("%v: method %+v", tt, m)
		}
		if e := bigref.Float64(T.Sub(Fb).Abs()); e > 1e-300 {
			w := math.Max(got.Error.Re.Width(), got.Error.Im.Width()) / e
			if w > worstRel {
				worstRel = w
				t.Logf("%v: width/|T-F| %.3g, %+v", tt, w, got.Method)
			}
		}

		for _, side := range []Side{SpectralSide, SpatialSide} {
			gen, err := aliasSumGeneral(ctx, f, g, tt.xi, Settings{Side: side}, familyEnvelopes{})
			if err != nil {
				continue // the general path may refuse a side (work limit)
			}
			if !overlaps(got.Error, gen.Error) || !overlaps(got.Sampled, gen.Sampled) {
				t.Errorf("%v: error %v, general %v path %v: enclosures do not overlap", tt, got.Error, side, gen.Error)
			}
			// As tight as the general spectral path, within a factor 2.
			if side == SpectralSide && gen.Method.Side == SpectralSide {
				wf := math.Max(got.Error.Re.Width(), got.Error.Im.Width())
				wg := math.Max(gen.Error.Re.Width(), gen.Error.Im.Width())
				if wf > 2*wg+1e-15*got.Error.Mag() {
					t.Errorf("%v: error %v is wider than the general path's %v", tt, got.Error, gen.Error)
				}
			}
		}
	}
	if taken < 60 {
		t.Errorf("fast path taken in %d cases, want most of them", taken)
	}
	t.Logf("fast path taken in %d of %d cases; worst width/|T-F| %.3g", taken, len(gaussianFastCases()), worstRel)
}

// TestGaussianFastPathMatchesGeneral checks, on a seeded random sweep, that
// the fast path needs no more alias copies than the general path whenever
// both sum the spectral side, and that their enclosures overlap, for ξ across the Nyquist band and shifts
// across a step.
func TestGaussianFastPathMatchesGeneral(t *testing.T) {
	ctx := context.Background()
	taken := 0
	for i := range 400 {
		u := float64(i) / 400
		sigma := math.Exp(-4 + 8*math.Mod(u*7.31, 1)) // e^-4 … e^4
		h := sigma * (0.3 + 3.7*math.Mod(u*3.17, 1))
		s := h * (math.Mod(u*11.3, 1) - 0.5) * 3
		xi := (math.Mod(u*5.7, 1)*2 - 1) * math.Pi / h
		if i%7 == 0 {
			xi = 0
		}
		var n int64
		if i%3 == 0 {
			n = int64(20+40*sigma/h) | 1
		}
		f := Family(GaussianFamily{Sigma: sigma})
		if i%2 == 1 {
			f = shiftedGaussian{sigma: sigma, center: 0.4 * sigma}
		}
		g := Grid{Step: h, Shift: s, Count: n}
		fast, ok := fastAliasSum(ctx, f, g, xi, Settings{})
		if !ok {
			continue
		}
		taken++
		gen, err := aliasSumGeneral(ctx, f, g, xi, Settings{}, familyEnvelopes{})
		if err != nil {
			t.Fatalf("%v h=%g s=%g ξ=%g N=%d: %v", f, h, s, xi, n, err)
		}
		if !overlaps(fast.Error, gen.Error) || !overlaps(fast.Exact, gen.Exact) || !overlaps(fast.Alias, gen.Alias) {
			t.Errorf("%v h=%g s=%g ξ=%g N=%d: fast E = %v, general %v", f, h, s, xi, n, fast.Error, gen.Error)
		}
		// The fast path's geometric tail (G) is at least as tight as the
		// envelope's, so it never needs more copies.
		if gen.Method.Side == SpectralSide && fast.Method.AliasTerms > gen.Method.AliasTerms {
			t.Errorf("%v h=%g s=%g ξ=%g N=%d: fast path summed %d copies, general path %d", f, h, s, xi, n, fast.Method.AliasTerms, gen.Method.AliasTerms)
		}
	}
	if taken < 300 {
		t.Errorf("fast path taken in %d of 400 cases, want most", taken)
	}
}
