package halving

import (
	"context"
	"errors"
	"math"
	"testing"
)

// TestRunGaussian follows the habit on ∫exp(-x²/2)dx = √(2π) (the Gaussian
// integral, DLMF 7.4.2, from memory): from h = 1 and a window of 4 the
// trial grids have 5, 17 and 65 samples (K = ⌈L/2h⌉ = 2, 8, 32), and the
// second and third answers agree to 1e-3, so 87 samples are spent and the
// answer is right to rounding.
func TestRunGaussian(t *testing.T) {
	f := func(x float64) complex128 { return complex(math.Exp(-x*x/2), 0) }
	exact := complex(math.Sqrt(2*math.Pi), 0)
	r, err := Run(context.Background(), f, exact, 1e-3, Options{Step: 1, Window: 4})
	if err != nil {
		t.Fatal(err)
	}
	if r.Samples != 87 || r.Trials != 3 || r.Count != 65 || !r.Converged || !r.WithinTol || r.Error > 1e-14 {
		t.Errorf("Run = %+v, want 87 samples over 3 trials, last 65, within tol", r)
	}
}

// TestRunStopsWrong shows the habit stopping on a wrong answer: a narrow
// bump exp(-(x-0.3)²/(2·0.01²)) lies between the samples of the first two
// grids (multiples of 1 and of 1/2), whose answers are both about 0 and so
// agree, far from the integral 0.01·√(2π).
func TestRunStopsWrong(t *testing.T) {
	const s = 0.01
	f := func(x float64) complex128 { u := (x - 0.3) / s; return complex(math.Exp(-u*u/2), 0) }
	exact := complex(s*math.Sqrt(2*math.Pi), 0)
	r, err := Run(context.Background(), f, exact, 1e-6, Options{Step: 1, Window: 4})
	if err != nil {
		t.Fatal(err)
	}
	if !r.Converged || r.WithinTol || r.Error < 0.02 {
		t.Errorf("Run = %+v, want a converged answer far outside the tolerance", r)
	}
}

func TestRunErrors(t *testing.T) {
	f := func(x float64) complex128 { return 0 }
	if _, err := Run(context.Background(), f, 0, 1e-3, Options{}); !errors.Is(err, ErrInvalid) {
		t.Errorf("zero step: %v", err)
	}
	if _, err := Run(context.Background(), f, 0, 0, Options{Step: 1, Window: 1}); !errors.Is(err, ErrInvalid) {
		t.Errorf("zero tol: %v", err)
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := Run(ctx, f, 0, 1e-3, Options{Step: 1, Window: 1}); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled: %v", err)
	}
}
