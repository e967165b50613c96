package client

import (
	"context"
	"errors"
	"fmt"
	"io"
	"time"

	"google.golang.org/genproto/googleapis/rpc/errdetails"
	"google.golang.org/grpc"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/proto"

	pb "foldbound/api/foldbound/v1"
)

// Item wraps a request as a Batch item with the given id. req must be an
// *AliasSumRequest, *ErrorBudgetRequest, *PlanGridRequest,
// *PlanScanRequest, *LatticeAliasSumRequest, *CompareLatticesRequest or
// *PlanKernelRequest; Item panics
// on any other type (a programming error).
func Item(id string, req proto.Message) *pb.BatchRequest {
	b := &pb.BatchRequest{Id: id}
	switch r := req.(type) {
	case *pb.AliasSumRequest:
		b.Request = &pb.BatchRequest_AliasSum{AliasSum: r}
	case *pb.ErrorBudgetRequest:
		b.Request = &pb.BatchRequest_ErrorBudget{ErrorBudget: r}
	case *pb.PlanGridRequest:
		b.Request = &pb.BatchRequest_PlanGrid{PlanGrid: r}
	case *pb.PlanScanRequest:
		b.Request = &pb.BatchRequest_PlanScan{PlanScan: r}
	case *pb.LatticeAliasSumRequest:
		b.Request = &pb.BatchRequest_LatticeAliasSum{LatticeAliasSum: r}
	case *pb.CompareLatticesRequest:
		b.Request = &pb.BatchRequest_CompareLattices{CompareLattices: r}
	case *pb.PlanKernelRequest:
		b.Request = &pb.BatchRequest_PlanKernel{PlanKernel: r}
	default:
		panic(fmt.Sprintf("client.Item: %T is not a SamplingService request", req))
	}
	return b
}

// ItemErr returns the error carried by a Batch response as a gRPC status
// error (with its field violations as a BadRequest detail), or nil.
func ItemErr(r *pb.BatchResponse) error {
	e := r.GetError()
	if e == nil {
		return nil
	}
	st := status.New(codes.Code(e.GetCode()), e.GetMessage())
	if len(e.GetFieldViolations()) > 0 {
		br := &errdetails.BadRequest{}
		for _, v := range e.GetFieldViolations() {
			br.FieldViolations = append(br.FieldViolations, &errdetails.BadRequest_FieldViolation{Field: v.GetField(), Description: v.GetDescription()})
		}
		if d, err := st.WithDetails(br); err == nil {
			st = d
		}
	}
	return st.Err()
}

// BatchOption configures one Batch call.
type BatchOption func(*batchOptions)

type batchOptions struct {
	progress func(done, total int)
}

// WithProgress calls f after each newly answered item with the number of
// items answered so far. f runs on the receiving goroutine: keep it short.
func WithProgress(f func(done, total int)) BatchOption {
	return func(o *batchOptions) { o.progress = f }
}

// Batch sends items over the Batch stream and returns the responses in
// the order of items. Ids must be non-empty and unique. Per-item errors
// are in the responses (see ItemErr); Batch itself fails only when the
// stream cannot be completed.
//
// When a stream breaks (UNAVAILABLE: server restart, dropped connection)
// or ends early (the server's per-stream item cap), Batch opens a new
// stream, waiting for the connection to come back, and resends only the
// items not yet answered. Each item is returned exactly once: a response
// for an id already answered is dropped. It gives up after
// WithMaxStalls consecutive streams that answer nothing, or when ctx
// ends; the responses received so far are returned with the error (nil
// entries are unanswered).
func (c *Client) Batch(ctx context.Context, items []*pb.BatchRequest, opts ...BatchOption) ([]*pb.BatchResponse, error) {
	var bo batchOptions
	for _, opt := range opts {
		opt(&bo)
	}
	index := make(map[string]int, len(items))
	for i, it := range items {
		id := it.GetId()
		if id == "" {
			return nil, fmt.Errorf("client: batch item %d: empty id", i)
		}
		if j, dup := index[id]; dup {
			return nil, fmt.Errorf("client: batch items %d and %d: duplicate id %q", j, i, id)
		}
		index[id] = i
	}
	ctx, cancel := withDeadline(ctx, c.o.batchTimeout)
	defer cancel()

	b := &batchRun{items: items, index: index, results: make([]*pb.BatchResponse, len(items)), progress: bo.progress}
	stalls := 0
	for b.done < len(items) {
		got, err := b.stream(ctx, c.rpc)
		if b.done == len(items) {
			break
		}
		if err == nil {
			err = fmt.Errorf("stream ended with %d items unanswered", len(items)-b.done)
		}
		if got > 0 {
			stalls = 0
		} else {
			stalls++
		}
		if !resumable(err, got) || stalls > c.o.maxStalls || ctx.Err() != nil {
			return b.results, fmt.Errorf("client: batch: %d of %d items unanswered: %w", len(items)-b.done, len(items), err)
		}
		if stalls > 0 {
			wait := min(c.o.resumeBackoff<<min(stalls-1, 6), 2*time.Second)
			t := time.NewTimer(wait)
			select {
			case <-t.C:
			case <-ctx.Done():
				t.Stop()
			}
		}
	}
	return b.results, nil
}

// resumable reports whether a broken stream is worth resuming: the
// connection failed, or the server ended the stream at its item cap after
// answering some items.
func resumable(err error, got int) bool {
	switch status.Code(err) {
	case codes.Unavailable:
		return true
	case codes.ResourceExhausted, codes.Unknown:
		return got > 0
	}
	return false
}

// batchRun is the state of one Batch call across its streams. It is used
// by one goroutine at a time (the receiving one).
type batchRun struct {
	items    []*pb.BatchRequest
	index    map[string]int
	results  []*pb.BatchResponse
	done     int
	progress func(done, total int)
}

// stream runs one stream carrying every unanswered item and returns how
// many items it answered and the error that ended it (nil for a clean
// end).
func (b *batchRun) stream(ctx context.Context, rpc pb.SamplingServiceClient) (got int, err error) {
	order := make([]int, 0, len(b.items)-b.done)
	for i, r := range b.results {
		if r == nil {
			order = append(order, i)
		}
	}
	sctx, cancel := context.WithCancel(ctx)
	defer cancel()
	st, err := rpc.Batch(sctx, grpc.WaitForReady(true))
	if err != nil {
		return 0, err
	}
	sent := make(chan struct{})
	go func() {
		defer close(sent)
		for _, i := range order {
			if st.Send(b.items[i]) != nil {
				return // the stream broke; Recv reports why
			}
		}
		_ = st.CloseSend()
	}()
	defer func() {
		cancel()
		<-sent
	}()
	for {
		r, err := st.Recv()
		if errors.Is(err, io.EOF) {
			return got, nil
		}
		if err != nil {
			return got, err
		}
		i, ok := b.index[r.GetId()]
		if !ok || b.results[i] != nil {
			continue // unknown or already answered: never returned twice
		}
		b.results[i] = r
		b.done++
		got++
		if b.progress != nil {
			b.progress(b.done, len(b.items))
		}
	}
}
