package server

import (
	"context"
	"fmt"
	"runtime/debug"
	"time"

	"github.com/rs/zerolog"
	"google.golang.org/grpc"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/metadata"
	"google.golang.org/grpc/peer"
	"google.golang.org/grpc/status"
)

// RequestIDHeader is the metadata key of the request id. A caller may set
// it; otherwise the server makes one. The server returns it in the
// response header and logs it with the call.
const RequestIDHeader = "x-request-id"

// interceptors returns the server options that chain the interceptors, in
// this order from the outside in:
//
//	log       request id, then one JSON line per call (level by outcome)
//	deadline  unary calls end after Limits.MaxCallDuration at the latest
//	recover   a panic becomes INTERNAL and is logged with its stack
//
// Recovery is innermost so that the log sees the INTERNAL code it makes.
func (s *Server) interceptors() []grpc.ServerOption {
	return []grpc.ServerOption{
		grpc.ChainUnaryInterceptor(s.logUnary, s.deadlineUnary, s.recoverUnary),
		grpc.ChainStreamInterceptor(s.logStream, s.recoverStream),
	}
}

type requestIDKey struct{}

// requestID returns the caller's request id, or a new one.
func (s *Server) requestID(ctx context.Context) string {
	if md, ok := metadata.FromIncomingContext(ctx); ok {
		if v := md.Get(RequestIDHeader); len(v) > 0 && v[0] != "" && len(v[0]) <= 128 {
			return v[0]
		}
	}
	return fmt.Sprintf("%s-%d", s.idPrefix, s.seq.Add(1))
}

func requestIDFrom(ctx context.Context) string {
	id, _ := ctx.Value(requestIDKey{}).(string)
	return id
}

func (s *Server) logUnary(ctx context.Context, req any, info *grpc.UnaryServerInfo, handler grpc.UnaryHandler) (any, error) {
	start := time.Now()
	id := s.requestID(ctx)
	ctx = context.WithValue(ctx, requestIDKey{}, id)
	_ = grpc.SetHeader(ctx, metadata.Pairs(RequestIDHeader, id))
	resp, err := handler(ctx, req)
	s.logCall(ctx, info.FullMethod, id, start, err)
	return resp, err
}

func (s *Server) logStream(srv any, ss grpc.ServerStream, info *grpc.StreamServerInfo, handler grpc.StreamHandler) error {
	start := time.Now()
	id := s.requestID(ss.Context())
	ctx := context.WithValue(ss.Context(), requestIDKey{}, id)
	_ = ss.SetHeader(metadata.Pairs(RequestIDHeader, id))
	err := handler(srv, &contextStream{ServerStream: ss, ctx: ctx})
	s.logCall(ctx, info.FullMethod, id, start, err)
	return err
}

// logCall writes one line per call: errors of the server at error level,
// errors of the caller and slow calls at info, the rest at debug.
func (s *Server) logCall(ctx context.Context, method, id string, start time.Time, err error) {
	d := time.Since(start)
	st := status.Convert(err)
	var ev *zerolog.Event
	switch st.Code() {
	case codes.OK:
		if d >= s.cfg.SlowCall {
			ev = s.log.Info()
		} else {
			ev = s.log.Debug()
		}
	case codes.Internal, codes.Unknown, codes.DataLoss:
		ev = s.log.Error()
	default:
		ev = s.log.Info()
	}
	if !ev.Enabled() {
		return
	}
	ev = ev.Str("method", method).Str("code", st.Code().String()).
		Float64("duration_ms", float64(d.Microseconds())/1e3).Str("request_id", id)
	if p, ok := peer.FromContext(ctx); ok && p.Addr != nil {
		ev = ev.Str("peer", p.Addr.String())
	}
	if err != nil {
		ev = ev.Str("error", st.Message())
	}
	ev.Msg("call")
}

// deadlineUnary bounds a unary call by Limits.MaxCallDuration.
func (s *Server) deadlineUnary(ctx context.Context, req any, _ *grpc.UnaryServerInfo, handler grpc.UnaryHandler) (any, error) {
	ctx, cancel := context.WithTimeout(ctx, s.cfg.Limits.MaxCallDuration)
	defer cancel()
	return handler(ctx, req)
}

func (s *Server) recoverUnary(ctx context.Context, req any, info *grpc.UnaryServerInfo, handler grpc.UnaryHandler) (resp any, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = s.panicked(ctx, info.FullMethod, r)
		}
	}()
	return handler(ctx, req)
}

func (s *Server) recoverStream(srv any, ss grpc.ServerStream, info *grpc.StreamServerInfo, handler grpc.StreamHandler) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = s.panicked(ss.Context(), info.FullMethod, r)
		}
	}()
	return handler(srv, ss)
}

// panicked logs a recovered panic with its stack and returns INTERNAL.
func (s *Server) panicked(ctx context.Context, method string, r any) error {
	s.log.Error().Str("method", method).Str("request_id", requestIDFrom(ctx)).
		Str("panic", fmt.Sprint(r)).Bytes("stack", debug.Stack()).Msg("panic recovered")
	return status.Errorf(codes.Internal, "internal error: panic in %s (request %s)", method, requestIDFrom(ctx))
}

// contextStream is a ServerStream with a replaced context.
type contextStream struct {
	grpc.ServerStream
	ctx context.Context
}

func (c *contextStream) Context() context.Context { return c.ctx }
