package bounds

import (
	"math"
	"testing"
)

// fejerTail returns the part of ∫ f(x)cos(ξx) dx over |x| > X for
// f(x) = sinc²(Ωx/2) = (2/Ω²)(1 - cos Ωx)/x², and a bound on what the
// returned value leaves out. With
//
//	f(x)cos(ξx) = (2/(Ω²x²))·[cos ξx - ½cos((ξ+Ω)x) - ½cos((ξ-Ω)x)],
//
// each piece has the tail T(θ) = ∫_X^∞ cos(θx)/x² dx, which is 1/X for
// θ = 0 and, after one integration by parts, -sin(θX)/(θX²) with a
// remainder at most 4/(θ²X³) otherwise.
func fejerTail(omega, xi, X float64) (complex128, float64) {
	T := func(theta float64) (float64, float64) {
		if theta == 0 {
			return 1 / X, 1e-16 / X
		}
		return -math.Sin(theta*X) / (theta * X * X), 4 / (theta * theta * X * X * X)
	}
	v0, b0 := T(xi)
	v1, b1 := T(xi + omega)
	v2, b2 := T(xi - omega)
	k := 2 * 2 / (omega * omega) // two sides, factor 2/Ω²
	return complex(k*(v0-v1/2-v2/2), 0), k * (b0 + b1/2 + b2/2)
}

// Quadrature check of the triangle (2π/Ω)max(0, 1-|ξ|/Ω) (gonum
// quad.Legendre on [-X, X], X = 5000/Ω, with the analytic tail fejerTail).
func TestFejerTransformQuadrature(t *testing.T) {
	var tests []transformCase
	for _, om := range []float64{1, 0.3, 7} {
		fam, err := NewFejer(om)
		if err != nil {
			t.Fatal(err)
		}
		X := 5000 / om
		tests = append(tests, transformCase{
			name: fam.String(),
			fam:  fam,
			f: func(x float64) complex128 {
				u := om * x / 2
				if u == 0 {
					return 1
				}
				s := math.Sin(u) / u
				return complex(s*s, 0)
			},
			xis:   []float64{0, 0.5 * om, om, 1.5 * om, 3 * om},
			lo:    -X,
			hi:    X,
			scale: 1 / om,
			tail:  func(xi float64) (complex128, float64) { return fejerTail(om, xi, X) },
			abs:   1e-14 / om,
			rel:   1e-12,
		})
	}
	checkTransforms(t, tests)
}
