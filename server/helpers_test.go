package server_test

import (
	"bytes"
	"context"
	"net"
	"sync"
	"testing"
	"time"

	"google.golang.org/grpc"
	"google.golang.org/grpc/backoff"

	"foldbound/client"
	"foldbound/server"
)

// defaultTestTimeout bounds every test call.
const defaultTestTimeout = 20 * time.Second

// startServer serves cfg on a fresh loopback TCP port until the test ends.
func startServer(t testing.TB, cfg server.Config) (addr string, srv *server.Server) {
	t.Helper()
	srv, err := server.New(cfg)
	if err != nil {
		t.Fatalf("server.New: %v", err)
	}
	addr = serveOn(t, srv, "127.0.0.1:0")
	return addr, srv
}

// serveOn serves srv on addr until the test ends (or srv is stopped).
func serveOn(t testing.TB, srv *server.Server, addr string) string {
	t.Helper()
	lis, err := net.Listen("tcp", addr)
	if err != nil {
		t.Fatalf("listen: %v", err)
	}
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan error, 1)
	go func() { done <- srv.Serve(ctx, lis) }()
	t.Cleanup(func() {
		cancel()
		if err := <-done; err != nil {
			t.Errorf("Serve: %v", err)
		}
	})
	return lis.Addr().String()
}

// newClient returns a client of addr closed when the test ends.
func newClient(t testing.TB, addr string, opts ...client.Option) *client.Client {
	t.Helper()
	opts = append([]client.Option{
		client.WithTimeout(defaultTestTimeout),
		client.WithDialOptions(grpc.WithConnectParams(grpc.ConnectParams{
			Backoff: backoff.Config{BaseDelay: 20 * time.Millisecond, Multiplier: 1.6, MaxDelay: 200 * time.Millisecond},
		})),
	}, opts...)
	c, err := client.New(addr, opts...)
	if err != nil {
		t.Fatalf("client.New: %v", err)
	}
	t.Cleanup(func() { _ = c.Close() })
	return c
}

// syncBuffer is a bytes.Buffer safe for the concurrent writes of a logger.
type syncBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
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
