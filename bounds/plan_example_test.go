package bounds_test

import (
	"context"
	"fmt"

	"foldbound/bounds"
)

// The cheapest grid for ∫ exp(-x²/2) dx = √(2π) to 1e-10, for every shift.
func ExamplePlanGrid() {
	g, _ := bounds.NewGaussian(1)
	plan, err := bounds.PlanGrid(context.Background(), bounds.PlanRequest{Family: g, Tol: 1e-10})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("N = %d samples, step %.3f, window %.2f\n", plan.Grid.Count, plan.Grid.Step, plan.Span)
	fmt.Println("certified within 1e-10:", plan.Budget.Total <= 1e-10)
	// Output:
	// N = 16 samples, step 0.868, window 13.89
	// certified within 1e-10: true
}

// A 2-D grid for a Gaussian times a hyperbolic secant: the tolerance goes
// mostly to the slower axis.
func ExamplePlanGridND() {
	g, _ := bounds.NewGaussian(1)
	s, _ := bounds.NewSech(1)
	plan, err := bounds.PlanGridND(context.Background(), bounds.PlanNDRequest{
		Axes: []bounds.AxisRequest{{Family: g}, {Family: s}},
		Tol:  1e-8,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("counts %d × %d = %d\n", plan.Axes[0].Grid.Count, plan.Axes[1].Grid.Count, plan.Count)
	fmt.Println("certified within 1e-8:", plan.Budget.Total <= 1e-8)
	// Output:
	// counts 14 × 103 = 1442
	// certified within 1e-8: true
}
