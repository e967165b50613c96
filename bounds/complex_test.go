package bounds

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// randFiniteInterval returns a finite interval: a point, a thin interval or
// a wide one, with magnitudes from 2^-40 to 2^40 and now and then zero.
func randFiniteInterval(r *rand.Rand) Interval {
	a := randLog(r, -40, 40)
	switch r.IntN(5) {
	case 0:
		return Point(a)
	case 1:
		return Span(a, randNear(r, a, 8))
	case 2:
		return Span(0, a)
	}
	return Span(a, randLog(r, -40, 40))
}

func randComplex(r *rand.Rand) Complex {
	return Complex{randFiniteInterval(r), randFiniteInterval(r)}
}

// TestComplexMulContainment checks Complex.Mul, MulReal, Scale, Add, Sub
// and Conj against exact math/big arithmetic at sample points. Magnitudes
// stay within 2^±40, so 600 bits hold every sum of products exactly.
func TestComplexMulContainment(t *testing.T) {
	t.Parallel()
	const exactPrec = 600
	r := rand.New(rand.NewPCG(17, 18))
	for i := 0; i < 800; i++ {
		z, w := randComplex(r), randComplex(r)
		v := randLog(r, -20, 20)
		prod, sum, diff := z.Mul(w), z.Add(w), z.Sub(w)
		mr, sc, cj := z.MulReal(w.Re), z.Scale(v), z.Conj()
		for _, a := range samplePoints(r, z.Re, 1) {
			for _, b := range samplePoints(r, z.Im, 1) {
				A, B := bf(a, exactPrec), bf(b, exactPrec)
				for _, c := range samplePoints(r, w.Re, 0) {
					for _, d := range samplePoints(r, w.Im, 0) {
						C, D := bf(c, exactPrec), bf(d, exactPrec)
						re := newF(exactPrec).Sub(newF(exactPrec).Mul(A, C), newF(exactPrec).Mul(B, D))
						im := newF(exactPrec).Add(newF(exactPrec).Mul(A, D), newF(exactPrec).Mul(B, C))
						what := fmt.Sprintf("(%v)·(%v) at (%g%+gi)(%g%+gi)", z, w, a, b, c, d)
						checkEnclosure(t, what+" re", prod.Re, re)
						checkEnclosure(t, what+" im", prod.Im, im)
						checkEnclosure(t, "sum re", sum.Re, newF(exactPrec).Add(A, C))
						checkEnclosure(t, "diff im", diff.Im, newF(exactPrec).Sub(B, D))
						checkEnclosure(t, "MulReal re", mr.Re, newF(exactPrec).Mul(A, C))
						checkEnclosure(t, "MulReal im", mr.Im, newF(exactPrec).Mul(B, C))
					}
				}
				V := bf(v, exactPrec)
				checkEnclosure(t, "Scale re", sc.Re, newF(exactPrec).Mul(A, V))
				checkEnclosure(t, "Scale im", sc.Im, newF(exactPrec).Mul(B, V))
				checkEnclosure(t, "Conj im", cj.Im, newF(exactPrec).Neg(B))
			}
		}
	}
}

// TestComplexMagMig checks Mag ≥ max |w| and Mig ≤ min |w| over the box
// (attained at its corners nearest and farthest from 0), each within a few
// ulps, over magnitudes from 2^-1074 to 2^1023 (no overflow in Mag).
func TestComplexMagMig(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(19, 20))
	gen := func() Interval {
		a := randLog(r, -1074, 1023.9)
		if r.IntN(4) == 0 {
			return Span(a, randLog(r, -1074, 1023.9))
		}
		return Span(a, a*(1+r.Float64()))
	}
	for i := 0; i < 5000; i++ {
		z := Complex{gen(), gen()}
		if r.IntN(5) == 0 {
			z.Im = Point(0)
		}
		hyp := func(a, b float64) *big.Float {
			A, B := bf(a, exactPrec), bf(b, exactPrec)
			s := newF(exactPrec).Add(newF(exactPrec).Mul(A, A), newF(exactPrec).Mul(B, B))
			return s.Sqrt(s)
		}
		max := hyp(z.Re.Mag(), z.Im.Mag())
		min := hyp(z.Re.Mig(), z.Im.Mig())
		mag, mig := z.Mag(), z.Mig()
		if bf(mag, 64).Cmp(max) < 0 || bf(mig, 64).Cmp(min) > 0 {
			t.Errorf("%v: Mag %g, Mig %g, want Mag ≥ %s, Mig ≤ %s", z, mag, mig, max.Text('g', 20), min.Text('g', 20))
		}
		// Tightness: within 4 ulps where the result is normal.
		if f := f64(max); f > 0x1p-1000 && !math.IsInf(f, 0) && mag > f*(1+0x1p-50) {
			t.Errorf("%v: Mag %g, want within 4 ulps of %g", z, mag, f)
		}
		if f := f64(min); f > 0x1p-1000 && mig < f*(1-0x1p-50) {
			t.Errorf("%v: Mig %g, want within 4 ulps of %g", z, mig, f)
		}
		if a := z.Abs(); a.Lo != mig || a.Hi != mag {
			t.Errorf("%v.Abs() = %v, want [Mig, Mag]", z, a)
		}
	}
	if m := (Complex{Point(math.MaxFloat64), Point(math.MaxFloat64)}).Mag(); !math.IsInf(m, 1) {
		t.Errorf("Mag of (Max, Max) = %g, want +Inf (√2·Max overflows)", m)
	}
	if m := (Complex{Point(1e300), Point(1e300)}).Mag(); m > 1.4142135623730958e300 || m < 1.414213562373095e300 {
		t.Errorf("Mag of (1e300, 1e300) = %g, want √2·1e300", m)
	}
	if m := (Complex{Entire(), Point(0)}).Mag(); !math.IsInf(m, 1) {
		t.Errorf("Mag of Entire = %g, want +Inf", m)
	}
}

// TestCisContainment checks Cis against math/big sin and cos on points
// (including huge and near-multiple-of-π/2 phases) and on intervals.
func TestCisContainment(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(21, 22))
	gen := mix(uni(-10, 10), logu(-30, 40), nearHalfPi(40), logu(28, 31))
	n := 1500
	if testing.Short() {
		n = 300
	}
	var widths []float64
	for i := 0; i < n; i++ {
		a := gen(r)
		x := Point(a)
		if r.IntN(3) == 0 {
			x = Span(a, a+randLog(r, -40, 3))
		}
		c := Cis(x)
		if x.Lo == x.Hi && math.Abs(a) < 1e4 {
			widths = append(widths, math.Max(c.Re.Width(), c.Im.Width()))
		}
		ps := append(samplePoints(r, x, 3), halfPiMultiplesIn(x, 4)...)
		for _, p := range ps {
			s, co := refSinCos(p)
			checkEnclosure(t, fmt.Sprintf("Cis(%v).Re at %g", x, p), c.Re, co)
			checkEnclosure(t, fmt.Sprintf("Cis(%v).Im at %g", x, p), c.Im, s)
		}
		if x.Lo == x.Hi && (c.Re != Cos(x) || c.Im != Sin(x)) {
			t.Errorf("Cis(%v) = %v, want Cos, Sin = %v, %v (math.Sincos agrees with math.Sin, math.Cos)", x, c, Cos(x), Sin(x))
		}
	}
	var worst float64
	for _, w := range widths {
		worst = math.Max(worst, w)
	}
	// Thin phases as the alias sums form them: 2π·u·L in interval
	// arithmetic (width a few ulps of θ).
	var worstThin, worstExcess float64
	for i := 0; i < 300; i++ {
		theta := TwoPi.Scale(r.Float64()).Scale(float64(1 + r.IntN(1000)))
		c := Cis(theta)
		w := math.Max(c.Re.Width(), c.Im.Width())
		worstThin = math.Max(worstThin, w)
		worstExcess = math.Max(worstExcess, w/theta.Width())
		s, co := refSinCos(theta.Mid())
		checkEnclosure(t, fmt.Sprintf("Cis(%v).Re", theta), c.Re, co)
		checkEnclosure(t, fmt.Sprintf("Cis(%v).Im", theta), c.Im, s)
	}
	t.Logf("Cis on points |θ| < 1e4: max width %.3g; on thin phases 2π·u·L, L ≤ 1000: max width %.3g, max width/width(θ) %.3g",
		worst, worstThin, worstExcess)
}

// TestComplexInflateHull checks Inflate contains the disc of radius r and
// Hull contains both operands.
func TestComplexInflateHull(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(23, 24))
	for i := 0; i < 1000; i++ {
		z, w := randComplex(r), randComplex(r)
		rad := randLog(r, -30, 30)
		inf := z.Inflate(rad)
		R := bf(math.Abs(rad), exactPrec)
		for _, p := range []struct {
			part, grown Interval
		}{{z.Re, inf.Re}, {z.Im, inf.Im}} {
			lo := newF(exactPrec).Sub(bf(p.part.Lo, exactPrec), R)
			hi := newF(exactPrec).Add(bf(p.part.Hi, exactPrec), R)
			if !bigContains(p.grown.Lo, p.grown.Hi, lo) || !bigContains(p.grown.Lo, p.grown.Hi, hi) {
				t.Errorf("%v.Inflate(%g) = %v, want ⊇ [%s, %s]", z, rad, inf, lo.Text('g', 20), hi.Text('g', 20))
			}
		}
		h := z.Hull(w)
		if !h.Re.ContainsInterval(z.Re) || !h.Im.ContainsInterval(w.Im) {
			t.Errorf("%v.Hull(%v) = %v", z, w, h)
		}
	}
}
