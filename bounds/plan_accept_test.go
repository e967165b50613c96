package bounds_test

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"foldbound/bounds"
)

// catalogueCase pairs an engine family with its independent reference.
type catalogueCase struct {
	name string
	fam  bounds.Family
	ref  refFamily
	// tols are the tolerances checked; the planner must meet each or
	// refuse it as infeasible when the brute force cannot meet it either.
	tols []float64
}

func mustGaussian(t testing.TB, sigma float64) bounds.Family {
	t.Helper()
	g, err := bounds.NewGaussian(sigma)
	if err != nil {
		t.Fatal(err)
	}
	return g
}

var acceptTols = []float64{1e-3, 1e-4, 1e-5, 1e-6, 1e-7, 1e-8, 1e-9, 1e-10, 1e-11, 1e-12, 1e-13, 1e-14}

func must[F bounds.Family](t testing.TB, f F, err error) bounds.Family {
	t.Helper()
	if err != nil {
		t.Fatal(err)
	}
	return f
}

func catalogueCases(t testing.TB) []catalogueCase {
	sech, err := bounds.NewSech(1)
	sechFam := must(t, sech, err)
	sq, err := bounds.NewSechSquared(1)
	sqFam := must(t, sq, err)
	wp, err := bounds.NewWavePacket(1, 3)
	wpFam := must(t, wp, err)
	ex, err := bounds.NewExponential(1)
	exFam := must(t, ex, err)
	b4, err := bounds.NewBSpline(4)
	b4Fam := must(t, b4, err)
	b6, err := bounds.NewBSpline(6)
	b6Fam := must(t, b6, err)
	return []catalogueCase{
		{name: "gaussian(sigma=1)", fam: mustGaussian(t, 1), ref: gaussRef(1, 0), tols: acceptTols},
		{name: "gaussian(sigma=0.3)", fam: mustGaussian(t, 0.3), ref: gaussRef(0.3, 0), tols: acceptTols},
		{name: "sech(w=1)", fam: sechFam, ref: sechRef(1), tols: acceptTols},
		{name: "sech2(w=1)", fam: sqFam, ref: sechSqRef(), tols: acceptTols},
		{name: "wavepacket(1,3)", fam: wpFam, ref: wavePacketRef(1, 3), tols: acceptTols},
		{name: "exponential(a=1)", fam: exFam, ref: expRef(1), tols: []float64{1e-3, 1e-4}},
		{name: "bspline(4)", fam: b4Fam, ref: bsplineRef(4), tols: acceptTols},
		{name: "bspline(6)", fam: b6Fam, ref: bsplineRef(6), tols: acceptTols},
	}
}

// bruteSteps returns the steps the brute force scans for a tolerance: a
// geometric grid from a quarter of the aliasing-limited step to a little
// beyond it, and the steps W/n at which n samples span a compact support W.
func bruteSteps(r refFamily, tol, widen float64, m int) []float64 {
	var hs []float64
	if r.reach > 0 {
		// First, so that the search over counts stops early.
		for n := 1; n < 512; n++ {
			hs = append(hs, 2*r.reach/float64(n))
		}
	}
	hA := refStepForAlias(r, tol)
	return append(hs, logSteps(hA/4, hA*widen, m)...)
}

// refine returns a fine geometric grid of steps within ±3% of h.
func refine(h float64, m int) []float64 { return logSteps(h*0.97, h*1.03, m) }

// TestPlanNearBruteForce checks the acceptance criterion of the planner: for
// catalogue families and tolerances 1e-3 … 1e-14 the planned count is within
// 5% (plus 2 samples) of the least count whose certified budget — aliasing
// of every shift Σ_{l≠0}|F(2πl/h)|, worst truncation over shifts
// h Σ_omitted |f|, and the rounding term (γ_{N+3} + u)·S of the engine — is
// within the tolerance, found by an exhaustive search over steps and
// counts that evaluates these quantities from the closed forms
// (plan_ref_test.go), not through the engine. It also reports the price of
// certification: the ratio to the least count whose worst actual error
// over shifts is within the tolerance (aliasing and truncation may
// cancel).
func TestPlanNearBruteForce(t *testing.T) {
	ctx := context.Background()
	for _, c := range catalogueCases(t) {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			var table strings.Builder
			fmt.Fprintf(&table, "\n%-20s %8s %7s %7s %7s %7s %7s\n", "family", "tol", "N_plan", "N_cert", "ratio", "N_true", "price")
			worst := 0.0
			env := c.fam.Spatial()
			for _, tol := range c.tols {
				name := fmt.Sprintf("tol=%g", tol)
				const shifts = 7
				budget := func(h float64) func(int) (float64, bool) { return refCertifiedAt(c.ref, env, h, shifts, tol) }
				nCert, hCert := bruteMin(bruteSteps(c.ref, tol, 1.001, 200), tol, 1<<16, budget)
				if nCert < math.MaxInt {
					if n2, h2 := bruteMin(refine(hCert, 300), tol, nCert, budget); n2 < nCert {
						nCert, hCert = n2, h2
					}
				}
				plan, err := bounds.PlanGrid(ctx, bounds.PlanRequest{Family: c.fam, Tol: tol})
				if err != nil {
					if errors.Is(err, bounds.ErrInfeasible) && nCert == math.MaxInt {
						fmt.Fprintf(&table, "%-20s %8.0e %7s %7s %7s %7s %7s\n", c.name, tol, "-", "-", "-", "-", "-")
						continue
					}
					t.Errorf("%s: PlanGrid: %v (brute force: N = %d at h = %g)", name, err, nCert, hCert)
					continue
				}
				n := int(plan.Grid.Count)
				if nCert == math.MaxInt {
					t.Errorf("%s: planned N = %d but the brute force found no grid within the tolerance", name, n)
					continue
				}
				if float64(n) > 1.05*float64(nCert)+2 {
					t.Errorf("%s: planned N = %d, want ≤ 1.05·%d + 2 (brute-force minimum at h = %g)", name, n, nCert, hCert)
				}
				ratio := float64(n) / float64(nCert)
				worst = math.Max(worst, ratio)
				// The certificate must hold against the reference budget of
				// the planned grid, evaluated on a denser set of shifts.
				// The exact parts (aliasing and truncation) are compared
				// as they are; the rounding parts are two bounds of the same
				// thing (the engine's S is an enclosure of h Σ|f(x_k)|, the
				// reference's its envelope bound), compared within 1%. The
				// reference's aliasing carries its own tail bound of at most
				// a few 1e-18 (refAliasAbs), allowed for: where the true
				// aliasing is 0 (the B-splines at h = 1) the engine's ray
				// bound is far below it.
				ref := refCertified(c.ref, env, plan.Grid.Step, n, 33)
				refRd := refRounding(n, refEnvelopeSum(env, plan.Grid.Step))
				b := plan.Budget
				if ref-refRd > (b.Aliasing+b.Truncation)*(1+1e-9)+1e-17 || refRd > 1.01*b.Rounding || b.Total > tol {
					t.Errorf("%s: certificate %g (aliasing + truncation %g, rounding %g), reference budget %g (rounding %g), tol %g",
						name, b.Total, b.Aliasing+b.Truncation, b.Rounding, ref, refRd, tol)
				}
				if act := refActual(c.ref, plan.Grid.Step, n, 33); act > tol {
					t.Errorf("%s: actual error %g exceeds tol", name, act)
				}
				// The price of certification.
				actual := func(h float64) func(int) (float64, bool) { return refActualAt(c.ref, h, shifts) }
				nTrue, hTrue := bruteMin(bruteSteps(c.ref, tol, 1.5, 200), tol, nCert, actual)
				if nTrue < math.MaxInt {
					if n2, _ := bruteMin(refine(hTrue, 100), tol, nTrue, actual); n2 < nTrue {
						nTrue = n2
					}
				} else {
					nTrue = nCert
				}
				fmt.Fprintf(&table, "%-20s %8.0e %7d %7d %7.3f %7d %7.3f\n", c.name, tol, n, nCert, ratio, nTrue, float64(n)/float64(nTrue))
			}
			t.Logf("planned N against the brute-force minima (N_cert: same certified budget; N_true: actual error); worst ratio %.3f%s", worst, table.String())
		})
	}
}
