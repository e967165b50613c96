package bounds

import (
	"math"
	"math/big"
)

// Exact rational matrix arithmetic for lattices. A float64 is a rational
// number, so a generator matrix given in float64 defines its lattice, its
// dual, its covolume and the Gram matrices of its reduced bases exactly;
// the dimension is at most MaxDim = 8, so exact Gauss-Jordan elimination
// over big.Rat costs microseconds to a millisecond and is done once per
// lattice. Results enter the interval arithmetic through ratInterval, which
// rounds outward.

// ratMat is a dense square matrix of rationals, row major: a[i][j] is row
// i, column j.
type ratMat [][]*big.Rat

func newRatMat(n int) ratMat {
	a := make(ratMat, n)
	for i := range a {
		a[i] = make([]*big.Rat, n)
		for j := range a[i] {
			a[i][j] = new(big.Rat)
		}
	}
	return a
}

// ratFromFloats returns the exact rational matrix of w (entries finite).
func ratFromFloats(w [][]float64) ratMat {
	a := newRatMat(len(w))
	for i := range w {
		for j := range w[i] {
			a[i][j].SetFloat64(w[i][j])
		}
	}
	return a
}

// ratFromInts returns the rational matrix of an integer matrix.
func ratFromInts(u [][]int64) ratMat {
	a := newRatMat(len(u))
	for i := range u {
		for j := range u[i] {
			a[i][j].SetInt64(u[i][j])
		}
	}
	return a
}

func (a ratMat) mul(b ratMat) ratMat {
	n := len(a)
	c := newRatMat(n)
	t := new(big.Rat)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			for k := 0; k < n; k++ {
				if a[i][k].Sign() == 0 || b[k][j].Sign() == 0 {
					continue
				}
				c[i][j].Add(c[i][j], t.Mul(a[i][k], b[k][j]))
			}
		}
	}
	return c
}

func (a ratMat) transpose() ratMat {
	n := len(a)
	c := newRatMat(n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			c[i][j].Set(a[j][i])
		}
	}
	return c
}

// inverse returns a⁻¹ and det a by Gauss-Jordan elimination; ok is false
// when a is singular.
func (a ratMat) inverse() (inv ratMat, det *big.Rat, ok bool) {
	n := len(a)
	m := newRatMat(n)
	inv = newRatMat(n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			m[i][j].Set(a[i][j])
		}
		inv[i][i].SetInt64(1)
	}
	det = big.NewRat(1, 1)
	t := new(big.Rat)
	for col := 0; col < n; col++ {
		p := -1
		for r := col; r < n; r++ {
			if m[r][col].Sign() != 0 {
				p = r
				break
			}
		}
		if p < 0 {
			return nil, new(big.Rat), false
		}
		if p != col {
			m[p], m[col] = m[col], m[p]
			inv[p], inv[col] = inv[col], inv[p]
			det.Neg(det)
		}
		piv := new(big.Rat).Set(m[col][col])
		det.Mul(det, piv)
		pinv := new(big.Rat).Inv(piv)
		for j := 0; j < n; j++ {
			m[col][j].Mul(m[col][j], pinv)
			inv[col][j].Mul(inv[col][j], pinv)
		}
		for r := 0; r < n; r++ {
			if r == col || m[r][col].Sign() == 0 {
				continue
			}
			f := new(big.Rat).Set(m[r][col])
			for j := 0; j < n; j++ {
				m[r][j].Sub(m[r][j], t.Mul(f, m[col][j]))
				inv[r][j].Sub(inv[r][j], t.Mul(f, inv[col][j]))
			}
		}
	}
	return inv, det, true
}

// ratInterval encloses the rational r: the nearest float64, widened by one
// ulp on each side unless the conversion was exact. Values beyond the
// float64 range give an infinite endpoint.
func ratInterval(r *big.Rat) Interval {
	f, exact := r.Float64()
	if exact {
		return Point(f)
	}
	switch {
	case math.IsInf(f, 1):
		return Interval{math.MaxFloat64, f}
	case math.IsInf(f, -1):
		return Interval{f, -math.MaxFloat64}
	}
	return Interval{nextDown(f), nextUp(f)}
}

// intervals encloses every entry of a.
func (a ratMat) intervals() [][]Interval {
	out := make([][]Interval, len(a))
	for i := range a {
		out[i] = make([]Interval, len(a[i]))
		for j := range a[i] {
			out[i][j] = ratInterval(a[i][j])
		}
	}
	return out
}

// floats rounds every entry of a to the nearest float64.
func (a ratMat) floats() [][]float64 {
	out := make([][]float64, len(a))
	for i := range a {
		out[i] = make([]float64, len(a[i]))
		for j := range a[i] {
			out[i][j], _ = a[i][j].Float64()
		}
	}
	return out
}

// gramSchmidt returns the exact Gram-Schmidt data of the basis whose Gram
// matrix is g (g[i][j] = b_i·b_j): beta[i] = |b_i*|² and, for j < i,
// mu[i][j] = b_i·b_j*/|b_j*|², from the recurrences
//
//	mu_ij  = (g_ij - Σ_{k<j} mu_jk mu_ik beta_k) / beta_j
//	beta_i = g_ii - Σ_{k<i} mu_ik² beta_k
//
// (Cohen, A Course in Computational Algebraic Number Theory, 1993,
// Algorithm 2.6.3, from memory). ok is false if a beta vanishes.
func gramSchmidt(g ratMat) (mu ratMat, beta []*big.Rat, ok bool) {
	n := len(g)
	mu = newRatMat(n)
	beta = make([]*big.Rat, n)
	t := new(big.Rat)
	for i := 0; i < n; i++ {
		for j := 0; j < i; j++ {
			s := new(big.Rat).Set(g[i][j])
			for k := 0; k < j; k++ {
				t.Mul(mu[j][k], mu[i][k])
				s.Sub(s, t.Mul(t, beta[k]))
			}
			mu[i][j].Quo(s, beta[j])
		}
		b := new(big.Rat).Set(g[i][i])
		for k := 0; k < i; k++ {
			t.Mul(mu[i][k], mu[i][k])
			b.Sub(b, t.Mul(t, beta[k]))
		}
		if b.Sign() <= 0 {
			return nil, nil, false
		}
		beta[i] = b
	}
	return mu, beta, true
}
