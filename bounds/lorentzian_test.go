package bounds

import (
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
