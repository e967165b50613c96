package server_test

import (
	"context"
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
	"foldbound/server"
)

// TestFamiliesOverTCP checks every catalogue family and composition of
// the wire against closed forms from outside the project.
func TestFamiliesOverTCP(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	inf := func(h float64) []*pb.Grid { return []*pb.Grid{client.Grid(h, 0, 0)} }
	coth := func(x float64) float64 { return 1 / math.Tanh(x) }
	g := complex(sqrt2Pi, 0) // ∫ exp(-x²/2) dx
	tests := []struct {
		name        string
		family      *pb.Family
		grids       []*pb.Grid
		xi          float64
		wantExact   complex128
		wantSampled complex128 // 0: not checked
		tol         float64
	}{
		// h Σ_k e^{-a|hk|} = h·coth(ah/2) (geometric series; the partial
		// fractions of coth, DLMF 4.36.3, give the same by Poisson).
		{"two-sided exponential", client.TwoSidedExponential(1), inf(0.5), 0, 2, complex(0.5*coth(0.25), 0), 1e-14},
		// Σ_k 1/(1+k²) = π·coth π, from π·coth(πz) = 1/z + 2z Σ_{k≥1}
		// 1/(z²+k²) at z = 1 (DLMF 4.36.3, from memory).
		{"Lorentzian", client.Lorentzian(1), inf(1), 0, math.Pi, complex(math.Pi*coth(math.Pi), 0), 1e-14},
		// ∫ sech(x/w) dx = πw (math.md catalogue: F(0) = πw).
		{"sech", client.Sech(2), inf(0.25), 0, 2 * math.Pi, 0, 1e-14},
		// ∫ sech²(x/w) dx = 2w (tanh from -1 to 1).
		{"sech squared", client.SechSquared(1.5), inf(0.25), 0, 3, 0, 1e-14},
		// F(ω0) = σ√(π/2)(1 + e^{-2σ²ω0²}) (math.md catalogue).
		{"wave packet", client.WavePacket(2, 3), inf(0.2), 3, complex(2*math.Sqrt(math.Pi/2)*(1+math.Exp(-2*4*9)), 0), 0, 1e-14},
		// Band-limited to Ω = 2: at h = 1 ≤ 2π/Ω the trapezoidal rule is
		// exact, T = F(0) = 2π/Ω = π (math.md, band limit).
		{"Fejér", client.Fejer(2), inf(1), 0, math.Pi, math.Pi, 1e-14},
		// c·f → c·F.
		{"amplitude", client.Scaled(2+1i, client.Gaussian(1)), inf(0.5), 0, (2 + 1i) * g, (2 + 1i) * g, 1e-14},
		// f(x - c) → F(ξ)e^{-iξc}.
		{"shift", client.Shifted(client.Gaussian(1), 0.3), inf(0.5), 0.7, g * complex(math.Exp(-0.49/2), 0) * cmplx.Exp(-0.21i), 0, 1e-14},
		// f(x/a) → a·F(aξ): exp(-x²/8) has ∫ = 2√(2π).
		{"dilation", client.Dilated(client.Gaussian(1), 2), inf(0.5), 0, 2 * g, 0, 1e-14},
		// f(x)e^{iω0x} → F(ξ - ω0).
		{"modulation", client.Modulated(client.Gaussian(1), 1), inf(0.5), 1, g, 0, 1e-14},
		{"sum", client.Sum(client.Gaussian(1), client.Lorentzian(1)), inf(0.5), 0, g + math.Pi, 0, 1e-14},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			res, err := c.AliasSum(context.Background(), &pb.AliasSumRequest{Family: tt.family, Grids: tt.grids, Xi: []float64{tt.xi}})
			if err != nil {
				t.Fatalf("AliasSum: %v", err)
			}
			if got := mid(res.GetExact()); cmplx.Abs(got-tt.wantExact) > tt.tol*cmplx.Abs(tt.wantExact) {
				t.Errorf("exact = %v, want %v", got, tt.wantExact)
			}
			if tt.wantSampled != 0 {
				if got := mid(res.GetSampled()); cmplx.Abs(got-tt.wantSampled) > tt.tol*cmplx.Abs(tt.wantSampled) {
					t.Errorf("sampled = %v, want %v", got, tt.wantSampled)
				}
			}
		})
	}
}

// TestEngineRulesAtWirePaths: rules only the engine knows (an envelope
// leaving the float64 range) are reported at the wire path of the field.
func TestEngineRulesAtWirePaths(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	_, err := c.AliasSum(context.Background(), &pb.AliasSumRequest{
		Family: client.Sum(client.Gaussian(1), client.Lorentzian(1e-310)),
		Grids:  []*pb.Grid{client.Grid(1, 0, 0)}})
	st := status.Convert(err)
	if st.Code() != codes.InvalidArgument || !strings.HasPrefix(st.Message(), "family.sum.terms[1].lorentzian.a") {
		t.Errorf("%v %q, want InvalidArgument naming family.sum.terms[1].lorentzian.a", st.Code(), st.Message())
	}
}
