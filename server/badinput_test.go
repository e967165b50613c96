package server_test

import (
	"context"
	"math"
	"strings"
	"testing"

	"google.golang.org/genproto/googleapis/rpc/errdetails"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/encoding/protojson"
	"google.golang.org/protobuf/encoding/protowire"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
	"foldbound/server"
)

// TestBadInput sends requests that break the contract and checks the
// documented code, that the message names the field, that the field is in
// the BadRequest detail, and that the server keeps serving.
func TestBadInput(t *testing.T) {
	const maxMsg = 64 << 10
	addr, _ := startServer(t, server.Config{Limits: server.Limits{MaxRecvMsgBytes: maxMsg}})
	c := newClient(t, addr)
	addrDefault, _ := startServer(t, server.Config{}) // default 4 MiB messages
	cDefault := newClient(t, addrDefault)
	ctx := context.Background()

	g1 := []*pb.Grid{client.Grid(1, 0, 0)}
	alias := func(f *pb.Family, grids []*pb.Grid) func() error {
		return func() error {
			_, err := c.AliasSum(ctx, &pb.AliasSumRequest{Family: f, Grids: grids})
			return err
		}
	}
	aliasReq := func(r *pb.AliasSumRequest) func() error {
		return func() error { _, err := c.AliasSum(ctx, r); return err }
	}
	plan := func(r *pb.PlanGridRequest) func() error {
		return func() error { _, err := c.PlanGrid(ctx, r); return err }
	}
	planJSON := func(js string) func() error {
		return func() error {
			var r pb.PlanGridRequest
			if err := protojson.Unmarshal([]byte(js), &r); err != nil {
				t.Fatalf("protojson: %v", err)
			}
			_, err := c.PlanGrid(ctx, &r)
			return err
		}
	}
	gauss := &pb.PlanGridRequest_Family{Family: client.Gaussian(1)}

	// A family whose kind is a field number this server does not know, as
	// a newer client would send it.
	unknown := &pb.Family{}
	raw := protowire.AppendTag(nil, 99, protowire.BytesType)
	raw = protowire.AppendBytes(raw, []byte{0x09, 0, 0, 0, 0, 0, 0, 0xf0, 0x3f})
	unknown.ProtoReflect().SetUnknown(raw)

	nested := client.Gaussian(1)
	for range 40 {
		nested = client.Shifted(nested, 0.1)
	}
	abysmal := client.Gaussian(1)
	for range 10001 {
		abysmal = client.Shifted(abysmal, 0.1)
	}
	manyTerms := func(n int) *pb.Family {
		fs := make([]*pb.Family, n)
		for i := range fs {
			fs[i] = client.Gaussian(1)
		}
		return client.Sum(fs...)
	}
	separable := func(n int) *pb.Family {
		fs := make([]*pb.Family, n)
		for i := range fs {
			fs[i] = client.Gaussian(1)
		}
		return client.Separable(fs...)
	}

	tests := []struct {
		name  string
		call  func() error
		code  codes.Code
		field string // named in the message and the BadRequest detail (for gRPC's own refusals: a phrase of its message)
	}{
		{"NaN width", alias(client.Gaussian(math.NaN()), g1), codes.InvalidArgument, "family.gaussian.sigma"},
		{"+Inf width", alias(client.Gaussian(math.Inf(1)), g1), codes.InvalidArgument, "family.gaussian.sigma"},
		{"zero width", alias(client.Lorentzian(0), g1), codes.InvalidArgument, "family.lorentzian.a"},
		{"negative width", alias(client.Sech(-2), g1), codes.InvalidArgument, "family.sech.w"},
		{"NaN step", alias(client.Gaussian(1), []*pb.Grid{client.Grid(math.NaN(), 0, 0)}), codes.InvalidArgument, "grids[0].step"},
		{"+Inf step", alias(client.Gaussian(1), []*pb.Grid{client.Grid(math.Inf(1), 0, 0)}), codes.InvalidArgument, "grids[0].step"},
		{"zero step", alias(client.Gaussian(1), []*pb.Grid{client.Grid(0, 0, 0)}), codes.InvalidArgument, "grids[0].step"},
		{"negative step", alias(client.Gaussian(1), []*pb.Grid{client.Grid(-0.5, 0, 0)}), codes.InvalidArgument, "grids[0].step"},
		{"+Inf shift", alias(client.Gaussian(1), []*pb.Grid{client.Grid(1, math.Inf(1), 0)}), codes.InvalidArgument, "grids[0].shift"},
		{"NaN frequency", aliasReq(&pb.AliasSumRequest{Family: client.Gaussian(1), Grids: g1, Xi: []float64{math.NaN()}}), codes.InvalidArgument, "xi[0]"},
		{"NaN settings tol", aliasReq(&pb.AliasSumRequest{Family: client.Gaussian(1), Grids: g1, Settings: &pb.Settings{Tol: math.NaN()}}), codes.InvalidArgument, "settings.tol"},
		{"empty family oneof", alias(&pb.Family{}, g1), codes.InvalidArgument, "family"},
		{"missing family", alias(nil, g1), codes.InvalidArgument, "family"},
		{"empty subject oneof", func() error {
			_, err := c.ErrorBudget(ctx, &pb.ErrorBudgetRequest{Grids: g1})
			return err
		}, codes.InvalidArgument, "subject"},
		{"empty composition", alias(client.Shifted(nil, 1), g1), codes.InvalidArgument, "family.shift.of"},
		{"unknown family", alias(unknown, g1), codes.InvalidArgument, "family"},
		{"unknown convention", aliasReq(&pb.AliasSumRequest{Family: client.Gaussian(1), Grids: g1, Convention: 7}), codes.InvalidArgument, "convention"},
		{"dimension 0 (radial)", alias(client.RadialGaussian(0, 1), nil), codes.InvalidArgument, "family.radial_gaussian.dim"},
		{"dimension 65 (radial)", alias(client.RadialGaussian(65, 1), nil), codes.InvalidArgument, "family.radial_gaussian.dim"},
		{"dimension 0 (separable)", alias(separable(0), nil), codes.InvalidArgument, "family.separable.factors"},
		{"dimension 65 (separable)", alias(separable(65), nil), codes.InvalidArgument, "family.separable.factors"},
		{"grids do not match the dimension", alias(separable(2), g1), codes.InvalidArgument, "grids"},
		{"n-D family inside a composition", alias(client.Shifted(client.RadialGaussian(2, 1), 1), g1), codes.InvalidArgument, "family.shift.of.radial_gaussian"},
		{"sample count 1e15", alias(client.Gaussian(1), []*pb.Grid{client.Grid(1e-9, 0, 1e15)}), codes.ResourceExhausted, "grids[0].count"},
		{"negative sample count", alias(client.Gaussian(1), []*pb.Grid{client.Grid(1, 0, -3)}), codes.InvalidArgument, "grids[0].count"},
		{"B-spline order 9", alias(client.BSpline(9), g1), codes.InvalidArgument, "family.b_spline.order"},
		{"tolerance 0", plan(&pb.PlanGridRequest{Subject: gauss, Tol: 0}), codes.InvalidArgument, "tol"},
		// 1e-400 is below the float64 range: protojson reads it as 0, the
		// server sees 0 and says so.
		{"tolerance 1e-400 (JSON)", planJSON(`{"family": {"gaussian": {"sigma": 1}}, "tol": 1e-400}`), codes.InvalidArgument, "tol"},
		{"tolerance subnormal", plan(&pb.PlanGridRequest{Subject: gauss, Tol: 5e-324}), codes.InvalidArgument, "tol"},
		{"tolerance NaN", plan(&pb.PlanGridRequest{Subject: gauss, Tol: math.NaN()}), codes.InvalidArgument, "tol"},
		{"envelope without decay", func() error {
			_, err := c.ErrorBudget(ctx, &pb.ErrorBudgetRequest{Subject: &pb.ErrorBudgetRequest_Envelopes{Envelopes: &pb.Envelopes{
				Spatial: []*pb.EnvelopeTerm{{Amplitude: 1, Rate: 1}}}}, Grids: g1})
			return err
		}, codes.InvalidArgument, "envelopes.spatial[0].decay"},
		{"envelope negative rate", func() error {
			_, err := c.ErrorBudget(ctx, &pb.ErrorBudgetRequest{Subject: &pb.ErrorBudgetRequest_Envelopes{Envelopes: &pb.Envelopes{
				Spectral: []*pb.EnvelopeTerm{{Decay: pb.Decay_DECAY_EXPONENTIAL, Amplitude: 1, Rate: -1}}}}, Grids: g1})
			return err
		}, codes.InvalidArgument, "envelopes.spectral[0].rate"},
		{"family nested too deep", alias(nested, g1), codes.InvalidArgument, "family.shift.of"},
		{"family with too many nodes", alias(manyTerms(2000), g1), codes.InvalidArgument, "family.sum.terms[63]"},
		// The size limit applies before the message is decoded, so gRPC's
		// message names the limit, not a field.
		{"oversized message", alias(manyTerms(10000), g1), codes.ResourceExhausted, "larger than max"},
		// Protobuf refuses to decode nesting beyond 10000 levels, and gRPC
		// reports every decoding failure as INTERNAL, before the service
		// sees the request (documented in the README).
		{"nesting beyond the decoder's limit", func() error {
			_, err := cDefault.AliasSum(ctx, &pb.AliasSumRequest{Family: abysmal, Grids: g1})
			return err
		}, codes.Internal, "recursion depth"},
		{"work over max_terms", aliasReq(&pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(0.01, 0, 100001)},
			Settings: &pb.Settings{MaxTerms: 1000, Side: pb.Side_SIDE_SPATIAL}}), codes.ResourceExhausted, "settings.max_terms"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			err := tt.call()
			st := status.Convert(err)
			t.Logf("%v: %s", st.Code(), st.Message())
			if st.Code() != tt.code {
				t.Fatalf("code = %v, want %v (message %q)", st.Code(), tt.code, st.Message())
			}
			if strings.HasPrefix(st.Message(), "grpc: ") {
				if !strings.Contains(st.Message(), tt.field) {
					t.Errorf("gRPC's message %q lacks %q", st.Message(), tt.field)
				}
				return
			}
			if !strings.HasPrefix(st.Message(), tt.field) {
				t.Errorf("message %q does not start with the field %q", st.Message(), tt.field)
			}
			if !hasViolation(st, tt.field) {
				t.Errorf("no BadRequest violation for %q in %v", tt.field, st.Details())
			}
		})
	}

	// The server is still up and answers correctly.
	res, err := c.AliasSum(ctx, &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: g1})
	if err != nil {
		t.Fatalf("AliasSum after bad input: %v", err)
	}
	if got := mid(res.GetExact()); math.Abs(real(got)-sqrt2Pi) > 1e-15 {
		t.Errorf("exact = %v, want %v", got, sqrt2Pi)
	}
}

func hasViolation(st *status.Status, field string) bool {
	for _, d := range st.Details() {
		if br, ok := d.(*errdetails.BadRequest); ok {
			for _, v := range br.GetFieldViolations() {
				if strings.HasPrefix(v.GetField(), field) {
					return true
				}
			}
		}
	}
	return false
}

// TestBadBatchItems checks that bad items get their own errors while the
// stream goes on.
func TestBadBatchItems(t *testing.T) {
	addr, _ := startServer(t, server.Config{})
	c := newClient(t, addr)
	good := &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(1, 0, 0)}}
	items := []*pb.BatchRequest{
		client.Item("good-1", good),
		{Id: "empty-request"},
		client.Item("bad-step", &pb.AliasSumRequest{Family: client.Gaussian(1), Grids: []*pb.Grid{client.Grid(-1, 0, 0)}}),
		client.Item(strings.Repeat("x", 129), good),
		client.Item("good-2", good),
	}
	res, err := c.Batch(context.Background(), items)
	if err != nil {
		t.Fatalf("Batch: %v", err)
	}
	want := []struct {
		code  codes.Code
		field string
	}{{codes.OK, ""}, {codes.InvalidArgument, "request"}, {codes.InvalidArgument, "grids[0].step"}, {codes.InvalidArgument, "id"}, {codes.OK, ""}}
	for i, w := range want {
		st := status.Convert(client.ItemErr(res[i]))
		if st.Code() != w.code || !strings.HasPrefix(st.Message(), w.field) {
			t.Errorf("item %d: %v %q, want %v naming %q", i, st.Code(), st.Message(), w.code, w.field)
		}
	}
}
