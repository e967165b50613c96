package bounds

import (
	"errors"
	"fmt"
)

// Sentinel errors. Every error returned by an entry point of this package
// wraps exactly one of them (or a context error), so callers can map them
// to their own vocabulary with errors.Is.
var (
	// ErrInvalid marks a parameter outside its domain: NaN, an infinity, a
	// non-positive width, a dimension out of range.
	ErrInvalid = errors.New("invalid parameter")

	// ErrWorkLimit marks a computation that would need more terms, points or
	// samples than the caller's limit allows.
	ErrWorkLimit = errors.New("work limit exceeded")

	// ErrInfeasible marks a request that no grid can satisfy in double
	// precision, such as a tolerance below the rounding floor.
	ErrInfeasible = errors.New("not achievable")

	// ErrNotFinite marks a result that overflowed the float64 range, so that
	// no finite enclosure could be returned.
	ErrNotFinite = errors.New("result not finite")
)

// ParamError reports a bad parameter. Param is a dotted path such as
// "grid[1].step"; Err is ErrInvalid, ErrWorkLimit or ErrInfeasible.
type ParamError struct {
	Param  string
	Reason string
	Err    error
}

func (e *ParamError) Error() string {
	return "bounds: " + e.Param + ": " + e.Reason
}

func (e *ParamError) Unwrap() error { return e.Err }

// invalidf returns a *ParamError wrapping ErrInvalid.
func invalidf(param, format string, args ...any) error {
	return &ParamError{Param: param, Reason: fmt.Sprintf(format, args...), Err: ErrInvalid}
}

// workLimitf returns a *ParamError wrapping ErrWorkLimit.
func workLimitf(param, format string, args ...any) error {
	return &ParamError{Param: param, Reason: fmt.Sprintf(format, args...), Err: ErrWorkLimit}
}

// infeasiblef returns a *ParamError wrapping ErrInfeasible.
func infeasiblef(param, format string, args ...any) error {
	return &ParamError{Param: param, Reason: fmt.Sprintf(format, args...), Err: ErrInfeasible}
}
