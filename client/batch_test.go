package client_test

import (
	"context"
	"errors"
	"math"
	"net"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"
	"testing"
	"time"

	"github.com/rs/zerolog"
	"google.golang.org/grpc"
	"google.golang.org/grpc/backoff"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
	"foldbound/server"
)

const defaultTestTimeout = 30 * time.Second

// fastReconnect makes the client retry a lost connection within 200 ms.
var fastReconnect = client.WithDialOptions(grpc.WithConnectParams(grpc.ConnectParams{
	Backoff: backoff.Config{BaseDelay: 20 * time.Millisecond, Multiplier: 1.6, MaxDelay: 200 * time.Millisecond},
}))

// serve runs srv on lis until the test ends or srv is stopped.
func serve(t *testing.T, srv *server.Server, lis net.Listener) {
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan error, 1)
	go func() { done <- srv.Serve(ctx, lis) }()
	t.Cleanup(func() {
		cancel()
		if err := <-done; err != nil {
			t.Errorf("Serve: %v", err)
		}
	})
}

func startServer(t *testing.T, cfg server.Config) (string, *server.Server) {
	t.Helper()
	srv, err := server.New(cfg)
	if err != nil {
		t.Fatal(err)
	}
	lis, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	serve(t, srv, lis)
	return lis.Addr().String(), srv
}

func newClient(t *testing.T, addr string, opts ...client.Option) *client.Client {
	t.Helper()
	c, err := client.New(addr, append([]client.Option{fastReconnect, client.WithTimeout(defaultTestTimeout)}, opts...)...)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { _ = c.Close() })
	return c
}

func gaussianItems(n int) []*pb.BatchRequest {
	items := make([]*pb.BatchRequest, n)
	for i := range items {
		h := 0.3 + float64(i%100)/50
		items[i] = client.Item("item-"+strconv.Itoa(i), &pb.AliasSumRequest{
			Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(h, 0, 0)}})
	}
	return items
}

// syncBuffer collects log lines written concurrently.
type syncBuffer struct {
	mu sync.Mutex
	b  strings.Builder
}

func (s *syncBuffer) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.Write(p)
}

func (s *syncBuffer) String() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.String()
}

// TestBatchSurvivesServerRestart stops the server hard in the middle of a
// stream, starts a new one on the same address, and checks that every id
// is answered exactly once, in input order, with a correct answer.
func TestBatchSurvivesServerRestart(t *testing.T) {
	srv1, err := server.New(server.Config{})
	if err != nil {
		t.Fatal(err)
	}
	lis1, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	addr := lis1.Addr().String()
	serve(t, srv1, lis1)

	logs2 := &syncBuffer{}
	srv2, err := server.New(server.Config{Logger: zerolog.New(logs2).Level(zerolog.DebugLevel)})
	if err != nil {
		t.Fatal(err)
	}
	var lis2 net.Listener
	restart := func() {
		srv1.Stop()
		deadline := time.Now().Add(5 * time.Second)
		for {
			l, err := net.Listen("tcp", addr)
			if err == nil {
				lis2 = l
				return
			}
			if time.Now().After(deadline) {
				t.Errorf("relisten on %s: %v", addr, err)
				return
			}
			time.Sleep(10 * time.Millisecond)
		}
	}

	const n, stopAt = 6000, 300
	var (
		once        sync.Once
		restarted   = make(chan struct{})
		calls       atomic.Int64
		doneAtStop  atomic.Int64
		seenDone    = make(map[int]bool)
		progressErr error
	)
	progress := func(done, total int) {
		calls.Add(1)
		if seenDone[done] || total != n {
			progressErr = errors.New("progress reported a count twice or a wrong total")
		}
		seenDone[done] = true
		if done == stopAt {
			once.Do(func() {
				doneAtStop.Store(int64(done))
				go func() {
					defer close(restarted)
					restart()
				}()
			})
		}
	}
	c := newClient(t, addr)
	items := gaussianItems(n)
	ctx, cancel := context.WithTimeout(context.Background(), defaultTestTimeout)
	defer cancel()

	type result struct {
		res []*pb.BatchResponse
		err error
	}
	out := make(chan result, 1)
	go func() {
		res, err := c.Batch(ctx, items, client.WithProgress(progress))
		out <- result{res, err}
	}()
	<-restarted
	if lis2 == nil {
		t.Fatal("no second listener")
	}
	serve(t, srv2, lis2)
	r := <-out
	if r.err != nil {
		t.Fatalf("Batch: %v", r.err)
	}
	if progressErr != nil {
		t.Error(progressErr)
	}
	if got := calls.Load(); got != n {
		t.Errorf("progress called %d times, want %d (each item once)", got, n)
	}
	for i, resp := range r.res {
		if resp == nil {
			t.Fatalf("item %d unanswered", i)
		}
		if want := "item-" + strconv.Itoa(i); resp.GetId() != want {
			t.Fatalf("res[%d].id = %q, want %q", i, resp.GetId(), want)
		}
		if err := client.ItemErr(resp); err != nil {
			t.Fatalf("item %d: %v", i, err)
		}
		// F(0) = √(2π) (OEIS A019727) whatever the step.
		z := resp.GetAliasSum().GetExact().GetRe()
		if math.Abs((z.GetLo()+z.GetHi())/2-2.5066282746310005) > 1e-15 {
			t.Fatalf("item %d: exact = %v", i, z)
		}
	}
	// The second server must have carried part of the batch: the restart
	// really happened mid-stream.
	if !strings.Contains(logs2.String(), "/foldbound.v1.SamplingService/Batch") {
		t.Errorf("the restarted server saw no Batch stream; the restart did not interrupt the batch")
	}
	t.Logf("stopped the first server after %d of %d answers", doneAtStop.Load(), n)
}

func TestBatchRejectsBadIDs(t *testing.T) {
	c, err := client.New("127.0.0.1:1")
	if err != nil {
		t.Fatal(err)
	}
	defer c.Close()
	req := &pb.AliasSumRequest{Family: client.Gaussian(1)}
	tests := []struct {
		name  string
		items []*pb.BatchRequest
		want  string
	}{
		{"empty id", []*pb.BatchRequest{client.Item("", req)}, "empty id"},
		{"duplicate id", []*pb.BatchRequest{client.Item("a", req), client.Item("a", req)}, "duplicate id"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := c.Batch(context.Background(), tt.items)
			if err == nil || !strings.Contains(err.Error(), tt.want) {
				t.Errorf("Batch = %v, want error containing %q", err, tt.want)
			}
		})
	}
}

func TestDefaultDeadline(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr, client.WithTimeout(time.Nanosecond))
	_, err := c.AliasSum(context.Background(), &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(1, 0, 0)}})
	if status.Code(err) != codes.DeadlineExceeded {
		t.Errorf("AliasSum with a 1 ns default deadline: %v, want DeadlineExceeded", err)
	}
}

func TestItemErrKeepsFieldViolations(t *testing.T) {
	r := &pb.BatchResponse{Id: "x", Result: &pb.BatchResponse_Error{Error: &pb.ItemError{
		Code: int32(codes.InvalidArgument), Message: "grids[0].step: must be finite and > 0, got NaN",
		FieldViolations: []*pb.FieldViolation{{Field: "grids[0].step", Description: "must be finite and > 0, got NaN"}},
	}}}
	st := status.Convert(client.ItemErr(r))
	if st.Code() != codes.InvalidArgument || len(st.Details()) != 1 {
		t.Errorf("ItemErr = %v with %d details, want InvalidArgument with 1", st, len(st.Details()))
	}
	if client.ItemErr(&pb.BatchResponse{Id: "y"}) != nil {
		t.Error("ItemErr of a response without error is not nil")
	}
}

// TestBatchResumesPastTheStreamItemCap serves with a cap of 100 items per
// stream: Batch must carry 250 items over several streams, each answered
// once.
func TestBatchResumesPastTheStreamItemCap(t *testing.T) {
	addr, _ := startServer(t, server.Config{Limits: server.Limits{MaxStreamItems: 100}})
	c := newClient(t, addr)
	items := gaussianItems(250)
	calls := 0
	res, err := c.Batch(context.Background(), items, client.WithProgress(func(int, int) { calls++ }))
	if err != nil {
		t.Fatalf("Batch: %v", err)
	}
	if calls != len(items) {
		t.Errorf("progress called %d times, want %d", calls, len(items))
	}
	for i, r := range res {
		if want := "item-" + strconv.Itoa(i); r.GetId() != want || client.ItemErr(r) != nil {
			t.Fatalf("res[%d] = %v, want id %q without error", i, r, want)
		}
	}
}
