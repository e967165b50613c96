package scan

import (
	"errors"
	"math"
	"testing"

	"foldbound/bounds"
)

// TestFitPhantomFits checks the two properties FitPhantom promises, from
// the definitions rather than from Phantom.Extent: every blob is below
// ε·|A| on the circle |x| = ρ (and the circle lies outside its ε-ellipse,
// so beyond it too), and the narrowest width s gives a transform
// exp(−½s²|ξ|²) of exactly ε at |ξ| = Ω (the transform of a Gaussian,
// ∫ e^{−x²/(2s²)} e^{−ixξ} dx = s√(2π)·e^{−s²ξ²/2}; common practice, no
// source), while no blob is narrower.
func TestFitPhantomFits(t *testing.T) {
	t.Parallel()
	tests := []struct {
		rho, omega, eps float64
	}{
		{1, 40, 1e-3},
		{10, 5, 1e-3},
		{20, 7.4338, 1e-3},
		{100, 3, 1e-3},
		{250, 2 * math.Pi, 1e-3},
		{20, 20, 1e-6},
		{20, 20, 1e-12},
		{5, 10, 0.1},
	}
	for _, tt := range tests {
		ph, err := FitPhantom(tt.rho, tt.omega, tt.eps)
		if err != nil {
			t.Errorf("FitPhantom(%g, %g, %g): %v", tt.rho, tt.omega, tt.eps, err)
			continue
		}
		narrow := math.Inf(1)
		for i, b := range ph.Blobs {
			narrow = math.Min(narrow, math.Min(b.SigmaU, b.SigmaV))
			for k := range 720 {
				phi := 2 * math.Pi * float64(k) / 720
				x, y := tt.rho*math.Cos(phi), tt.rho*math.Sin(phi)
				if v := math.Abs(b.value(x, y)); v > tt.eps*math.Abs(b.Amplitude)*(1+1e-12) {
					t.Errorf("ρ=%g Ω=%g ε=%g: blob %d at (%.4g, %.4g) = %.3g·|A|, want ≤ ε", tt.rho, tt.omega, tt.eps, i, x, y, v/math.Abs(b.Amplitude))
					break
				}
			}
		}
		if got := math.Exp(-0.5 * narrow * narrow * tt.omega * tt.omega); math.Abs(got-tt.eps) > 1e-12*tt.eps {
			t.Errorf("ρ=%g Ω=%g ε=%g: narrowest σ = %g has transform ratio %.15g at Ω, want ε", tt.rho, tt.omega, tt.eps, narrow, got)
		}
	}
}

// TestFitPhantomDemo checks that at the demo's own radius and band limit
// FitPhantom gives DemoPhantom back (its construction keeps the demo's
// relative reach of every blob).
func TestFitPhantomDemo(t *testing.T) {
	t.Parallel()
	omega := math.Sqrt(2*math.Log(1e3)) / 0.5 // the demo's band limit at ε = 10⁻³
	ph, err := FitPhantom(20, omega, 1e-3)
	if err != nil {
		t.Fatal(err)
	}
	for i, want := range DemoPhantom().Blobs {
		got := ph.Blobs[i]
		for _, f := range []struct {
			name string
			g, w float64
		}{{"x", got.X, want.X}, {"y", got.Y, want.Y}, {"σu", got.SigmaU, want.SigmaU}, {"σv", got.SigmaV, want.SigmaV},
			{"angle", got.Angle, want.Angle}, {"amplitude", got.Amplitude, want.Amplitude}} {
			if math.Abs(f.g-f.w) > 1e-12*(1+math.Abs(f.w)) {
				t.Errorf("blob %d: %s = %.15g, want %.15g", i, f.name, f.g, f.w)
			}
		}
	}
}

// TestFitPhantomLimit checks the stated limit: at ε = 10⁻³ the elongated
// blob (σ 1.2 × 0.5 at (−8, 13) in the demo) fits only for
// ρΩ ≥ t²·1.2/(0.5·e), e = (|(−8, 13)| + 1.2t)/20, t² = 2 ln 1000 — the
// arithmetic of the construction, recomputed here.
func TestFitPhantomLimit(t *testing.T) {
	t.Parallel()
	t2 := 2 * math.Log(1e3)
	e := (math.Hypot(-8, 13) + 1.2*math.Sqrt(t2)) / 20
	need := t2 * 1.2 / (0.5 * e) // 33.63
	if need < 33.5 || need > 33.7 {
		t.Fatalf("threshold %g, want about 33.6 (package doc)", need)
	}
	if _, err := FitPhantom(1, need*1.001, 1e-3); err != nil {
		t.Errorf("FitPhantom(ρΩ = %g) = %v, want a phantom", need*1.001, err)
	}
	_, err := FitPhantom(1, need*0.999, 1e-3)
	var pe *bounds.ParamError
	if !errors.As(err, &pe) || pe.Param != "scan.bandwidth" || !errors.Is(err, bounds.ErrInvalid) {
		t.Errorf("FitPhantom(ρΩ = %g) = %v, want ParamError scan.bandwidth wrapping ErrInvalid", need*0.999, err)
	}
}

func TestFitPhantomBadInput(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name            string
		rho, omega, eps float64
		param           string
		want            error
	}{
		{"zero radius", 0, 5, 1e-3, "scan.radius", bounds.ErrInvalid},
		{"nan radius", math.NaN(), 5, 1e-3, "scan.radius", bounds.ErrInvalid},
		{"negative bandwidth", 10, -1, 1e-3, "scan.bandwidth", bounds.ErrInvalid},
		{"inf bandwidth", 10, math.Inf(1), 1e-3, "scan.bandwidth", bounds.ErrInvalid},
		{"eps 0", 10, 5, 0, "phantom.eps", bounds.ErrInvalid},
		{"eps 0.5", 10, 5, 0.5, "phantom.eps", bounds.ErrInvalid},
		{"eps nan", 10, 5, math.NaN(), "phantom.eps", bounds.ErrInvalid},
		{"too small", 1, 10, 1e-3, "scan.bandwidth", bounds.ErrInvalid},
		{"huge", 1e300, 1e300, 1e-3, "scan.bandwidth", bounds.ErrWorkLimit},
	}
	for _, tt := range tests {
		_, err := FitPhantom(tt.rho, tt.omega, tt.eps)
		var pe *bounds.ParamError
		if !errors.As(err, &pe) || pe.Param != tt.param || !errors.Is(err, tt.want) {
			t.Errorf("%s: FitPhantom(%g, %g, %g) = %v, want ParamError %q wrapping %v", tt.name, tt.rho, tt.omega, tt.eps, err, tt.param, tt.want)
		}
	}
}
