package server

import (
	"context"
	"errors"
	"fmt"
	"strings"

	pb "foldbound/api/foldbound/v1"
	"foldbound/bounds"
)

// planGrid answers a PlanGridRequest: one-dimensional families and
// envelopes with bounds.PlanGrid, n-dimensional separable families with
// bounds.PlanGridND, axis by axis.
func (s *service) planGrid(ctx context.Context, req *pb.PlanGridRequest) (*pb.PlanGridResponse, error) {
	dim, err := s.lim.checkPlanGrid(req)
	if err != nil {
		return nil, err
	}
	conv := engineConvention(req.GetConvention())
	out := newOutputs(conv, dim)
	// The tolerance is in the units of the request's convention; the
	// engine's results are angular, larger by 1/scale.
	tol := bounds.Point(req.GetTol()).Div(out.scale).Lo
	maxCount := req.GetMaxSamples()
	if maxCount == 0 || maxCount > s.lim.MaxCount {
		maxCount = s.lim.MaxCount
	}
	maxTerms := s.lim.engineSettings(req.GetSettings()).MaxTerms
	axes := make([]bounds.AxisRequest, dim)
	for j := range axes {
		a := bounds.AxisRequest{Band: engineBand(conv, req.GetFrequency(), j)}
		if d := req.GetFrequencySpacing(); len(d) > j {
			a.Resolution = conv.ToAngular(d[j]).Lo
		}
		if sh := req.GetShift(); len(sh) > j {
			a.FixedShift, a.Shift = true, sh[j]
		}
		axes[j] = a
	}
	var subject string
	switch {
	case req.GetEnvelopes() != nil:
		axes[0].Spatial = engineEnvelope(req.GetEnvelopes().GetSpatial())
		axes[0].Spectral = engineEnvelope(req.GetEnvelopes().GetSpectral())
		subject = "spatial envelope " + axes[0].Spatial.String() + "; spectral envelope " + axes[0].Spectral.String()
	case dim == 1 && !isND(req.GetFamily().GetKind()):
		f, err := rootFamily1D("family", req.GetFamily())
		if err != nil {
			return nil, err
		}
		axes[0].Family, subject = f, f.String()
	default:
		factors, name, err := separableFactors(req.GetFamily(), dim, "plans")
		if err != nil {
			return nil, err
		}
		for j, g := range factors {
			axes[j].Family = g
		}
		subject = name
	}
	cost := engineCost(req.GetCost())
	res := &pb.PlanGridResponse{
		Convention:     wireConvention(conv),
		Subject:        subject,
		WorstCaseShift: len(req.GetShift()) == 0,
	}
	var budget bounds.Budget
	if dim == 1 {
		a := axes[0]
		p, err := bounds.PlanGrid(ctx, bounds.PlanRequest{Family: a.Family, Spatial: a.Spatial, Spectral: a.Spectral,
			Tol: tol, Band: a.Band, Resolution: a.Resolution, FixedShift: a.FixedShift, Shift: a.Shift,
			Cost: cost, SampleUlps: req.GetSampleUlps(), MaxCount: maxCount, MaxTerms: maxTerms})
		if err != nil {
			return nil, planPaths(err)
		}
		res.Axes = []*pb.PlannedAxis{wirePlannedAxis(p)}
		res.TotalSamples, res.Cost, budget = p.Grid.Count, p.Cost, p.Budget
	} else {
		p, err := bounds.PlanGridND(ctx, bounds.PlanNDRequest{Axes: axes, Tol: tol, Cost: cost,
			SampleUlps: req.GetSampleUlps(), MaxCount: maxCount, MaxTerms: maxTerms})
		if err != nil {
			return nil, planPaths(err)
		}
		for _, a := range p.Axes {
			res.Axes = append(res.Axes, wirePlannedAxis(a))
		}
		res.TotalSamples, res.Cost, budget = p.Count, p.Cost, p.Budget
	}
	wb := out.budget(budget)
	res.Budget = wb
	method := "envelope bounds"
	if budget.Exact {
		method = "exact alias and truncation enclosures"
	}
	if res.WorstCaseShift {
		method += ", worst case over every shift within half a step"
	} else {
		method += ", at the requested shift"
	}
	if dim > 1 {
		method += fmt.Sprintf(", composed over %d axes", dim)
	}
	res.Verification = &pb.Verification{Verified: wb.GetTotal() <= req.GetTol(), Budget: wb,
		Method: "re-evaluated in outward-rounded interval arithmetic: " + method}
	if !finiteResult(wb.GetTotal(), res.Cost) {
		return nil, fmt.Errorf("server: plan: %w", bounds.ErrNotFinite)
	}
	return res, nil
}

// engineCost converts a validated cost model.
func engineCost(c *pb.CostModel) bounds.CostModel {
	m := bounds.CostModel{PerSample: c.GetPerSample(), PerTransform: c.GetPerTransform()}
	if c.GetSizes() == pb.SizeRule_SIZE_RULE_FFT_FRIENDLY {
		m.Sizes = bounds.SmoothSizes
	}
	return m
}

func wirePlannedAxis(p bounds.Plan) *pb.PlannedAxis {
	return &pb.PlannedAxis{
		Grid:   &pb.Grid{Step: p.Grid.Step, Shift: p.Grid.Shift, Count: p.Grid.Count},
		Window: &pb.Interval{Lo: p.Window.Lo, Hi: p.Window.Hi},
	}
}

// planPaths renames the parameter paths of the planner's errors ("tol",
// "band.center", "axes[1].resolution", "spatial[0].power",
// "max_count", a family path) to the request's field paths.
func planPaths(err error) error {
	var pe *bounds.ParamError
	if !errors.As(err, &pe) {
		return err
	}
	p, axis := pe.Param, 0
	if rest, ok := strings.CutPrefix(p, "axes["); ok {
		if i := strings.Index(rest, "]."); i > 0 {
			fmt.Sscanf(rest[:i], "%d", &axis)
			p = rest[i+2:]
		}
	}
	head, tail, _ := strings.Cut(p, ".")
	name, _, _ := strings.Cut(head, "[")
	switch name {
	case "tol", "cost", "sample_ulps":
	case "max_count":
		p = "max_samples"
	case "max_terms":
		p = "settings.max_terms"
	case "band":
		p = fmt.Sprintf("frequency.%s[%d]", tail, axis)
	case "resolution":
		p = fmt.Sprintf("frequency_spacing[%d]", axis)
	case "shift":
		p = fmt.Sprintf("shift[%d]", axis)
	case "spatial", "spectral":
		p = "envelopes." + p
	case "family":
		p = "family"
	default:
		p = "family." + wireFamilyPath(p)
		if strings.HasPrefix(pe.Param, "axes[") {
			p = fmt.Sprintf("family.separable.factors[%d].%s", axis, wireFamilyPath(strings.SplitN(pe.Param, ".", 2)[1]))
		}
	}
	return &bounds.ParamError{Param: p, Reason: pe.Reason, Err: pe.Err}
}
