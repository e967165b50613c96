package server_test

import (
	"context"
	"io"
	"math"
	"math/cmplx"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/rs/zerolog"
	"google.golang.org/grpc"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/credentials/insecure"
	healthpb "google.golang.org/grpc/health/grpc_health_v1"
	reflectionpb "google.golang.org/grpc/reflection/grpc_reflection_v1"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/types/known/emptypb"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
	"foldbound/server"
)

// sqrt2Pi is √(2π) to 21 digits (OEIS A019727).
const sqrt2Pi = 2.50662827463100050242

// gaussianTrapezoid returns h Σ_{k=-K..K} exp(-(s+hk)²/2)·exp(-iξ(s+hk)),
// summed directly in float64 from the outside in (a reference independent
// of the engine; its rounding error is a few ulps of the result).
func gaussianTrapezoid(h, s, xi float64, K int) complex128 {
	var sum complex128
	for j := K; j >= 0; j-- {
		for _, k := range []int{-j, j} {
			x := s + h*float64(k)
			sum += complex(math.Exp(-x*x/2), 0) * cmplx.Exp(complex(0, -xi*x))
			if j == 0 {
				break
			}
		}
	}
	return sum * complex(h, 0)
}

func mid(z *pb.ComplexInterval) complex128 {
	return complex((z.GetRe().GetLo()+z.GetRe().GetHi())/2, (z.GetIm().GetLo()+z.GetIm().GetHi())/2)
}

func contains(z *pb.ComplexInterval, w complex128) bool {
	return z.GetRe().GetLo() <= real(w) && real(w) <= z.GetRe().GetHi() &&
		z.GetIm().GetLo() <= imag(w) && imag(w) <= z.GetIm().GetHi()
}

func TestAliasSumOverTCP(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	ctx := context.Background()

	tests := []struct {
		name       string
		req        *pb.AliasSumRequest
		convention pb.Convention
		// wantExact is F in the request's convention, wantSampled the
		// sampled sum; tol is the relative tolerance of the comparison.
		wantExact, wantSampled complex128
		wantError              complex128
		tol                    float64
	}{
		{
			// Jacobi imaginary transformation (DLMF §20.7(viii), from
			// memory): Σ_k e^{-k²/2} = √(2π) Σ_l e^{-2π²l²}, so the alias
			// error of the unit-step infinite grid is 2√(2π)(e^{-2π²}+…).
			name:        "gaussian infinite grid, integral",
			req:         &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(1, 0, 0)}},
			convention:  pb.Convention_CONVENTION_ANGULAR,
			wantExact:   sqrt2Pi,
			wantSampled: gaussianTrapezoid(1, 0, 0, 40),
			wantError:   complex(2*sqrt2Pi*(math.Exp(-2*math.Pi*math.Pi)+math.Exp(-8*math.Pi*math.Pi)), 0),
			tol:         1e-14,
		},
		{
			// Unitary: F_u(0) = σ√(2π)/(2π)^{1/2} = σ (math.md, Conventions).
			name: "gaussian unitary",
			req: &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(0.5, 0, 41)},
				Convention: pb.Convention_CONVENTION_UNITARY},
			convention:  pb.Convention_CONVENTION_UNITARY,
			wantExact:   1,
			wantSampled: gaussianTrapezoid(0.5, 0, 0, 20) / sqrt2Pi,
			tol:         1e-14,
		},
		{
			// Ordinary: F_o(ν) = F(2πν) = √(2π) e^{-(2πν)²/2}, and the
			// sampled sum of a shifted finite grid at ν = 0.25.
			name: "gaussian ordinary, shifted finite grid",
			req: &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(0.5, 0.1, 41)},
				Xi: []float64{0.25}, Convention: pb.Convention_CONVENTION_ORDINARY},
			convention:  pb.Convention_CONVENTION_ORDINARY,
			wantExact:   complex(sqrt2Pi*math.Exp(-(math.Pi/2)*(math.Pi/2)/2), 0),
			wantSampled: gaussianTrapezoid(0.5, 0.1, math.Pi/2, 20),
			tol:         1e-13,
		},
		{
			// Partition of unity of the cardinal B-spline, Σ_k M_4(x - k) = 1
			// (de Boor, A Practical Guide to Splines, 1978, ch. IX, from
			// memory), and ∫ M_4 = 1.
			name:        "B-spline order 4, unit grid, shifted",
			req:         &pb.AliasSumRequest{Family: client.BSpline(4), Grids: []*pb.Grid{client.Grid(1, 0.3, 0)}},
			convention:  pb.Convention_CONVENTION_ANGULAR,
			wantExact:   1,
			wantSampled: 1,
			tol:         1e-14,
		},
		{
			// Kaiser-Bessel with β = 0 is the box of width W: ∫ = W, and
			// on the step W/4 with a shift off the edges it has 4 samples
			// of 1 (common practice, no source).
			name:        "Kaiser-Bessel beta 0 is the box",
			req:         &pb.AliasSumRequest{Family: client.KaiserBessel(2, 0), Grids: []*pb.Grid{client.Grid(0.5, 0.25, 0)}},
			convention:  pb.Convention_CONVENTION_ANGULAR,
			wantExact:   2,
			wantSampled: 2,
			tol:         1e-14,
		},
		{
			// A separable product factorises (Fubini): on unit grids the
			// 2-D sum of exp(-|x|²/2) is the square of the 1-D sum, and
			// the integral is 2π.
			name:        "radial Gaussian in 2-D",
			req:         &pb.AliasSumRequest{Family: client.RadialGaussian(2, 1), Grids: []*pb.Grid{client.Grid(1, 0, 0), client.Grid(1, 0, 0)}},
			convention:  pb.Convention_CONVENTION_ANGULAR,
			wantExact:   2 * math.Pi,
			wantSampled: gaussianTrapezoid(1, 0, 0, 40) * gaussianTrapezoid(1, 0, 0, 40),
			tol:         1e-14,
		},
		{
			name: "separable Gaussian × B-spline, unitary",
			req: &pb.AliasSumRequest{Family: client.Separable(client.Gaussian(1), client.BSpline(2)),
				Grids: []*pb.Grid{client.Grid(0.5, 0, 41), client.Grid(1, 0, 0)}, Convention: pb.Convention_CONVENTION_UNITARY},
			convention: pb.Convention_CONVENTION_UNITARY,
			// (2π)^{-1}·√(2π)·1 = 1/√(2π); the hat M_2 sums to 1 on Z.
			wantExact:   1 / sqrt2Pi,
			wantSampled: gaussianTrapezoid(0.5, 0, 0, 20) / (2 * math.Pi),
			tol:         1e-14,
		},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			res, err := c.AliasSum(ctx, tt.req)
			if err != nil {
				t.Fatalf("AliasSum: %v", err)
			}
			if got := res.GetConvention().GetConvention(); got != tt.convention {
				t.Errorf("convention = %v, want %v", got, tt.convention)
			}
			if res.GetConvention().GetFormula() == "" || res.GetFamily() == "" {
				t.Errorf("response does not state its formula and family: %v", res)
			}
			check := func(what string, z *pb.ComplexInterval, want complex128) {
				t.Helper()
				if got := mid(z); cmplx.Abs(got-want) > tt.tol*cmplx.Abs(want) {
					t.Errorf("%s = %v, want %v (rel. tol %g)", what, got, want, tt.tol)
				}
			}
			check("exact", res.GetExact(), tt.wantExact)
			check("sampled", res.GetSampled(), tt.wantSampled)
			if tt.wantError != 0 {
				check("error", res.GetError(), tt.wantError)
			}
			if tt.wantExact == 1 && !contains(res.GetExact(), 1) {
				t.Errorf("exact %v does not contain 1", res.GetExact())
			}
		})
	}
}

func TestBatch10000OverTCP(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	const n = 10000
	items := make([]*pb.BatchRequest, n)
	for i := range items {
		h := 0.25 + float64(i%200)/100 // steps 0.25 … 2.24
		items[i] = client.Item(idOf(i), &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(h, 0, 0)}})
	}
	items[17] = client.Item(idOf(17), &pb.AliasSumRequest{Family: client.Gaussian(math.NaN()), Grids: []*pb.Grid{client.Grid(1, 0, 0)}})
	res, err := c.Batch(context.Background(), items)
	if err != nil {
		t.Fatalf("Batch: %v", err)
	}
	if len(res) != n {
		t.Fatalf("len(res) = %d, want %d", len(res), n)
	}
	for i, r := range res {
		if r.GetId() != idOf(i) {
			t.Fatalf("res[%d].id = %q, want %q", i, r.GetId(), idOf(i))
		}
		if i == 17 {
			if err := client.ItemErr(r); status.Code(err) != codes.InvalidArgument || !strings.Contains(err.Error(), "family.gaussian.sigma") {
				t.Errorf("item 17: %v, want InvalidArgument naming family.gaussian.sigma", err)
			}
			continue
		}
		if err := client.ItemErr(r); err != nil {
			t.Fatalf("item %d: %v", i, err)
		}
		// F(0) = √(2π) for every step.
		if got := mid(r.GetAliasSum().GetExact()); cmplx.Abs(got-sqrt2Pi) > 1e-15 {
			t.Fatalf("item %d: exact = %v, want %v", i, got, sqrt2Pi)
		}
	}
	// The sampled sum at h = 2.24 against the direct sum.
	h := 0.25 + 199.0/100
	if got, want := mid(res[199].GetAliasSum().GetSampled()), gaussianTrapezoid(h, 0, 0, 30); cmplx.Abs(got-want) > 1e-14 {
		t.Errorf("item 199: sampled = %v, want %v", got, want)
	}
}

func idOf(i int) string { return "job-" + strconv.Itoa(i) }

func TestHealthAndReflection(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	ctx := context.Background()
	for _, svc := range []string{"", server.ServiceName} {
		st, err := c.Check(ctx, svc)
		if err != nil || st != healthpb.HealthCheckResponse_SERVING {
			t.Errorf("Check(%q) = %v, %v; want SERVING", svc, st, err)
		}
	}
	services := listServices(t, c.Conn())
	for _, want := range []string{server.ServiceName, "grpc.health.v1.Health"} {
		if !slices.Contains(services, want) {
			t.Errorf("reflection lists %v, want %s among them", services, want)
		}
	}
}

func TestReflectionCanBeTurnedOff(t *testing.T) {
	addr, _ := startServer(t, server.Config{DisableReflection: true})
	c := newClient(t, addr)
	stream, err := reflectionpb.NewServerReflectionClient(c.Conn()).ServerReflectionInfo(context.Background())
	if err == nil {
		_ = stream.Send(&reflectionpb.ServerReflectionRequest{MessageRequest: &reflectionpb.ServerReflectionRequest_ListServices{}})
		_, err = stream.Recv()
	}
	if status.Code(err) != codes.Unimplemented {
		t.Errorf("reflection with DisableReflection: %v, want Unimplemented", err)
	}
}

func listServices(t *testing.T, conn grpc.ClientConnInterface) []string {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), defaultTestTimeout)
	defer cancel()
	stream, err := reflectionpb.NewServerReflectionClient(conn).ServerReflectionInfo(ctx)
	if err != nil {
		t.Fatalf("reflection: %v", err)
	}
	if err := stream.Send(&reflectionpb.ServerReflectionRequest{MessageRequest: &reflectionpb.ServerReflectionRequest_ListServices{}}); err != nil {
		t.Fatalf("reflection send: %v", err)
	}
	resp, err := stream.Recv()
	if err != nil {
		t.Fatalf("reflection recv: %v", err)
	}
	_ = stream.CloseSend()
	if _, err := stream.Recv(); err != io.EOF {
		t.Fatalf("reflection: stream did not end: %v", err)
	}
	var names []string
	for _, s := range resp.GetListServicesResponse().GetService() {
		names = append(names, s.GetName())
	}
	return names
}

// panicDesc is a service whose only method panics, registered beside the
// real one to exercise the recovery interceptor.
var panicDesc = grpc.ServiceDesc{
	ServiceName: "test.Panicker",
	HandlerType: (*any)(nil),
	Methods: []grpc.MethodDesc{{
		MethodName: "Panic",
		Handler: func(srv any, ctx context.Context, dec func(any) error, in grpc.UnaryServerInterceptor) (any, error) {
			req := new(emptypb.Empty)
			if err := dec(req); err != nil {
				return nil, err
			}
			h := func(context.Context, any) (any, error) { panic("deliberate test panic") }
			return in(ctx, req, &grpc.UnaryServerInfo{Server: srv, FullMethod: "/test.Panicker/Panic"}, h)
		},
	}},
}

func TestPanicBecomesInternalAndServerKeepsServing(t *testing.T) {
	logs := &syncBuffer{}
	srv, err := server.New(server.Config{Logger: zerolog.New(logs)})
	if err != nil {
		t.Fatal(err)
	}
	var impl any = struct{}{}
	srv.GRPC().RegisterService(&panicDesc, impl)
	addr := serveOn(t, srv, "127.0.0.1:0")
	conn, err := grpc.NewClient(addr, grpc.WithTransportCredentials(insecure.NewCredentials()))
	if err != nil {
		t.Fatal(err)
	}
	defer conn.Close()
	ctx, cancel := context.WithTimeout(context.Background(), defaultTestTimeout)
	defer cancel()
	err = conn.Invoke(ctx, "/test.Panicker/Panic", &emptypb.Empty{}, &emptypb.Empty{})
	if status.Code(err) != codes.Internal {
		t.Fatalf("panicking call: %v, want Internal", err)
	}
	if l := logs.String(); !strings.Contains(l, `"panic":"deliberate test panic"`) || !strings.Contains(l, `"level":"error"`) {
		t.Errorf("panic not logged at error level with its value:\n%s", l)
	}
	c := newClient(t, addr)
	if _, err := c.AliasSum(ctx, &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(1, 0, 0)}}); err != nil {
		t.Errorf("AliasSum after a panic: %v", err)
	}
}

func TestRequestLogLine(t *testing.T) {
	logs := &syncBuffer{}
	addr, _ := startServer(t, server.Config{Logger: zerolog.New(logs)}) // info level: errors only
	c := newClient(t, addr)
	_, err := c.AliasSum(context.Background(), &pb.AliasSumRequest{Family: client.Gaussian(-1), Grids: []*pb.Grid{client.Grid(1, 0, 0)}})
	if status.Code(err) != codes.InvalidArgument {
		t.Fatalf("AliasSum: %v, want InvalidArgument", err)
	}
	l := logs.String()
	for _, want := range []string{`"method":"/foldbound.v1.SamplingService/AliasSum"`, `"code":"InvalidArgument"`, `"duration_ms":`, `"request_id":"`} {
		if !strings.Contains(l, want) {
			t.Errorf("log lacks %s:\n%s", want, l)
		}
	}
}
