package bounds

import (
	"context"
	"errors"
	"math"
	"testing"

	"foldbound/internal/bigref"
)

// The periodized Gaussian sampled at N points: the discrete coefficient
// (1/N) Σ_j f_per(2πj/N) e^{-ik2πj/N} is computed in math/big directly
// from its definition (f_per summed over 2π-translates until negligible)
// and must lie in PeriodicRule's enclosure of c_k + Σ_{m≠0} c_{k+mN}.
func TestPeriodicRuleContainsDirectDFT(t *testing.T) {
	ctx := context.Background()
	for _, sigma := range []float64{0.4, 0.9, 1.6} {
		g := GaussianFamily{Sigma: sigma}
		for _, n := range []int64{4, 7, 16} {
			for _, k := range []int64{0, 1, 3} {
				r, err := PeriodicRule(ctx, g, n, k, Settings{})
				if err != nil {
					t.Fatal(err)
				}
				want := bigref.C(0, 0)
				twoPi := bigref.Mul(bigref.Int(2), bigref.Pi())
				for j := int64(0); j < n; j++ {
					theta := bigref.Quo(bigref.Mul(twoPi, bigref.Int(j)), bigref.Int(n))
					fper := bigref.Int(0)
					for m := int64(-12); m <= 12; m++ { // e^{-(2π·12)²/(2·1.6²)} is far below 2^-300
						x := bigref.Add(theta, bigref.Mul(twoPi, bigref.Int(m)))
						u := bigref.Quo(x, bigref.New(sigma))
						fper = bigref.Add(fper, bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(u, u), bigref.Int(2)))))
					}
					phase := bigref.Cis(bigref.Neg(bigref.Mul(bigref.Int(k), theta)))
					want = want.Add(bigref.Real(fper).Mul(phase))
				}
				want = want.Scale(bigref.Quo(bigref.Int(1), bigref.Int(n)))
				// The reference's phases carry about 2^-300 relative error.
				if !inCRef(r.Coefficient, want, 1e-85) {
					t.Errorf("σ=%g N=%d k=%d: c_k^(N) = %v, want %.17g", sigma, n, k, r.Coefficient, bigref.Float64(want.Re))
				}
			}
		}
	}
}

// StripBound against a function with known coefficients: f(θ) =
// sinh(a)/(cosh(a) - cos θ) = Σ_k e^{-a|k|} e^{ikθ} (the Poisson kernel,
// e.g. DLMF 4.36 / any table of Fourier series, from memory), analytic in
// |Im θ| < a and bounded there by M_b = sinh a/(cosh a - cosh b) on the
// strip of half-width b < a. The true alias error of coefficient k is
// Σ_{m≠0} e^{-a|k+mN|}.
func TestStripBoundPoissonKernel(t *testing.T) {
	for _, a := range []float64{0.3, 1, 2.5} {
		for _, n := range []int64{5, 12, 40} {
			for _, k := range []int64{0, 2} {
				if k >= n {
					continue
				}
				var alias float64
				for m := int64(1); m < 200; m++ {
					alias += math.Exp(-a*math.Abs(float64(k+m*n))) + math.Exp(-a*math.Abs(float64(k-m*n)))
				}
				b := 0.9 * a
				M := math.Sinh(a) / (math.Cosh(a) - math.Cosh(b))
				bound, err := StripBound(M, b, n, k)
				if err != nil {
					t.Fatal(err)
				}
				if bound < alias {
					t.Errorf("a=%g N=%d k=%d: strip bound %g < alias error %g", a, n, k, bound, alias)
				}
			}
		}
	}
	if _, err := StripBound(1, 1, 4, 4); !errors.Is(err, ErrInvalid) {
		t.Errorf("k = N: err = %v, want ErrInvalid", err)
	}
}
