package bounds_test

import (
	"context"
	"fmt"

	"foldbound/bounds"
)

// The cubic B-spline sampled at unit spacing sums to 1 for every shift
// (partition of unity): the Poisson formula at h = 1, ξ = 0, where every
// alias copy F(2πl) vanishes.
func ExampleBSplineFamily() {
	b, err := bounds.NewBSpline(4)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, s := range []float64{0, 0.25, 0.4} {
		r, err := bounds.AliasSum(context.Background(), b, bounds.Grid{Step: 1, Shift: s}, 0, bounds.Settings{})
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("shift %.2f: sum %.12f, error contains 0: %v\n", s, r.Sampled.Re.Mid(), r.Error.Contains(0))
	}
	// Output:
	// shift 0.00: sum 1.000000000000, error contains 0: true
	// shift 0.25: sum 1.000000000000, error contains 0: true
	// shift 0.40: sum 1.000000000000, error contains 0: true
}
