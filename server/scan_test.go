package server_test

import (
	"context"
	"math"
	"strings"
	"testing"

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
