package server

import (
	"errors"
	"testing"

	"foldbound/bounds"
)

func TestWireFamilyPath(t *testing.T) {
	tests := []struct{ give, want string }{
		{"gaussian.sigma", "gaussian.sigma"},
		{"exponential.rate", "two_sided_exponential.a"},
		{"lorentzian.width", "lorentzian.a"},
		{"sech2.width", "sech_squared.w"},
		{"wavepacket.omega0", "wave_packet.omega0"},
		{"bspline.order", "b_spline.order"},
		{"sum[2].shift.by", "sum.terms[2].shift.by"},
		{"dilation.by", "dilation.factor"},
		{"dilation.of.sech.width", "dilation.of.sech.w"},
		{"amplitude.im", "amplitude.factor.im"},
		{"separable.axes[1].kaiser_bessel.beta", "separable.factors[1].kaiser_bessel.beta"},
		{"sum", "sum.terms"},
	}
	for _, tt := range tests {
		if got := wireFamilyPath(tt.give); got != tt.want {
			t.Errorf("wireFamilyPath(%q) = %q, want %q", tt.give, got, tt.want)
		}
	}
}

func TestWirePaths(t *testing.T) {
	tests := []struct{ give, want string }{
		{"grid.step", "grids[0].step"},
		{"band.center", "frequency.center[0]"},
		{"settings.max_terms", "settings.max_terms"},
		{"spectral[0].rate", "envelopes.spectral[0].rate"},
		{"options.sample_ulps", "sample_ulps"},
		{"sum[0].lorentzian.width", "family.sum.terms[0].lorentzian.a"},
	}
	for _, tt := range tests {
		err := wirePaths(&bounds.ParamError{Param: tt.give, Reason: "r", Err: bounds.ErrInvalid})
		var pe *bounds.ParamError
		if !errors.As(err, &pe) || pe.Param != tt.want {
			t.Errorf("wirePaths(%q) = %v, want %q", tt.give, err, tt.want)
		}
	}
}
