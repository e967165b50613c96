// Package bigref computes high-precision reference values with math/big for
// the tests of foldbound. It is independent of the engine: nothing here
// uses interval arithmetic or the engine's formulas, so a test that checks
// an enclosure against a value from bigref checks it against an outside
// computation.
//
// All functions work at Prec bits (about 96 decimal digits) unless a
// precision is given, using textbook series: Taylor series with argument
// halving for exp, Newton's method on exp for log, Taylor series after
// reduction by 2π for sin and cos, Machin's formula for π
// (π/4 = 4·atan(1/5) - atan(1/239)), and the power series of I0
// (DLMF 10.25.2).
package bigref

import (
	"math"
	"math/big"
	"sync"
)

// Prec is the working precision of the reference values, in bits.
const Prec = 320

// guard is the number of extra bits carried inside each function.
const guard = 64

// New returns x as a big.Float at Prec bits (exactly).
func New(x float64) *big.Float { return new(big.Float).SetPrec(Prec).SetFloat64(x) }

// Int returns the integer n at Prec bits.
func Int(n int64) *big.Float { return new(big.Float).SetPrec(Prec).SetInt64(n) }

func newp(prec uint) *big.Float { return new(big.Float).SetPrec(prec) }

// Add returns a + b.
func Add(a, b *big.Float) *big.Float { return newp(Prec).Add(a, b) }

// Sub returns a - b.
func Sub(a, b *big.Float) *big.Float { return newp(Prec).Sub(a, b) }

// Mul returns a·b.
func Mul(a, b *big.Float) *big.Float { return newp(Prec).Mul(a, b) }

// Quo returns a/b.
func Quo(a, b *big.Float) *big.Float { return newp(Prec).Quo(a, b) }

// Neg returns -a.
func Neg(a *big.Float) *big.Float { return newp(Prec).Neg(a) }

// Abs returns |a|.
func Abs(a *big.Float) *big.Float { return newp(Prec).Abs(a) }

// Sqrt returns √a for a ≥ 0.
func Sqrt(a *big.Float) *big.Float {
	if a.Sign() == 0 {
		return newp(Prec)
	}
	return newp(Prec).Sqrt(a)
}

// Float64 returns the nearest float64 to a.
func Float64(a *big.Float) float64 {
	f, _ := a.Float64()
	return f
}

// In reports whether lo ≤ v ≤ hi.
func In(lo, hi float64, v *big.Float) bool {
	if math.IsNaN(lo) || math.IsNaN(hi) {
		return false
	}
	if !math.IsInf(lo, -1) && v.Cmp(New(lo)) < 0 {
		return false
	}
	if !math.IsInf(hi, 1) && v.Cmp(New(hi)) > 0 {
		return false
	}
	return true
}

// RelErr returns |a - b|/|b| as a float64 (|a - b| if b = 0).
func RelErr(a, b *big.Float) float64 {
	d := Abs(Sub(a, b))
	if b.Sign() == 0 {
		return Float64(d)
	}
	return Float64(Quo(d, Abs(b)))
}

var piOnce = sync.OnceValue(func() *big.Float {
	p := uint(Prec + guard)
	five := atanInv(5, p)
	two39 := atanInv(239, p)
	r := newp(p).Mul(five, big.NewFloat(16).SetPrec(p))
	r.Sub(r, newp(p).Mul(two39, big.NewFloat(4).SetPrec(p)))
	return r
})

// Pi returns π at Prec+64 bits. The result must not be modified.
func Pi() *big.Float { return piOnce() }

// atanInv returns atan(1/n) = Σ (-1)^k / ((2k+1) n^{2k+1}).
func atanInv(n int64, prec uint) *big.Float {
	sum := newp(prec)
	nn := newp(prec).SetInt64(n * n)
	pow := newp(prec).Quo(newp(prec).SetInt64(1), newp(prec).SetInt64(n)) // 1/n^{2k+1}
	eps := newp(prec).SetMantExp(big.NewFloat(1), -int(prec)-4)
	for k := int64(0); ; k++ {
		term := newp(prec).Quo(pow, newp(prec).SetInt64(2*k+1))
		if k%2 == 0 {
			sum.Add(sum, term)
		} else {
			sum.Sub(sum, term)
		}
		if term.Cmp(eps) < 0 {
			return sum
		}
		pow.Quo(pow, nn)
	}
}

// Exp returns e^x by the Taylor series of e^{x/2^n}, squared n times.
func Exp(x *big.Float) *big.Float {
	if x.Sign() == 0 {
		return Int(1)
	}
	n := 0
	if e := x.MantExp(nil); e > -8 {
		n = e + 8
	}
	p := uint(Prec + guard + n)
	y := newp(p).SetMantExp(newp(p).Set(x), -n)
	sum := newp(p).SetInt64(1)
	term := newp(p).SetInt64(1)
	eps := newp(p).SetMantExp(big.NewFloat(1), -int(p)-4)
	for k := int64(1); ; k++ {
		term.Mul(term, y)
		term.Quo(term, newp(p).SetInt64(k))
		sum.Add(sum, term)
		if newp(p).Abs(term).Cmp(eps) < 0 {
			break
		}
	}
	for i := 0; i < n; i++ {
		sum.Mul(sum, sum)
	}
	return newp(Prec).Set(sum)
}

// Log returns ln x for x > 0 by Newton's method on exp, started from the
// float64 logarithm of the mantissa.
func Log(x *big.Float) *big.Float {
	if x.Sign() <= 0 {
		panic("bigref: Log of a non-positive number")
	}
	mant := newp(Prec + guard)
	e := x.MantExp(mant) // x = mant·2^e, mant in [0.5, 1)
	lm := logNewton(mant)
	if e == 0 {
		return newp(Prec).Set(lm)
	}
	ln2 := logNewton(newp(Prec + guard).SetInt64(2))
	r := newp(Prec+guard).Mul(ln2, newp(Prec+guard).SetInt64(int64(e)))
	return newp(Prec).Add(r, lm)
}

func logNewton(x *big.Float) *big.Float {
	f, _ := x.Float64()
	y := newp(Prec + guard).SetFloat64(math.Log(f))
	for i := 0; i < 5; i++ {
		// y ← y + 2(x - e^y)/(x + e^y) (Halley's step, cubic convergence)
		ey := Exp(y)
		num := newp(Prec+guard).Sub(x, ey)
		den := newp(Prec+guard).Add(x, ey)
		y.Add(y, newp(Prec+guard).Quo(num.Mul(num, big.NewFloat(2)), den))
	}
	return y
}

// reduce returns x - 2πk in [-π, π].
func reduce(x *big.Float) *big.Float {
	e := x.MantExp(nil)
	p := uint(Prec + guard)
	if e > 0 {
		p += uint(e)
	}
	twoPi := newp(p).Mul(Pi(), big.NewFloat(2))
	if e > 0 {
		// Pi() has Prec+guard bits; large arguments need more.
		twoPi = newp(p).Mul(piAt(p), big.NewFloat(2))
	}
	q := newp(p).Quo(x, twoPi)
	k, _ := q.Int(nil)
	kf := newp(p).SetInt(k)
	// round to nearest
	frac := newp(p).Sub(q, kf)
	if frac.Cmp(big.NewFloat(0.5)) > 0 {
		kf.Add(kf, big.NewFloat(1))
	} else if frac.Cmp(big.NewFloat(-0.5)) < 0 {
		kf.Sub(kf, big.NewFloat(1))
	}
	return newp(Prec+guard).Sub(x, newp(p).Mul(kf, twoPi))
}

func piAt(p uint) *big.Float {
	five := atanInv(5, p+16)
	two39 := atanInv(239, p+16)
	r := newp(p+16).Mul(five, big.NewFloat(16))
	return r.Sub(r, newp(p+16).Mul(two39, big.NewFloat(4)))
}

// Sin returns sin x.
func Sin(x *big.Float) *big.Float { return sinCos(x, true) }

// Cos returns cos x.
func Cos(x *big.Float) *big.Float { return sinCos(x, false) }

func sinCos(x *big.Float, sin bool) *big.Float {
	p := uint(Prec + guard)
	y := reduce(x)
	y2 := newp(p).Mul(y, y)
	var term *big.Float
	var k int64
	if sin {
		term = newp(p).Set(y)
		k = 1
	} else {
		term = newp(p).SetInt64(1)
		k = 0
	}
	sum := newp(p).Set(term)
	eps := newp(p).SetMantExp(big.NewFloat(1), -int(p)-4)
	for {
		term.Mul(term, y2)
		term.Quo(term, newp(p).SetInt64((k+1)*(k+2)))
		term.Neg(term)
		k += 2
		sum.Add(sum, term)
		if newp(p).Abs(term).Cmp(eps) < 0 {
			return newp(Prec).Set(sum)
		}
	}
}

// Sinh returns sinh x.
func Sinh(x *big.Float) *big.Float {
	if x.Sign() == 0 {
		return Int(0)
	}
	if x.MantExp(nil) < -4 {
		// Taylor series avoids cancellation for small |x|.
		p := uint(Prec + guard)
		x2 := newp(p).Mul(x, x)
		term := newp(p).Set(x)
		sum := newp(p).Set(x)
		eps := newp(p).SetMantExp(newp(p).Abs(x), -int(p)-4)
		for k := int64(1); ; k += 2 {
			term.Mul(term, x2)
			term.Quo(term, newp(p).SetInt64((k+1)*(k+2)))
			sum.Add(sum, term)
			if newp(p).Abs(term).Cmp(eps) < 0 {
				return newp(Prec).Set(sum)
			}
		}
	}
	e := Exp(x)
	r := Sub(e, Quo(Int(1), e))
	return r.Quo(r, big.NewFloat(2))
}

// Cosh returns cosh x.
func Cosh(x *big.Float) *big.Float {
	e := Exp(x)
	r := Add(e, Quo(Int(1), e))
	return r.Quo(r, big.NewFloat(2))
}

// Sech returns 1/cosh x.
func Sech(x *big.Float) *big.Float { return Quo(Int(1), Cosh(x)) }

// Tanh returns tanh x.
func Tanh(x *big.Float) *big.Float { return Quo(Sinh(x), Cosh(x)) }

// BesselI0 returns I0(x) = Σ_k (x²/4)^k/(k!)² (DLMF 10.25.2).
func BesselI0(x *big.Float) *big.Float {
	p := uint(Prec + guard)
	q := newp(p).Mul(x, x)
	q.Quo(q, big.NewFloat(4))
	term := newp(p).SetInt64(1)
	sum := newp(p).SetInt64(1)
	eps := newp(p).SetMantExp(big.NewFloat(1), -int(p)-4)
	for k := int64(1); ; k++ {
		term.Mul(term, q)
		term.Quo(term, newp(p).SetInt64(k*k))
		sum.Add(sum, term)
		if newp(p).Quo(term, sum).Cmp(eps) < 0 && newp(p).SetInt64(k*k).Cmp(q) > 0 {
			return newp(Prec).Set(sum)
		}
	}
}

// Complex is a complex number with big.Float parts.
type Complex struct{ Re, Im *big.Float }

// C returns re + i·im from float64 parts.
func C(re, im float64) Complex { return Complex{New(re), New(im)} }

// Real returns x + i·0.
func Real(x *big.Float) Complex { return Complex{x, Int(0)} }

// Add returns z + w.
func (z Complex) Add(w Complex) Complex { return Complex{Add(z.Re, w.Re), Add(z.Im, w.Im)} }

// Sub returns z - w.
func (z Complex) Sub(w Complex) Complex { return Complex{Sub(z.Re, w.Re), Sub(z.Im, w.Im)} }

// Mul returns z·w.
func (z Complex) Mul(w Complex) Complex {
	return Complex{
		Sub(Mul(z.Re, w.Re), Mul(z.Im, w.Im)),
		Add(Mul(z.Re, w.Im), Mul(z.Im, w.Re)),
	}
}

// Scale returns a·z for real a.
func (z Complex) Scale(a *big.Float) Complex { return Complex{Mul(z.Re, a), Mul(z.Im, a)} }

// Abs returns |z|.
func (z Complex) Abs() *big.Float { return Sqrt(Add(Mul(z.Re, z.Re), Mul(z.Im, z.Im))) }

// Cis returns e^{iθ}.
func Cis(theta *big.Float) Complex { return Complex{Cos(theta), Sin(theta)} }

// In reports whether both parts of z lie in the rectangle
// [reLo, reHi] × [imLo, imHi].
func (z Complex) In(reLo, reHi, imLo, imHi float64) bool {
	return In(reLo, reHi, z.Re) && In(imLo, imHi, z.Im)
}
