package bounds

import "fmt"

// WavePacketFamily is the Gaussian wave packet
// f(x) = exp(-x²/(2σ²))·cos(ω₀x), whose transform is
//
//	F(ξ) = σ√(π/2)·[e^{-σ²(ξ-ω₀)²/2} + e^{-σ²(ξ+ω₀)²/2}]
//
// (the Gaussian transform of GaussianFamily with the modulation rule
// f(x)e^{iω₀x} → F(ξ-ω₀) applied to cos ω₀x = (e^{iω₀x} + e^{-iω₀x})/2;
// math.md, catalogue). Any finite ω₀ is allowed; ω₀ = 0 is the Gaussian and
// f does not depend on the sign of ω₀.
type WavePacketFamily struct {
	Sigma  float64 // σ > 0
	Omega0 float64 // ω₀, the carrier (angular) frequency
}

// NewWavePacket returns the wave packet of width σ and carrier ω₀.
func NewWavePacket(sigma, omega0 float64) (WavePacketFamily, error) {
	p := WavePacketFamily{Sigma: sigma, Omega0: omega0}
	return p, p.Validate()
}

// Validate reports whether σ is finite and positive, ω₀ finite, and both
// within the range where the envelopes are finite.
func (p WavePacketFamily) Validate() error {
	if !finite(p.Sigma) || p.Sigma <= 0 {
		return invalidf("wavepacket.sigma", "must be finite and > 0, got %g", p.Sigma)
	}
	if !finite(p.Omega0) {
		return invalidf("wavepacket.omega0", "must be finite, got %g", p.Omega0)
	}
	return checkEnvelopeRange(p, "wavepacket.sigma", p.Sigma)
}

func (p WavePacketFamily) String() string {
	return fmt.Sprintf("wavepacket(sigma=%g, omega0=%g)", p.Sigma, p.Omega0)
}

// Value encloses exp(-x²/(2σ²))·cos(ω₀x).
func (p WavePacketFamily) Value(x Interval) Complex {
	g := Exp(divPos(x, p.Sigma).Sqr().Scale(-0.5))
	if p.Omega0 == 0 {
		return RealC(g)
	}
	return RealC(g.Mul(Cos(x.Scale(p.Omega0))))
}

// Transform encloses σ√(π/2)·[e^{-σ²(ξ-ω₀)²/2} + e^{-σ²(ξ+ω₀)²/2}].
func (p WavePacketFamily) Transform(xi Interval) Complex {
	s := p.Sigma
	g1 := Exp(xi.AddFloat(-p.Omega0).Scale(s).Sqr().Scale(-0.5))
	g2 := Exp(xi.AddFloat(p.Omega0).Scale(s).Sqr().Scale(-0.5))
	// √(π/2) = √(2π)/2.
	return RealC(g1.Add(g2).Mul(SqrtTwoPi.Scale(0.5 * s)))
}

// Spatial is the Gaussian factor: |f(x)| ≤ exp(-x²/(2σ²)), one Gaussian
// term of amplitude 1 and width σ (exact where |cos ω₀x| = 1).
func (p WavePacketFamily) Spatial() Envelope { return p.appendSpatial(nil) }

func (p WavePacketFamily) appendSpatial(dst Envelope) Envelope {
	return append(dst, EnvelopeTerm{Decay: Gaussian, Amplitude: 1, Width: p.Sigma})
}

// Spectral is F itself: two Gaussian terms of amplitude σ√(π/2) (rounded
// up) and width 1/σ (rounded up), centred at ±ω₀.
func (p WavePacketFamily) Spectral() Envelope { return p.appendSpectral(nil) }

func (p WavePacketFamily) appendSpectral(dst Envelope) Envelope {
	A := SqrtTwoPi.Scale(0.5 * p.Sigma).Hi
	w := divUp(1, p.Sigma)
	return append(dst, EnvelopeTerm{Decay: Gaussian, Amplitude: A, Center: -p.Omega0, Width: w},
		EnvelopeTerm{Decay: Gaussian, Amplitude: A, Center: p.Omega0, Width: w})
}
