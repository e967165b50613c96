package bounds

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"foldbound/internal/bigref"

	"gonum.org/v1/gonum/integrate/quad"
)

// bsplineRecur evaluates the centred B-spline by the recurrence
//
//	M_m(x) = ((m/2 + x) M_{m-1}(x + 1/2) + (m/2 - x) M_{m-1}(x - 1/2)) / (m-1)
//
// (de Boor, A Practical Guide to Splines, 1978, ch. IX, shifted to the
// centred spline; from memory), starting from the box with value 1/2 at
// ±1/2. It is independent of the truncated-power formula in bspline.go.
func bsplineRecur(m int, x float64) float64 {
	h := float64(m) / 2
	switch {
	case math.Abs(x) > h:
		return 0
	case m == 1 && math.Abs(x) == h:
		return 0.5
	case m == 1:
		return 1
	}
	return ((h+x)*bsplineRecur(m-1, x+0.5) + (h-x)*bsplineRecur(m-1, x-0.5)) / float64(m-1)
}

// bigBSpline is bsplineRecur in math/big at bigref.Prec bits.
func bigBSpline(m int, x *big.Float) *big.Float {
	h := bigref.New(float64(m) / 2)
	ax := bigref.Abs(x)
	switch c := ax.Cmp(h); {
	case c > 0:
		return bigref.Int(0)
	case m == 1 && c == 0:
		return bigref.New(0.5)
	case m == 1:
		return bigref.Int(1)
	}
	half := bigref.New(0.5)
	a := bigref.Mul(bigref.Add(h, x), bigBSpline(m-1, bigref.Add(x, half)))
	b := bigref.Mul(bigref.Sub(h, x), bigBSpline(m-1, bigref.Sub(x, half)))
	return bigref.Quo(bigref.Add(a, b), bigref.Int(int64(m-1)))
}

// TestBSplineTable checks values quoted in the spline literature (de Boor,
// 1978, from memory): the cubic B-spline 1/6, 2/3, 1/6 at the knots and
// 23/48 at 1/2; the quadratic 1/8, 3/4; the hat 1 at 0; the box with the
// midpoint value 1/2 at its jumps.
func TestBSplineTable(t *testing.T) {
	tests := []struct {
		m    int
		x    float64
		want float64
		tol  float64
	}{
		{1, 0, 1, 0},
		{1, 0.5, 0.5, 0},
		{1, -0.5, 0.5, 0},
		{1, 0.50000001, 0, 0},
		{2, 0, 1, 1e-16},
		{2, 0.25, 0.75, 1e-16},
		{3, 0, 0.75, 1e-16},
		{3, 1, 0.125, 1e-16},
		{3, 1.5, 0, 0},
		{4, 0, 2.0 / 3, 1e-16},
		{4, 1, 1.0 / 6, 1e-16},
		{4, -1, 1.0 / 6, 1e-16},
		{4, 0.5, 23.0 / 48, 1e-16},
		{4, 2, 0, 0},
	}
	for _, tt := range tests {
		b, err := NewBSpline(tt.m)
		if err != nil {
			t.Fatal(err)
		}
		v := b.Value(Point(tt.x)).Re
		if v.Lo > tt.want+tt.tol || v.Hi < tt.want-tt.tol {
			t.Errorf("M_%d(%g) = %v, want %.17g", tt.m, tt.x, v, tt.want)
		}
	}
}

// TestBSplineValue checks the values against (a) the exact recurrence in
// math/big (containment, and relative width ≤ 1e-12 away from the support
// edges, 1e-9 of the support from them) and (b) the convolution definition
// M_m(x) = ∫_{-1/2}^{1/2} M_{m-1}(x - t) dt by Gauss-Legendre quadrature
// (gonum), piecewise between the knots.
func TestBSplineValue(t *testing.T) {
	worst := 0.0
	for m := 1; m <= MaxBSplineOrder; m++ {
		b := BSplineFamily{Order: m}
		h := float64(m) / 2
		for i := -200; i <= 200; i++ {
			x := h * float64(i) / 199 // also a few points outside the support
			v := b.Value(Point(x)).Re
			want := bigBSpline(m, bigref.New(x))
			if !bigref.In(v.Lo, v.Hi, want) {
				t.Errorf("M_%d(%g) = %v, want it to contain %.20g", m, x, v, bigref.Float64(want))
				continue
			}
			if h-math.Abs(x) > 1e-9*h {
				if w := v.RelWidth(); w > 1e-12 {
					t.Errorf("M_%d(%g) = %v: relative width %.3g, want ≤ 1e-12", m, x, v, w)
				} else {
					worst = math.Max(worst, w)
				}
			}
			if m >= 2 && i%10 == 0 {
				// Convolution with the box, split at the knots of M_{m-1}
				// shifted by x.
				conv := 0.0
				lo := x - 0.5
				for lo < x+0.5 {
					hi := math.Min(x+0.5, math.Floor(lo+float64(m-1)/2+1)-float64(m-1)/2)
					if hi <= lo {
						hi = x + 0.5
					}
					conv += quad.Fixed(func(s float64) float64 { return bsplineRecur(m-1, s) }, lo, hi, 8, quad.Legendre{}, 0)
					lo = hi
				}
				if math.Abs(conv-v.Mid()) > 1e-14 {
					t.Errorf("M_%d(%g) = %v, want %.17g (convolution by quadrature)", m, x, v, conv)
				}
			}
		}
	}
	t.Logf("worst relative width of M_m(x) away from the edges: %.3g", worst)
	// Near the edges a single truncated power remains: still tight.
	for m := 2; m <= MaxBSplineOrder; m++ {
		x := float64(m)/2 - 1e-3
		v := BSplineFamily{Order: m}.Value(Point(x)).Re
		if w := v.RelWidth(); w > 1e-12 {
			t.Errorf("M_%d(%g) = %v: relative width %.3g near the edge, want ≤ 1e-12", m, x, v, w)
		}
	}
}

// TestBSplineValueWide checks enclosures over wide arguments against
// sampled values.
func TestBSplineValueWide(t *testing.T) {
	boxes := []Interval{{-0.6, -0.4}, {0.4, 0.5}, {0.5, 0.5}, {-3, 3}, {0.9, 1.7}, {1.9, 5}, {-0.01, 0.02}}
	for m := 1; m <= MaxBSplineOrder; m++ {
		for _, bx := range boxes {
			z := BSplineFamily{Order: m}.Value(bx).Re
			for i := 0; i <= 400; i++ {
				x := bx.Lo + (bx.Hi-bx.Lo)*float64(i)/400
				if v := bsplineRecur(m, x); v < z.Lo-1e-15 || v > z.Hi+1e-15 {
					t.Errorf("M_%d(%v) = %v, want it to contain M_%d(%g) = %g", m, bx, z, m, x, v)
					break
				}
			}
		}
	}
}

// TestBSplineTransformQuadrature checks F(ξ) = (sin(ξ/2)/(ξ/2))^m
// against ∫ M_m(x) cos(ξx) dx (M_m is even), by Gauss-Legendre quadrature
// (gonum) on each polynomial piece [k - m/2, k + 1 - m/2], with M_m from the
// recurrence.
func TestBSplineTransformQuadrature(t *testing.T) {
	xis := []float64{0, 0.3, 1, math.Pi, 2 * math.Pi, 7.5, 20, -33.3, 60}
	worst := 0.0 // |F - quadrature|, F ≤ 1
	for m := 1; m <= MaxBSplineOrder; m++ {
		b := BSplineFamily{Order: m}
		for _, xi := range xis {
			q := 0.0
			for k := 0; k < m; k++ {
				lo := float64(k) - float64(m)/2
				q += quad.Fixed(func(x float64) float64 { return bsplineRecur(m, x) * math.Cos(xi*x) }, lo, lo+1, 40, quad.Legendre{}, 0)
			}
			F := b.Transform(Point(xi)).Re
			worst = math.Max(worst, math.Abs(F.Mid()-q))
			// Quadrature error ≈ 1e-16 per piece; F itself ≤ 1.
			if tol := 1e-14 + 1e-12*math.Abs(q); math.Abs(F.Mid()-q) > tol {
				t.Errorf("F_%d(%g) = %v, want %.17g (quadrature), tol %.2g", m, xi, F, q, tol)
			}
		}
	}
	t.Logf("worst |F - quadrature| over orders 1..8: %.3g", worst)
}

// TestBSplineEnvelopes checks |M_m| ≤ Spatial and |F| ≤ Spectral on fine
// samples, the spectral one against bigref's sine.
func TestBSplineEnvelopes(t *testing.T) {
	for m := 1; m <= MaxBSplineOrder; m++ {
		sp := BSplineFamily{Order: m}.Spatial()
		for i := -1000; i <= 1000; i++ {
			x := float64(i) * float64(m) / 1800
			if v := bigBSpline(m, bigref.New(x)); !bigref.In(0, sp.At(Point(x)), v) {
				t.Errorf("M_%d(%g) = %.17g above its spatial envelope %.17g", m, x, bigref.Float64(v), sp.At(Point(x)))
			}
		}
	}
	var touch [MaxBSplineOrder + 1]float64 // sup |F|/envelope: 1 means the envelope is attained
	for i := -300; i <= 300; i++ {
		xi := float64(i) * 0.0731
		if xi == 0 {
			continue
		}
		u := bigref.New(xi / 2)
		s := bigref.Abs(bigref.Quo(bigref.Sin(u), u))
		p := bigref.Int(1)
		for m := 1; m <= MaxBSplineOrder; m++ {
			p = bigref.Mul(p, s) // |F_m(ξ)|
			env := (BSplineFamily{Order: m}).Spectral().At(Point(xi))
			if !bigref.In(0, env, p) {
				t.Errorf("|F_%d(%g)| = %.17g above its spectral envelope %g", m, xi, bigref.Float64(p), env)
			}
			if math.Abs(xi) > 4 {
				touch[m] = math.Max(touch[m], bigref.Float64(p)/env)
			}
		}
	}
	t.Logf("tightness of the spectral envelope for |ξ| > 4, sup |F|/envelope by order: %.3f", touch[1:])
}

// TestBSplinePartitionOfUnity checks Σ_k M_m(x - k) = 1 (de Boor, 1978,
// from memory): the Poisson formula at h = 1, ξ = 0, where every alias term
// F(2πl) = 0, so AliasSum must return an Error containing 0 for every
// shift. The spectral side is checked too where its envelope is summable
// (m ≥ 3) with a tolerance that keeps it affordable.
func TestBSplinePartitionOfUnity(t *testing.T) {
	shifts := []float64{0, 0.5, 0.25, 1.0 / 3, -0.7, 0.123456789, 12.5}
	for m := 1; m <= MaxBSplineOrder; m++ {
		b := BSplineFamily{Order: m}
		for _, s := range shifts {
			sides := []Settings{{}, {Side: SpatialSide}}
			if m >= 3 {
				sides = append(sides, Settings{Side: SpectralSide, Tol: 1e-9, MaxTerms: 1 << 22})
			}
			for _, set := range sides {
				r, err := AliasSum(context.Background(), b, Grid{Step: 1, Shift: s}, 0, set)
				if err != nil {
					t.Errorf("m=%d s=%g side=%v: %v", m, s, set.Side, err)
					continue
				}
				if !r.Error.Contains(0) || !r.Sampled.Contains(1) {
					t.Errorf("m=%d s=%g side=%v: Σ_k M_m(s+k) = %v, error %v, want 1 and 0 (partition of unity)", m, s, set.Side, r.Sampled, r.Error)
				}
			}
		}
	}
}

// TestBSplineInvalid checks the order's domain.
func TestBSplineInvalid(t *testing.T) {
	tests := []struct {
		m     int
		param string
	}{
		{0, "bspline.order"}, {-1, "bspline.order"}, {9, "bspline.order"}, {1 << 40, "bspline.order"},
	}
	for _, tt := range tests {
		_, err := NewBSpline(tt.m)
		var pe *ParamError
		if !errors.Is(err, ErrInvalid) || !errors.As(err, &pe) || pe.Param != tt.param {
			t.Errorf("NewBSpline(%d) = %v, want ErrInvalid naming %q", tt.m, err, tt.param)
		}
		_, err = AliasSum(context.Background(), BSplineFamily{Order: tt.m}, Grid{Step: 1}, 0, Settings{})
		if !errors.Is(err, ErrInvalid) || !errors.As(err, &pe) || pe.Param != tt.param {
			t.Errorf("AliasSum(bspline(%d)) = %v, want ErrInvalid naming %q", tt.m, err, tt.param)
		}
	}
}

// TestBSplineContainment checks AliasSum on B-splines of every order
// against direct spatial sums in math/big (famref_test.go): 6 parameter
// points per order (48 in all), steps from coarser than the support to
// h = 1/16, several shifts and frequencies up to 0.97 of the Nyquist
// frequency π/h, infinite and finite grids (truncating and covering). For
// the box (m = 1) the shifts keep samples away from the jumps (see
// TestGridAtWidensExactJumps).
func TestBSplineContainment(t *testing.T) {
	steps := []float64{2.5, 1, 0.7, 0.31, 0.1, 0.0625}
	shifts := []float64{0.0123, 0.1234, -0.377, 3.3001, 0.5001, -0.0311}
	counts := []int64{0, 3, 0, 7, 0, 64}
	var st widthStats
	for m := 1; m <= MaxBSplineOrder; m++ {
		b := BSplineFamily{Order: m}
		for i, h := range steps {
			xis := []float64{0, 0.9, -2.2, 0.97 * math.Pi / h}
			g := Grid{Step: h, Shift: shifts[(i+m)%len(shifts)], Count: counts[(i+m)%len(counts)]}
			xi := xis[(i+m)%len(xis)]
			got, err := AliasSum(context.Background(), b, g, xi, Settings{})
			if err != nil {
				t.Errorf("m=%d %+v ξ=%g: %v", m, g, xi, err)
				continue
			}
			ref := refSum([]refAxis{refBSpline(m)}, []Grid{g}, []float64{xi}, 1<<20)
			checkSum(t, fmt.Sprintf("bspline(%d) %+v ξ=%g", m, g, xi), got, ref, &st)
		}
	}
	t.Logf("%d parts contained; worst relative width (non-tiny) %.3g; worst width/scale %.3g", st.contained, st.worstRel, st.worstAbs)
}

// TestGridAtWidensExactJumps shows that sample positions that are exact
// floating-point numbers still reach the families as intervals a few ulps
// wide, so a sample sitting exactly on a jump (the box at ±1/2, the
// Kaiser-Bessel window at ±W/2) gets the hull of both sides instead of the
// midpoint value 1/2. The result is valid but loose: for the partition of
// unity Σ_k M_1(1/2 + k) = M_1(-1/2) + M_1(1/2) = 1 (de Boor, from memory)
// AliasSum returns [0, 2].
func TestGridAtWidensExactJumps(t *testing.T) {
	r, err := AliasSum(context.Background(), BSplineFamily{Order: 1}, Grid{Step: 1, Shift: 0.5}, 0, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	// A few ulps of rounding from the sum itself are expected; the hull of
	// both sides of the jump would be [0, 2].
	if w := r.Sampled.Re.Width(); w > 1e-14 || !r.Sampled.Re.Contains(1) {
		t.Errorf("Σ_k M_1(1/2 + k) = %v: width %.3g, want the point 1 (midpoint values 1/2 + 1/2)", r.Sampled, w)
	}
}

// TestAutoSideZeroAliasSum shows AliasSum failing where the spatial side
// is cheap: for the B-spline of order 8 at h = 0.2, ξ = -4π, every alias
// copy F(ξ + 2πl/h) = sinc(π(5l - 2))^8 sits on a zero of F, so the alias
// sum is exactly 0 (as is F(ξ)). The automatic side choice takes the
// spectral side, whose remainder goal (relative to a sum that stays 0,
// floored at 2⁻¹⁰²²) cannot be met by an algebraic tail, and the call ends
// with ErrWorkLimit after about 3 s, although the spatial side needs 66
// samples (Settings{Side: SpatialSide} succeeds).
func TestAutoSideZeroAliasSum(t *testing.T) {
	b := BSplineFamily{Order: 8}
	g := Grid{Step: 0.2, Shift: -0.06142}
	r, err := AliasSum(context.Background(), b, g, -4*math.Pi, Settings{})
	if err != nil {
		t.Fatalf("AliasSum(bspline(8), h=0.2, ξ=-4π) = %v, want a result (the spatial side needs 66 samples)", err)
	}
	if !r.Error.Contains(0) {
		t.Errorf("error = %v, want it to contain 0 (every alias copy is 0)", r.Error)
	}
}

var sinkSum SampledSum

// BenchmarkAliasSumBSpline times AliasSum for B-splines of a few orders
// on an infinite grid at a nonzero frequency (spatial side, a handful of
// samples).
func BenchmarkAliasSumBSpline(b *testing.B) {
	for _, m := range []int{1, 4, 8} {
		f := BSplineFamily{Order: m}
		b.Run(fmt.Sprintf("order=%d", m), func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				r, err := AliasSum(context.Background(), f, Grid{Step: 0.7, Shift: 0.123}, 0.9, Settings{})
				if err != nil {
					b.Fatal(err)
				}
				sinkSum = r
			}
		})
	}
}

var sinkC Complex

// BenchmarkBSplineEval times one value and one transform enclosure.
func BenchmarkBSplineEval(b *testing.B) {
	for _, m := range []int{1, 4, 8} {
		f := BSplineFamily{Order: m}
		b.Run(fmt.Sprintf("order=%d", m), func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				sinkC = f.Value(Point(0.3)).Add(f.Transform(Point(2.1)))
			}
		})
	}
}

// bsplineRat is M_m(x) in exact rational arithmetic by the truncated-power
// formula (Schoenberg 1946; de Boor 1978, ch. IX — from memory), with the
// midpoint value 1/2 of the box at its jumps.
func bsplineRat(m int, x float64) *big.Rat {
	X := new(big.Rat).SetFloat64(x)
	if m == 1 {
		a := new(big.Rat).Abs(X)
		switch a.Cmp(big.NewRat(1, 2)) {
		case -1:
			return big.NewRat(1, 1)
		case 0:
			return big.NewRat(1, 2)
		}
		return new(big.Rat)
	}
	sum := new(big.Rat)
	c := big.NewRat(1, 1) // (-1)^j C(m, j)
	for j := 0; j <= m; j++ {
		t := new(big.Rat).Add(X, big.NewRat(int64(m)-2*int64(j), 2)) // x + m/2 - j
		if t.Sign() > 0 {
			p := big.NewRat(1, 1)
			for range m - 1 {
				p.Mul(p, t)
			}
			sum.Add(sum, new(big.Rat).Mul(c, p))
		}
		c.Mul(c, big.NewRat(-int64(m-j), int64(j+1)))
	}
	fact := big.NewRat(1, 1)
	for k := 2; k < m; k++ {
		fact.Mul(fact, big.NewRat(int64(k), 1))
	}
	return sum.Quo(sum, fact)
}

// TestBSplineValueExact checks Value, which takes the polynomial pieces by
// Horner's rule inside a knot interval and the truncated powers across
// knots, against exact rational values of the truncated-power formula at
// 800 seeded points per order, at every knot and near it, and on thin
// and wide intervals (each endpoint's value must be enclosed, and on an
// interval within one piece the enclosure must be tight: relative width
// ≤ 1e-13 where M_m ≥ 1e-6).
func TestBSplineValueExact(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 1))
	for m := 1; m <= MaxBSplineOrder; m++ {
		f := BSplineFamily{Order: m}
		half := float64(m) / 2
		var xs []float64
		for k := -m; k <= m; k++ {
			knot := float64(k) / 2
			xs = append(xs, knot, math.Nextafter(knot, -10), math.Nextafter(knot, 10), knot+1e-9, knot-1e-9)
		}
		for range 800 {
			xs = append(xs, (r.Float64()*2-1)*(half+0.5))
		}
		for i, x := range xs {
			want := bsplineRat(m, x)
			got := f.Value(Point(x)).Re
			if !ratIn(got, want) {
				w, _ := want.Float64()
				t.Errorf("M_%d(%g) = %v, want %.17g", m, x, got, w)
			}
			if w, _ := want.Float64(); w >= 1e-6 && got.RelWidth() > 1e-13 {
				t.Errorf("M_%d(%g) = %v: relative width %.3g, want ≤ 1e-13", m, x, got, got.RelWidth())
			}
			// Thin and wide intervals: both ends enclosed.
			d := []float64{1e-12, 0.3}[i%2]
			iv := Interval{x, x + d}
			giv := f.Value(iv).Re
			for _, v := range []float64{iv.Lo, iv.Hi} {
				if !ratIn(giv, bsplineRat(m, v)) {
					t.Errorf("M_%d(%v) = %v does not contain M_%d(%g)", m, iv, giv, m, v)
				}
			}
		}
	}
}

func ratIn(iv Interval, v *big.Rat) bool {
	lo, hi := new(big.Rat), new(big.Rat)
	if math.IsInf(iv.Lo, 0) || math.IsInf(iv.Hi, 0) {
		return true
	}
	lo.SetFloat64(iv.Lo)
	hi.SetFloat64(iv.Hi)
	return lo.Cmp(v) <= 0 && v.Cmp(hi) <= 0
}

// TestPartitionOfUnityExactAtKnots checks that the alias sums of the hat
// and the quadratic B-spline at h = 1, zero shift, are exact: their samples
// at the integers (1; 3/4, 1/8, 1/8, de Boor 1978, from memory) and their
// transform at 0 (sin(x)/x → 1, DLMF 4.19.1) are binary fractions, so
// T = F = 1 and the enclosure of T - F is the single point 0.
func TestPartitionOfUnityExactAtKnots(t *testing.T) {
	if s := Sinc(Point(0)); s != Point(1) {
		t.Errorf("Sinc(0) = %v, want exactly 1", s)
	}
	for _, m := range []int{2, 3} {
		r, err := AliasSum(context.Background(), BSplineFamily{Order: m}, Grid{Step: 1}, 0, Settings{})
		if err != nil {
			t.Fatal(err)
		}
		if r.Error != (Complex{}) || r.Exact != RealC(Point(1)) {
			t.Errorf("m=%d: F = %v, T - F = %v, want exactly 1 and 0", m, r.Exact, r.Error)
		}
	}
}
