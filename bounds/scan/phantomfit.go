package scan

import (
	"fmt"
	"math"
)

// PhantomLevel is the relative level ε at which FitPhantom's phantom has
// the radius and band limit of the plan it checks (Phantom.Extent).
const PhantomLevel = 1e-3

// demoRadius is the radius of the disc DemoPhantom is laid out in.
const demoRadius = 20

// maxReach keeps every blob of a fitted phantom inside 0.99ρ at level ε,
// so that rounding cannot push its extent past ρ.
const maxReach = 0.99

// FitPhantom returns an analytic phantom for a plan with object radius ρ
// and band limit Ω: Gaussian blobs whose essential radius at level ε is
// at most ρ and whose essential band limit at level ε is exactly Ω, both
// in the sense of Phantom.Extent. With
//
//	t = √(2 ln(1/ε)),   s = t/Ω      (Extent: a blob of width σ has band limit t/σ)
//
// it takes the layout of DemoPhantom (ρ_d = 20; a background blob at the
// centre and four small blobs near the rim, one of them elongated). It
// scales the background with the disc, and the widths of the small blobs
// so that the narrowest (σ_min,d = 0.5 in the demo) becomes s, which sets
// Ω; each small blob keeps its direction from the centre and the relative
// radius e_d/ρ_d its ε-contour reaches in the demo, e_d = |c_d| + t·max σ_d:
//
//	background:   σu = σv = min(σ_d/ρ_d, 0.99/t)·ρ
//	small blobs:  σu, σv = σ_d·s/σ_min,d,   |c| = min(e_d/ρ_d, 0.99)·ρ − t·max(σu, σv)
//
// At ρΩ equal to the demo's (ρ = 20, Ω = t/0.5) this is DemoPhantom
// itself; for larger ρΩ the small blobs get narrower and sit closer to the
// rim, where angular undersampling shows first. The amplitudes are the
// demo's.
//
// Limits. The phantom exists only when every centre radius above is ≥ 0
// and the background is not narrower than s; at ε = 10⁻³ that needs
// ρΩ ≥ 33.6 (the elongated blob, 2.4·t²/0.986), below which FitPhantom
// fails with bounds.ErrInvalid naming "scan.bandwidth". The phantom has
// five blobs, so the relative RMS error of a reconstruction weighs the
// background most; the small blobs are few pixels wide when ρΩ is large
// compared with the image size. ε must lie in [1e-15, 0.1].
func FitPhantom(radius, bandwidth, eps float64) (Phantom, error) {
	if err := positive("scan.radius", radius); err != nil {
		return Phantom{}, err
	}
	if err := positive("scan.bandwidth", bandwidth); err != nil {
		return Phantom{}, err
	}
	if !(eps >= 1e-15 && eps <= 0.1) {
		return Phantom{}, invalid("phantom.eps", "must lie in [1e-15, 0.1], got %g", eps)
	}
	if rw := radius * bandwidth; !(rw <= MaxSamples) {
		return Phantom{}, workLimit("scan.bandwidth", "ρΩ = %g exceeds %g", rw, float64(MaxSamples))
	}
	t := math.Sqrt(-2 * math.Log(eps))
	s := t / bandwidth
	demo := DemoPhantom()
	demoMin := math.Inf(1) // narrowest σ of the small blobs, 0.5
	for _, b := range demo.Blobs {
		if b.X != 0 || b.Y != 0 {
			demoMin = math.Min(demoMin, math.Min(b.SigmaU, b.SigmaV))
		}
	}
	out := Phantom{Blobs: make([]Blob, len(demo.Blobs))}
	need := 0.0 // the least ρΩ at which every blob fits
	for i, b := range demo.Blobs {
		wide, narrow := math.Max(b.SigmaU, b.SigmaV), math.Min(b.SigmaU, b.SigmaV)
		c := math.Hypot(b.X, b.Y)
		if c == 0 { // the background: max σ = frac·ρ
			frac := math.Min(wide/demoRadius, maxReach/t)
			k := frac * radius / wide
			b.SigmaU *= k
			b.SigmaV *= k
			// narrow·k ≥ s ⇔ ρΩ ≥ t·wide/(narrow·frac).
			need = math.Max(need, t*wide/(narrow*frac))
			out.Blobs[i] = b
			continue
		}
		reach := math.Min((c+t*wide)/demoRadius, maxReach)
		k := s / demoMin
		// |c'| = reach·ρ − t·wide·k ≥ 0 ⇔ ρΩ ≥ t²·wide/(demoMin·reach).
		need = math.Max(need, t*t*wide/(demoMin*reach))
		r := math.Max(0, reach*radius-t*wide*k) // > −rounding when ρΩ ≥ need
		out.Blobs[i] = Blob{
			X: b.X / c * r, Y: b.Y / c * r,
			SigmaU: b.SigmaU * k, SigmaV: b.SigmaV * k,
			Angle: b.Angle, Amplitude: b.Amplitude,
		}
	}
	if !(radius*bandwidth >= need) {
		return Phantom{}, invalid("scan.bandwidth", "the verification phantom needs ρΩ ≥ %.4g, got %.4g: below it no phantom of "+
			"this layout with band limit Ω fits in the disc of radius ρ at level ε = %g", need, radius*bandwidth, eps)
	}
	if err := out.Validate(); err != nil {
		return Phantom{}, fmt.Errorf("fitted phantom: %w", err)
	}
	return out, nil
}
