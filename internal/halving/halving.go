// Package halving is a baseline for the grid planner's benchmark, not a
// feature: it implements the habit many practitioners use to choose a grid
// for the trapezoidal rule or a sampled Fourier transform without an error
// bound — start from a coarse grid, halve the step and double the window
// until two successive answers agree to the tolerance (common practice, no
// source). It counts every integrand sample it spends on every trial grid
// and checks its final answer against the exact value, so that the
// benchmark can show how many samples the habit costs and how often it
// stops on an answer that is still wrong. It certifies nothing.
package halving

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/cmplx"
)

// Options describe the starting grid and the limits of the search.
type Options struct {
	// Step and Window are the first grid's step h₀ and the length L₀ of
	// the window it covers; both > 0.
	Step, Window float64
	// Center is the point the windows are centred on.
	Center float64
	// Xi is the angular frequency of the sampled transform; 0 is the
	// integral.
	Xi float64
	// MaxSamples caps the samples of one trial grid; 0 means 1<<26.
	MaxSamples int64
}

// Result is the outcome of one halving run.
type Result struct {
	// Value is the last sampled sum, the answer the habit returns.
	Value complex128
	// Step, Count and Window describe the last grid.
	Step   float64
	Count  int64
	Window float64
	// Trials is the number of grids evaluated; Samples the integrand
	// samples spent on all of them.
	Trials  int
	Samples int64
	// Converged is true when two successive answers agreed to the
	// tolerance; false when the sample cap stopped the search first.
	Converged bool
	// Exact is the exact value F(ξ) and Error = |Value - Exact|.
	Exact complex128
	Error float64
	// WithinTol reports Error ≤ tol: false means the habit stopped on an
	// answer outside the tolerance (or never stopped).
	WithinTol bool
}

// ErrInvalid marks bad options.
var ErrInvalid = errors.New("halving: invalid option")

// Run applies the halving habit to f for the tolerance tol, with the exact
// value exact for the final check. The grids are
//
//	x_k = Center + h·k,  |k| ≤ K,  K = ⌈L/(2h)⌉,
//
// with (h, L) = (h₀/2^i, L₀·2^i) for the i-th trial, and the answer of a
// trial is T = h Σ_k f(x_k) e^{-iξx_k}, summed in float64. The search
// stops when |T_i - T_{i-1}| ≤ tol.
func Run(ctx context.Context, f func(x float64) complex128, exact complex128, tol float64, opt Options) (Result, error) {
	if !(opt.Step > 0) || !(opt.Window > 0) || math.IsInf(opt.Step, 0) || math.IsInf(opt.Window, 0) {
		return Result{}, fmt.Errorf("%w: step and window must be finite and > 0", ErrInvalid)
	}
	if !(tol > 0) {
		return Result{}, fmt.Errorf("%w: tol must be > 0", ErrInvalid)
	}
	maxN := opt.MaxSamples
	if maxN <= 0 {
		maxN = 1 << 26
	}
	h, L := opt.Step, opt.Window
	var r Result
	r.Exact = exact
	var prev complex128
	for i := 0; ; i++ {
		if err := ctx.Err(); err != nil {
			return r, err
		}
		K := int64(math.Ceil(L / (2 * h)))
		n := 2*K + 1
		if n > maxN {
			break
		}
		var sum complex128
		for k := -K; k <= K; k++ {
			x := opt.Center + h*float64(k)
			v := f(x)
			if opt.Xi != 0 {
				v *= cmplx.Exp(complex(0, -opt.Xi*x))
			}
			sum += v
		}
		T := complex(h, 0) * sum
		r.Trials++
		r.Samples += n
		r.Value, r.Step, r.Count, r.Window = T, h, n, 2*float64(K)*h
		if i > 0 && cmplx.Abs(T-prev) <= tol {
			r.Converged = true
			break
		}
		prev = T
		h /= 2
		L *= 2
	}
	r.Error = cmplx.Abs(r.Value - exact)
	r.WithinTol = r.Converged && r.Error <= tol
	return r, nil
}
