package bounds

import (
	"context"
	"math/big"
	"math/cmplx"

	"foldbound/internal/bigref"
	"math"
	"testing"
)

// Quadrature check of (π/a)e^{-a|ξ|} (gonum quad.Legendre on [-X, X],
// X = 5000a). The tail 2∫_X^∞ cos(ξx)/(a²+x²) dx is, for ξ = 0, exactly
// (2/a)·atan(a/X); for ξ ≠ 0 one integration by parts gives
// -2f(X)sin(ξX)/ξ with remainder at most 4|f'(X)|/ξ² (|f'| decreases
// beyond a/√3, so |∫_X^∞ f'(x) sin(ξx) dx| ≤ 2|f'(X)|/|ξ|).
func TestLorentzianTransformQuadrature(t *testing.T) {
	var tests []transformCase
	for _, a := range []float64{1, 0.25, 4} {
		fam, err := NewLorentzian(a)
		if err != nil {
			t.Fatal(err)
		}
		X := 5000 * a
		f := func(x float64) float64 { return 1 / (a*a + x*x) }
		tests = append(tests, transformCase{
			name:  fam.String(),
			fam:   fam,
			f:     func(x float64) complex128 { return complex(f(x), 0) },
			xis:   []float64{0, 0.5 / a, 2 / a, 8 / a},
			lo:    -X,
			hi:    X,
			scale: a,
			tail: func(xi float64) (complex128, float64) {
				if xi == 0 {
					return complex(2/a*math.Atan(a/X), 0), 1e-16 / X
				}
				fp := 2 * X / ((a*a + X*X) * (a*a + X*X))
				return complex(-2*f(X)*math.Sin(xi*X)/xi, 0), 4 * fp / (xi * xi)
			},
			abs: 1e-15 / a,
			rel: 1e-12,
		})
	}
	checkTransforms(t, tests)
}

// bigLorentzian is the math/big reference of 1/(a²+x²) and (π/a)e^{-a|ξ|}.
// Its infinite-grid sums are referenced on the spectral side only: the
// spatial tail decays like 1/K, too slowly for a direct sum to reach 10⁻¹⁶.
func bigLorentzian(a float64) bigFamily {
	ba := bigref.New(a)
	return bigFamily{
		samples: pointSamples(func(x *big.Float) bigref.Complex {
			return bigref.Real(bigref.Quo(bigref.Int(1), bigref.Add(bigref.Mul(ba, ba), bigref.Mul(x, x))))
		}),
		transform: func(xi *big.Float) bigref.Complex {
			return bigref.Real(bigref.Mul(bigref.Quo(bigref.Pi(), ba), bigref.Exp(bigref.Neg(bigref.Mul(ba, bigref.Abs(xi))))))
		},
		specBound:   func(d float64) float64 { return math.Pi / a * math.Exp(-a*d) },
		nonNegative: true,
	}
}

// slowDecayCases adapts standardCases to a family whose spatial envelope
// decays only like x⁻²: on a finite grid the engine must sum the omitted
// samples to split the error into alias and truncation, which to full
// precision would take ~2⁶⁰ samples (see TestFiniteGridSlowDecay), so
// finite grids are summed on the spatial side, where Error = T - F is
// exact, with an absolute tolerance tol for the truncation split.
func slowDecayCases(L, tol float64) []containCase {
	cases := standardCases(L)
	for i := range cases {
		if !cases[i].g.Infinite() {
			cases[i].set = Settings{Side: SpatialSide, Tol: tol}
		}
	}
	return cases
}

// Containment: math/big lattice sums (direct on finite grids, the spectral
// side of the Poisson formula on infinite ones) lie in AliasSum's
// enclosures.
func TestLorentzianContainment(t *testing.T) {
	for _, a := range []float64{1, 0.3} {
		fam, _ := NewLorentzian(a)
		checkContainment(t, fam, bigLorentzian(a), slowDecayCases(a, 0.05*math.Pi/a))
	}
}

// At shift 0 the alias sum of the Lorentzian is a pair of geometric series,
//
//	Σ_{l≠0} (π/a)e^{-a|ξ+2πl/h|} = (2π/a)·cosh(aξ)/(e^{2πa/h} - 1),  |ξ| ≤ π/h,
//
// equal to the exponential-envelope bound 2B·cosh(βξ)/(e^{2πβ/h} - 1) with
// B = π/a, β = a (math.md, "Envelopes and their bounds"). AliasSum's Alias
// part must contain the closed form, computed in math/big, and match it to
// 1e-12 relative.
func TestLorentzianAliasClosedForm(t *testing.T) {
	for _, a := range []float64{1, 0.3, 2.5} {
		fam, _ := NewLorentzian(a)
		for _, h := range []float64{4 * a, 2 * a, a, 0.5 * a, 0.2 * a, 0.1 * a} {
			for _, frac := range []float64{0, 0.3, 0.75, 1} {
				xi := frac * math.Pi / h
				ba := bigref.New(a)
				twoPiA := bigref.Quo(bigref.Mul(bigref.Mul(bigref.Pi(), bigref.Int(2)), ba), bigref.New(h))
				den := bigref.Sub(bigref.Exp(twoPiA), bigref.Int(1))
				want := bigref.Quo(bigref.Mul(bigref.Quo(bigref.Mul(bigref.Pi(), bigref.Int(2)), ba),
					bigref.Cosh(bigref.Mul(ba, bigref.New(xi)))), den)
				res, err := AliasSum(context.Background(), fam, Grid{Step: h}, xi, Settings{})
				if err != nil {
					t.Fatal(err)
				}
				got := res.Alias.Re
				if !bigref.In(got.Lo, got.Hi, want) {
					t.Errorf("%v, h=%g, ξ=%g: Alias = %v, want it to contain (2π/a)cosh(aξ)/(e^{2πa/h}-1) = %.20g",
						fam, h, xi, got, want)
				}
				if e := bigref.RelErr(bigref.New(got.Mid()), want); e > 1e-12 {
					t.Errorf("%v, h=%g, ξ=%g: Alias = %v, want %.20g, relative error %.3g > 1e-12", fam, h, xi, got, want, e)
				}
				if w := got.RelWidth(); w > 1e-12 {
					t.Errorf("%v, h=%g, ξ=%g: Alias = %v, relative width %.3g > 1e-12", fam, h, xi, got, w)
				}
			}
		}
	}
}

// An independent spatial-side check of the infinite-grid sums (the
// containment test references them on the spectral side): the direct sum
// over |k| ≤ K in float64 plus the bound
//
//	h Σ_{|k|>K} 1/(a² + x_k²) ≤ 2·∫_d^∞ dx/x² = 2/d,  d = hK - |s|,
//
// must overlap AliasSum's enclosure of T.
func TestLorentzianDirectSpatialOverlap(t *testing.T) {
	const K = 200000
	for _, tc := range []struct{ a, h, s, xi float64 }{
		{1, 0.5, 0, 0}, {1, 2, 0.7, 0.4}, {0.3, 0.1, -0.02, 10}, {2, 3, 1.1, 0.9},
	} {
		fam, _ := NewLorentzian(tc.a)
		res, err := AliasSum(context.Background(), fam, Grid{Step: tc.h, Shift: tc.s}, tc.xi, Settings{})
		if err != nil {
			t.Fatal(err)
		}
		var sum complex128
		for k := -K; k <= K; k++ {
			x := tc.s + tc.h*float64(k)
			sum += complex(tc.h/(tc.a*tc.a+x*x), 0) * cmplx.Exp(complex(0, -tc.xi*x))
		}
		bound := 2/(tc.h*K-math.Abs(tc.s)) + 1e-12*cmplx.Abs(sum)
		z := res.Sampled.Inflate(bound)
		if !z.Contains(sum) {
			t.Errorf("%v, h=%g, s=%g, ξ=%g: T = %v, direct sum %v ± %.2g does not overlap", fam, tc.h, tc.s, tc.xi, res.Sampled, sum, bound)
		}
	}
}
