package server_test

import (
	"context"
	"math"
	"testing"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
	"foldbound/server"
)

func TestErrorBudgetOverTCP(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	ctx := context.Background()

	// The Lorentzian 1/(1+x²) has F(ξ) = π e^{-|ξ|}; its exact alias error
	// on the unit grid at zero shift is Σ_{l≠0} π e^{-2π|l|} =
	// 2π/(e^{2π}-1) (geometric series), and the exponential-envelope bound
	// 2B cosh(βξ)/(e^{2πβ/h}-1) with B = π, β = 1 is equal to it
	// (Trefethen & Weideman, SIAM Review 56(3), 2014, Thm 5.1, from memory).
	lorentzAlias := 2 * math.Pi / math.Expm1(2*math.Pi)
	// Jacobi imaginary transformation (DLMF §20.7(viii), from memory): the
	// alias error of exp(-x²/2) on the unit grid is 2√(2π) Σ_{l≥1} e^{-2π²l²}.
	gaussAlias := 2 * sqrt2Pi * (math.Exp(-2*math.Pi*math.Pi) + math.Exp(-8*math.Pi*math.Pi))

	tests := []struct {
		name       string
		req        *pb.ErrorBudgetRequest
		trueError  float64 // the exact error the budget must cover
		maxRatio   float64 // largest accepted bound / true error
		wantExact  bool
		wantRoundg bool // a finite grid has a rounding term
	}{
		{
			name: "lorentzian envelopes, infinite unit grid",
			req: &pb.ErrorBudgetRequest{
				Subject: &pb.ErrorBudgetRequest_Envelopes{Envelopes: &pb.Envelopes{
					Spatial:  []*pb.EnvelopeTerm{{Decay: pb.Decay_DECAY_ALGEBRAIC, Amplitude: 1, Width: 1, Power: 2}},
					Spectral: []*pb.EnvelopeTerm{{Decay: pb.Decay_DECAY_EXPONENTIAL, Amplitude: math.Pi, Rate: 1}},
				}},
				Grids: []*pb.Grid{client.Grid(1, 0, 0)},
			},
			trueError: lorentzAlias,
			maxRatio:  1 + 1e-12,
		},
		{
			name: "gaussian family, infinite unit grid",
			req: &pb.ErrorBudgetRequest{
				Subject: &pb.ErrorBudgetRequest_Family{Family: client.Gaussian(1)},
				Grids:   []*pb.Grid{client.Grid(1, 0, 0)},
			},
			trueError: gaussAlias,
			maxRatio:  1 + 1e-9,
			wantExact: true,
		},
		{
			name: "gaussian family, finite grid, every shift",
			req: &pb.ErrorBudgetRequest{
				Subject:        &pb.ErrorBudgetRequest_Family{Family: client.Gaussian(1)},
				Grids:          []*pb.Grid{client.Grid(1, 0, 21)},
				WorstCaseShift: true,
			},
			// The alias error alone is attained at zero shift; the budget
			// adds truncation (e^{-50}-sized) and rounding.
			trueError:  gaussAlias,
			maxRatio:   1.01,
			wantExact:  true,
			wantRoundg: true,
		},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			res, err := c.ErrorBudget(ctx, tt.req)
			if err != nil {
				t.Fatalf("ErrorBudget: %v", err)
			}
			b := res.GetBudget()
			if b.GetTotal() < tt.trueError {
				t.Errorf("total = %g, below the true error %g", b.GetTotal(), tt.trueError)
			}
			if r := b.GetAliasing() / tt.trueError; r < 1 || r > tt.maxRatio {
				t.Errorf("aliasing bound / true = %.15g, want in [1, %g]", r, tt.maxRatio)
			}
			if b.GetExact() != tt.wantExact {
				t.Errorf("exact = %v, want %v", b.GetExact(), tt.wantExact)
			}
			if (b.GetRounding() > 0) != tt.wantRoundg {
				t.Errorf("rounding = %g, want > 0: %v", b.GetRounding(), tt.wantRoundg)
			}
			if sum := b.GetAliasing() + b.GetTruncation() + b.GetRounding(); b.GetTotal() < sum*(1-1e-15) {
				t.Errorf("total %g < aliasing + truncation + rounding = %g", b.GetTotal(), sum)
			}
			if res.GetConvention().GetConvention() != pb.Convention_CONVENTION_ANGULAR || res.GetSubject() == "" {
				t.Errorf("response does not state its convention and subject: %v", res)
			}
			t.Logf("budget %v; tightness aliasing/true = %.6g", b, b.GetAliasing()/tt.trueError)
		})
	}
}

// TestErrorBudgetUnitary checks the unitary rescaling: every part is the
// angular one divided by √(2π) (math.md, Conventions), rounded up.
func TestErrorBudgetUnitary(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	req := &pb.ErrorBudgetRequest{Subject: &pb.ErrorBudgetRequest_Family{Family: client.Gaussian(1)}, Grids: []*pb.Grid{client.Grid(0.8, 0, 15)}}
	ang, err := c.ErrorBudget(context.Background(), req)
	if err != nil {
		t.Fatal(err)
	}
	req.Convention = pb.Convention_CONVENTION_UNITARY
	uni, err := c.ErrorBudget(context.Background(), req)
	if err != nil {
		t.Fatal(err)
	}
	if got, want := uni.GetBudget().GetTotal(), ang.GetBudget().GetTotal()/sqrt2Pi; math.Abs(got-want) > 1e-14*want || got < want*(1-1e-15) {
		t.Errorf("unitary total = %g, want %g (angular %g / √(2π))", got, want, ang.GetBudget().GetTotal())
	}
	if uni.GetConvention().GetConvention() != pb.Convention_CONVENTION_UNITARY {
		t.Errorf("convention = %v, want unitary", uni.GetConvention().GetConvention())
	}
}

// An n-dimensional budget for a separable family: the float64 double sum
// on the grid must be within the certified total of the closed form
// F(0) = σ√(2π)·πw (Gaussian and sech integrals, DLMF 7.7.6 and 4.20 by
// substitution, from memory), for the grid's shift and, with
// worst_case_shift, for shifts across the cell.
func TestErrorBudget2DOverTCP(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	gx, gy := client.Grid(0.8, 0.1, 11), client.Grid(0.3, 0, 31)
	for _, worst := range []bool{false, true} {
		res, err := c.ErrorBudget(context.Background(), &pb.ErrorBudgetRequest{
			Subject:        &pb.ErrorBudgetRequest_Family{Family: client.Separable(client.Gaussian(1), client.Sech(0.5))},
			Grids:          []*pb.Grid{gx, gy},
			WorstCaseShift: worst,
		})
		if err != nil {
			t.Fatal(err)
		}
		total := res.GetBudget().GetTotal()
		shifts := []float64{0}
		if worst {
			shifts = []float64{-0.5, -0.2, 0.3, 0.5}
		}
		for _, fx := range shifts {
			for _, fy := range shifts {
				sx := floatTrapezoid(func(x float64) float64 { return math.Exp(-x * x / 2) },
					&pb.Grid{Step: gx.GetStep(), Shift: gx.GetShift() + fx*gx.GetStep(), Count: gx.GetCount()})
				sy := floatTrapezoid(func(y float64) float64 { return 1 / math.Cosh(y/0.5) },
					&pb.Grid{Step: gy.GetStep(), Shift: gy.GetShift() + fy*gy.GetStep(), Count: gy.GetCount()})
				if e := math.Abs(sx*sy - sqrt2Pi*math.Pi*0.5); e > total {
					t.Errorf("worst=%v shifts (%g, %g) steps: error %g > budget %g", worst, fx, fy, e, total)
				}
			}
		}
	}
}
