package gridding

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"foldbound/bounds"
	"foldbound/internal/bigref"
)

// The closed-form transforms used for deapodization against Gauss-Legendre
// quadrature of φ(y)cos(θy) (gonum integrate/quad; φ is even). The
// Kaiser-Bessel kernel I0(β√(1-t²)) = Σ (β²(1-t²)/4)^k/(k!)² is entire in
// t, so 200 nodes on [-W/2, W/2] are far more than enough; the Gaussian is
// integrated over ±14s, beyond which it is below 10⁻⁴² of its peak, with
// 3000 nodes for the oscillating factor.
func TestKernelTransformQuadrature(t *testing.T) {
	tests := []struct {
		k   Kernel
		tol float64 // relative to φ̂(0)
	}{
		{Kernel{KaiserBessel, 6, 13.9}, 1e-13},
		{Kernel{KaiserBessel, 12, 28.1}, 1e-13},
		{Kernel{KaiserBessel, 15, 35.2}, 1e-13},
		{Kernel{KaiserBessel, 4, 0.5}, 1e-13},
		{Kernel{Gaussian, 14, 16}, 1e-13},
		{Kernel{Gaussian, 28, 32.7}, 1e-13},
		{Kernel{Gaussian, 8, 0.5}, 1e-13},
	}
	for _, tt := range tests {
		k := tt.k
		half, nodes := float64(k.Width)/2, 200
		if k.Type == Gaussian {
			half, nodes = 14*k.Sigma(), 3000
		}
		for _, theta := range []float64{0, 0.3, 1.1, math.Pi / 2, 2.5, 2*math.Pi - 1.2, 9.7} {
			want := quad.Fixed(func(y float64) float64 {
				if k.Type == Gaussian {
					return math.Exp(-y*y/(2*k.Sigma()*k.Sigma())) * math.Cos(theta*y)
				}
				return k.value(y) * math.Cos(theta*y)
			}, -half, half, nodes, quad.Legendre{}, 0)
			got := k.transform(theta)
			if d := math.Abs(got - want); d > tt.tol*k.transform(0) {
				t.Errorf("%v: φ̂(%g) = %.17g, want %.17g (quadrature)", k, theta, got, want)
			}
		}
	}
}

// besselI0 against the power series in math/big (DLMF 10.25.2).
func TestBesselI0(t *testing.T) {
	for _, x := range []float64{0, 1e-3, 0.5, 1, 3.7, 10, 25.3, 60, 120, 350, 700} {
		want := bigref.BesselI0(bigref.New(x))
		got := besselI0(x)
		if e := bigref.RelErr(bigref.New(got), want); e > 1e-14 {
			t.Errorf("I0(%g) = %.17g, want %.17g (rel. error %.2g)", x, got, bigref.Float64(want), e)
		}
	}
}

// The published shape formulas, evaluated by hand:
// Beatty et al. 2005 (from memory), σ = 2, W = 6: π√(36·(1.5/2)² - 0.8) =
// π√19.45 = 13.8551; σ = 1.25, W = 8: π√(64·0.36 - 0.8) = π√22.24 =
// 14.81553. Greengard & Lee 2004 (from memory) with M_sp = W/2, R = σ:
// β = π(W/2)(1 - 1/(2σ)); W = 24, σ = 2: 9π = 28.2743.
func TestPublishedShapes(t *testing.T) {
	tests := []struct {
		name string
		got  float64
		want float64
	}{
		{"beatty(2, 6)", beattyBeta(2, 6), 13.855100346},
		{"beatty(1.25, 8)", beattyBeta(1.25, 8), 14.815532453},
		{"greengard-lee(2, 24)", greengardLeeBeta(2, 24), 9 * math.Pi},
	}
	for _, tt := range tests {
		if math.Abs(tt.got-tt.want) > 1e-8 {
			t.Errorf("%s = %.10g, want %.10g", tt.name, tt.got, tt.want)
		}
	}
	// Greengard & Lee's τ = πM_sp/(M²R(R - 1/2)), with M = N modes and a grid
	// of R·M points, equals Kernel.Tau for β from greengardLeeBeta.
	const n, r, msp = 128, 2.0, 12
	k := Kernel{Gaussian, 2 * msp, greengardLeeBeta(r, 2*msp)}
	want := math.Pi * msp / (n * n * r * (r - 0.5))
	if got := k.Tau(int(r * n)); math.Abs(got-want) > 1e-15*want {
		t.Errorf("τ = %.17g, want %.17g", got, want)
	}
}

func TestKernelValidate(t *testing.T) {
	nan := math.NaN()
	tests := []struct {
		k     Kernel
		param string
	}{
		{Kernel{0, 6, 13}, "kernel.type"},
		{Kernel{KaiserBessel, 1, 13}, "kernel.width"},
		{Kernel{KaiserBessel, MaxWidth + 1, 13}, "kernel.width"},
		{Kernel{KaiserBessel, 6, nan}, "kernel.beta"},
		{Kernel{KaiserBessel, 6, -1}, "kernel.beta"},
		{Kernel{KaiserBessel, 6, 701}, "kernel.beta"},
		{Kernel{Gaussian, 6, 0.4}, "kernel.beta"},
		{Kernel{Gaussian, 6, math.Inf(1)}, "kernel.beta"},
	}
	for _, tt := range tests {
		err := tt.k.Validate()
		var pe *bounds.ParamError
		if !errors.As(err, &pe) || !errors.Is(err, bounds.ErrInvalid) || pe.Param != tt.param {
			t.Errorf("%v: error = %v, want ErrInvalid naming %q", tt.k, err, tt.param)
		}
	}
	for _, k := range []Kernel{{KaiserBessel, 2, 0}, {KaiserBessel, 64, 700}, {Gaussian, 2, 0.5}} {
		if err := k.Validate(); err != nil {
			t.Errorf("%v: %v", k, err)
		}
	}
}

// The piecewise polynomials reproduce the kernel: against I0 and exp in
// math/big at points across every piece, the error relative to the peak
// stays below the measured fit error plus 1e-14.
func TestKernelPolyAgainstBig(t *testing.T) {
	for _, k := range []Kernel{{KaiserBessel, 5, 11.3}, {KaiserBessel, 15, 35.2}, {Gaussian, 14, 16}, {Gaussian, 28, 32.7}} {
		kp := newKernelPoly(k, 0)
		out := make([]float64, k.Width)
		w := float64(k.Width)
		peak := bigKernel(k, 0)
		for i := 0; i < 17; i++ {
			tt := float64(i) / 17
			kp.eval(tt, out)
			for j, v := range out {
				y := -w/2 + float64(j) + tt
				want := bigKernel(k, y)
				if e := math.Abs(v-want) / peak; e > kp.maxErr+1e-14 {
					t.Errorf("%v: φ(%g) = %.17g, want %.17g (error %.2g of the peak, fit error %.2g)", k, y, v, want, e, kp.maxErr)
				}
			}
		}
	}
}

// bigKernel evaluates the kernel in math/big and rounds to float64.
func bigKernel(k Kernel, y float64) float64 {
	t := bigref.Quo(bigref.Mul(bigref.Int(2), bigref.New(y)), bigref.Int(int64(k.Width)))
	t2 := bigref.Mul(t, t)
	if k.Type == Gaussian {
		return bigref.Float64(bigref.Exp(bigref.Neg(bigref.Mul(bigref.New(k.Beta), t2))))
	}
	s := bigref.Sub(bigref.Int(1), t2)
	if s.Sign() < 0 {
		return 0
	}
	return bigref.Float64(bigref.BesselI0(bigref.Mul(bigref.New(k.Beta), bigref.Sqrt(s))))
}
