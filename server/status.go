package server

import (
	"context"
	"errors"
	"fmt"
	"strings"

	"google.golang.org/genproto/googleapis/rpc/errdetails"
	"google.golang.org/grpc/codes"
	"google.golang.org/grpc/status"

	pb "foldbound/api/foldbound/v1"
	"foldbound/bounds"
)

// violation is a request field that breaks a rule.
type violation struct {
	Field string // dotted path, e.g. "family.gaussian.sigma"
	Rule  string // e.g. "must be finite and > 0, got NaN"
}

// requestError reports request fields that break the service's rules,
// with the code they earn: InvalidArgument for rules of the contract,
// ResourceExhausted for this server's configurable limits.
type requestError struct {
	code       codes.Code
	violations []violation
}

func (e *requestError) Error() string {
	v := e.violations[0]
	msg := v.Field + ": " + v.Rule
	if n := len(e.violations) - 1; n == 1 {
		msg += " (and 1 more violation)"
	} else if n > 1 {
		msg += fmt.Sprintf(" (and %d more violations)", n)
	}
	return msg
}

// overLimit returns a requestError for a field over one of this server's
// limits.
func overLimit(field, format string, args ...any) error {
	return &requestError{code: codes.ResourceExhausted, violations: []violation{{field, fmt.Sprintf(format, args...)}}}
}

// unimplementedError marks a request the engine of this build cannot
// answer yet.
type unimplementedError struct {
	field string // the field that asks for it, or "" for a whole call
	what  string
}

func (e *unimplementedError) Error() string {
	if e.field == "" {
		return e.what
	}
	return e.field + ": " + e.what
}

// wirePaths renames the parameter path of an engine *bounds.ParamError
// from the engine's names for a one-dimensional call ("grid.step",
// "sum[1].lorentzian.width", "band.center") to the request's field paths
// ("grids[0].step", "family.sum.terms[1].lorentzian.a",
// "frequency.center[0]"). Other errors pass unchanged.
func wirePaths(err error) error {
	var pe *bounds.ParamError
	if !errors.As(err, &pe) {
		return err
	}
	p := pe.Param
	head, rest, _ := strings.Cut(p, ".")
	if rest != "" {
		rest = "." + rest
	}
	head, _, _ = strings.Cut(head, "[")
	switch head {
	case "settings":
	case "grid":
		p = "grids[0]" + rest
	case "xi":
		p = "xi[0]"
	case "band":
		p = "frequency" + rest + "[0]"
	case "spatial", "spectral":
		p = "envelopes." + p
	case "options":
		p = strings.TrimPrefix(rest, ".")
	case "family":
		p = "family" + rest
	default:
		p = "family." + wireFamilyPath(p)
	}
	return &bounds.ParamError{Param: p, Reason: pe.Reason, Err: pe.Err}
}

// atWirePath renames the path of an engine error about one family node
// ("lorentzian.width") to the node's wire path (leaf, e.g.
// "family.sum.terms[1].lorentzian") plus the wire name of the field.
func atWirePath(err error, leaf string) error {
	var pe *bounds.ParamError
	if !errors.As(err, &pe) {
		return err
	}
	wp := wireFamilyPath(pe.Param)
	if _, field, ok := strings.Cut(wp, "."); ok {
		leaf += "." + field
	}
	return &bounds.ParamError{Param: leaf, Reason: pe.Reason, Err: pe.Err}
}

// wireFamilyPath translates an engine family path, segment by segment,
// to the names of family.proto.
func wireFamilyPath(p string) string {
	segs := strings.Split(p, ".")
	out := make([]string, 0, len(segs)+2)
	kind := ""
	for _, s := range segs {
		name, index, _ := strings.Cut(s, "[")
		if index != "" {
			index = "[" + index
		}
		switch name {
		case "exponential":
			name = "two_sided_exponential"
		case "sech2":
			name = "sech_squared"
		case "wavepacket":
			name = "wave_packet"
		case "bspline":
			name = "b_spline"
		case "sum":
			out = append(out, "sum")
			name, kind = "terms", "sum"
		case "axes":
			name = "factors"
		}
		switch {
		case (kind == "two_sided_exponential" && name == "rate") || (kind == "lorentzian" && name == "width"):
			name = "a"
		case (kind == "sech" || kind == "sech_squared") && name == "width":
			name = "w"
		case kind == "amplitude" && (name == "re" || name == "im"):
			name = "factor." + name
		case kind == "dilation" && name == "by":
			name = "factor"
		}
		if kind != "sum" || name != "terms" {
			kind = name
		}
		out = append(out, name+index)
	}
	return strings.Join(out, ".")
}

// wirePathsND renames the parameter path of an engine error of the
// n-dimensional calls, whose names ("grids[j].step", "xi[j]",
// "separable.axes[j]...") are already close to the request's.
func wirePathsND(err error) error {
	var pe *bounds.ParamError
	if !errors.As(err, &pe) {
		return err
	}
	p := pe.Param
	switch {
	case strings.HasPrefix(p, "grids"), strings.HasPrefix(p, "xi"), strings.HasPrefix(p, "shift"),
		strings.HasPrefix(p, "settings"), strings.HasPrefix(p, "lattice"), p == "family":
	default:
		p = "family." + wireFamilyPath(p)
	}
	return &bounds.ParamError{Param: p, Reason: pe.Reason, Err: pe.Err}
}

// scanPaths renames "scan.radius" and the like to the request's field
// names, and the verification's limits to the fields that ask for them:
// "verify.size" and "verify.work" (image size, estimated work) to
// verify_image_size, any other "verify…" path (a sinogram too large, a
// plan that cannot be verified) to verify.
func scanPaths(err error) error {
	var pe *bounds.ParamError
	if !errors.As(err, &pe) {
		return err
	}
	p := strings.TrimPrefix(pe.Param, "scan.")
	switch {
	case p == "verify.size" || p == "verify.work":
		p = "verify_image_size"
	case strings.HasPrefix(p, "verify."):
		p = "verify"
	}
	return &bounds.ParamError{Param: p, Reason: pe.Reason, Err: pe.Err}
}

// toStatus maps any error of validation, conversion or the engine to a
// gRPC status. It is the only place in the package that chooses codes.
//
//	*requestError            its code (InvalidArgument or ResourceExhausted)
//	*unimplementedError      Unimplemented
//	context.DeadlineExceeded DeadlineExceeded
//	context.Canceled         Canceled
//	bounds.ErrInvalid        InvalidArgument (field from *bounds.ParamError)
//	bounds.ErrWorkLimit      ResourceExhausted
//	bounds.ErrInfeasible     OutOfRange
//	bounds.ErrNotFinite      OutOfRange
//	anything else            Internal
//
// Field problems carry a google.rpc.BadRequest detail.
func toStatus(err error) *status.Status {
	if err == nil {
		return status.New(codes.OK, "")
	}
	if st, ok := status.FromError(err); ok {
		return st // already a status (e.g. from an interceptor)
	}
	var (
		re *requestError
		ue *unimplementedError
		pe *bounds.ParamError
	)
	switch {
	case errors.As(err, &re):
		return withViolations(status.New(re.code, re.Error()), re.violations)
	case errors.As(err, &ue):
		return status.New(codes.Unimplemented, ue.Error())
	case errors.Is(err, context.DeadlineExceeded):
		return status.New(codes.DeadlineExceeded, "deadline exceeded before the computation finished: "+err.Error())
	case errors.Is(err, context.Canceled):
		return status.New(codes.Canceled, "call cancelled: "+err.Error())
	}
	code := codes.Internal
	switch {
	case errors.Is(err, bounds.ErrInvalid):
		code = codes.InvalidArgument
	case errors.Is(err, bounds.ErrWorkLimit):
		code = codes.ResourceExhausted
	case errors.Is(err, bounds.ErrInfeasible), errors.Is(err, bounds.ErrNotFinite):
		code = codes.OutOfRange
	}
	if code == codes.Internal {
		return status.New(codes.Internal, "internal error: "+err.Error())
	}
	msg := strings.TrimPrefix(err.Error(), "bounds: ")
	if errors.As(err, &pe) {
		return withViolations(status.New(code, msg), []violation{{pe.Param, pe.Reason}})
	}
	return status.New(code, msg)
}

// withViolations attaches a google.rpc.BadRequest detail listing vs.
func withViolations(st *status.Status, vs []violation) *status.Status {
	br := &errdetails.BadRequest{}
	for _, v := range vs {
		br.FieldViolations = append(br.FieldViolations, &errdetails.BadRequest_FieldViolation{
			Field: v.Field, Description: v.Rule,
		})
	}
	if d, err := st.WithDetails(br); err == nil {
		return d
	}
	return st
}

// itemError converts a status to the error of a Batch item.
func itemError(st *status.Status) *pb.ItemError {
	e := &pb.ItemError{Code: int32(st.Code()), Message: st.Message()}
	for _, d := range st.Details() {
		if br, ok := d.(*errdetails.BadRequest); ok {
			for _, v := range br.GetFieldViolations() {
				e.FieldViolations = append(e.FieldViolations, &pb.FieldViolation{Field: v.GetField(), Description: v.GetDescription()})
			}
		}
	}
	return e
}
