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

// floatTrapezoid is the computation a user runs on a planned grid: the
// trapezoidal sum of f in float64 over the grid's samples.
func floatTrapezoid(f func(float64) float64, g *pb.Grid) float64 {
	n := g.GetCount()
	lo, hi := -((n - 1) / 2), n/2
	var s float64
	for k := lo; k <= hi; k++ {
		s += f(g.GetShift() + g.GetStep()*float64(k))
	}
	return g.GetStep() * s
}

// PlanGrid over TCP, checked against closed forms outside the engine: the
// planned grid's float64 trapezoidal sum must be within tol of the exact
// integral for shifts across the whole cell (the plan's guarantee), with
// ∫ exp(-x²/(2σ²)) dx = σ√(2π) and ∫ dx/(a²+x²) = π/a (any table of
// integrals, e.g. DLMF 7.7.6 by substitution and DLMF 4.24.2, from memory).
func TestPlanGridOverTCP(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	ctx := context.Background()
	gauss := func(x float64) float64 { return math.Exp(-x * x / (2 * 0.7 * 0.7)) }
	lorentz := func(x float64) float64 { return 1 / (1 + x*x) }
	tests := []struct {
		name  string
		req   *pb.PlanGridRequest
		f     func(float64) float64
		exact float64
		check func(t *testing.T, res *pb.PlanGridResponse)
	}{
		{
			name:  "gaussian family, integral, any shift",
			req:   &pb.PlanGridRequest{Subject: &pb.PlanGridRequest_Family{Family: client.Gaussian(0.7)}, Tol: 1e-10},
			f:     gauss,
			exact: 0.7 * sqrt2Pi,
		},
		{
			name: "gaussian family, FFT-friendly sizes",
			req: &pb.PlanGridRequest{Subject: &pb.PlanGridRequest_Family{Family: client.Gaussian(0.7)}, Tol: 1e-12,
				Cost: &pb.CostModel{Sizes: pb.SizeRule_SIZE_RULE_FFT_FRIENDLY}},
			f:     gauss,
			exact: 0.7 * sqrt2Pi,
			check: func(t *testing.T, res *pb.PlanGridResponse) {
				n := res.GetAxes()[0].GetGrid().GetCount()
				for _, p := range []int64{2, 3, 5, 7} {
					for n%p == 0 {
						n /= p
					}
				}
				if n != 1 {
					t.Errorf("count %d is not of the form 2^a 3^b 5^c 7^d", res.GetAxes()[0].GetGrid().GetCount())
				}
			},
		},
		{
			name: "lorentzian known by its envelopes",
			req: &pb.PlanGridRequest{Subject: &pb.PlanGridRequest_Envelopes{Envelopes: &pb.Envelopes{
				// 1/(1+x²) ≤ min(1, x⁻²) = (1 + max(0, |x|-1))⁻², F = π e^{-|ξ|}
				Spatial:  []*pb.EnvelopeTerm{{Decay: pb.Decay_DECAY_ALGEBRAIC, Amplitude: 1, Width: 1, Power: 2, Plateau: 1}},
				Spectral: []*pb.EnvelopeTerm{{Decay: pb.Decay_DECAY_EXPONENTIAL, Amplitude: math.Pi, Rate: 1}},
			}}, Tol: 1e-3},
			f:     lorentz,
			exact: math.Pi,
		},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			res, err := c.PlanGrid(ctx, tt.req)
			if err != nil {
				t.Fatal(err)
			}
			if !res.GetVerification().GetVerified() || res.GetBudget().GetTotal() > tt.req.GetTol() {
				t.Fatalf("plan not verified within tol: %v", res)
			}
			g := res.GetAxes()[0].GetGrid()
			for _, frac := range []float64{-0.5, -0.2, 0, 0.31, 0.5} {
				shifted := &pb.Grid{Step: g.GetStep(), Count: g.GetCount(), Shift: g.GetShift() + frac*g.GetStep()}
				if err := math.Abs(floatTrapezoid(tt.f, shifted) - tt.exact); err > tt.req.GetTol() {
					t.Errorf("grid %v shifted by %g steps: error %g > tol %g", g, frac, err, tt.req.GetTol())
				}
			}
			if tt.check != nil {
				tt.check(t, res)
			}
			t.Logf("%s: step %.4g, %d samples, certified total %.3g", tt.name, g.GetStep(), g.GetCount(), res.GetBudget().GetTotal())
		})
	}
}

// A separable 2-D family is planned axis by axis; the product of the
// planned counts is the total, and the float64 double sum of the product
// on the planned grid is within tol of F(0) = (σ√(2π))·(πw).
func TestPlanGrid2D(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	req := &pb.PlanGridRequest{Subject: &pb.PlanGridRequest_Family{Family: client.Separable(client.Gaussian(1), client.Sech(0.5))}, Tol: 1e-9}
	res, err := c.PlanGrid(context.Background(), req)
	if err != nil {
		t.Fatal(err)
	}
	if len(res.GetAxes()) != 2 {
		t.Fatalf("axes = %d, want 2", len(res.GetAxes()))
	}
	gx, gy := res.GetAxes()[0].GetGrid(), res.GetAxes()[1].GetGrid()
	if res.GetTotalSamples() != gx.GetCount()*gy.GetCount() {
		t.Errorf("total %d, want %d × %d", res.GetTotalSamples(), gx.GetCount(), gy.GetCount())
	}
	sx := floatTrapezoid(func(x float64) float64 { return math.Exp(-x * x / 2) }, gx)
	sy := floatTrapezoid(func(y float64) float64 { return 1 / math.Cosh(y/0.5) }, gy)
	if err := math.Abs(sx*sy - sqrt2Pi*math.Pi*0.5); err > req.GetTol() {
		t.Errorf("2-D error %g > tol %g on %v × %v", err, req.GetTol(), gx, gy)
	}
}

// Tolerances below what double precision can certify are answered
// OUT_OF_RANGE with what is achievable; a sample limit too small for the
// tolerance is RESOURCE_EXHAUSTED naming max_samples.
func TestPlanGridLimits(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	ctx := context.Background()
	_, err := c.PlanGrid(ctx, &pb.PlanGridRequest{Subject: &pb.PlanGridRequest_Family{Family: client.Gaussian(1)}, Tol: 1e-300})
	if status.Code(err) != codes.OutOfRange || !strings.Contains(status.Convert(err).Message(), "tol") {
		t.Errorf("tol 1e-300: %v, want OUT_OF_RANGE naming tol", err)
	}
	_, err = c.PlanGrid(ctx, &pb.PlanGridRequest{Subject: &pb.PlanGridRequest_Family{Family: client.Lorentzian(1)}, Tol: 1e-6, MaxSamples: 100})
	if status.Code(err) != codes.ResourceExhausted || !strings.Contains(status.Convert(err).Message(), "max_samples") {
		t.Errorf("max_samples 100: %v, want RESOURCE_EXHAUSTED naming max_samples", err)
	}
}
