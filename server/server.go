package server

import (
	"context"
	"crypto/rand"
	"encoding/hex"
	"errors"
	"net"
	"sync/atomic"
	"time"

	"github.com/rs/zerolog"
	"google.golang.org/grpc"
	"google.golang.org/grpc/health"
	healthgrpc "google.golang.org/grpc/health/grpc_health_v1"
	healthpb "google.golang.org/grpc/health/grpc_health_v1"
	"google.golang.org/grpc/keepalive"
	"google.golang.org/grpc/reflection"

	pb "foldbound/api/foldbound/v1"
)

// ServiceName is the full name of the service, as used by health checks.
const ServiceName = "foldbound.v1.SamplingService"

// Server serves SamplingService, the standard health service and (unless
// disabled) server reflection on one gRPC server.
type Server struct {
	cfg    Config
	log    zerolog.Logger
	grpc   *grpc.Server
	health *health.Server

	idPrefix string        // distinguishes this server's request ids
	seq      atomic.Uint64 // request id counter
}

// New builds a Server from cfg; zero fields of cfg take their defaults.
func New(cfg Config) (*Server, error) {
	cfg = cfg.withDefaults()
	if err := cfg.validate(); err != nil {
		return nil, err
	}
	var b [4]byte
	_, _ = rand.Read(b[:])
	s := &Server{cfg: cfg, log: cfg.Logger, health: health.NewServer(), idPrefix: hex.EncodeToString(b[:])}
	lim := cfg.Limits
	opts := append([]grpc.ServerOption{
		grpc.MaxRecvMsgSize(lim.MaxRecvMsgBytes),
		grpc.MaxSendMsgSize(lim.MaxSendMsgBytes),
		grpc.MaxConcurrentStreams(lim.MaxConcurrentStreams),
		// Clients may ping every 10 s (the client package pings every
		// 30 s), also between calls.
		grpc.KeepaliveEnforcementPolicy(keepalive.EnforcementPolicy{MinTime: 10 * time.Second, PermitWithoutStream: true}),
		grpc.KeepaliveParams(keepalive.ServerParameters{Time: 2 * time.Minute, Timeout: 20 * time.Second}),
	}, s.interceptors()...)
	s.grpc = grpc.NewServer(opts...)
	pb.RegisterSamplingServiceServer(s.grpc, &service{lim: lim, log: cfg.Logger})
	healthgrpc.RegisterHealthServer(s.grpc, s.health)
	s.health.SetServingStatus(ServiceName, healthpb.HealthCheckResponse_SERVING)
	if !cfg.DisableReflection {
		reflection.Register(s.grpc)
	}
	return s, nil
}

// GRPC returns the underlying gRPC server, to register further services
// (such as a JSON gateway) before Serve.
func (s *Server) GRPC() *grpc.Server { return s.grpc }

// Serve accepts connections on lis until ctx ends, then shuts down
// gracefully: health checks turn NOT_SERVING, new calls are refused,
// in-flight calls and streams run to completion, and after
// Config.ShutdownGrace the remaining connections are closed. It returns
// nil after a shutdown caused by ctx, or the error that stopped serving.
// A Server serves once.
func (s *Server) Serve(ctx context.Context, lis net.Listener) error {
	errc := make(chan error, 1)
	go func() { errc <- s.grpc.Serve(lis) }()
	s.log.Info().Str("addr", lis.Addr().String()).Bool("reflection", !s.cfg.DisableReflection).Msg("serving")
	select {
	case err := <-errc:
		if errors.Is(err, grpc.ErrServerStopped) {
			return nil
		}
		return err
	case <-ctx.Done():
	}
	s.shutdown()
	<-errc
	return nil
}

// shutdown stops gracefully, falling back to Stop after the grace period.
func (s *Server) shutdown() {
	start := time.Now()
	s.health.Shutdown()
	done := make(chan struct{})
	go func() {
		s.grpc.GracefulStop()
		close(done)
	}()
	t := time.NewTimer(s.cfg.ShutdownGrace)
	defer t.Stop()
	select {
	case <-done:
		s.log.Info().Float64("duration_ms", float64(time.Since(start).Microseconds())/1e3).Msg("stopped gracefully")
	case <-t.C:
		s.grpc.Stop()
		<-done
		s.log.Warn().Dur("grace", s.cfg.ShutdownGrace).Msg("grace period over; closed remaining connections")
	}
}

// Stop closes every connection and listener at once, cancelling in-flight
// calls. Serve then returns nil.
func (s *Server) Stop() {
	s.health.Shutdown()
	s.grpc.Stop()
}
