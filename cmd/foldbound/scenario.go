package main

import (
	"context"
	"fmt"
	"io"
	"math"
	"strconv"
	"time"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
)

// The demo follows a fictional group, the Tarnwick modelling lab, through
// two sizing questions. Every number it prints comes from the service
// through the Go client; the lab, its grids and its tolerances are
// invented.

// runDemo runs the scenario against c and writes the report to w.
func runDemo(ctx context.Context, c *client.Client, w io.Writer) error {
	start := time.Now()
	d := &demo{c: c, w: w}
	fmt.Fprintln(w, "foldbound demo: the (fictional) Tarnwick modelling lab sizes two grids")
	fmt.Fprintln(w, "=======================================================================")
	if err := d.overlap(ctx); err != nil {
		return err
	}
	if err := d.wavePacket(ctx); err != nil {
		return err
	}
	fmt.Fprintf(w, "\n(%d service calls, %.2f s)\n", d.calls, time.Since(start).Seconds())
	return nil
}

type demo struct {
	c     *client.Client
	w     io.Writer
	calls int
}

// overlap: the trapezoidal rule for a Gaussian overlap integral.
func (d *demo) overlap(ctx context.Context) error {
	const (
		sigma = 0.7
		tol   = 1e-12
	)
	w := d.w
	f := client.Gaussian(sigma)
	current := client.Grid(0.5, 0, 13)
	fmt.Fprintf(w, `
1. Overlap integrals by the trapezoidal rule
-------------------------------------------
The lab integrates products of Gaussian orbitals; each product is a Gaussian
exp(-x²/(2σ²)) with σ = %g (length unit: bohr). Its current grid is
%s. Target: every integral within %g.

`, sigma, fmtGrid(current), tol)

	// How wrong is the current grid?
	res, err := d.c.AliasSum(ctx, &pb.AliasSumRequest{Family: f, Grids: []*pb.Grid{current}})
	d.calls++
	if err != nil {
		return err
	}
	t := newTable(w)
	t.row("  trapezoidal sum T", fmtInterval(res.GetSampled().GetRe()))
	t.row("  exact integral F", fmtInterval(res.GetExact().GetRe()))
	t.row("  error T - F", fmtInterval(res.GetError().GetRe()))
	t.row("    aliasing", fmtInterval(res.GetAlias().GetRe()))
	t.row("    truncation", fmtInterval(res.GetTruncation().GetRe()))
	if err := t.flush(); err != nil {
		return err
	}
	bud, err := d.c.ErrorBudget(ctx, &pb.ErrorBudgetRequest{
		Subject: &pb.ErrorBudgetRequest_Family{Family: f}, Grids: []*pb.Grid{current}, WorstCaseShift: true})
	d.calls++
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "\n  Certified for every placement of the samples (any shift): total error ≤ %s\n",
		fmtBound(bud.GetBudget().GetTotal()))
	fmt.Fprintf(w, "  (aliasing %s, truncation %s, rounding %s): the window [-3, 3] is too narrow;\n",
		fmtBound(bud.GetBudget().GetAliasing()), fmtBound(bud.GetBudget().GetTruncation()), fmtBound(bud.GetBudget().GetRounding()))
	fmt.Fprintln(w, "  the step is already far finer than it needs to be.")

	// The cheapest certified grid.
	fmt.Fprintf(w, "\n  Cheapest grid certified within %g for every shift:\n", tol)
	plan, err := d.cheapest(ctx, &pb.PlanGridRequest{Subject: &pb.PlanGridRequest_Family{Family: f}, Tol: tol})
	if err != nil {
		return err
	}

	// The halving habit: halve the step and widen the window by half until
	// two successive sums agree to the tolerance.
	fmt.Fprintf(w, "\n  The halving habit (halve the step, widen the window ×1.5, stop when two\n  successive sums agree within %g), starting from step 1 on [-2, 2]:\n\n", tol)
	t = newTable(w)
	t.row("  round", "grid", "sum T", "change")
	h, half := 1.0, 2.0
	spent := int64(0)
	var prev float64
	var last *pb.AliasSumResponse
	for round := 1; round <= 12; round++ {
		n := 2*int64(math.Round(half/h)) + 1
		g := client.Grid(h, 0, n)
		r, err := d.c.AliasSum(ctx, &pb.AliasSumRequest{Family: f, Grids: []*pb.Grid{g}})
		d.calls++
		if err != nil {
			return err
		}
		spent += n
		T := mid(r.GetSampled().GetRe())
		change := "-"
		if round > 1 {
			change = fmt.Sprintf("%.2e", math.Abs(T-prev))
		}
		t.row(fmt.Sprintf("  %d", round), fmt.Sprintf("h=%g, N=%d", h, n), fmt.Sprintf("%.15f", T), change)
		last = r
		if round > 1 && math.Abs(T-prev) <= tol {
			break
		}
		prev = T
		h /= 2
		half *= 1.5
	}
	if err := t.flush(); err != nil {
		return err
	}
	actual := math.Abs(mid(last.GetError().GetRe()))
	fmt.Fprintf(w, "\n  The habit spent %d samples over all its trial grids; its last grid is %.2g from\n  the integral in exact arithmetic, far finer than the %g it needed.\n", spent, actual, tol)

	t = newTable(w)
	fmt.Fprintln(w)
	t.row("  approach", "samples", "error of the answer")
	t.row("  current grid", strconv.FormatInt(current.GetCount(), 10), fmt.Sprintf("%.2g (certified ≤ %s)", math.Abs(mid(res.GetError().GetRe())), fmtBound(bud.GetBudget().GetTotal())))
	t.row("  halving habit", fmt.Sprintf("%d (all trials)", spent), fmt.Sprintf("%.2g", actual))
	t.row("  certified plan", strconv.FormatInt(plan.count, 10), fmt.Sprintf("certified ≤ %s for every shift", fmtBound(plan.total)))
	if err := t.flush(); err != nil {
		return err
	}
	fmt.Fprintf(w, "  → the plan needs %.1fx fewer samples than the habit spent, with no trial runs.\n", float64(spent)/float64(plan.count))
	return nil
}

// wavePacket: an FFT grid for a wave packet known by its envelopes.
func (d *demo) wavePacket(ctx context.Context) error {
	const (
		sigma  = 2.0
		omega0 = 6.0
		tol    = 1e-9
	)
	w := d.w
	amp := sigma * math.Sqrt(math.Pi/2)
	env := &pb.Envelopes{
		Spatial: []*pb.EnvelopeTerm{{Decay: pb.Decay_DECAY_GAUSSIAN, Amplitude: 1, Width: sigma}},
		Spectral: []*pb.EnvelopeTerm{
			{Decay: pb.Decay_DECAY_GAUSSIAN, Amplitude: amp, Center: omega0, Width: 1 / sigma},
			{Decay: pb.Decay_DECAY_GAUSSIAN, Amplitude: amp, Center: -omega0, Width: 1 / sigma},
		},
	}
	band := &pb.Band{Center: []float64{omega0}, HalfWidth: []float64{3}}
	fmt.Fprintf(w, `
2. An FFT grid for a wave packet
--------------------------------
A simulation samples a wave packet exp(-x²/(2σ²))·cos(ω0·x), σ = %g, ω0 = %g,
and Fourier-transforms it by FFT; the spectrum is used on the band |ξ - %g| ≤ 3.
The lab describes the packet only by its envelopes: |f| ≤ exp(-x²/(2σ²)) and
|F| ≤ %.4f·(exp(-σ²(ξ-ω0)²/2) + exp(-σ²(ξ+ω0)²/2)). Target: %g over the band,
for every placement of the samples.

`, sigma, omega0, omega0, amp, tol)

	type option struct {
		name string
		grid *pb.Grid
	}
	options := []option{
		{"current grid", client.Grid(0.3, 0, 64)},
		{"halve the step", client.Grid(0.15, 0, 128)},
		{"double the window", client.Grid(0.3, 0, 128)},
	}
	t := newTable(w)
	t.row("  grid", "", "aliasing", "truncation", "rounding", "total", "")
	for _, o := range options {
		r, err := d.c.ErrorBudget(ctx, &pb.ErrorBudgetRequest{
			Subject: &pb.ErrorBudgetRequest_Envelopes{Envelopes: env}, Grids: []*pb.Grid{o.grid},
			Frequency: band, WorstCaseShift: true})
		d.calls++
		if err != nil {
			return err
		}
		b := r.GetBudget()
		t.row("  "+o.name, fmt.Sprintf("h=%g, N=%d", o.grid.GetStep(), o.grid.GetCount()),
			fmtBound(b.GetAliasing()), fmtBound(b.GetTruncation()), fmtBound(b.GetRounding()), fmtBound(b.GetTotal()), verdict(b.GetTotal() <= tol))
	}
	if err := t.flush(); err != nil {
		return err
	}
	fmt.Fprintln(w, "\n  Halving the step removes aliasing that was never the problem; the error is\n  truncation by the window, and only a wider window fixes it.")

	fmt.Fprintf(w, "\n  Cheapest FFT-friendly size (2^a 3^b 5^c 7^d) certified within %g:\n", tol)
	plan, err := d.cheapest(ctx, &pb.PlanGridRequest{Subject: &pb.PlanGridRequest_Envelopes{Envelopes: env}, Tol: tol,
		Frequency: band, Cost: &pb.CostModel{Sizes: pb.SizeRule_SIZE_RULE_FFT_FRIENDLY}})
	if err != nil {
		return err
	}
	fmt.Fprintf(w, "  → N = %d instead of 128 when the window is doubled by habit (%.0f%% fewer samples\n    per transform), and the current N = 64 is not enough.\n",
		plan.count, 100*(1-float64(plan.count)/128))
	return nil
}

func verdict(ok bool) string {
	if ok {
		return "within tolerance"
	}
	return "NOT within tolerance"
}

// planned is the cheapest grid found.
type planned struct {
	count int64
	step  float64
	total float64
}

// cheapest asks the planner (PlanGrid) and prints its grid.
func (d *demo) cheapest(ctx context.Context, req *pb.PlanGridRequest) (planned, error) {
	p, err := d.c.PlanGrid(ctx, req)
	d.calls++
	if err != nil {
		return planned{}, err
	}
	a := p.GetAxes()[0].GetGrid()
	fmt.Fprintf(d.w, "    step %.6g, %d samples, shift %.4g, certified total ≤ %s\n    (%s)\n", a.GetStep(), a.GetCount(),
		a.GetShift(), fmtBound(p.GetBudget().GetTotal()), p.GetVerification().GetMethod())
	return planned{count: a.GetCount(), step: a.GetStep(), total: p.GetBudget().GetTotal()}, nil
}

func mid(x *pb.Interval) float64 { return x.GetLo() + (x.GetHi()-x.GetLo())/2 }
