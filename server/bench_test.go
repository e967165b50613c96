package server_test

import (
	"context"
	"errors"
	"io"
	"strconv"
	"testing"
	"time"

	"google.golang.org/grpc"
	"google.golang.org/grpc/credentials/insecure"
	healthpb "google.golang.org/grpc/health/grpc_health_v1"
	"google.golang.org/protobuf/proto"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
	"foldbound/server"
)

// The benchmarks measure the service over loopback TCP side by side with
// an echo service that moves messages of the same size through the same
// server (same interceptors, limits and codec) but computes nothing, so
// the ratio is the price of the computation and the wiring over gRPC
// itself. Calls are interleaved within one loop so that both see the same
// machine load.

// echoService answers AliasSum and Batch with canned responses of the
// size the real service returns.
type echoService struct {
	alias *pb.AliasSumResponse
	item  *pb.BatchResponse
}

func echoDesc() *grpc.ServiceDesc {
	return &grpc.ServiceDesc{
		ServiceName: "bench.Echo",
		HandlerType: (*any)(nil),
		Methods: []grpc.MethodDesc{{
			MethodName: "AliasSum",
			Handler: func(srv any, ctx context.Context, dec func(any) error, in grpc.UnaryServerInterceptor) (any, error) {
				req := new(pb.AliasSumRequest)
				if err := dec(req); err != nil {
					return nil, err
				}
				h := func(context.Context, any) (any, error) { return srv.(*echoService).alias, nil }
				return in(ctx, req, &grpc.UnaryServerInfo{Server: srv, FullMethod: "/bench.Echo/AliasSum"}, h)
			},
		}},
		Streams: []grpc.StreamDesc{{
			StreamName: "Batch", ServerStreams: true, ClientStreams: true,
			Handler: func(srv any, stream grpc.ServerStream) error {
				e := srv.(*echoService)
				for {
					in := new(pb.BatchRequest)
					if err := stream.RecvMsg(in); errors.Is(err, io.EOF) {
						return nil
					} else if err != nil {
						return err
					}
					out := proto.Clone(e.item).(*pb.BatchResponse)
					out.Id = in.GetId()
					if err := stream.SendMsg(out); err != nil {
						return err
					}
				}
			},
		}},
	}
}

// benchSetup serves the real service and the echo service on one
// loopback server and returns a client and a raw connection.
func benchSetup(b *testing.B, req *pb.AliasSumRequest) (*client.Client, *grpc.ClientConn) {
	srv, err := server.New(server.Config{})
	if err != nil {
		b.Fatal(err)
	}
	echo := &echoService{}
	srv.GRPC().RegisterService(echoDesc(), echo)
	addr := serveOn(b, srv, "127.0.0.1:0")
	c := newClient(b, addr)
	res, err := c.AliasSum(context.Background(), req)
	if err != nil {
		b.Fatal(err)
	}
	echo.alias = res
	echo.item = &pb.BatchResponse{Id: "x", Result: &pb.BatchResponse_AliasSum{AliasSum: res}}
	conn, err := grpc.NewClient(addr, grpc.WithTransportCredentials(insecure.NewCredentials()))
	if err != nil {
		b.Fatal(err)
	}
	b.Cleanup(func() { _ = conn.Close() })
	return c, conn
}

var sinkResponse *pb.AliasSumResponse

// BenchmarkUnary times AliasSum, the echo call of the same size and a
// health Check, interleaved, and reports each and the ratios.
func BenchmarkUnary(b *testing.B) {
	cases := []struct {
		name string
		req  *pb.AliasSumRequest
	}{
		{"gaussian-infinite", &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(0.5, 0, 0)}}},
		{"gaussian-N1001-spatial", &pb.AliasSumRequest{Family: client.Gaussian(100), Grids: []*pb.Grid{client.Grid(0.5, 0.1, 1001)},
			Settings: &pb.Settings{Side: pb.Side_SIDE_SPATIAL}}},
	}
	for _, bc := range cases {
		b.Run(bc.name, func(b *testing.B) {
			c, conn := benchSetup(b, bc.req)
			health := healthpb.NewHealthClient(conn)
			ctx := context.Background()
			var real, echo, check time.Duration
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				t0 := time.Now()
				res, err := c.AliasSum(ctx, bc.req)
				if err != nil {
					b.Fatal(err)
				}
				t1 := time.Now()
				out := new(pb.AliasSumResponse)
				if err := conn.Invoke(ctx, "/bench.Echo/AliasSum", bc.req, out); err != nil {
					b.Fatal(err)
				}
				t2 := time.Now()
				if _, err := health.Check(ctx, &healthpb.HealthCheckRequest{}); err != nil {
					b.Fatal(err)
				}
				t3 := time.Now()
				real += t1.Sub(t0)
				echo += t2.Sub(t1)
				check += t3.Sub(t2)
				sinkResponse = res
			}
			n := float64(b.N)
			b.ReportMetric(float64(real.Nanoseconds())/n, "alias-ns/call")
			b.ReportMetric(float64(echo.Nanoseconds())/n, "echo-ns/call")
			b.ReportMetric(float64(check.Nanoseconds())/n, "health-ns/call")
			b.ReportMetric(float64(real)/float64(echo), "alias/echo")
			b.ReportMetric(float64(real)/float64(check), "alias/health")
		})
	}
}

// BenchmarkStream sends batches of alias sums through client.Batch and
// the same items through the echo stream, interleaved, and reports items
// per second for each and their ratio.
func BenchmarkStream(b *testing.B) {
	req := &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(0.5, 0, 0)}}
	for _, size := range []int{1000, 10000} {
		b.Run(strconv.Itoa(size), func(b *testing.B) {
			c, conn := benchSetup(b, req)
			items := make([]*pb.BatchRequest, size)
			for i := range items {
				items[i] = client.Item(strconv.Itoa(i), req)
			}
			ctx := context.Background()
			var real, echo time.Duration
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				t0 := time.Now()
				res, err := c.Batch(ctx, items)
				if err != nil || len(res) != size {
					b.Fatalf("Batch: %d answers, %v", len(res), err)
				}
				t1 := time.Now()
				if err := echoStream(ctx, conn, items); err != nil {
					b.Fatal(err)
				}
				real += t1.Sub(t0)
				echo += time.Since(t1)
			}
			total := float64(b.N * size)
			b.ReportMetric(total/real.Seconds(), "items/s")
			b.ReportMetric(total/echo.Seconds(), "echo-items/s")
			b.ReportMetric(float64(real)/float64(echo), "time/echo")
		})
	}
}

// echoStream sends items over the echo stream and reads every answer.
func echoStream(ctx context.Context, conn *grpc.ClientConn, items []*pb.BatchRequest) error {
	desc := &grpc.StreamDesc{StreamName: "Batch", ServerStreams: true, ClientStreams: true}
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	st, err := conn.NewStream(ctx, desc, "/bench.Echo/Batch")
	if err != nil {
		return err
	}
	sent := make(chan error, 1)
	go func() {
		for _, it := range items {
			if err := st.SendMsg(it); err != nil {
				sent <- err
				return
			}
		}
		sent <- st.CloseSend()
	}()
	for range items {
		if err := st.RecvMsg(new(pb.BatchResponse)); err != nil {
			return err
		}
	}
	if err := st.RecvMsg(new(pb.BatchResponse)); !errors.Is(err, io.EOF) {
		return err
	}
	return <-sent
}
