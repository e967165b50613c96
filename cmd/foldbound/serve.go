package main

import (
	"fmt"
	"io"
	"net"
	"os"
	"os/signal"
	"syscall"
	"time"

	"github.com/rs/zerolog"
	"github.com/spf13/cobra"

	"foldbound/server"
)

func newServeCmd(stderr io.Writer) *cobra.Command {
	var (
		listen     string
		reflection bool
		logLevel   string
		cfg        server.Config
	)
	def := os.Getenv("FOLDBOUND_LISTEN")
	if def == "" {
		def = "127.0.0.1:8440"
	}
	cmd := &cobra.Command{
		Use:   "serve",
		Short: "Serve foldbound.v1.SamplingService over gRPC",
		Long: `serve runs the gRPC service with the standard health service and server
reflection, writing JSON logs to stderr. SIGTERM or SIGINT stops it
gracefully: health turns NOT_SERVING, in-flight calls and streams finish,
and after --grace the remaining connections are closed.`,
		Example: `  foldbound serve
  foldbound serve --listen :8440 --log-level debug --reflection=false`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			lvl, err := zerolog.ParseLevel(logLevel)
			if err != nil {
				return fmt.Errorf("--log-level: %w", err)
			}
			cfg.Logger = zerolog.New(stderr).Level(lvl).With().Timestamp().Logger()
			cfg.DisableReflection = !reflection
			srv, err := server.New(cfg)
			if err != nil {
				return err
			}
			lis, err := net.Listen("tcp", listen)
			if err != nil {
				return err
			}
			ctx, stop := signal.NotifyContext(cmd.Context(), os.Interrupt, syscall.SIGTERM)
			defer stop()
			return srv.Serve(ctx, lis)
		},
	}
	fs := cmd.Flags()
	fs.StringVar(&listen, "listen", def, "TCP address to listen on ($FOLDBOUND_LISTEN)")
	fs.BoolVar(&reflection, "reflection", true, "register gRPC server reflection")
	fs.StringVar(&logLevel, "log-level", "info", "log level: debug (every call), info (errors and slow calls), warn, error")
	fs.DurationVar(&cfg.SlowCall, "slow-call", time.Second, "successful calls slower than this are logged at info")
	fs.DurationVar(&cfg.ShutdownGrace, "grace", 10*time.Second, "how long shutdown waits for in-flight calls")
	l := &cfg.Limits
	fs.IntVar(&l.MaxRecvMsgBytes, "max-recv-bytes", 4<<20, "largest request message")
	fs.Int64Var(&l.MaxTerms, "max-terms", 1<<24, "cap on a request's work limit (terms)")
	fs.Int64Var(&l.MaxCount, "max-count", 1<<40, "largest sample count per axis")
	fs.Int64Var(&l.MaxStreamItems, "max-stream-items", 1<<20, "largest number of items per Batch stream")
	fs.IntVar(&l.StreamWorkers, "stream-workers", 0, "items of one stream computed concurrently (0: GOMAXPROCS)")
	fs.DurationVar(&l.MaxCallDuration, "max-call-duration", time.Minute, "longest a call or batch item may compute")
	return cmd
}
