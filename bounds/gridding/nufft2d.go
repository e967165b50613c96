package gridding

import (
	"context"
	"fmt"

	"gonum.org/v1/gonum/dsp/fourier"
)

// Type1In2D computes the two-dimensional type-1 sums
//
//	f_{k1,k2} ≈ Σ_j c_j e^{-i(k1·x_j + k2·y_j)}
//
// for the N×N modes of the setup (per axis as in Type1; f[i1·N + i2] holds
// k1 = i1 - ⌊N/2⌋, k2 = i2 - ⌊N/2⌋) with the tensor-product kernel
// φ(y_1)φ(y_2) on an M×M grid and a 2-D FFT by rows and columns. The error
// of every output is at most Bound(t.Setup(), 2).Total·Σ|c_j| in exact
// arithmetic (doc.go, step 6), plus rounding (RoundingEstimate(s, 2)).
// Errors wrap bounds.ErrInvalid, bounds.ErrWorkLimit (M² > MaxGrid) or the
// context's error.
func (t *Transform) Type1In2D(ctx context.Context, x, y []float64, c []complex128) ([]complex128, error) {
	if err := checkPoints(x, "x", len(c), "c"); err != nil {
		return nil, err
	}
	if len(y) != len(x) {
		return nil, invalid("y", "need one second coordinate per point: %d and %d", len(x), len(y))
	}
	if err := checkPoints(y, "y", len(y), "y"); err != nil {
		return nil, err
	}
	if err := checkValues(c, "c"); err != nil {
		return nil, err
	}
	m := t.setup.Grid
	if m > MaxGrid/m {
		return nil, workLimit("setup.grid", "a %d×%d grid exceeds %d points", m, m, MaxGrid)
	}
	w := t.setup.Kernel.Width
	// Padded grid of (M+W)² points, folded back after spreading.
	mp := m + w
	grid := make([]complex128, mp*mp)
	vx := make([]float64, w)
	vy := make([]float64, w)
	for j := range x {
		if j%ctxEvery == 0 {
			if err := ctx.Err(); err != nil {
				return nil, fmt.Errorf("gridding: 2-D type 1 spreading: %w", err)
			}
		}
		ix, ox := t.locate(x[j])
		iy, oy := t.locate(y[j])
		t.poly.eval(ox, vx)
		t.poly.eval(oy, vy)
		cr, ci := real(c[j]), imag(c[j])
		for a, va := range vx {
			row := grid[(ix+a)*mp+iy : (ix+a)*mp+iy+w]
			ar, ai := cr*va, ci*va
			for b, vb := range vy {
				row[b] += complex(ar*vb, ai*vb)
			}
		}
	}
	// Fold the padding: rows and columns m..m+w-1 belong to 0..w-1.
	g := make([]complex128, m*m)
	for i := 0; i < mp; i++ {
		for k := 0; k < mp; k++ {
			g[(i%m)*m+k%m] += grid[i*mp+k]
		}
	}
	fft := fourier.NewCmplxFFT(m)
	buf := make([]complex128, m)
	for i := 0; i < m; i++ {
		row := g[i*m : (i+1)*m]
		fft.Coefficients(row, row)
	}
	for k := 0; k < m; k++ {
		if err := ctx.Err(); err != nil {
			return nil, fmt.Errorf("gridding: 2-D type 1 FFT: %w", err)
		}
		for i := 0; i < m; i++ {
			buf[i] = g[i*m+k]
		}
		fft.Coefficients(buf, buf)
		for i := 0; i < m; i++ {
			g[i*m+k] = buf[i]
		}
	}
	n := t.setup.Modes
	f := make([]complex128, n*n)
	for i1 := 0; i1 < n; i1++ {
		q1 := (i1 - n/2) % m
		if q1 < 0 {
			q1 += m
		}
		for i2 := 0; i2 < n; i2++ {
			q2 := (i2 - n/2) % m
			if q2 < 0 {
				q2 += m
			}
			d := t.deapod[i1] * t.deapod[i2]
			v := g[q1*m+q2]
			f[i1*n+i2] = complex(real(v)*d, imag(v)*d)
		}
	}
	return f, nil
}
