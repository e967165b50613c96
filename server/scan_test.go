package server_test

import (
	"context"
	"math"
	"strings"
	"testing"
	"time"

	"google.golang.org/genproto/googleapis/rpc/errdetails"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
	"foldbound/server"
)

// TestPlanScanOverTCP checks a parallel-beam plan against the classical
// sampling conditions Δs ≤ π/Ω and p ≥ ρΩ views over 180° (Natterer, The
// Mathematics of Computerized Tomography, 1986, Ch. III, from memory),
// and that the caution travels with it, also through Batch.
func TestPlanScanOverTCP(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	req := &pb.PlanScanRequest{Geometry: pb.ScanGeometry_SCAN_GEOMETRY_PARALLEL_BEAM, Radius: 20, Resolution: 0.25}
	res, err := c.PlanScan(context.Background(), req)
	if err != nil {
		t.Fatalf("PlanScan: %v", err)
	}
	p := res.GetPlan()
	omega := math.Pi / 0.25
	if math.Abs(p.GetBandwidth()-omega) > 1e-12 {
		t.Errorf("bandwidth = %g, want π/δ = %g", p.GetBandwidth(), omega)
	}
	std := p.GetStandard()
	if std.GetDetectorSpacing() > math.Pi/omega*(1+1e-15) {
		t.Errorf("detector spacing %g > π/Ω = %g", std.GetDetectorSpacing(), math.Pi/omega)
	}
	if float64(std.GetViews()) < 20*omega {
		t.Errorf("views %d < ρΩ = %g", std.GetViews(), 20*omega)
	}
	if math.Abs(std.GetArc()-math.Pi) > 1e-15 {
		t.Errorf("arc = %g, want π", std.GetArc())
	}
	// Interlacing halves the detectors at the price of a few more views.
	if il := p.GetInterlaced(); !il.GetOffered() || il.GetSamples() >= std.GetSamples() {
		t.Errorf("interlaced %v, want fewer samples than standard %d", il, std.GetSamples())
	}
	if !strings.Contains(p.GetCaution(), "not a scan protocol") || !strings.Contains(p.GetCaution(), "licensed practice") {
		t.Errorf("caution = %q", p.GetCaution())
	}

	items := []*pb.BatchRequest{client.Item("s", req), client.Item("bad", &pb.PlanScanRequest{
		Geometry: pb.ScanGeometry_SCAN_GEOMETRY_FAN_BEAM, Radius: 250, Bandwidth: 6, SourceRadius: 200})}
	out, err := c.Batch(context.Background(), items)
	if err != nil {
		t.Fatal(err)
	}
	if got := out[0].GetPlanScan().GetPlan().GetCaution(); got != p.GetCaution() {
		t.Errorf("batch scan plan caution = %q", got)
	}
	if st := status.Convert(client.ItemErr(out[1])); st.Code() != codes.InvalidArgument || !strings.HasPrefix(st.Message(), "source_radius") {
		t.Errorf("fan beam with R < ρ: %v, want InvalidArgument naming source_radius", st)
	}
}

// TestPlanScanVerifyOverTCP checks the reconstruction check of a plan over
// TCP: at the planned sampling the fitted phantom is reconstructed below
// its level ε = 10⁻³ (an error of the order of the neglected spectrum;
// common practice, no source), half the views or twice the detector
// spacing are at least 10× worse (angular and radial aliasing; the engine
// measures 31× and more), and the caution travels with the answer.
func TestPlanScanVerifyOverTCP(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	ctx := context.Background()
	tests := []struct {
		name   string
		req    *pb.PlanScanRequest
		labels []string
	}{
		{"parallel", &pb.PlanScanRequest{Geometry: pb.ScanGeometry_SCAN_GEOMETRY_PARALLEL_BEAM, Radius: 10, Bandwidth: 5,
			Verify: true, VerifyImageSize: 64},
			[]string{"planned", "half the views", "twice the detector spacing", "interlaced, planned"}},
		{"fan", &pb.PlanScanRequest{Geometry: pb.ScanGeometry_SCAN_GEOMETRY_FAN_BEAM, Radius: 10, Bandwidth: 5, SourceRadius: 20,
			Verify: true, VerifyImageSize: 32},
			[]string{"planned", "half the sources", "twice the detector angle"}},
	}
	for _, tt := range tests {
		res, err := c.PlanScan(ctx, tt.req)
		if err != nil {
			t.Fatalf("%s: PlanScan: %v", tt.name, err)
		}
		v := res.GetVerification()
		if v == nil {
			t.Fatalf("%s: no verification", tt.name)
		}
		if !strings.Contains(v.GetCaution(), "not a scan protocol") || res.GetPlan().GetCaution() == "" {
			t.Errorf("%s: caution = %q, plan caution %q", tt.name, v.GetCaution(), res.GetPlan().GetCaution())
		}
		if v.GetImageSize() != tt.req.GetVerifyImageSize() || v.GetImageWidth() != 20 || v.GetLevel() != 1e-3 || len(v.GetBlobs()) != 5 {
			t.Errorf("%s: image %d px over %g, level %g, %d blobs; want %d px over 20, 0.001, 5 blobs",
				tt.name, v.GetImageSize(), v.GetImageWidth(), v.GetLevel(), len(v.GetBlobs()), tt.req.GetVerifyImageSize())
		}
		if math.Abs(v.GetPhantomBandwidth()-5) > 1e-12 || v.GetPhantomRadius() > 10 {
			t.Errorf("%s: phantom extent (%g, %g), want radius ≤ 10, band limit 5", tt.name, v.GetPhantomRadius(), v.GetPhantomBandwidth())
		}
		if len(v.GetCases()) != len(tt.labels) {
			t.Fatalf("%s: %d cases, want %d", tt.name, len(v.GetCases()), len(tt.labels))
		}
		std := res.GetPlan().GetStandard()
		for i, cs := range v.GetCases() {
			t.Logf("%s: %-28s %4d × %3d  rel RMS %.2e (%.1f×)  max %.2e  %d pixels",
				tt.name, cs.GetLabel(), cs.GetViews(), cs.GetDetectors(), cs.GetRelativeRmsError(), cs.GetRatioToPlanned(), cs.GetMaxAbsError(), cs.GetPixels())
			if cs.GetLabel() != tt.labels[i] {
				t.Errorf("%s: case %d is %q, want %q", tt.name, i, cs.GetLabel(), tt.labels[i])
			}
			switch {
			case i == 0:
				if cs.GetViews() != std.GetViews() || cs.GetDetectors() != std.GetDetectors() || cs.GetRelativeRmsError() > 1e-3 {
					t.Errorf("%s: planned %d × %d, rel RMS %.2e; want the plan's %d × %d and ≤ 1e-3",
						tt.name, cs.GetViews(), cs.GetDetectors(), cs.GetRelativeRmsError(), std.GetViews(), std.GetDetectors())
				}
			case cs.GetScheme() == pb.ScanScheme_SCAN_SCHEME_STANDARD:
				if cs.GetRatioToPlanned() < 10 {
					t.Errorf("%s, %s: %.1f× the planned error, want ≥ 10×", tt.name, cs.GetLabel(), cs.GetRatioToPlanned())
				}
			}
		}
	}

	// Without verify, no verification.
	res, err := c.PlanScan(ctx, &pb.PlanScanRequest{Geometry: pb.ScanGeometry_SCAN_GEOMETRY_PARALLEL_BEAM, Radius: 10, Bandwidth: 5})
	if err != nil || res.GetVerification() != nil {
		t.Errorf("PlanScan without verify = %v, %v; want no verification", res.GetVerification(), err)
	}

	// The deadline stops a long verification (ρΩ = 1000 at 512² pixels
	// takes seconds).
	dctx, cancel := context.WithTimeout(ctx, 50*time.Millisecond)
	defer cancel()
	_, err = c.PlanScan(dctx, &pb.PlanScanRequest{Geometry: pb.ScanGeometry_SCAN_GEOMETRY_PARALLEL_BEAM, Radius: 100, Bandwidth: 10,
		Verify: true, VerifyImageSize: 512})
	if st := status.Convert(err); st.Code() != codes.DeadlineExceeded {
		t.Errorf("long verification with a 50 ms deadline: %v, want DeadlineExceeded", st)
	}
}

// TestPlanScanVerifyBadInput checks the rules and limits of the
// verification fields: the code and the exact field named.
func TestPlanScanVerifyBadInput(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	par := func(rho, omega float64, size int32) *pb.PlanScanRequest {
		return &pb.PlanScanRequest{Geometry: pb.ScanGeometry_SCAN_GEOMETRY_PARALLEL_BEAM, Radius: rho, Bandwidth: omega, Verify: true, VerifyImageSize: size}
	}
	tests := []struct {
		name  string
		req   *pb.PlanScanRequest
		code  codes.Code
		field string
	}{
		{"size too small", par(10, 5, 8), codes.InvalidArgument, "verify_image_size"},
		{"size negative", par(10, 5, -1), codes.InvalidArgument, "verify_image_size"},
		{"size over the limit", par(10, 5, 2048), codes.ResourceExhausted, "verify_image_size"},
		{"size without verify", &pb.PlanScanRequest{Geometry: pb.ScanGeometry_SCAN_GEOMETRY_PARALLEL_BEAM, Radius: 10, Bandwidth: 5, VerifyImageSize: 64},
			codes.InvalidArgument, "verify_image_size"},
		{"ρΩ too small", par(1, 30, 0), codes.InvalidArgument, "bandwidth"},
		{"ρΩ too small, by resolution", &pb.PlanScanRequest{Geometry: pb.ScanGeometry_SCAN_GEOMETRY_PARALLEL_BEAM, Radius: 1, Resolution: 0.1, Verify: true},
			codes.InvalidArgument, "resolution"},
		{"short scan", &pb.PlanScanRequest{Geometry: pb.ScanGeometry_SCAN_GEOMETRY_FAN_BEAM, Radius: 10, Bandwidth: 5, SourceRadius: 20, ShortScan: true, Verify: true},
			codes.InvalidArgument, "short_scan"},
		{"source too close", &pb.PlanScanRequest{Geometry: pb.ScanGeometry_SCAN_GEOMETRY_FAN_BEAM, Radius: 10, Bandwidth: 5, SourceRadius: 14, Verify: true},
			codes.InvalidArgument, "source_radius"},
		{"work over the limit", par(20, 100, 1024), codes.ResourceExhausted, "verify_image_size"},
		{"sinogram over the limit", par(1, 20000, 16), codes.ResourceExhausted, "verify"},
	}
	for _, tt := range tests {
		_, err := c.PlanScan(context.Background(), tt.req)
		st := status.Convert(err)
		t.Logf("%s: %v: %s", tt.name, st.Code(), st.Message())
		if st.Code() != tt.code || !strings.HasPrefix(st.Message(), tt.field+":") {
			t.Errorf("%s: %v %q, want %v naming %s", tt.name, st.Code(), st.Message(), tt.code, tt.field)
		}
		found := false
		for _, d := range st.Details() {
			if br, ok := d.(*errdetails.BadRequest); ok {
				for _, v := range br.GetFieldViolations() {
					found = found || v.GetField() == tt.field
				}
			}
		}
		if !found {
			t.Errorf("%s: no BadRequest violation for %q in %v", tt.name, tt.field, st.Details())
		}
	}
}
