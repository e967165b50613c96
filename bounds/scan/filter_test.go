package scan

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/integrate/quad"
)

// windowRef returns W(σ) on [0, b] from its definition, written again here.
func windowRef(w Window, sigma, tau float64) float64 {
	switch w {
	case SheppLogan:
		x := sigma * tau / 2
		if x == 0 {
			return 1
		}
		return math.Sin(x) / x
	case Hann:
		return 0.5 * (1 + math.Cos(sigma*tau))
	}
	return 1
}

// TestKernelQuadrature checks the closed-form kernels against the defining
// integral h(s) = (1/π) ∫_0^b σ W(σ) cos(σs) dσ, b = π/τ, evaluated with
// gonum's Gauss–Legendre rule on 64 panels (reference library).
func TestKernelQuadrature(t *testing.T) {
	t.Parallel()
	const tau = 0.37
	b := math.Pi / tau
	for _, w := range []Window{RamLak, SheppLogan, Hann} {
		for _, s := range []float64{0, 1e-9, 1e-4, tau / 2, 0.1, tau, 1.3 * tau, 2 * tau, 7.25 * tau, 40 * tau} {
			var ref float64
			const panels = 64
			for i := range panels {
				lo, hi := b*float64(i)/panels, b*float64(i+1)/panels
				ref += quad.Fixed(func(sg float64) float64 {
					return sg * windowRef(w, sg, tau) * math.Cos(sg*s)
				}, lo, hi, 16, quad.Legendre{}, 0)
			}
			ref /= math.Pi
			got := w.kernel(s, tau)
			// Tolerance: relative to h(0) = O(b²/π), the scale of the kernel.
			if tol := 1e-11 * b * b; math.Abs(got-ref) > tol {
				t.Errorf("%v kernel(%g) = %.15g, want %.15g (quadrature)", w, s, got, ref)
			}
		}
	}
}

// TestKernelGridValues checks the classical sampled kernels. In ordinary
// frequency (Kak & Slaney 1988, eq. 3.61, from memory) the Ram-Lak kernel is
// 1/(4τ²) at 0, 0 at even n, −1/(n²π²τ²) at odd n; the Shepp-Logan kernel is
// −2/(π²τ²(4n²−1)) (Shepp & Logan 1974, from memory). Our angular
// convention multiplies both by 2π.
func TestKernelGridValues(t *testing.T) {
	t.Parallel()
	const tau = 0.8
	for n := range 12 {
		s := float64(n) * tau
		var rl float64
		switch {
		case n == 0:
			rl = 1 / (4 * tau * tau)
		case n%2 == 1:
			rl = -1 / (float64(n*n) * math.Pi * math.Pi * tau * tau)
		}
		sl := -2 / (math.Pi * math.Pi * tau * tau * float64(4*n*n-1))
		tests := []struct {
			w    Window
			want float64
		}{
			{RamLak, 2 * math.Pi * rl},
			{SheppLogan, 2 * math.Pi * sl},
		}
		for _, tt := range tests {
			if got := tt.w.kernel(s, tau); !scalar.EqualWithinAbsOrRel(got, tt.want, 1e-14, 1e-12) {
				t.Errorf("%v kernel(%d·τ) = %.16g, want %.16g", tt.w, n, got, tt.want)
			}
		}
	}
}
