package bounds

import (
	"fmt"
	"strconv"
	"strings"
)

// RadialGaussian is the isotropic Gaussian on R^n centred at c,
//
//	f(x) = exp(-|x - c|²/(2σ²)),   F(ξ) = (σ√(2π))^n exp(-σ²|ξ|²/2) e^{-iξ·c}
//
// (the one-dimensional pair of GaussianFamily on each axis, shifted:
// f(x - c) ↦ F(ξ)e^{-iξc}; math.md, catalogue). It is separable, f(x) =
// Π_j exp(-(x_j - c_j)²/(2σ²)), so it also implements Factored. The
// dimension n = len(Center) is between 1 and MaxDim; Center must not be
// modified after the value is built.
type RadialGaussian struct {
	Sigma  float64   // σ > 0
	Center []float64 // c, one coordinate per axis
}

// NewRadialGaussian returns the isotropic Gaussian of width σ centred at
// c (copied); its dimension is len(c).
func NewRadialGaussian(sigma float64, c []float64) (RadialGaussian, error) {
	g := RadialGaussian{Sigma: sigma, Center: append([]float64(nil), c...)}
	return g, g.Validate()
}

// Validate checks σ, the dimension and the centre.
func (g RadialGaussian) Validate() error {
	if !finite(g.Sigma) || g.Sigma <= 0 {
		return invalidf("radial_gaussian.sigma", "must be finite and > 0, got %g", g.Sigma)
	}
	if len(g.Center) < 1 || len(g.Center) > MaxDim {
		return invalidf("radial_gaussian.center", "dimension must be between 1 and %d, got %d", MaxDim, len(g.Center))
	}
	for j, c := range g.Center {
		if !finite(c) {
			return invalidf("radial_gaussian.center["+strconv.Itoa(j)+"]", "must be finite, got %g", c)
		}
	}
	return nil
}

// Dim returns n.
func (g RadialGaussian) Dim() int { return len(g.Center) }

func (g RadialGaussian) String() string {
	cs := make([]string, len(g.Center))
	for j, c := range g.Center {
		cs[j] = strconv.FormatFloat(c, 'g', -1, 64)
	}
	return fmt.Sprintf("radial_gaussian(sigma=%g, center=[%s])", g.Sigma, strings.Join(cs, ", "))
}

// Factors returns the one-dimensional factors exp(-(x_j - c_j)²/(2σ²)).
func (g RadialGaussian) Factors() []Family {
	fs := make([]Family, len(g.Center))
	for j, c := range g.Center {
		fs[j] = shiftedGaussian{sigma: g.Sigma, center: c}
	}
	return fs
}

// Value encloses exp(-|x - c|²/(2σ²)) from the squared distance summed in
// interval arithmetic. A point of the wrong dimension gives Entire.
func (g RadialGaussian) Value(x []Interval) Complex {
	if len(x) != len(g.Center) {
		return Complex{entire, entire}
	}
	var r2 Interval
	for j, c := range g.Center {
		r2 = r2.Add(x[j].AddFloat(-c).Sqr())
	}
	return RealC(Exp(r2.Div(Point(g.Sigma).Sqr()).Scale(-0.5)))
}

// Transform encloses (σ√(2π))^n exp(-σ²|ξ|²/2) e^{-iξ·c}. A point of the
// wrong dimension gives Entire.
func (g RadialGaussian) Transform(xi []Interval) Complex {
	if len(xi) != len(g.Center) {
		return Complex{entire, entire}
	}
	var r2, phase Interval
	for j, c := range g.Center {
		r2 = r2.Add(xi[j].Scale(g.Sigma).Sqr())
		phase = phase.Add(xi[j].Scale(c))
	}
	amp := SqrtTwoPi.Scale(g.Sigma).IntPow(len(g.Center))
	v := RealC(Exp(r2.Scale(-0.5)).Mul(amp))
	if phase.Lo == 0 && phase.Hi == 0 {
		return v
	}
	return v.Mul(Cis(phase.Neg()))
}

// Spatial is the function itself: a Gaussian of |x - c| with amplitude 1
// and width σ.
func (g RadialGaussian) Spatial() RadialEnvelope {
	return RadialEnvelope{
		Center:  append([]float64(nil), g.Center...),
		Profile: Envelope{{Decay: Gaussian, Amplitude: 1, Width: g.Sigma}},
	}
}

// Spectral is the modulus of the transform: a Gaussian of |ξ| with
// amplitude (σ√(2π))^n and width 1/σ, rounded up (a wider Gaussian is
// larger, so the envelope stays an upper bound).
func (g RadialGaussian) Spectral() RadialEnvelope {
	n := len(g.Center)
	return RadialEnvelope{
		Center: make([]float64, n),
		Profile: Envelope{{Decay: Gaussian, Amplitude: SqrtTwoPi.Scale(g.Sigma).IntPow(n).Hi,
			Width: divUp(1, g.Sigma)}},
	}
}

// shiftedGaussian is the one-dimensional factor exp(-(x - c)²/(2σ²)) of a
// RadialGaussian, with transform σ√(2π) exp(-σ²ξ²/2) e^{-iξc}.
type shiftedGaussian struct {
	sigma, center float64
}

func (s shiftedGaussian) Validate() error {
	if !finite(s.sigma) || s.sigma <= 0 {
		return invalidf("gaussian.sigma", "must be finite and > 0, got %g", s.sigma)
	}
	if !finite(s.center) {
		return invalidf("gaussian.center", "must be finite, got %g", s.center)
	}
	return nil
}

func (s shiftedGaussian) String() string {
	return fmt.Sprintf("gaussian(sigma=%g, center=%g)", s.sigma, s.center)
}

func (s shiftedGaussian) Value(x Interval) Complex {
	return RealC(Exp(x.AddFloat(-s.center).Div(Point(s.sigma)).Sqr().Scale(-0.5)))
}

func (s shiftedGaussian) Transform(xi Interval) Complex {
	v := RealC(Exp(xi.Scale(s.sigma).Sqr().Scale(-0.5)).Mul(SqrtTwoPi.Scale(s.sigma)))
	if s.center == 0 {
		return v
	}
	return v.Mul(Cis(xi.Scale(s.center).Neg()))
}

func (s shiftedGaussian) Spatial() Envelope {
	return Envelope{{Decay: Gaussian, Amplitude: 1, Center: s.center, Width: s.sigma}}
}

func (s shiftedGaussian) Spectral() Envelope {
	return Envelope{{Decay: Gaussian, Amplitude: SqrtTwoPi.Scale(s.sigma).Hi, Width: divUp(1, s.sigma)}}
}
