package bounds_test

import (
	"context"
	"testing"

	"foldbound/bounds"
)

var (
	sinkPlan   bounds.Plan
	sinkPlanND bounds.PlanND
)

// BenchmarkPlanGrid measures one 1-D plan, certificate included.
func BenchmarkPlanGrid(b *testing.B) {
	ctx := context.Background()
	g, _ := bounds.NewGaussian(1)
	s, _ := bounds.NewSech(1)
	w, _ := bounds.NewWavePacket(1, 3)
	bs, _ := bounds.NewBSpline(4)
	cases := []struct {
		name string
		fam  bounds.Family
		tol  float64
	}{
		{"gaussian/1e-6", g, 1e-6},
		{"gaussian/1e-10", g, 1e-10},
		{"gaussian/1e-14", g, 1e-14},
		{"wavepacket/1e-8", w, 1e-8},
		{"sech/1e-8", s, 1e-8},
		{"bspline4/1e-8", bs, 1e-8},
	}
	for _, c := range cases {
		b.Run(c.name, func(b *testing.B) {
			b.ReportAllocs()
			req := bounds.PlanRequest{Family: c.fam, Tol: c.tol}
			for i := 0; i < b.N; i++ {
				sinkPlan, _ = bounds.PlanGrid(ctx, req)
			}
		})
	}
}

// BenchmarkPlanGridND measures one separable n-D plan, certificates
// included.
func BenchmarkPlanGridND(b *testing.B) {
	ctx := context.Background()
	g, _ := bounds.NewGaussian(1)
	g2, _ := bounds.NewGaussian(0.5)
	w, _ := bounds.NewWavePacket(1, 3)
	s, _ := bounds.NewSech(1)
	cases := []struct {
		name string
		axes []bounds.AxisRequest
		tol  float64
	}{
		{"3d-gaussian/1e-8", []bounds.AxisRequest{{Family: g}, {Family: g}, {Family: g}}, 1e-8},
		{"3d-gaussians/1e-8", []bounds.AxisRequest{{Family: g}, {Family: g2}, {Family: g}}, 1e-8},
		{"3d-gauss-wave/1e-8", []bounds.AxisRequest{{Family: g}, {Family: w}, {Family: g2}}, 1e-8},
		{"3d-gauss-sech/1e-8", []bounds.AxisRequest{{Family: g}, {Family: s}, {Family: g2}}, 1e-8},
	}
	for _, c := range cases {
		b.Run(c.name, func(b *testing.B) {
			b.ReportAllocs()
			req := bounds.PlanNDRequest{Axes: c.axes, Tol: c.tol}
			for i := 0; i < b.N; i++ {
				sinkPlanND, _ = bounds.PlanGridND(ctx, req)
			}
		})
	}
}
