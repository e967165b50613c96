package bounds

import (
	"math"
	"testing"

	"foldbound/internal/bigref"
)

// TestExponentialLatticeSum checks the closed form of the infinite grid's
// sum of e^{-a|x|} against the samples summed in math/big (two geometric
// series written out term by term), for point and interval shifts and
// frequencies: the enclosure must contain the sum at the ends of the
// intervals, and for points be as tight as the exponential tests ask of
// spatial sums (1e-12 relative, 1e-13 where nothing cancels).
func TestExponentialLatticeSum(t *testing.T) {
	tests := []struct {
		a, h     float64
		shift    Interval
		xi       Interval
		wantOK   bool
		maxWidth float64 // relative, for points
	}{
		{1, 0.5, Point(0.3), Point(0.3), true, 1e-13},
		{1, 0.5, Point(0), Point(0), true, 1e-13},
		{0.35, 2, Point(-0.7), Point(1.9), true, 1e-12},
		{3, 0.05, Point(12.345), Point(-40), true, 1e-12},
		{800, 1, Point(0.3), Point(0.3), false, 0}, // sinh(400) squared overflows
		{1, 0.5, Interval{0.1, 0.2}, Point(0.3), true, 0},
		{1, 0.5, Point(0.3), Interval{0.29, 0.31}, true, 0},
		{1, 0.5, Interval{-0.1, 0.1}, Point(0.3), false, 0}, // a sample crosses the kink
	}
	for _, tt := range tests {
		f := ExponentialFamily{Rate: tt.a}
		got, ok := f.latticeSum(tt.h, tt.shift, tt.xi)
		if ok != tt.wantOK {
			t.Errorf("a=%g h=%g s=%v ξ=%v: ok = %v, want %v", tt.a, tt.h, tt.shift, tt.xi, ok, tt.wantOK)
			continue
		}
		if !ok {
			continue
		}
		for _, s := range []float64{tt.shift.Lo, tt.shift.Hi} {
			for _, xi := range []float64{tt.xi.Lo, tt.xi.Hi} {
				want := bigLatticeExp(tt.a, tt.h, s, xi)
				if !bigref.In(got.Re.Lo, got.Re.Hi, want.Re) || !bigref.In(got.Im.Lo, got.Im.Hi, want.Im) {
					t.Errorf("a=%g h=%g s=%g ξ=%g: T∞ = %v, want %.17g%+.17gi", tt.a, tt.h, s, xi, got,
						bigref.Float64(want.Re), bigref.Float64(want.Im))
				}
			}
		}
		if tt.maxWidth > 0 {
			if w := (got.Re.Width() + got.Im.Width()) / got.Mag(); w > tt.maxWidth {
				t.Errorf("a=%g h=%g s=%v ξ=%v: T∞ = %v, relative width %.3g > %g", tt.a, tt.h, tt.shift, tt.xi, got, w, tt.maxWidth)
			}
		}
	}
}

// TestExponentialLatticeSumSmallSteps checks the closed form where the
// ratio e^{-ah} is within 1e-9 of 1, at shift 0 and ξ = 0, against
// h·coth(ah/2) (DLMF 4.36.3, from memory) in math/big: it must stay tight
// (1e-13 relative: a few widenings of the sinh enclosures).
func TestExponentialLatticeSumSmallSteps(t *testing.T) {
	for _, h := range []float64{1e-9, 1e-6, 1e-3} {
		got, ok := ExponentialFamily{Rate: 1}.latticeSum(h, Point(0), Point(0))
		if !ok {
			t.Errorf("h=%g: no closed form", h)
			continue
		}
		half := bigref.Quo(bigref.New(h), bigref.Int(2))
		want := bigref.Mul(bigref.New(h), bigref.Quo(bigref.Cosh(half), bigref.Sinh(half)))
		if !bigref.In(got.Re.Lo, got.Re.Hi, want) || !got.Im.Contains(0) {
			t.Errorf("h=%g: T∞ = %v, want h·coth(h/2) = %.17g", h, got, bigref.Float64(want))
		}
		if w := got.Re.RelWidth(); w > 1e-13 {
			t.Errorf("h=%g: T∞ = %v, relative width %.3g > 1e-13", h, got.Re, w)
		}
	}
}

// bigLatticeExp returns h Σ_k e^{-a|x_k|} e^{-iξx_k}, x_k = s + hk, summed
// in math/big over the samples with a|x_k| ≤ 60·ln 2·4 + |a·s| (the rest is
// below 2⁻²⁴⁰ of the sum).
func bigLatticeExp(a, h, s, xi float64) bigref.Complex {
	X := (120*math.Ln2 + math.Abs(a*s)) / a
	re, im := bigref.Int(0), bigref.Int(0)
	for k := math.Floor((-X - s) / h); s+h*k <= X; k++ {
		x := bigX(h, s, int64(k))
		e := bigref.Exp(bigref.Neg(bigref.Mul(bigref.New(a), bigref.Abs(x))))
		ph := bigref.Neg(bigref.Mul(bigref.New(xi), x))
		re = bigref.Add(re, bigref.Mul(e, bigref.Cos(ph)))
		im = bigref.Add(im, bigref.Mul(e, bigref.Sin(ph)))
	}
	H := bigref.New(h)
	return bigref.Complex{Re: bigref.Mul(H, re), Im: bigref.Mul(H, im)}
}
