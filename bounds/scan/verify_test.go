package scan

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"foldbound/bounds"
)

// Acceptance thresholds of TestVerifyPlans.
const (
	// plannedTarget: at the planned sampling the relative RMS error of the
	// fitted phantom stays below its level ε = 10⁻³, the relative size of
	// its spectrum beyond Ω (an error of the order of the neglected
	// spectrum; common practice, no source). Measured 8e-5 to 3.4e-4
	// (parallel) and 2e-5 to 6e-5 (fan) at 128×128 on amd64.
	plannedTarget = 1e-3
	// interlacedTarget: the interlaced layout with plain filtered
	// backprojection reaches only the order of ε (measured 8.7e-4 at
	// ρΩ = 40 rising to 3.5e-3 at ρΩ = 300; more views do not lower it,
	// so it is the reconstruction, not the view count).
	interlacedTarget = 5e-3
	// worseFactor: half the views, or twice the detector spacing (angle),
	// must give at least this multiple of the planned error. Measured
	// 31× to 55× (half the views, parallel), 100× to 190× (half the
	// sources, fan), 180× to 275× (twice the spacing or angle); 10× keeps
	// a margin of 3 below the least of them and is far above any change
	// rounding or the image grid could make.
	worseFactor = 10
)

// TestVerifyPlans is the acceptance check of the verification path: for
// parallel-beam plans with ρΩ from 40 to 300 and fan-beam plans with R/ρ
// from 2 to 4 (standard conditions Δs ≤ π/Ω, p ≥ ρΩ: Natterer, Acta
// Numerica 8 (1999) §2; fan conditions derived in the package doc), the
// reconstruction of the fitted phantom at the planned sampling meets the
// target and half the views or twice the detector spacing is at least
// worseFactor times worse (angular and radial aliasing).
func TestVerifyPlans(t *testing.T) {
	t.Parallel()
	tests := []struct {
		name string
		req  Request
	}{
		{"parallel ρΩ=40", Request{Radius: 1, Bandwidth: 40}},
		{"parallel ρΩ=50", Request{Radius: 10, Bandwidth: 5}},
		{"parallel ρΩ=100", Request{Radius: 20, Bandwidth: 5}},
		{"parallel ρΩ=149 (demo)", Request{Radius: 20, Bandwidth: math.Sqrt(2*math.Log(1e3)) / 0.5}},
		{"parallel ρΩ=300", Request{Radius: 100, Bandwidth: 3}},
		{"parallel δ=0.25", Request{Radius: 20, Resolution: 0.25}},
		{"fan ρΩ=50 R=2ρ", Request{Geometry: FanBeam, Radius: 10, Bandwidth: 5, SourceRadius: 20}},
		{"fan ρΩ=100 R=4ρ", Request{Geometry: FanBeam, Radius: 20, Bandwidth: 5, SourceRadius: 80}},
		{"fan ρΩ=200 R=2.28ρ", Request{Geometry: FanBeam, Radius: 250, Bandwidth: 0.8, SourceRadius: 570}},
	}
	for _, tt := range tests {
		res, err := Plan(tt.req)
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		v, err := Verify(context.Background(), res, VerifyOptions{Size: 128})
		if err != nil {
			t.Fatalf("%s: Verify: %v", tt.name, err)
		}
		if v.Caution != Caution {
			t.Errorf("%s: caution = %q", tt.name, v.Caution)
		}
		want := 3
		if res.Interlaced.Offered {
			want = 4
		}
		if len(v.Cases) != want {
			t.Fatalf("%s: %d cases, want %d", tt.name, len(v.Cases), want)
		}
		for _, c := range v.Cases {
			t.Logf("%-24s %-28s %5d × %4d  rel RMS %.2e (%5.1f× planned)  max %.2e  %v",
				tt.name, c.Label, c.Views, c.Detectors, c.Error.RelRMS, c.Ratio, c.Error.MaxAbs, c.Elapsed.Round(1e5))
			switch {
			case c.Label == "planned":
				if c.Error.RelRMS > plannedTarget {
					t.Errorf("%s: planned rel RMS = %.2e, want ≤ %g", tt.name, c.Error.RelRMS, plannedTarget)
				}
			case c.Scheme == Interlaced:
				if c.Error.RelRMS > interlacedTarget {
					t.Errorf("%s: interlaced rel RMS = %.2e, want ≤ %g", tt.name, c.Error.RelRMS, interlacedTarget)
				}
			default:
				if c.Ratio < worseFactor {
					t.Errorf("%s, %s: rel RMS = %.2e, %.1f× planned, want ≥ %g×", tt.name, c.Label, c.Error.RelRMS, c.Ratio, float64(worseFactor))
				}
			}
		}
		p := v.Cases[0]
		if p.Views != res.Standard.Views || p.Detectors != res.Standard.Detectors || p.Spacing != res.Standard.DetectorSpacing && res.Geometry == ParallelBeam {
			t.Errorf("%s: planned case %d × %d, Δs = %g, want the plan's %d × %d, %g", tt.name,
				p.Views, p.Detectors, p.Spacing, res.Standard.Views, res.Standard.Detectors, res.Standard.DetectorSpacing)
		}
		if v.Radius > res.Radius || math.Abs(v.Bandwidth-res.Bandwidth) > 1e-12*res.Bandwidth {
			t.Errorf("%s: phantom extent (%g, %g), want radius ≤ %g and band limit %g", tt.name, v.Radius, v.Bandwidth, res.Radius, res.Bandwidth)
		}
	}
}

// TestVerifyBadInput checks that bad plans, options and limits are
// reported as *bounds.ParamError naming the field, and that a cancelled
// context stops the work.
func TestVerifyBadInput(t *testing.T) {
	t.Parallel()
	plan := func(req Request) Result {
		t.Helper()
		res, err := Plan(req)
		if err != nil {
			t.Fatal(err)
		}
		return res
	}
	par := plan(Request{Radius: 10, Bandwidth: 5})
	fan := plan(Request{Geometry: FanBeam, Radius: 10, Bandwidth: 5, SourceRadius: 20})
	modify := func(r Result, f func(*Result)) Result { f(&r); return r }
	tests := []struct {
		name  string
		res   Result
		size  int
		param string
		want  error
	}{
		{"negative size", par, -1, "verify.size", bounds.ErrInvalid},
		{"size over the limit", par, MaxVerifySize + 1, "verify.size", bounds.ErrWorkLimit},
		{"zero plan", Result{}, 0, "scan.radius", bounds.ErrInvalid},
		{"no bandwidth", modify(par, func(r *Result) { r.Bandwidth = 0 }), 0, "scan.bandwidth", bounds.ErrInvalid},
		{"nan radius", modify(par, func(r *Result) { r.Radius = math.NaN() }), 0, "scan.radius", bounds.ErrInvalid},
		{"no standard layout", modify(par, func(r *Result) { r.Standard = Layout{} }), 0, "verify.plan", bounds.ErrInvalid},
		{"unknown geometry", modify(par, func(r *Result) { r.Geometry = 7 }), 0, "scan.geometry", bounds.ErrInvalid},
		{"ρΩ too small", plan(Request{Radius: 1, Bandwidth: 30}), 0, "scan.bandwidth", bounds.ErrInvalid},
		{"ρΩ too small, by resolution", plan(Request{Radius: 1, Resolution: 0.1}), 0, "scan.resolution", bounds.ErrInvalid},
		{"short scan", plan(Request{Geometry: FanBeam, Radius: 10, Bandwidth: 5, SourceRadius: 20, ShortScan: true}), 0, "scan.short_scan", bounds.ErrInvalid},
		{"source too close", plan(Request{Geometry: FanBeam, Radius: 10, Bandwidth: 5, SourceRadius: 14}), 0, "scan.source_radius", bounds.ErrInvalid},
		{"fan of one source", modify(fan, func(r *Result) { r.Standard.Views = 1 }), 0, "verify.plan", bounds.ErrInvalid},
		{"more rays than a sinogram holds", plan(Request{Radius: 1, Bandwidth: 20000}), 0, "verify.rays", bounds.ErrWorkLimit},
		{"work over the limit", plan(Request{Radius: 20, Bandwidth: 100}), MaxVerifySize, "verify.work", bounds.ErrWorkLimit},
	}
	for _, tt := range tests {
		_, err := Verify(context.Background(), tt.res, VerifyOptions{Size: tt.size})
		var pe *bounds.ParamError
		if !errors.As(err, &pe) || pe.Param != tt.param || !errors.Is(err, tt.want) {
			t.Errorf("%s: Verify = %v, want ParamError %q wrapping %v", tt.name, err, tt.param, tt.want)
		}
	}

	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	for _, res := range []Result{par, fan} {
		if _, err := Verify(ctx, res, VerifyOptions{Size: 16}); !errors.Is(err, context.Canceled) {
			t.Errorf("Verify(%v, cancelled) = %v, want context.Canceled", res.Geometry, err)
		}
	}
}

// TestVerifyDescription checks that the report says what was built.
func TestVerifyDescription(t *testing.T) {
	t.Parallel()
	res, err := Plan(Request{Radius: 10, Bandwidth: 5})
	if err != nil {
		t.Fatal(err)
	}
	v, err := Verify(context.Background(), res, VerifyOptions{Size: 16})
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"5 Gaussian blobs", "ρ = 10", "ε = 0.001", "Ω = 5"} {
		if !strings.Contains(v.Description, want) {
			t.Errorf("description %q lacks %q", v.Description, want)
		}
	}
	if v.Size != 16 || v.Width != 20 || v.Window != RamLak || v.Level != PhantomLevel {
		t.Errorf("Verify: size %d, width %g, window %v, level %g; want 16, 20, Ram-Lak, %g", v.Size, v.Width, v.Window, v.Level, PhantomLevel)
	}
}

var sinkVerification Verification

// BenchmarkVerify runs the whole verification at 256×256 pixels: the
// parallel plan for the demo's ρ = 20, Ω = 7.43 (149 views × 97
// detectors; four reconstructions) and the fan plan for ρ = 20, Ω = 5,
// R = 80 (267 sources × 83 detectors; three reconstructions).
func BenchmarkVerify(b *testing.B) {
	for _, req := range []Request{
		{Radius: 20, Bandwidth: math.Sqrt(2*math.Log(1e3)) / 0.5},
		{Geometry: FanBeam, Radius: 20, Bandwidth: 5, SourceRadius: 80},
	} {
		res, err := Plan(req)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("%v-%dviews-256x256", req.Geometry, res.Standard.Views), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				v, err := Verify(context.Background(), res, VerifyOptions{Size: 256})
				if err != nil {
					b.Fatal(err)
				}
				sinkVerification = v
			}
		})
	}
}
