package server

import (
	"context"
	"errors"
	"fmt"
	"io"
	"runtime/debug"
	"sync"

	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"

	pb "foldbound/api/foldbound/v1"
)

// maxIDBytes is the longest Batch item id accepted.
const maxIDBytes = 128

// Batch implements SamplingService.Batch. One goroutine receives items,
// StreamWorkers goroutines answer them, and the handler's goroutine sends
// the answers as they complete (in any order). When the client half-closes
// the stream, every item received is answered before the stream ends;
// after MaxStreamItems items the stream ends with RESOURCE_EXHAUSTED once
// the items before the cap are answered.
func (s *service) Batch(stream pb.SamplingService_BatchServer) error {
	ctx, cancel := context.WithCancel(stream.Context())
	defer cancel()

	items := make(chan *pb.BatchRequest)
	out := make(chan *pb.BatchResponse, s.lim.StreamWorkers)
	recvDone := make(chan error, 1) // the receiver's outcome

	go func() {
		defer close(items)
		recvDone <- s.receive(ctx, stream, items)
	}()

	var wg sync.WaitGroup
	for range s.lim.StreamWorkers {
		wg.Go(func() {
			for req := range items {
				resp := s.answer(ctx, req)
				select {
				case out <- resp:
				case <-ctx.Done():
					return
				}
			}
		})
	}
	go func() {
		wg.Wait()
		close(out)
	}()

	var sendErr error
	for resp := range out {
		if sendErr != nil {
			continue // drain so that the workers can finish
		}
		if err := stream.Send(resp); err != nil {
			sendErr = err
			cancel()
		}
	}
	if sendErr != nil {
		return sendErr
	}
	select {
	case err := <-recvDone:
		return err
	case <-ctx.Done():
		return status.FromContextError(ctx.Err()).Err()
	}
}

// receive passes the stream's items to the workers until the client
// half-closes (nil), the stream fails, or the item cap is passed.
func (s *service) receive(ctx context.Context, stream pb.SamplingService_BatchServer, items chan<- *pb.BatchRequest) error {
	var n int64
	for {
		req, err := stream.Recv()
		if errors.Is(err, io.EOF) {
			return nil
		}
		if err != nil {
			return err
		}
		if n++; n > s.lim.MaxStreamItems {
			return status.Errorf(codes.ResourceExhausted, "stream carries more than %d items, this server's limit per stream; resend the rest on a new stream", s.lim.MaxStreamItems)
		}
		select {
		case items <- req:
		case <-ctx.Done():
			return status.FromContextError(ctx.Err()).Err()
		}
	}
}

// answer computes one Batch item. Errors, panics included, become the
// item's error; the stream goes on.
func (s *service) answer(ctx context.Context, req *pb.BatchRequest) (resp *pb.BatchResponse) {
	resp = &pb.BatchResponse{Id: req.GetId()}
	defer func() {
		if r := recover(); r != nil {
			s.log.Error().Str("method", "/foldbound.v1.SamplingService/Batch").Str("item_id", req.GetId()).
				Str("panic", fmt.Sprint(r)).Bytes("stack", debug.Stack()).Msg("panic in batch item")
			resp.Result = &pb.BatchResponse_Error{Error: itemError(status.New(codes.Internal, "internal error: panic while answering the item"))}
		}
	}()
	ctx, cancel := context.WithTimeout(ctx, s.lim.MaxCallDuration)
	defer cancel()

	var err error
	switch {
	case len(req.GetId()) == 0 || len(req.GetId()) > maxIDBytes:
		err = &requestError{code: codes.InvalidArgument, violations: []violation{{"id", fmt.Sprintf("must be 1 to %d bytes, got %d", maxIDBytes, len(req.GetId()))}}}
	default:
		switch r := req.GetRequest().(type) {
		case *pb.BatchRequest_AliasSum:
			var res *pb.AliasSumResponse
			if res, err = s.aliasSum(ctx, r.AliasSum); err == nil {
				resp.Result = &pb.BatchResponse_AliasSum{AliasSum: res}
			}
		case *pb.BatchRequest_ErrorBudget:
			var res *pb.ErrorBudgetResponse
			if res, err = s.errorBudget(ctx, r.ErrorBudget); err == nil {
				resp.Result = &pb.BatchResponse_ErrorBudget{ErrorBudget: res}
			}
		case *pb.BatchRequest_PlanGrid:
			var res *pb.PlanGridResponse
			if res, err = s.planGrid(ctx, r.PlanGrid); err == nil {
				resp.Result = &pb.BatchResponse_PlanGrid{PlanGrid: res}
			}
		case *pb.BatchRequest_PlanScan:
			var res *pb.PlanScanResponse
			if res, err = s.planScan(ctx, r.PlanScan); err == nil {
				resp.Result = &pb.BatchResponse_PlanScan{PlanScan: res}
			}
		case *pb.BatchRequest_LatticeAliasSum:
			var res *pb.LatticeAliasSumResponse
			if res, err = s.latticeAliasSum(ctx, r.LatticeAliasSum); err == nil {
				resp.Result = &pb.BatchResponse_LatticeAliasSum{LatticeAliasSum: res}
			}
		case *pb.BatchRequest_CompareLattices:
			var res *pb.CompareLatticesResponse
			if res, err = s.compareLattices(ctx, r.CompareLattices); err == nil {
				resp.Result = &pb.BatchResponse_CompareLattices{CompareLattices: res}
			}
		case *pb.BatchRequest_PlanKernel:
			var res *pb.PlanKernelResponse
			if res, err = s.planKernel(ctx, r.PlanKernel); err == nil {
				resp.Result = &pb.BatchResponse_PlanKernel{PlanKernel: res}
			}
		default:
			if len(req.ProtoReflect().GetUnknown()) > 0 {
				err = &unimplementedError{field: "request", what: "request kind not known to this server (is the client newer?)"}
			} else {
				err = &requestError{code: codes.InvalidArgument, violations: []violation{{"request", "one of alias_sum, error_budget, plan_grid, plan_scan, lattice_alias_sum, compare_lattices or plan_kernel is required"}}}
			}
		}
	}
	if err != nil {
		resp.Result = &pb.BatchResponse_Error{Error: itemError(toStatus(err))}
	}
	return resp
}
