package bounds

import (
	"math"
	"testing"
)

// Quadrature check of πw²ξ/sinh(πwξ/2) (gonum quad.Legendre on
// [-25w, 25w]; the tail ∫_{|x|>X} sech²(x/w) ≤ 4w·e^{-2X/w}).
func TestSechSquaredTransformQuadrature(t *testing.T) {
	var tests []transformCase
	for _, w := range []float64{1, 0.5, 2} {
		fam, err := NewSechSquared(w)
		if err != nil {
			t.Fatal(err)
		}
		X := 25 * w
		tests = append(tests, transformCase{
			name: fam.String(),
			fam:  fam,
			f: func(x float64) complex128 {
				c := 1 / math.Cosh(x/w)
				return complex(c*c, 0)
			},
			xis:   []float64{0, 1e-3 / w, 1 / w, 5 / w, 15 / w},
			lo:    -X,
			hi:    X,
			scale: w,
			tail:  func(float64) (complex128, float64) { return 0, 4 * w * math.Exp(-2*X/w) },
			abs:   1e-15 * w,
			rel:   1e-13,
		})
	}
	checkTransforms(t, tests)
}
