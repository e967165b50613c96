package bounds

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"
	"testing"

	"foldbound/internal/bigref"

	"gonum.org/v1/gonum/integrate/quad"
)

// i0Quad is I0(y) = (1/π)∫_0^π e^{y cos θ} dθ (DLMF 10.32.1) by 64-point
// Gauss-Legendre quadrature (gonum); the integrand is entire and periodic,
// accurate to about 1e-15 relative for y ≤ 40.
func i0Quad(y float64) float64 {
	return quad.Fixed(func(th float64) float64 { return math.Exp(y * math.Cos(th)) }, 0, math.Pi, 64, quad.Legendre{}, 0) / math.Pi
}

// bigKaiserBessel is f(x) in math/big: I0(β√(1-(2x/W)²)) inside, 1/2 at
// the edges, 0 outside.
func bigKaiserBessel(w, beta float64, x *big.Float) *big.Float {
	t := bigref.Quo(bigref.Mul(bigref.Int(2), bigref.Abs(x)), bigref.New(w))
	switch t.Cmp(bigref.Int(1)) {
	case 1:
		return bigref.Int(0)
	case 0:
		return bigref.New(0.5)
	}
	r := bigref.Sqrt(bigref.Sub(bigref.Int(1), bigref.Mul(t, t)))
	return bigref.BesselI0(bigref.Mul(bigref.New(beta), r))
}

// bigKaiserBesselTransform is W·sinh(√(β²-u²))/√(β²-u²), u = Wξ/2, in
// math/big (the sin form for |u| > β).
func bigKaiserBesselTransform(w, beta, xi float64) *big.Float {
	u := bigref.Mul(bigref.New(w/2), bigref.New(xi)) // w/2 exact
	z := bigref.Sub(bigref.Mul(bigref.New(beta), bigref.New(beta)), bigref.Mul(u, u))
	var s *big.Float
	switch z.Sign() {
	case 0:
		s = bigref.Int(1)
	case 1:
		r := bigref.Sqrt(z)
		s = bigref.Quo(bigref.Sinh(r), r)
	default:
		r := bigref.Sqrt(bigref.Neg(z))
		s = bigref.Quo(bigref.Sin(r), r)
	}
	return bigref.Mul(bigref.New(w), s)
}

// kbCases are the windows used below: the box (β = 0) and typical gridding
// kernels (β ≈ 2.3·W for oversampling 2, common practice, no source).
var kbCases = []struct{ w, beta float64 }{
	{1, 0}, {2, 2.3}, {4, 9.2}, {6, 14.1}, {8, 30},
}

// TestKaiserBesselTransformQuadrature checks the transform formula against
// ∫_{-W/2}^{W/2} I0(β√(1-(2x/W)²)) cos(ξx) dx, with I0 itself by
// quadrature of DLMF 10.32.1 (both gonum Gauss-Legendre, independent of the
// engine). The integrand is entire in x (I0(β√(1-t²)) is a power series in
// 1 - t²), so 200 points resolve it to rounding for these ξ. Tolerance:
// 1e-11 of the peak W·sinh(β)/β (F has zeros, where relative error is
// meaningless).
func TestKaiserBesselTransformQuadrature(t *testing.T) {
	worst := 0.0
	for _, c := range kbCases {
		k, err := NewKaiserBessel(c.w, c.beta)
		if err != nil {
			t.Fatal(err)
		}
		peak := k.Transform(Point(0)).Re.Mid()
		band := 2 * c.beta / c.w // |u| = β
		for _, xi := range []float64{0, 0.1, 0.5 * band, band, band + 0.3, 2 * band, 3 + 3*band, -7.7, 25} {
			q := quad.Fixed(func(x float64) float64 {
				t := 2 * x / c.w
				return i0Quad(c.beta*math.Sqrt(math.Max(0, 1-t*t))) * math.Cos(xi*x)
			}, -c.w/2, c.w/2, 200, quad.Legendre{}, 0)
			F := k.Transform(Point(xi)).Re
			e := math.Abs(F.Mid()-q) / peak
			worst = math.Max(worst, e)
			if e > 1e-11 {
				t.Errorf("F(%g) = %v for W=%g β=%g, want %.17g (quadrature): error %.3g of the peak", xi, F, c.w, c.beta, q, e)
			}
		}
	}
	t.Logf("worst quadrature discrepancy, relative to the peak: %.3g", worst)
}

// TestKaiserBesselValues checks f(x) against bigref (I0 by its series in
// math/big): containment, relative width ≤ 1e-12, and the midpoint value
// 1/2 at the edges.
func TestKaiserBesselValues(t *testing.T) {
	worst := 0.0
	for _, c := range kbCases {
		k := KaiserBesselFamily{Width: c.w, Beta: c.beta}
		for i := -105; i <= 105; i++ {
			x := c.w / 2 * float64(i) / 100
			v := k.Value(Point(x)).Re
			want := bigKaiserBessel(c.w, c.beta, bigref.New(x))
			if !bigref.In(v.Lo, v.Hi, want) {
				t.Errorf("f(%g) = %v for W=%g β=%g, want it to contain %.20g", x, v, c.w, c.beta, bigref.Float64(want))
				continue
			}
			w := v.RelWidth()
			worst = math.Max(worst, w)
			if w > 1e-12 {
				t.Errorf("f(%g) = %v for W=%g β=%g: relative width %.3g, want ≤ 1e-12", x, v, c.w, c.beta, w)
			}
		}
		edge := []struct{ x, want float64 }{
			{c.w / 2, 0.5}, {-c.w / 2, 0.5}, {math.Nextafter(c.w/2, 10), 0}, {math.Nextafter(c.w/2, 0), 1},
		}
		for _, e := range edge {
			if v := k.Value(Point(e.x)).Re; math.Abs(v.Mid()-e.want) > 1e-9 {
				t.Errorf("f(%g) = %v for W=%g β=%g, want %g (midpoint convention)", e.x, v, c.w, c.beta, e.want)
			}
		}
	}
	t.Logf("worst relative width of f(x): %.3g", worst)
	// Wide arguments across the edge.
	k := KaiserBesselFamily{Width: 4, Beta: 9.2}
	for _, b := range []Interval{{1.5, 2.5}, {1.99, 2}, {-2, 2}, {2, 3}} {
		z := k.Value(b).Re
		for i := 0; i <= 100; i++ {
			x := b.Lo + (b.Hi-b.Lo)*float64(i)/100
			if want := bigKaiserBessel(4, 9.2, bigref.New(x)); !bigref.In(z.Lo, z.Hi, want) {
				t.Errorf("f(%v) = %v, want it to contain f(%g) = %g", b, z, x, bigref.Float64(want))
				break
			}
		}
	}
}

// TestKaiserBesselTransformBig checks transform enclosures against
// math/big: containment everywhere, relative width ≤ 1e-12 where |F| is at
// least 1e-3 of the peak.
func TestKaiserBesselTransformBig(t *testing.T) {
	for _, c := range kbCases {
		k := KaiserBesselFamily{Width: c.w, Beta: c.beta}
		peak := k.Transform(Point(0)).Re.Mid()
		for i := -60; i <= 60; i++ {
			xi := float64(i) * (1 + 2*c.beta/c.w) / 17
			F := k.Transform(Point(xi)).Re
			want := bigKaiserBesselTransform(c.w, c.beta, xi)
			if !bigref.In(F.Lo, F.Hi, want) {
				t.Errorf("F(%g) = %v for W=%g β=%g, want it to contain %.20g", xi, F, c.w, c.beta, bigref.Float64(want))
				continue
			}
			if math.Abs(bigref.Float64(want)) > 1e-3*peak && F.RelWidth() > 1e-12 {
				t.Errorf("F(%g) = %v for W=%g β=%g: relative width %.3g, want ≤ 1e-12", xi, F, c.w, c.beta, F.RelWidth())
			}
		}
	}
}

// TestKaiserBesselEnvelopes checks |f| ≤ Spatial and |F| ≤ Spectral on
// samples, against math/big values.
func TestKaiserBesselEnvelopes(t *testing.T) {
	for _, c := range kbCases {
		k := KaiserBesselFamily{Width: c.w, Beta: c.beta}
		sp, sc := k.Spatial(), k.Spectral()
		touch := 0.0 // sup |F|/envelope beyond the band |u| ≤ β + 1
		for i := -120; i <= 120; i++ {
			x := c.w / 2 * float64(i) / 100
			if v := bigKaiserBessel(c.w, c.beta, bigref.New(x)); !bigref.In(0, sp.At(Point(x)), v) {
				t.Errorf("f(%g) = %g above its spatial envelope %g (W=%g β=%g)", x, bigref.Float64(v), sp.At(Point(x)), c.w, c.beta)
			}
			xi := float64(i) * (2 + 2*c.beta/c.w) / 31
			v := bigref.Abs(bigKaiserBesselTransform(c.w, c.beta, xi))
			if !bigref.In(0, sc.At(Point(xi)), v) {
				t.Errorf("|F(%g)| = %g above its spectral envelope %g (W=%g β=%g)", xi, bigref.Float64(v), sc.At(Point(xi)), c.w, c.beta)
			}
			if math.Abs(xi)*c.w/2 > c.beta+1 {
				touch = math.Max(touch, bigref.Float64(v)/sc.At(Point(xi)))
			}
		}
		for i := 0; i < 4000; i++ { // finer sampling of the tail for the tightness figure
			xi := (2*c.beta + 2 + float64(i)*0.01) / c.w * (1 + float64(i)/400)
			touch = math.Max(touch, math.Abs(k.Transform(Point(xi)).Re.Mid())/sc.At(Point(xi)))
		}
		t.Logf("W=%g β=%g: spectral envelope at ξ=0 is %.3g × F(0); sup |F|/envelope beyond the band %.3f",
			c.w, c.beta, sc.At(Point(0))/k.Transform(Point(0)).Re.Mid(), touch)
	}
}

// TestKaiserBesselBox checks that β = 0, W = 1 is the box, the B-spline of
// order 1 (same values and transform).
func TestKaiserBesselBox(t *testing.T) {
	k := KaiserBesselFamily{Width: 1}
	b := BSplineFamily{Order: 1}
	for _, x := range []float64{0, 0.3, 0.5, -0.5, 0.7} {
		if kv, bv := k.Value(Point(x)).Re, b.Value(Point(x)).Re; math.Abs(kv.Mid()-bv.Mid()) > 1e-15 {
			t.Errorf("kaiser_bessel(1, 0)(%g) = %v, want %v (the box)", x, kv, bv)
		}
	}
	for _, xi := range []float64{0, 1, math.Pi, 2 * math.Pi, 40} {
		if kv, bv := k.Transform(Point(xi)).Re, b.Transform(Point(xi)).Re; math.Abs(kv.Mid()-bv.Mid()) > 1e-15 {
			t.Errorf("kaiser_bessel(1, 0) F(%g) = %v, want %v (the box)", xi, kv, bv)
		}
	}
}

// TestKaiserBesselInvalid checks the parameter domain, directly and
// through AliasSum.
func TestKaiserBesselInvalid(t *testing.T) {
	tests := []struct {
		w, beta float64
		param   string
	}{
		{0, 1, "kaiser_bessel.width"},
		{-1, 1, "kaiser_bessel.width"},
		{math.NaN(), 1, "kaiser_bessel.width"},
		{math.Inf(1), 1, "kaiser_bessel.width"},
		{1e-310, 1, "kaiser_bessel.width"},
		{1, -0.1, "kaiser_bessel.beta"},
		{1, math.NaN(), "kaiser_bessel.beta"},
		{1, 701, "kaiser_bessel.beta"},
		{1, math.Inf(1), "kaiser_bessel.beta"},
	}
	for _, tt := range tests {
		_, err := NewKaiserBessel(tt.w, tt.beta)
		var pe *ParamError
		if !errors.Is(err, ErrInvalid) || !errors.As(err, &pe) || pe.Param != tt.param {
			t.Errorf("NewKaiserBessel(%g, %g) = %v, want ErrInvalid naming %q", tt.w, tt.beta, err, tt.param)
		}
		_, err = AliasSum(context.Background(), KaiserBesselFamily{Width: tt.w, Beta: tt.beta}, Grid{Step: 1}, 0, Settings{})
		if !errors.Is(err, ErrInvalid) || !errors.As(err, &pe) || pe.Param != tt.param {
			t.Errorf("AliasSum(kaiser_bessel(%g, %g)) = %v, want ErrInvalid naming %q", tt.w, tt.beta, err, tt.param)
		}
	}
}

// TestKaiserBesselContainment checks AliasSum on Kaiser-Bessel windows
// against direct spatial sums in math/big (famref_test.go): 8 parameter
// points for each of the 5 windows (40 in all), steps from W/2 down to
// W/80, several shifts (none putting a sample exactly on an edge, see
// TestGridAtWidensExactJumps) and frequencies, infinite and finite grids.
func TestKaiserBesselContainment(t *testing.T) {
	var st widthStats
	for _, c := range kbCases {
		k := KaiserBesselFamily{Width: c.w, Beta: c.beta}
		for i, frac := range []float64{0.5, 0.33, 0.25, 0.1, 0.07, 0.05, 0.02, 0.0125} {
			h := frac * c.w
			xis := []float64{0, 1.1 / c.w, -0.9 * math.Pi / h, 3.7}
			counts := []int64{0, 5, 0, 40, 0, 1, 0, 101}
			g := Grid{Step: h, Shift: []float64{0.0101, -0.2345, 1.2222, 0.0007}[i%4] * c.w, Count: counts[i]}
			xi := xis[i%len(xis)]
			got, err := AliasSum(context.Background(), k, g, xi, Settings{})
			if err != nil {
				t.Errorf("%v %+v ξ=%g: %v", k, g, xi, err)
				continue
			}
			ref := refSum([]refAxis{refKaiserBessel(c.w, c.beta)}, []Grid{g}, []float64{xi}, 1<<20)
			checkSum(t, fmt.Sprintf("%v %+v ξ=%g", k, g, xi), got, ref, &st)
		}
	}
	t.Logf("%d parts contained; worst relative width (non-tiny) %.3g; worst width/scale %.3g", st.contained, st.worstRel, st.worstAbs)
}

// BenchmarkAliasSumKaiserBessel times AliasSum for a typical gridding
// kernel (W = 6, β = 14.1) at unit spacing and a finer one.
func BenchmarkAliasSumKaiserBessel(b *testing.B) {
	f := KaiserBesselFamily{Width: 6, Beta: 14.1}
	for _, h := range []float64{1, 0.25} {
		b.Run(fmt.Sprintf("h=%g", h), func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				r, err := AliasSum(context.Background(), f, Grid{Step: h, Shift: 0.123}, 0.9, Settings{})
				if err != nil {
					b.Fatal(err)
				}
				sinkSum = r
			}
		})
	}
}

// BenchmarkKaiserBesselEval times one value and one transform enclosure.
func BenchmarkKaiserBesselEval(b *testing.B) {
	for _, beta := range []float64{2.3, 14.1, 40} {
		f := KaiserBesselFamily{Width: 6, Beta: beta}
		b.Run(fmt.Sprintf("beta=%g", beta), func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				sinkC = f.Value(Point(0.3)).Add(f.Transform(Point(2.1)))
			}
		})
	}
}
