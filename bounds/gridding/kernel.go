package gridding

import (
	"fmt"
	"math"
	"strconv"
)

// KernelType names the shape of a gridding kernel.
type KernelType int

const (
	// Gaussian is the truncated Gaussian φ(y) = exp(-β(2y/W)²), |y| < W/2.
	Gaussian KernelType = iota + 1
	// KaiserBessel is φ(y) = I0(β√(1-(2y/W)²)), |y| ≤ W/2.
	KaiserBessel
)

func (t KernelType) String() string {
	switch t {
	case Gaussian:
		return "gaussian"
	case KaiserBessel:
		return "kaiser-bessel"
	}
	return "KernelType(" + strconv.Itoa(int(t)) + ")"
}

func (t KernelType) valid() bool { return t == Gaussian || t == KaiserBessel }

// Limits on kernels.
const (
	// MinWidth and MaxWidth bound the kernel width W in grid cells.
	MinWidth = 2
	MaxWidth = 64
	// MaxBeta bounds the shape parameter; I0(700) and sinh(700) are still
	// finite in float64.
	MaxBeta = 700
	// minGaussianBeta keeps the truncation point W/2 beyond the Gaussian's
	// inflection point (W/2 ≥ s ⇔ β ≥ 1/2), which the truncation bound
	// needs (doc.go, step 4).
	minGaussianBeta = 0.5
)

// Kernel is a gridding kernel in units of the oversampled grid (spacing 1):
//
//	Gaussian       φ(y) = exp(-β(2y/W)²) = exp(-y²/(2s²)),  s = W/√(8β),  |y| < W/2
//	Kaiser-Bessel  φ(y) = I0(β√(1-(2y/W)²)),                               |y| ≤ W/2
//
// Each non-uniform point touches the W grid points m with m - u in
// [-W/2, W/2), u the point's position in grid units. For both kernels β
// says how far the kernel falls towards its edge: the Gaussian's edge
// value is e^{-β}, the Kaiser-Bessel's is 1/I0(β) of its peak.
type Kernel struct {
	Type  KernelType
	Width int     // W, grid cells per axis, MinWidth ≤ W ≤ MaxWidth
	Beta  float64 // β, the shape parameter
}

func (k Kernel) String() string {
	return fmt.Sprintf("%v(W=%d, beta=%.6g)", k.Type, k.Width, k.Beta)
}

// Validate checks the kernel; errors name the field ("kernel.width").
func (k Kernel) Validate() error {
	if !k.Type.valid() {
		return invalid("kernel.type", "unknown kernel type %d", int(k.Type))
	}
	if k.Width < MinWidth || k.Width > MaxWidth {
		return invalid("kernel.width", "must be between %d and %d grid cells, got %d", MinWidth, MaxWidth, k.Width)
	}
	lo := 0.0
	if k.Type == Gaussian {
		lo = minGaussianBeta
	}
	if !finite(k.Beta) || k.Beta < lo || k.Beta > MaxBeta {
		return invalid("kernel.beta", "must be between %g and %d for the %v kernel, got %g", lo, MaxBeta, k.Type, k.Beta)
	}
	return nil
}

// Sigma returns the Gaussian's standard deviation s = W/√(8β) in grid
// cells (0 for other kernels).
func (k Kernel) Sigma() float64 {
	if k.Type != Gaussian || k.Beta <= 0 {
		return 0
	}
	return float64(k.Width) / math.Sqrt(8*k.Beta)
}

// Tau returns the Gaussian's parameter τ in the form exp(-x²/(4τ)) of
// Greengard & Lee (SIAM Review 46, 2004; from memory), x in radians on
// [-π, π) sampled by a grid of size m: with x = y·2π/m,
//
//	τ = s²(2π/m)²/2.
//
// It is 0 for other kernels.
func (k Kernel) Tau(m int) float64 {
	s := k.Sigma()
	h := 2 * math.Pi / float64(m)
	return s * s * h * h / 2
}

// value returns φ(y) in float64 for |y| ≤ W/2 (the caller applies the
// window).
func (k Kernel) value(y float64) float64 {
	switch k.Type {
	case Gaussian:
		// The form the bound is computed for (bounds.GaussianFamily with
		// σ = Sigma()).
		r := y / k.Sigma()
		return math.Exp(-r * r / 2)
	default:
		a := math.Abs(2 * y / float64(k.Width))
		return besselI0(k.Beta * math.Sqrt(math.Max(0, (1-a)*(1+a))))
	}
}

// transform returns φ̂(θ) = ∫ φ(y) e^{-iθy} dy of the untruncated
// Gaussian or of the Kaiser-Bessel kernel, in float64:
//
//	Gaussian       φ̂(θ) = s√(2π)·exp(-s²θ²/2)                      (math.md, catalogue)
//	Kaiser-Bessel  φ̂(θ) = W·sinh(√(β²-u²))/√(β²-u²),  u = Wθ/2      (Jackson et al. 1991, from memory)
//
// (sin(√(u²-β²))/√(u²-β²) for u > β).
func (k Kernel) transform(theta float64) float64 {
	switch k.Type {
	case Gaussian:
		s := k.Sigma()
		return s * math.Sqrt(2*math.Pi) * math.Exp(-s*s*theta*theta/2)
	default:
		w := float64(k.Width)
		u := math.Abs(w * theta / 2)
		return w * sinhcSqrt((k.Beta-u)*(k.Beta+u))
	}
}

// besselI0 returns I0(x) = Σ_k (x²/4)^k/(k!)² (DLMF 10.25.2) in float64.
// All terms are positive, so the relative error is a few ulps times the
// number of terms (below 10⁻¹⁴ for x ≤ MaxBeta).
func besselI0(x float64) float64 {
	q := x * x / 4
	term, sum := 1.0, 1.0
	for k := 1; k < 2000; k++ {
		term *= q / float64(k*k)
		sum += term
		if term < 0x1p-60*sum && float64(k*k) > q {
			break
		}
	}
	return sum
}

// sinhcSqrt returns sinh(√z)/√z for z > 0, sin(√-z)/√-z for z < 0 and 1
// at 0, in float64, by the series Σ z^k/(2k+1)! near 0 (DLMF 4.33.1 and
// 4.19.1 with t² = ±z, from memory).
func sinhcSqrt(z float64) float64 {
	switch {
	case math.Abs(z) < 0.25:
		sum, term := 1.0, 1.0
		for k := 1; k < 12; k++ {
			term *= z / float64((2*k)*(2*k+1))
			sum += term
		}
		return sum
	case z > 0:
		r := math.Sqrt(z)
		return math.Sinh(r) / r
	default:
		r := math.Sqrt(-z)
		return math.Sin(r) / r
	}
}

// beattyBeta returns the Kaiser-Bessel shape of Beatty, Nishimura & Pauly
// (IEEE TMI 24(6), 2005, from memory) for oversampling σ and width W,
//
//	β = π√(W²/σ²·(σ - 1/2)² - 0.8),
//
// or πW(1 - 1/(2σ))/2 when the radicand is not positive.
func beattyBeta(sigma float64, w int) float64 {
	a := float64(w) / sigma * (sigma - 0.5)
	r := a*a - 0.8
	if r <= 0 {
		return math.Pi * a / 2
	}
	return math.Pi * math.Sqrt(r)
}

// greengardLeeBeta returns the Gaussian shape that corresponds to the
// choice τ = πM_sp/(M²R(R - 1/2)) of Greengard & Lee (2004, from memory)
// with M_sp = W/2 points on each side and R = σ: in grid units the kernel
// is exp(-y²·π(R - 1/2)/(M_sp·R)), so
//
//	β = π(W/2)(1 - 1/(2σ)).
func greengardLeeBeta(sigma float64, w int) float64 {
	return math.Pi * float64(w) / 2 * (1 - 1/(2*sigma))
}
