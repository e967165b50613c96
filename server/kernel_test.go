package server_test

import (
	"context"
	"math"
	"strings"
	"testing"

	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"

	pb "foldbound/api/foldbound/v1"
	"foldbound/server"
)

// TestPlanKernelOverTCP plans Kaiser-Bessel kernels for 1e-9, checks the
// published shape against the formula of Beatty, Nishimura & Pauly (IEEE
// TMI 24(6), 2005, from memory) computed here, and that the verification
// run (gridded transform against the directly summed DFT) stays within
// the plan's promise.
func TestPlanKernelOverTCP(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	res, err := c.PlanKernel(context.Background(), &pb.PlanKernelRequest{
		Modes: 128, Tol: 1e-9, Oversampling: []float64{1.5, 2}, VerifyPoints: 500, VerifySeed: 1})
	if err != nil {
		t.Fatalf("PlanKernel: %v", err)
	}
	if len(res.GetOptions()) == 0 {
		t.Fatalf("no options; notes %v", res.GetNotes())
	}
	for _, o := range res.GetOptions() {
		if o.GetTotal() > 1e-9 || o.GetBound().GetTotal() > o.GetTotal() {
			t.Errorf("option %v: total %g over the tolerance or below its bound", o.GetOversampling(), o.GetTotal())
		}
		sigma, w := o.GetOversampling(), float64(o.GetKernel().GetWidth())
		a := w / sigma * (sigma - 0.5)
		beatty := math.Pi * math.Sqrt(a*a-0.8)
		if math.Abs(o.GetPublishedBeta()-beatty) > 1e-12*beatty {
			t.Errorf("σ = %g, W = %g: published β = %g, want Beatty's %g", sigma, w, o.GetPublishedBeta(), beatty)
		}
	}
	v := res.GetVerification()
	if v.GetPoints() != 500 || v.GetObserved() > v.GetTotal() || v.GetObserved() <= 0 {
		t.Errorf("verification %v: observed must be in (0, total]", v)
	}
	t.Logf("best: %v; observed %.3g vs promised %.3g", res.GetOptions()[0].GetKernel(), v.GetObserved(), v.GetTotal())
	if !strings.Contains(res.GetConvention(), "type 1") {
		t.Errorf("convention = %q", res.GetConvention())
	}
}

func TestPlanKernelBadInput(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	tests := []struct {
		name  string
		req   *pb.PlanKernelRequest
		code  codes.Code
		field string
	}{
		{"tolerance 0", &pb.PlanKernelRequest{Modes: 64}, codes.InvalidArgument, "tol"},
		{"tolerance 1", &pb.PlanKernelRequest{Modes: 64, Tol: 1}, codes.InvalidArgument, "tol"},
		{"ratio 1", &pb.PlanKernelRequest{Modes: 64, Tol: 1e-6, Oversampling: []float64{1}}, codes.InvalidArgument, "oversampling[0]"},
		{"dimension 4", &pb.PlanKernelRequest{Modes: 64, Tol: 1e-6, Dim: 4}, codes.InvalidArgument, "dim"},
		{"verification too large", &pb.PlanKernelRequest{Modes: 1 << 20, Tol: 1e-6, VerifyPoints: 10}, codes.ResourceExhausted, "verify_points"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := c.PlanKernel(context.Background(), tt.req)
			st := status.Convert(err)
			if st.Code() != tt.code || !strings.HasPrefix(st.Message(), tt.field) {
				t.Errorf("%v %q, want %v naming %q", st.Code(), st.Message(), tt.code, tt.field)
			}
		})
	}
}
