package bounds

import (
	"math/big"

	"foldbound/internal/bigref"
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

// bigSech is the math/big reference of sech(x/w) = 2E/(1+E²), E = e^{-|x|/w},
// and of πw·sech(πwξ/2).
func bigSech(w float64) bigFamily {
	bw := bigref.New(w)
	return bigFamily{
		samples: func(h, s float64, lo, hi int64) []bigref.Complex {
			es := geometricSamples(bigref.Quo(bigref.Int(1), bw), nil, h, s, lo, hi)
			out := make([]bigref.Complex, len(es))
			for i, e := range es {
				out[i] = bigref.Real(bigref.Quo(bigref.Mul(bigref.Int(2), e), bigref.Add(bigref.Int(1), bigref.Mul(e, e))))
			}
			return out
		},
		tail: expTail(2, 0, 1/w), // sech u ≤ 2e^{-|u|}
		// πw·sech(πwξ/2) ≤ 2πw·e^{-πw|ξ|/2}.
		specBound:   func(d float64) float64 { return 2 * math.Pi * w * math.Exp(-math.Pi*w*d/2) },
		nonNegative: true,
		transform: func(xi *big.Float) bigref.Complex {
			pw := bigref.Mul(bigref.Pi(), bw)
			return bigref.Real(bigref.Mul(pw, bigref.Sech(bigref.Quo(bigref.Mul(pw, xi), bigref.Int(2)))))
		},
	}
}

// Containment: math/big direct spatial sums lie in AliasSum's enclosures.
func TestSechContainment(t *testing.T) {
	for _, w := range []float64{1, 0.4} {
		fam, _ := NewSech(w)
		checkContainment(t, fam, bigSech(w), standardCases(w))
	}
}
