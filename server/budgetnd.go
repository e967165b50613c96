package server

import (
	"context"
	"errors"
	"fmt"
	"strings"

	pb "foldbound/api/foldbound/v1"
	"foldbound/bounds"
)

// errorBudgetND answers an ErrorBudgetRequest for a separable family on a
// rectangular grid in dim dimensions (bounds.FamilyBudgetND).
func (s *service) errorBudgetND(ctx context.Context, req *pb.ErrorBudgetRequest, dim int, conv bounds.Convention, opt bounds.BudgetOptions) (*pb.ErrorBudgetResponse, error) {
	factors, name, err := separableFactors(req.GetFamily(), dim, "error budgets")
	if err != nil {
		return nil, err
	}
	axes := make([]bounds.BudgetAxis, dim)
	for j, g := range factors {
		axes[j] = bounds.BudgetAxis{Family: g, Grid: engineGrid(req.GetGrids()[j]), Band: engineBand(conv, req.GetFrequency(), j)}
	}
	b, err := bounds.FamilyBudgetND(ctx, axes, opt)
	if err != nil {
		return nil, axisPaths(err)
	}
	return &pb.ErrorBudgetResponse{
		Budget:         newOutputs(conv, dim).budget(b),
		Convention:     wireConvention(conv),
		Subject:        name,
		WorstCaseShift: req.GetWorstCaseShift(),
		Frequency:      &pb.Band{Center: req.GetFrequency().GetCenter(), HalfWidth: req.GetFrequency().GetHalfWidth()},
	}, nil
}

// axisPaths renames "axes[j].grid.step", "axes[j].band.center" and the
// family paths of axis j to the request's field paths.
func axisPaths(err error) error {
	var pe *bounds.ParamError
	if !errors.As(err, &pe) {
		return err
	}
	rest, ok := strings.CutPrefix(pe.Param, "axes[")
	i := strings.Index(rest, "].")
	if !ok || i < 0 {
		return planPaths(err)
	}
	var axis int
	fmt.Sscanf(rest[:i], "%d", &axis)
	p := rest[i+2:]
	head, tail, _ := strings.Cut(p, ".")
	switch head {
	case "grid":
		p = fmt.Sprintf("grids[%d].%s", axis, tail)
	case "band":
		p = fmt.Sprintf("frequency.%s[%d]", tail, axis)
	case "settings":
	case "options":
		p = tail
	default:
		p = fmt.Sprintf("family.separable.factors[%d].%s", axis, wireFamilyPath(p))
	}
	return &bounds.ParamError{Param: p, Reason: pe.Reason, Err: pe.Err}
}
