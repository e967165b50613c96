package scan

import (
	"fmt"
	"math"
)

// Window selects the apodising window W(σ) of the ramp filter |σ|·W(σ),
// cut off at the Nyquist frequency b = π/τ of the detector spacing τ.
type Window int

const (
	// RamLak is the unwindowed ramp, W = 1 (Ramachandran & Lakshminarayanan,
	// PNAS 68 (1971), from memory).
	RamLak Window = iota
	// SheppLogan is W(σ) = sinc(στ/2) = sin(στ/2)/(στ/2) (Shepp & Logan,
	// IEEE Trans. Nucl. Sci. 21 (1974), from memory).
	SheppLogan
	// Hann is W(σ) = ½(1 + cos(στ)) (common practice, no source).
	Hann
)

func (w Window) String() string {
	switch w {
	case RamLak:
		return "Ram-Lak"
	case SheppLogan:
		return "Shepp-Logan"
	case Hann:
		return "Hann"
	}
	return fmt.Sprintf("Window(%d)", int(w))
}

func (w Window) valid() bool { return w >= RamLak && w <= Hann }

// kernel returns the band-limited filter kernel
//
//	h(s) = (1/2π) ∫_{−b}^{b} |σ| W(σ) e^{iσs} dσ,   b = π/τ,
//
// so that f(x) = (1/2π) ∫_0^π (g(φ,·) * h)(x·θ) dφ is the inversion formula
// with the band limit applied (2-D transform in the angular convention;
// projection-slice theorem). Closed forms, with t = bs:
//
//	Ram-Lak:      h(s) = (b²/π)·F(t),  F(t) = ∫_0^1 u cos(ut) du = sin t/t + (cos t − 1)/t²
//	Shepp-Logan:  h(s) = (1/(πτ))·[c(τ/2 + s) + c(τ/2 − s)],  c(u) = (1 − cos bu)/u
//	Hann:         h(s) = ½h₀(s) + ¼h₀(s − τ) + ¼h₀(s + τ),  h₀ the Ram-Lak kernel
//
// (elementary integrals; the Hann line uses cos(στ)cos(σs) =
// ½[cos σ(s−τ) + cos σ(s+τ)]). On the grid s = nτ these give the classical
// values h(0) = π/(2τ²), h(nτ) = −2/(πn²τ²) for odd n, 0 for even n ≠ 0
// (Ram-Lak) and h(nτ) = −4/(πτ²(4n²−1)) (Shepp-Logan); the tests check all
// three against numerical quadrature of the defining integral.
func (w Window) kernel(s, tau float64) float64 {
	switch w {
	case SheppLogan:
		b := math.Pi / tau
		return (sheppTerm(tau/2+s, b) + sheppTerm(tau/2-s, b)) / (math.Pi * tau)
	case Hann:
		return 0.5*ramLak(s, tau) + 0.25*(ramLak(s-tau, tau)+ramLak(s+tau, tau))
	default:
		return ramLak(s, tau)
	}
}

// ramLak is the band-limited ramp kernel (b²/π)·F(bs).
func ramLak(s, tau float64) float64 {
	b := math.Pi / tau
	t := b * s
	var f float64
	if math.Abs(t) < 1e-3 {
		t2 := t * t
		f = 0.5 - t2/8 + t2*t2/144 // Taylor series of ∫_0^1 u cos(ut) du
	} else {
		// cos t − 1 = −2 sin²(t/2) avoids cancellation.
		h := math.Sin(t / 2)
		f = math.Sin(t)/t - 2*h*h/(t*t)
	}
	return b * b / math.Pi * f
}

// sheppTerm is (1 − cos bu)/u = 2 sin²(bu/2)/u, with its limit 0 at u = 0.
func sheppTerm(u, b float64) float64 {
	if math.Abs(b*u) < 1e-8 {
		return b * b * u / 2
	}
	h := math.Sin(b * u / 2)
	return 2 * h * h / u
}
