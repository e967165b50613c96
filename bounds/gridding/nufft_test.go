package gridding

import (
	"context"
	"errors"
	"math"
	"testing"

	"foldbound/bounds"
)

// acceptanceTolerances are the tolerances of the acceptance test (issue 6:
// 1e-3 to 1e-12).
var acceptanceTolerances = []float64{1e-3, 1e-4, 1e-5, 1e-6, 1e-7, 1e-8, 1e-9, 1e-10, 1e-11, 1e-12}

const (
	acceptModes  = 256
	acceptPoints = 4096
	acceptSets   = 20
)

// referenceSets returns the random point sets of the acceptance test with
// their direct sums (Direct1, the definition summed in double-double
// arithmetic; checked against math/big in direct_test.go).
func referenceSets(t *testing.T) (xs [][]float64, cs, refs [][]complex128) {
	t.Helper()
	ctx := context.Background()
	for set := range acceptSets {
		x, c := RandomInput(acceptPoints, uint64(1000+set))
		ref, err := Direct1(ctx, acceptModes, x, c)
		if err != nil {
			t.Fatal(err)
		}
		xs, cs, refs = append(xs, x), append(cs, c), append(refs, ref)
	}
	return xs, cs, refs
}

// singlePointSweep returns the largest error of the gridded type-1
// transform of one unit strength at 64 positions across one grid cell
// (and the nearest representable positions), over all modes: a lower
// estimate of the per-mode sup ε that the bound encloses, since for one
// point the error bound ε·Σ|c_j| is sharp.
func singlePointSweep(t *testing.T, tr *Transform) float64 {
	t.Helper()
	ctx := context.Background()
	s := tr.Setup()
	h := 2 * math.Pi / float64(s.Grid)
	w := float64(s.Kernel.Width)
	worst := 0.0
	for i := 0; i <= 64; i++ {
		// Positions where the window edge passes grid point 5 + the
		// offset i/64 of a cell, and just beside the edge.
		u := 5 + w/2 - float64(i)/64
		for _, x := range []float64{u * h, math.Nextafter(u*h, 0), math.Nextafter(u*h, 4)} {
			got, err := tr.Type1(ctx, []float64{x}, []complex128{1})
			if err != nil {
				t.Fatal(err)
			}
			ref, err := Direct1(ctx, s.Modes, []float64{x}, []complex128{1})
			if err != nil {
				t.Fatal(err)
			}
			e, _ := MaxError(got, ref, []complex128{1})
			worst = math.Max(worst, e)
		}
	}
	return worst
}

// TestGriddedAgainstDirect is the acceptance test of issue 6: for every
// tolerance from 1e-3 to 1e-12 and both kernels, every option of the plan
// (one per oversampling ratio that meets the tolerance) is run on 20
// random sets of 4096 points against the direct sum, and the observed
// error relative to Σ|c_j| never exceeds the planned total (certified
// kernel bound + rounding estimate). The test prints observed against the
// bound, and the single-point sweep, for which the bound is sharp, as the
// measure of tightness.
func TestGriddedAgainstDirect(t *testing.T) {
	ctx := context.Background()
	xs, cs, refs := referenceSets(t)
	for _, typ := range []KernelType{KaiserBessel, Gaussian} {
		for _, tol := range acceptanceTolerances {
			res, err := Plan(ctx, Request{Modes: acceptModes, Tolerance: tol, Kernel: typ})
			if errors.Is(err, bounds.ErrInfeasible) {
				t.Logf("%v tol=%g: %v", typ, tol, err)
				continue
			}
			if err != nil {
				t.Fatalf("%v tol=%g: %v", typ, tol, err)
			}
			for _, o := range res.Options {
				tr, err := NewTransform(o.Setup, o.Total)
				if err != nil {
					t.Fatal(err)
				}
				worst := 0.0
				for set := range xs {
					got, err := tr.Type1(ctx, xs[set], cs[set])
					if err != nil {
						t.Fatal(err)
					}
					e, _ := MaxError(got, refs[set], cs[set])
					worst = math.Max(worst, e)
					if e > o.Total {
						t.Errorf("%v tol=%g σ=%g %v set %d: observed %.3g > planned total %.3g (bound %.3g + rounding %.3g)",
							typ, tol, o.Oversampling, o.Setup.Kernel, set, e, o.Total, o.Bound.Total, o.Rounding)
					}
				}
				single := singlePointSweep(t, tr)
				if single > o.Total {
					t.Errorf("%v tol=%g σ=%g %v: single point error %.3g > planned total %.3g", typ, tol, o.Oversampling, o.Setup.Kernel, single, o.Total)
				}
				fit, deg := tr.KernelFitError()
				t.Logf("%-13v tol=%-6g σ=%-4g M=%-3d W=%-2d β=%-7.4g bound=%.3g rounding=%.2g | random: max observed %.3g (observed/total %.3f) | one point: %.3g (observed/total %.3f) | fit %.1g deg %d",
					typ, tol, o.Oversampling, o.Setup.Grid, o.Setup.Kernel.Width, o.Setup.Kernel.Beta, o.Bound.Total, o.Rounding,
					worst, worst/o.Total, single, single/o.Total, fit, deg)
			}
		}
	}
}

// TestType2AgainstDirect checks the type-2 transform with the same bound
// (|error_j| ≤ ε·Σ|f_k|, doc.go step 5) on a few planned setups.
func TestType2AgainstDirect(t *testing.T) {
	ctx := context.Background()
	tests := []struct {
		typ KernelType
		tol float64
	}{
		{KaiserBessel, 1e-4}, {KaiserBessel, 1e-10}, {Gaussian, 1e-5}, {Gaussian, 1e-9},
	}
	for _, tt := range tests {
		res, err := Plan(ctx, Request{Modes: 128, Tolerance: tt.tol, Kernel: tt.typ})
		if err != nil {
			t.Fatal(err)
		}
		o := res.Best
		tr, err := NewTransform(o.Setup, o.Total)
		if err != nil {
			t.Fatal(err)
		}
		for seed := uint64(0); seed < 3; seed++ {
			x, _ := RandomInput(1000, 50+seed)
			_, f := RandomInput(128, 80+seed)
			got, err := tr.Type2(ctx, x, f)
			if err != nil {
				t.Fatal(err)
			}
			want, err := Direct2(ctx, x, f)
			if err != nil {
				t.Fatal(err)
			}
			e, _ := MaxError(got, want, f)
			if e > o.Total {
				t.Errorf("%v tol=%g %v seed %d: type 2 error %.3g > total %.3g", tt.typ, tt.tol, o.Setup.Kernel, seed, e, o.Total)
			}
			if seed == 0 {
				t.Logf("type 2 %v tol=%g %v: observed %.3g, total %.3g", tt.typ, tt.tol, o.Setup.Kernel, e, o.Total)
			}
		}
	}
}

// TestTransformSingleModes checks the transforms on inputs with known
// sums: points on the grid of the modes, x_j = 2πj/N - π, with c_j =
// e^{ik0·x_j}, give f_k = N·[k ≡ k0 mod N] (orthogonality of the DFT;
// common knowledge, no source); and type 2 of a single mode is e^{ik0 x}.
func TestTransformSingleModes(t *testing.T) {
	ctx := context.Background()
	const n = 64
	s := Setup{Modes: n, Grid: 128, Kernel: Kernel{KaiserBessel, 12, 28.1}}
	tr, err := NewTransform(s, 0)
	if err != nil {
		t.Fatal(err)
	}
	b, err := Bound(ctx, s, 1)
	if err != nil {
		t.Fatal(err)
	}
	tol := b.Total + RoundingEstimate(s, 1)
	for _, k0 := range []int{-32, -5, 0, 17, 31} {
		x := make([]float64, n)
		c := make([]complex128, n)
		for j := range x {
			x[j] = 2*math.Pi*float64(j)/n - math.Pi
			sn, cs := math.Sincos(float64(k0) * x[j])
			c[j] = complex(cs, sn)
		}
		f, err := tr.Type1(ctx, x, c)
		if err != nil {
			t.Fatal(err)
		}
		for i, v := range f {
			want := 0.0
			if i-n/2 == k0 {
				want = n
			}
			if d := math.Hypot(real(v)-want, imag(v)); d > tol*n {
				t.Errorf("k0=%d: f_%d = %v, want %g (tolerance %.2g)", k0, i-n/2, v, want, tol*n)
			}
		}
		fk := make([]complex128, n)
		fk[k0+n/2] = 1
		xr, _ := RandomInput(50, uint64(k0+100))
		g, err := tr.Type2(ctx, xr, fk)
		if err != nil {
			t.Fatal(err)
		}
		for j, v := range g {
			sn, cs := math.Sincos(float64(k0) * xr[j])
			if d := math.Hypot(real(v)-cs, imag(v)-sn); d > tol {
				t.Errorf("type 2 k0=%d x=%g: got %v, want %v", k0, xr[j], v, complex(cs, sn))
			}
		}
	}
}

func TestTransformBadInput(t *testing.T) {
	ctx := context.Background()
	good := Setup{Modes: 16, Grid: 32, Kernel: Kernel{KaiserBessel, 6, 13}}
	tr, err := NewTransform(good, 0)
	if err != nil {
		t.Fatal(err)
	}
	nan := math.NaN()
	tests := []struct {
		name  string
		run   func() error
		param string
		want  error
	}{
		{"grid too small", func() error { _, err := NewTransform(Setup{16, 16, good.Kernel}, 0); return err }, "setup.grid", bounds.ErrInvalid},
		{"grid too large", func() error { _, err := NewTransform(Setup{16, MaxGrid + 1, good.Kernel}, 0); return err }, "setup.grid", bounds.ErrWorkLimit},
		{"grid below width", func() error {
			_, err := NewTransform(Setup{2, 5, Kernel{KaiserBessel, 6, 13}}, 0)
			return err
		}, "setup.grid", bounds.ErrInvalid},
		{"NaN tolerance", func() error { _, err := NewTransform(good, nan); return err }, "tolerance", bounds.ErrInvalid},
		{"NaN point", func() error { _, err := tr.Type1(ctx, []float64{0, nan}, []complex128{1, 1}); return err }, "x[1]", bounds.ErrInvalid},
		{"point beyond π", func() error { _, err := tr.Type1(ctx, []float64{4}, []complex128{1}); return err }, "x[0]", bounds.ErrInvalid},
		{"length mismatch", func() error { _, err := tr.Type1(ctx, []float64{0}, []complex128{1, 2}); return err }, "c", bounds.ErrInvalid},
		{"infinite strength", func() error {
			_, err := tr.Type1(ctx, []float64{0}, []complex128{complex(math.Inf(1), 0)})
			return err
		}, "c[0]", bounds.ErrInvalid},
		{"type 2 wrong modes", func() error { _, err := tr.Type2(ctx, []float64{0}, make([]complex128, 3)); return err }, "f", bounds.ErrInvalid},
		{"type 2 NaN mode", func() error {
			f := make([]complex128, 16)
			f[3] = complex(0, nan)
			_, err := tr.Type2(ctx, []float64{0}, f)
			return err
		}, "f[3]", bounds.ErrInvalid},
		{"direct modes", func() error { _, err := Direct1(ctx, 0, []float64{0}, []complex128{1}); return err }, "modes", bounds.ErrInvalid},
		{"direct work", func() error {
			_, err := Direct1(ctx, 1<<30, make([]float64, 8), make([]complex128, 8))
			return err
		}, "modes", bounds.ErrWorkLimit},
		{"verify points", func() error { _, err := Verify(ctx, good, 0, 1); return err }, "points", bounds.ErrInvalid},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			err := tt.run()
			var pe *bounds.ParamError
			if !errors.As(err, &pe) || !errors.Is(err, tt.want) || pe.Param != tt.param {
				t.Errorf("error = %v, want %v naming %q", err, tt.want, tt.param)
			}
		})
	}
}

func TestTransformHonoursContext(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	tr, err := NewTransform(Setup{Modes: 16, Grid: 32, Kernel: Kernel{Gaussian, 8, 9}}, 0)
	if err != nil {
		t.Fatal(err)
	}
	x, c := RandomInput(10, 1)
	if _, err := tr.Type1(ctx, x, c); !errors.Is(err, context.Canceled) {
		t.Errorf("Type1 error = %v, want context.Canceled", err)
	}
	if _, err := tr.Type2(ctx, x, make([]complex128, 16)); !errors.Is(err, context.Canceled) {
		t.Errorf("Type2 error = %v, want context.Canceled", err)
	}
	if _, err := Direct1(ctx, 16, x, c); !errors.Is(err, context.Canceled) {
		t.Errorf("Direct1 error = %v, want context.Canceled", err)
	}
	if _, err := Plan(ctx, Request{Modes: 64, Tolerance: 1e-6}); !errors.Is(err, context.Canceled) {
		t.Errorf("Plan error = %v, want context.Canceled", err)
	}
}
