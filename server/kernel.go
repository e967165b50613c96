package server

import (
	"context"
	"fmt"

	pb "foldbound/api/foldbound/v1"
	"foldbound/bounds/gridding"
)

// This file holds the gridding-kernel call: its field rules, conversion
// and handler.

// Limits of the verification run of PlanKernel: the direct non-uniform
// DFT costs modes × points terms.
const (
	maxVerifyPoints = 4096
	maxVerifyModes  = 1 << 16
)

// checkPlanKernel validates a PlanKernelRequest.
func (lim Limits) checkPlanKernel(r *pb.PlanKernelRequest) error {
	c := &checker{lim: lim}
	c.unknownFields("", r.ProtoReflect())
	if n := r.GetModes(); n < 1 {
		c.bad("modes", "must be at least 1, got %d", n)
	} else if n > gridding.MaxModes {
		c.limit("modes", "%d modes exceed the limit of 2^40 per axis", n)
	}
	if d := r.GetDim(); d < 0 || d > gridding.MaxDim {
		c.bad("dim", "must be between 1 and %d (0 means 1), got %d", gridding.MaxDim, d)
	}
	if tol := r.GetTol(); !finite(tol) || tol <= 0 || tol >= 1 {
		c.bad("tol", "must be finite, > 0 and < 1, got %g (a JSON literal below 2.2e-308, such as 1e-400, arrives as 0)", tol)
	}
	if _, ok := pb.KernelShape_name[int32(r.GetShape())]; !ok {
		c.bad("shape", "unknown kernel shape %d", r.GetShape())
	}
	if n := len(r.GetOversampling()); n > gridding.MaxCandidates {
		c.bad("oversampling", "at most %d candidate ratios, got %d", gridding.MaxCandidates, n)
	}
	for i, s := range r.GetOversampling() {
		if !finite(s) || s <= 1 || s > gridding.MaxOversampling {
			c.bad(fmt.Sprintf("oversampling[%d]", i), "must be > 1 and ≤ %g, got %g", gridding.MaxOversampling, s)
		}
	}
	c.nonNegative("points", r.GetPoints())
	c.nonNegative("spread_cost", r.GetSpreadCost())
	c.nonNegative("fft_cost", r.GetFftCost())
	if v := r.GetVerifyPoints(); v < 0 || v > maxVerifyPoints {
		c.bad("verify_points", "must be between 0 and %d, got %d", maxVerifyPoints, v)
	} else if v > 0 && r.GetModes() > maxVerifyModes {
		c.limit("verify_points", "verification sums the non-uniform DFT directly and needs modes ≤ %d, got %d", maxVerifyModes, r.GetModes())
	}
	return c.err()
}

// planKernel answers a PlanKernelRequest.
func (s *service) planKernel(ctx context.Context, req *pb.PlanKernelRequest) (*pb.PlanKernelResponse, error) {
	if err := s.lim.checkPlanKernel(req); err != nil {
		return nil, err
	}
	shape := gridding.KaiserBessel
	if req.GetShape() == pb.KernelShape_KERNEL_SHAPE_GAUSSIAN {
		shape = gridding.Gaussian
	}
	greq := gridding.Request{
		Modes: int(req.GetModes()), Dim: int(req.GetDim()), Tolerance: req.GetTol(), Kernel: shape,
		Points: req.GetPoints(), Cost: gridding.CostModel{Spread: req.GetSpreadCost(), FFT: req.GetFftCost()},
		AnyGridSize: req.GetAnyGridSize(),
	}
	if len(req.GetOversampling()) > 0 {
		greq.Oversampling = req.GetOversampling()
	}
	res, err := gridding.Plan(ctx, greq)
	if err != nil {
		return nil, kernelPaths(err)
	}
	out := &pb.PlanKernelResponse{Notes: res.Notes, Convention: res.Convention}
	for _, o := range res.Options {
		out.Options = append(out.Options, wireKernelOption(o))
	}
	if v := req.GetVerifyPoints(); v > 0 {
		ch, err := gridding.Verify(ctx, res.Best.Setup, int(v), req.GetVerifySeed())
		if err != nil {
			return nil, kernelPaths(err)
		}
		out.Verification = &pb.KernelCheck{Points: int64(ch.Points), Seed: ch.Seed, Observed: ch.Observed,
			ObservedMode: int64(ch.ObservedMode), Total: ch.Total}
	}
	return out, nil
}

func wireKernelOption(o gridding.Option) *pb.KernelOption {
	k := o.Setup.Kernel
	shape := pb.KernelShape_KERNEL_SHAPE_KAISER_BESSEL
	if k.Type == gridding.Gaussian {
		shape = pb.KernelShape_KERNEL_SHAPE_GAUSSIAN
	}
	b := o.Bound
	return &pb.KernelOption{
		Oversampling: o.Oversampling, Modes: int64(o.Setup.Modes), Grid: int64(o.Setup.Grid),
		Kernel: &pb.GriddingKernel{Shape: shape, Width: int32(k.Width), Beta: k.Beta},
		Tau:    o.Tau, PublishedBeta: o.Published,
		Bound: &pb.KernelErrorBound{PerAxis: b.PerAxis, Aliasing: b.Aliasing, Truncation: b.Truncation, Total: b.Total,
			Attained: b.Attained, WorstMode: b.WorstMode, Pieces: int32(b.Pieces)},
		Rounding: o.Rounding, Total: o.Total, SpreadCost: o.SpreadCost, FftCost: o.FFTCost, Cost: o.Cost,
	}
}

// kernelPaths renames the engine's "plan.tolerance", "kernel.oversampling[1]"
// and the like to the request's field names.
func kernelPaths(err error) error {
	for _, r := range [][2]string{{"plan.tolerance", "tol"}, {"plan.modes", "modes"}, {"plan.dim", "dim"},
		{"plan.points", "points"}, {"kernel.oversampling", "oversampling"}, {"kernel.type", "shape"},
		{"cost.spread", "spread_cost"}, {"cost.fft", "fft_cost"}} {
		err = renameParam(err, r[0], r[1])
	}
	return err
}
