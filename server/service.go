package server

import (
	"context"

	"github.com/rs/zerolog"

	pb "foldbound/api/foldbound/v1"
	"foldbound/bounds"
	"foldbound/bounds/scan"
)

// service implements foldbound.v1.SamplingService. It is stateless: the
// limits and the logger are fixed at construction.
type service struct {
	pb.UnimplementedSamplingServiceServer
	lim Limits
	log zerolog.Logger
}

var _ pb.SamplingServiceServer = (*service)(nil)

// AliasSum implements SamplingService.AliasSum.
func (s *service) AliasSum(ctx context.Context, req *pb.AliasSumRequest) (*pb.AliasSumResponse, error) {
	res, err := s.aliasSum(ctx, req)
	if err != nil {
		return nil, toStatus(err).Err()
	}
	return res, nil
}

// ErrorBudget implements SamplingService.ErrorBudget.
func (s *service) ErrorBudget(ctx context.Context, req *pb.ErrorBudgetRequest) (*pb.ErrorBudgetResponse, error) {
	res, err := s.errorBudget(ctx, req)
	if err != nil {
		return nil, toStatus(err).Err()
	}
	return res, nil
}

// PlanGrid implements SamplingService.PlanGrid.
func (s *service) PlanGrid(ctx context.Context, req *pb.PlanGridRequest) (*pb.PlanGridResponse, error) {
	res, err := s.planGrid(ctx, req)
	if err != nil {
		return nil, toStatus(err).Err()
	}
	return res, nil
}

// PlanScan implements SamplingService.PlanScan.
func (s *service) PlanScan(ctx context.Context, req *pb.PlanScanRequest) (*pb.PlanScanResponse, error) {
	res, err := s.planScan(ctx, req)
	if err != nil {
		return nil, toStatus(err).Err()
	}
	return res, nil
}

// LatticeAliasSum implements SamplingService.LatticeAliasSum.
func (s *service) LatticeAliasSum(ctx context.Context, req *pb.LatticeAliasSumRequest) (*pb.LatticeAliasSumResponse, error) {
	res, err := s.latticeAliasSum(ctx, req)
	if err != nil {
		return nil, toStatus(err).Err()
	}
	return res, nil
}

// CompareLattices implements SamplingService.CompareLattices.
func (s *service) CompareLattices(ctx context.Context, req *pb.CompareLatticesRequest) (*pb.CompareLatticesResponse, error) {
	res, err := s.compareLattices(ctx, req)
	if err != nil {
		return nil, toStatus(err).Err()
	}
	return res, nil
}

// PlanKernel implements SamplingService.PlanKernel.
func (s *service) PlanKernel(ctx context.Context, req *pb.PlanKernelRequest) (*pb.PlanKernelResponse, error) {
	res, err := s.planKernel(ctx, req)
	if err != nil {
		return nil, toStatus(err).Err()
	}
	return res, nil
}

// aliasSum answers an AliasSumRequest; errors are mapped by the caller.
func (s *service) aliasSum(ctx context.Context, req *pb.AliasSumRequest) (*pb.AliasSumResponse, error) {
	dim, err := s.lim.checkAliasSum(req)
	if err != nil {
		return nil, err
	}
	conv := engineConvention(req.GetConvention())
	set := s.lim.engineSettings(req.GetSettings())
	xi := make([]float64, dim)
	for i, v := range req.GetXi() {
		xi[i] = angular(conv, v)
	}
	var (
		r    bounds.SampledSum
		name string
	)
	if kind := req.GetFamily().GetKind(); dim == 1 && !isND(kind) {
		f, err := rootFamily1D("family", req.GetFamily())
		if err != nil {
			return nil, err
		}
		if r, err = bounds.AliasSum(ctx, f, engineGrid(req.GetGrids()[0]), xi[0], set); err != nil {
			return nil, wirePaths(err)
		}
		name = f.String()
	} else {
		f, err := familyND("family", req.GetFamily(), dim)
		if err != nil {
			return nil, err
		}
		grids := make([]bounds.Grid, dim)
		for i, g := range req.GetGrids() {
			grids[i] = engineGrid(g)
		}
		if r, err = bounds.AliasSumND(ctx, f, grids, xi, set); err != nil {
			return nil, wirePathsND(err)
		}
		name = f.String()
	}
	out := newOutputs(conv, dim)
	res := out.sampledSum(r)
	res.Method = out.method(r.Method, set.MaxTerms)
	res.Convention = wireConvention(conv)
	res.Family = name
	res.XiAngular = xi
	return res, nil
}

// isND reports whether a family kind is n-dimensional by nature.
func isND(k any) bool {
	switch k.(type) {
	case *pb.Family_Separable, *pb.Family_RadialGaussian:
		return true
	}
	return false
}

// errorBudget answers an ErrorBudgetRequest.
func (s *service) errorBudget(ctx context.Context, req *pb.ErrorBudgetRequest) (*pb.ErrorBudgetResponse, error) {
	dim, err := s.lim.checkErrorBudget(req)
	if err != nil {
		return nil, err
	}
	conv := engineConvention(req.GetConvention())
	opt := bounds.BudgetOptions{AnyShift: req.GetWorstCaseShift(), SampleUlps: req.GetSampleUlps(), Settings: s.lim.engineSettings(req.GetSettings())}
	if dim != 1 || isND(req.GetFamily().GetKind()) {
		return s.errorBudgetND(ctx, req, dim, conv, opt)
	}
	g := engineGrid(req.GetGrids()[0])
	band := engineBand(conv, req.GetFrequency(), 0)
	var (
		b       bounds.Budget
		subject string
	)
	switch {
	case req.GetFamily() != nil:
		f, err := rootFamily1D("family", req.GetFamily())
		if err != nil {
			return nil, err
		}
		if b, err = bounds.FamilyBudget(ctx, f, g, band, opt); err != nil {
			return nil, wirePaths(err)
		}
		subject = f.String()
	default:
		spatial, spectral := engineEnvelope(req.GetEnvelopes().GetSpatial()), engineEnvelope(req.GetEnvelopes().GetSpectral())
		if b, err = bounds.EnvelopeBudget(ctx, spatial, spectral, g, band, opt); err != nil {
			return nil, wirePaths(err)
		}
		subject = "spatial envelope " + spatial.String() + "; spectral envelope " + spectral.String()
	}
	out := newOutputs(conv, dim)
	return &pb.ErrorBudgetResponse{
		Budget:         out.budget(b),
		Convention:     wireConvention(conv),
		Subject:        subject,
		WorstCaseShift: req.GetWorstCaseShift(),
		Frequency:      &pb.Band{Center: req.GetFrequency().GetCenter(), HalfWidth: req.GetFrequency().GetHalfWidth()},
	}, nil
}

// planScan answers a PlanScanRequest. The engine's plan is closed-form and
// quick; it takes no context. The verification, when asked for, is a
// bounded computation that honours ctx.
func (s *service) planScan(ctx context.Context, req *pb.PlanScanRequest) (*pb.PlanScanResponse, error) {
	if err := s.lim.checkPlanScan(req); err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	r := scan.Request{Geometry: scan.ParallelBeam, Radius: req.GetRadius(), Bandwidth: req.GetBandwidth(),
		Resolution: req.GetResolution(), SourceRadius: req.GetSourceRadius(), ShortScan: req.GetShortScan()}
	if req.GetGeometry() == pb.ScanGeometry_SCAN_GEOMETRY_FAN_BEAM {
		r.Geometry = scan.FanBeam
	}
	res, err := scan.Plan(r)
	if err != nil {
		return nil, scanPaths(err)
	}
	out := &pb.PlanScanResponse{Plan: wireScanPlan(res), Convention: wireConvention(bounds.Angular)}
	if req.GetVerify() {
		v, err := scan.Verify(ctx, res, scan.VerifyOptions{Size: int(req.GetVerifyImageSize())})
		if err != nil {
			return nil, scanPaths(err)
		}
		out.Verification = wireScanVerification(v)
	}
	return out, nil
}
