package gridding

import (
	"context"
	"fmt"
	"math"
)

// The non-uniform DFT by its definition, for verification. Each phase
// k·x_j is formed exactly as p + e (p = fl(k·x_j), e = k·x_j - p by a
// fused multiply-add), the sine and cosine are corrected to first order,
// cos(p + e) ≈ cos p - e·sin p with |e| ≤ 2⁻⁵³|k·x_j| (the neglected e²/2
// is below 10⁻²⁵ for |k·x_j| < 10⁶), and the terms are accumulated in
// double-double arithmetic (Knuth's two-sum; Higham 2002, §4.3, from
// memory). Each term is then within a few units of u = 2⁻⁵³ of c_j (the
// error of math.Sincos, of the first-order correction and of the complex
// product), and the sums add less than u·Σ|c_j|, so every output is
// within about 5u·Σ|c_j| of the exact sum; the tests check it against
// math/big.

// MaxDirectWork is the largest number of terms (points × modes) a direct
// sum accepts (about a minute of CPU time).
const MaxDirectWork = 1 << 30

// ddSum is a double-double accumulator.
type ddSum struct{ hi, lo float64 }

func (s *ddSum) add(v float64) {
	t := s.hi + v
	bp := t - s.hi
	err := (s.hi - (t - bp)) + (v - bp)
	s.hi = t
	s.lo += err
}

func (s *ddSum) value() float64 { return s.hi + s.lo }

// phase returns cos(k·x) and sin(k·x) for integer k with the exact product.
func phase(k, x float64) (c, s float64) {
	p := k * x
	e := math.FMA(k, x, -p)
	sp, cp := math.Sincos(p)
	return cp - e*sp, sp + e*cp
}

func checkDirect(n, points int) error {
	if n < 1 || n > MaxModes {
		return invalid("modes", "must be between 1 and 2^40, got %d", n)
	}
	if float64(n)*float64(points) > MaxDirectWork {
		return workLimit("modes", "direct sum of %d modes over %d points exceeds %d terms", n, points, int64(MaxDirectWork))
	}
	return nil
}

// Direct1 computes the type-1 sums f_k = Σ_j c_j e^{-ik·x_j} for the modes
// k = -⌊N/2⌋, …, ⌈N/2⌉-1 directly (N·len(x) terms). Errors wrap
// bounds.ErrInvalid or bounds.ErrWorkLimit, or the context's error.
func Direct1(ctx context.Context, n int, x []float64, c []complex128) ([]complex128, error) {
	if err := checkPoints(x, "x", len(c), "c"); err != nil {
		return nil, err
	}
	if err := checkValues(c, "c"); err != nil {
		return nil, err
	}
	if err := checkDirect(n, len(x)); err != nil {
		return nil, err
	}
	f := make([]complex128, n)
	for i := range f {
		if err := ctx.Err(); err != nil {
			return nil, fmt.Errorf("gridding: direct type 1: %w", err)
		}
		k := float64(i - n/2)
		var re, im ddSum
		for j, xj := range x {
			cs, sn := phase(k, xj)
			a, b := real(c[j]), imag(c[j])
			// (a + ib)(cos - i sin) = a cos + b sin + i(b cos - a sin)
			re.add(a * cs)
			re.add(b * sn)
			im.add(b * cs)
			im.add(-a * sn)
		}
		f[i] = complex(re.value(), im.value())
	}
	return f, nil
}

// Direct2 computes the type-2 sums c_j = Σ_k f_k e^{ik·x_j} over the modes
// k = -⌊N/2⌋, …, ⌈N/2⌉-1 (f[0] is k = -⌊N/2⌋) directly.
func Direct2(ctx context.Context, x []float64, f []complex128) ([]complex128, error) {
	n := len(f)
	if err := checkPoints(x, "x", len(x), "x"); err != nil {
		return nil, err
	}
	if err := checkValues(f, "f"); err != nil {
		return nil, err
	}
	if err := checkDirect(n, len(x)); err != nil {
		return nil, err
	}
	out := make([]complex128, len(x))
	for j, xj := range x {
		if j%64 == 0 {
			if err := ctx.Err(); err != nil {
				return nil, fmt.Errorf("gridding: direct type 2: %w", err)
			}
		}
		var re, im ddSum
		for i, v := range f {
			cs, sn := phase(float64(i-n/2), xj)
			a, b := real(v), imag(v)
			// (a + ib)(cos + i sin) = a cos - b sin + i(b cos + a sin)
			re.add(a * cs)
			re.add(-b * sn)
			im.add(b * cs)
			im.add(a * sn)
		}
		out[j] = complex(re.value(), im.value())
	}
	return out, nil
}
