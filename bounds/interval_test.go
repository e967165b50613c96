package bounds

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

var inf = math.Inf(1)

// randInterval returns a valid interval of any sign pattern, with zero,
// infinite, subnormal and huge endpoints now and then.
func randInterval(r *rand.Rand) Interval {
	a, b := randFloat(r), randFloat(r)
	switch r.IntN(14) {
	case 0:
		return Point(a)
	case 1:
		return Interval{-inf, a}
	case 2:
		return Interval{a, inf}
	case 3:
		return Entire()
	case 4:
		return Span(0, a)
	case 5:
		return Span(math.Copysign(0, -1), a)
	case 6:
		return Span(a, randNear(r, a, 4)) // thin
	case 7:
		return Interval{-math.Abs(a), math.Abs(b)} // contains 0
	}
	return Span(a, b)
}

// samplePoints returns finite points of x: its finite endpoints, stand-ins
// for infinite ones, 0 if x contains it, and random interior points.
func samplePoints(r *rand.Rand, x Interval, n int) []float64 {
	lo, hi := x.Lo, x.Hi
	if math.IsInf(lo, -1) {
		lo = -math.MaxFloat64
	}
	if math.IsInf(hi, 1) {
		hi = math.MaxFloat64
	}
	ps := []float64{lo, hi}
	if x.ContainsZero() {
		ps = append(ps, 0)
	}
	if x.Lo == -inf {
		ps = append(ps, math.Min(-1e300, hi), math.Min(-1, hi))
	}
	if x.Hi == inf {
		ps = append(ps, math.Max(1e300, lo), math.Max(1, lo))
	}
	for i := 0; i < n; i++ {
		u := r.Float64()
		p := lo*(1-u) + hi*u
		p = math.Max(lo, math.Min(hi, p))
		ps = append(ps, p)
	}
	return ps
}

// checkValid fails on a NaN endpoint or Lo > Hi.
func checkValid(t *testing.T, what string, z Interval) bool {
	t.Helper()
	if math.IsNaN(z.Lo) || math.IsNaN(z.Hi) || z.Lo > z.Hi {
		t.Errorf("%s = %v, want a valid interval", what, z)
		return false
	}
	return true
}

// TestArithmeticContainment checks Add, Sub, Mul, Div against exact
// math/big results at sample points of random intervals of every sign
// pattern, and that Add, Sub and Mul of finite operands round their exact
// extremes exactly (directed rounding, no wasted ulp) in the normal range.
func TestArithmeticContainment(t *testing.T) {
	t.Parallel()
	type op struct {
		name  string
		iv    func(x, y Interval) Interval
		exact func(a, b *big.Float) *big.Float
		tight bool
	}
	ops := []op{
		{"Add", Interval.Add, func(a, b *big.Float) *big.Float { return newF(exactPrec).Add(a, b) }, true},
		{"Sub", Interval.Sub, func(a, b *big.Float) *big.Float { return newF(exactPrec).Sub(a, b) }, true},
		{"Mul", Interval.Mul, func(a, b *big.Float) *big.Float { return newF(exactPrec).Mul(a, b) }, true},
		{"Div", Interval.Div, func(a, b *big.Float) *big.Float { return newF(exactPrec).Quo(a, b) }, false},
	}
	r := rand.New(rand.NewPCG(7, 8))
	for i := 0; i < 3000; i++ {
		x, y := randInterval(r), randInterval(r)
		xs, ys := samplePoints(r, x, 2), samplePoints(r, y, 2)
		for _, o := range ops {
			z := o.iv(x, y)
			what := fmt.Sprintf("%v.%s(%v)", x, o.name, y)
			if !checkValid(t, what, z) {
				continue
			}
			if o.name == "Div" && y.ContainsZero() {
				if z != Entire() {
					t.Errorf("%s = %v, want Entire", what, z)
				}
				continue
			}
			var min, max *big.Float
			for _, a := range xs {
				for _, b := range ys {
					e := o.exact(bf(a, exactPrec), bf(b, exactPrec))
					if !bigContains(z.Lo, z.Hi, e) {
						t.Errorf("%s = %v, want ∋ %g %s %g = %s", what, z, a, o.name, b, e.Text('g', 20))
					}
					if min == nil || e.Cmp(min) < 0 {
						min = e
					}
					if max == nil || e.Cmp(max) > 0 {
						max = e
					}
				}
			}
			if x.IsFinite() && y.IsFinite() {
				// The extremes are at the endpoints, which are all sampled.
				checkEndpoint(t, what+".Lo", z.Lo, min, big.ToNegativeInf, o.tight)
				checkEndpoint(t, what+".Hi", z.Hi, max, big.ToPositiveInf, o.tight)
			}
		}
	}
}

// checkEndpoint checks that v is the rounding of exact in direction mode
// (tight) or at most one ulp beyond it, where exact is in the normal range.
func checkEndpoint(t *testing.T, what string, v float64, exact *big.Float, mode big.RoundingMode, tight bool) {
	t.Helper()
	mag := newF(64).Abs(exact)
	if exact.Sign() == 0 || mag.Cmp(bf(0x1p-968, 64)) < 0 || mag.Cmp(bf(math.MaxFloat64, 64)) > 0 {
		return
	}
	want, _ := newF(53).SetMode(mode).Set(exact).Float64()
	switch {
	case v == want:
	case tight:
		t.Errorf("%s = %g, want the directed rounding %g of %s", what, v, want, exact.Text('g', 25))
	case mode == big.ToNegativeInf && v != nextDown(want), mode == big.ToPositiveInf && v != nextUp(want):
		t.Errorf("%s = %g, want within one ulp of the directed rounding %g of %s", what, v, want, exact.Text('g', 25))
	}
}

// TestArithmeticSpecial checks the IEEE 1788 conventions (from memory:
// IEEE Std 1788-2015, 10.5.3): 0·∞ contributes 0, division by an interval
// containing 0 gives Entire, no NaN ever.
func TestArithmeticSpecial(t *testing.T) {
	t.Parallel()
	max := math.MaxFloat64
	tests := []struct {
		name string
		got  Interval
		want Interval
	}{
		{"[0,0]·Entire", Point(0).Mul(Entire()), Point(0)},
		{"[0,Inf]·[0,0]", Interval{0, inf}.Mul(Point(0)), Point(0)},
		{"[0,Inf]·[-1,2]", Interval{0, inf}.Mul(Interval{-1, 2}), Entire()},
		{"[-Inf,-1]·[-Inf,-1]", Interval{-inf, -1}.Mul(Interval{-inf, -1}), Interval{1, inf}},
		{"[1,Inf]·[-3,-2]", Interval{1, inf}.Mul(Interval{-3, -2}), Interval{-inf, -2}},
		{"Entire+[1,1]", Entire().Add(Point(1)), Entire()},
		{"Entire-Entire", Entire().Sub(Entire()), Entire()},
		{"[1,Inf]+[-Inf,2]", Interval{1, inf}.Add(Interval{-inf, 2}), Entire()},
		{"[Max,Max]+[Max,Max]", Point(max).Add(Point(max)), Interval{max, inf}},
		{"[1,2]/[0,1]", Interval{1, 2}.Div(Interval{0, 1}), Entire()},
		{"[1,2]/[-0,0]", Interval{1, 2}.Div(Interval{math.Copysign(0, -1), 0}), Entire()},
		{"[0,0]/[1,2]", Point(0).Div(Interval{1, 2}), Point(0)},
		{"[1,Inf]/[1,Inf]", Interval{1, inf}.Div(Interval{1, inf}), Interval{0, inf}},
		{"[-Inf,-1]/[1,Inf]", Interval{-inf, -1}.Div(Interval{1, inf}), Interval{-inf, 0}},
		{"[-1,1]/[-Inf,-2]", Interval{-1, 1}.Div(Interval{-inf, -2}), Interval{-0.5, 0.5}},
		{"[2,4]/[-Inf,-2]", Interval{2, 4}.Div(Interval{-inf, -2}), Interval{-2, 0}},
		{"Recip [-Inf,-1]", Interval{-inf, -1}.Recip(), Interval{-1, 0}},
		{"Recip [2,Inf]", Interval{2, inf}.Recip(), Interval{0, 0.5}},
		{"Recip [-1,1]", Interval{-1, 1}.Recip(), Entire()},
		{"Sqr [-Inf,2]", Interval{-inf, 2}.Sqr(), Interval{0, inf}},
		{"Sqr [-3,2]", Interval{-3, 2}.Sqr(), Interval{0, 9}},
		{"Abs [-3,2]", Interval{-3, 2}.Abs(), Interval{0, 3}},
		{"Abs [-3,-2]", Interval{-3, -2}.Abs(), Interval{2, 3}},
		{"Neg [1,Inf]", Interval{1, inf}.Neg(), Interval{-inf, -1}},
		{"Scale [1,Inf]·0", Interval{1, inf}.Scale(0), Point(0)},
		{"Scale [1,2]·-Inf", Interval{1, 2}.Scale(-inf), Interval{-inf, -max}},
		{"Scale [1,2]·NaN", Interval{1, 2}.Scale(math.NaN()), Entire()},
		{"AddFloat Entire+NaN", Entire().AddFloat(math.NaN()), Entire()},
		{"IntPow [-2,3]^0", Interval{-2, 3}.IntPow(0), Point(1)},
		{"IntPow [-2,3]^2", Interval{-2, 3}.IntPow(2), Interval{0, 9}},
		{"IntPow [-2,3]^3", Interval{-2, 3}.IntPow(3), Interval{-8, 27}},
		{"IntPow [2,4]^-1", Interval{2, 4}.IntPow(-1), Interval{0.25, 0.5}},
		{"IntPow [-2,-1]^-2", Interval{-2, -1}.IntPow(-2), Interval{0.25, 1}},
		{"IntPow [-1,1]^-1", Interval{-1, 1}.IntPow(-1), Entire()},
		{"IntPow [2,Inf]^2", Interval{2, inf}.IntPow(2), Interval{4, inf}},
		{"Max", Interval{1, 5}.Max(Interval{2, 3}), Interval{2, 5}},
		{"Min", Interval{1, 5}.Min(Interval{2, 3}), Interval{1, 3}},
		{"Hull", Interval{1, 2}.Hull(Interval{4, 5}), Interval{1, 5}},
	}
	for _, tt := range tests {
		if tt.got != tt.want {
			t.Errorf("%s = %v, want %v", tt.name, tt.got, tt.want)
		}
	}
	if z, ok := (Interval{1, 2}).Intersect(Interval{3, 4}); ok {
		t.Errorf("Intersect of disjoint = %v, true, want false", z)
	}
	if z, ok := (Interval{1, 3}).Intersect(Interval{2, 4}); !ok || z != (Interval{2, 3}) {
		t.Errorf("Intersect = %v, %v, want [2, 3], true", z, ok)
	}
}

// TestNoNaN runs every operation on all pairs of intervals built from
// special endpoints (including the degenerate [Inf, Inf]) and requires
// valid results.
func TestNoNaN(t *testing.T) {
	t.Parallel()
	ends := []float64{-inf, -math.MaxFloat64, -1, -5e-324, math.Copysign(0, -1), 0, 5e-324, 1, math.MaxFloat64, inf}
	var ivs []Interval
	for _, a := range ends {
		for _, b := range ends {
			if a <= b {
				ivs = append(ivs, Interval{a, b})
			}
		}
	}
	for _, x := range ivs {
		for _, y := range ivs {
			for name, z := range map[string]Interval{
				"Add": x.Add(y), "Sub": x.Sub(y), "Mul": x.Mul(y), "Div": x.Div(y),
				"Hull": x.Hull(y), "Max": x.Max(y), "Min": x.Min(y),
			} {
				checkValid(t, fmt.Sprintf("%v.%s(%v)", x, name, y), z)
			}
		}
		for name, z := range map[string]Interval{
			"Neg": x.Neg(), "Abs": x.Abs(), "Sqr": x.Sqr(), "Recip": x.Recip(),
			"IntPow(3)": x.IntPow(3), "IntPow(-2)": x.IntPow(-2), "IntPow(4)": x.IntPow(4), "Scale(-3)": x.Scale(-3),
			"AddFloat(1)": x.AddFloat(1),
		} {
			checkValid(t, fmt.Sprintf("%v.%s", x, name), z)
		}
		for name, v := range map[string]float64{"Width": x.Width(), "RelWidth": x.RelWidth(), "Mag": x.Mag(), "Mig": x.Mig(), "Mid": x.Mid()} {
			if math.IsNaN(v) {
				t.Errorf("%v.%s = NaN", x, name)
			}
		}
		if m := x.Mid(); !x.Contains(m) && x.Lo != inf && x.Hi != -inf {
			t.Errorf("%v.Mid() = %g, want inside", x, m)
		}
	}
}

// TestIntervalMeasures checks Mid, Width, Mag, Mig and RelWidth against
// exact math/big values on random intervals.
func TestIntervalMeasures(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(9, 10))
	for i := 0; i < 5000; i++ {
		x := randInterval(r)
		if m := x.Mid(); !x.Contains(m) {
			t.Errorf("%v.Mid() = %g, want inside", x, m)
		}
		w := newF(exactPrec).Sub(bf(x.Hi, exactPrec), bf(x.Lo, exactPrec))
		if x.IsFinite() && bf(x.Width(), exactPrec).Cmp(w) < 0 {
			t.Errorf("%v.Width() = %g, want ≥ %s", x, x.Width(), w.Text('g', 20))
		}
		if a, b := math.Abs(x.Lo), math.Abs(x.Hi); x.Mag() != math.Max(a, b) {
			t.Errorf("%v.Mag() = %g, want %g", x, x.Mag(), math.Max(a, b))
		}
		if x.ContainsZero() && x.Mig() != 0 || !x.ContainsZero() && x.Mig() != math.Min(math.Abs(x.Lo), math.Abs(x.Hi)) {
			t.Errorf("%v.Mig() = %g", x, x.Mig())
		}
		if m := x.Mag(); x.IsFinite() && m > 0 {
			rw := newF(exactPrec).Quo(w, bf(m, exactPrec))
			if bf(x.RelWidth(), exactPrec).Cmp(rw) < 0 {
				t.Errorf("%v.RelWidth() = %g, want ≥ %s", x, x.RelWidth(), rw.Text('g', 20))
			}
		}
	}
}

// TestIntPow checks x^n against exact math/big powers at sample points.
func TestIntPow(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(11, 12))
	for i := 0; i < 1500; i++ {
		a, b := randLog(r, -20, 20), randLog(r, -20, 20)
		if r.IntN(3) == 0 {
			b = randNear(r, a, 3)
		}
		x := Span(a, b)
		n := r.IntN(17) - 7
		z := x.IntPow(n)
		if !checkValid(t, fmt.Sprintf("%v.IntPow(%d)", x, n), z) {
			continue
		}
		for _, p := range samplePoints(r, x, 3) {
			if p == 0 && n < 0 {
				continue
			}
			e := bint(1, exactPrec)
			P := bf(p, exactPrec)
			for k := 0; k < abs(n); k++ {
				e.Mul(e, P)
			}
			if n < 0 {
				e.Quo(bint(1, exactPrec), e)
			}
			if !bigContains(z.Lo, z.Hi, e) {
				t.Errorf("%v.IntPow(%d) = %v, want ∋ %g^%d = %s", x, n, z, p, n, e.Text('g', 20))
			}
		}
	}
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}

// TestSumTightness sums 1000 terms of a convergent positive series in
// interval arithmetic and checks the relative width stays below 1e-12
// (the engine's target for alias sums); the exact sum Σ 1/k² for k ≤ 1000
// is computed with math/big.
func TestSumTightness(t *testing.T) {
	t.Parallel()
	var s Interval
	exact := newF(workPrec)
	for k := 1; k <= 1000; k++ {
		kk := Point(float64(k))
		s = s.Add(kk.Sqr().Recip())
		exact.Add(exact, newF(workPrec).Quo(bint(1, workPrec), bint(int64(k*k), workPrec)))
	}
	if !bigContains(s.Lo, s.Hi, exact) {
		t.Fatalf("Σ 1/k² = %v, want ∋ %s", s, exact.Text('g', 20))
	}
	if rw := s.RelWidth(); rw > 1e-12 {
		t.Errorf("Σ 1/k², k ≤ 1000: relative width %g, want ≤ 1e-12", rw)
	} else {
		t.Logf("Σ 1/k², k ≤ 1000: relative width %.3g", rw)
	}
}
