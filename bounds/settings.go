package bounds

import (
	"math"
	"strconv"
)

// Side names a side of the Poisson summation formula
//
//	h Σ_k f(s+hk) e^{-iξ(s+hk)} = Σ_l F(ξ + 2πl/h) e^{i2πls/h}.
type Side int

const (
	// AutoSide lets the engine choose the side that needs fewer terms and
	// keeps relative accuracy.
	AutoSide Side = iota
	// SpatialSide sums samples of f (the left-hand side).
	SpatialSide
	// SpectralSide sums aliased copies of F (the right-hand side).
	SpectralSide
)

func (s Side) String() string {
	switch s {
	case AutoSide:
		return "auto"
	case SpatialSide:
		return "spatial"
	case SpectralSide:
		return "spectral"
	}
	return "Side(" + strconv.Itoa(int(s)) + ")"
}

// DefaultMaxTerms is the work limit used when Settings.MaxTerms is 0.
const DefaultMaxTerms = 1 << 20

// Settings are the caller's knobs shared by the entry points. The zero
// value asks for full double-precision accuracy within DefaultMaxTerms.
type Settings struct {
	// Tol is the absolute size below which the unevaluated remainder of an
	// infinite sum may be left as a bound (it is still included in the
	// enclosure). 0 asks for a remainder below 2⁻⁶⁰ of the sum's magnitude.
	Tol float64
	// MaxTerms limits the number of terms (samples, alias copies or lattice
	// points) one call may sum; 0 means DefaultMaxTerms. Work beyond it
	// ends with an error wrapping ErrWorkLimit.
	MaxTerms int64
	// Side forces a side of the Poisson formula; AutoSide lets the engine
	// choose.
	Side Side
}

// relGoal is the default remainder goal relative to the magnitude of a sum.
const relGoal = 0x1p-60

func (s Settings) maxTerms() int64 {
	if s.MaxTerms <= 0 {
		return DefaultMaxTerms
	}
	return s.MaxTerms
}

// Validate checks the settings.
func (s Settings) Validate() error {
	if math.IsNaN(s.Tol) || math.IsInf(s.Tol, 0) || s.Tol < 0 {
		return invalidf("settings.tol", "must be finite and ≥ 0, got %g", s.Tol)
	}
	if s.MaxTerms < 0 {
		return invalidf("settings.max_terms", "must be ≥ 0, got %d", s.MaxTerms)
	}
	if s.Side < AutoSide || s.Side > SpectralSide {
		return invalidf("settings.side", "unknown side %d", int(s.Side))
	}
	return nil
}
