package bounds

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// testGS is the classical Gram-Schmidt process in float64, written here
// for the test: b[j] are the basis vectors.
func testGS(b [][]float64) (mu [][]float64, B []float64) {
	n := len(b)
	star := make([][]float64, n)
	mu = make([][]float64, n)
	B = make([]float64, n)
	for i := 0; i < n; i++ {
		mu[i] = make([]float64, n)
		v := append([]float64(nil), b[i]...)
		for j := 0; j < i; j++ {
			d := 0.0
			for l := range v {
				d += b[i][l] * star[j][l]
			}
			mu[i][j] = d / B[j]
			for l := range v {
				v[l] -= mu[i][j] * star[j][l]
			}
		}
		star[i] = v
		for _, x := range v {
			B[i] += x * x
		}
	}
	return mu, B
}

func TestLLLReduction(t *testing.T) {
	// Bad generators of lattices with a known minimum λ₁ (Z^n: 1; BCC:
	// √3/2; FCC: 1/√2; D4: √2 — Conway & Sloane, Sphere Packings, Lattices
	// and Groups, 1988, Ch. 4, from memory). An LLL-reduced basis with
	// parameter δ satisfies
	//
	//	|b_1|² ≤ α^{n-1} λ₁²,  α = 1/(δ - 1/4)
	//
	// (Lenstra, Lenstra & Lovász 1982, Prop. 1.11, from memory, stated there
	// for δ = 3/4, α = 2).
	rng := rand.New(rand.NewPCG(3, 3))
	z2, _ := IntegerLattice(2)
	z4, _ := IntegerLattice(4)
	tests := []struct {
		lat  Lattice
		lam1 float64
	}{
		{z2, 1},
		{z4, 1},
		{BodyCentredCubic(), math.Sqrt(3) / 2},
		{FaceCentredCubic(), 1 / math.Sqrt2},
		{D4(), math.Sqrt2},
	}
	for _, tt := range tests {
		n := tt.lat.Dim()
		for trial := 0; trial < 5; trial++ {
			u := randomUnimodular(rng, n, int64(1)<<(30/n))
			w := mulExact(t, tt.lat.Generator(), u)
			lat, err := NewLattice(w)
			if err != nil {
				t.Logf("%v trial %d: %v (skipped)", tt.lat, trial, err)
				continue
			}
			basis, tr, reduced := lat.ReducedBasis()
			if !reduced {
				t.Errorf("%v trial %d: reduction check failed", tt.lat, trial)
			}
			// The transform is unimodular: |det| = 1 exactly.
			_, det, ok := ratFromInts(tr).inverse()
			if !ok || new(big.Rat).Abs(det).Cmp(big.NewRat(1, 1)) != 0 {
				t.Errorf("%v trial %d: det U = %v, want ±1", tt.lat, trial, det)
			}
			cols := columns(basis)
			mu, B := testGS(cols)
			for i := 0; i < n; i++ {
				for j := 0; j < i; j++ {
					if math.Abs(mu[i][j]) > 0.51 {
						t.Errorf("%v trial %d: |mu[%d][%d]| = %g, want ≤ 1/2", tt.lat, trial, i, j, mu[i][j])
					}
				}
				if i > 0 && B[i] < (LLLDelta-0.01-mu[i][i-1]*mu[i][i-1])*B[i-1] {
					t.Errorf("%v trial %d: Lovász condition fails at %d", tt.lat, trial, i)
				}
			}
			alpha := 1 / (LLLDelta - 0.25)
			b1 := math.Sqrt(B[0])
			if lim := math.Pow(alpha, float64(n-1)/2) * tt.lam1; b1 > lim*(1+1e-12) {
				t.Errorf("%v trial %d: |b1| = %g, want ≤ %g", tt.lat, trial, b1, lim)
			}
			t.Logf("%v trial %d: condition %.3g → |b1|/λ1 = %.4f", tt.lat, trial, lat.Condition(), b1/tt.lam1)
		}
	}
}
