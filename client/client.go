// Package client is a small Go client of foldbound.v1.SamplingService: it
// dials with keepalive and a retry policy for UNAVAILABLE, puts a default
// deadline on every call, offers one typed method per call, and a Batch
// helper that streams many requests, resumes after a dropped connection
// with the unanswered ones only, and returns the answers in input order.
//
// Requests are the generated messages of package
// foldbound/api/foldbound/v1; the constructors in families.go build the
// common ones without spelling out the oneof wrappers.
package client

import (
	"context"
	"fmt"
	"time"

	"google.golang.org/grpc"
	"google.golang.org/grpc/credentials"
	"google.golang.org/grpc/credentials/insecure"
	healthgrpc "google.golang.org/grpc/health/grpc_health_v1"
	healthpb "google.golang.org/grpc/health/grpc_health_v1"
	"google.golang.org/grpc/keepalive"

	pb "foldbound/api/foldbound/v1"
)

// DefaultServiceConfig is the gRPC service config the client dials with:
// round-robin over every address the name resolves to (replicas behind a
// headless service), and up to 4 attempts of a call that fails with
// UNAVAILABLE before the server answered, with exponential backoff.
const DefaultServiceConfig = `{
  "loadBalancingConfig": [{"round_robin": {}}],
  "methodConfig": [{
    "name": [{"service": "foldbound.v1.SamplingService"}, {"service": "grpc.health.v1.Health"}],
    "retryPolicy": {
      "maxAttempts": 4,
      "initialBackoff": "0.1s",
      "maxBackoff": "1s",
      "backoffMultiplier": 2,
      "retryableStatusCodes": ["UNAVAILABLE"]
    }
  }]
}`

// Client calls a SamplingService. It is safe for concurrent use.
type Client struct {
	conn   *grpc.ClientConn
	rpc    pb.SamplingServiceClient
	health healthgrpc.HealthClient
	o      options
}

type options struct {
	timeout       time.Duration
	batchTimeout  time.Duration
	creds         credentials.TransportCredentials
	keepalive     keepalive.ClientParameters
	serviceConfig string
	dialOpts      []grpc.DialOption
	maxStalls     int
	resumeBackoff time.Duration
}

// defaults returns a fresh copy of the default options.
func defaults() options {
	return options{
		timeout:       30 * time.Second,
		batchTimeout:  10 * time.Minute,
		creds:         insecure.NewCredentials(),
		keepalive:     keepalive.ClientParameters{Time: 30 * time.Second, Timeout: 10 * time.Second},
		serviceConfig: DefaultServiceConfig,
		maxStalls:     8,
		resumeBackoff: 50 * time.Millisecond,
	}
}

// Option configures a Client.
type Option func(*options)

// WithTimeout sets the deadline given to unary calls whose context has
// none. Default 30 s.
func WithTimeout(d time.Duration) Option { return func(o *options) { o.timeout = d } }

// WithBatchTimeout sets the deadline given to Batch calls whose context
// has none. Default 10 min.
func WithBatchTimeout(d time.Duration) Option { return func(o *options) { o.batchTimeout = d } }

// WithTransportCredentials sets the transport security. Default: none
// (plain TCP, for loopback and trusted cluster networks).
func WithTransportCredentials(c credentials.TransportCredentials) Option {
	return func(o *options) { o.creds = c }
}

// WithKeepalive sets the keepalive pings. Default: every 30 s on an
// active connection, 10 s to answer. Servers of this project accept
// pings every 10 s or slower.
func WithKeepalive(p keepalive.ClientParameters) Option {
	return func(o *options) { o.keepalive = p }
}

// WithServiceConfig replaces DefaultServiceConfig.
func WithServiceConfig(json string) Option { return func(o *options) { o.serviceConfig = json } }

// WithDialOptions adds gRPC dial options (applied after the client's own).
func WithDialOptions(opts ...grpc.DialOption) Option {
	return func(o *options) { o.dialOpts = append(o.dialOpts, opts...) }
}

// WithMaxStalls sets how many consecutive Batch streams may end without
// answering a single item before Batch gives up. Default 8.
func WithMaxStalls(n int) Option { return func(o *options) { o.maxStalls = n } }

// New returns a client of the service at target (a gRPC target such as
// "localhost:8440" or "dns:///foldbound.lab.svc:8440"). It does not
// connect until the first call.
func New(target string, opts ...Option) (*Client, error) {
	o := defaults()
	for _, opt := range opts {
		opt(&o)
	}
	dial := append([]grpc.DialOption{
		grpc.WithTransportCredentials(o.creds),
		grpc.WithKeepaliveParams(o.keepalive),
		grpc.WithDefaultServiceConfig(o.serviceConfig),
	}, o.dialOpts...)
	conn, err := grpc.NewClient(target, dial...)
	if err != nil {
		return nil, fmt.Errorf("client: %w", err)
	}
	return &Client{conn: conn, rpc: pb.NewSamplingServiceClient(conn), health: healthgrpc.NewHealthClient(conn), o: o}, nil
}

// Close closes the connection.
func (c *Client) Close() error { return c.conn.Close() }

// Conn returns the underlying connection, e.g. for reflection clients.
func (c *Client) Conn() *grpc.ClientConn { return c.conn }

// withDeadline gives ctx the deadline d unless it has one.
func withDeadline(ctx context.Context, d time.Duration) (context.Context, context.CancelFunc) {
	if _, ok := ctx.Deadline(); ok || d <= 0 {
		return ctx, func() {}
	}
	return context.WithTimeout(ctx, d)
}

// AliasSum computes the sampled sum, the exact transform and the error as
// enclosures.
func (c *Client) AliasSum(ctx context.Context, req *pb.AliasSumRequest, opts ...grpc.CallOption) (*pb.AliasSumResponse, error) {
	ctx, cancel := withDeadline(ctx, c.o.timeout)
	defer cancel()
	return c.rpc.AliasSum(ctx, req, opts...)
}

// ErrorBudget bounds the error of a given grid, itemised.
func (c *Client) ErrorBudget(ctx context.Context, req *pb.ErrorBudgetRequest, opts ...grpc.CallOption) (*pb.ErrorBudgetResponse, error) {
	ctx, cancel := withDeadline(ctx, c.o.timeout)
	defer cancel()
	return c.rpc.ErrorBudget(ctx, req, opts...)
}

// PlanGrid returns the cheapest certified grid for a tolerance.
func (c *Client) PlanGrid(ctx context.Context, req *pb.PlanGridRequest, opts ...grpc.CallOption) (*pb.PlanGridResponse, error) {
	ctx, cancel := withDeadline(ctx, c.o.timeout)
	defer cancel()
	return c.rpc.PlanGrid(ctx, req, opts...)
}

// PlanScan returns the sampling layouts of a tomography scan (sampling
// mathematics, not a scan protocol; the response carries the caution).
func (c *Client) PlanScan(ctx context.Context, req *pb.PlanScanRequest, opts ...grpc.CallOption) (*pb.PlanScanResponse, error) {
	ctx, cancel := withDeadline(ctx, c.o.timeout)
	defer cancel()
	return c.rpc.PlanScan(ctx, req, opts...)
}

// LatticeAliasSum computes the sampled sum of a family on a lattice, the
// exact transform and the alias sum as enclosures.
func (c *Client) LatticeAliasSum(ctx context.Context, req *pb.LatticeAliasSumRequest, opts ...grpc.CallOption) (*pb.LatticeAliasSumResponse, error) {
	ctx, cancel := withDeadline(ctx, c.o.timeout)
	defer cancel()
	return c.rpc.LatticeAliasSum(ctx, req, opts...)
}

// CompareLattices ranks sampling lattices for a spectral envelope and a
// tolerance.
func (c *Client) CompareLattices(ctx context.Context, req *pb.CompareLatticesRequest, opts ...grpc.CallOption) (*pb.CompareLatticesResponse, error) {
	ctx, cancel := withDeadline(ctx, c.o.timeout)
	defer cancel()
	return c.rpc.CompareLattices(ctx, req, opts...)
}

// PlanKernel returns gridding-kernel plans of a non-uniform FFT for a
// tolerance.
func (c *Client) PlanKernel(ctx context.Context, req *pb.PlanKernelRequest, opts ...grpc.CallOption) (*pb.PlanKernelResponse, error) {
	ctx, cancel := withDeadline(ctx, c.o.timeout)
	defer cancel()
	return c.rpc.PlanKernel(ctx, req, opts...)
}

// Check asks the standard health service about service ("" for the
// server as a whole).
func (c *Client) Check(ctx context.Context, service string) (healthpb.HealthCheckResponse_ServingStatus, error) {
	ctx, cancel := withDeadline(ctx, c.o.timeout)
	defer cancel()
	r, err := c.health.Check(ctx, &healthpb.HealthCheckRequest{Service: service})
	if err != nil {
		return healthpb.HealthCheckResponse_UNKNOWN, err
	}
	return r.GetStatus(), nil
}
