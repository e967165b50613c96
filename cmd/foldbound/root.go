package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"net"
	"os"
	"strings"
	"time"

	"github.com/rs/zerolog"
	"github.com/spf13/cobra"
	"github.com/spf13/pflag"
	"google.golang.org/grpc"
	"google.golang.org/protobuf/encoding/protojson"
	"google.golang.org/protobuf/proto"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
	"foldbound/server"
)

// newRoot builds the command tree.
func newRoot(stdout, stderr io.Writer) *cobra.Command {
	root := &cobra.Command{
		Use:   "foldbound",
		Short: "Certified aliasing and truncation errors, and cheapest sample grids",
		Long: `foldbound answers sampling questions by the Poisson summation formula:
how wrong a sample grid is (aliasing, truncation and rounding, as certified
bounds) and which grid is the cheapest one whose error is within a tolerance.

Query commands call a running server with --addr (or $FOLDBOUND_ADDR), or,
without one, start the service in-process on a loopback port.

Functions are written as ` + "`name(key=value, …)`" + `, e.g. 'gaussian(sigma=0.7)' or
'shift(by=0.5, lorentzian(a=2))'. Known names:
` + familyNames,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.SetOut(stdout)
	root.SetErr(stderr)
	root.AddCommand(newServeCmd(stderr), newAliasCmd(stdout, stderr), newBudgetCmd(stdout, stderr),
		newPlanCmd(stdout, stderr), newScanCmd(stdout, stderr), newLatticeCmd(stdout, stderr), newKernelCmd(stdout, stderr), newBatchCmd(stdout, stderr), newDemoCmd(stdout, stderr))
	return root
}

// callFlags are the flags shared by the query commands.
type callFlags struct {
	addr    string
	timeout time.Duration
	json    bool
	request string
}

func (c *callFlags) register(fs *pflag.FlagSet) {
	fs.StringVar(&c.addr, "addr", os.Getenv("FOLDBOUND_ADDR"), "server address host:port; empty runs the service in-process on a loopback port")
	fs.DurationVar(&c.timeout, "timeout", 30*time.Second, "deadline of each call")
	fs.BoolVar(&c.json, "json", false, "print the response as protojson (for machines)")
	fs.StringVar(&c.request, "request", "", "read the whole request from this protojson file ('-' for stdin) instead of flags")
}

// session is a client connected to a server, perhaps an in-process one.
type session struct {
	*client.Client
	stop func()
}

// dial connects to --addr, or starts an in-process server on a loopback
// port and connects to it over TCP.
func (c *callFlags) dial(ctx context.Context, stderr io.Writer) (*session, error) {
	opts := []client.Option{client.WithTimeout(c.timeout)}
	if c.addr != "" {
		cl, err := client.New(c.addr, opts...)
		if err != nil {
			return nil, err
		}
		return &session{Client: cl, stop: func() { _ = cl.Close() }}, nil
	}
	srv, err := server.New(server.Config{Logger: zerolog.New(stderr).Level(zerolog.ErrorLevel)})
	if err != nil {
		return nil, err
	}
	lis, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		return nil, fmt.Errorf("in-process server: %w", err)
	}
	sctx, cancel := context.WithCancel(ctx)
	done := make(chan error, 1)
	go func() { done <- srv.Serve(sctx, lis) }()
	cl, err := client.New(lis.Addr().String(), opts...)
	if err != nil {
		cancel()
		<-done
		return nil, err
	}
	return &session{Client: cl, stop: func() {
		_ = cl.Close()
		cancel()
		<-done
	}}, nil
}

// readRequest fills m from the protojson file named by --request.
func (c *callFlags) readRequest(m proto.Message) error {
	var (
		data []byte
		err  error
	)
	if c.request == "-" {
		data, err = io.ReadAll(os.Stdin)
	} else {
		data, err = os.ReadFile(c.request)
	}
	if err != nil {
		return err
	}
	if err := protojson.Unmarshal(data, m); err != nil {
		return fmt.Errorf("%s: %w", c.request, err)
	}
	return nil
}

// printJSON writes m as indented protojson.
func printJSON(w io.Writer, m proto.Message) error {
	b, err := protojson.MarshalOptions{Multiline: true, Indent: "  "}.Marshal(m)
	if err != nil {
		return err
	}
	_, err = fmt.Fprintf(w, "%s\n", b)
	return err
}

// ask sends one request and prints its answer. The request comes from
// --request, or build fills it from the flags; the answer is printed as
// protojson with --json, otherwise by human.
func ask[Req, Res proto.Message](cmd *cobra.Command, call *callFlags, stdout, stderr io.Writer, req Req,
	build func() error,
	rpc func(*session, context.Context, Req, ...grpc.CallOption) (Res, error),
	human func(io.Writer, Req, Res) error) error {
	if call.request != "" {
		if err := onlyRequest(cmd); err != nil {
			return err
		}
		if err := call.readRequest(req); err != nil {
			return err
		}
	} else if err := build(); err != nil {
		return err
	}
	s, err := call.dial(cmd.Context(), stderr)
	if err != nil {
		return err
	}
	defer s.stop()
	res, err := rpc(s, cmd.Context(), req)
	if err != nil {
		return err
	}
	if call.json {
		return printJSON(stdout, res)
	}
	return human(stdout, req, res)
}

// onlyRequest reports flags given together with --request.
func onlyRequest(cmd *cobra.Command, allowed ...string) error {
	var extra []string
	cmd.Flags().Visit(func(f *pflag.Flag) {
		for _, a := range append(allowed, "request", "addr", "timeout", "json") {
			if f.Name == a {
				return
			}
		}
		extra = append(extra, "--"+f.Name)
	})
	if len(extra) > 0 {
		return fmt.Errorf("--request gives the whole request; drop %s", strings.Join(extra, ", "))
	}
	return nil
}

// gridFlags describe the grids of a request, one value per axis or one
// for all axes.
type gridFlags struct {
	step  []float64
	shift []float64
	count []int64
}

func (g *gridFlags) register(fs *pflag.FlagSet) {
	fs.Float64SliceVar(&g.step, "step", nil, "grid step h per axis (one value: all axes)")
	fs.Float64SliceVar(&g.shift, "shift", nil, "grid shift s per axis: position of sample 0 (default 0)")
	fs.Int64SliceVar(&g.count, "count", nil, "sample count N per axis; 0 is the infinite grid (default 0)")
}

// grids builds dim grids from the flags.
func (g *gridFlags) grids(dim int) ([]*pb.Grid, error) {
	if len(g.step) == 0 {
		return nil, errors.New("--step is required")
	}
	pick := func(name string, n int) (func(i int) int, error) {
		switch n {
		case 0:
			return func(int) int { return -1 }, nil
		case 1:
			return func(int) int { return 0 }, nil
		case dim:
			return func(i int) int { return i }, nil
		}
		return nil, fmt.Errorf("--%s has %d values for a %d-dimensional function", name, n, dim)
	}
	st, err := pick("step", len(g.step))
	if err != nil {
		return nil, err
	}
	sh, err := pick("shift", len(g.shift))
	if err != nil {
		return nil, err
	}
	co, err := pick("count", len(g.count))
	if err != nil {
		return nil, err
	}
	out := make([]*pb.Grid, dim)
	for i := range out {
		gr := &pb.Grid{Step: g.step[st(i)]}
		if j := sh(i); j >= 0 {
			gr.Shift = g.shift[j]
		}
		if j := co(i); j >= 0 {
			gr.Count = g.count[j]
		}
		out[i] = gr
	}
	return out, nil
}

// dimOf returns the dimension of a family as the server will see it.
func dimOf(f *pb.Family) int {
	switch k := f.GetKind().(type) {
	case *pb.Family_Separable:
		return max(1, len(k.Separable.GetFactors()))
	case *pb.Family_RadialGaussian:
		return max(1, int(k.RadialGaussian.GetDim()))
	}
	return 1
}

func parseConvention(s string) (pb.Convention, error) {
	switch strings.ToLower(s) {
	case "", "angular":
		return pb.Convention_CONVENTION_ANGULAR, nil
	case "unitary":
		return pb.Convention_CONVENTION_UNITARY, nil
	case "ordinary":
		return pb.Convention_CONVENTION_ORDINARY, nil
	}
	return 0, fmt.Errorf("--convention %q: want angular, unitary or ordinary", s)
}

// settingsFlags are the numerical settings.
type settingsFlags struct {
	tol        float64
	maxTerms   int64
	side       string
	convention string
}

func (s *settingsFlags) register(fs *pflag.FlagSet) {
	fs.Float64Var(&s.tol, "remainder-tol", 0, "absolute size below which an infinite sum's remainder may stay a bound (0: full precision)")
	fs.Int64Var(&s.maxTerms, "max-terms", 0, "work limit in terms (0: the server's default)")
	fs.StringVar(&s.side, "side", "auto", "side of the Poisson formula to sum: auto, spatial or spectral")
	fs.StringVar(&s.convention, "convention", "angular", "Fourier convention: angular, unitary or ordinary (frequencies in cycles per unit)")
}

func (s *settingsFlags) settings() (*pb.Settings, pb.Convention, error) {
	out := &pb.Settings{Tol: s.tol, MaxTerms: s.maxTerms}
	switch strings.ToLower(s.side) {
	case "auto", "":
	case "spatial":
		out.Side = pb.Side_SIDE_SPATIAL
	case "spectral":
		out.Side = pb.Side_SIDE_SPECTRAL
	default:
		return nil, 0, fmt.Errorf("--side %q: want auto, spatial or spectral", s.side)
	}
	c, err := parseConvention(s.convention)
	return out, c, err
}

// subjectFlags select a family or envelopes.
type subjectFlags struct {
	family   string
	spatial  []string
	spectral []string
}

func (s *subjectFlags) register(fs *pflag.FlagSet, envelopes bool) {
	fs.StringVar(&s.family, "family", "", "the function, e.g. 'gaussian(sigma=0.7)'")
	if envelopes {
		fs.StringArrayVar(&s.spatial, "spatial", nil, "a spatial envelope term bounding |f|, e.g. 'exponential(amplitude=1, rate=2)' (repeatable)")
		fs.StringArrayVar(&s.spectral, "spectral", nil, "a spectral envelope term bounding |F| (angular convention), e.g. 'compact(width=6.3)' (repeatable)")
	}
}

// subject returns either a family or envelopes, and the dimension.
func (s *subjectFlags) subject() (*pb.Family, *pb.Envelopes, int, error) {
	hasEnv := len(s.spatial)+len(s.spectral) > 0
	switch {
	case s.family != "" && hasEnv:
		return nil, nil, 0, errors.New("give --family or envelopes (--spatial, --spectral), not both")
	case s.family != "":
		f, err := parseFamily(s.family)
		if err != nil {
			return nil, nil, 0, err
		}
		return f, nil, dimOf(f), nil
	case hasEnv:
		sp, err := parseEnvelope(s.spatial)
		if err != nil {
			return nil, nil, 0, err
		}
		sc, err := parseEnvelope(s.spectral)
		if err != nil {
			return nil, nil, 0, err
		}
		return nil, &pb.Envelopes{Spatial: sp, Spectral: sc}, 1, nil
	}
	return nil, nil, 0, errors.New("--family (or --spatial/--spectral envelopes, or --request) is required")
}

// perAxis broadcasts a flag list to dim entries (empty stays empty).
func perAxis(name string, vs []float64, dim int) ([]float64, error) {
	switch len(vs) {
	case 0:
		return nil, nil
	case dim:
		return vs, nil
	case 1:
		out := make([]float64, dim)
		for i := range out {
			out[i] = vs[0]
		}
		return out, nil
	}
	return nil, fmt.Errorf("--%s has %d values for a %d-dimensional function", name, len(vs), dim)
}
