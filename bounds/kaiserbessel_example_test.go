package bounds_test

import (
	"context"
	"fmt"

	"foldbound/bounds"
)

// The trapezoidal rule for the integral of a Kaiser-Bessel gridding kernel
// (width 6, β = 14.1) at two sample spacings: the error is the alias sum of
// its transform, which decays only like 1/ξ because the window jumps at its
// edges.
func ExampleKaiserBesselFamily() {
	k, err := bounds.NewKaiserBessel(6, 14.1)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, h := range []float64{0.5, 0.1} {
		r, err := bounds.AliasSum(context.Background(), k, bounds.Grid{Step: h, Shift: 0.01}, 0, bounds.Settings{})
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("h = %.1f: integral %.6e, relative error %.2e (%v side)\n",
			h, r.Exact.Re.Mid(), r.Error.Re.Mid()/r.Exact.Re.Mid(), r.Method.Side)
	}
	// Output:
	// h = 0.5: integral 2.827837e+05, relative error -1.61e-06 (spatial side)
	// h = 0.1: integral 2.827837e+05, relative error -8.58e-08 (spatial side)
}
