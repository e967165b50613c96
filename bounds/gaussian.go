package bounds

import "fmt"

// GaussianFamily is f(x) = exp(-x²/(2σ²)), whose transform is
//
//	F(ξ) = σ√(2π)·exp(-σ²ξ²/2)
//
// (DLMF 7.7.6 with a change of variable; math.md, catalogue).
type GaussianFamily struct {
	Sigma float64 // σ > 0
}

// NewGaussian returns the Gaussian family of width σ.
func NewGaussian(sigma float64) (GaussianFamily, error) {
	g := GaussianFamily{Sigma: sigma}
	return g, g.Validate()
}

// Validate reports whether σ is finite and positive.
func (g GaussianFamily) Validate() error {
	if !finite(g.Sigma) || g.Sigma <= 0 {
		return invalidf("gaussian.sigma", "must be finite and > 0, got %g", g.Sigma)
	}
	return nil
}

func (g GaussianFamily) String() string { return fmt.Sprintf("gaussian(sigma=%g)", g.Sigma) }

// Value encloses exp(-x²/(2σ²)).
func (g GaussianFamily) Value(x Interval) Complex {
	u := x.Div(Point(g.Sigma)).Sqr().Scale(-0.5)
	return RealC(Exp(u))
}

// Transform encloses σ√(2π)·exp(-σ²ξ²/2).
func (g GaussianFamily) Transform(xi Interval) Complex {
	u := xi.Scale(g.Sigma).Sqr().Scale(-0.5)
	return RealC(Exp(u).Mul(SqrtTwoPi.Scale(g.Sigma)))
}

// Spatial is the function itself: one Gaussian term of width σ.
func (g GaussianFamily) Spatial() Envelope { return g.appendSpatial(nil) }

func (g GaussianFamily) appendSpatial(dst Envelope) Envelope {
	return append(dst, EnvelopeTerm{Decay: Gaussian, Amplitude: 1, Width: g.Sigma})
}

// Spectral is the transform itself: amplitude σ√(2π), width 1/σ.
func (g GaussianFamily) Spectral() Envelope { return g.appendSpectral(nil) }

func (g GaussianFamily) appendSpectral(dst Envelope) Envelope {
	return append(dst, EnvelopeTerm{Decay: Gaussian, Amplitude: SqrtTwoPi.Scale(g.Sigma).Hi, Width: divUp(1, g.Sigma)})
}
