package main

import (
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/spf13/cobra"

	pb "foldbound/api/foldbound/v1"
)

func newScanCmd(stdout, stderr io.Writer) *cobra.Command {
	var (
		call                          callFlags
		geometry                      string
		radius, bandwidth, resolution float64
		sourceRadius                  float64
		shortScan, verify             bool
		imageSize                     int
	)
	cmd := &cobra.Command{
		Use:   "scan",
		Short: "Detector spacing, detector count and views for a tomography scan (sampling mathematics only)",
		Long: `scan plans the sampling of a parallel-beam or fan-beam tomography scan of an
object inside a disc of radius ρ with essential band limit Ω (or resolution
δ, read as Ω = π/δ): detector spacing, detectors per view, number of views
and total line integrals, for the standard and the interlaced scheme.

With --verify the plan is also checked by reconstruction: a phantom of
Gaussian blobs fitted to ρ and Ω is projected exactly and reconstructed by
filtered backprojection at the planned layout and at undersampled ones (half
the views, twice the detector spacing), and the relative RMS errors are
printed side by side. It costs seconds of CPU time.

CAUTION: these are sampling conditions from the mathematics of the Radon
transform, not a scan protocol. Radiation dose, safety and clinical use are
matters for licensed practice and local regulations.`,
		Example: `  foldbound scan --radius 20 --resolution 0.25
  foldbound scan --radius 20 --resolution 0.5 --verify
  foldbound scan --geometry fan --radius 250 --bandwidth 6.2832 --source-radius 570 --json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			req := &pb.PlanScanRequest{}
			build := func() error {
				switch strings.ToLower(geometry) {
				case "parallel":
					req.Geometry = pb.ScanGeometry_SCAN_GEOMETRY_PARALLEL_BEAM
				case "fan":
					req.Geometry = pb.ScanGeometry_SCAN_GEOMETRY_FAN_BEAM
				default:
					return fmt.Errorf("--geometry %q: want parallel or fan", geometry)
				}
				req.Radius, req.Bandwidth, req.Resolution = radius, bandwidth, resolution
				req.SourceRadius, req.ShortScan = sourceRadius, shortScan
				if imageSize != 0 && !verify {
					return fmt.Errorf("--image-size needs --verify")
				}
				if imageSize < 0 || imageSize > math.MaxInt32 {
					return fmt.Errorf("--image-size %d: want 16 to 1024", imageSize)
				}
				req.Verify, req.VerifyImageSize = verify, int32(imageSize)
				return nil
			}
			return ask(cmd, &call, stdout, stderr, req, build, (*session).PlanScan, func(w io.Writer, req *pb.PlanScanRequest, res *pb.PlanScanResponse) error {
				if err := printScan(w, res.GetPlan()); err != nil {
					return err
				}
				if v := res.GetVerification(); v != nil {
					return printScanVerification(w, v)
				}
				return nil
			})
		},
	}
	fs := cmd.Flags()
	call.register(fs)
	fs.StringVar(&geometry, "geometry", "parallel", "ray geometry: parallel or fan")
	fs.Float64Var(&radius, "radius", 0, "radius ρ of the disc containing the object (length units)")
	fs.Float64Var(&bandwidth, "bandwidth", 0, "essential band limit Ω, radians per length unit")
	fs.Float64Var(&resolution, "resolution", 0, "resolution δ, read as Ω = π/δ (instead of --bandwidth)")
	fs.Float64Var(&sourceRadius, "source-radius", 0, "fan beam: distance R > ρ from the rotation axis to the source")
	fs.BoolVar(&shortScan, "short-scan", false, "fan beam: sources over 180° plus the fan angle instead of 360°")
	fs.BoolVar(&verify, "verify", false, "also reconstruct a phantom fitted to the plan at the planned and undersampled layouts")
	fs.IntVar(&imageSize, "image-size", 0, "with --verify: pixels per side of the reconstructed images (16 to 1024; 0 means 256)")
	return cmd
}

func printScan(w io.Writer, p *pb.ScanPlan) error {
	deg := func(r float64) string { return fmt.Sprintf("%.4g°", r*180/math.Pi) }
	fmt.Fprintf(w, "CAUTION: %s\n\n", p.GetCaution())
	t := newTable(w)
	geo := strings.ToLower(strings.TrimPrefix(p.GetGeometry().String(), "SCAN_GEOMETRY_"))
	t.row("scan plan", strings.ReplaceAll(geo, "_", "-"))
	t.row("object radius", fmt.Sprintf("%g", p.GetRadius()))
	t.row("band limit", fmt.Sprintf("%.6g rad per length unit (%s)", p.GetBandwidth(), p.GetBandwidthBy()))
	if p.GetGeometry() == pb.ScanGeometry_SCAN_GEOMETRY_FAN_BEAM {
		t.row("source radius", fmt.Sprintf("%g, fan angle %s, short scan %v", p.GetSourceRadius(), deg(p.GetFanAngle()), p.GetShortScan()))
	}
	t.row("")
	t.row("scheme", "detector spacing", "detectors", "views", "arc", "line integrals")
	for _, l := range []*pb.ScanLayout{p.GetStandard(), p.GetInterlaced()} {
		name := strings.ToLower(strings.TrimPrefix(l.GetScheme().String(), "SCAN_SCHEME_"))
		if !l.GetOffered() {
			t.row(name, l.GetNote())
			continue
		}
		spacing := fmt.Sprintf("%.4g", l.GetDetectorSpacing())
		if l.GetDetectorAngle() != 0 {
			spacing += " (" + deg(l.GetDetectorAngle()) + ")"
		}
		t.row(name, spacing, fmt.Sprint(l.GetDetectors()), fmt.Sprint(l.GetViews()), deg(l.GetArc()), fmt.Sprint(l.GetSamples()))
	}
	if err := t.flush(); err != nil {
		return err
	}
	for _, l := range []*pb.ScanLayout{p.GetStandard(), p.GetInterlaced()} {
		if l.GetOffered() {
			fmt.Fprintf(w, "\n%s: %s\n  (%s)\n", strings.ToLower(strings.TrimPrefix(l.GetScheme().String(), "SCAN_SCHEME_")), l.GetCondition(), l.GetSource())
		}
	}
	return nil
}

// printScanVerification prints the reconstruction check of a scan plan:
// one row per sampling, with its error relative to the planned one.
func printScanVerification(w io.Writer, v *pb.ScanVerification) error {
	fmt.Fprintf(w, "\nreconstruction check (%s)\n", v.GetPhantom())
	fmt.Fprintf(w, "  %d blobs, essential radius %.4g and band limit %.4g at level %g; %d×%d pixels over %g, %s filter\n\n",
		len(v.GetBlobs()), v.GetPhantomRadius(), v.GetPhantomBandwidth(), v.GetLevel(),
		v.GetImageSize(), v.GetImageSize(), v.GetImageWidth(), v.GetWindow())
	t := newTable(w)
	t.row("sampling", "views", "detectors", "spacing", "relative RMS error", "max |error| / peak", "× planned", "seconds")
	for _, c := range v.GetCases() {
		spacing := fmt.Sprintf("%.4g", c.GetDetectorSpacing())
		if a := c.GetDetectorAngle(); a != 0 {
			spacing = fmt.Sprintf("%.4g°", a*180/math.Pi)
		}
		rel := 0.0
		if p := c.GetPeak(); p > 0 {
			rel = c.GetMaxAbsError() / p
		}
		t.row(c.GetLabel(), fmt.Sprint(c.GetViews()), fmt.Sprint(c.GetDetectors()), spacing,
			fmt.Sprintf("%.3g", c.GetRelativeRmsError()), fmt.Sprintf("%.3g", rel),
			fmt.Sprintf("%.3g", c.GetRatioToPlanned()), fmt.Sprintf("%.2f", c.GetSeconds()))
	}
	if err := t.flush(); err != nil {
		return err
	}
	if n := v.GetNote(); n != "" {
		fmt.Fprintf(w, "\nnote: %s\n", n)
	}
	fmt.Fprintf(w, "\nCAUTION: %s\n", v.GetCaution())
	return nil
}
