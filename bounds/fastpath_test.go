package bounds

import (
	"math"
	"math/rand/v2"
	"testing"

	"foldbound/internal/bigref"
)

// TestExpThin checks the one-call path of Exp for thin intervals against
// e^x in math/big at both ends, and that it is as tight as two calls
// (within 1e-15 relative, outside the subnormal range).
func TestExpThin(t *testing.T) {
	for _, lo := range []float64{-745, -700.5, -80.25, -3.1, -1e-300, 0, 1e-20, 0.7, 12.5, 700, 708.9} {
		for _, d := range []float64{0x1p-52, 1e-14, 3e-9, 0x1p-26} {
			x := Interval{lo, lo + d*math.Max(1, math.Abs(lo))}
			if x.Hi-x.Lo > 0x1p-26 || x.Hi > expDirect {
				continue
			}
			got := Exp(x)
			for _, v := range []float64{x.Lo, x.Hi} {
				if want := bigref.Exp(bigref.New(v)); !bigref.In(got.Lo, got.Hi, want) {
					t.Errorf("Exp(%v) = %v does not contain e^%g = %.17g", x, got, v, bigref.Float64(want))
				}
			}
			_, hi := expBounds(x.Hi)
			if hi > 1e-300 && got.Hi > hi*(1+1e-15) {
				t.Errorf("Exp(%v).Hi = %g, want about e^Hi = %g", x, got.Hi, hi)
			}
		}
	}
}

// TestIsEven checks the families isEven calls even against their values
// and transforms at mirrored points, and that it does not call a shifted
// or modulated family even.
func TestIsEven(t *testing.T) {
	even := []Family{
		GaussianFamily{Sigma: 0.7}, ExponentialFamily{Rate: 2}, LorentzianFamily{Width: 1.5},
		SechFamily{Width: 0.4}, SechSquaredFamily{Width: 2}, FejerFamily{Omega: 3},
		WavePacketFamily{Sigma: 1, Omega0: 3}, BSplineFamily{Order: 5}, KaiserBesselFamily{Width: 6, Beta: 14.1},
		AmplitudeFamily{Re: 2, Im: -1, Of: SechFamily{Width: 1}}, DilationFamily{By: -2.5, Of: GaussianFamily{Sigma: 1}},
		SumFamily{Terms: []Family{GaussianFamily{Sigma: 1}, BSplineFamily{Order: 3}}},
		ShiftFamily{By: 0, Of: GaussianFamily{Sigma: 1}},
	}
	for _, f := range even {
		if !isEven(f) {
			t.Errorf("isEven(%v) = false, want true", f)
			continue
		}
		for _, x := range []float64{0.1, 0.77, 1.9, 4.2} {
			a, b := f.Value(Point(x)), f.Value(Point(-x))
			if !overlaps(a, b) {
				t.Errorf("%v: f(%g) = %v, f(%g) = %v, want equal (even)", f, x, a, -x, b)
			}
			A, B := f.Transform(Point(x)), f.Transform(Point(-x))
			if !overlaps(A, B) {
				t.Errorf("%v: F(%g) = %v, F(%g) = %v, want equal (even)", f, x, A, -x, B)
			}
		}
	}
	for _, f := range []Family{ShiftFamily{By: 0.3, Of: GaussianFamily{Sigma: 1}}, ModulationFamily{Omega0: 2, Of: GaussianFamily{Sigma: 1}},
		SumFamily{Terms: []Family{GaussianFamily{Sigma: 1}, ShiftFamily{By: 1, Of: SechFamily{Width: 1}}}}} {
		if isEven(f) {
			t.Errorf("isEven(%v) = true, want false", f)
		}
	}
}

func overlaps(a, b Complex) bool {
	_, re := a.Re.Intersect(b.Re)
	_, im := a.Im.Intersect(b.Im)
	return re && im
}

// TestSechXOverSinhThin checks the one-evaluation path of Sech and
// XOverSinh for thin intervals (width ≤ 2⁻⁴⁰) against sech and x/sinh x in
// math/big at both ends, on both signs and across the range where the
// series, the closed forms and the underflowing tails are used.
func TestSechXOverSinhThin(t *testing.T) {
	for _, lo := range []float64{0, 1e-300, 0.01, 0.3, 0.99, 1, 1.01, 3.7, 20, 354.5, 699, 701, 745, 1500} {
		for _, d := range []float64{0x1p-60, 1e-14, 3e-13, 0x1p-40} {
			for _, sign := range []float64{1, -1} {
				x := Interval{lo, lo + d*math.Max(1, lo)}
				if x.Hi-x.Lo > 0x1p-40 {
					continue
				}
				if sign < 0 {
					x = x.Neg()
				}
				gs, gx := Sech(x), XOverSinh(x)
				for _, v := range []float64{x.Lo, x.Hi} {
					bv := bigref.New(v)
					if want := bigref.Sech(bv); !bigref.In(gs.Lo, gs.Hi, want) {
						t.Errorf("Sech(%v) = %v does not contain sech(%g) = %.17g", x, gs, v, bigref.Float64(want))
					}
					want := bigref.Int(1) // x/sinh x at 0
					if v != 0 {
						want = bigref.Quo(bv, bigref.Sinh(bv))
					}
					if !bigref.In(gx.Lo, gx.Hi, want) {
						t.Errorf("XOverSinh(%v) = %v does not contain %g/sinh(%g) = %.17g", x, gx, v, v, bigref.Float64(want))
					}
				}
			}
		}
	}
}

// TestCosThin checks the one-call cosine of thin intervals (cosThin) against
// cos in math/big at both ends of intervals of radius up to 2⁻²⁰, from 0 to
// beyond 2²⁹ (where Go's argument reduction changes), and that wide or
// infinite intervals fall back to Cos.
func TestCosThin(t *testing.T) {
	for _, m := range []float64{0, 1e-300, 0.3, -1.5707963267948966, 3.141592653589793, -2.5, 100.25, 1e6 + 0.1, 0x1p29 + 3, 1e15} {
		for _, r := range []float64{0, 0x1p-60, 1e-15, 3e-9, 0x1p-20, 0.5} {
			x := Interval{m - r, m + r}
			got := cosThin(x)
			for _, v := range []float64{x.Lo, x.Hi, m} {
				if want := bigref.Cos(bigref.New(v)); !bigref.In(got.Lo, got.Hi, want) {
					t.Errorf("cosThin(%v) = %v does not contain cos(%g) = %.17g", x, got, v, bigref.Float64(want))
				}
			}
		}
	}
	if got := cosThin(Interval{0, math.Inf(1)}); got != (Interval{-1, 1}) {
		t.Errorf("cosThin([0, +Inf]) = %v, want [-1, 1]", got)
	}
}

// TestNextUpBits checks nextUp, which decides its cases on the bits, against
// math.Nextafter(x, +Inf) (the next float64 by IEEE 754 nextUp, +Inf kept)
// at the special values and 100 000 seeded random bit patterns.
func TestNextUpBits(t *testing.T) {
	xs := []float64{0, math.Copysign(0, -1), math.Inf(1), math.Inf(-1), math.MaxFloat64, -math.MaxFloat64,
		math.SmallestNonzeroFloat64, -math.SmallestNonzeroFloat64, 1, -1, 0x1p-1022, -0x1p-1022}
	r := rand.New(rand.NewPCG(1, 2))
	for range 100000 {
		xs = append(xs, math.Float64frombits(r.Uint64()))
	}
	for _, x := range xs {
		got := nextUp(x)
		if math.IsNaN(x) {
			if !math.IsNaN(got) {
				t.Errorf("nextUp(NaN) = %v, want NaN", got)
			}
			continue
		}
		want := math.Nextafter(x, math.Inf(1))
		if math.IsInf(x, 1) {
			want = x
		}
		if got != want {
			t.Errorf("nextUp(%v) = %v, want %v", x, got, want)
		}
		if d := nextDown(-x); d != -want {
			t.Errorf("nextDown(%v) = %v, want %v", -x, d, -want)
		}
	}
	if nextUp(math.NaN()) == nextUp(math.NaN()) {
		t.Errorf("nextUp(NaN) is not NaN")
	}
}
