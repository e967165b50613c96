package gridding_test

import (
	"context"
	"fmt"

	"foldbound/bounds/gridding"
)

// Kaiser-Bessel kernels for a 1-D type-1 transform with 256 modes at a
// tolerance of 10⁻⁹ (relative to Σ|c_j|), one per default oversampling
// ratio, cheapest first by the default cost model for 256 points.
func ExamplePlan() {
	res, err := gridding.Plan(context.Background(), gridding.Request{
		Modes:     256,
		Tolerance: 1e-9,
		Kernel:    gridding.KaiserBessel,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, o := range res.Options {
		k := o.Setup.Kernel
		fmt.Printf("σ = %-4g M = %d  W = %2d  β = %.2f (Beatty et al.: %.2f)  certified %.1e  cost %.0f µs\n",
			o.Oversampling, o.Setup.Grid, k.Width, k.Beta, o.Published, o.Bound.Total, o.Cost/1000)
	}
	fmt.Printf("recommended: σ = %g, W = %d\n", res.Best.Oversampling, res.Best.Setup.Kernel.Width)
	// Output:
	// σ = 1.5  M = 384  W = 14  β = 29.19 (Beatty et al.: 29.19)  certified 1.9e-10  cost 69 µs
	// σ = 1.25 M = 320  W = 17  β = 31.47 (Beatty et al.: 31.92)  certified 8.2e-10  cost 70 µs
	// σ = 2    M = 512  W = 11  β = 25.80 (Beatty et al.: 25.77)  certified 6.2e-10  cost 74 µs
	// recommended: σ = 1.5, W = 14
}

// The verification path: the gridded transform of a planned setup against
// the direct sum on 4096 random points.
func ExampleVerify() {
	ctx := context.Background()
	res, err := gridding.Plan(ctx, gridding.Request{Modes: 256, Tolerance: 1e-6, Kernel: gridding.Gaussian})
	if err != nil {
		fmt.Println(err)
		return
	}
	ch, err := gridding.Verify(ctx, res.Best.Setup, 4096, 1)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%v on M = %d: bound %.2e, observed within it: %v\n",
		ch.Setup.Kernel, ch.Setup.Grid, ch.Bound.Total, ch.Observed <= ch.Total)
	// Output:
	// gaussian(W=18, beta=18.4408) on M = 384: bound 8.65e-07, observed within it: true
}
