package gridding

import (
	"context"
	"errors"
	"math"
	"testing"

	"foldbound/bounds"
)

// direct2D sums f_{k1,k2} = Σ_j c_j e^{-i(k1x_j + k2y_j)} by the definition,
// with the phases formed as in Direct1 (exact products, first-order
// correction) and double-double accumulation.
func direct2D(n int, x, y []float64, c []complex128) []complex128 {
	f := make([]complex128, n*n)
	for i1 := 0; i1 < n; i1++ {
		for i2 := 0; i2 < n; i2++ {
			k1, k2 := float64(i1-n/2), float64(i2-n/2)
			var re, im ddSum
			for j := range x {
				c1, s1 := phase(k1, x[j])
				c2, s2 := phase(k2, y[j])
				// e^{-i(a+b)} = (c1c2 - s1s2) - i(s1c2 + c1s2)
				cs, sn := c1*c2-s1*s2, s1*c2+c1*s2
				a, b := real(c[j]), imag(c[j])
				re.add(a * cs)
				re.add(b * sn)
				im.add(b * cs)
				im.add(-a * sn)
			}
			f[i1*n+i2] = complex(re.value(), im.value())
		}
	}
	return f
}

// The 2-D type-1 transform against the direct sum: the observed error
// stays within the planned total for d = 2, whose kernel part is
// (1 + ε)² - 1 (doc.go, step 6). One point at the worst position in both
// axes shows how tight the product bound is.
func TestType1In2DAgainstDirect(t *testing.T) {
	ctx := context.Background()
	const n = 32
	for _, tt := range []struct {
		typ KernelType
		tol float64
	}{{KaiserBessel, 1e-4}, {KaiserBessel, 1e-9}, {Gaussian, 1e-6}} {
		res, err := Plan(ctx, Request{Modes: n, Dim: 2, Tolerance: tt.tol, Kernel: tt.typ})
		if err != nil {
			t.Fatal(err)
		}
		o := res.Best
		tr, err := NewTransform(o.Setup, o.Total)
		if err != nil {
			t.Fatal(err)
		}
		worst := 0.0
		for seed := uint64(0); seed < 3; seed++ {
			x, c := RandomInput(500, 300+seed)
			y, _ := RandomInput(500, 400+seed)
			got, err := tr.Type1In2D(ctx, x, y, c)
			if err != nil {
				t.Fatal(err)
			}
			e, _ := MaxError(got, direct2D(n, x, y, c), c)
			worst = math.Max(worst, e)
			if e > o.Total {
				t.Errorf("%v tol=%g %v seed %d: 2-D error %.3g > total %.3g", tt.typ, tt.tol, o.Setup.Kernel, seed, e, o.Total)
			}
		}
		// One point swept along the diagonal of a cell.
		h := 2 * math.Pi / float64(o.Setup.Grid)
		single := 0.0
		for i := 0; i <= 32; i++ {
			u := (5 + float64(o.Setup.Kernel.Width)/2 - float64(i)/32) * h
			got, err := tr.Type1In2D(ctx, []float64{u}, []float64{u}, []complex128{1})
			if err != nil {
				t.Fatal(err)
			}
			e, _ := MaxError(got, direct2D(n, []float64{u}, []float64{u}, []complex128{1}), []complex128{1})
			single = math.Max(single, e)
		}
		if single > o.Total {
			t.Errorf("%v tol=%g: one point error %.3g > total %.3g", tt.typ, tt.tol, single, o.Total)
		}
		t.Logf("2-D %v tol=%g σ=%g %v: bound (1+ε)²-1 = %.3g (ε = %.3g), random %.3g, one point %.3g (%.2f of the total)",
			tt.typ, tt.tol, o.Oversampling, o.Setup.Kernel, o.Bound.Total, o.Bound.PerAxis, worst, single, single/o.Total)
	}
}

func TestType1In2DBadInput(t *testing.T) {
	ctx := context.Background()
	tr, err := NewTransform(Setup{Modes: 16, Grid: 32, Kernel: Kernel{KaiserBessel, 6, 13}}, 0)
	if err != nil {
		t.Fatal(err)
	}
	big, err := NewTransform(Setup{Modes: 16, Grid: 1 << 14, Kernel: Kernel{KaiserBessel, 6, 13}}, 0)
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name  string
		run   func() error
		param string
		want  error
	}{
		{"y length", func() error { _, err := tr.Type1In2D(ctx, []float64{0}, nil, []complex128{1}); return err }, "y", bounds.ErrInvalid},
		{"y NaN", func() error {
			_, err := tr.Type1In2D(ctx, []float64{0}, []float64{math.NaN()}, []complex128{1})
			return err
		}, "y[0]", bounds.ErrInvalid},
		{"grid too large", func() error {
			_, err := big.Type1In2D(ctx, []float64{0}, []float64{0}, []complex128{1})
			return err
		}, "setup.grid", bounds.ErrWorkLimit},
	}
	for _, tt := range tests {
		err := tt.run()
		var pe *bounds.ParamError
		if !errors.As(err, &pe) || !errors.Is(err, tt.want) || pe.Param != tt.param {
			t.Errorf("%s: error = %v, want %v naming %q", tt.name, err, tt.want, tt.param)
		}
	}
}
