package bounds

import (
	"context"
	"fmt"
	"testing"
)

var sinkSampledSum SampledSum

// AliasSum per family at default settings: infinite grid, a moderate step
// (half the family's length scale), ξ = 0.3/L, tolerance 1e-15.
func BenchmarkAliasSumClosedForm(b *testing.B) {
	fams := []Family{
		ExponentialFamily{1},
		LorentzianFamily{1},
		SechFamily{1},
		SechSquaredFamily{1},
		WavePacketFamily{1, 3},
		FejerFamily{1},
		mustFamily(NewShift(0.3, DilationFamily{-1.5, ModulationFamily{2, SumFamily{[]Family{SechFamily{1}, GaussianFamily{1}}}}})),
	}
	ctx := context.Background()
	set := Settings{Tol: 1e-15}
	for _, f := range fams {
		L := spatialScale(f)
		for _, h := range []float64{0.5 * L, 0.25 * L} {
			g := Grid{Step: h, Shift: 0.1 * L}
			b.Run(fmt.Sprintf("%v/h=%g", f, h), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					res, err := AliasSum(ctx, f, g, 0.3/L, set)
					if err != nil {
						b.Fatal(err)
					}
					sinkSampledSum = res
				}
			})
		}
	}
}
