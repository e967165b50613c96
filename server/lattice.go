package server

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strings"

	pb "foldbound/api/foldbound/v1"
	"foldbound/bounds"
)

// This file holds the lattice calls: their field rules, their conversion
// to the engine, and the handlers.

// latticeDim returns the dimension of a built-in lattice: 0 for the
// integer lattice (given by dim), -1 for an unknown name.
func latticeDim(n pb.LatticeName) int {
	switch n {
	case pb.LatticeName_LATTICE_NAME_INTEGER:
		return 0
	case pb.LatticeName_LATTICE_NAME_HEXAGONAL:
		return 2
	case pb.LatticeName_LATTICE_NAME_BODY_CENTRED_CUBIC, pb.LatticeName_LATTICE_NAME_FACE_CENTRED_CUBIC:
		return 3
	case pb.LatticeName_LATTICE_NAME_D4:
		return 4
	}
	return -1
}

// lattice checks a lattice and returns its dimension (0 if unknown).
func (c *checker) lattice(path string, l *pb.Lattice, scaled bool) int {
	if l == nil {
		c.bad(path, "required")
		return 0
	}
	dim := 0
	switch k := l.GetKind().(type) {
	case *pb.Lattice_Named:
		want := latticeDim(k.Named)
		switch {
		case want < 0:
			c.bad(path+".named", "must be one of LATTICE_NAME_INTEGER, _HEXAGONAL, _BODY_CENTRED_CUBIC, _FACE_CENTRED_CUBIC, _D4, got %v", k.Named)
		case want == 0:
			if d := l.GetDim(); d < 1 || d > bounds.MaxDim {
				c.bad(path+".dim", "must be between 1 and %d for LATTICE_NAME_INTEGER, got %d", bounds.MaxDim, d)
			} else {
				dim = int(d)
			}
		default:
			if d := l.GetDim(); d != 0 && int(d) != want {
				c.bad(path+".dim", "%v is %d-dimensional, got dim = %d", k.Named, want, d)
			}
			dim = want
		}
	case *pb.Lattice_Generator:
		g := k.Generator
		n := int(g.GetDim())
		if n < 1 || n > bounds.MaxDim {
			c.bad(path+".generator.dim", "must be between 1 and %d, got %d", bounds.MaxDim, g.GetDim())
			break
		}
		if len(g.GetEntries()) != n*n {
			c.bad(path+".generator.entries", "must have dim² = %d entries, got %d", n*n, len(g.GetEntries()))
			break
		}
		for i, v := range g.GetEntries() {
			c.finite(fmt.Sprintf("%s.generator.entries[%d]", path, i), v)
		}
		if d := l.GetDim(); d != 0 && int(d) != n {
			c.bad(path+".dim", "must be 0 or the generator's dimension %d, got %d", n, d)
		}
		dim = n
	case nil:
		if len(l.ProtoReflect().GetUnknown()) == 0 {
			c.bad(path, "one of named or generator is required")
		}
	}
	if s := l.GetScale(); scaled && (!finite(s) || s < 0) {
		c.bad(path+".scale", "must be finite and > 0 (0 means 1), got %g", s)
	}
	return dim
}

// engineLattice builds a validated lattice; errors (a singular or badly
// conditioned generator) are the engine's, renamed to path.
func engineLattice(path string, l *pb.Lattice, scaled bool) (bounds.Lattice, error) {
	var (
		lat bounds.Lattice
		err error
	)
	switch k := l.GetKind().(type) {
	case *pb.Lattice_Named:
		switch k.Named {
		case pb.LatticeName_LATTICE_NAME_INTEGER:
			lat, err = bounds.IntegerLattice(int(l.GetDim()))
		case pb.LatticeName_LATTICE_NAME_HEXAGONAL:
			lat = bounds.Hexagonal()
		case pb.LatticeName_LATTICE_NAME_BODY_CENTRED_CUBIC:
			lat = bounds.BodyCentredCubic()
		case pb.LatticeName_LATTICE_NAME_FACE_CENTRED_CUBIC:
			lat = bounds.FaceCentredCubic()
		case pb.LatticeName_LATTICE_NAME_D4:
			lat = bounds.D4()
		}
	case *pb.Lattice_Generator:
		n := int(k.Generator.GetDim())
		rows := make([][]float64, n)
		for i := range rows {
			rows[i] = k.Generator.GetEntries()[i*n : (i+1)*n]
		}
		lat, err = bounds.NewLattice(rows)
	}
	if err == nil && scaled && l.GetScale() != 0 && l.GetScale() != 1 {
		lat, err = lat.Scaled(l.GetScale())
	}
	return lat, renameParam(err, "lattice", path)
}

// renameParam replaces the leading segment from of an engine parameter
// path by to ("lattice.generator[1][0]" → "candidates[2].generator[1][0]";
// with to = "", "target.tol" → "tol").
func renameParam(err error, from, to string) error {
	var pe *bounds.ParamError
	if err == nil || !errors.As(err, &pe) {
		return err
	}
	p := pe.Param
	if p == from || strings.HasPrefix(p, from+".") || strings.HasPrefix(p, from+"[") {
		p = to + strings.TrimPrefix(p, from)
		if to == "" {
			p = strings.TrimPrefix(p, ".")
		}
	}
	return &bounds.ParamError{Param: p, Reason: pe.Reason, Err: pe.Err}
}

func wireLattice(l bounds.Lattice) *pb.LatticeInfo {
	info := &pb.LatticeInfo{Name: l.Name(), Dim: int32(l.Dim())}
	for _, row := range l.Generator() {
		info.Generator = append(info.Generator, row...)
	}
	cv, d := l.Covolume(), l.Density()
	info.Covolume = &pb.Interval{Lo: cv.Lo, Hi: cv.Hi}
	info.Density = &pb.Interval{Lo: d.Lo, Hi: d.Hi}
	return info
}

// checkLatticeAliasSum validates a LatticeAliasSumRequest and returns the
// dimension.
func (lim Limits) checkLatticeAliasSum(r *pb.LatticeAliasSumRequest) (int, error) {
	c := &checker{lim: lim}
	c.unknownFields("", r.ProtoReflect())
	fdim := c.family("family", r.GetFamily(), 1, true)
	ldim := c.lattice("lattice", r.GetLattice(), true)
	if fdim > 0 && ldim > 0 && fdim != ldim {
		c.bad("lattice", "is %d-dimensional; the family is %d-dimensional", ldim, fdim)
	}
	c.perAxis("shift", r.GetShift(), fdim, c.finite)
	c.perAxis("xi", r.GetXi(), fdim, c.finite)
	c.convention("convention", r.GetConvention())
	c.settings("settings", r.GetSettings())
	return fdim, c.err()
}

// latticeAliasSum answers a LatticeAliasSumRequest.
func (s *service) latticeAliasSum(ctx context.Context, req *pb.LatticeAliasSumRequest) (*pb.LatticeAliasSumResponse, error) {
	dim, err := s.lim.checkLatticeAliasSum(req)
	if err != nil {
		return nil, err
	}
	conv := engineConvention(req.GetConvention())
	set := s.lim.engineSettings(req.GetSettings())
	f, err := familyND("family", req.GetFamily(), dim)
	if err != nil {
		return nil, err
	}
	lat, err := engineLattice("lattice", req.GetLattice(), true)
	if err != nil {
		return nil, err
	}
	shift, xi := make([]float64, dim), make([]float64, dim)
	copy(shift, req.GetShift())
	for i, v := range req.GetXi() {
		xi[i] = angular(conv, v)
	}
	r, err := bounds.LatticeAliasSum(ctx, f, lat, shift, xi, set)
	if err != nil {
		return nil, wirePathsND(err)
	}
	out := newOutputs(conv, dim)
	m := r.Method
	return &pb.LatticeAliasSumResponse{
		Sampled: out.complex(r.Sampled),
		Exact:   out.complex(r.Exact),
		Alias:   out.complex(r.Alias),
		Method: &pb.LatticeMethod{Side: wireSide(m.Side), Points: m.Points, Visited: m.Visited, Radius: m.Radius,
			Remainder: out.bound(m.Remainder), RemainderFrom: m.RemainderFrom, MaxTerms: set.MaxTerms},
		Convention: wireConvention(conv),
		Family:     f.String(),
		Lattice:    wireLattice(lat),
		XiAngular:  xi,
	}, nil
}

// checkCompareLattices validates a CompareLatticesRequest.
func (lim Limits) checkCompareLattices(r *pb.CompareLatticesRequest) error {
	c := &checker{lim: lim}
	c.unknownFields("", r.ProtoReflect())
	dim := int(r.GetDim())
	if dim < 1 || dim > bounds.MaxDim {
		c.bad("dim", "must be between 1 and %d, got %d", bounds.MaxDim, r.GetDim())
	}
	if len(r.GetSpectral()) == 0 {
		c.bad("spectral", "at least one envelope term is required")
	}
	c.envelope("spectral", r.GetSpectral())
	positive := false
	for _, t := range r.GetSpectral() {
		positive = positive || t.GetAmplitude() > 0
	}
	if len(r.GetSpectral()) > 0 && !positive {
		c.bad("spectral", "every amplitude is 0: nothing aliases")
	}
	c.nonNegative("band", r.GetBand())
	if r.GetWholeBand() {
		if r.GetBand() != 0 {
			c.bad("band", "must be 0 with whole_band (the band is the envelope's band limit)")
		}
		for i, t := range r.GetSpectral() {
			if t.GetDecay() != pb.Decay_DECAY_COMPACT {
				c.bad(fmt.Sprintf("spectral[%d].decay", i), "whole_band needs a band-limited envelope (DECAY_COMPACT terms only), got %v", t.GetDecay())
			}
		}
	}
	c.tolerance("tol", r.GetTol())
	for i, l := range r.GetCandidates() {
		p := fmt.Sprintf("candidates[%d]", i)
		if d := c.lattice(p, l, false); d > 0 && dim > 0 && d != dim {
			c.bad(p, "is %d-dimensional, want dim = %d", d, dim)
		}
	}
	if len(r.GetCandidates()) > 64 {
		c.bad("candidates", "at most 64 extra candidates, got %d", len(r.GetCandidates()))
	}
	c.convention("convention", r.GetConvention())
	c.settings("settings", r.GetSettings())
	return c.err()
}

// compareLattices answers a CompareLatticesRequest.
func (s *service) compareLattices(ctx context.Context, req *pb.CompareLatticesRequest) (*pb.CompareLatticesResponse, error) {
	if err := s.lim.checkCompareLattices(req); err != nil {
		return nil, err
	}
	dim := int(req.GetDim())
	conv := engineConvention(req.GetConvention())
	set := s.lim.engineSettings(req.GetSettings())
	out := newOutputs(conv, dim)
	spectral := engineEnvelope(req.GetSpectral())
	// The tolerance is in the units of the request's convention: divide by
	// the output scale, rounding down, to get the angular one.
	tol := bounds.Point(req.GetTol()).Div(out.scale).Lo
	var target bounds.LatticeTarget
	if req.GetWholeBand() {
		var err error
		if target, err = bounds.ReconstructionTarget(spectral, tol); err != nil {
			return nil, renameParam(err, "target", "")
		}
	} else {
		band := conv.ToAngular(req.GetBand()).Hi
		target = bounds.LatticeTarget{Spectral: spectral, Band: band, Tol: tol}
	}
	extra := make([]bounds.Lattice, len(req.GetCandidates()))
	for i, l := range req.GetCandidates() {
		var err error
		if extra[i], err = engineLattice(fmt.Sprintf("candidates[%d]", i), l, false); err != nil {
			return nil, err
		}
	}
	cmp, err := bounds.CompareLattices(ctx, dim, target, extra, set)
	if err != nil {
		return nil, renameParam(err, "target", "")
	}
	plan := func(p bounds.LatticePlan) *pb.LatticePlan {
		return &pb.LatticePlan{Lattice: wireLattice(p.Lattice), Scale: p.Scale,
			Density: &pb.Interval{Lo: p.Density.Lo, Hi: p.Density.Hi}, Aliasing: out.bound(p.Aliasing),
			Saving: p.Saving, Points: p.Points}
	}
	res := &pb.CompareLatticesResponse{Reference: plan(cmp.Reference), Convention: wireConvention(conv)}
	for _, p := range cmp.Plans {
		res.Plans = append(res.Plans, plan(p))
	}
	res.Band = conv.FromAngular(bounds.Point(cmp.Target.Band)).Hi
	if math.IsNaN(res.Band) {
		res.Band = 0
	}
	return res, nil
}
