package bounds

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"
	"strings"
	"testing"

	"foldbound/internal/bigref"
)

// ndCase is one parameter point of the n-dimensional containment tests.
type ndCase struct {
	f     Factored
	grids []Grid
	xi    []float64
}

// radialCases returns 40 parameter points for the isotropic Gaussian in
// dimension n: eight steps from coarse (alias error of order 1) to fine,
// each in five variants (infinite grids, anisotropic steps with a
// frequency near Nyquist, partly and wholly finite grids, even counts).
func radialCases(n int) []ndCase {
	steps := []float64{2.2, 1.5, 1, 0.8, 0.6, 0.5, 0.3, 0.15}
	if n == 3 {
		steps = []float64{3, 2, 1.5, 1.2, 1, 0.7, 0.5, 0.25}
	}
	var out []ndCase
	for i, r := range steps {
		sigma := []float64{1, 0.6}[i%2]
		c := []float64{0.3, -0.2, 0.7}[:n]
		if i%3 == 2 {
			c = []float64{1.7, 0.4, -2.1}[:n]
		}
		f := RadialGaussian{Sigma: sigma, Center: c}
		h := r * sigma
		for v := 0; v < 5; v++ {
			grids := make([]Grid, n)
			xi := make([]float64, n)
			for j := range grids {
				hj := h
				if v == 1 && j == 1 {
					hj = 1.37 * h
				}
				grids[j] = Grid{Step: hj, Shift: []float64{0.1, -0.3, 0.44, 2.5, -7.25}[(v+j)%5] * hj}
				switch v {
				case 1:
					xi[j] = []float64{0.5 / sigma, -0.9 * math.Pi / hj, 0.2}[j]
				case 2:
					grids[j].Count = []int64{7, 0, 3}[j]
					xi[j] = []float64{0.3, 0.2, -0.1}[j]
				case 3:
					grids[j].Count = []int64{4, 21, 9}[j]
					xi[j] = []float64{0.97 * math.Pi / hj, 0, 1}[j]
				case 4:
					grids[j].Count = []int64{101, 64, 33}[j]
					xi[j] = []float64{-1.1, 0.7, 0}[j]
				}
			}
			out = append(out, ndCase{f, grids, xi})
		}
	}
	return out
}

// separableCases returns 40 parameter points for the products of
// sepFamilies, ten each.
func separableCases() []ndCase {
	var out []ndCase
	for fi, s := range sepFamilies() {
		for i := 0; i < 10; i++ {
			n := s.Dim()
			grids := make([]Grid, n)
			xi := make([]float64, n)
			r := []float64{1.3, 1, 0.7, 0.5, 0.37, 0.25, 0.2, 0.13, 0.1, 0.07}[i]
			for j := range grids {
				h := r * (1 + 0.21*float64(j))
				grids[j] = Grid{Step: h, Shift: []float64{0.0123, -0.3071, 0.4449, 2.5013}[(i+j+fi)%4] * h}
				if i%3 == 1 {
					grids[j].Count = []int64{5, 0, 12}[j]
				}
				if i%3 == 2 {
					grids[j].Count = []int64{0, 31, 3}[j]
				}
				xi[j] = []float64{0, 0.6, -0.83 * math.Pi / h, 1.9}[(i+2*j)%4]
			}
			out = append(out, ndCase{s, grids, xi})
		}
	}
	return out
}

// TestAliasSumNDContainment checks AliasSumND against direct spatial sums
// in math/big (famref_test.go) for the isotropic Gaussian in 2-D and 3-D
// and for separable products of Gaussians, B-splines and Kaiser-Bessel
// windows: 40 parameter points each. The reference adds every term of the
// n-dimensional sum separately when there are at most 20000 of them;
// otherwise (the finer grids) it takes the product of the one-dimensional
// sums, equal to the n-dimensional sum by distributivity.
func TestAliasSumNDContainment(t *testing.T) {
	groups := []struct {
		name  string
		cases []ndCase
	}{
		{"radial gaussian 2-D", radialCases(2)},
		{"radial gaussian 3-D", radialCases(3)},
		{"separable", separableCases()},
	}
	for _, gr := range groups {
		var st widthStats
		direct := 0
		for _, c := range gr.cases {
			name := fmt.Sprintf("%v %+v ξ=%v", c.f, c.grids, c.xi)
			got, err := AliasSumND(context.Background(), c.f, c.grids, c.xi, Settings{})
			if err != nil {
				t.Errorf("%s: %v", name, err)
				continue
			}
			axes := make([]refAxis, len(c.grids))
			count := 1
			for j, f := range c.f.Factors() {
				axes[j] = refAxisOf(t, f)
				k0, k1 := axes[j].window(c.grids[j])
				count *= int(k1 - k0 + 1)
			}
			if count <= 20000 {
				direct++
			}
			ref := refSum(axes, c.grids, c.xi, 20000)
			checkSum(t, name, got, ref, &st)
		}
		t.Logf("%s: %d points (%d summed term by term), %d parts contained; worst relative width (non-tiny) %.3g; worst width/scale %.3g",
			gr.name, len(gr.cases), direct, st.contained, st.worstRel, st.worstAbs)
	}
}

// TestAliasSumNDNonSeparableReference checks a few 2-D radial Gaussian
// sums against references whose terms are exp(-|x-c|²/(2σ²)) computed
// from the whole squared distance with bigref.Exp (not as products over
// axes).
func TestAliasSumNDNonSeparableReference(t *testing.T) {
	tests := []struct {
		sigma float64
		c     []float64
		grids []Grid
		xi    []float64
	}{
		{1, []float64{0.3, -0.2}, []Grid{{Step: 1.1, Shift: 0.2}, {Step: 0.9, Shift: -0.35}}, []float64{0.4, -1.2}},
		{0.8, []float64{0, 0.5}, []Grid{{Step: 0.5, Shift: 0.1, Count: 9}, {Step: 0.7, Shift: 0}}, []float64{0, 2.1}},
		{1.2, []float64{-1, 1}, []Grid{{Step: 2, Shift: 0.7}, {Step: 2.4, Shift: 1.1, Count: 3}}, []float64{1.3, 0}},
	}
	for _, tt := range tests {
		f := RadialGaussian{Sigma: tt.sigma, Center: tt.c}
		got, err := AliasSumND(context.Background(), f, tt.grids, tt.xi, Settings{})
		if err != nil {
			t.Fatal(err)
		}
		// Direct double sum over |x_j - c_j| ≤ 14σ (omitted terms below
		// e^{-98} < 1e-42 of the peak).
		var k0, k1 [2]int64
		for j, g := range tt.grids {
			k0[j] = int64(math.Floor((tt.c[j]-14*tt.sigma-g.Shift)/g.Step)) - 1
			k1[j] = int64(math.Ceil((tt.c[j]+14*tt.sigma-g.Shift)/g.Step)) + 1
			if g.Count > 0 {
				lo, hi := g.Indices()
				k0[j], k1[j] = max(k0[j], lo), min(k1[j], hi)
			}
		}
		twoS2 := bigref.Mul(bigref.Int(2), bigref.Mul(bigref.New(tt.sigma), bigref.New(tt.sigma)))
		hh := bigref.Mul(bigref.New(tt.grids[0].Step), bigref.New(tt.grids[1].Step))
		T := bigref.Real(bigref.Int(0))
		for a := k0[0]; a <= k1[0]; a++ {
			x := bigref.Add(bigref.New(tt.grids[0].Shift), bigref.Mul(bigref.New(tt.grids[0].Step), bigref.Int(a)))
			dx := bigref.Sub(x, bigref.New(tt.c[0]))
			for b := k0[1]; b <= k1[1]; b++ {
				y := bigref.Add(bigref.New(tt.grids[1].Shift), bigref.Mul(bigref.New(tt.grids[1].Step), bigref.Int(b)))
				dy := bigref.Sub(y, bigref.New(tt.c[1]))
				r2 := bigref.Add(bigref.Mul(dx, dx), bigref.Mul(dy, dy))
				v := bigref.Exp(bigref.Neg(bigref.Quo(r2, twoS2)))
				ph := bigref.Add(bigref.Mul(bigref.New(tt.xi[0]), x), bigref.Mul(bigref.New(tt.xi[1]), y))
				T = T.Add(bigref.Cis(bigref.Neg(ph)).Scale(bigref.Mul(hh, v)))
			}
		}
		if !T.In(got.Sampled.Re.Lo-1e-40, got.Sampled.Re.Hi+1e-40, got.Sampled.Im.Lo-1e-40, got.Sampled.Im.Hi+1e-40) {
			t.Errorf("%v %+v ξ=%v: T = %v, want it to contain %.17g%+.17gi (direct double sum)", f, tt.grids, tt.xi, got.Sampled,
				bigref.Float64(T.Re), bigref.Float64(T.Im))
		}
	}
}

// TestPoisson2D checks the Poisson summation formula in two dimensions
// (math.md, "Lattices in n dimensions", diagonal case) for the separable
// product of a Gaussian and the B-spline of order 8, each side summed
// independently in math/big:
//
//	h1 h2 Σ_{k∈Z²} f(x_k) e^{-iξ·x_k} = Σ_{l∈Z²} F(ξ + 2πl/h) e^{i2πl·s/h}
//
// The spatial side is a finite double sum (the spline has compact support,
// the Gaussian is cut at 20σ). The spectral side is summed over |l1| ≤ 6
// (Gaussian copies beyond are below e^{-10³}) and |l2| ≤ L = 600, with the
// rest bounded by Σ_{l1}|F1| · 2 Σ_{l>L} (2/(2πl/h2 - |ξ2|))^8 ≤
// Σ|F1| · 2·2^8·(h2/2π)/(7(2πL/h2 - |ξ2|)^7). AliasSumND must enclose the
// spatial value, and the two sides must agree within that bound.
func TestPoisson2D(t *testing.T) {
	sigma, m := 0.8, 8
	f := Separable{Axes: []Family{GaussianFamily{Sigma: sigma}, BSplineFamily{Order: m}}}
	tests := []struct {
		h, s, xi [2]float64
	}{
		{[2]float64{0.6, 0.7}, [2]float64{0.13, -0.21}, [2]float64{0.9, -1.3}},
		{[2]float64{1.9, 1.2}, [2]float64{0.5, 0.3}, [2]float64{-1.4, 2.5}},
		{[2]float64{0.35, 1}, [2]float64{0, 0.5}, [2]float64{0, 0}},
	}
	const L = 600
	for _, tt := range tests {
		grids := []Grid{{Step: tt.h[0], Shift: tt.s[0]}, {Step: tt.h[1], Shift: tt.s[1]}}
		got, err := AliasSumND(context.Background(), f, grids, tt.xi[:], Settings{})
		if err != nil {
			t.Fatal(err)
		}
		// Spatial side: every term of the double sum.
		ax := []refAxis{refGaussian(sigma, 0), refBSpline(m)}
		var ts [2][]bigref.Complex
		for j := range ax {
			k0, k1 := ax[j].window(grids[j])
			ts[j], _ = ax[j].terms(grids[j], tt.xi[j], k0, k1)
		}
		spatial := directSum(ts[:])

		// Spectral side: every term of the double sum over l.
		pi := bigref.Pi()
		twoPi := bigref.Mul(bigref.Int(2), pi)
		var fs [2][]bigref.Complex
		sumF1 := bigref.Int(0)
		for j, lmax := range []int{6, L} {
			P := bigref.Quo(twoPi, bigref.New(tt.h[j])) // 2π/h
			ph := bigref.Cis(bigref.Mul(P, bigref.New(tt.s[j])))
			phInv := bigref.Cis(bigref.Neg(bigref.Mul(P, bigref.New(tt.s[j]))))
			var rot, rotInv bigref.Complex // e^{iπl/h} steps for the spline's sine
			if j == 1 {
				half := bigref.Quo(P, bigref.Int(2))
				rot, rotInv = bigref.Cis(half), bigref.Cis(bigref.Neg(half))
			}
			for _, dir := range []int{1, -1} {
				phase := bigref.Real(bigref.Int(1))
				var sn bigref.Complex
				if j == 1 {
					sn = bigref.Cis(bigref.New(tt.xi[1] / 2)) // e^{i(ξ2 + lP)/2} at l = 0
				}
				for l := 0; l <= lmax; l++ {
					if !(l == 0 && dir == -1) {
						w := bigref.Add(bigref.New(tt.xi[j]), bigref.Mul(bigref.Int(int64(dir*l)), P))
						var F *big.Float
						if j == 0 {
							sw := bigref.Mul(bigref.New(sigma), w)
							F = bigref.Mul(bigref.Mul(bigref.New(sigma), bigref.Sqrt(twoPi)), bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(sw, sw), bigref.Int(2)))))
							sumF1 = bigref.Add(sumF1, F)
						} else {
							u := bigref.Quo(w, bigref.Int(2))
							if u.Sign() == 0 {
								F = bigref.Int(1)
							} else {
								F = bigref.Int(1)
								sc := bigref.Quo(sn.Im, u)
								for p := 0; p < m; p++ {
									F = bigref.Mul(F, sc)
								}
							}
						}
						fs[j] = append(fs[j], phase.Scale(F))
					}
					if dir == 1 {
						phase = phase.Mul(ph)
						if j == 1 {
							sn = sn.Mul(rot)
						}
					} else {
						phase = phase.Mul(phInv)
						if j == 1 {
							sn = sn.Mul(rotInv)
						}
					}
				}
			}
		}
		spectral := directSum(fs[:])
		x := 2*math.Pi*L/tt.h[1] - math.Abs(tt.xi[1])
		tail := bigref.Float64(sumF1) * 2 * math.Pow(2, 8) * (tt.h[1] / (2 * math.Pi)) / (7 * math.Pow(x, 7)) * 2
		name := fmt.Sprintf("%v h=%v s=%v ξ=%v", f, tt.h, tt.s, tt.xi)
		d := bigref.Float64(spatial.Sub(spectral).Abs())
		if d > tail {
			t.Errorf("%s: spatial and spectral sides differ by %.3g, want ≤ %.3g (Poisson)", name, d, tail)
		}
		t.Logf("%s: |T| = %.3g, sides differ by %.3g (bound on the spectral tail %.3g); |T - F| = %.3g",
			name, bigref.Float64(spatial.Abs()), d, tail, got.Error.Mag())
		z := got.Sampled
		if !spatial.In(z.Re.Lo, z.Re.Hi, z.Im.Lo, z.Im.Hi) {
			t.Errorf("%s: T = %v, want it to contain the spatial side %.17g%+.17gi", name, z, bigref.Float64(spatial.Re), bigref.Float64(spatial.Im))
		}
		if !spectral.In(z.Re.Lo-tail, z.Re.Hi+tail, z.Im.Lo-tail, z.Im.Hi+tail) {
			t.Errorf("%s: T = %v, want it within %.3g of the spectral side %.17g%+.17gi", name, z, tail, bigref.Float64(spectral.Re), bigref.Float64(spectral.Im))
		}
	}
}

// notFactored is an n-dimensional family that does not expose factors.
type notFactored struct{ n int }

func (f notFactored) Dim() int                        { return f.n }
func (f notFactored) Value(x []Interval) Complex      { return RealC(Point(0)) }
func (f notFactored) Transform(xi []Interval) Complex { return RealC(Point(0)) }
func (f notFactored) Spatial() RadialEnvelope         { return RadialEnvelope{Center: make([]float64, f.n)} }
func (f notFactored) Spectral() RadialEnvelope        { return RadialEnvelope{Center: make([]float64, f.n)} }
func (f notFactored) String() string                  { return fmt.Sprintf("not_factored(%d)", f.n) }

// TestAliasSumNDInvalid checks the argument checks of AliasSumND.
func TestAliasSumNDInvalid(t *testing.T) {
	g2 := RadialGaussian{Sigma: 1, Center: []float64{0, 0}}
	ok := []Grid{{Step: 1}, {Step: 1}}
	nine := make([]Family, 9)
	for j := range nine {
		nine[j] = GaussianFamily{Sigma: 1}
	}
	tests := []struct {
		name  string
		f     FamilyND
		grids []Grid
		xi    []float64
		set   Settings
		param string
		msg   string // a phrase the message must contain
	}{
		{"nil family", nil, ok, []float64{0, 0}, Settings{}, "family", ""},
		{"dimension 0", notFactored{0}, nil, nil, Settings{}, "family", "dimension"},
		{"dimension 9", Separable{Axes: nine}, make([]Grid, 9), make([]float64, 9), Settings{}, "family", "dimension"},
		{"dimension 9, no factors", notFactored{9}, make([]Grid, 9), make([]float64, 9), Settings{}, "family", "dimension"},
		{"too few grids", g2, ok[:1], []float64{0, 0}, Settings{}, "grids", ""},
		{"too many grids", g2, []Grid{{Step: 1}, {Step: 1}, {Step: 1}}, []float64{0, 0}, Settings{}, "grids", ""},
		{"too few frequencies", g2, ok, []float64{0}, Settings{}, "xi", ""},
		{"nil frequencies", g2, ok, nil, Settings{}, "xi", ""},
		{"bad step", g2, []Grid{{Step: 1}, {Step: -1}}, []float64{0, 0}, Settings{}, "grids[1].step", ""},
		{"bad count", g2, []Grid{{Step: 1, Count: -3}, {Step: 1}}, []float64{0, 0}, Settings{}, "grids[0].count", ""},
		{"NaN frequency", g2, ok, []float64{math.NaN(), 0}, Settings{}, "xi[0]", ""},
		{"infinite frequency", g2, ok, []float64{0, math.Inf(1)}, Settings{}, "xi[1]", ""},
		{"bad tolerance", g2, ok, []float64{0, 0}, Settings{Tol: -1}, "settings.tol", ""},
		{"bad sigma", RadialGaussian{Sigma: 0, Center: []float64{0, 0}}, ok, []float64{0, 0}, Settings{}, "family.radial_gaussian.sigma", ""},
		{"bad factor", Separable{Axes: []Family{GaussianFamily{Sigma: 1}, BSplineFamily{Order: 12}}}, ok, []float64{0, 0}, Settings{}, "family.separable.axes[1].bspline.order", ""},
		{"not factorisable", notFactored{2}, ok, []float64{0, 0}, Settings{}, "family", "lattice engine"},
	}
	for _, tt := range tests {
		_, err := AliasSumND(context.Background(), tt.f, tt.grids, tt.xi, tt.set)
		var pe *ParamError
		if !errors.Is(err, ErrInvalid) || !errors.As(err, &pe) || pe.Param != tt.param {
			t.Errorf("%s: AliasSumND = %v, want ErrInvalid naming %q", tt.name, err, tt.param)
			continue
		}
		if !strings.Contains(err.Error(), tt.msg) {
			t.Errorf("%s: AliasSumND = %v, want the message to mention %q", tt.name, err, tt.msg)
		}
	}
}

// TestAliasSumNDWorkLimit checks that MaxTerms is a total over the axes.
func TestAliasSumNDWorkLimit(t *testing.T) {
	f := RadialGaussian{Sigma: 1, Center: []float64{0, 0, 0}}
	grids := []Grid{{Step: 0.1}, {Step: 0.1}, {Step: 0.1}}
	xi := []float64{0, 0, 0}
	// Each axis needs about 2·9σ/h ≈ 180 samples on the spatial side.
	r, err := AliasSumND(context.Background(), f, grids, xi, Settings{Side: SpatialSide, MaxTerms: 1000})
	if err != nil {
		t.Fatalf("MaxTerms 1000: %v", err)
	}
	if used := r.Method.AliasTerms + r.Method.TruncationTerms; used > 1000 {
		t.Errorf("MaxTerms 1000: used %d terms", used)
	}
	_, err = AliasSumND(context.Background(), f, grids, xi, Settings{Side: SpatialSide, MaxTerms: 300})
	if !errors.Is(err, ErrWorkLimit) {
		t.Errorf("MaxTerms 300 for 3 axes of ~180 samples: err = %v, want ErrWorkLimit", err)
	}
	_, err = AliasSumND(context.Background(), f, grids, xi, Settings{MaxTerms: 2})
	if !errors.Is(err, ErrWorkLimit) {
		t.Errorf("MaxTerms 2 for 3 axes: err = %v, want ErrWorkLimit", err)
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := AliasSumND(ctx, f, grids, xi, Settings{}); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled context: err = %v, want context.Canceled", err)
	}
}

// TestAliasSumNDOneAxis checks that in one dimension AliasSumND returns
// AliasSum's result.
func TestAliasSumNDOneAxis(t *testing.T) {
	g := Grid{Step: 0.7, Shift: 0.2, Count: 9}
	a, err := AliasSum(context.Background(), shiftedGaussian{sigma: 1, center: 0.3}, g, 0.4, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	b, err := AliasSumND(context.Background(), RadialGaussian{Sigma: 1, Center: []float64{0.3}}, []Grid{g}, []float64{0.4}, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	if a.Error != b.Error || a.Exact != b.Exact || a.Alias != b.Alias || a.Truncation != b.Truncation || a.Method != b.Method {
		t.Errorf("AliasSumND in 1-D = %+v, want AliasSum's %+v", b, a)
	}
}

// BenchmarkAliasSumND times AliasSumND for the isotropic Gaussian (σ = 1)
// on square grids with h = 0.76, where the alias error is about 1e-15 of
// F, in 2 and 3 dimensions.
func BenchmarkAliasSumND(b *testing.B) {
	for _, n := range []int{2, 3} {
		f := RadialGaussian{Sigma: 1, Center: []float64{0.3, -0.2, 0.1}[:n]}
		grids := make([]Grid, n)
		for j := range grids {
			grids[j] = Grid{Step: 0.76, Shift: 0.05}
		}
		xi := []float64{0.4, -0.3, 0.2}[:n]
		b.Run(fmt.Sprintf("dim=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				r, err := AliasSumND(context.Background(), f, grids, xi, Settings{})
				if err != nil {
					b.Fatal(err)
				}
				sinkSum = r
			}
		})
	}
}
