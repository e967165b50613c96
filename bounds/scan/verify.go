package scan

import (
	"context"
	"fmt"
	"math"
	"time"
)

// Limits of Verify.
const (
	// DefaultVerifySize is the image size (pixels per side) of a
	// verification when VerifyOptions.Size is 0.
	DefaultVerifySize = 256
	// MaxVerifySize is the largest image size of a verification.
	MaxVerifySize = 1024
	// MaxVerifyWork bounds the estimated work of one verification, in
	// units of one backprojected pixel of one parallel view at 16-fold
	// oversampling (about 5.5 ns on one amd64 core, BenchmarkVerify, so
	// the limit is of the order of 12 s): see verifyRun.work.
	MaxVerifyWork = 1 << 31
)

// Relative costs in verifyRun.work, measured on amd64 (BenchmarkVerify
// and the sinograms of the fitted phantom): a fan pixel costs an
// arctangent and a division more than a parallel one, a sample of one
// blob an exponential.
const (
	fanPixelCost = 4
	rayBlobCost  = 3
)

// Oversampling factors M of the filtered projections (Options). At M = 4
// the linear interpolation of the backprojection, not the sampling,
// dominates the error of a planned scan of the fitted phantom (measured
// 2.2e-3 at ρΩ = 50, against 3.4e-4 at M = 16, where doubling the views
// changes nothing); M = 16 takes it below the phantom's level ε.
// Interlaced data need M = 64 (ReconstructParallel).
const (
	stdOversample        = 16
	interlacedOversample = 64
)

// VerifyOptions controls Verify.
type VerifyOptions struct {
	// Size n: the reconstructions have n×n pixels over the square of side
	// 2ρ centred on the rotation axis; 0 means DefaultVerifySize, at most
	// MaxVerifySize.
	Size int
}

// VerifyCase is one reconstruction of a verification.
type VerifyCase struct {
	// Label names the sampling: "planned", "half the views", "twice the
	// detector spacing", "interlaced, planned" (parallel beam); "planned",
	// "half the sources", "twice the detector angle" (fan beam).
	Label  string
	Scheme Scheme

	// Views is the number of view directions over 180° (parallel beam) or
	// source positions over 360° (fan beam).
	Views int
	// Detectors is the number of rays per view simulated.
	Detectors int
	// Spacing is the ray spacing Δs (parallel beam) or R·Δα, the ray
	// spacing at the rotation axis (fan beam), in length units.
	Spacing float64
	// Angle is the detector angle Δα (fan beam), radians.
	Angle float64
	// Oversample is the factor M of the filtered projections (Options).
	Oversample int

	// Error is the reconstruction error over the pixel centres in the
	// disc of radius ρ.
	Error ImageError
	// Ratio is Error.RelRMS over that of the planned case (1 for it).
	Ratio float64
	// Elapsed is the wall time of the case: sinogram, reconstruction and
	// comparison.
	Elapsed time.Duration
}

// Verification is the result of Verify.
type Verification struct {
	// Phantom is the object reconstructed (FitPhantom), Description says
	// how it was built, Level is its level ε, and Radius and Bandwidth
	// are its essential radius (≤ ρ) and band limit (= Ω) at that level
	// (Phantom.Extent).
	Phantom     Phantom
	Description string
	Level       float64
	Radius      float64
	Bandwidth   float64

	// Size and Width describe the images: Size×Size pixels over the
	// square of side Width = 2ρ. Window is the ramp filter's window.
	Size   int
	Width  float64
	Window Window

	// Cases holds the planned layout first, then its undersampled
	// variants, then the interlaced layout when it is offered (parallel
	// beam only).
	Cases []VerifyCase
	// Note states what was not verified and why.
	Note string
	// Caution is always the package constant Caution.
	Caution string
}

// Verify checks a plan by reconstruction: it builds the phantom
// FitPhantom(ρ, Ω, PhantomLevel) for the plan's radius ρ and band limit Ω,
// simulates its exact projections (closed form, Blob) at the plan's
// standard layout and at the same layout undersampled, reconstructs each
// by filtered backprojection (Ram-Lak window, filtered projections
// oversampled 4-fold; 64-fold for interlaced data) and compares the images
// with the phantom over the disc of radius ρ (Phantom.Compare):
//
//	parallel beam: planned (p views, N detectors, Δs); half the views
//	               (⌊p/2⌋); twice the detector spacing (2Δs, (N+1)/2
//	               detectors, the same span); and the interlaced layout
//	               when offered, simulated with one more ray per view
//	               than its larger count, outside the disc, so that both
//	               detector grids span it
//	fan beam:      planned (p sources over 360°, N detectors, Δα); half
//	               the sources; twice the detector angle ((N+1)/2
//	               detectors, the same fan)
//
// Fan-beam verification needs a full scan (ReconstructFan has no
// short-scan weighting; error "scan.short_scan") and R > √2·ρ, so that the
// image square lies inside the source circle (error "scan.source_radius").
//
// Work is bounded: the image size by MaxVerifySize ("verify.size"), each
// simulated sinogram by the limits of ParallelScan and FanScan
// ("verify.rays"), and the estimated total by MaxVerifyWork
// ("verify.work"), all bounds.ErrWorkLimit. It checks ctx once per view
// and returns its error. Errors are *bounds.ParamError values; paths
// "scan.…" name the fields of the plan's request (Result.BandwidthBy
// tells "scan.bandwidth" from "scan.resolution").
func Verify(ctx context.Context, res Result, opt VerifyOptions) (Verification, error) {
	n := opt.Size
	if n == 0 {
		n = DefaultVerifySize
	}
	if n < 1 || n > MaxVerifySize {
		return Verification{}, countErr("verify.size", n, 1, MaxVerifySize)
	}
	bwPath := "scan.bandwidth"
	if res.BandwidthBy != "given" && res.BandwidthBy != "" {
		bwPath = "scan.resolution"
	}
	rho, omega := res.Radius, res.Bandwidth
	if err := positive("scan.radius", rho); err != nil {
		return Verification{}, err
	}
	if err := positive(bwPath, omega); err != nil {
		return Verification{}, err
	}
	if !res.Standard.Offered {
		return Verification{}, invalid("verify.plan", "the plan has no standard layout")
	}
	ph, err := FitPhantom(rho, omega, PhantomLevel)
	if err != nil {
		return Verification{}, renameParam(err, "scan.bandwidth", bwPath, "")
	}
	eRho, eOmega, err := ph.Extent(PhantomLevel)
	if err != nil {
		return Verification{}, err
	}
	v := Verification{
		Phantom: ph, Level: PhantomLevel, Radius: eRho, Bandwidth: eOmega,
		Size: n, Width: 2 * rho, Window: RamLak, Caution: Caution,
	}
	v.Description = describePhantom(ph, rho, omega)

	var cases []verifyRun
	switch res.Geometry {
	case ParallelBeam:
		cases, v.Note, err = parallelRuns(res)
	case FanBeam:
		cases, v.Note, err = fanRuns(res)
	default:
		return Verification{}, invalid("scan.geometry", "unknown geometry %d", int(res.Geometry))
	}
	if err != nil {
		return Verification{}, err
	}
	var work float64
	for _, c := range cases {
		if err := c.validate(); err != nil {
			return Verification{}, err
		}
		work += c.work(n, len(ph.Blobs))
	}
	if work > MaxVerifyWork {
		return Verification{}, workLimit("verify.work", "the %d reconstructions of %d² pixels need about %.3g work units, more than the limit %.3g; "+
			"ask for a smaller image or a smaller plan", len(cases), n, work, float64(MaxVerifyWork))
	}

	opts := Options{Size: n, Width: 2 * rho, Window: RamLak}
	for _, c := range cases {
		start := time.Now()
		e, err := c.run(ctx, ph, opts, rho)
		if err != nil {
			return Verification{}, err
		}
		vc := c.VerifyCase
		vc.Error = e
		vc.Elapsed = time.Since(start)
		v.Cases = append(v.Cases, vc)
	}
	for i := range v.Cases {
		v.Cases[i].Ratio = v.Cases[i].Error.RelRMS / v.Cases[0].Error.RelRMS
	}
	return v, nil
}

// verifyRun is a case to run: its report and its scan.
type verifyRun struct {
	VerifyCase
	parallel *ParallelScan
	fan      *FanScan
}

func (c verifyRun) validate() error {
	var err error
	if c.parallel != nil {
		err = c.parallel.Validate()
	} else {
		err = c.fan.Validate()
	}
	if err != nil {
		return renameParam(err, "", "verify.rays", c.Label)
	}
	return nil
}

// work estimates the cost of the case in MaxVerifyWork's units: one per
// pixel and parallel view, fanPixelCost per pixel and source, rayBlobCost
// per sample and blob.
func (c verifyRun) work(n, blobs int) float64 {
	px := float64(n) * float64(n) * float64(c.Views)
	if c.fan != nil {
		px *= fanPixelCost
	}
	return px + rayBlobCost*float64(c.Views)*float64(c.Detectors)*float64(blobs)
}

func (c verifyRun) run(ctx context.Context, ph Phantom, opt Options, rho float64) (ImageError, error) {
	opt.Oversample = c.Oversample
	var (
		im  Image
		err error
	)
	if c.parallel != nil {
		var sino Sinogram
		if sino, err = ph.parallelSinogram(ctx, *c.parallel); err == nil {
			im, err = ReconstructParallel(ctx, *c.parallel, sino, opt)
		}
	} else {
		var sino Sinogram
		if sino, err = ph.fanSinogram(ctx, *c.fan); err == nil {
			im, err = ReconstructFan(ctx, *c.fan, sino, opt)
		}
	}
	if err != nil {
		return ImageError{}, err
	}
	return ph.Compare(im, rho)
}

// parallelRuns lists the parallel-beam cases of a plan.
func parallelRuns(res Result) ([]verifyRun, string, error) {
	s := res.Standard
	if s.Views < 2 || s.Detectors < 3 {
		return nil, "", invalid("verify.plan", "standard layout of %d views × %d detectors is too small to verify", s.Views, s.Detectors)
	}
	mk := func(label string, scheme Scheme, g ParallelScan, m int) verifyRun {
		return verifyRun{
			VerifyCase: VerifyCase{Label: label, Scheme: scheme, Views: g.Views, Detectors: g.Detectors, Spacing: g.Spacing, Oversample: m},
			parallel:   &g,
		}
	}
	runs := []verifyRun{
		mk("planned", Standard, ParallelScan{Views: s.Views, Detectors: s.Detectors, Spacing: s.DetectorSpacing}, stdOversample),
		mk("half the views", Standard, ParallelScan{Views: s.Views / 2, Detectors: s.Detectors, Spacing: s.DetectorSpacing}, stdOversample),
		mk("twice the detector spacing", Standard, ParallelScan{Views: s.Views, Detectors: (s.Detectors + 1) / 2, Spacing: 2 * s.DetectorSpacing}, stdOversample),
	}
	note := ""
	if in := res.Interlaced; in.Offered {
		runs = append(runs, mk("interlaced, planned", Interlaced,
			ParallelScan{Views: in.Views, Detectors: in.Detectors + 1, Spacing: in.DetectorSpacing, Interlaced: true}, interlacedOversample))
	} else {
		note = "interlaced layout not offered, not verified"
	}
	return runs, note, nil
}

// fanRuns lists the fan-beam cases of a plan.
func fanRuns(res Result) ([]verifyRun, string, error) {
	if res.ShortScan {
		return nil, "", invalid("scan.short_scan", "verification reconstructs full-circle fan data only; "+
			"a short scan needs a redundancy weighting that is not implemented")
	}
	rho, bigR := res.Radius, res.SourceRadius
	if !(bigR > math.Sqrt2*rho) {
		return nil, "", invalid("scan.source_radius", "fan-beam verification reconstructs on the square of side 2ρ, "+
			"whose corners must lie inside the source circle: needs R > √2·ρ = %.6g, got R = %g", math.Sqrt2*rho, bigR)
	}
	s := res.Standard
	if s.Views < 2 || s.Detectors < 3 {
		return nil, "", invalid("verify.plan", "standard layout of %d sources × %d detectors is too small to verify", s.Views, s.Detectors)
	}
	mk := func(label string, g FanScan) verifyRun {
		return verifyRun{
			VerifyCase: VerifyCase{Label: label, Scheme: Standard, Views: g.Sources, Detectors: g.Detectors,
				Spacing: g.SourceRadius * g.Angle, Angle: g.Angle, Oversample: stdOversample},
			fan: &g,
		}
	}
	runs := []verifyRun{
		mk("planned", FanScan{Sources: s.Views, Detectors: s.Detectors, Angle: s.DetectorAngle, SourceRadius: bigR}),
		mk("half the sources", FanScan{Sources: s.Views / 2, Detectors: s.Detectors, Angle: s.DetectorAngle, SourceRadius: bigR}),
		mk("twice the detector angle", FanScan{Sources: s.Views, Detectors: (s.Detectors + 1) / 2, Angle: 2 * s.DetectorAngle, SourceRadius: bigR}),
	}
	return runs, "fan beam: the interlaced fan layout is not offered, not verified", nil
}

// describePhantom says how FitPhantom built ph for ρ and Ω.
func describePhantom(ph Phantom, rho, omega float64) string {
	t := math.Sqrt(-2 * math.Log(PhantomLevel))
	narrow, wide := math.Inf(1), 0.0
	for _, b := range ph.Blobs {
		narrow = math.Min(narrow, math.Min(b.SigmaU, b.SigmaV))
		wide = math.Max(wide, math.Max(b.SigmaU, b.SigmaV))
	}
	return fmt.Sprintf("%d Gaussian blobs in the layout of the demo phantom fitted to the disc of radius ρ = %g: "+
		"narrowest σ = t/Ω = %.4g with t = √(2 ln(1/ε)) = %.4f, ε = %g, so the band limit at level ε is Ω = %.6g; "+
		"widest σ = %.4g; every blob is below ε of its peak outside the disc",
		len(ph.Blobs), rho, narrow, t, PhantomLevel, omega, wide)
}
