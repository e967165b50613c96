package bounds

import (
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
