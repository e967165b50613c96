package bounds

import (
	"math"
	"testing"
)

// Quadrature check of πw·sech(πwξ/2) (gonum quad.Legendre on [-45w, 45w];
// the tail ∫_{|x|>X} sech(x/w) ≤ 4w·e^{-X/w}).
func TestSechTransformQuadrature(t *testing.T) {
	var tests []transformCase
	for _, w := range []float64{1, 0.2, 3} {
		fam, err := NewSech(w)
		if err != nil {
			t.Fatal(err)
		}
		X := 45 * w
		tests = append(tests, transformCase{
			name:  fam.String(),
			fam:   fam,
			f:     func(x float64) complex128 { return complex(1/math.Cosh(x/w), 0) },
			xis:   []float64{0, 1 / w, 4 / w, 12 / w},
			lo:    -X,
			hi:    X,
			scale: w,
			tail:  func(float64) (complex128, float64) { return 0, 4 * w * math.Exp(-X/w) },
			abs:   1e-15 * w,
			rel:   1e-13,
		})
	}
	checkTransforms(t, tests)
}
