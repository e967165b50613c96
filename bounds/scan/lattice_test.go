package scan

import (
	"math"
	"math/rand/v2"
	"testing"
)

// inBowtie reports whether (k, σ) lies in the interior of K(a, Ω), shrunk
// by a relative margin m so that boundary contact does not count.
func inBowtie(k, s, a, omega, m float64) bool {
	return math.Abs(s) < omega*(1-m) && math.Abs(k) < a*math.Abs(s)*(1-m)
}

// overlapBrute searches a fine grid of K for a point whose translate by
// −(k0, σ0) is also inside K: a direct geometric test, independent of the
// closed form in bowtieClear.
func overlapBrute(k0, s0, a, omega float64) bool {
	const n = 400
	const m = 1e-3
	for i := 0; i <= n; i++ {
		s := -omega + 2*omega*float64(i)/n
		for j := 0; j <= n; j++ {
			k := -a * math.Abs(s) * (1 - 2*float64(j)/n)
			if inBowtie(k, s, a, omega, m) && inBowtie(k-k0, s-s0, a, omega, m) {
				return true
			}
		}
	}
	return false
}

// TestBowtieClearBrute checks the disjointness criterion of the derivation
// (package doc, step 4) against a brute-force geometric search on seeded
// random translates; cases within 2% of the boundary of the criterion are
// skipped (the grid cannot decide them).
func TestBowtieClearBrute(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(1, 1))
	const a, omega = 1.3, 2.0
	checked := 0
	for range 300 {
		k0 := (rng.Float64()*2 - 1) * 3 * a * omega
		s0 := (rng.Float64()*2 - 1) * 2.5 * omega
		as := math.Abs(s0)
		lim := a * math.Max(as, 2*omega-as)
		if math.Abs(math.Abs(k0)-lim) < 0.02*lim || math.Abs(as-2*omega) < 0.02*omega {
			continue
		}
		checked++
		if got, want := bowtieClear(k0, s0, a, omega), !overlapBrute(k0, s0, a, omega); got != want {
			t.Errorf("bowtieClear(%g, %g) = %v, want %v (brute force)", k0, s0, got, want)
		}
	}
	if checked < 200 {
		t.Fatalf("only %d cases checked", checked)
	}
}

// TestDualLattice checks the dual of a lattice: every pair of generator
// vectors w_i, d_j has w_i·d_j = 2π δ_ij (definition of L*, math.md).
func TestDualLattice(t *testing.T) {
	t.Parallel()
	w := lattice2{{0.3, 0.1}, {0.05, 0.7}}
	d, ok := w.dual()
	if !ok {
		t.Fatal("dual of a regular lattice failed")
	}
	for i := range 2 {
		for j := range 2 {
			got := w[0][i]*d[0][j] + w[1][i]*d[1][j]
			want := 0.0
			if i == j {
				want = 2 * math.Pi
			}
			if math.Abs(got-want) > 1e-12 {
				t.Errorf("w_%d·d_%d = %g, want %g", i, j, got, want)
			}
		}
	}
}
