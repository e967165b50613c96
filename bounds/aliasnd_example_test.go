package bounds_test

import (
	"context"
	"fmt"

	"foldbound/bounds"
)

// The aliasing error of a 2-D isotropic Gaussian (σ = 1) sampled on a
// square grid, at the origin of frequency space, for three spacings; the
// error is known to relative accuracy however small it is.
func ExampleAliasSumND() {
	g, err := bounds.NewRadialGaussian(1, []float64{0.1, 0.2})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, h := range []float64{1.5, 1, 0.5} {
		grids := []bounds.Grid{{Step: h}, {Step: h}}
		r, err := bounds.AliasSumND(context.Background(), g, grids, []float64{0, 0}, bounds.Settings{})
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("h = %.1f: relative error %.3e\n", h, r.Error.Re.Mid()/r.Exact.Re.Mid())
	}
	// Output:
	// h = 1.5: relative error 4.902e-04
	// h = 1.0: relative error 5.982e-09
	// h = 0.5: relative error -5.123e-35
}
