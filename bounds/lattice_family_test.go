package bounds

import (
	"fmt"
	"math"
)

// radialGaussianND is a test family on Rⁿ, written here independently of
// any family of the package:
//
//	f(x) = exp(-|x-c|²/(2σ²))·e^{iω·x}
//	F(ξ) = (σ√(2π))ⁿ exp(-σ²|ξ-ω|²/2)·e^{-i(ξ-ω)·c}
//
// (the Gaussian row of the catalogue in math.md, taken per axis, with the
// shift and modulation rules below it).
type radialGaussianND struct {
	sigma float64
	c     []float64 // centre (nil: 0)
	omega []float64 // modulation (nil: 0)
	n     int
}

func newRadialGaussianND(n int, sigma float64, c, omega []float64) radialGaussianND {
	if c == nil {
		c = make([]float64, n)
	}
	if omega == nil {
		omega = make([]float64, n)
	}
	return radialGaussianND{sigma: sigma, c: c, omega: omega, n: n}
}

func (g radialGaussianND) Dim() int { return g.n }

func (g radialGaussianND) String() string {
	return fmt.Sprintf("radial-gaussian%d(sigma=%g)", g.n, g.sigma)
}

func (g radialGaussianND) Value(x []Interval) Complex {
	r2 := Point(0)
	ph := Point(0)
	zeroOmega := true
	for i := range x {
		r2 = r2.Add(x[i].AddFloat(-g.c[i]).Sqr())
		if g.omega[i] != 0 {
			ph = ph.Add(x[i].Scale(g.omega[i]))
			zeroOmega = false
		}
	}
	mag := Exp(r2.Div(Point(g.sigma).Sqr()).Scale(-0.5))
	if zeroOmega {
		return RealC(mag)
	}
	return Cis(ph).MulReal(mag)
}

func (g radialGaussianND) amplitude() Interval {
	return SqrtTwoPi.Scale(g.sigma).IntPow(g.n)
}

func (g radialGaussianND) Transform(xi []Interval) Complex {
	r2 := Point(0)
	ph := Point(0)
	zeroC := true
	for i := range xi {
		u := xi[i].AddFloat(-g.omega[i])
		r2 = r2.Add(u.Sqr())
		if g.c[i] != 0 {
			ph = ph.Add(u.Scale(g.c[i]))
			zeroC = false
		}
	}
	mag := Exp(r2.Mul(Point(g.sigma).Sqr()).Scale(-0.5)).Mul(g.amplitude())
	if zeroC {
		return RealC(mag)
	}
	return Cis(ph.Neg()).MulReal(mag)
}

func (g radialGaussianND) Spatial() RadialEnvelope {
	return RadialEnvelope{Center: g.c, Profile: Envelope{{Decay: Gaussian, Amplitude: 1, Width: g.sigma}}}
}

func (g radialGaussianND) Spectral() RadialEnvelope {
	return RadialEnvelope{Center: g.omega, Profile: Envelope{{Decay: Gaussian,
		Amplitude: g.amplitude().Hi, Width: divDown(1, g.sigma)}}}
}

// refGaussianTerm returns, in float64, the term |det W|·f(x)e^{-iξ·x} of
// the direct spatial sum, and the bound on its rounding error derived in
// directSumFloat.
func refGaussianTerm(g radialGaussianND, x, xi []float64) (complex128, float64) {
	r2, ph, xmag := 0.0, 0.0, 0.0
	for i := range x {
		d := x[i] - g.c[i]
		r2 += d * d
		ph += (g.omega[i] - xi[i]) * x[i]
		xmag += math.Abs(x[i]) * (math.Abs(x[i]) + math.Abs(g.c[i]) + math.Abs(g.omega[i]) + math.Abs(xi[i]))
	}
	m := math.Exp(-r2 / (2 * g.sigma * g.sigma))
	return complex(m*math.Cos(ph), m*math.Sin(ph)), xmag
}
