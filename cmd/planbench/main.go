// Command planbench runs the grid planner (bounds.PlanGrid) and the halving
// habit (internal/halving) side by side on a fixed suite of catalogue
// functions and tolerances 1e-3 … 1e-14, for the integral ∫f, and prints a
// fixed-width table: samples each spends, their ratio, wall time of each,
// the baseline's error against the exact value and whether it stopped
// within the tolerance, and the planner's certified error.
//
//	go run ./cmd/planbench [-tols 1e-3,...] [-reps 5]
//
// The planner spends no integrand samples while planning (it works from
// the closed forms); its count is that of the grid it returns, which the
// caller then samples once. The baseline spends the samples of every trial
// grid. Where the planner refuses a tolerance as not certifiable in double
// precision, the row says so and is left out of the totals; the baseline
// still runs there and its answer is checked like any other.
package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"math/cmplx"
	"os"
	"sort"
	"strconv"
	"strings"
	"time"

	"foldbound/bounds"
	"foldbound/internal/halving"
)

func main() {
	if err := run(os.Args[1:], os.Stdout); err != nil {
		fmt.Fprintln(os.Stderr, "planbench:", err)
		os.Exit(1)
	}
}

// benchCase is one function of the suite: the engine's family, plain
// float64 samples of f for the baseline, and the baseline's first grid
// (a step and a window a practitioner might start from: the function's
// width, and four widths).
type benchCase struct {
	name         string
	fam          bounds.Family
	f            func(x float64) complex128
	step, window float64
}

func suite() ([]benchCase, error) {
	var cases []benchCase
	add := func(name string, fam bounds.Family, err error, f func(float64) float64, width float64) error {
		if err != nil {
			return err
		}
		cases = append(cases, benchCase{name: name, fam: fam, f: func(x float64) complex128 { return complex(f(x), 0) },
			step: width, window: 4 * width})
		return nil
	}
	g, err := bounds.NewGaussian(1)
	if err := add("gaussian(1)", g, err, func(x float64) float64 { return math.Exp(-x * x / 2) }, 1); err != nil {
		return nil, err
	}
	s, err := bounds.NewSech(1)
	if err := add("sech(1)", s, err, func(x float64) float64 { return 1 / math.Cosh(x) }, 1); err != nil {
		return nil, err
	}
	s2, err := bounds.NewSechSquared(1)
	if err := add("sech2(1)", s2, err, func(x float64) float64 { c := math.Cosh(x); return 1 / (c * c) }, 1); err != nil {
		return nil, err
	}
	w, err := bounds.NewWavePacket(1, 3)
	if err := add("wavepacket(1,3)", w, err, func(x float64) float64 { return math.Exp(-x*x/2) * math.Cos(3*x) }, 1); err != nil {
		return nil, err
	}
	b, err := bounds.NewBSpline(4)
	if err := add("bspline(4)", b, err, bspline4, 1); err != nil {
		return nil, err
	}
	e, err := bounds.NewExponential(1)
	if err := add("exponential(1)", e, err, func(x float64) float64 { return math.Exp(-math.Abs(x)) }, 1); err != nil {
		return nil, err
	}
	l, err := bounds.NewLorentzian(1)
	if err := add("lorentzian(1)", l, err, func(x float64) float64 { return 1 / (1 + x*x) }, 1); err != nil {
		return nil, err
	}
	return cases, nil
}

// bspline4 is the centred cubic B-spline (order 4) by its piecewise
// polynomial (de Boor, A Practical Guide to Splines, 1978, ch. IX, from
// memory).
func bspline4(x float64) float64 {
	a := math.Abs(x)
	switch {
	case a >= 2:
		return 0
	case a >= 1:
		t := 2 - a
		return t * t * t / 6
	}
	return 2.0/3 - a*a + a*a*a/2
}

// row is one line of the table.
type row struct {
	family, tol         string
	planN               int64
	planErr             error
	planTime            time.Duration
	planCert, planWorst float64
	base                halving.Result
	baseTime            time.Duration
}

func run(args []string, w io.Writer) error {
	fs := flag.NewFlagSet("planbench", flag.ContinueOnError)
	tolsFlag := fs.String("tols", "1e-3,1e-4,1e-5,1e-6,1e-7,1e-8,1e-9,1e-10,1e-11,1e-12,1e-13,1e-14", "tolerances, comma separated")
	reps := fs.Int("reps", 5, "planner runs per case; the median time is shown")
	maxBase := fs.Int64("base-max", 1<<25, "largest trial grid of the baseline")
	if err := fs.Parse(args); err != nil {
		return err
	}
	var tols []float64
	for _, s := range strings.Split(*tolsFlag, ",") {
		v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
		if err != nil || !(v > 0) {
			return fmt.Errorf("bad tolerance %q", s)
		}
		tols = append(tols, v)
	}
	cases, err := suite()
	if err != nil {
		return err
	}
	ctx := context.Background()
	var rows []row
	for _, c := range cases {
		exact := c.fam.Transform(bounds.Point(0)).Mid()
		for _, tol := range tols {
			r := row{family: c.name, tol: fmt.Sprintf("%.0e", tol)}
			var times []time.Duration
			var plan bounds.Plan
			for i := 0; i < max(*reps, 1); i++ {
				t0 := time.Now()
				plan, r.planErr = bounds.PlanGrid(ctx, bounds.PlanRequest{Family: c.fam, Tol: tol})
				times = append(times, time.Since(t0))
			}
			sort.Slice(times, func(i, j int) bool { return times[i] < times[j] })
			r.planTime = times[len(times)/2]
			if r.planErr == nil {
				r.planN = plan.Grid.Count
				r.planCert = plan.Budget.Total
				r.planWorst = worstError(c.f, plan.Grid, exact)
			}
			t0 := time.Now()
			r.base, err = halving.Run(ctx, c.f, exact, tol, halving.Options{Step: c.step, Window: c.window, MaxSamples: *maxBase})
			r.baseTime = time.Since(t0)
			if err != nil {
				return err
			}
			rows = append(rows, r)
		}
	}
	return printTable(w, rows)
}

// worstError returns the largest error |T - F(0)| of the planned grid,
// summed in float64, over 17 shifts across the cell the plan covers.
func worstError(f func(float64) complex128, g bounds.Grid, exact complex128) float64 {
	lo, hi := g.Indices()
	worst := 0.0
	for i := 0; i <= 16; i++ {
		s := g.Shift + g.Step*(float64(i)/16-0.5)
		var sum complex128
		for k := lo; k <= hi; k++ {
			sum += f(s + g.Step*float64(k))
		}
		worst = math.Max(worst, cmplx.Abs(complex(g.Step, 0)*sum-exact))
	}
	return worst
}

func printTable(w io.Writer, rows []row) error {
	const head = "%-16s %6s %9s %9s %9s %9s %12s %10s %10s %9s %9s %7s\n"
	const line = "%-16s %6s %9s %9s %9s %9s %12d %10d %10s %9s %9.2e %7s\n"
	fmt.Fprintf(w, "integral of f, any shift: planner (certified) against halving the step and doubling the window\n\n")
	fmt.Fprintf(w, head, "family", "tol", "plan_n", "plan_cert", "plan_err", "plan_time", "base_samples", "base_n", "base_time", "ratio", "base_err", "base_ok")
	// Totals over the planned cases, and over those where the baseline
	// also stopped by itself (its count is then complete, not capped).
	var all, both struct {
		cases      int
		plan, base int64
		pt, bt     time.Duration
		logRatio   float64
	}
	var refused, baseBad, baseBadAll, baseCapped, planOver int
	for _, r := range rows {
		ok := "yes"
		if !r.base.WithinTol {
			ok = "NO"
			baseBadAll++
		}
		if !r.base.Converged {
			ok = "NO(cap)"
		}
		var planN, cert, perr, ratio string
		switch {
		case r.planErr != nil:
			refused++
			planN, cert, perr, ratio = "refused", "-", "-", "-"
			if !errors.Is(r.planErr, bounds.ErrInfeasible) && !errors.Is(r.planErr, bounds.ErrWorkLimit) {
				planN = "error"
			}
		default:
			q := float64(r.base.Samples) / float64(r.planN)
			all.cases++
			all.plan += r.planN
			all.base += r.base.Samples
			all.pt += r.planTime
			all.bt += r.baseTime
			all.logRatio += math.Log(q)
			if r.base.Converged {
				both.cases++
				both.plan += r.planN
				both.base += r.base.Samples
				both.pt += r.planTime
				both.bt += r.baseTime
				both.logRatio += math.Log(q)
			} else {
				baseCapped++
			}
			if !r.base.WithinTol {
				baseBad++
			}
			tol, _ := strconv.ParseFloat(r.tol, 64)
			if r.planWorst > tol || r.planCert > tol {
				planOver++
			}
			planN = strconv.FormatInt(r.planN, 10)
			cert = fmt.Sprintf("%.2e", r.planCert)
			perr = fmt.Sprintf("%.2e", r.planWorst)
			ratio = fmt.Sprintf("%.1f", q)
		}
		fmt.Fprintf(w, line, r.family, r.tol, planN, cert, perr, dur(r.planTime), r.base.Samples, r.base.Count,
			dur(r.baseTime), ratio, r.base.Error, ok)
	}
	fmt.Fprintf(w, "\nplanned cases: %d; refused as not certifiable in double precision: %d\n", all.cases, refused)
	if both.cases > 0 {
		fmt.Fprintf(w, "cases where the baseline stopped by itself: %d; samples planner %d, baseline %d, ratio %.1f (geometric mean of the ratios %.1f)\n",
			both.cases, both.plan, both.base, float64(both.base)/float64(both.plan), math.Exp(both.logRatio/float64(both.cases)))
		fmt.Fprintf(w, "  wall time there: planner %s, baseline %s\n", dur(both.pt), dur(both.bt))
	}
	if all.cases > 0 {
		fmt.Fprintf(w, "all planned cases (%d with the baseline stopped at its sample cap, counted at the cap): samples planner %d, baseline %d, ratio %.1f (geometric mean %.1f)\n",
			baseCapped, all.plan, all.base, float64(all.base)/float64(all.plan), math.Exp(all.logRatio/float64(all.cases)))
		fmt.Fprintf(w, "  wall time there: planner %s, baseline %s\n", dur(all.pt), dur(all.bt))
	}
	fmt.Fprintf(w, "plans over tol (certificate or observed error): %d of %d\n", planOver, all.cases)
	fmt.Fprintf(w, "baseline answers outside tol (stopped wrong or capped): %d of %d planned cases, %d of %d in all\n", baseBad, all.cases, baseBadAll, len(rows))
	return nil
}

func dur(d time.Duration) string {
	switch {
	case d < time.Millisecond:
		return fmt.Sprintf("%.1fus", float64(d)/float64(time.Microsecond))
	case d < time.Second:
		return fmt.Sprintf("%.2fms", float64(d)/float64(time.Millisecond))
	}
	return fmt.Sprintf("%.2fs", d.Seconds())
}
