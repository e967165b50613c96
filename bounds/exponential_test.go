package bounds

import (
	"context"
	"math/big"

	"foldbound/internal/bigref"
	"math"
	"testing"
)

// Quadrature check of 2a/(a²+ξ²) (gonum quad.Legendre on [-X, X] with a
// panel break at the kink x = 0; the tail ∫_{|x|>X} e^{-a|x|} = 2e^{-aX}/a).
func TestExponentialTransformQuadrature(t *testing.T) {
	var tests []transformCase
	for _, a := range []float64{1, 0.3, 5} {
		fam, err := NewExponential(a)
		if err != nil {
			t.Fatal(err)
		}
		X := 42 / a
		tests = append(tests, transformCase{
			name:   fam.String(),
			fam:    fam,
			f:      func(x float64) complex128 { return complex(math.Exp(-a*math.Abs(x)), 0) },
			xis:    []float64{0, 0.7 * a, 3 * a, 40 * a},
			lo:     -X,
			hi:     X,
			scale:  1 / a,
			breaks: []float64{0},
			tail:   func(float64) (complex128, float64) { return 0, 2 * math.Exp(-a*X) / a },
			abs:    2e-15 / a,
			rel:    1e-13,
		})
	}
	checkTransforms(t, tests)
}

// bigExponential is the math/big reference of e^{-a|x|} and 2a/(a²+ξ²).
func bigExponential(a float64) bigFamily {
	ba := bigref.New(a)
	return bigFamily{
		samples: func(h, s float64, lo, hi int64) []bigref.Complex {
			return realSamples(geometricSamples(ba, nil, h, s, lo, hi))
		},
		// h·Σ_{k>hi} e^{-a x_k} = h·e^{-a x_{hi+1}}/(1 - e^{-ah}), both sides.
		tail: func(h, s float64, lo, hi int64) float64 {
			r := h / -math.Expm1(-a*h)
			return r * (math.Exp(-a*(s+h*float64(hi+1))) + math.Exp(a*(s+h*float64(lo-1))))
		},
		nonNegative: true,
		transform: func(xi *big.Float) bigref.Complex {
			return bigref.Real(bigref.Quo(bigref.Mul(bigref.Int(2), ba), bigref.Add(bigref.Mul(ba, ba), bigref.Mul(xi, xi))))
		},
	}
}

// Containment: math/big direct spatial sums lie in AliasSum's enclosures.
func TestExponentialContainment(t *testing.T) {
	for _, a := range []float64{1, 0.35} {
		fam, _ := NewExponential(a)
		checkContainment(t, fam, bigExponential(a), standardCases(1/a))
	}
}

// The partial-fraction expansion of coth (DLMF 4.36.3),
//
//	h·coth(ah/2) = Σ_{l∈Z} 2a/(a² + (2πl/h)²),
//
// is the Poisson formula for e^{-a|x|} on the infinite grid at shift 0 and
// ξ = 0, whose spatial side is the geometric series
// h·Σ_k e^{-a|hk|} = h(1 + e^{-ah})/(1 - e^{-ah}). Both forced sides must
// enclose h·coth(ah/2) computed in math/big. The spectral side converges
// only like 1/L (F decays like ξ⁻²), so it runs with an absolute tolerance.
func TestExponentialCothPartialFractions(t *testing.T) {
	for _, a := range []float64{1, 0.3} {
		fam, _ := NewExponential(a)
		for _, h := range []float64{4, 2, 1, 0.5, 0.1, 0.02} {
			half := bigref.Quo(bigref.Mul(bigref.New(a), bigref.New(h)), bigref.Int(2))
			want := bigref.Mul(bigref.New(h), bigref.Quo(bigref.Cosh(half), bigref.Sinh(half)))
			wantErr := bigref.Sub(want, bigref.Quo(bigref.Int(2), bigref.New(a)))
			for _, set := range []Settings{
				{Side: SpatialSide},
				{Side: SpectralSide, Tol: 2e-5 / a, MaxTerms: 1 << 21},
			} {
				res, err := AliasSum(context.Background(), fam, Grid{Step: h}, 0, set)
				if err != nil {
					t.Errorf("%v, h=%g, %v side: %v", fam, h, set.Side, err)
					continue
				}
				if !bigref.In(res.Sampled.Re.Lo, res.Sampled.Re.Hi, want) {
					t.Errorf("%v, h=%g, %v side: T = %v, want h·coth(ah/2) = %.20g (DLMF 4.36.3)", fam, h, set.Side, res.Sampled.Re, want)
				}
				if !bigref.In(res.Error.Re.Lo, res.Error.Re.Hi, wantErr) {
					t.Errorf("%v, h=%g, %v side: E = %v, want h·coth(ah/2) - 2/a = %.20g", fam, h, set.Side, res.Error.Re, wantErr)
				}
				// Width criterion as in checkContainment (≤ 4096 terms).
				if set.Side == SpatialSide && res.Method.AliasTerms <= maxWidthTerms {
					if w := res.Sampled.Re.RelWidth(); w > 1e-12 {
						t.Errorf("%v, h=%g: T = %v, relative width %.3g > 1e-12", fam, h, res.Sampled.Re, w)
					}
				}
				t.Logf("%v, h=%g, %v side: %d terms, T relative width %.2g", fam, h, set.Side, res.Method.AliasTerms, res.Sampled.Re.RelWidth())
			}
		}
	}
}
