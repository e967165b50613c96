package bounds

// High-precision references for the tests of rounding.go, interval.go,
// elementary.go, specialfunc.go and complex.go. The reference functions use
// math/big only, so that no value in them depends on package math or on the
// code under test (package math only generates random inputs).
//
// Every function returns a *big.Float with at least refPrec correct bits
// (relative, or absolute 2^-refPrec·|largest intermediate| where stated);
// refPrec = 320 is far beyond the 53 bits the enclosures are tested at, so
// comparing an enclosure endpoint against the reference decides containment
// unless the truth lies within 2^-300 (relative) of a float64, which only
// happens at the exact special values (exp 0 = 1, sin 0 = 0, …) that the
// references below return exactly.

import (
	"math"
	"math/big"
	"math/rand/v2"
	"sync"
	"testing"
)

const (
	refPrec  = 320
	workPrec = refPrec + 64
	// piPrec carries π far enough for the reduction of any float64
	// (|x| < 2^1024) by π/2 to keep workPrec bits.
	piPrec = 1024 + workPrec + 64
)

func newF(prec uint) *big.Float { return new(big.Float).SetPrec(prec) }

// bf returns x exactly at precision prec (≥ 53).
func bf(x float64, prec uint) *big.Float { return newF(prec).SetFloat64(x) }

func bint(n int64, prec uint) *big.Float { return newF(prec).SetInt64(n) }

// negligible reports whether |t| < 2^-prec·|s| (t can no longer change s
// at precision prec), treating t = 0 as negligible.
func negligible(t, s *big.Float, prec uint) bool {
	if t.Sign() == 0 {
		return true
	}
	if s.Sign() == 0 {
		return false
	}
	return t.MantExp(nil) < s.MantExp(nil)-int(prec)
}

// atanInv returns atan(1/n) = Σ (-1)^k / ((2k+1) n^(2k+1)) (Gregory series).
func atanInv(n int64, prec uint) *big.Float {
	wp := prec + 32
	nn := bint(n*n, wp)
	pow := newF(wp).Quo(bint(1, wp), bint(n, wp)) // 1/n^(2k+1)
	sum := newF(wp).Set(pow)
	for k := int64(1); ; k++ {
		pow.Quo(pow, nn)
		t := newF(wp).Quo(pow, bint(2*k+1, wp))
		if negligible(t, sum, wp) {
			break
		}
		if k%2 == 1 {
			sum.Sub(sum, t)
		} else {
			sum.Add(sum, t)
		}
	}
	return sum
}

// atanhInv returns atanh(1/n) = Σ 1 / ((2k+1) n^(2k+1)).
func atanhInv(n int64, prec uint) *big.Float {
	wp := prec + 32
	nn := bint(n*n, wp)
	pow := newF(wp).Quo(bint(1, wp), bint(n, wp))
	sum := newF(wp).Set(pow)
	for k := int64(1); ; k++ {
		pow.Quo(pow, nn)
		t := newF(wp).Quo(pow, bint(2*k+1, wp))
		if negligible(t, sum, wp) {
			break
		}
		sum.Add(sum, t)
	}
	return sum
}

// machinPi returns π = 16 atan(1/5) - 4 atan(1/239) (Machin, 1706).
func machinPi(prec uint) *big.Float {
	a := atanInv(5, prec)
	b := atanInv(239, prec)
	a.Mul(a, bint(16, a.Prec()))
	b.Mul(b, bint(4, b.Prec()))
	return a.Sub(a, b)
}

// eulerPi returns π = 4 (atan(1/2) + atan(1/3)) (Euler/Hutton), an
// independent check on machinPi.
func eulerPi(prec uint) *big.Float {
	a := atanInv(2, prec)
	a.Add(a, atanInv(3, prec))
	return a.Mul(a, bint(4, a.Prec()))
}

var (
	refPi    = sync.OnceValue(func() *big.Float { return machinPi(piPrec) })
	refLn2   = sync.OnceValue(func() *big.Float { l := atanhInv(3, 2*workPrec); return l.Mul(l, bint(2, l.Prec())) }) // ln 2 = 2 atanh(1/3)
	refSqrtP = sync.OnceValue(func() *big.Float { return newF(workPrec).Sqrt(newF(workPrec).Set(refPi())) })
)

// refExp returns e^x. |x| must be below 2^40.
func refExp(x *big.Float) *big.Float {
	const halvings = 12
	wp := uint(workPrec + halvings + 16)
	if x.Sign() == 0 {
		return bint(1, wp)
	}
	ln2 := refLn2()
	// n = round(x/ln 2), r = x - n ln 2, |r| ≤ ln2/2.
	q := newF(wp).Quo(x, ln2)
	q.Add(q, newF(wp).SetFloat64(0.5))
	n, _ := q.Int64()
	if q.Sign() < 0 && !q.IsInt() {
		n-- // floor
	}
	r := newF(2*workPrec).Mul(bint(n, 2*workPrec), ln2)
	r.Sub(newF(2*workPrec).Set(x), r)
	r.SetPrec(wp)
	r.SetMantExp(r, -halvings)
	// Taylor series of e^r - 1 (keeps relative precision under squaring).
	term := newF(wp).Set(r)
	sum := newF(wp).Set(r)
	for k := int64(2); ; k++ {
		term.Mul(term, r)
		term.Quo(term, bint(k, wp))
		if negligible(term, sum, wp) {
			break
		}
		sum.Add(sum, term)
	}
	// (e^r - 1) → (e^(2r) - 1) = (e^r - 1)(e^r - 1 + 2).
	two := bint(2, wp)
	for i := 0; i < halvings; i++ {
		t := newF(wp).Add(sum, two)
		sum.Mul(sum, t)
	}
	sum.Add(sum, bint(1, wp))
	return sum.SetMantExp(sum, int(n))
}

// refExpm1 returns e^x - 1 with full relative precision near 0.
func refExpm1(x *big.Float) *big.Float {
	wp := uint(workPrec)
	if x.Sign() == 0 {
		return newF(wp)
	}
	if x.MantExp(nil) > -1 { // |x| ≥ 0.5
		e := refExp(x)
		return e.Sub(e, bint(1, e.Prec()))
	}
	term := newF(wp).Set(x)
	sum := newF(wp).Set(x)
	for k := int64(2); ; k++ {
		term.Mul(term, x)
		term.Quo(term, bint(k, wp))
		if negligible(term, sum, wp) {
			break
		}
		sum.Add(sum, term)
	}
	return sum
}

// atanhSeries returns atanh t = Σ t^(2k+1)/(2k+1) for |t| ≤ 1/2.
func atanhSeries(t *big.Float, wp uint) *big.Float {
	if t.Sign() == 0 {
		return newF(wp)
	}
	t2 := newF(wp).Mul(t, t)
	pow := newF(wp).Set(t)
	sum := newF(wp).Set(t)
	for k := int64(1); ; k++ {
		pow.Mul(pow, t2)
		term := newF(wp).Quo(pow, bint(2*k+1, wp))
		if negligible(term, sum, wp) {
			break
		}
		sum.Add(sum, term)
	}
	return sum
}

// refLog returns ln x for x > 0: x = m·2^e, m ∈ [1/2, 1),
// ln x = e ln 2 + 2 atanh((m-1)/(m+1)).
func refLog(x *big.Float) *big.Float {
	wp := uint(workPrec + 64)
	m := newF(wp)
	e := x.MantExp(m)
	if m.Cmp(newF(wp).SetFloat64(0.75)) < 0 { // keep |t| ≤ 1/5: m ∈ [3/4, 3/2)
		m.SetMantExp(m, 1)
		e--
	}
	one := bint(1, wp)
	t := newF(wp).Sub(m, one)
	t.Quo(t, newF(wp).Add(m, one))
	s := atanhSeries(t, wp)
	s.Mul(s, bint(2, wp))
	l := newF(2*workPrec).Mul(bint(int64(e), 2*workPrec), refLn2())
	return l.Add(l, s).SetPrec(wp)
}

// refLog1p returns ln(1+x) for x > -1, with full relative precision near 0:
// ln(1+x) = 2 atanh(x/(2+x)).
func refLog1p(x *big.Float) *big.Float {
	wp := uint(workPrec + 64)
	half := newF(wp).SetFloat64(0.5)
	if newF(wp).Abs(x).Cmp(half) >= 0 {
		return refLog(newF(4096).Add(x, bint(1, 4096)))
	}
	t := newF(wp).Quo(x, newF(wp).Add(x, bint(2, wp)))
	s := atanhSeries(t, wp)
	return s.Mul(s, bint(2, wp))
}

// refSinCos returns sin x and cos x. The argument is reduced exactly enough
// by π/2 at piPrec bits: x = kπ/2 + r, |r| ≤ π/4.
func refSinCos(x float64) (sin, cos *big.Float) { return refSinCosBig(bf(x, piPrec)) }

// refSinCosBig is refSinCos for |x| < 2^1024 given in high precision.
func refSinCosBig(x *big.Float) (sin, cos *big.Float) {
	wp := uint(workPrec)
	X := newF(piPrec).Set(x)
	halfPi := newF(piPrec).Set(refPi())
	halfPi.SetMantExp(halfPi, -1)
	q := newF(piPrec).Quo(X, halfPi)
	q.Add(q, newF(piPrec).SetFloat64(0.5))
	k, _ := q.Int(nil) // truncates toward zero
	if q.Sign() < 0 && !q.IsInt() {
		k.Sub(k, big.NewInt(1))
	}
	r := newF(piPrec).Mul(newF(piPrec).SetInt(k), halfPi)
	r.Sub(X, r)
	r.SetPrec(wp)
	s, c := sinCosSeries(r, wp)
	switch new(big.Int).Mod(k, big.NewInt(4)).Int64() {
	case 0:
		return s, c
	case 1:
		return c, s.Neg(s)
	case 2:
		return s.Neg(s), c.Neg(c)
	default:
		return c.Neg(c), s
	}
}

// sinCosSeries returns the Taylor series of sin r and cos r, |r| ≤ 1.
func sinCosSeries(r *big.Float, wp uint) (sin, cos *big.Float) {
	r2 := newF(wp).Mul(r, r)
	sin = newF(wp).Set(r)
	term := newF(wp).Set(r)
	for k := int64(1); r.Sign() != 0; k++ {
		term.Mul(term, r2)
		term.Quo(term, bint((2*k)*(2*k+1), wp))
		term.Neg(term)
		if negligible(term, sin, wp) {
			break
		}
		sin.Add(sin, term)
	}
	cos = bint(1, wp)
	term = bint(1, wp)
	for k := int64(1); r.Sign() != 0; k++ {
		term.Mul(term, r2)
		term.Quo(term, bint((2*k-1)*(2*k), wp))
		term.Neg(term)
		if negligible(term, cos, wp) {
			break
		}
		cos.Add(cos, term)
	}
	return sin, cos
}

// refSinh returns sinh x: its Taylor series for |x| < 1 (no cancellation),
// (e^x - e^-x)/2 otherwise.
func refSinh(x *big.Float) *big.Float {
	wp := uint(workPrec)
	if x.MantExp(nil) <= 0 { // |x| < 1
		x2 := newF(wp).Mul(x, x)
		sum := newF(wp).Set(x)
		term := newF(wp).Set(x)
		for k := int64(1); x.Sign() != 0; k++ {
			term.Mul(term, x2)
			term.Quo(term, bint((2*k)*(2*k+1), wp))
			if negligible(term, sum, wp) {
				break
			}
			sum.Add(sum, term)
		}
		return sum
	}
	a := refExp(x)
	b := refExp(newF(wp).Neg(x))
	a.Sub(a, b)
	return a.SetMantExp(a, -1)
}

// refCosh returns cosh x = (e^x + e^-x)/2.
func refCosh(x *big.Float) *big.Float {
	a := refExp(x)
	b := refExp(newF(workPrec).Neg(x))
	a.Add(a, b)
	return a.SetMantExp(a, -1)
}

// refTanh returns tanh x = sinh x / cosh x.
func refTanh(x *big.Float) *big.Float {
	s := refSinh(x)
	return s.Quo(s, refCosh(x))
}

// refErfTaylor returns erf x by its Maclaurin series (DLMF 7.6.1)
//
//	erf x = (2/√π) Σ (-1)^n x^(2n+1) / (n! (2n+1)),
//
// carrying extra bits for the cancellation (terms reach about e^(x²)).
func refErfTaylor(x float64) *big.Float {
	wp := uint(workPrec + 64 + 2*x*x)
	X := bf(x, wp)
	x2 := newF(wp).Mul(X, X)
	pow := newF(wp).Set(X) // (-1)^n x^(2n+1)/n!
	sum := newF(wp).Set(X)
	for n := int64(1); x != 0; n++ {
		pow.Mul(pow, x2)
		pow.Quo(pow, bint(n, wp))
		pow.Neg(pow)
		t := newF(wp).Quo(pow, bint(2*n+1, wp))
		if t.MantExp(nil) < -int(wp) {
			break
		}
		sum.Add(sum, t)
	}
	sum.Mul(sum, bint(2, wp))
	return sum.Quo(sum, refSqrtP())
}

// refErfPositive returns erf x by the series of positive terms (DLMF 7.6.2)
//
//	erf x = (2/√π) e^(-x²) Σ 2^n x^(2n+1) / (1·3·5···(2n+1)),
//
// an independent check on refErfTaylor.
func refErfPositive(x float64) *big.Float { return refErfSeries(x, workPrec+32) }

// refErfSeries is refErfPositive at working precision wp.
func refErfSeries(x float64, wp uint) *big.Float {
	X := bf(x, wp)
	twoX2 := newF(wp).Mul(X, X)
	twoX2.SetMantExp(twoX2, 1)
	term := newF(wp).Set(X)
	sum := newF(wp).Set(X)
	for n := int64(1); x != 0; n++ {
		term.Mul(term, twoX2)
		term.Quo(term, bint(2*n+1, wp))
		if negligible(term, sum, wp) && n > int64(2*x*x) {
			break
		}
		sum.Add(sum, term)
	}
	sum.Mul(sum, refExp(newF(wp).Neg(bigSqr(X, wp))))
	sum.Mul(sum, bint(2, wp))
	return sum.Quo(sum, refSqrtP())
}

func bigSqr(x *big.Float, wp uint) *big.Float { return newF(wp).Mul(x, x) }

// refErfcCF returns erfc x for x ≥ 2 by the Laplace continued fraction
// (DLMF 7.9.2, from memory)
//
//	√π e^(x²) erfc x = 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + 2/(x + …))))),
//
// evaluated backward from depth N, doubling N until two depths agree to
// workPrec bits.
func refErfcCF(x float64) *big.Float {
	wp := uint(workPrec + 32)
	X := bf(x, wp)
	eval := func(n int64) *big.Float {
		t := newF(wp).Set(X)
		for k := n; k >= 1; k-- {
			a := newF(wp).SetFloat64(float64(k) / 2)
			t.Quo(a, t)
			t.Add(t, X)
		}
		return t.Quo(bint(1, wp), t)
	}
	prev := eval(32)
	for n := int64(64); ; n *= 2 {
		cur := eval(n)
		d := newF(wp).Sub(cur, prev)
		if negligible(d, cur, workPrec) {
			prev = cur
			break
		}
		if n > 1<<20 {
			panic("refErfcCF: no convergence")
		}
		prev = cur
	}
	prev.Mul(prev, refExp(newF(wp).Neg(bigSqr(X, wp))))
	return prev.Quo(prev, refSqrtP())
}

// erfcSwitch is where refErfc and refErf change from the series to the
// continued fraction, which converges fast from there on.
const erfcSwitch = 7

// refErfc returns erfc x: 1 - erf x (DLMF 7.6.2, with extra bits for the
// cancellation, erfc x ≈ e^(-x²)) for |x| < 7, the continued fraction for
// x ≥ 7 and 2 - erfc(-x) for x ≤ -7.
func refErfc(x float64) *big.Float {
	switch {
	case x >= erfcSwitch:
		return refErfcCF(x)
	case x <= -erfcSwitch:
		e := refErfcCF(-x)
		return e.Sub(bint(2, e.Prec()), e)
	}
	e := refErfSeries(x, uint(workPrec+32+1.5*x*x))
	return e.Sub(bint(1, e.Prec()), e)
}

// refErf returns erf x: the series DLMF 7.6.2 for |x| < 7, 1 - erfc x
// beyond.
func refErf(x float64) *big.Float {
	switch {
	case x >= erfcSwitch:
		e := refErfcCF(x)
		return e.Sub(bint(1, e.Prec()), e)
	case x <= -erfcSwitch:
		e := refErfcCF(-x)
		return e.Sub(e, bint(1, e.Prec()))
	}
	return refErfPositive(x)
}

// refPow returns x^p = e^(p ln x) for x > 0.
func refPow(x, p float64) *big.Float {
	l := refLog(bf(x, workPrec))
	l.Mul(l, bf(p, workPrec))
	return refExp(l)
}

// ulpsOff returns |r - ref| in units of the last place of ref as a float64
// (2^(e-53) for ref in [2^(e-1), 2^e), 2^-1074 in the subnormal range).
func ulpsOff(r float64, ref *big.Float) float64 {
	d := newF(workPrec).Sub(bf(r, workPrec), ref)
	d.Abs(d)
	e := ref.MantExp(nil)
	if ref.Sign() == 0 || e < -1021 {
		e = -1021
	}
	d.SetMantExp(d, 53-e)
	f, _ := d.Float64()
	return f
}

// contains reports whether lo ≤ ref ≤ hi.
func bigContains(lo, hi float64, ref *big.Float) bool {
	return bf(lo, 64).Cmp(ref) <= 0 && ref.Cmp(bf(hi, 64)) <= 0
}

// float64 of a reference, for failure messages.
func f64(r *big.Float) float64 { f, _ := r.Float64(); return f }

// Random inputs. All generators draw from a *rand.Rand seeded by the test.

// randSign returns ±1.
func randSign(r *rand.Rand) float64 {
	if r.IntN(2) == 0 {
		return -1
	}
	return 1
}

// randLog returns ±2^u, u uniform in [lo, hi] (log-uniform magnitude).
func randLog(r *rand.Rand, lo, hi float64) float64 {
	return randSign(r) * math.Exp2(lo+(hi-lo)*r.Float64())
}

// randUniform returns a uniform float in [lo, hi].
func randUniform(r *rand.Rand, lo, hi float64) float64 { return lo + (hi-lo)*r.Float64() }

// randBits returns a finite float64 with uniformly random bits.
func randBits(r *rand.Rand) float64 {
	for {
		if v := math.Float64frombits(r.Uint64()); !math.IsNaN(v) && !math.IsInf(v, 0) {
			return v
		}
	}
}

// randNear returns x moved by up to k ulps.
func randNear(r *rand.Rand, x float64, k int) float64 {
	for i := r.IntN(2*k+1) - k; i != 0; {
		if i > 0 {
			x = math.Nextafter(x, math.Inf(1))
			i--
		} else {
			x = math.Nextafter(x, math.Inf(-1))
			i++
		}
	}
	return x
}

// randFloat returns a float64 from a mixture covering all magnitudes,
// zeros, subnormals and the overflow threshold.
func randFloat(r *rand.Rand) float64 {
	switch r.IntN(10) {
	case 0:
		return randBits(r)
	case 1:
		return randLog(r, -1074, -1022) // subnormal
	case 2:
		return randLog(r, 1000, 1023.99)
	case 3:
		return randSign(r) * float64(r.IntN(20))
	case 4:
		return randSign(r) * math.Ldexp(float64(r.Int64N(1<<53)), -r.IntN(60)) // exact binary fractions
	case 5:
		return randUniform(r, -4, 4)
	default:
		return randLog(r, -60, 60)
	}
}

// parseRef parses a decimal constant at workPrec bits.
func parseRef(t *testing.T, s string) *big.Float {
	t.Helper()
	f, _, err := newF(workPrec).Parse(s, 10)
	if err != nil {
		t.Fatalf("parse %q: %v", s, err)
	}
	return f
}

// agreeBits reports whether a and b agree to n bits relative to |b|.
func agreeBits(a, b *big.Float, n uint) bool {
	d := newF(workPrec).Sub(a, b)
	return negligible(d, b, n)
}

// TestReferences checks the math/big references against published
// constants and identities, so that the containment tests rest on values
// independent of this code and of package math.
func TestReferences(t *testing.T) {
	t.Parallel()
	const bits = 280
	// Decimal digits are well known (from memory); 60 digits ≈ 199 bits.
	const digitsBits = 195
	tests := []struct {
		name string
		got  *big.Float
		want string
		bits uint
	}{
		{"Machin π vs Euler π", machinPi(workPrec), "", bits},
		{"π digits (OEIS A000796)", refPi(), "3.14159265358979323846264338327950288419716939937510582097494", digitsBits},
		{"e = exp(1) digits (OEIS A001113)", refExp(bint(1, 64)), "2.71828182845904523536028747135266249775724709369995957496697", digitsBits},
		{"ln 2 digits (OEIS A002162)", refLn2(), "0.693147180559945309417232121458176568075500134360255254120680", digitsBits},
		{"√π digits (OEIS A002161)", refSqrtP(), "1.77245385090551602729816748334114518279754945612238712821380", digitsBits},
		{"sin 1 digits (OEIS A049469)", first(refSinCos(1)), "0.841470984807896506652502321630298999622563060798371065672751", digitsBits},
		{"cos 1 digits (OEIS A049470)", second(refSinCos(1)), "0.540302305868139717400936607442976603732310420617922227670097", digitsBits},
		{"erf 1 digits (A&S Table 7.1 to 10 digits; OEIS A099286)", refErf(1), "0.842700792949714869341220635082609259296066997966302908459938", digitsBits},
	}
	for _, tt := range tests {
		want := eulerPi(workPrec)
		if tt.want != "" {
			want = parseRef(t, tt.want)
		}
		if !agreeBits(tt.got, want, tt.bits) {
			t.Errorf("%s: got %s, want %s", tt.name, tt.got.Text('g', 60), want.Text('g', 60))
		}
	}

	// Identities at random points.
	r := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 40; i++ {
		x := randUniform(r, -700, 700)
		X := bf(x, workPrec)
		// exp(ln(e^x)) = e^x and e^x e^-x = 1.
		e := refExp(X)
		if back := refExp(refLog(e)); !agreeBits(back, e, bits) {
			t.Errorf("exp(log(exp(%g))) = %s, want %s", x, back.Text('g', 30), e.Text('g', 30))
		}
		p := newF(workPrec).Mul(e, refExp(newF(workPrec).Neg(X)))
		if !agreeBits(p, bint(1, 64), bits) {
			t.Errorf("exp(%g)·exp(%g) = %s, want 1", x, -x, p.Text('g', 30))
		}
		// sin² + cos² = 1 (also at huge arguments).
		y := randFloat(r)
		s, c := refSinCos(y)
		q := newF(workPrec).Mul(s, s)
		q.Add(q, newF(workPrec).Mul(c, c))
		if !agreeBits(q, bint(1, 64), bits) {
			t.Errorf("sin²+cos² at %g = %s, want 1", y, q.Text('g', 30))
		}
		// cosh² - sinh² = 1.
		z := randUniform(r, -30, 30)
		Z := bf(z, workPrec)
		ch, sh := refCosh(Z), refSinh(Z)
		q = newF(workPrec).Mul(ch, ch)
		q.Sub(q, newF(workPrec).Mul(sh, sh))
		if !agreeBits(q, bint(1, 64), bits-2*uint(math.Abs(z)*1.45)) {
			t.Errorf("cosh²-sinh² at %g = %s, want 1", z, q.Text('g', 30))
		}
		// log1p(x) = log(1+x), expm1(x) = exp(x)-1 away from 0.
		u := randUniform(r, 0.5, 10)
		U := bf(u, workPrec)
		if a, b := refLog1p(U), refLog(bf(1+u, workPrec)); 1+u-1 == u && !agreeBits(a, b, bits) {
			t.Errorf("log1p(%g) = %s, want log(1+x) = %s", u, a.Text('g', 30), b.Text('g', 30))
		}
		w := randLog(r, -40, -2)
		W := bf(w, workPrec)
		em := refExpm1(W)
		em2 := refExp(W)
		em2.Sub(em2, bint(1, workPrec))
		if !agreeBits(em, em2, bits-50) {
			t.Errorf("expm1(%g) = %s, want exp(x)-1 = %s", w, em.Text('g', 30), em2.Text('g', 30))
		}
		if l := refLog1p(em); !agreeBits(l, W, bits-50) {
			t.Errorf("log1p(expm1(%g)) = %s", w, l.Text('g', 30))
		}
	}
	// erf: two independent series (DLMF 7.6.1, 7.6.2); erfc: continued
	// fraction (DLMF 7.9.2) against 1 - erf where both converge.
	for _, x := range []float64{1e-300, 0.1, 0.5, 0.84375, 1, 1.25, 2, 2.9, 4, 5.5} {
		a, b := refErfTaylor(x), refErfPositive(x)
		if !agreeBits(a, b, bits) {
			t.Errorf("erf(%g): DLMF 7.6.1 %s, 7.6.2 %s", x, a.Text('g', 30), b.Text('g', 30))
		}
	}
	for _, x := range []float64{2, 3, 4.5, 6} {
		cf := refErfcCF(x)
		e := refErfTaylor(x)
		e.Sub(bint(1, e.Prec()), e)
		if !agreeBits(cf, e, bits-20) {
			t.Errorf("erfc(%g): DLMF 7.9.2 %s, 1 - DLMF 7.6.1 %s", x, cf.Text('g', 30), e.Text('g', 30))
		}
	}
}

func first(a, _ *big.Float) *big.Float  { return a }
func second(_, b *big.Float) *big.Float { return b }
