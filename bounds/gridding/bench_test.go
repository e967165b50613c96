package gridding

import (
	"context"
	"fmt"
	"testing"

	"gonum.org/v1/gonum/dsp/fourier"
)

var (
	sinkResult Result
	sinkBound  ErrorBound
	sinkC      []complex128
)

// BenchmarkPlan times whole kernel plans for 256 modes with the default
// candidates 1.25, 1.5 and 2.
func BenchmarkPlan(b *testing.B) {
	ctx := context.Background()
	for _, typ := range []KernelType{KaiserBessel, Gaussian} {
		for _, tol := range []float64{1e-6, 1e-12} {
			b.Run(fmt.Sprintf("%v/tol=%g", typ, tol), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					r, err := Plan(ctx, Request{Modes: 256, Tolerance: tol, Kernel: typ})
					if err != nil {
						b.Fatal(err)
					}
					sinkResult = r
				}
			})
		}
	}
}

// BenchmarkBound times the certified bound of one setup.
func BenchmarkBound(b *testing.B) {
	ctx := context.Background()
	for _, k := range []Kernel{{KaiserBessel, 8, 18.68}, {Gaussian, 14, 16.02}} {
		b.Run(k.String(), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				r, err := Bound(ctx, Setup{Modes: 256, Grid: 512, Kernel: k}, 1)
				if err != nil {
					b.Fatal(err)
				}
				sinkBound = r
			}
		})
	}
}

// BenchmarkType1 compares the gridded type-1 transform with the direct sum
// for 4096 points and 256 modes.
func BenchmarkType1(b *testing.B) {
	ctx := context.Background()
	x, c := RandomInput(4096, 7)
	for _, k := range []Kernel{{KaiserBessel, 8, 18.68}, {KaiserBessel, 15, 35.18}, {Gaussian, 14, 16.02}} {
		tr, err := NewTransform(Setup{Modes: 256, Grid: 512, Kernel: k}, 0)
		if err != nil {
			b.Fatal(err)
		}
		b.Run("gridded/"+k.String(), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				f, err := tr.Type1(ctx, x, c)
				if err != nil {
					b.Fatal(err)
				}
				sinkC = f
			}
		})
	}
	b.Run("direct", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			f, err := Direct1(ctx, 256, x, c)
			if err != nil {
				b.Fatal(err)
			}
			sinkC = f
		}
	})
}

// BenchmarkSpread and BenchmarkFFT calibrate DefaultCostModel: spreading
// 65536 points with W = 8 (ns/op / (65536·8) per point and cell), and
// gonum's complex FFT of size 2^16 (ns/op / (2^16·16)).
func BenchmarkSpread(b *testing.B) {
	ctx := context.Background()
	x, c := RandomInput(1<<16, 3)
	for _, w := range []int{4, 8, 16} {
		// A tiny grid keeps the FFT negligible.
		tr, err := NewTransform(Setup{Modes: 8, Grid: 32, Kernel: Kernel{KaiserBessel, w, 2.2 * float64(w)}}, 0)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("W=%d", w), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				f, err := tr.Type1(ctx, x, c)
				if err != nil {
					b.Fatal(err)
				}
				sinkC = f
			}
		})
	}
}

func BenchmarkFFT(b *testing.B) {
	for _, m := range []int{1 << 10, 1 << 16, 3 * 5 * 1 << 12} {
		seq := make([]complex128, m)
		for i := range seq {
			seq[i] = complex(float64(i%7), float64(i%5))
		}
		b.Run(fmt.Sprintf("M=%d", m), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkC = fourier.NewCmplxFFT(m).Coefficients(nil, seq)
			}
		})
	}
}
