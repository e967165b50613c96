package gridding

import (
	"context"
	"fmt"
	"math"

	"gonum.org/v1/gonum/dsp/fourier"
)

// Limits on executed transforms.
const (
	// MaxGrid is the largest oversampled grid a Transform allocates, in
	// points (per axis in 1-D, M² in 2-D): 2^24 complex values, 256 MiB.
	MaxGrid = 1 << 24
	// MaxPointCount is the largest number of non-uniform points per call.
	MaxPointCount = 1 << 26
)

// ctxEvery is the number of points between context checks.
const ctxEvery = 1 << 12

// Transform is the gridded non-uniform FFT in one dimension for one Setup
// (doc.go, "The gridded transform"). It holds the fitted kernel and the
// deapodization factors; it is immutable and safe for concurrent use.
type Transform struct {
	setup  Setup
	poly   *kernelPoly
	deapod []float64 // 1/φ̂(2πk/M) for k = -⌊N/2⌋, …, ⌈N/2⌉-1
}

// NewTransform prepares the transform of a setup. tol is the accuracy the
// caller aims at (relative to Σ|c_j|), used to choose the degree of the
// kernel's piecewise polynomials; 0 asks for full double precision.
// Errors wrap bounds.ErrInvalid or bounds.ErrWorkLimit (grids beyond
// MaxGrid), naming the field.
func NewTransform(s Setup, tol float64) (*Transform, error) {
	if err := s.Validate(); err != nil {
		return nil, err
	}
	if s.Grid > MaxGrid {
		return nil, workLimit("setup.grid", "at most %d grid points per axis, got %d", MaxGrid, s.Grid)
	}
	if !finite(tol) || tol < 0 || tol >= 1 {
		return nil, invalid("tolerance", "must be finite, ≥ 0 and < 1, got %g", tol)
	}
	k := s.Kernel
	n := s.Modes
	t := &Transform{setup: s, deapod: make([]float64, n)}
	for i := range t.deapod {
		kk := i - n/2
		v := k.transform(2 * math.Pi * float64(kk) / float64(s.Grid))
		if !(v > 0) || math.IsInf(v, 0) {
			return nil, invalid("setup.kernel", "%v: transform %g at mode %d cannot be divided by", k, v, kk)
		}
		t.deapod[i] = 1 / v
	}
	// The polynomial error δ (relative to max φ) reaches the output
	// amplified by about κ·W·max φ/φ̂(0) (RoundingEstimate); aim at 1% of
	// the tolerance.
	kappa := k.transform(0) / k.transform(s.thetaMax())
	spread := float64(k.Width) * k.value(0) / k.transform(0)
	t.poly = newKernelPoly(k, 0.01*tol/(kappa*spread))
	return t, nil
}

// Setup returns the configuration of the transform.
func (t *Transform) Setup() Setup { return t.setup }

// KernelFitError returns the largest error of the kernel's piecewise
// polynomials measured at setup, relative to the kernel's peak value, and
// their degree.
func (t *Transform) KernelFitError() (float64, int) { return t.poly.maxErr, t.poly.p }

// checkPoints checks the coordinates x (named name in errors) and that
// there are n values, named what, for them.
func checkPoints(x []float64, name string, n int, what string) error {
	if len(x) != n {
		return invalid(what, "need one value per point: %d points, %d values", len(x), n)
	}
	if len(x) > MaxPointCount {
		return workLimit(name, "at most %d points, got %d", MaxPointCount, len(x))
	}
	for i, v := range x {
		if !finite(v) || v < -math.Pi || v > math.Pi {
			return invalid(fmt.Sprintf("%s[%d]", name, i), "must be finite and in [-π, π], got %g", v)
		}
	}
	return nil
}

func checkValues(v []complex128, what string) error {
	for i, z := range v {
		if !finite(real(z)) || !finite(imag(z)) {
			return invalid(fmt.Sprintf("%s[%d]", what, i), "must be finite, got %v", z)
		}
	}
	return nil
}

// locate returns, for a point x in [-π, π], the grid index i0 in [0, M) of
// the first of the W grid points it touches and the offset t in [0, 1) of
// that grid point from the window's left edge: the grid points are
// m0 + j, j = 0..W-1, with m0 - u = -W/2 + t and u = xM/(2π).
func (t *Transform) locate(x float64) (int, float64) {
	m := t.setup.Grid
	w := t.setup.Kernel.Width
	u := x * (float64(m) / (2 * math.Pi))
	left := u - float64(w)/2
	m0 := math.Ceil(left)
	off := m0 - left
	if off >= 1 { // rounding: keep t in [0, 1)
		off = math.Nextafter(1, 0)
	}
	i0 := int(m0) % m
	if i0 < 0 {
		i0 += m
	}
	return i0, off
}

// Type1 computes f_k ≈ Σ_j c_j e^{-ikx_j} for the modes
// k = -⌊N/2⌋, …, ⌈N/2⌉-1 (f[0] is k = -⌊N/2⌋): spreading onto the grid,
// FFT, deapodization. The error of every output is at most
// Bound(t.Setup(), 1).Total·Σ|c_j| in exact arithmetic, plus rounding
// (RoundingEstimate). x_j must lie in [-π, π].
func (t *Transform) Type1(ctx context.Context, x []float64, c []complex128) ([]complex128, error) {
	if err := checkPoints(x, "x", len(c), "c"); err != nil {
		return nil, err
	}
	if err := checkValues(c, "c"); err != nil {
		return nil, err
	}
	m := t.setup.Grid
	w := t.setup.Kernel.Width
	grid := make([]complex128, m+w)
	vals := make([]float64, w)
	for j, xj := range x {
		if j%ctxEvery == 0 {
			if err := ctx.Err(); err != nil {
				return nil, fmt.Errorf("gridding: type 1 spreading: %w", err)
			}
		}
		i0, off := t.locate(xj)
		t.poly.eval(off, vals)
		cr, ci := real(c[j]), imag(c[j])
		g := grid[i0 : i0+w]
		for i, v := range vals {
			g[i] += complex(cr*v, ci*v)
		}
	}
	for i := 0; i < w; i++ {
		grid[i] += grid[m+i]
	}
	coef := fourier.NewCmplxFFT(m).Coefficients(nil, grid[:m])
	n := t.setup.Modes
	f := make([]complex128, n)
	for i := range f {
		k := i - n/2
		q := k % m
		if q < 0 {
			q += m
		}
		d := t.deapod[i]
		f[i] = complex(real(coef[q])*d, imag(coef[q])*d)
	}
	return f, nil
}

// Type2 computes c_j ≈ Σ_k f_k e^{ikx_j} over the modes
// k = -⌊N/2⌋, …, ⌈N/2⌉-1 (f[0] is k = -⌊N/2⌋): deapodization, inverse FFT,
// interpolation from the grid. The error of every output is at most
// Bound(t.Setup(), 1).Total·Σ|f_k| in exact arithmetic, plus rounding.
func (t *Transform) Type2(ctx context.Context, x []float64, f []complex128) ([]complex128, error) {
	n := t.setup.Modes
	if len(f) != n {
		return nil, invalid("f", "need %d mode values, got %d", n, len(f))
	}
	if err := checkPoints(x, "x", len(x), "x"); err != nil {
		return nil, err
	}
	if err := checkValues(f, "f"); err != nil {
		return nil, err
	}
	m := t.setup.Grid
	w := t.setup.Kernel.Width
	spec := make([]complex128, m)
	for i, v := range f {
		k := i - n/2
		q := k % m
		if q < 0 {
			q += m
		}
		d := t.deapod[i]
		spec[q] = complex(real(v)*d, imag(v)*d)
	}
	seq := fourier.NewCmplxFFT(m).Sequence(nil, spec)
	grid := make([]complex128, m+w)
	copy(grid, seq)
	copy(grid[m:], seq[:w])
	vals := make([]float64, w)
	out := make([]complex128, len(x))
	for j, xj := range x {
		if j%ctxEvery == 0 {
			if err := ctx.Err(); err != nil {
				return nil, fmt.Errorf("gridding: type 2 interpolation: %w", err)
			}
		}
		i0, off := t.locate(xj)
		t.poly.eval(off, vals)
		var re, im float64
		for i, g := range grid[i0 : i0+w] {
			re += real(g) * vals[i]
			im += imag(g) * vals[i]
		}
		out[j] = complex(re, im)
	}
	return out, nil
}
