package bounds

import (
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
