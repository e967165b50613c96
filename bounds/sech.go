package bounds

import "fmt"

// SechFamily is the hyperbolic secant f(x) = sech(x/w), whose transform is
//
//	F(ξ) = πw·sech(πwξ/2)
//
// (Gradshteyn & Ryzhik 3.981.3, ∫₀^∞ cos(ξx)/cosh(βx) dx = (π/2β)·sech(πξ/2β),
// from memory; math.md, catalogue). f and F are both analytic in strips
// and decay exponentially.
type SechFamily struct {
	Width float64 // w > 0
}

// NewSech returns the hyperbolic secant of width w.
func NewSech(w float64) (SechFamily, error) {
	s := SechFamily{Width: w}
	return s, s.Validate()
}

// Validate reports whether w is finite, positive and within the range where
// the envelopes are finite.
func (s SechFamily) Validate() error {
	if !finite(s.Width) || s.Width <= 0 {
		return invalidf("sech.width", "must be finite and > 0, got %g", s.Width)
	}
	return checkEnvelopeRange(s, "sech.width", s.Width)
}

func (s SechFamily) String() string { return fmt.Sprintf("sech(width=%g)", s.Width) }

// Value encloses sech(x/w), even and decreasing in |x|.
func (s SechFamily) Value(x Interval) Complex {
	return RealC(Sech(divPos(x, s.Width)))
}

// Transform encloses πw·sech(πwξ/2).
func (s SechFamily) Transform(xi Interval) Complex {
	w := s.Width
	pw := Pi.Scale(w)
	return RealC(Sech(xi.Mul(pw).Scale(0.5)).Mul(pw))
}

// Spatial bounds f by
//
//	sech(u) = 2/(e^u + e^{-u}) ≤ min(1, 2e^{-|u|}) = e^{-max(0, |u| - ln 2)},  u = x/w,
//
// an exponential term of amplitude 1, rate 1/w and plateau w·ln 2. The
// ratio envelope/f is 1 at 0 and at infinity and at most 5/4 (at |u| = ln 2).
func (s SechFamily) Spatial() Envelope { return s.appendSpatial(nil) }

func (s SechFamily) appendSpatial(dst Envelope) Envelope {
	return append(dst, cappedExponential(1, ln2.Hi, divDown(1, s.Width)))
}

// Spectral bounds F in the same way,
//
//	πw·sech(v) ≤ πw·min(1, 2e^{-|v|}),  v = πwξ/2:
//
// amplitude πw, rate πw/2 and plateau 2·ln 2/(πw).
func (s SechFamily) Spectral() Envelope { return s.appendSpectral(nil) }

func (s SechFamily) appendSpectral(dst Envelope) Envelope {
	pw := Pi.Scale(s.Width)
	return append(dst, cappedExponential(pw.Hi, ln2.Hi, pw.Scale(0.5).Lo))
}
