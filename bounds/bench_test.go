package bounds

import "testing"

// Sinks keep the compiler from discarding benchmarked results.
var (
	sinkIv Interval
	sinkCx Complex
)

// benchInputs are the argument shapes of the benchmarks: a point, a thin
// interval (a phase 2π·u computed in interval arithmetic, the hot path of
// alias sums) and a wide interval.
var benchInputs = []struct {
	name string
	x    Interval
}{
	{"point", Point(0.7390851332151607)},
	{"thin", TwoPi.Scale(0.1176)},
	{"wide", Interval{-0.3, 1.7}},
}

func BenchmarkAdd(b *testing.B) {
	y := Point(1.2345678901234567)
	for _, in := range benchInputs {
		b.Run(in.name, func(b *testing.B) {
			b.ReportAllocs()
			x := in.x
			for b.Loop() {
				x = x.Add(y)
			}
			sinkIv = x
		})
	}
}

func BenchmarkMul(b *testing.B) {
	y := Interval{0.999999, 1.000001}
	for _, in := range benchInputs {
		b.Run(in.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkIv = in.x.Mul(y)
			}
		})
	}
}

func BenchmarkExp(b *testing.B) {
	for _, in := range append(benchInputs, struct {
		name string
		x    Interval
	}{"point-709.5", Point(709.5)}) {
		b.Run(in.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkIv = Exp(in.x)
			}
		})
	}
}

func BenchmarkSin(b *testing.B) {
	for _, in := range append(benchInputs, struct {
		name string
		x    Interval
	}{"point-1e6", Point(1e6 + 0.25)}) {
		b.Run(in.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkIv = Sin(in.x)
			}
		})
	}
}

func BenchmarkCis(b *testing.B) {
	for _, in := range benchInputs {
		b.Run(in.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkCx = Cis(in.x)
			}
		})
	}
}

func BenchmarkComplexMul(b *testing.B) {
	w := Cis(Point(0.3))
	for _, in := range benchInputs {
		z := Complex{in.x, in.x.Scale(0.5)}
		b.Run(in.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkCx = z.Mul(w)
			}
		})
	}
}

func BenchmarkErfc(b *testing.B) {
	for _, in := range benchInputs {
		b.Run(in.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkIv = Erfc(in.x)
			}
		})
	}
}

func BenchmarkBesselI0(b *testing.B) {
	for _, beta := range []float64{5, 40} {
		b.Run(map[float64]string{5: "beta-5", 40: "beta-40"}[beta], func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkIv = BesselI0(Point(beta))
			}
		})
	}
}

func BenchmarkSinhcSqrt(b *testing.B) {
	for _, z := range []struct {
		name string
		z    float64
	}{{"small", 0.3}, {"positive", 300}, {"negative", -300}} {
		b.Run(z.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkIv = SinhcSqrt(Point(z.z))
			}
		})
	}
}
