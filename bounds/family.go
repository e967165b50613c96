package bounds

// Family is a function f on the real line whose Fourier transform
//
//	F(ξ) = ∫ f(x) e^{-iξx} dx
//
// is known in closed form, together with envelopes of |f| and |F| that
// bound the tails of the sums on either side of the Poisson summation
// formula. Implementations are immutable values, safe for concurrent use.
//
// Value and Transform must return enclosures valid for every point of their
// (possibly wide) interval argument, never NaN; they may return Entire or an
// infinite endpoint where they cannot bound the range.
type Family interface {
	// Value encloses f(x) for every x in the interval.
	Value(x Interval) Complex
	// Transform encloses F(ξ) for every ξ in the interval.
	Transform(xi Interval) Complex
	// Spatial returns an envelope of |f|: |f(x)| ≤ Spatial().At(x).
	Spatial() Envelope
	// Spectral returns an envelope of |F|: |F(ξ)| ≤ Spectral().At(ξ).
	Spectral() Envelope
	// String names the family and its parameters, e.g. "gaussian(sigma=1)".
	String() string
}

// A Validator reports whether a family's parameters are in its domain.
// Constructors return validated families; families built as struct
// literals (for instance by a wire decoder) are checked by Validate before
// any computation.
type Validator interface {
	Validate() error
}

// Validate checks a family, and the families it is built from, for
// parameters outside their domains, and its envelopes for values outside
// the float64 range. It returns a *ParamError wrapping ErrInvalid, or nil.
func Validate(f Family) error {
	if err := validateParams(f); err != nil {
		return err
	}
	return validateEnvelopes(f.Spatial(), f.Spectral())
}

// validateParams checks a family's own parameters (Validator).
func validateParams(f Family) error {
	if f == nil {
		return invalidf("family", "missing")
	}
	if v, ok := f.(Validator); ok {
		return v.Validate()
	}
	return nil
}

// validateEnvelopes checks a family's envelopes, fetched once by the
// caller.
func validateEnvelopes(spatial, spectral Envelope) error {
	if err := spatial.Validate("spatial"); err != nil {
		return err
	}
	return spectral.Validate("spectral")
}

// FamilyND is a function f on R^n (1 ≤ n ≤ MaxDim) with known transform
//
//	F(ξ) = ∫ f(x) e^{-iξ·x} dx,
//
// and radial envelopes for the tails of lattice sums. Slices passed to
// Value and Transform have length Dim().
type FamilyND interface {
	Dim() int
	// Value encloses f(x) for every x in the box.
	Value(x []Interval) Complex
	// Transform encloses F(ξ) for every ξ in the box.
	Transform(xi []Interval) Complex
	// Spatial returns a radial envelope of |f|.
	Spatial() RadialEnvelope
	// Spectral returns a radial envelope of |F|.
	Spectral() RadialEnvelope
	String() string
}

// MaxDim is the largest dimension the engine accepts.
const MaxDim = 8

// RadialEnvelope bounds a function on R^n by a profile of the Euclidean
// distance from a centre: |g(x)| ≤ Profile.At(|x - Center|). The profile's
// terms are centred at 0.
type RadialEnvelope struct {
	Center  []float64
	Profile Envelope
}

// isEven reports whether f is known to be even, f(-x) = f(x), so that its
// transform is even too: the catalogue functions centred at 0, and the
// amplitudes, dilations and sums of even functions. False means unknown.
func isEven(f Family) bool {
	switch g := f.(type) {
	case GaussianFamily, ExponentialFamily, LorentzianFamily, SechFamily, SechSquaredFamily,
		FejerFamily, WavePacketFamily, BSplineFamily, KaiserBesselFamily:
		return true
	case AmplitudeFamily:
		return isEven(g.Of)
	case DilationFamily:
		return isEven(g.Of)
	case ShiftFamily:
		return g.By == 0 && isEven(g.Of)
	case ModulationFamily:
		return g.Omega0 == 0 && isEven(g.Of)
	case SumFamily:
		for _, t := range g.Terms {
			if !isEven(t) {
				return false
			}
		}
		return len(g.Terms) > 0
	}
	return false
}
