package bounds

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"slices"
	"testing"
)

// An elemCase describes one elementary function for the containment tests:
// its interval version, the Go math function it rests on (whose error we
// measure), a math/big reference, random inputs and edge inputs.
type elemCase struct {
	name  string
	iv    func(Interval) Interval
	libm  func(float64) float64
	ref   func(float64) *big.Float // nil where undefined
	gen   func(*rand.Rand) float64
	edges []float64
	crit  []float64 // interior points where the range has an extremum
	// libmSkip marks inputs where the code under test does not call libm
	// directly (known defects it works around); their error is reported
	// apart.
	libmSkip func(float64) bool
	// halfPiCrit adds the floats nearest to kπ/2 inside wide intervals.
	halfPiCrit bool
}

// neighbours returns x and the k floats on either side of it.
func neighbours(k int, xs ...float64) []float64 {
	var out []float64
	for _, x := range xs {
		out = append(out, x)
		lo, hi := x, x
		for i := 0; i < k; i++ {
			lo, hi = math.Nextafter(lo, math.Inf(-1)), math.Nextafter(hi, math.Inf(1))
			out = append(out, lo, hi)
		}
	}
	return out
}

// symmetric returns xs and their negatives.
func symmetric(xs ...float64) []float64 {
	out := slices.Clone(xs)
	for _, x := range xs {
		out = append(out, -x)
	}
	return out
}

func refOf(f func(*big.Float) *big.Float) func(float64) *big.Float {
	return func(x float64) *big.Float { return f(bf(x, workPrec)) }
}

func mix(gens ...func(*rand.Rand) float64) func(*rand.Rand) float64 {
	return func(r *rand.Rand) float64 { return gens[r.IntN(len(gens))](r) }
}

func uni(lo, hi float64) func(*rand.Rand) float64 {
	return func(r *rand.Rand) float64 { return randUniform(r, lo, hi) }
}

func logu(lo, hi float64) func(*rand.Rand) float64 {
	return func(r *rand.Rand) float64 { return randLog(r, lo, hi) }
}

func posLogu(lo, hi float64) func(*rand.Rand) float64 {
	return func(r *rand.Rand) float64 { return math.Abs(randLog(r, lo, hi)) }
}

// nearHalfPiMultiple returns the float64 nearest to kπ/2, moved by up to 2
// ulps: the inputs at which argument reduction loses most.
func nearHalfPiMultiple(r *rand.Rand, k *big.Int) float64 {
	x := newF(piPrec).Mul(newF(piPrec).SetInt(k), refPi())
	x.SetMantExp(x, -1)
	f, _ := x.Float64()
	return randNear(r, f, 2)
}

// nearHalfPi draws k with a log-uniform magnitude below 2^maxBits.
func nearHalfPi(maxBits int) func(*rand.Rand) float64 {
	return func(r *rand.Rand) float64 {
		k := randBigInt(r, 1+r.IntN(maxBits))
		if r.IntN(2) == 0 {
			k.Neg(k)
		}
		return nearHalfPiMultiple(r, k)
	}
}

// randBigInt returns a random non-negative integer below 2^bits.
func randBigInt(r *rand.Rand, bits int) *big.Int {
	k := new(big.Int)
	for b := 0; b < bits; b += 64 {
		k.Lsh(k, 64)
		k.Or(k, new(big.Int).SetUint64(r.Uint64()))
	}
	return k.Rsh(k, uint((bits+63)/64*64-bits))
}

// The worst case for argument reduction in double precision:
// 6381956970095103·2^797 lies within about 4.7e-19 of a multiple of π/2
// (Muller, Elementary Functions, 3rd ed. 2016, Table 11.1 — from memory;
// the test does not rely on it being the worst).
var trigWorst = math.Ldexp(6381956970095103, 797)

func elemCases() []elemCase {
	sechRef := func(x *big.Float) *big.Float { c := refCosh(x); return c.Quo(bint(1, c.Prec()), c) }
	return []elemCase{
		{
			name: "Exp", iv: Exp, libm: math.Exp, ref: refOf(refExp),
			gen: mix(uni(-746, 710), logu(-60, 3), uni(708, 711), uni(-746, -707)),
			edges: append(neighbours(2, 0, 1, -1, 709, 709.43, 709.437, 709.5, 709.78, 709.782712893384, 710.47586007394394,
				-708.3964185322641, -709, -720, -744.4400719213812, -745.1332191019411, -745.14, -746),
				symmetric(5e-324, 1e-300, 0x1p-53, 0x1p-26)...),
		},
		{
			name: "Expm1", iv: Expm1, libm: math.Expm1, ref: refOf(refExpm1),
			gen: mix(uni(-50, 710), logu(-80, 3), uni(700, 710)),
			edges: append(neighbours(2, 0, 0.34657359027997264, 1.0397207708399179, 38.816242111356935, -38.816242111356935,
				709.782712893384, 700, -745), symmetric(5e-324, 1e-300, 0x1p-54, 0x1p-53)...),
		},
		{
			name: "Log", iv: Log, libm: math.Log, ref: posOnly(refOf(refLog)),
			// Go issue 56600: amd64 math.Log ignores subnormal scaling.
			libmSkip: func(x float64) bool { return x < 0x1p-1022 },
			gen:      mix(posLogu(-1074, 1024), posLogu(-3, 3), func(r *rand.Rand) float64 { return randNear(r, 1, 1000) }),
			edges:    neighbours(3, 1, 5e-324, 0x1p-1022, math.MaxFloat64, 0.7071067811865476, 2, 0.5),
		},
		{
			name: "Log1p", iv: Log1p, libm: math.Log1p, ref: aboveMinus1(refOf(refLog1p)),
			gen: mix(logu(-80, 0), posLogu(-10, 1000), func(r *rand.Rand) float64 { return -1 + math.Abs(randLog(r, -53, -1)) }),
			edges: append(neighbours(2, 0, -1+0x1p-53, -0.5, 0.41421356237309503, -0.2928932188134524, math.MaxFloat64),
				symmetric(5e-324, 1e-300, 0x1p-29, 0x1p-54)...),
		},
		{
			name: "Sin", iv: Sin, libm: math.Sin, ref: func(x float64) *big.Float { s, _ := refSinCos(x); return s },
			gen: mix(uni(-10, 10), logu(-60, 1023), logu(0, 40), nearHalfPi(30), nearHalfPi(1000), logu(28, 31)),
			edges: append(symmetric(neighbours(2, 0, 5e-324, 1e-300, math.Pi/2, math.Pi, 3*math.Pi/2, 2*math.Pi, 1e5, 1e15, 1e22, 1e300,
				0x1p29, 0x1p30, math.MaxFloat64, trigWorst)...), neighbours(1, 7.853981633974483e-01, 355, 103993)...),
			halfPiCrit: true,
		},
		{
			name: "Cos", iv: Cos, libm: math.Cos, ref: func(x float64) *big.Float { _, c := refSinCos(x); return c },
			gen: mix(uni(-10, 10), logu(-60, 1023), logu(0, 40), nearHalfPi(30), nearHalfPi(1000), logu(28, 31)),
			edges: append(symmetric(neighbours(2, 0, 5e-324, 1e-300, math.Pi/2, math.Pi, 3*math.Pi/2, 2*math.Pi, 1e5, 1e15, 1e22, 1e300,
				0x1p29, 0x1p30, math.MaxFloat64, trigWorst)...), neighbours(1, 7.853981633974483e-01, 355, 103993)...),
			halfPiCrit: true,
		},
		{
			name: "Sinh", iv: Sinh, libm: math.Sinh, ref: refOf(refSinh),
			gen:   mix(uni(-25, 25), uni(-715, 715), logu(-60, 1), uni(705, 712)),
			edges: symmetric(neighbours(2, 0, 5e-324, 1e-300, 0.5, 21, 22, 709.4, 709.5, 710, 710.4758600739439, 711, 712)...),
		},
		{
			name: "Cosh", iv: Cosh, libm: math.Cosh, ref: refOf(refCosh),
			gen:   mix(uni(-25, 25), uni(-715, 715), logu(-60, 1), uni(705, 712)),
			edges: symmetric(neighbours(2, 0, 5e-324, 1e-300, 0x1p-26, 0.5, 21, 22, 709.4, 709.5, 710, 710.4758600739439, 711, 712)...),
			crit:  []float64{0},
		},
		{
			name: "Tanh", iv: Tanh, libm: math.Tanh, ref: refOf(refTanh),
			gen:   mix(uni(-25, 25), uni(-50, 50), logu(-60, 1)),
			edges: symmetric(neighbours(2, 0, 5e-324, 1e-300, 0.625, 19.06, 22, 44.014845965556525, 50, 700)...),
		},
		{
			name: "Sech", iv: Sech, ref: refOf(sechRef), // rests on math.Cosh and math.Exp
			gen:   mix(uni(-25, 25), uni(-760, 760), logu(-60, 1)),
			edges: symmetric(neighbours(2, 0, 5e-324, 1e-300, 0.5, 21, 22, 709.5, 710, 711, 744, 745.2, 746)...),
			crit:  []float64{0},
		},
		{
			name: "Erf", iv: Erf, libm: math.Erf, ref: refErf,
			gen:   mix(uni(-6.5, 6.5), logu(-60, 2)),
			edges: symmetric(neighbours(2, 0, 5e-324, 1e-300, 0x1p-28, 0x1p-56, 0.84375, 1.25, 2.857142857142857, 5.9, 6)...),
		},
		{
			name: "Erfc", iv: Erfc, libm: math.Erfc, ref: refErfc,
			gen: mix(uni(-6.5, 28.5), logu(-60, 2), uni(25, 28.5)),
			edges: append(symmetric(neighbours(2, 0, 5e-324, 1e-300, 0x1p-56, 0.25, 0.84375, 1.25, 2.857142857142857, 6)...),
				neighbours(2, 26, 26.5, 26.55, 27, 27.2, 27.22, 27.23, 27.5, 28, 30)...),
		},
		{
			name: "Sqrt", iv: Sqrt, libm: math.Sqrt, ref: func(x float64) *big.Float {
				if x < 0 {
					return nil
				}
				return newF(workPrec).Sqrt(bf(x, workPrec))
			},
			gen:   posLogu(-1074, 1024),
			edges: neighbours(2, 0, 5e-324, 1, 2, 4, math.MaxFloat64),
		},
	}
}

// posOnly restricts a reference to x > 0.
func posOnly(f func(float64) *big.Float) func(float64) *big.Float {
	return func(x float64) *big.Float {
		if x <= 0 {
			return nil
		}
		return f(x)
	}
}

// aboveMinus1 restricts a reference to x > -1.
func aboveMinus1(f func(float64) *big.Float) func(float64) *big.Float {
	return func(x float64) *big.Float {
		if x <= -1 {
			return nil
		}
		return f(x)
	}
}

// libmStats collects the error of a Go math function against the reference.
type libmStats struct {
	maxUlps     float64 // over results in the normal range
	argMaxUlps  float64
	maxSubUnits float64 // |error| in units of 2^-1074 for subnormal results
	earlyInf    int     // ±Inf returned where the exact value is finite
	earlyInfArg float64
	skipped     int     // inputs in libmSkip
	skippedUlps float64 // their largest error
	// sin, cos: absolute error beyond 2 ulps (the polynomial's share), per
	// unit |x| (|x| < 2^29) and absolute (|x| ≥ 2^29): the error of
	// argument reduction.
	maxCWRel, maxPHAbs float64
	widths             []float64 // relative widths of point enclosures
}

func (s *libmStats) add(c elemCase, x float64, ref *big.Float) {
	if c.libm == nil {
		return
	}
	v := c.libm(x)
	maxF := bf(math.MaxFloat64, 64)
	absRef := newF(workPrec).Abs(ref)
	if absRef.Cmp(maxF) > 0 {
		return // overflow is correct
	}
	if math.IsInf(v, 0) {
		if s.earlyInf == 0 || math.Abs(x) < math.Abs(s.earlyInfArg) {
			s.earlyInfArg = x
		}
		s.earlyInf++
		return
	}
	u := ulpsOff(v, ref)
	if c.libmSkip != nil && c.libmSkip(x) {
		s.skipped++
		s.skippedUlps = math.Max(s.skippedUlps, u)
		return
	}
	trig := c.name == "Sin" || c.name == "Cos"
	if trig && ref.Sign() != 0 && trigAbsErr(x) > math.Ldexp(1, ref.MantExp(nil)-53-10) {
		// The reduction error may dominate: counted below instead.
	} else if ref.Sign() != 0 && ref.MantExp(nil) < -1021 {
		s.maxSubUnits = math.Max(s.maxSubUnits, u)
	} else if u > s.maxUlps {
		s.maxUlps, s.argMaxUlps = u, x
	}
	if trig {
		d := newF(workPrec).Sub(bf(v, workPrec), ref)
		d.Abs(d)
		e := ref.MantExp(nil)
		ulp := newF(64).SetMantExp(bint(2, 64), e-53)
		d.Sub(d, ulp)
		if d.Sign() > 0 {
			if math.Abs(x) < trigThreshold {
				d.Quo(d, bf(math.Abs(x), 64))
				f, _ := d.Float64()
				s.maxCWRel = math.Max(s.maxCWRel, f)
			} else {
				f, _ := d.Float64()
				s.maxPHAbs = math.Max(s.maxPHAbs, f)
			}
		}
	}
}

// checkEnclosure reports whether z ⊇ ref (and z is valid).
func checkEnclosure(t *testing.T, what string, z Interval, ref *big.Float) bool {
	t.Helper()
	if !checkValid(t, what, z) {
		return false
	}
	if !bigContains(z.Lo, z.Hi, ref) {
		t.Errorf("%s = %v, want ∋ %s", what, z, ref.Text('g', 25))
		return false
	}
	return true
}

// TestElementaryContainment checks every elementary function on point
// inputs (random and edge) and on wide intervals (at sample points and the
// interior extrema) against math/big references, and measures the error
// of the Go math function each rests on.
func TestElementaryContainment(t *testing.T) {
	t.Parallel()
	for i, c := range elemCases() {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			runContainment(t, c, 100+uint64(i))
		})
	}
}

// runContainment runs the containment checks of one case and reports the
// measured libm error and the tightness of point enclosures.
func runContainment(t *testing.T, c elemCase, seed uint64) {
	points, wide := 1500, 250
	if testing.Short() {
		points, wide = 300, 50
	}
	r := rand.New(rand.NewPCG(seed, 1))
	var st libmStats
	xs := slices.Clone(c.edges)
	for j := 0; j < points; j++ {
		xs = append(xs, c.gen(r))
	}
	for _, x := range xs {
		if math.IsInf(x, 0) {
			checkValid(t, fmt.Sprintf("%s(%v)", c.name, Point(x)), c.iv(Point(x)))
			continue
		}
		ref := c.ref(x)
		if ref == nil {
			continue
		}
		z := c.iv(Point(x))
		if checkEnclosure(t, fmt.Sprintf("%s(%v)", c.name, Point(x)), z, ref) {
			if z.IsFinite() && z.Mag() > 0x1p-1000 {
				st.widths = append(st.widths, z.RelWidth())
			}
		}
		st.add(c, x, ref)
	}
	for j := 0; j < wide; j++ {
		a, b := c.gen(r), c.gen(r)
		if r.IntN(2) == 0 {
			b = a + randLog(r, -40, 3)
		}
		x := Span(a, b)
		z := c.iv(x)
		ps := samplePoints(r, x, 6)
		for _, p := range c.crit {
			if x.Contains(p) {
				ps = append(ps, p)
			}
		}
		if c.halfPiCrit {
			ps = append(ps, halfPiMultiplesIn(x, 8)...)
		}
		for _, p := range ps {
			if ref := c.ref(p); ref != nil {
				checkEnclosure(t, fmt.Sprintf("%s(%v) at %g", c.name, x, p), z, ref)
			}
		}
	}
	slices.Sort(st.widths)
	med, mx := 0.0, 0.0
	if n := len(st.widths); n > 0 {
		med, mx = st.widths[n/2], st.widths[n-1]
	}
	if c.libm == nil {
		t.Logf("%-9s point enclosures: median rel width %.3g, max %.3g", c.name, med, mx)
		return
	}
	t.Logf("%-6s math: max %.3f ulp (at %g), subnormal results max %.3g units of 2^-1074, early ±Inf %d (from %g), "+
		"worked-around inputs %d (max %.3g ulp); sin/cos reduction excess: %.3g·|x| below 2^29, %.3g abs above; "+
		"point enclosures: median rel width %.3g, max %.3g",
		c.name, st.maxUlps, st.argMaxUlps, st.maxSubUnits, st.earlyInf, st.earlyInfArg, st.skipped, st.skippedUlps,
		st.maxCWRel, st.maxPHAbs, med, mx)
	if st.maxUlps > libmUlps {
		t.Errorf("math.%s: %.3f ulp at %g, above the assumed %d", c.name, st.maxUlps, st.argMaxUlps, libmUlps)
	}
	if st.maxSubUnits > 0x1p14 {
		t.Errorf("math.%s: subnormal error %.3g units, above 2^14", c.name, st.maxSubUnits)
	}
	if st.maxCWRel > trigRelCW || st.maxPHAbs > trigAbsPH {
		t.Errorf("math.%s: reduction error %.3g·|x|, %.3g, above the allowance", c.name, st.maxCWRel, st.maxPHAbs)
	}
}

// halfPiMultiplesIn returns the floats nearest to kπ/2 inside x, at most n
// of them (the extrema and zeros of sin and cos).
func halfPiMultiplesIn(x Interval, n int) []float64 {
	if !x.IsFinite() {
		return nil
	}
	halfPi := newF(piPrec).Set(refPi())
	halfPi.SetMantExp(halfPi, -1)
	q := newF(piPrec).Quo(bf(x.Lo, piPrec), halfPi)
	k, _ := q.Int(nil)
	var out []float64
	for i := 0; i < n+2; i++ {
		p := newF(piPrec).Mul(newF(piPrec).SetInt(k), halfPi)
		f, _ := p.Float64()
		if x.Contains(f) {
			out = append(out, f)
			if len(out) == n {
				break
			}
		} else if f > x.Hi {
			break
		}
		k.Add(k, big.NewInt(1))
	}
	return out
}

// TestConstants checks the interval constants against math/big values.
func TestConstants(t *testing.T) {
	t.Parallel()
	pi := refPi()
	two := func(x *big.Float) *big.Float { y := newF(workPrec).Set(x); return y.SetMantExp(y, 1) }
	sqrt := func(x *big.Float) *big.Float { return newF(workPrec).Sqrt(x) }
	e := refExp(bint(1, 64))
	tests := []struct {
		name string
		got  Interval
		want *big.Float
	}{
		{"Pi", Pi, pi},
		{"TwoPi", TwoPi, two(pi)},
		{"SqrtPi", SqrtPi, sqrt(pi)},
		{"SqrtTwoPi", SqrtTwoPi, sqrt(two(pi))},
		{"e", Interval{eLo, eHi}, e},
		{"e²", Interval{e2Lo, e2Hi}, refExp(bint(2, 64))},
		{"ln 2", Interval{ln2Lo, ln2Hi}, refLn2()},
	}
	for _, tt := range tests {
		if !bigContains(tt.got.Lo, tt.got.Hi, tt.want) {
			t.Errorf("%s = %v, want ∋ %s", tt.name, tt.got, tt.want.Text('g', 25))
		}
		if tt.got.RelWidth() > 0x1p-50 {
			t.Errorf("%s = %v: relative width %g, want ≤ 2^-50", tt.name, tt.got, tt.got.RelWidth())
		}
	}
}

// TestElementarySpecial checks infinite, empty-domain and overflowing
// arguments: the results are the documented ones and never NaN.
func TestElementarySpecial(t *testing.T) {
	t.Parallel()
	max := math.MaxFloat64
	ent := Entire()
	tests := []struct {
		name string
		got  Interval
		want Interval
	}{
		{"Exp(1e300)", Exp(Point(1e300)), Interval{max, inf}},
		{"Exp(710)", Exp(Point(710)), Interval{max, inf}},
		{"Exp(Entire)", Exp(ent), Interval{0, inf}},
		{"Expm1(Entire)", Expm1(ent), Interval{-1, inf}},
		{"Log([-1,0])", Log(Interval{-1, 0}), ent},
		{"Log([0,1]).Lo", Interval{Log(Interval{0, 1}).Lo, 0}, Interval{-inf, 0}},
		{"Log1p([-3,-1])", Log1p(Interval{-3, -1}), ent},
		{"Sqrt([-4,4])", Sqrt(Interval{-4, 4}), Interval{0, 2}},
		{"Sqrt([-4,-1])", Sqrt(Interval{-4, -1}), Point(0)},
		{"Sqrt([0,Inf])", Sqrt(Interval{0, inf}), Interval{0, inf}},
		{"Sin(Entire)", Sin(ent), Interval{-1, 1}},
		{"Cos([-Inf,0])", Cos(Interval{-inf, 0}), Interval{-1, 1}},
		{"Sin([0,7])", Sin(Interval{0, 7}), Interval{-1, 1}},
		{"Cos(Point(Inf))", Cos(Point(inf)), Interval{-1, 1}},
		{"Sinh(Entire)", Sinh(ent), ent},
		{"Sinh(1e300)", Sinh(Point(1e300)), Interval{nextDown(max), inf}},
		{"Cosh(Entire)", Cosh(ent), Interval{1, inf}},
		{"Cosh(-1e300)", Cosh(Point(-1e300)), Interval{max, inf}},
		{"Tanh(Entire)", Tanh(ent), Interval{-1, 1}},
		{"Sech(Entire).Hi", Interval{0, Sech(ent).Hi}, Interval{0, 1}},
		{"Erf(Entire)", Erf(ent), Interval{-1, 1}},
		{"Erfc(Entire)", Erfc(ent), Interval{0, 2}},
		{"Pow([0,0],2)", Pow(Point(0), 2), Point(0)},
		{"Pow([-3,0],-2)", Pow(Interval{-3, 0}, -2), Interval{max, inf}},
		{"Pow([0,4],-0.5)", Pow(Interval{0, 4}, -0.5), Interval{0.5, inf}},
		{"Pow([0,4],0.5)", Pow(Interval{0, 4}, 0.5), Interval{0, 2}},
		{"Pow([-1,4],1.5)", Pow(Interval{-1, 4}, 1.5), Interval{0, 8}},
		{"Pow([2,2],-3)", Pow(Point(2), -3), Point(0.125)},
		{"Pow(x,0)", Pow(Interval{-1, 5}, 0), Point(1)},
		{"Pow(x,NaN)", Pow(Interval{1, 5}, math.NaN()), ent},
	}
	for _, tt := range tests {
		if tt.got != tt.want {
			t.Errorf("%s = %v, want %v", tt.name, tt.got, tt.want)
		}
	}
	if z := Exp(Point(-inf)); z.Lo != 0 || z.Hi > 0x1p-1059 {
		t.Errorf("Exp(-Inf) = %v, want [0, tiny]", z)
	}
	if z := Sech(Point(inf)); z.Lo != 0 || z.Hi > 0x1p-1058 {
		t.Errorf("Sech(Inf) = %v, want [0, tiny]", z)
	}
}

// TestPow checks Pow against e^(p ln x) in math/big on random points and
// intervals, for integer, half-integer and general exponents.
func TestPow(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(13, 14))
	n := 800
	if testing.Short() {
		n = 150
	}
	var widths []float64
	for i := 0; i < n; i++ {
		var p float64
		switch r.IntN(3) {
		case 0:
			p = float64(r.IntN(41) - 20)
		case 1:
			p = float64(r.IntN(41)-20) + 0.5
		default:
			p = randUniform(r, -20, 20)
		}
		a := math.Abs(randLog(r, -30, 30))
		if math.Abs(p*math.Log(a)) > 700 {
			continue
		}
		x := Point(a)
		if r.IntN(3) == 0 {
			x = Span(a, a*(1+randUniform(r, 0, 0.5)))
		}
		z := Pow(x, p)
		if x.Lo == x.Hi && p != 0 {
			widths = append(widths, z.RelWidth())
		}
		for _, v := range samplePoints(r, x, 3) {
			checkEnclosure(t, fmt.Sprintf("Pow(%v, %g) at %g", x, p, v), z, refPow(v, p))
		}
	}
	slices.Sort(widths)
	t.Logf("Pow on points: median relative width %.3g, max %.3g", widths[len(widths)/2], widths[len(widths)-1])
}

// A fuzzFunc pairs an interval function with a float64 evaluation that is
// within a few ulps of the truth where it is defined (NaN where not, or
// where no such evaluation is at hand), and a relative slack for
// evaluations that accumulate more rounding than that.
type fuzzFunc struct {
	name  string
	iv    func(x Interval, p float64) Interval
	f64   func(v, p float64) float64
	slack float64
}

// e2f64 is e² rounded to float64, for float64 evaluations beyond 709.
const e2f64 = 7.38905609893065

func fuzzFuncs() []fuzzFunc {
	iv := func(f func(Interval) Interval) func(Interval, float64) Interval {
		return func(x Interval, _ float64) Interval { return f(x) }
	}
	expF := func(v float64) float64 {
		if v > expDirect {
			return math.Exp(v-2) * e2f64 // math.Exp overflows early on amd64
		}
		return math.Exp(v)
	}
	return []fuzzFunc{
		{"Exp", iv(Exp), func(v, _ float64) float64 { return expF(v) }, 0},
		{"Expm1", iv(Expm1), func(v, _ float64) float64 {
			if v > expDirect {
				return expF(v)
			}
			return math.Expm1(v)
		}, 0},
		{"Log", iv(Log), func(v, _ float64) float64 {
			if v > 0 && v < 0x1p-1022 {
				return math.Log(v*0x1p54) - 54*math.Ln2 // Go issue 56600
			}
			return math.Log(v)
		}, 0},
		{"Log1p", iv(Log1p), func(v, _ float64) float64 { return math.Log1p(v) }, 0},
		{"Sqrt", iv(Sqrt), func(v, _ float64) float64 { return math.Sqrt(v) }, 0},
		{"Sin", iv(Sin), func(v, _ float64) float64 { return math.Sin(v) }, 0},
		{"Cos", iv(Cos), func(v, _ float64) float64 { return math.Cos(v) }, 0},
		{"Sinh", iv(Sinh), func(v, _ float64) float64 {
			if math.Abs(v) > hypDirect {
				return math.Copysign(expF(math.Abs(v))/2, v)
			}
			return math.Sinh(v)
		}, 0},
		{"Cosh", iv(Cosh), func(v, _ float64) float64 {
			if math.Abs(v) > hypDirect {
				return expF(math.Abs(v)) / 2
			}
			return math.Cosh(v)
		}, 0},
		{"Tanh", iv(Tanh), func(v, _ float64) float64 { return math.Tanh(v) }, 0},
		{"Sech", iv(Sech), func(v, _ float64) float64 {
			if math.Abs(v) > hypDirect {
				return 2 * math.Exp(-math.Abs(v))
			}
			return 1 / math.Cosh(v)
		}, 0},
		{"Erf", iv(Erf), func(v, _ float64) float64 { return math.Erf(v) }, 0},
		{"Erfc", iv(Erfc), func(v, _ float64) float64 { return math.Erfc(v) }, 0},
		{"Pow", Pow, func(v, p float64) float64 {
			if v < 0x1p-1022 || math.Abs(p) > 1e6 {
				return math.NaN() // math.Pow calls math.Log: wrong at subnormal v on amd64
			}
			return math.Pow(v, p)
		}, 1e-12},
		{"Sinc", iv(Sinc), func(v, _ float64) float64 {
			if v == 0 {
				return 1
			}
			return math.Sin(v) / v
		}, 0},
		{"Sinhc", iv(Sinhc), func(v, _ float64) float64 {
			switch {
			case v == 0:
				return 1
			case math.Abs(v) > 700:
				return math.NaN()
			}
			return math.Sinh(v) / v
		}, 0},
		{"XOverSinh", iv(XOverSinh), func(v, _ float64) float64 {
			switch {
			case v == 0:
				return 1
			case math.Abs(v) > 700:
				return 0
			}
			return v / math.Sinh(v)
		}, 0},
		{"SinhcSqrt", iv(SinhcSqrt), func(v, _ float64) float64 {
			switch {
			case v == 0:
				return 1
			case v > 0 && v < 4e5:
				return math.Sinh(math.Sqrt(v)) / math.Sqrt(v)
			case v < 0:
				return math.Sin(math.Sqrt(-v)) / math.Sqrt(-v)
			}
			return math.NaN()
		}, 0},
		{"BesselI0", iv(BesselI0), func(v, _ float64) float64 {
			if math.Abs(v) > 700 {
				return math.NaN()
			}
			q, t, s := v*v/4, 1.0, 1.0
			for k := 1.0; t > s*0x1p-60 || k*k < q; k++ {
				t *= q / (k * k)
				s += t
			}
			return s
		}, 1e-12},
		{"Cis.Re", func(x Interval, _ float64) Interval { return Cis(x).Re }, func(v, _ float64) float64 { return math.Cos(v) }, 0},
		{"Cis.Im", func(x Interval, _ float64) Interval { return Cis(x).Im }, func(v, _ float64) float64 { return math.Sin(v) }, 0},
	}
}

// FuzzElementary checks that no elementary or special function returns NaN
// or an inverted interval, and that each contains a float64 evaluation at
// a point of its argument (a weak but fast check; the containment proofs
// are the math/big tests above). The seeds run in every go test.
func FuzzElementary(f *testing.F) {
	fs := fuzzFuncs()
	seeds := [][3]float64{
		{0, 0, 2}, {1, 2, 0.5}, {-745.2, 710, -1.5}, {709.5, 709.5, 3}, {1e300, 1e300, -0.5},
		{-1, 1e-300, 7}, {5e-324, 5e-324, 0.25}, {26.5, 28, 2}, {0x1p29, 0x1p29, 1}, {-21, 22, 1},
		{math.Inf(-1), math.Inf(1), 0}, {-1e5, -20, 1}, {700, 716, 1}, {math.Pi / 2, math.Pi / 2, 2},
	}
	for i := range fs {
		for _, s := range seeds {
			f.Add(s[0], s[1], s[2], uint8(i))
		}
	}
	f.Fuzz(func(t *testing.T, a, b, p float64, which uint8) {
		if a != a || b != b || p != p {
			return
		}
		fz := fs[int(which)%len(fs)]
		x := Span(a, b)
		z := fz.iv(x, p)
		if !checkValid(t, fmt.Sprintf("%s(%v, %g)", fz.name, x, p), z) {
			return
		}
		m := x.Mid()
		v := fz.f64(m, p)
		if v != v {
			return
		}
		s := 0.0
		if fz.slack > 0 && !math.IsInf(v, 0) {
			s = fz.slack * math.Abs(v)
		}
		if !(z.Lo <= v+s && v-s <= z.Hi) {
			t.Errorf("%s(%v, %g) = %v, want ∋ float64 value %g at %g", fz.name, x, p, z, v, m)
		}
	})
}
