package bounds

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"foldbound/internal/bigref"

	"gonum.org/v1/gonum/integrate/quad"
)

// TestRadialGaussianTransformQuadrature checks
// F(ξ) = (σ√(2π))^n e^{-σ²|ξ|²/2} e^{-iξ·c} against the n-fold integral
// ∫ e^{-|x-c|²/(2σ²)} e^{-iξ·x} dx by nested Gauss-Legendre quadrature
// (gonum) over the box |x_j - c_j| ≤ 10σ (the rest is below e^{-50}), in 2
// and 3 dimensions. The integrand is evaluated as a whole (not as a
// product), so the test also checks the separation of the phase.
func TestRadialGaussianTransformQuadrature(t *testing.T) {
	tests := []struct {
		sigma float64
		c, xi []float64
		n     int // quadrature points per axis
		tol   float64
	}{
		{1, []float64{0, 0}, []float64{0, 0}, 60, 1e-13},
		{0.7, []float64{0.3, -1.1}, []float64{1.3, -0.4}, 60, 1e-13},
		{1.5, []float64{2, 0.5}, []float64{0.2, 2.1}, 80, 1e-13},
		{1, []float64{0.3, -0.2, 0.7}, []float64{0.5, -1, 1.5}, 64, 1e-12},
		{0.6, []float64{-1, 0, 1}, []float64{3, 0, -2}, 64, 1e-12},
	}
	worst := 0.0
	for _, tt := range tests {
		g, err := NewRadialGaussian(tt.sigma, tt.c)
		if err != nil {
			t.Fatal(err)
		}
		n := len(tt.c)
		var integrate func(j int, x []float64, part int) float64
		integrate = func(j int, x []float64, part int) float64 {
			lo, hi := tt.c[j]-10*tt.sigma, tt.c[j]+10*tt.sigma
			return quad.Fixed(func(v float64) float64 {
				x[j] = v
				if j+1 < n {
					return integrate(j+1, x, part)
				}
				r2, ph := 0.0, 0.0
				for i := range x {
					d := x[i] - tt.c[i]
					r2 += d * d
					ph += tt.xi[i] * x[i]
				}
				e := math.Exp(-r2 / (2 * tt.sigma * tt.sigma))
				if part == 0 {
					return e * math.Cos(ph)
				}
				return -e * math.Sin(ph)
			}, lo, hi, tt.n, quad.Legendre{}, 0)
		}
		re := integrate(0, make([]float64, n), 0)
		im := integrate(0, make([]float64, n), 1)
		xi := make([]Interval, n)
		for j, v := range tt.xi {
			xi[j] = Point(v)
		}
		F := g.Transform(xi)
		peak := math.Pow(tt.sigma*math.Sqrt(2*math.Pi), float64(n))
		e := math.Hypot(F.Re.Mid()-re, F.Im.Mid()-im) / peak
		worst = math.Max(worst, e)
		if e > tt.tol {
			t.Errorf("%v: F(%v) = %v, want %.17g%+.17gi (quadrature): error %.3g of the peak", g, tt.xi, F, re, im, e)
		}
	}
	t.Logf("worst quadrature discrepancy, relative to the peak: %.3g", worst)
}

// TestRadialGaussianValues checks values and transforms against math/big
// (bigref.Exp and bigref.Cis of the whole exponent), the factors against
// the whole, and the envelopes.
func TestRadialGaussianValues(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 3))
	for _, c := range [][]float64{{0.3}, {0.3, -0.2}, {1, -2, 0.5}, {0, 0, 0, 0, 0, 0, 0, 0.1}} {
		sigma := 0.5 + r.Float64()
		g, err := NewRadialGaussian(sigma, c)
		if err != nil {
			t.Fatal(err)
		}
		n := g.Dim()
		fs := g.Factors()
		for p := 0; p < 30; p++ {
			x := make([]Interval, n)
			xi := make([]Interval, n)
			r2, ph, q2 := bigref.Int(0), bigref.Int(0), bigref.Int(0)
			var rr, qq Interval
			fact, factF := RealC(Point(1)), RealC(Point(1))
			for j := range x {
				xv := c[j] + (r.Float64()*2-1)*3*sigma
				fv := (r.Float64()*2 - 1) * 3 / sigma
				x[j], xi[j] = Point(xv), Point(fv)
				d := bigref.Sub(bigref.New(xv), bigref.New(c[j]))
				r2 = bigref.Add(r2, bigref.Mul(d, d))
				ph = bigref.Add(ph, bigref.Mul(bigref.New(fv), bigref.New(c[j])))
				q2 = bigref.Add(q2, bigref.Mul(bigref.New(fv), bigref.New(fv)))
				rr = rr.Add(Point(xv).AddFloat(-c[j]).Sqr())
				qq = qq.Add(Point(fv).Sqr())
				fact = fact.Mul(fs[j].Value(x[j]))
				factF = factF.Mul(fs[j].Transform(xi[j]))
			}
			bs := bigref.New(sigma)
			s2 := bigref.Mul(bs, bs)
			want := bigref.Exp(bigref.Neg(bigref.Quo(r2, bigref.Mul(bigref.Int(2), s2))))
			amp := bigref.Int(1)
			for j := 0; j < n; j++ {
				amp = bigref.Mul(amp, bigref.Mul(bs, bigref.Sqrt(bigref.Mul(bigref.Int(2), bigref.Pi()))))
			}
			wantF := bigref.Cis(bigref.Neg(ph)).Scale(bigref.Mul(amp, bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(s2, q2), bigref.Int(2))))))
			v, F := g.Value(x), g.Transform(xi)
			for _, chk := range []struct {
				what string
				z    Complex
				want bigref.Complex
			}{{"f", v, bigref.Real(want)}, {"Π f_j", fact, bigref.Real(want)}, {"F", F, wantF}, {"Π F_j", factF, wantF}} {
				if !chk.want.In(chk.z.Re.Lo, chk.z.Re.Hi, chk.z.Im.Lo, chk.z.Im.Hi) {
					t.Errorf("%v: %s = %v, want it to contain %.17g%+.17gi", g, chk.what, chk.z, bigref.Float64(chk.want.Re), bigref.Float64(chk.want.Im))
				}
				if w := math.Max(chk.z.Re.Width(), chk.z.Im.Width()); w > 1e-13*bigref.Float64(chk.want.Abs()) {
					t.Errorf("%v: %s = %v: relative width %.3g, want ≤ 1e-13", g, chk.what, chk.z, w/bigref.Float64(chk.want.Abs()))
				}
			}
			if env := g.Spatial().Profile.At(Sqrt(rr)); !bigref.In(0, env*(1+1e-13), want) {
				t.Errorf("%v: f(%v) = %g above its envelope %g", g, x, bigref.Float64(want), env)
			}
			if env := g.Spectral().Profile.At(Sqrt(qq)); !bigref.In(0, env*(1+1e-13), wantF.Abs()) {
				t.Errorf("%v: |F(%v)| = %g above its envelope %g", g, xi, bigref.Float64(wantF.Abs()), env)
			}
		}
	}
}

// TestRadialGaussianInvalid checks the parameter domain.
func TestRadialGaussianInvalid(t *testing.T) {
	tests := []struct {
		name   string
		sigma  float64
		center []float64
		param  string
	}{
		{"zero sigma", 0, []float64{0}, "radial_gaussian.sigma"},
		{"NaN sigma", math.NaN(), []float64{0}, "radial_gaussian.sigma"},
		{"infinite sigma", math.Inf(1), []float64{0}, "radial_gaussian.sigma"},
		{"no axes", 1, nil, "radial_gaussian.center"},
		{"nine axes", 1, make([]float64, 9), "radial_gaussian.center"},
		{"NaN centre", 1, []float64{0, math.NaN()}, "radial_gaussian.center[1]"},
		{"infinite centre", 1, []float64{math.Inf(-1)}, "radial_gaussian.center[0]"},
	}
	for _, tt := range tests {
		_, err := NewRadialGaussian(tt.sigma, tt.center)
		var pe *ParamError
		if !errors.Is(err, ErrInvalid) || !errors.As(err, &pe) || pe.Param != tt.param {
			t.Errorf("%s: NewRadialGaussian = %v, want ErrInvalid naming %q", tt.name, err, tt.param)
		}
	}
}
