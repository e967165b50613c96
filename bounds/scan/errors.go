package scan

import (
	"errors"
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

// finite reports whether v is neither NaN nor an infinity.
func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// positive checks that v is finite and > 0; param names it in the error.
func positive(param string, v float64) error {
	if !finite(v) || v <= 0 {
		return invalid(param, "must be finite and > 0, got %g", v)
	}
	return nil
}

// renameParam returns err with the path of its *bounds.ParamError set to
// to when it is from, and prefix (if any) put before the reason. Other
// errors pass unchanged.
func renameParam(err error, from, to, prefix string) error {
	var pe *bounds.ParamError
	if !errors.As(err, &pe) || (from != "" && pe.Param != from) {
		return err
	}
	reason := pe.Reason
	if prefix != "" {
		reason = prefix + ": " + pe.Param + " " + reason
	}
	return &bounds.ParamError{Param: to, Reason: reason, Err: pe.Err}
}
