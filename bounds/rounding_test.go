package bounds

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// exactPrec holds any sum or product of two float64 exactly
// (exponents span 2^-1074 … 2^1024, products 2^-2148 … 2^2048).
const exactPrec = 4400

// checkDirected checks lo ≤ exact ≤ hi for a directed pair and, when
// exactTight is set and the exact value lies in the normal range, that lo and
// hi are the directed roundings (no wasted ulp); otherwise at most one ulp
// beyond them.
func checkDirected(t *testing.T, op string, a, b, lo, hi float64, exact *big.Float, exactTight bool) {
	t.Helper()
	if math.IsNaN(lo) || math.IsNaN(hi) {
		t.Errorf("%s(%g, %g) = [%g, %g], want no NaN", op, a, b, lo, hi)
		return
	}
	if !bigContains(lo, hi, exact) {
		t.Errorf("%s(%g, %g) = [%g, %g], want ⊇ %s", op, a, b, lo, hi, exact.Text('g', 25))
		return
	}
	// Directed roundings of exact at 53 bits (valid in the normal range).
	mag := newF(64).Abs(exact)
	if exact.Sign() == 0 || mag.Cmp(bf(0x1p-968, 64)) < 0 || mag.Cmp(bf(math.MaxFloat64, 64)) > 0 {
		return
	}
	rd, _ := newF(53).SetMode(big.ToNegativeInf).Set(exact).Float64()
	ru, _ := newF(53).SetMode(big.ToPositiveInf).Set(exact).Float64()
	if exactTight {
		if lo != rd || hi != ru {
			t.Errorf("%s(%g, %g) = [%g, %g], want directed roundings [%g, %g]", op, a, b, lo, hi, rd, ru)
		}
		return
	}
	if lo < nextDown(rd) || hi > nextUp(ru) {
		t.Errorf("%s(%g, %g) = [%g, %g], want within one ulp of [%g, %g]", op, a, b, lo, hi, rd, ru)
	}
}

// TestDirectedRounding checks addUp/addDown and mulUp/mulDown against
// exact math/big sums, products, quotients and roots: they must equal
// directed rounding where the rounding error is computed exactly, and be
// at most one ulp wider elsewhere.
func TestDirectedRounding(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(3, 4))
	for i := 0; i < 20000; i++ {
		a, b := randFloat(r), randFloat(r)
		if r.IntN(4) == 0 {
			b = randNear(r, -a, 3) // cancellation
		}
		A, B := bf(a, exactPrec), bf(b, exactPrec)

		sum := newF(exactPrec).Add(A, B)
		checkDirected(t, "add", a, b, addDown(a, b), addUp(a, b), sum, true)

		prod := newF(exactPrec).Mul(A, B)
		checkDirected(t, "mul", a, b, mulDown(a, b), mulUp(a, b), prod, true)

		if b != 0 {
			q := newF(exactPrec).Quo(A, B) // not exact; 4400 bits decide the comparisons
			checkDirected(t, "div", a, b, divDown(a, b), divUp(a, b), q, math.Abs(a) >= minExact)
		}
		if a > 0 {
			s := newF(exactPrec).Sqrt(A)
			checkDirected(t, "sqrt", a, 0, sqrtDown(a), sqrtUp(a), s, a >= minExact)
		}
	}
}

// TestDirectedRoundingSpecial checks the special operands: zeros,
// infinities, the extremes of the range.
func TestDirectedRoundingSpecial(t *testing.T) {
	t.Parallel()
	inf := math.Inf(1)
	tests := []struct {
		name           string
		lo, hi         float64
		wantLo, wantHi float64
	}{
		{"0·Inf", mulDown(0, inf), mulUp(0, inf), 0, 0},
		{"-Inf·0", mulDown(-inf, 0), mulUp(-inf, 0), 0, 0},
		{"Inf+(-Inf)", addDown(inf, -inf), addUp(inf, -inf), -inf, inf},
		{"Max+Max", addDown(math.MaxFloat64, math.MaxFloat64), addUp(math.MaxFloat64, math.MaxFloat64), math.MaxFloat64, inf},
		{"-Max-Max", addDown(-math.MaxFloat64, -math.MaxFloat64), addUp(-math.MaxFloat64, -math.MaxFloat64), -inf, -math.MaxFloat64},
		{"Max·2", mulDown(math.MaxFloat64, 2), mulUp(math.MaxFloat64, 2), math.MaxFloat64, inf},
		{"Max·-2", mulDown(math.MaxFloat64, -2), mulUp(math.MaxFloat64, -2), -inf, -math.MaxFloat64},
		{"tiny·tiny", mulDown(5e-324, 5e-324), mulUp(5e-324, 5e-324), 0, 5e-324},
		{"tiny·-tiny", mulDown(5e-324, -5e-324), mulUp(5e-324, -5e-324), -5e-324, 0},
		{"tiny/Max", divDown(5e-324, math.MaxFloat64), divUp(5e-324, math.MaxFloat64), 0, 5e-324},
		{"-tiny/Max", divDown(-5e-324, math.MaxFloat64), divUp(-5e-324, math.MaxFloat64), -5e-324, 0},
		{"Inf/Inf", divDown(inf, inf), divUp(inf, inf), -inf, inf},
		{"1/Inf", divDown(1, inf), divUp(1, inf), 0, 5e-324},
		{"0/-3", divDown(0, -3), divUp(0, -3), 0, 0},
		{"sqrt 0", sqrtDown(0), sqrtUp(0), 0, 0},
		{"sqrt 4", sqrtDown(4), sqrtUp(4), 2, 2},
		{"sqrt Inf", sqrtDown(inf), sqrtUp(inf), math.MaxFloat64, inf},
		{"sqrt tiny", sqrtDown(5e-324), sqrtUp(5e-324), nextDown(math.Sqrt(5e-324)), nextUp(math.Sqrt(5e-324))},
		{"1+1", addDown(1, 1), addUp(1, 1), 2, 2},
		{"3·0.5", mulDown(3, 0.5), mulUp(3, 0.5), 1.5, 1.5},
		{"nextUp(-0)", nextUp(math.Copysign(0, -1)), nextUp(math.Copysign(0, -1)), 5e-324, 5e-324},
		{"nextDown(-Max)", nextDown(-math.MaxFloat64), nextDown(-math.MaxFloat64), -inf, -inf},
		{"nextUp(+Inf)", nextUp(inf), nextUp(inf), inf, inf},
		{"nextDown(+Inf)", nextDown(inf), nextDown(inf), math.MaxFloat64, math.MaxFloat64},
	}
	for _, tt := range tests {
		if tt.lo != tt.wantLo || tt.hi != tt.wantHi {
			t.Errorf("%s = [%g, %g], want [%g, %g]", tt.name, tt.lo, tt.hi, tt.wantLo, tt.wantHi)
		}
	}
}

// TestWiden checks that widenUp/widenDown move at least libmUlps+3 ulps
// outward over all magnitudes, and by at least 2^14 subnormal units near 0.
func TestWiden(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(5, 6))
	for i := 0; i < 5000; i++ {
		x := randFloat(r)
		up, down := widenUp(x), widenDown(x)
		ulp := math.Abs(x) * 0x1p-52
		if ulp < 0x1p-1074 {
			ulp = 0x1p-1074
		}
		// Compare in big: the gap must exceed (libmUlps+3) ulps of x, with
		// the ulp taken at x's binade (ulp(x) ≤ 2^-52|x|).
		X := bf(x, 2200)
		need := bf(float64(libmUlps+3), 2200)
		need.Mul(need, bf(ulp, 2200))
		gu := newF(2200).Sub(bf(up, 2200), X)
		gd := newF(2200).Sub(X, bf(down, 2200))
		if math.Abs(x) <= math.MaxFloat64/2 && (gu.Cmp(need) < 0 || gd.Cmp(need) < 0) {
			t.Errorf("widen(%g) = [%g, %g], want ≥ %d ulps each side", x, down, up, libmUlps+3)
		}
		if math.Abs(x) < 0x1p-1000 && (gu.Cmp(bf(0x1p-1061, 64)) < 0 || gd.Cmp(bf(0x1p-1061, 64)) < 0) {
			t.Errorf("widen(%g) = [%g, %g], want ≥ 2^-1061 each side", x, down, up)
		}
	}
	if widenUp(math.Inf(1)) != math.Inf(1) || widenDown(math.Inf(1)) != math.MaxFloat64 ||
		widenUp(math.Inf(-1)) != -math.MaxFloat64 || widenDown(math.Inf(-1)) != math.Inf(-1) {
		t.Errorf("widen(±Inf) wrong")
	}
}
