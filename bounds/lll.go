package bounds

import (
	"math"
	"math/big"
)

// LLLDelta is the Lovász parameter δ of the basis reduction. With δ = 0.99
// the reduced basis is close to the best an LLL reduction gives; 3/4 is the
// value of the original paper.
const LLLDelta = 0.99

const (
	// lllMaxRounds bounds the floating-point reduction rounds, each started
	// afresh from the exact basis.
	lllMaxRounds = 40
	// lllMaxSwaps bounds the swaps of one round.
	lllMaxSwaps = 100000
	// lllIntLimit bounds the entries of the unimodular transform, so that
	// they stay exact in int64 and in float64.
	lllIntLimit = 1 << 52
)

// lllResult is the outcome of a basis reduction: the columns of B0·U are
// the reduced basis, and U is unimodular (integer, det ±1) by construction:
// it is a product of swaps and of elementary column operations
// b_k ← b_k - q·b_j with integer q.
type lllResult struct {
	u       [][]int64
	reduced bool // the exact final check passed
}

// lllReduce reduces the basis formed by the columns of the exact matrix b0
// with the algorithm of Lenstra, Lenstra & Lovász ("Factoring polynomials
// with rational coefficients", Math. Ann. 261, 1982, from memory): size
// reduction |μ_kj| ≤ 1/2 and the Lovász condition
//
//	|b_k*|² ≥ (δ - μ_{k,k-1}²)·|b_{k-1}*|²        (LLL 1982, (1.4)-(1.5))
//
// The reduction runs in float64 on the basis B0·U rounded from its exact
// value, in rounds: a round that changes nothing ends the loop, so the
// rounding errors of one round never accumulate into the next (the
// exact-recomputation strategy of Schnorr & Euchner, Math. Programming 66,
// 1994, from memory). A final check computes the Gram-Schmidt data of the
// result exactly, over the rationals, and accepts it when |μ| ≤ 0.51 and
// the Lovász condition holds with δ - 0.01.
//
// Nothing computed from a lattice depends on the quality of the
// reduction for its correctness, only for its speed: the transform is
// exactly unimodular whatever the rounding.
func lllReduce(b0 ratMat, delta float64) (lllResult, error) {
	n := len(b0)
	u := identityInts(n)
	for round := 0; round < lllMaxRounds; round++ {
		cols := columns(b0.mul(ratFromInts(u)).floats())
		t, changed, err := lllFloat(cols, delta)
		if err != nil {
			return lllResult{}, err
		}
		if !changed {
			break
		}
		u, err = mulInts(u, t)
		if err != nil {
			return lllResult{}, err
		}
	}
	return lllResult{u: u, reduced: lllCheck(b0.mul(ratFromInts(u)), delta)}, nil
}

// lllCheck verifies the reduction conditions exactly, with a small slack.
func lllCheck(b ratMat, delta float64) bool {
	mu, beta, ok := gramSchmidt(b.transpose().mul(b))
	if !ok {
		return false
	}
	half := big.NewRat(51, 100)
	for i := range mu {
		for j := 0; j < i; j++ {
			if new(big.Rat).Abs(mu[i][j]).Cmp(half) > 0 {
				return false
			}
		}
	}
	d := new(big.Rat).SetFloat64(delta - 0.01)
	for k := 1; k < len(beta); k++ {
		m2 := new(big.Rat).Mul(mu[k][k-1], mu[k][k-1])
		rhs := new(big.Rat).Sub(d, m2)
		rhs.Mul(rhs, beta[k-1])
		if beta[k].Cmp(rhs) < 0 {
			return false
		}
	}
	return true
}

// lllFloat runs the LLL algorithm in float64 on the basis vectors b[j]
// (modified in place) and returns the integer transform T with
// b_new = b_old·T, and whether T differs from the identity.
func lllFloat(b [][]float64, delta float64) (t [][]int64, changed bool, err error) {
	n := len(b)
	t = identityInts(n)
	if n < 2 {
		return t, false, nil
	}
	mu, B := floatGS(b)
	swaps := 0
	for k := 1; k < n; {
		for j := k - 1; j >= 0; j-- {
			if math.Abs(mu[k][j]) <= 0.5 {
				continue
			}
			q := math.Round(mu[k][j])
			if math.Abs(q) > lllIntLimit {
				return nil, false, invalidf("lattice.generator", "basis reduction overflows: the generator is too badly conditioned")
			}
			for i := range b[k] {
				b[k][i] -= q * b[j][i]
			}
			if err := subColumn(t, k, j, int64(q)); err != nil {
				return nil, false, err
			}
			mu[k][j] -= q
			for i := 0; i < j; i++ {
				mu[k][i] -= q * mu[j][i]
			}
			changed = true
		}
		if B[k] < (delta-mu[k][k-1]*mu[k][k-1])*B[k-1] {
			b[k], b[k-1] = b[k-1], b[k]
			for i := range t {
				t[i][k], t[i][k-1] = t[i][k-1], t[i][k]
			}
			changed = true
			swaps++
			if swaps > lllMaxSwaps {
				return t, changed, nil
			}
			mu, B = floatGS(b)
			k = max(k-1, 1)
		} else {
			k++
		}
	}
	return t, changed, nil
}

// floatGS computes the Gram-Schmidt coefficients and squared norms of the
// vectors b[0..n-1] in float64 (modified Gram-Schmidt).
func floatGS(b [][]float64) (mu [][]float64, B []float64) {
	n := len(b)
	mu = make([][]float64, n)
	B = make([]float64, n)
	star := make([][]float64, n)
	for i := 0; i < n; i++ {
		mu[i] = make([]float64, n)
		v := append([]float64(nil), b[i]...)
		for j := 0; j < i; j++ {
			if B[j] == 0 {
				continue
			}
			mu[i][j] = dot(b[i], star[j]) / B[j]
			for l := range v {
				v[l] -= mu[i][j] * star[j][l]
			}
		}
		star[i] = v
		B[i] = dot(v, v)
	}
	return mu, B
}

func dot(a, b []float64) float64 {
	s := 0.0
	for i := range a {
		s += a[i] * b[i]
	}
	return s
}

// columns returns the columns of a row-major matrix as vectors.
func columns(a [][]float64) [][]float64 {
	n := len(a)
	c := make([][]float64, n)
	for j := 0; j < n; j++ {
		c[j] = make([]float64, n)
		for i := 0; i < n; i++ {
			c[j][i] = a[i][j]
		}
	}
	return c
}

func identityInts(n int) [][]int64 {
	u := make([][]int64, n)
	for i := range u {
		u[i] = make([]int64, n)
		u[i][i] = 1
	}
	return u
}

// subColumn sets column k of t to column k minus q times column j,
// refusing entries beyond lllIntLimit.
func subColumn(t [][]int64, k, j int, q int64) error {
	for i := range t {
		v := float64(t[i][k]) - float64(q)*float64(t[i][j])
		if math.Abs(v) > lllIntLimit {
			return invalidf("lattice.generator", "basis reduction overflows: the generator is too badly conditioned")
		}
		t[i][k] -= q * t[i][j]
	}
	return nil
}

// mulInts returns a·b for integer matrices whose product stays within
// lllIntLimit.
func mulInts(a, b [][]int64) ([][]int64, error) {
	n := len(a)
	c := make([][]int64, n)
	for i := 0; i < n; i++ {
		c[i] = make([]int64, n)
		for j := 0; j < n; j++ {
			var f float64
			var s int64
			for k := 0; k < n; k++ {
				f += math.Abs(float64(a[i][k]) * float64(b[k][j]))
				s += a[i][k] * b[k][j]
			}
			if f > lllIntLimit {
				return nil, invalidf("lattice.generator", "basis reduction overflows: the generator is too badly conditioned")
			}
			c[i][j] = s
		}
	}
	return c, nil
}

// invertUnimodular returns the exact integer inverse of a unimodular u.
func invertUnimodular(u [][]int64) ([][]int64, bool) {
	inv, det, ok := ratFromInts(u).inverse()
	if !ok || det.Cmp(big.NewRat(1, 1)) != 0 && det.Cmp(big.NewRat(-1, 1)) != 0 {
		return nil, false
	}
	out := make([][]int64, len(u))
	for i := range inv {
		out[i] = make([]int64, len(u))
		for j := range inv[i] {
			if !inv[i][j].IsInt() || !inv[i][j].Num().IsInt64() {
				return nil, false
			}
			out[i][j] = inv[i][j].Num().Int64()
		}
	}
	return out, true
}
