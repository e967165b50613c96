package bounds

import (
	"errors"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// testLattice is a lattice with a basis known to the test: good generates
// the same lattice as lat's generator (equal, or related by a unimodular
// integer matrix), and is well conditioned, so that the test can enumerate
// lattice points on its own.
type testLattice struct {
	name string
	lat  Lattice
	good [][]float64
}

func namedTestLattices() []testLattice {
	out := []testLattice{}
	for _, l := range []Lattice{Hexagonal(), BodyCentredCubic(), FaceCentredCubic(), D4()} {
		out = append(out, testLattice{l.Name(), l, l.Generator()})
	}
	return out
}

// randomDyadic returns an n×n matrix with entries k/1024, |k| ≤ 2048,
// plus 2 on the diagonal: exactly representable and well conditioned.
func randomDyadic(rng *rand.Rand, n int) [][]float64 {
	g := make([][]float64, n)
	for i := range g {
		g[i] = make([]float64, n)
		for j := range g[i] {
			g[i][j] = float64(rng.IntN(4097)-2048) / 1024
		}
		g[i][i] += 2
	}
	return g
}

// randomUnimodular returns a product of elementary integer column
// operations col_j += q·col_i (det 1), applied until the entries reach
// about maxEntry.
func randomUnimodular(rng *rand.Rand, n int, maxEntry int64) [][]int64 {
	u := identityInts(n)
	for step := 0; step < 400; step++ {
		i, j := rng.IntN(n), rng.IntN(n)
		if i == j {
			continue
		}
		q := int64(rng.IntN(7) - 3)
		big := false
		for r := 0; r < n; r++ {
			if v := u[r][j] + q*u[r][i]; v > maxEntry || v < -maxEntry {
				big = true
			}
		}
		if big {
			continue
		}
		for r := 0; r < n; r++ {
			u[r][j] += q * u[r][i]
		}
	}
	return u
}

// mulExact returns g·u, checking that every product and sum is exact in
// float64 (g dyadic with small numerators, u of moderate size).
func mulExact(t testing.TB, g [][]float64, u [][]int64) [][]float64 {
	n := len(g)
	w := make([][]float64, n)
	for i := range w {
		w[i] = make([]float64, n)
		for j := range w[i] {
			s := new(big.Rat)
			for k := 0; k < n; k++ {
				p := new(big.Rat).SetFloat64(g[i][k])
				s.Add(s, p.Mul(p, new(big.Rat).SetInt64(u[k][j])))
			}
			f, exact := s.Float64()
			if !exact {
				t.Fatalf("test generator entry (%d,%d) not exact in float64", i, j)
			}
			w[i][j] = f
		}
	}
	return w
}

// randomTestLattices returns seeded random lattices: well conditioned
// (the dyadic basis itself) and badly conditioned (the same lattice with
// a generator multiplied by a unimodular matrix with large entries).
func randomTestLattices(t testing.TB) []testLattice {
	rng := rand.New(rand.NewPCG(1, 1))
	var out []testLattice
	for _, n := range []int{2, 3, 4} {
		g := randomDyadic(rng, n)
		l, err := NewLattice(g)
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, testLattice{"random-well-" + itoa(n), l, g})
		// Badly conditioned: retry until the condition number lies in
		// [1e6, 1e11], inside the accepted range but far from 1.
		for try := 0; ; try++ {
			g2 := randomDyadic(rng, n)
			u := randomUnimodular(rng, n, int64(1)<<(32/n))
			w := mulExact(t, g2, u)
			l2, err := NewLattice(w)
			if err != nil || l2.Condition() < 1e6 || l2.Condition() > 1e11 {
				if try > 1000 {
					t.Fatalf("no badly conditioned generator found (n=%d): %v", n, err)
				}
				continue
			}
			out = append(out, testLattice{"random-bad-" + itoa(n), l2, g2})
			break
		}
	}
	return out
}

func itoa(n int) string { return string(rune('0' + n)) }

// invFloat inverts a small well-conditioned matrix in float64
// (Gauss-Jordan with partial pivoting), for the test's own enumeration.
func invFloat(a [][]float64) [][]float64 {
	n := len(a)
	m := make([][]float64, n)
	inv := make([][]float64, n)
	for i := range a {
		m[i] = append([]float64(nil), a[i]...)
		inv[i] = make([]float64, n)
		inv[i][i] = 1
	}
	for c := 0; c < n; c++ {
		p := c
		for r := c + 1; r < n; r++ {
			if math.Abs(m[r][c]) > math.Abs(m[p][c]) {
				p = r
			}
		}
		m[p], m[c] = m[c], m[p]
		inv[p], inv[c] = inv[c], inv[p]
		d := m[c][c]
		for j := 0; j < n; j++ {
			m[c][j] /= d
			inv[c][j] /= d
		}
		for r := 0; r < n; r++ {
			if r != c {
				f := m[r][c]
				for j := 0; j < n; j++ {
					m[r][j] -= f * m[c][j]
					inv[r][j] -= f * inv[c][j]
				}
			}
		}
	}
	return inv
}

// forEachPoint calls fn(k, x) for every lattice point x = G·k + off with
// |x - center| ≤ rho, and possibly a few beyond (the caller filters).
// The box |k_i - κ_i| ≤ rho·‖row i of G⁻¹‖ + 2, κ = G⁻¹(center - off),
// holds every such k: |k - κ|_i = |(G⁻¹(x - center))_i| ≤ ‖row_i‖·|x - center|;
// the +2 absorbs the rounding of the float64 inverse.
func forEachPoint(g [][]float64, off, center []float64, rho float64, fn func(k []int64, x []float64)) {
	n := len(g)
	gi := invFloat(g)
	lo := make([]int64, n)
	hi := make([]int64, n)
	for i := 0; i < n; i++ {
		rn, kap := 0.0, 0.0
		for j := 0; j < n; j++ {
			rn += gi[i][j] * gi[i][j]
			kap += gi[i][j] * (center[j] - off[j])
		}
		r := rho*math.Sqrt(rn) + 2
		lo[i] = int64(math.Floor(kap - r))
		hi[i] = int64(math.Ceil(kap + r))
	}
	k := append([]int64(nil), lo...)
	x := make([]float64, n)
	for {
		for i := 0; i < n; i++ {
			s := off[i]
			for j := 0; j < n; j++ {
				s += g[i][j] * float64(k[j])
			}
			x[i] = s
		}
		d := 0.0
		for i := range x {
			d += (x[i] - center[i]) * (x[i] - center[i])
		}
		if d <= rho*rho*(1+1e-12) {
			fn(k, x)
		}
		i := 0
		for ; i < n; i++ {
			if k[i] < hi[i] {
				k[i]++
				break
			}
			k[i] = lo[i]
		}
		if i == n {
			return
		}
	}
}

func TestNamedLatticeCovolumes(t *testing.T) {
	// Covolumes of the named generators: |det W| (hexagonal: the float64
	// √3/2; BCC 1/2, FCC 1/4 with cube side 1; D4 index 2 in Z⁴ — Conway
	// & Sloane, Sphere Packings, Lattices and Groups, 1988, Ch. 4, from
	// memory).
	z3, _ := IntegerLattice(3)
	tests := []struct {
		lat  Lattice
		want float64
	}{
		{Hexagonal(), math.Sqrt(3) / 2},
		{BodyCentredCubic(), 0.5},
		{FaceCentredCubic(), 0.25},
		{D4(), 2},
		{z3, 1},
	}
	for _, tt := range tests {
		if c := tt.lat.Covolume(); !c.Contains(tt.want) || c.Width() > 1e-15 {
			t.Errorf("%v: Covolume = %v, want %v", tt.lat, c, tt.want)
		}
	}
}

func TestDualGenerator(t *testing.T) {
	// Definition of the dual lattice (math.md): W^T·(2πW^{-T}) = 2π·I.
	for _, tl := range append(namedTestLattices(), randomTestLattices(t)...) {
		w := tl.lat.Generator()
		d := tl.lat.DualGenerator()
		n := len(w)
		for i := 0; i < n; i++ {
			for j := 0; j < n; j++ {
				var s Interval
				for k := 0; k < n; k++ {
					s = s.Add(d[k][j].Scale(w[k][i]))
				}
				want := 0.0
				if i == j {
					want = 2 * math.Pi
				}
				if !s.Contains(want) && math.Abs(s.Mid()-want) > 1e-15 {
					t.Errorf("%s: (W^T D)[%d][%d] = %v, want %v", tl.name, i, j, s, want)
				}
				if s.Width() > 1e-12*(1+tl.lat.Condition()) {
					t.Errorf("%s: (W^T D)[%d][%d] = %v is too wide", tl.name, i, j, s)
				}
			}
		}
	}
	// The dual of BCC (cube side 1) is 2π·{k ∈ Z³ : k₁+k₂+k₃ even}, the
	// face-centred cubic lattice (Kittel, Introduction to Solid State
	// Physics, Ch. 2, from memory): integer columns of even sum, |det| = 2.
	d := BodyCentredCubic().DualGenerator()
	for j := 0; j < 3; j++ {
		sum := 0.0
		for i := 0; i < 3; i++ {
			v := d[i][j].Mid() / (2 * math.Pi)
			if math.Abs(v-math.Round(v)) > 1e-12 {
				t.Fatalf("BCC dual column %d entry %d = %g·2π, want an integer", j, i, v)
			}
			sum += math.Round(v)
		}
		if math.Mod(sum, 2) != 0 {
			t.Errorf("BCC dual column %d has odd sum %g", j, sum)
		}
	}
}

func TestLatticeInvalid(t *testing.T) {
	nine := make([][]float64, 9)
	for i := range nine {
		nine[i] = make([]float64, 9)
		nine[i][i] = 1
	}
	tests := []struct {
		name  string
		gen   [][]float64
		param string
	}{
		{"nan", [][]float64{{1, 0}, {math.NaN(), 1}}, "lattice.generator[1][0]"},
		{"inf", [][]float64{{1, math.Inf(1)}, {0, 1}}, "lattice.generator[0][1]"},
		{"singular", [][]float64{{1, 2}, {2, 4}}, "lattice.generator"},
		{"zero", [][]float64{{0, 0}, {0, 0}}, "lattice.generator"},
		{"dimension 0", nil, "lattice.generator"},
		{"dimension 9", nine, "lattice.generator"},
		{"ragged", [][]float64{{1, 0}, {1}}, "lattice.generator[1]"},
		{"huge condition", [][]float64{{1, 1}, {1, 1 + 0x1p-45}}, "lattice.generator"},
		{"underflow", [][]float64{{1e-200, 0}, {0, 1e-200}}, "lattice.generator"},
		{"overflow", [][]float64{{1e200, 0}, {0, 1e200}}, "lattice.generator"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := NewLattice(tt.gen)
			checkParamErr(t, err, ErrInvalid, tt.param)
		})
	}
	_, err := IntegerLattice(0)
	checkParamErr(t, err, ErrInvalid, "lattice.dim")
	_, err = IntegerLattice(9)
	checkParamErr(t, err, ErrInvalid, "lattice.dim")
	_, err = Hexagonal().Scaled(-1)
	checkParamErr(t, err, ErrInvalid, "scale")
	_, err = Lattice{}.Dual()
	checkParamErr(t, err, ErrInvalid, "lattice")
}

func checkParamErr(t *testing.T, err, sentinel error, param string) {
	t.Helper()
	if !errors.Is(err, sentinel) {
		t.Fatalf("err = %v, want %v", err, sentinel)
	}
	var pe *ParamError
	if !errors.As(err, &pe) {
		t.Fatalf("err = %T, want *ParamError", err)
	}
	if pe.Param != param {
		t.Errorf("ParamError.Param = %q, want %q (%v)", pe.Param, param, err)
	}
}

func TestCountBound(t *testing.T) {
	// N(r) = #{v : |v - t| ≤ r}, counted by the test's own box
	// enumeration, never exceeds CountBound(r) and never falls below the
	// volume lower bound, at random centres.
	rng := rand.New(rand.NewPCG(2, 2))
	skew, err := NewLattice([][]float64{{1, 0}, {0, 0.01}})
	if err != nil {
		t.Fatal(err)
	}
	z2, _ := IntegerLattice(2)
	lats := append(namedTestLattices(), randomTestLattices(t)...)
	lats = append(lats, testLattice{"skew", skew, skew.Generator()}, testLattice{"square", z2, z2.Generator()})
	worst := 0.0
	for _, tl := range lats {
		n := tl.lat.Dim()
		pc := tl.lat.d.primal.counter(Point(1))
		for _, r := range []float64{0.3, 1, 2.5, 6} {
			for trial := 0; trial < 3; trial++ {
				c := make([]float64, n)
				for i := range c {
					c[i] = rng.Float64()*4 - 2
				}
				var count float64
				forEachPoint(tl.good, make([]float64, n), c, r, func(k []int64, x []float64) {
					d := 0.0
					for i := range x {
						d += (x[i] - c[i]) * (x[i] - c[i])
					}
					if d <= r*r {
						count++
					}
				})
				up := tl.lat.CountBound(r)
				if count > up {
					t.Errorf("%s: N(%g) = %g at %v, above CountBound = %g", tl.name, r, count, c, up)
				}
				if lo := pc.lower(r); count < lo {
					t.Errorf("%s: N(%g) = %g at %v, below the volume lower bound %g", tl.name, r, count, c, lo)
				}
				if count > 50 {
					worst = math.Max(worst, up/count)
				}
			}
		}
	}
	t.Logf("CountBound/N(r) at most %.3g where N(r) > 50", worst)
}

func newTestRand(seed uint64) *rand.Rand { return rand.New(rand.NewPCG(seed, seed)) }
