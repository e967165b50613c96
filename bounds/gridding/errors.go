package gridding

import (
	"fmt"
	"math"

	"foldbound/bounds"
)

// invalid returns a *bounds.ParamError wrapping bounds.ErrInvalid.
func invalid(param, format string, args ...any) error {
	return &bounds.ParamError{Param: param, Reason: fmt.Sprintf(format, args...), Err: bounds.ErrInvalid}
}

// workLimit returns a *bounds.ParamError wrapping bounds.ErrWorkLimit.
func workLimit(param, format string, args ...any) error {
	return &bounds.ParamError{Param: param, Reason: fmt.Sprintf(format, args...), Err: bounds.ErrWorkLimit}
}

// infeasible returns a *bounds.ParamError wrapping bounds.ErrInfeasible.
func infeasible(param, format string, args ...any) error {
	return &bounds.ParamError{Param: param, Reason: fmt.Sprintf(format, args...), Err: bounds.ErrInfeasible}
}

// finite reports whether v is neither NaN nor an infinity.
func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
