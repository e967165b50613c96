package scan

import (
	"errors"
	"math"
	"strings"
	"testing"

	"foldbound/bounds"
)

// TestPlanWorkedCases checks plans against cases worked by hand from the
// stated conditions; the source of each condition is named beside it.
func TestPlanWorkedCases(t *testing.T) {
	t.Parallel()
	const tol = 1e-12
	tests := []struct {
		name   string
		req    Request
		scheme Scheme
		// want
		spacing, angle float64
		dets, views    int
		samples        int64
	}{
		// Natterer, Acta Numerica 8 (1999) §2: Δs ≤ π/Ω, p ≥ ρΩ over 180°.
		// ρ = 1, Ω = 100: q = ⌈100/π⌉ = 32, Δs = 1/32, 65 rays; p = 100.
		{"parallel standard", Request{Radius: 1, Bandwidth: 100}, Standard, 1.0 / 32, 0, 65, 100, 6500},
		// Interlaced (Kruse 1989 via Natterer 1999; margin derived, package
		// doc): Δs = 2/32; K = 32π = 100.53, K + 3.7723·K^{1/3} = 118.07 → 120
		// (even); samples 120·65/2.
		{"parallel interlaced", Request{Radius: 1, Bandwidth: 100}, Interlaced, 2.0 / 32, 0, 33, 120, 3900},
		// Resolution δ = 0.5 mm (Ω = π/δ, common practice, no source) on a
		// 200 mm disc: Δs = δ exactly, q = ρ/δ = 200, p = ⌈200π⌉ = 629.
		{"resolution", Request{Radius: 100, Resolution: 0.5}, Standard, 0.5, 0, 401, 629, 629 * 401},
		// Fan beam (derived, package doc): ρ = 1, Ω = 100, R = 2.5;
		// αmax = asin 0.4; q = ⌈αmax·350/π⌉ = ⌈45.846⌉ = 46, Δα = αmax/46;
		// p = ⌈2·100·2.5/1.5⌉ = ⌈333.33⌉ = 334 over 360°.
		{"fan standard", Request{Geometry: FanBeam, Radius: 1, Bandwidth: 100, SourceRadius: 2.5}, Standard,
			2.5 * math.Asin(0.4) / 46, math.Asin(0.4) / 46, 93, 334, 334 * 93},
		// Short scan, π + 2αmax = 3.96463 at step 2π/334: ⌈210.75⌉ + 1 = 212
		// positions (Parker 1982 completeness, from memory; same step).
		{"fan short scan", Request{Geometry: FanBeam, Radius: 1, Bandwidth: 100, SourceRadius: 2.5, ShortScan: true}, Standard,
			2.5 * math.Asin(0.4) / 46, math.Asin(0.4) / 46, 93, 212, 212 * 93},
		// Far source, R = 10⁶ρ: the fan conditions tend to the parallel
		// ones (rebinning s = R sin α): RΔα → 1/32 = Δs, and p → 2·100 over
		// 360° (100 over 180°); here ⌈200.0002⌉ = 201.
		{"fan far source", Request{Geometry: FanBeam, Radius: 1, Bandwidth: 100, SourceRadius: 1e6}, Standard,
			1e6 * math.Asin(1e-6) / 32, math.Asin(1e-6) / 32, 65, 201, 201 * 65},
		// Small object, ρΩ = 2.5: q = 1, Δs = ρ, 3 rays, p = 3. Interlaced
		// would need K + 3.77·K^{1/3} = 8.76 → 10 views and 15 samples, more
		// than the standard 9, so it is not offered (checked below).
		{"small ρΩ", Request{Radius: 0.5, Bandwidth: 5}, Standard, 0.5, 0, 3, 3, 9},
	}
	for _, tt := range tests {
		res, err := Plan(tt.req)
		if err != nil {
			t.Errorf("%s: Plan = %v", tt.name, err)
			continue
		}
		l := res.Standard
		if tt.scheme == Interlaced {
			l = res.Interlaced
		}
		if !l.Offered {
			t.Errorf("%s: layout not offered: %s", tt.name, l.Note)
			continue
		}
		if math.Abs(l.DetectorSpacing-tt.spacing) > tol*tt.spacing {
			t.Errorf("%s: DetectorSpacing = %.16g, want %.16g", tt.name, l.DetectorSpacing, tt.spacing)
		}
		if math.Abs(l.DetectorAngle-tt.angle) > tol*tt.angle {
			t.Errorf("%s: DetectorAngle = %.16g, want %.16g", tt.name, l.DetectorAngle, tt.angle)
		}
		if l.Detectors != tt.dets || l.Views != tt.views || l.Samples != tt.samples {
			t.Errorf("%s: (Detectors, Views, Samples) = (%d, %d, %d), want (%d, %d, %d)",
				tt.name, l.Detectors, l.Views, l.Samples, tt.dets, tt.views, tt.samples)
		}
		if res.Caution != Caution {
			t.Errorf("%s: Caution = %q, want the package constant", tt.name, res.Caution)
		}
	}
}

func TestPlanInterlacedNotCheaper(t *testing.T) {
	t.Parallel()
	res, err := Plan(Request{Radius: 0.5, Bandwidth: 5})
	if err != nil {
		t.Fatal(err)
	}
	if res.Interlaced.Offered || !strings.Contains(res.Interlaced.Note, "not cheaper") {
		t.Errorf("small ρΩ: interlaced layout %+v, want not offered", res.Interlaced)
	}
	fan, err := Plan(Request{Geometry: FanBeam, Radius: 1, Bandwidth: 100, SourceRadius: 10})
	if err != nil {
		t.Fatal(err)
	}
	if fan.Interlaced.Offered || fan.Interlaced.Note == "" {
		t.Errorf("fan: interlaced layout %+v, want not offered with a note", fan.Interlaced)
	}
}

// TestPlanConditionsHold checks on a sweep of inputs that every layout
// meets its stated conditions and that one view fewer, or a count of
// detectors one smaller, would break them.
func TestPlanConditionsHold(t *testing.T) {
	t.Parallel()
	for _, rho := range []float64{0.3, 1, 7.5, 250} {
		for _, omega := range []float64{0.9, 3, 41.7, 300} {
			res, err := Plan(Request{Radius: rho, Bandwidth: omega})
			if err != nil {
				if rho*omega > 1e4 {
					continue
				}
				t.Fatalf("Plan(ρ=%g, Ω=%g) = %v", rho, omega, err)
			}
			s := res.Standard
			q := float64(s.Detectors-1) / 2
			if s.DetectorSpacing > math.Pi/omega || q*s.DetectorSpacing < rho*(1-1e-15) ||
				float64(s.Views) < rho*omega || float64(s.Views-1) >= math.Max(rho*omega*(1+1e-12), 1) {
				t.Errorf("ρ=%g Ω=%g: standard layout %+v breaks Δs ≤ π/Ω, qΔs ≥ ρ or p = ⌈ρΩ⌉", rho, omega, s)
			}
			if (q-1)*math.Pi/omega >= rho {
				t.Errorf("ρ=%g Ω=%g: %d detectors, fewer would do", rho, omega, s.Detectors)
			}
			in := res.Interlaced
			if !in.Offered {
				continue
			}
			if in.DetectorSpacing > 2*math.Pi/omega || in.Views%2 != 0 || float64(in.Views) < 2*math.Pi*rho/in.DetectorSpacing {
				t.Errorf("ρ=%g Ω=%g: interlaced layout %+v breaks its conditions", rho, omega, in)
			}
		}
	}
}

// TestPlanLimits checks the large-size behaviour of the plans against
// facts of the trade: the parallel standard scheme needs about π/2 views
// per detector (Kak & Slaney, Principles of Computerized Tomographic
// Imaging, 1988, Ch. 5, from memory; it follows from p = ρΩ and 2ρΩ/π
// detectors), and the interlaced scheme about half the samples of the
// standard one (Kruse 1989, quoted by Natterer 1999).
func TestPlanLimits(t *testing.T) {
	t.Parallel()
	res, err := Plan(Request{Radius: 1, Bandwidth: 1e4})
	if err != nil {
		t.Fatal(err)
	}
	if got := float64(res.Standard.Views) / float64(res.Standard.Detectors); math.Abs(got-math.Pi/2) > 1e-3 {
		t.Errorf("views/detectors = %.5f, want π/2 = %.5f within 1e-3", got, math.Pi/2)
	}
	// Debye margin: K + 3.77·K^{1/3} with K = 3184π = 10002.8 → 10084.
	if got := float64(res.Interlaced.Samples) / float64(res.Standard.Samples); math.Abs(got-0.5) > 0.01 {
		t.Errorf("interlaced/standard samples = %.4f, want 0.5 within 0.01", got)
	}
}

// TestPlanLattice checks the layouts against the brute-force lattice
// criterion (lattice.go), an executable form of the derivation: the
// returned lattices keep the bowtie translates apart at every ray angle,
// and the parallel ones fail once the views or the spacing go beyond the
// conditions. It also checks the information-level fan conditions stated in
// the package documentation (Δα = π/(ΩR), p = 2ρΩR/(R+ρ)), which the plans
// do not use.
func TestPlanLattice(t *testing.T) {
	t.Parallel()
	const rho, omega = 1.0, 60.0
	res, err := Plan(Request{Radius: rho, Bandwidth: omega})
	if err != nil {
		t.Fatal(err)
	}
	s, in := res.Standard, res.Interlaced
	// Lattice-level interlaced threshold, without the Debye margin.
	k := int(math.Ceil(2*math.Pi*rho/in.DetectorSpacing/2)) * 2
	tests := []struct {
		name string
		w    lattice2
		want bool
	}{
		{"standard", parallelLattice(s.Views, s.DetectorSpacing, false), true},
		{"standard, views−2", parallelLattice(s.Views-2, s.DetectorSpacing, false), false},
		{"standard, 1.02·Δs", parallelLattice(s.Views, 1.02*math.Pi/omega, false), false},
		{"interlaced", parallelLattice(in.Views, in.DetectorSpacing, true), true},
		{"interlaced, lattice threshold", parallelLattice(k, in.DetectorSpacing, true), true},
		{"interlaced, views below threshold", parallelLattice(k-4, in.DetectorSpacing, true), false},
		{"interlaced, 1.02·2π/Ω", parallelLattice(in.Views, 1.02*2*math.Pi/omega, true), false},
		{"standard grid with interlacing", parallelLattice(s.Views, s.DetectorSpacing, true), true},
	}
	for _, tt := range tests {
		if got := aliasFree(tt.w, rho, omega); got != tt.want {
			t.Errorf("%s: aliasFree = %v, want %v", tt.name, got, tt.want)
		}
	}

	for _, bigR := range []float64{1.2, 2, 4, 20} {
		fan, err := Plan(Request{Geometry: FanBeam, Radius: rho, Bandwidth: omega, SourceRadius: bigR})
		if err != nil {
			t.Fatal(err)
		}
		f := fan.Standard
		amax := math.Asin(rho / bigR)
		infoDa := math.Pi / (omega * bigR)
		infoDb := math.Pi * (bigR + rho) / (omega * rho * bigR)
		for i := 0; i <= 16; i++ {
			alpha := amax * float64(i) / 16
			a := fanHalfWidth(rho, bigR, alpha)
			if !aliasFree(fanLattice(f.ViewStep, f.DetectorAngle, bigR, alpha, false), a, omega) {
				t.Errorf("R=%g α=%.3f: planned fan lattice aliases", bigR, alpha)
			}
			// A finer Δα needs a finer Δβ at this level (the m = (1, 1) dual
			// point), so Δβ gets the larger safety factor.
			if !aliasFree(fanLattice(0.998*infoDb, 0.999*infoDa, bigR, alpha, false), a, omega) {
				t.Errorf("R=%g α=%.3f: information-level fan lattice aliases", bigR, alpha)
			}
		}
		// At the central ray the information-level bounds are sharp.
		if aliasFree(fanLattice(1.02*infoDb, infoDa, bigR, 0, false), rho, omega) ||
			aliasFree(fanLattice(infoDb, 1.02*infoDa, bigR, 0, false), rho, omega) {
			t.Errorf("R=%g: fan lattice beyond the information-level bounds is alias-free", bigR)
		}
	}
}

// TestPlanBadInput checks that bad fields are reported as
// *bounds.ParamError with the field named, wrapping the right sentinel.
func TestPlanBadInput(t *testing.T) {
	t.Parallel()
	nan, inf := math.NaN(), math.Inf(1)
	tests := []struct {
		name  string
		req   Request
		param string
		want  error
	}{
		{"nan radius", Request{Radius: nan, Bandwidth: 1}, "scan.radius", bounds.ErrInvalid},
		{"zero radius", Request{Radius: 0, Bandwidth: 1}, "scan.radius", bounds.ErrInvalid},
		{"negative radius", Request{Radius: -1, Bandwidth: 1}, "scan.radius", bounds.ErrInvalid},
		{"inf radius", Request{Radius: inf, Bandwidth: 1}, "scan.radius", bounds.ErrInvalid},
		{"no bandwidth", Request{Radius: 1}, "scan.bandwidth", bounds.ErrInvalid},
		{"nan bandwidth", Request{Radius: 1, Bandwidth: nan}, "scan.bandwidth", bounds.ErrInvalid},
		{"negative bandwidth", Request{Radius: 1, Bandwidth: -3}, "scan.bandwidth", bounds.ErrInvalid},
		{"inf bandwidth", Request{Radius: 1, Bandwidth: inf}, "scan.bandwidth", bounds.ErrInvalid},
		{"both", Request{Radius: 1, Bandwidth: 1, Resolution: 1}, "scan.resolution", bounds.ErrInvalid},
		{"negative resolution", Request{Radius: 1, Resolution: -0.1}, "scan.resolution", bounds.ErrInvalid},
		{"subnormal resolution", Request{Radius: 1, Resolution: 5e-324}, "scan.resolution", bounds.ErrInvalid},
		{"geometry", Request{Geometry: 7, Radius: 1, Bandwidth: 1}, "scan.geometry", bounds.ErrInvalid},
		{"source radius on parallel", Request{Radius: 1, Bandwidth: 1, SourceRadius: 3}, "scan.source_radius", bounds.ErrInvalid},
		{"short scan on parallel", Request{Radius: 1, Bandwidth: 1, ShortScan: true}, "scan.short_scan", bounds.ErrInvalid},
		{"fan without source radius", Request{Geometry: FanBeam, Radius: 1, Bandwidth: 1}, "scan.source_radius", bounds.ErrInvalid},
		{"source inside object", Request{Geometry: FanBeam, Radius: 2, Bandwidth: 1, SourceRadius: 2}, "scan.source_radius", bounds.ErrInvalid},
		{"source at infinity", Request{Geometry: FanBeam, Radius: 1e-200, Bandwidth: 1, SourceRadius: 1e200}, "scan.source_radius", bounds.ErrInvalid},
		{"nan source radius", Request{Geometry: FanBeam, Radius: 2, Bandwidth: 1, SourceRadius: nan}, "scan.source_radius", bounds.ErrInvalid},
		{"huge ρΩ", Request{Radius: 1e6, Bandwidth: 1e6}, "scan.bandwidth", bounds.ErrWorkLimit},
		{"huge samples", Request{Radius: 1, Bandwidth: 1e5}, "scan.samples", bounds.ErrWorkLimit},
		{"source grazing the object", Request{Geometry: FanBeam, Radius: 1, Bandwidth: 100, SourceRadius: 1 + 1e-12}, "scan.samples", bounds.ErrWorkLimit},
	}
	for _, tt := range tests {
		_, err := Plan(tt.req)
		var pe *bounds.ParamError
		if !errors.As(err, &pe) || pe.Param != tt.param || !errors.Is(err, tt.want) {
			t.Errorf("%s: Plan = %v, want ParamError %q wrapping %v", tt.name, err, tt.param, tt.want)
		}
	}
}

// TestCaution checks the wording the team rules require.
func TestCaution(t *testing.T) {
	t.Parallel()
	for _, w := range []string{"not a scan protocol", "dose", "safety", "clinical", "licensed practice", "local regulations"} {
		if !strings.Contains(Caution, w) {
			t.Errorf("Caution lacks %q", w)
		}
	}
}

var sinkResult Result

func BenchmarkPlan(b *testing.B) {
	for _, bm := range []struct {
		name string
		req  Request
	}{
		{"parallel", Request{Radius: 20, Bandwidth: 7.43}},
		{"parallel-resolution", Request{Radius: 20, Resolution: 0.25}},
		{"fan", Request{Geometry: FanBeam, Radius: 250, Resolution: 0.5, SourceRadius: 570}},
	} {
		b.Run(bm.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				r, err := Plan(bm.req)
				if err != nil {
					b.Fatal(err)
				}
				sinkResult = r
			}
		})
	}
}
