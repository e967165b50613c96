package bounds

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"foldbound/internal/bigref"

	"gonum.org/v1/gonum/integrate/quad"
)

// checkEncloses fails the test unless the interval z contains the
// reference value want, and reports the relative width of z against tol.
func checkEncloses(t *testing.T, name string, z Interval, want *big.Float, tol float64) {
	t.Helper()
	if !bigref.In(z.Lo, z.Hi, want) {
		t.Errorf("%s = %v, want it to contain %.20g", name, z, bigref.Float64(want))
		return
	}
	if w := z.RelWidth(); w > tol {
		t.Errorf("%s = %v: relative width %.3g, want ≤ %.3g", name, z, w, tol)
	}
}

// TestSinc checks sinc against sin(x)/x computed by bigref (Taylor series
// in math/big, outside the engine).
func TestSinc(t *testing.T) {
	tests := []struct {
		x   float64
		tol float64
	}{
		{0, 1e-15},
		{1e-300, 1e-15},
		{1e-8, 1e-15},
		{-0.3, 1e-14},
		{0.999999, 1e-14},
		{1, 1e-14},
		{1.000001, 1e-14},
		{-2.5, 1e-14},
		{4.493409457909064, 1e-14}, // the first extremum, tan x = x
		{100, 1e-13},
		{-1e6, 1e-9}, // argument reduction error |x|·2⁻⁶² dominates
	}
	for _, tt := range tests {
		var want *big.Float
		if tt.x == 0 {
			want = bigref.Int(1)
		} else {
			x := bigref.New(tt.x)
			want = bigref.Quo(bigref.Sin(x), x)
		}
		checkEncloses(t, "sinc("+ftoa(tt.x)+")", Sinc(Point(tt.x)), want, tt.tol)
	}
}

// TestSincWide checks that wide arguments give enclosures of every point
// (sampled finely).
func TestSincWide(t *testing.T) {
	boxes := []Interval{{-0.5, 0.25}, {0.2, 3}, {-2, 2}, {0.9, 1.1}, {3, 20}, {-1e-3, 1e-3},
		{math.Pi - 1e-7, math.Pi + 1e-7}, {-1.5*math.Pi - 1e-7, -1.5*math.Pi + 1e-7}, {100, 100 + 1e-5}}
	for _, b := range boxes {
		z := Sinc(b)
		for i := 0; i <= 1000; i++ {
			x := b.Lo + (b.Hi-b.Lo)*float64(i)/1000
			v := 1.0
			if x != 0 {
				v = math.Sin(x) / x
			}
			// 1e-15 slack for the float64 reference itself.
			if v < z.Lo-1e-15 || v > z.Hi+1e-15 {
				t.Errorf("sinc(%v) = %v, want it to contain sinc(%g) = %g", b, z, x, v)
				break
			}
		}
	}
}

// TestBesselI0 checks I0 against bigref's power series (DLMF 10.25.2 in
// math/big) and against the integral I0(x) = (1/π)∫_0^π e^{x cos θ} dθ
// (DLMF 10.32.1) by Gauss-Legendre quadrature (gonum), and the published
// value I0(1) = 1.266065877752008335598244625 (Abramowitz & Stegun, Table
// 9.8, from memory).
func TestBesselI0(t *testing.T) {
	tests := []struct {
		x   float64
		tol float64
	}{
		{0, 1e-15}, {1e-9, 1e-15}, {0.5, 1e-14}, {1, 1e-14}, {-3, 1e-14},
		{10, 1e-13}, {14.1, 1e-13}, {40, 1e-13}, {150, 1e-12}, {700, 1e-12},
	}
	for _, tt := range tests {
		z := BesselI0(Point(tt.x))
		checkEncloses(t, "I0("+ftoa(tt.x)+")", z, bigref.BesselI0(bigref.New(tt.x)), tt.tol)
		if math.Abs(tt.x) <= 40 {
			q := quad.Fixed(func(th float64) float64 { return math.Exp(tt.x * math.Cos(th)) }, 0, math.Pi, 80, quad.Legendre{}, 0) / math.Pi
			if math.Abs(q-z.Mid()) > 1e-13*q {
				t.Errorf("I0(%g) = %v, want %.17g (quadrature of DLMF 10.32.1)", tt.x, z, q)
			}
		}
	}
	want, _ := new(big.Float).SetPrec(bigref.Prec).SetString("1.266065877752008335598244625")
	if z := BesselI0(Point(1)); math.Abs(z.Mid()-bigref.Float64(want)) > 1e-15 {
		t.Errorf("I0(1) = %v, want 1.266065877752008335598244625 (A&S Table 9.8)", z)
	}
	// Wide argument: I0 is even and increasing in |x|.
	z := BesselI0(Interval{-2, 3})
	if !bigref.In(z.Lo, z.Hi, bigref.Int(1)) || !bigref.In(z.Lo, z.Hi, bigref.BesselI0(bigref.New(3))) {
		t.Errorf("I0([-2, 3]) = %v, want it to contain [1, I0(3)]", z)
	}
}

// TestSinhcSqrt checks S(z) = sinh(√z)/√z (sin(√-z)/√-z for z < 0)
// against bigref, on both sides of 0 and across the switch points ±1.
func TestSinhcSqrt(t *testing.T) {
	tests := []struct {
		z   float64
		tol float64
	}{
		{0, 1e-15}, {1e-12, 1e-15}, {-1e-12, 1e-15}, {0.7, 1e-14}, {-0.7, 1e-14},
		{1, 1e-14}, {-1, 1e-14}, {1.5, 1e-14}, {-1.5, 1e-14},
		{196, 1e-14}, {-196, 1e-13}, {490000, 1e-12}, {-4e6, 1e-11},
	}
	for _, tt := range tests {
		var want *big.Float
		switch {
		case tt.z == 0:
			want = bigref.Int(1)
		case tt.z > 0:
			s := bigref.Sqrt(bigref.New(tt.z))
			want = bigref.Quo(bigref.Sinh(s), s)
		default:
			s := bigref.Sqrt(bigref.New(-tt.z))
			want = bigref.Quo(bigref.Sin(s), s)
		}
		checkEncloses(t, "S("+ftoa(tt.z)+")", SinhcSqrt(Point(tt.z)), want, tt.tol)
	}
	// A wide interval across all three pieces contains every sampled value.
	b := Interval{-30, 5}
	r := SinhcSqrt(b)
	for i := 0; i <= 700; i++ {
		z := b.Lo + (b.Hi-b.Lo)*float64(i)/700
		var v float64
		switch {
		case z > 0:
			v = math.Sinh(math.Sqrt(z)) / math.Sqrt(z)
		case z < 0:
			v = math.Sin(math.Sqrt(-z)) / math.Sqrt(-z)
		default:
			v = 1
		}
		if v < r.Lo-1e-14 || v > r.Hi+1e-14 {
			t.Fatalf("S(%v) = %v, want it to contain S(%g) = %g", b, r, z, v)
		}
	}
}

func ftoa(x float64) string { return big.NewFloat(x).Text('g', 17) }

// TestBesselI0Horner checks the tabulated-length Horner evaluation of I0
// (besselI0Quarter, q = a²/4 ≤ besselI0Reach) against the power series in
// math/big (bigref.BesselI0, DLMF 10.25.2) on 600 seeded points from 0 to
// beyond the table's reach (a ≈ 47, where the term-by-term series takes
// over), on thin intervals, and checks the relative width (≤ 2e-15 plus
// 2⁻⁵¹·a for the rounding of about a terms).
func TestBesselI0Horner(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 7))
	reach := 2 * math.Sqrt(besselI0Reach[len(besselI0Reach)-1])
	for i := range 600 {
		a := r.Float64() * (reach + 5)
		if i%10 == 0 {
			a = reach * (1 + (r.Float64()-0.5)*1e-3) // across the switch
		}
		x := Interval{a, a * (1 + 1e-15*float64(i%3))}
		z := BesselI0(x)
		for _, v := range []float64{x.Lo, x.Hi} {
			if want := bigref.BesselI0(bigref.New(v)); !bigref.In(z.Lo, z.Hi, want) {
				t.Errorf("I0(%v) = %v does not contain I0(%g) = %.17g", x, z, v, bigref.Float64(want))
			}
		}
		if x.Lo == x.Hi {
			if w := z.RelWidth(); w > 2e-15+0x1p-51*a {
				t.Errorf("I0(%g) = %v: relative width %.3g", a, z, w)
			}
		}
	}
}
