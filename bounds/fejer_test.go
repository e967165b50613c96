package bounds

import (
	"context"
	"math/big"
	"math/cmplx"

	"foldbound/internal/bigref"
	"math"
	"testing"
)

// fejerTail returns the part of ∫ f(x)cos(ξx) dx over |x| > X for
// f(x) = sinc²(Ωx/2) = (2/Ω²)(1 - cos Ωx)/x², and a bound on what the
// returned value leaves out. With
//
//	f(x)cos(ξx) = (2/(Ω²x²))·[cos ξx - ½cos((ξ+Ω)x) - ½cos((ξ-Ω)x)],
//
// each piece has the tail T(θ) = ∫_X^∞ cos(θx)/x² dx, which is 1/X for
// θ = 0 and, after one integration by parts, -sin(θX)/(θX²) with a
// remainder at most 4/(θ²X³) otherwise.
func fejerTail(omega, xi, X float64) (complex128, float64) {
	T := func(theta float64) (float64, float64) {
		if theta == 0 {
			return 1 / X, 1e-16 / X
		}
		return -math.Sin(theta*X) / (theta * X * X), 4 / (theta * theta * X * X * X)
	}
	v0, b0 := T(xi)
	v1, b1 := T(xi + omega)
	v2, b2 := T(xi - omega)
	k := 2 * 2 / (omega * omega) // two sides, factor 2/Ω²
	return complex(k*(v0-v1/2-v2/2), 0), k * (b0 + b1/2 + b2/2)
}

// Quadrature check of the triangle (2π/Ω)max(0, 1-|ξ|/Ω) (gonum
// quad.Legendre on [-X, X], X = 5000/Ω, with the analytic tail fejerTail).
func TestFejerTransformQuadrature(t *testing.T) {
	var tests []transformCase
	for _, om := range []float64{1, 0.3, 7} {
		fam, err := NewFejer(om)
		if err != nil {
			t.Fatal(err)
		}
		X := 5000 / om
		tests = append(tests, transformCase{
			name: fam.String(),
			fam:  fam,
			f: func(x float64) complex128 {
				u := om * x / 2
				if u == 0 {
					return 1
				}
				s := math.Sin(u) / u
				return complex(s*s, 0)
			},
			xis:   []float64{0, 0.5 * om, om, 1.5 * om, 3 * om},
			lo:    -X,
			hi:    X,
			scale: 1 / om,
			tail:  func(xi float64) (complex128, float64) { return fejerTail(om, xi, X) },
			abs:   1e-14 / om,
			rel:   1e-12,
		})
	}
	checkTransforms(t, tests)
}

// bigFejer is the math/big reference of sinc²(Ωx/2) and of the triangle
// (2π/Ω)max(0, 1-|ξ|/Ω). Its infinite-grid sums are referenced on the
// spectral side, a finite sum because F vanishes for |ξ| ≥ Ω.
func bigFejer(omega float64) bigFamily {
	bo := bigref.New(omega)
	return bigFamily{
		samples: pointSamples(func(x *big.Float) bigref.Complex {
			if x.Sign() == 0 {
				return bigref.Real(bigref.Int(1))
			}
			u := bigref.Quo(bigref.Mul(bo, x), bigref.Int(2))
			s := bigref.Quo(bigref.Sin(u), u)
			return bigref.Real(bigref.Mul(s, s))
		}),
		transform: func(xi *big.Float) bigref.Complex {
			t := bigref.Sub(bigref.Int(1), bigref.Quo(bigref.Abs(xi), bo))
			if t.Sign() < 0 {
				return bigref.C(0, 0)
			}
			return bigref.Real(bigref.Mul(bigref.Quo(bigref.Mul(bigref.Pi(), bigref.Int(2)), bo), t))
		},
		specBound:   func(float64) float64 { return 0 }, // F = 0 for |ξ| ≥ Ω
		specR:       omega,
		nonNegative: true,
	}
}

// Containment: math/big lattice sums (direct on finite grids, the finite
// spectral side of the Poisson formula on infinite ones) lie in AliasSum's
// enclosures.
func TestFejerContainment(t *testing.T) {
	for _, om := range []float64{1, 3.7} {
		fam, _ := NewFejer(om)
		checkContainment(t, fam, bigFejer(om), slowDecayCases(2/om, 0.05*2*math.Pi/om))
	}
}

// Band limit (math.md, "Envelopes and their bounds"; the sampling theorem,
// common practice): F vanishes for |ξ| ≥ Ω, so on an infinite grid the
// alias error is exactly 0 when h ≤ 2π/(Ω + |ξ|) — for the integral
// (ξ = 0) when h ≤ 2π/Ω, twice the Nyquist spacing π/Ω — and is positive
// beyond, where the first copy F(ξ ± 2π/h) enters.
func TestFejerBandLimitNoAliasing(t *testing.T) {
	for _, om := range []float64{1, 0.2, 6} {
		fam, _ := NewFejer(om)
		for _, xi := range []float64{0, 0.3 * om, 0.9 * om} {
			hMax := 2 * math.Pi / (om + xi)
			for _, tc := range []struct {
				h       float64
				aliased bool
			}{
				{0.999999 * hMax, false}, {0.5 * hMax, false}, {0.1 * hMax, false},
				{1.05 * hMax, true}, {1.5 * hMax, true},
			} {
				for _, s := range []float64{0, 0.3 * tc.h} {
					res, err := AliasSum(context.Background(), fam, Grid{Step: tc.h, Shift: s}, xi, Settings{})
					if err != nil {
						t.Fatal(err)
					}
					a := res.Alias
					if !tc.aliased {
						if !a.Contains(0) || math.Max(a.Re.Mag(), a.Im.Mag()) > 1e-300 {
							t.Errorf("%v, h=%g (≤ 2π/(Ω+|ξ|) = %g), s=%g, ξ=%g: Alias = %v, want exactly 0", fam, tc.h, hMax, s, xi, a)
						}
						continue
					}
					if s == 0 && a.Re.Lo <= 0 {
						// At shift 0 every copy adds: Alias ≥ F(ξ - 2π/h) > 0.
						t.Errorf("%v, h=%g (> 2π/(Ω+|ξ|) = %g), ξ=%g: Alias = %v, want > 0", fam, tc.h, hMax, xi, a)
					}
				}
			}
		}
	}
}

// An independent spatial-side check of the infinite-grid sums, as for the
// Lorentzian: the float64 direct sum over |k| ≤ K plus the bound
// h Σ_{|k|>K} sinc²(Ωx_k/2) ≤ (4/Ω²)·2/d, d = hK - |s|, must overlap
// AliasSum's enclosure of T.
func TestFejerDirectSpatialOverlap(t *testing.T) {
	const K = 200000
	for _, tc := range []struct{ om, h, s, xi float64 }{
		{1, 0.5, 0, 0}, {1, 4, 0.7, 0.4}, {3, 1.9, -0.2, 2}, {0.5, 20, 3, 0.1},
	} {
		fam, _ := NewFejer(tc.om)
		res, err := AliasSum(context.Background(), fam, Grid{Step: tc.h, Shift: tc.s}, tc.xi, Settings{})
		if err != nil {
			t.Fatal(err)
		}
		var sum complex128
		for k := -K; k <= K; k++ {
			x := tc.s + tc.h*float64(k)
			v := 1.0
			if u := tc.om * x / 2; u != 0 {
				v = math.Sin(u) / u
			}
			sum += complex(tc.h*v*v, 0) * cmplx.Exp(complex(0, -tc.xi*x))
		}
		bound := 8/(tc.om*tc.om*(tc.h*K-math.Abs(tc.s))) + 1e-12*cmplx.Abs(sum)
		if z := res.Sampled.Inflate(bound); !z.Contains(sum) {
			t.Errorf("%v, h=%g, s=%g, ξ=%g: T = %v, direct sum %v ± %.2g does not overlap", fam, tc.h, tc.s, tc.xi, res.Sampled, sum, bound)
		}
	}
}
