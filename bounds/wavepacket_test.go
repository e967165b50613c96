package bounds

import (
	"math/big"

	"foldbound/internal/bigref"
	"math"
	"testing"
)

// Quadrature check of σ√(π/2)[e^{-σ²(ξ-ω₀)²/2} + e^{-σ²(ξ+ω₀)²/2}]
// (gonum quad.Legendre on [-10σ, 10σ]; the tail
// ∫_{|x|>X} e^{-x²/(2σ²)} = σ√(2π)·erfc(X/(σ√2))).
func TestWavePacketTransformQuadrature(t *testing.T) {
	var tests []transformCase
	for _, p := range []struct{ sigma, omega0 float64 }{
		{1, 0}, {1, 3}, {0.5, 10}, {2, -1.5},
	} {
		fam, err := NewWavePacket(p.sigma, p.omega0)
		if err != nil {
			t.Fatal(err)
		}
		s, om := p.sigma, p.omega0
		X := 10 * s
		tests = append(tests, transformCase{
			name: fam.String(),
			fam:  fam,
			f: func(x float64) complex128 {
				return complex(math.Exp(-x*x/(2*s*s))*math.Cos(om*x), 0)
			},
			xis:   []float64{0, om, -om + 0.3/s, 2 / s, math.Abs(om) + 6/s},
			lo:    -X,
			hi:    X,
			scale: math.Min(s, 1/(1+math.Abs(om))),
			tail: func(float64) (complex128, float64) {
				return 0, s * math.Sqrt(2*math.Pi) * math.Erfc(X/(s*math.Sqrt2))
			},
			abs: 1e-15 * s,
			rel: 1e-13,
		})
	}
	checkTransforms(t, tests)
}

// bigWavePacket is the math/big reference of exp(-x²/(2σ²))cos(ω₀x) and of
// its transform.
func bigWavePacket(sigma, omega0 float64) bigFamily {
	bs := bigref.New(sigma)
	return bigFamily{
		samples: func(h, s float64, lo, hi int64) []bigref.Complex {
			gs := gaussianSamples(sigma, h, s, lo, hi)
			cs := cisSamples(omega0, h, s, lo, hi)
			out := make([]bigref.Complex, len(gs))
			for i, g := range gs {
				out[i] = bigref.Real(bigref.Mul(g, cs[i].Re))
			}
			return out
		},
		tail: gaussTail(1, 0, sigma),
		// Both Gaussians are at most σ√(π/2)e^{-σ²(|ξ|-|ω₀|)²/2} for |ξ| ≥ |ω₀|.
		specBound: func(d float64) float64 {
			return 2 * sigma * math.Sqrt(math.Pi/2) * math.Exp(-sigma*sigma*d*d/2)
		},
		specR: math.Abs(omega0),
		transform: func(xi *big.Float) bigref.Complex {
			g := func(d *big.Float) *big.Float {
				u := bigref.Mul(bs, d)
				return bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(u, u), bigref.Int(2))))
			}
			sum := bigref.Add(g(bigref.Sub(xi, bigref.New(omega0))), g(bigref.Add(xi, bigref.New(omega0))))
			c := bigref.Mul(bs, bigref.Sqrt(bigref.Quo(bigref.Pi(), bigref.Int(2))))
			return bigref.Real(bigref.Mul(c, sum))
		},
	}
}

// Containment: math/big direct spatial sums lie in AliasSum's enclosures.
func TestWavePacketContainment(t *testing.T) {
	for _, p := range []struct{ sigma, omega0 float64 }{{1, 3}, {0.7, 0}, {2, -5}} {
		fam, _ := NewWavePacket(p.sigma, p.omega0)
		checkContainment(t, fam, bigWavePacket(p.sigma, p.omega0), standardCases(p.sigma))
	}
}
