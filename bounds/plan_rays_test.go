package bounds

import (
	"math"
	"testing"
)

// directRay returns Σ_{i≥0} g(x + ih) summed term by term in float64 with
// Neumaier's compensated summation, until the terms fall below 2⁻⁷⁰ of the
// sum for 50 consecutive terms or 4·10⁶ terms are summed, adding for
// slowly decaying g the rest by its integral (tail(X) = ∫_X^∞ g, given in
// closed form by the caller, or nil) and half its first term.
func directRay(g func(x float64) float64, x, h float64, tail func(x float64) float64) float64 {
	sum, comp := 0.0, 0.0
	small := 0
	i := 0
	for ; i < 4_000_000; i++ {
		t := g(x + h*float64(i))
		s := sum + t
		if math.Abs(sum) >= math.Abs(t) {
			comp += (sum - s) + t
		} else {
			comp += (t - s) + sum
		}
		sum = s
		if t < 0x1p-70*sum {
			small++
			if small > 50 {
				i++
				break
			}
		} else {
			small = 0
		}
	}
	sum += comp
	if tail != nil {
		// Σ_{j≥0} g(X + jh) = (1/h)∫_X^∞ g + g(X)/2 + O(h·g'(X))
		// (Euler–Maclaurin, DLMF 2.10.1, from memory).
		X := x + h*float64(i)
		sum += tail(X)/h + g(X)/2
	}
	return sum
}

// TestPointRays checks the planner model's ray sums against direct sums of
// the closed forms of the catalogue (math.md), term by term: they
// steer the search, so they need not be bounds, but they must be accurate
// (here to 1e-12 relative; the model's budget is 2⁻⁸ of the tolerance).
func TestPointRays(t *testing.T) {
	gauss := func(s float64) func(float64) float64 {
		return func(x float64) float64 { return math.Exp(-x * x / (2 * s * s)) }
	}
	sech := func(x float64) float64 { return 1 / math.Cosh(x) }
	sech2 := func(x float64) float64 { c := math.Cosh(x); return 1 / (c * c) }
	expo := func(a float64) func(float64) float64 {
		return func(x float64) float64 { return math.Exp(-a * x) }
	}
	lorentz := func(a float64) func(float64) float64 {
		return func(x float64) float64 { return 1 / (a*a + x*x) }
	}
	// ∫_X^∞ dt/(a² + t²) = atan(a/X)/a.
	lorentzTail := func(a float64) func(float64) float64 {
		return func(x float64) float64 { return math.Atan(a/x) / a }
	}
	wave := func(s, w0 float64) func(float64) float64 {
		return func(x float64) float64 { return math.Exp(-x*x/(2*s*s)) * math.Abs(math.Cos(w0*x)) }
	}
	tests := []struct {
		name string
		ray  func(x, h float64) float64
		ref  func(float64) float64
		tail func(float64) float64
		xs   []float64
		hs   []float64
	}{
		{"gaussian σ=1", func(x, h float64) float64 { return gaussRay(x, h, 1) }, gauss(1), nil,
			[]float64{0, 0.3, 2, 5.5, 9}, []float64{0.05, 0.4, 0.97, 3}},
		{"gaussian σ=0.3 small steps", func(x, h float64) float64 { return gaussRay(x, h, 0.3) }, gauss(0.3), nil,
			[]float64{0, 0.5, 1.2}, []float64{0.0005, 0.002}},
		{"sech w=1", func(x, h float64) float64 { return sechRay(x, h) }, sech, nil,
			[]float64{0, 0.5, 1.39, 1.41, 7, 21}, []float64{0.03, 0.45, 2}},
		{"sech² w=1", func(x, h float64) float64 { return sech2Ray(x, h) }, sech2, nil,
			[]float64{0, 0.5, 1.41, 7, 21}, []float64{0.03, 0.45, 2}},
		{"exponential a=1.5", func(x, h float64) float64 { return expRay(x, h, 1.5) }, expo(1.5), nil,
			[]float64{0, 3, 12}, []float64{0.01, 0.5, 4}},
		{"lorentzian a=0.7", func(x, h float64) float64 { return lorentzRay(x, h, 0.7) }, lorentz(0.7), lorentzTail(0.7),
			[]float64{0, 0.3, 5, 400}, []float64{0.01, 0.4, 3}},
		{"wave packet σ=1 ω₀=3", func(x, h float64) float64 { return wavePacketRay(x, h, 1, 3) }, wave(1, 3), nil,
			[]float64{0, 1.1, 5.5}, []float64{0.05, 0.66, 1.3}},
	}
	for _, tt := range tests {
		for _, x := range tt.xs {
			for _, h := range tt.hs {
				got := tt.ray(x, h)
				want := directRay(tt.ref, x, h, tt.tail)
				tol := 1e-12
				if tt.tail != nil {
					// The reference's own tail: O(h·g'(X)), below 1e-11 of
					// the sum once 4·10⁶ terms are summed.
					tol = 1e-11
				}
				if math.Abs(got-want) > tol*want {
					t.Errorf("%s: ray(%g, %g) = %.17g, want %.17g (rel %.2g)", tt.name, x, h, got, want, math.Abs(got-want)/want)
				}
			}
		}
	}
	// The line ray of a Gaussian that starts before its centre.
	for _, x := range []float64{-7.3, -2, -0.4} {
		for _, h := range []float64{0.3, 1.7} {
			got := gaussLineRay(x, h, 0.8)
			want := directRay(gauss(0.8), x, h, nil)
			if math.Abs(got-want) > 1e-12*want {
				t.Errorf("gaussLineRay(%g, %g) = %.17g, want %.17g", x, h, got, want)
			}
		}
	}
}
