package bounds

import (
	"math/big"

	"foldbound/internal/bigref"
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

// bigSechSquared is the math/big reference of sech²(x/w) and of
// πw²ξ/sinh(πwξ/2) (2w at ξ = 0).
func bigSechSquared(w float64) bigFamily {
	bw := bigref.New(w)
	return bigFamily{
		samples: func(h, s float64, lo, hi int64) []bigref.Complex {
			es := geometricSamples(bigref.Quo(bigref.Int(1), bw), nil, h, s, lo, hi)
			out := make([]bigref.Complex, len(es))
			for i, e := range es {
				c := bigref.Quo(bigref.Mul(bigref.Int(2), e), bigref.Add(bigref.Int(1), bigref.Mul(e, e)))
				out[i] = bigref.Real(bigref.Mul(c, c))
			}
			return out
		},
		tail: expTail(4, 0, 2/w), // sech² u ≤ 4e^{-2|u|}
		// 2w·v/sinh v ≤ 2w(2v+1)e^{-v} ≤ 4w·e^{-v/2}, v = πw|ξ|/2, since
		// 2e^{v/2} - 2v - 1 is least at v = 2 ln 2, where it is 3 - 4 ln 2 > 0.
		specBound:   func(d float64) float64 { return 4 * w * math.Exp(-math.Pi*w*d/4) },
		nonNegative: true,
		transform: func(xi *big.Float) bigref.Complex {
			if xi.Sign() == 0 {
				return bigref.Real(bigref.Mul(bigref.Int(2), bw))
			}
			pw := bigref.Mul(bigref.Pi(), bw)
			num := bigref.Mul(bigref.Mul(pw, bw), xi)
			return bigref.Real(bigref.Quo(num, bigref.Sinh(bigref.Quo(bigref.Mul(pw, xi), bigref.Int(2)))))
		},
	}
}

// Containment: math/big direct spatial sums lie in AliasSum's enclosures.
func TestSechSquaredContainment(t *testing.T) {
	for _, w := range []float64{1, 2.5} {
		fam, _ := NewSechSquared(w)
		checkContainment(t, fam, bigSechSquared(w), standardCases(w))
	}
}
