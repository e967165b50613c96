package server_test

import (
	"context"
	"net"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/rs/zerolog"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
	"foldbound/server"
)

// heavy is an alias sum of 2^24 samples on the spatial side: many seconds
// of engine work, which only the call's context can cut short.
func heavy() *pb.AliasSumRequest {
	return &pb.AliasSumRequest{
		Family:   client.Gaussian(1e4),
		Grids:    []*pb.Grid{client.Grid(1e-3, 0, 1<<24)},
		Settings: &pb.Settings{Side: pb.Side_SIDE_SPATIAL, MaxTerms: 1 << 24},
	}
}

func TestDeadlineStopsTheEngine(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	ctx, cancel := context.WithTimeout(context.Background(), 200*time.Millisecond)
	defer cancel()
	_, err := c.AliasSum(ctx, heavy())
	if status.Code(err) != codes.DeadlineExceeded {
		t.Fatalf("AliasSum with a 200 ms deadline: %v, want DeadlineExceeded", err)
	}
}

// TestCancellationStopsTheEngine cancels a heavy call and waits for the
// server's log line: the handler returned CANCELLED, so the engine stopped.
func TestCancellationStopsTheEngine(t *testing.T) {
	logs := &syncBuffer{}
	addr, _ := startServer(t, server.Config{Logger: zerolog.New(logs)})
	c := newClient(t, addr)
	ctx, cancel := context.WithCancel(context.Background())
	go func() {
		time.Sleep(100 * time.Millisecond)
		cancel()
	}()
	if _, err := c.AliasSum(ctx, heavy()); status.Code(err) != codes.Canceled {
		t.Fatalf("cancelled AliasSum: %v, want Canceled", err)
	}
	deadline := time.Now().Add(defaultTestTimeout)
	for !strings.Contains(logs.String(), `"code":"Canceled"`) {
		if time.Now().After(deadline) {
			t.Fatalf("the server never finished the cancelled call; log:\n%s", logs.String())
		}
		time.Sleep(10 * time.Millisecond)
	}
}

// TestGracefulShutdownFinishesStreams ends Serve's context in the middle
// of a Batch stream: the stream must still deliver every answer (the
// client could not resume: the server is gone), and Serve must return.
func TestGracefulShutdownFinishesStreams(t *testing.T) {
	srv, err := server.New(server.Config{ShutdownGrace: defaultTestTimeout})
	if err != nil {
		t.Fatal(err)
	}
	lis, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	ctx, stop := context.WithCancel(context.Background())
	served := make(chan error, 1)
	go func() { served <- srv.Serve(ctx, lis) }()
	c := newClient(t, lis.Addr().String())

	const n = 4000
	items := make([]*pb.BatchRequest, n)
	for i := range items {
		items[i] = client.Item(strconv.Itoa(i), &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(0.5, 0, 0)}})
	}
	var once sync.Once
	res, err := c.Batch(context.Background(), items, client.WithProgress(func(done, _ int) {
		if done == 100 {
			once.Do(stop)
		}
	}))
	if err != nil {
		t.Fatalf("Batch across a graceful shutdown: %v", err)
	}
	for i, r := range res {
		if r == nil || client.ItemErr(r) != nil {
			t.Fatalf("item %d: %v", i, r)
		}
	}
	if err := <-served; err != nil {
		t.Errorf("Serve: %v", err)
	}
}
