package bounds

import (
	"context"
	"errors"
	"math"
	"testing"

	"foldbound/internal/bigref"
)

// Demonstrations of problems found in code owned elsewhere (envelope.go,
// alias.go, interval.go) while testing the closed-form families. Each is
// skipped so that the branch stays green; remove the Skip once fixed.

// Envelope.Dilated rounds Gaussian (and algebraic) widths down, so the
// dilated envelope can fall below the function it must bound: with three
// dilations by a = 0.708217 of e^{-x²/2}, At(x) at x = 15a³ is below
// e^{-x²/(2a⁶)} computed in math/big. A Gaussian or algebraic profile
// increases with its width, so widths must be rounded up (as rates of
// exponential terms are rounded down). dilateEnvelope in compose.go does so.
func TestBugDilatedRoundsWidthsDown(t *testing.T) {
	a := 0.708217
	env := Envelope{{Decay: Gaussian, Amplitude: 1, Width: 1}}.Dilated(a).Dilated(a).Dilated(a)
	w := bigref.Mul(bigref.Mul(bigref.New(a), bigref.New(a)), bigref.New(a))
	x := 15 * a * a * a
	q := bigref.Quo(bigref.New(x), w)
	exact := bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(q, q), bigref.Int(2))))
	if got := env.At(Point(x)); !bigref.In(math.Inf(-1), got, exact) {
		t.Errorf("Dilated(a)³.At(%g) = %.17g, below the exact envelope %.20g (math/big)", x, got, exact)
	}
}

// On a finite grid a family whose spatial envelope decays only like x⁻²
// (Lorentzian, Fejér) cannot be summed at the default tolerance: AliasSum
// insists on splitting T - F into alias and truncation to 2⁻⁶⁰ relative,
// which needs ~2⁶⁰ omitted samples, and returns ErrWorkLimit (after
// seconds at the default limit), although T (N samples) and F, hence the
// error T - F, are available exactly. Expected: the error T - F at full
// accuracy, with the split into alias and truncation to the tolerance the
// work limit allows.
func TestFiniteGridSlowDecay(t *testing.T) {
	fam, _ := NewLorentzian(1)
	_, err := AliasSum(context.Background(), fam, Grid{Step: 0.5, Count: 21}, 0.3, Settings{MaxTerms: 1 << 14})
	if errors.Is(err, ErrWorkLimit) {
		t.Errorf("AliasSum(%v, 21 samples) = %v, want T and T - F to full accuracy", fam, err)
	}
}

// The width of a spatial sum grows by about one ulp of the running sum per
// term (Interval.Add steps outward even when an addition is exact), so on
// fine grids the enclosure of T widens well beyond the families' own
// enclosures (a few ulps per term): h Σ e^{-|hk|} at h = 0.02 (8193
// samples summed) has relative width 1.7e-12, while each term's is 4e-15.
// Error-free accumulation (TwoSum of the endpoints, rounding once at the
// end) would keep it near 1e-15.
func TestSummationWidthGrowth(t *testing.T) {
	fam, _ := NewExponential(1)
	res, err := AliasSum(context.Background(), fam, Grid{Step: 0.02}, 0, Settings{Side: SpatialSide})
	if err != nil {
		t.Fatal(err)
	}
	if w := res.Sampled.Re.RelWidth(); w > 1e-13 {
		t.Errorf("T = %v over %d samples, relative width %.3g, want ≤ 1e-13", res.Sampled.Re, res.Method.AliasTerms, w)
	}
}

// Envelope.Shifted adds the rounding error of the new centre to the
// plateau with addUp even when it is 0, so every shifted envelope gets a
// plateau of 5e-324 and EnvelopeTerm.tail takes its cruder plateau branch
// ((⌊2p/h⌋+3)·g(0) + 2B(h) instead of g(0) + B(h) + B(h/2)).
func TestShiftedSpuriousPlateau(t *testing.T) {
	env := Envelope{{Decay: Exponential, Amplitude: 1, Rate: 1}}.Shifted(1)
	if p := env[0].Plateau; p != 0 {
		t.Errorf("Shifted(1) plateau = %g, want 0 (1 + 0 is exact)", p)
	}
}
