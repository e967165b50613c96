package main

import (
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"

	pb "foldbound/api/foldbound/v1"
)

// Human output prints enclosures as midpoint ± radius with a fixed
// number of digits, and bounds with 4 significant digits.

// fmtInterval formats [lo, hi] as mid ± radius, or one number if exact.
func fmtInterval(x *pb.Interval) string {
	lo, hi := x.GetLo(), x.GetHi()
	if lo == hi {
		return fmt.Sprintf("%.15g", lo)
	}
	m := lo + (hi-lo)/2
	r := math.Max(hi-m, m-lo)
	return fmt.Sprintf("%.15g ± %.1e", m, r)
}

// fmtBound formats a certified upper bound.
func fmtBound(v float64) string {
	if v == 0 {
		return "0"
	}
	return fmt.Sprintf("%.4g", v)
}

// fmtGrid describes one grid.
func fmtGrid(g *pb.Grid) string {
	if g.GetCount() == 0 {
		return fmt.Sprintf("step %g, shift %g, infinite", g.GetStep(), g.GetShift())
	}
	lo := g.GetShift() - g.GetStep()*float64((g.GetCount()-1)/2)
	hi := g.GetShift() + g.GetStep()*float64(g.GetCount()/2)
	return fmt.Sprintf("step %g, shift %g, %d samples on [%.6g, %.6g]", g.GetStep(), g.GetShift(), g.GetCount(), lo, hi)
}

func fmtGrids(gs []*pb.Grid) string {
	parts := make([]string, len(gs))
	for i, g := range gs {
		parts[i] = fmtGrid(g)
		if len(gs) > 1 {
			parts[i] = fmt.Sprintf("axis %d: %s", i, parts[i])
		}
	}
	return strings.Join(parts, "; ")
}

func fmtFloats(vs []float64) string {
	if len(vs) == 0 {
		return "0"
	}
	parts := make([]string, len(vs))
	for i, v := range vs {
		parts[i] = fmt.Sprintf("%g", v)
	}
	if len(parts) == 1 {
		return parts[0]
	}
	return "(" + strings.Join(parts, ", ") + ")"
}

// fmtBand describes a frequency or band in its convention's unit.
func fmtBand(b *pb.Band, c *pb.ConventionUsed) string {
	sym := "xi"
	if c.GetConvention() == pb.Convention_CONVENTION_ORDINARY {
		sym = "nu"
	}
	hw := b.GetHalfWidth()
	allZero := true
	for _, v := range hw {
		allZero = allZero && v == 0
	}
	if allZero {
		return fmt.Sprintf("%s = %s %s", sym, fmtFloats(b.GetCenter()), c.GetFrequencyUnit())
	}
	return fmt.Sprintf("|%s - %s| ≤ %s %s", sym, fmtFloats(b.GetCenter()), fmtFloats(hw), c.GetFrequencyUnit())
}

func fmtConvention(c *pb.ConventionUsed) string {
	name := strings.ToLower(strings.TrimPrefix(c.GetConvention().String(), "CONVENTION_"))
	return fmt.Sprintf("%s convention: %s", name, c.GetFormula())
}

func sideName(s pb.Side) string {
	if s == pb.Side_SIDE_UNSPECIFIED {
		return "per-axis (mixed)"
	}
	return strings.ToLower(strings.TrimPrefix(s.String(), "SIDE_"))
}

// table writes aligned columns.
type table struct{ tw *tabwriter.Writer }

func newTable(w io.Writer) *table {
	return &table{tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)}
}

func (t *table) row(cells ...string) { fmt.Fprintln(t.tw, strings.Join(cells, "\t")) }
func (t *table) flush() error        { return t.tw.Flush() }

// printAliasSum writes an AliasSumResponse for people.
func printAliasSum(w io.Writer, req *pb.AliasSumRequest, r *pb.AliasSumResponse) error {
	t := newTable(w)
	t.row("alias sum", r.GetFamily())
	t.row("grid", fmtGrids(req.GetGrids()))
	t.row("frequency", fmtBand(&pb.Band{Center: req.GetXi()}, r.GetConvention()))
	t.row("convention", fmtConvention(r.GetConvention()))
	t.row("")
	t.row("quantity", "real part", "imaginary part")
	for _, q := range []struct {
		name string
		z    *pb.ComplexInterval
	}{
		{"sampled sum T", r.GetSampled()},
		{"exact F", r.GetExact()},
		{"error T - F", r.GetError()},
		{"  aliasing", r.GetAlias()},
		{"  truncation", r.GetTruncation()},
	} {
		t.row(q.name, fmtInterval(q.z.GetRe()), fmtInterval(q.z.GetIm()))
	}
	if err := t.flush(); err != nil {
		return err
	}
	m := r.GetMethod()
	_, err := fmt.Fprintf(w, "\nmethod: %s side of the Poisson formula, %d alias terms, %d omitted samples summed, remainder ≤ %s (%s); work limit %d terms\n",
		sideName(m.GetSide()), m.GetAliasTerms(), m.GetTruncationTerms(), fmtBound(m.GetRemainder()), m.GetRemainderFrom(), m.GetMaxTerms())
	return err
}

// printBudget writes an itemised budget table.
func printBudget(w io.Writer, b *pb.ErrorBudget, tol float64) error {
	t := newTable(w)
	t.row("part", "certified bound")
	t.row("aliasing", fmtBound(b.GetAliasing()))
	t.row("truncation", fmtBound(b.GetTruncation()))
	t.row("rounding", fmtBound(b.GetRounding()))
	total := fmtBound(b.GetTotal())
	if tol > 0 {
		total += fmt.Sprintf("  (tolerance %g)", tol)
	}
	t.row("total", total)
	for _, it := range b.GetItems() {
		t.row(fmt.Sprintf("  %s, axis %d", strings.ToLower(strings.TrimPrefix(it.GetPart().String(), "BUDGET_PART_")), it.GetAxis()), fmtBound(it.GetBound()), it.GetSource())
	}
	return t.flush()
}

func printErrorBudget(w io.Writer, req *pb.ErrorBudgetRequest, r *pb.ErrorBudgetResponse) error {
	t := newTable(w)
	t.row("error budget", r.GetSubject())
	shift := "at the grid's shift"
	if r.GetWorstCaseShift() {
		shift = "for every shift"
	}
	t.row("grid", fmtGrids(req.GetGrids())+", "+shift)
	t.row("frequency", fmtBand(r.GetFrequency(), r.GetConvention()))
	t.row("convention", fmtConvention(r.GetConvention()))
	if err := t.flush(); err != nil {
		return err
	}
	fmt.Fprintln(w)
	if err := printBudget(w, r.GetBudget(), 0); err != nil {
		return err
	}
	from := "envelope bounds"
	if r.GetBudget().GetExact() {
		from = "enclosures of the exact error terms"
	}
	_, err := fmt.Fprintf(w, "\naliasing and truncation from %s; suprema over %d piece(s)\n", from, r.GetBudget().GetPieces())
	return err
}

func printPlan(w io.Writer, req *pb.PlanGridRequest, r *pb.PlanGridResponse) error {
	t := newTable(w)
	t.row("plan", r.GetSubject())
	shift := "for every shift"
	if !r.GetWorstCaseShift() {
		shift = "for the given shift"
	}
	t.row("tolerance", fmt.Sprintf("%g, %s", req.GetTol(), shift))
	t.row("frequency", fmtBand(req.GetFrequency(), r.GetConvention()))
	t.row("convention", fmtConvention(r.GetConvention()))
	t.row("")
	t.row("axis", "step", "count", "shift", "window")
	for i, a := range r.GetAxes() {
		g := a.GetGrid()
		t.row(fmt.Sprint(i), fmt.Sprintf("%.6g", g.GetStep()), fmt.Sprint(g.GetCount()), fmt.Sprintf("%.6g", g.GetShift()),
			fmt.Sprintf("[%.6g, %.6g]", a.GetWindow().GetLo(), a.GetWindow().GetHi()))
	}
	if err := t.flush(); err != nil {
		return err
	}
	fmt.Fprintln(w)
	if err := printBudget(w, r.GetBudget(), req.GetTol()); err != nil {
		return err
	}
	v := r.GetVerification()
	verdict := "NOT verified"
	if v.GetVerified() {
		verdict = "verified"
	}
	_, err := fmt.Fprintf(w, "\n%d samples in total, cost %g; %s: total %s (%s)\n",
		r.GetTotalSamples(), r.GetCost(), verdict, fmtBound(v.GetBudget().GetTotal()), v.GetMethod())
	return err
}
