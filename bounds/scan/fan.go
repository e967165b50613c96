package scan

import (
	"context"
	"math"
)

// FanScan is a full-circle (360°) fan-beam sampling with an equiangular
// detector: Sources positions a_j = R·(cos β_j, sin β_j), β_j = 2πj/p, and
// Detectors rays per source at angles α_l = (l − (N−1)/2)·Angle from the
// central ray (the ray through the rotation axis), counted anticlockwise.
// The ray (β, α) is the line with parallel coordinates
//
//	φ = β + α − π/2,   s = R sin α
//
// (the source a satisfies a·θ = R cos(β − φ) = R sin α, and the ray
// direction, the central direction −a/R turned by α, is normal to θ).
type FanScan struct {
	Sources      int     // p ≥ 1
	Detectors    int     // N ≥ 2
	Angle        float64 // Δα > 0, radians
	SourceRadius float64 // R > 0
}

// Validate checks the scan; errors name "fan.sources" etc. The fan must
// open less than 180°: (N−1)·Δα < π.
func (g FanScan) Validate() error {
	if g.Sources < 1 || g.Sources > MaxViews {
		return countErr("fan.sources", g.Sources, 1, MaxViews)
	}
	if g.Detectors < 2 || g.Detectors > MaxDetectors {
		return countErr("fan.detectors", g.Detectors, 2, MaxDetectors)
	}
	if err := positive("fan.angle", g.Angle); err != nil {
		return err
	}
	if !(float64(g.Detectors-1)*g.Angle < math.Pi) {
		return invalid("fan.angle", "fan of %d rays at %g rad opens %g rad, must be < π", g.Detectors, g.Angle, float64(g.Detectors-1)*g.Angle)
	}
	if err := positive("fan.source_radius", g.SourceRadius); err != nil {
		return err
	}
	if g.Sources*g.Detectors > maxRays {
		return workLimit("fan", "%d sources × %d detectors exceeds %d rays", g.Sources, g.Detectors, maxRays)
	}
	return nil
}

// FanSinogram returns the exact fan-beam samples of the phantom, using the
// parallel coordinates of each ray and the closed-form Radon transform.
func (p Phantom) FanSinogram(g FanScan) (Sinogram, error) {
	return p.fanSinogram(context.Background(), g)
}

// fanSinogram is FanSinogram checking ctx once per source position.
func (p Phantom) fanSinogram(ctx context.Context, g FanScan) (Sinogram, error) {
	if err := p.Validate(); err != nil {
		return Sinogram{}, err
	}
	if err := g.Validate(); err != nil {
		return Sinogram{}, err
	}
	sino := Sinogram{Views: g.Sources, Detectors: g.Detectors, Data: make([]float64, g.Sources*g.Detectors)}
	a0 := -0.5 * float64(g.Detectors-1) * g.Angle
	for j := range g.Sources {
		if err := ctx.Err(); err != nil {
			return Sinogram{}, err
		}
		beta := 2 * math.Pi * float64(j) / float64(g.Sources)
		row := sino.Data[j*g.Detectors : (j+1)*g.Detectors]
		for l := range row {
			alpha := a0 + float64(l)*g.Angle
			row[l] = p.Projection(beta+alpha-math.Pi/2, g.SourceRadius*math.Sin(alpha))
		}
	}
	return sino, nil
}

// ReconstructFan inverts full-circle equiangular fan-beam data by
// filtered backprojection. Over the full circle every line is measured
// twice, so f = (1/4π) ∫_0^{2π} (g(φ,·) * h)(x·θ) dφ; the change of
// variables (φ, s) → (β, α) has Jacobian R cos α, and for the point x seen
// from source a at angle α' and distance L = |x − a|, x·θ − s = L sin(α'−α).
// With the homogeneity h(Lu) = h(u)/L² of the ideal ramp this gives
//
//	f(x) = (1/4π) ∫_0^{2π} L⁻² ∫ g(β,α) R cos α · k(α' − α) dα dβ,
//	k(γ) = (γ/sin γ)² h(γ)
//
// (the equiangular fan-beam formula; Kak & Slaney, Principles of
// Computerized Tomographic Imaging, IEEE Press 1988, §3.4.2, from memory).
// h is Window.kernel with τ = Δα; the inner integral is the trapezoidal
// sum, evaluated on a grid of spacing Δα/M and interpolated linearly in α'.
// It checks ctx once per source position.
func ReconstructFan(ctx context.Context, g FanScan, sino Sinogram, opt Options) (Image, error) {
	if err := g.Validate(); err != nil {
		return Image{}, err
	}
	m, err := opt.validate()
	if err != nil {
		return Image{}, err
	}
	if err := checkSinogram(sino, g.Sources, g.Detectors); err != nil {
		return Image{}, err
	}
	if m*(g.Detectors-1) > maxFineLen {
		return Image{}, workLimit("fbp.oversample", "oversampled projection of %d values exceeds %d", m*(g.Detectors-1), maxFineLen)
	}
	n := opt.Size
	if float64(n)*float64(n)*float64(g.Sources) > maxBackproj {
		return Image{}, workLimit("fbp.size", "%d² pixels × %d sources exceeds %g", n, g.Sources, maxBackproj)
	}
	if r := math.Sqrt2 * opt.Width / 2; !(r < g.SourceRadius) {
		return Image{}, invalid("fbp.width", "image corners at radius %g reach the source circle R = %g", r, g.SourceRadius)
	}
	da := g.Angle
	kernel := func(gamma float64) float64 {
		w := 1.0
		if gamma != 0 {
			w = gamma / math.Sin(gamma)
		}
		return w * w * opt.Window.kernel(gamma, da)
	}
	conv := newConvolver(g.Detectors, m, da, kernel)
	a0 := -0.5 * float64(g.Detectors-1) * da
	weight := make([]float64, g.Detectors)
	for l := range weight {
		weight[l] = g.SourceRadius * math.Cos(a0+float64(l)*da)
	}
	row := make([]float64, g.Detectors)
	q := make([]float64, conv.out)
	im := Image{Size: n, Width: opt.Width, Pix: make([]float64, n*n)}
	inv := float64(m) / da
	last := float64(len(q) - 1)
	for j := range g.Sources {
		if err := ctx.Err(); err != nil {
			return Image{}, err
		}
		for l, v := range sino.Data[j*g.Detectors : (j+1)*g.Detectors] {
			row[l] = v * weight[l]
		}
		conv.apply(q, row)
		sb, cb := math.Sincos(2 * math.Pi * float64(j) / float64(g.Sources))
		ax, ay := g.SourceRadius*cb, g.SourceRadius*sb
		for iy := range n {
			vy := im.Centre(iy) - ay
			out := im.Pix[iy*n : (iy+1)*n]
			for ix := range out {
				vx := im.Centre(ix) - ax
				// Central direction (−cos β, −sin β); α' from it to x − a.
				alpha := math.Atan2(-cb*vy+sb*vx, -cb*vx-sb*vy)
				u := (alpha - a0) * inv
				if u >= 0 && u < last {
					k := int(u)
					f := u - float64(k)
					out[ix] += (q[k] + f*(q[k+1]-q[k])) / (vx*vx + vy*vy)
				}
			}
		}
	}
	scale := 1 / (2 * float64(g.Sources)) // Δβ/(4π) with Δβ = 2π/p
	for i := range im.Pix {
		im.Pix[i] *= scale
	}
	return im, nil
}
