package bounds

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// Families built from other families. Each rule changes f, F and both
// envelopes together (math.md, catalogue; any Fourier-analysis text):
//
//	amplitude   c·f(x)            →  c·F(ξ)
//	shift       f(x - c)          →  F(ξ)·e^{-iξc}
//	dilation    f(x/a), a ≠ 0     →  |a|·F(aξ)
//	modulation  f(x)·e^{iω₀x}     →  F(ξ - ω₀)
//	sum         Σ_j f_j(x)        →  Σ_j F_j(ξ)
//
// A composed family holds at most MaxComposeNodes families in all (itself
// included); Validate reports a larger or malformed tree as ErrInvalid with
// the path of the offending parameter, such as "sum[2].shift.by" or
// "dilation.of.gaussian.sigma".

// MaxComposeNodes is the largest number of families, composition nodes and
// the families they are built from, that one composed family may hold.
const MaxComposeNodes = 64

// composite is implemented by the composition families: they validate
// their children against a shared node budget, naming parameters by their
// path from the root.
type composite interface {
	validateNode(prefix string, nodes *int) error
}

// validateRoot validates the tree rooted at f.
func validateRoot(f composite) error {
	nodes := 1
	return f.validateNode("", &nodes)
}

// validateChild validates the family f found at path loc ("shift.of",
// "sum[2]"), counting it against the node budget.
func validateChild(f Family, loc string, nodes *int) error {
	if f == nil {
		return invalidf(loc, "missing")
	}
	*nodes++
	if *nodes > MaxComposeNodes {
		return invalidf(loc, "a composed family may hold at most %d families", MaxComposeNodes)
	}
	if c, ok := f.(composite); ok {
		return c.validateNode(loc+".", nodes)
	}
	if err := Validate(f); err != nil {
		var pe *ParamError
		if errors.As(err, &pe) {
			return &ParamError{Param: loc + "." + pe.Param, Reason: pe.Reason, Err: pe.Err}
		}
		return fmt.Errorf("%s: %w", loc, err)
	}
	return nil
}

// validateNodeEnvelopes checks the envelopes a node derives from its
// children, which can leave the float64 range even when every parameter is
// in its domain.
func validateNodeEnvelopes(f Family, path string) error {
	if err := f.Spatial().Validate(path + ".spatial"); err != nil {
		return err
	}
	return f.Spectral().Validate(path + ".spectral")
}

// AmplitudeFamily is c·f for a complex constant c = Re + i·Im:
//
//	c·f(x)  →  c·F(ξ).
type AmplitudeFamily struct {
	Re, Im float64 // c
	Of     Family  // f
}

// NewAmplitude returns c·f.
func NewAmplitude(c complex128, f Family) (AmplitudeFamily, error) {
	a := AmplitudeFamily{Re: real(c), Im: imag(c), Of: f}
	return a, a.Validate()
}

// Validate checks c, f and the derived envelopes.
func (a AmplitudeFamily) Validate() error { return validateRoot(a) }

func (a AmplitudeFamily) validateNode(prefix string, nodes *int) error {
	if !finite(a.Re) {
		return invalidf(prefix+"amplitude.re", "must be finite, got %g", a.Re)
	}
	if !finite(a.Im) {
		return invalidf(prefix+"amplitude.im", "must be finite, got %g", a.Im)
	}
	if err := validateChild(a.Of, prefix+"amplitude.of", nodes); err != nil {
		return err
	}
	return validateNodeEnvelopes(a, prefix+"amplitude")
}

func (a AmplitudeFamily) String() string {
	return fmt.Sprintf("amplitude(re=%g, im=%g, %v)", a.Re, a.Im, a.Of)
}

func (a AmplitudeFamily) times(z Complex) Complex {
	if a.Im == 0 {
		return z.Scale(a.Re)
	}
	return z.Mul(PointC(complex(a.Re, a.Im)))
}

// Value encloses c·f(x).
func (a AmplitudeFamily) Value(x Interval) Complex { return a.times(a.Of.Value(x)) }

// Transform encloses c·F(ξ).
func (a AmplitudeFamily) Transform(xi Interval) Complex { return a.times(a.Of.Transform(xi)) }

// modulus returns an upper bound of |c|.
func (a AmplitudeFamily) modulus() float64 { return PointC(complex(a.Re, a.Im)).Mag() }

// Spatial is |c| times the envelope of f (amplitudes rounded up).
func (a AmplitudeFamily) Spatial() Envelope { return a.Of.Spatial().Scaled(a.modulus()) }

// Spectral is |c| times the envelope of F.
func (a AmplitudeFamily) Spectral() Envelope { return a.Of.Spectral().Scaled(a.modulus()) }

// ShiftFamily is f moved right by c:
//
//	f(x - c)  →  F(ξ)·e^{-iξc}.
type ShiftFamily struct {
	By float64 // c
	Of Family  // f
}

// NewShift returns f(x - c).
func NewShift(c float64, f Family) (ShiftFamily, error) {
	s := ShiftFamily{By: c, Of: f}
	return s, s.Validate()
}

// Validate checks c, f and the derived envelopes.
func (s ShiftFamily) Validate() error { return validateRoot(s) }

func (s ShiftFamily) validateNode(prefix string, nodes *int) error {
	if !finite(s.By) {
		return invalidf(prefix+"shift.by", "must be finite, got %g", s.By)
	}
	if err := validateChild(s.Of, prefix+"shift.of", nodes); err != nil {
		return err
	}
	return validateNodeEnvelopes(s, prefix+"shift")
}

func (s ShiftFamily) String() string { return fmt.Sprintf("shift(by=%g, %v)", s.By, s.Of) }

// Value encloses f(x - c).
func (s ShiftFamily) Value(x Interval) Complex { return s.Of.Value(x.AddFloat(-s.By)) }

// Transform encloses F(ξ)·e^{-iξc}.
func (s ShiftFamily) Transform(xi Interval) Complex {
	F := s.Of.Transform(xi)
	if s.By == 0 {
		return F
	}
	return F.Mul(Cis(xi.Scale(-s.By)))
}

// Spatial is the envelope of f moved by c (Envelope.Shifted adds the
// rounding of each new centre to its plateau).
func (s ShiftFamily) Spatial() Envelope { return s.Of.Spatial().Shifted(s.By) }

// Spectral is the envelope of F: |F(ξ)e^{-iξc}| = |F(ξ)|.
func (s ShiftFamily) Spectral() Envelope { return s.Of.Spectral() }

// DilationFamily is f stretched by a ≠ 0 (a < 0 also reflects):
//
//	f(x/a)  →  |a|·F(aξ).
type DilationFamily struct {
	By float64 // a ≠ 0
	Of Family  // f
}

// NewDilation returns f(x/a).
func NewDilation(a float64, f Family) (DilationFamily, error) {
	d := DilationFamily{By: a, Of: f}
	return d, d.Validate()
}

// Validate checks a, f and the derived envelopes.
func (d DilationFamily) Validate() error { return validateRoot(d) }

func (d DilationFamily) validateNode(prefix string, nodes *int) error {
	if !finite(d.By) || d.By == 0 {
		return invalidf(prefix+"dilation.by", "must be finite and non-zero, got %g", d.By)
	}
	if err := validateChild(d.Of, prefix+"dilation.of", nodes); err != nil {
		return err
	}
	return validateNodeEnvelopes(d, prefix+"dilation")
}

func (d DilationFamily) String() string { return fmt.Sprintf("dilation(by=%g, %v)", d.By, d.Of) }

// Value encloses f(x/a).
func (d DilationFamily) Value(x Interval) Complex { return d.Of.Value(x.Div(Point(d.By))) }

// Transform encloses |a|·F(aξ).
func (d DilationFamily) Transform(xi Interval) Complex {
	return d.Of.Transform(xi.Scale(d.By)).Scale(math.Abs(d.By))
}

// Spatial bounds |f(x/a)| ≤ env(x/a): the envelope of f, reflected if
// a < 0 and dilated by |a| (see dilateEnvelope).
func (d DilationFamily) Spatial() Envelope {
	return dilateEnvelope(d.Of.Spatial(), d.By < 0, Point(math.Abs(d.By)))
}

// Spectral bounds |a|·|F(aξ)| ≤ |a|·env(aξ) = |a|·env(ξ/(1/a)): the
// envelope of F reflected if a < 0, dilated by an enclosure of 1/|a|, and
// scaled by |a| (rounded up).
func (d DilationFamily) Spectral() Envelope {
	abs := math.Abs(d.By)
	return dilateEnvelope(d.Of.Spectral(), d.By < 0, Point(1).Div(Point(abs))).Scaled(abs)
}

// dilateEnvelope returns an envelope of g(x/b), for every b in the interval
// B (B.Lo > 0), given an envelope e of g; with reflect it is an envelope of
// g(-x/b). A term A·g(max(0, |y - c| - p)) becomes at y = x/b
//
//	A·g(max(0, |x - bc| - bp)/b) ≤ A·g(max(0, |x - c'| - p')/B.Hi)
//
// for any centre c' and p' ≥ p·B.Hi + max_b |bc - c'|, because every
// profile g is non-increasing; so rates are divided by B.Hi (rounded down)
// and widths multiplied by B.Hi (rounded up). Unlike Envelope.Dilated,
// which rounds Gaussian and algebraic widths down and takes an exact factor,
// every rounding here is on the safe side.
func dilateEnvelope(e Envelope, reflect bool, B Interval) Envelope {
	out := make(Envelope, len(e))
	for i, t := range e {
		c := t.Center
		if reflect {
			c = -c
		}
		cb := Point(c).Mul(B)
		nc := cb.Mid()
		t.Center = nc
		t.Plateau = mulUp(t.Plateau, B.Hi)
		if cb.Lo != cb.Hi {
			rad := math.Max(addUp(cb.Hi, -nc), addUp(nc, -cb.Lo))
			t.Plateau = addUp(t.Plateau, rad)
		}
		switch t.Decay {
		case Exponential:
			t.Rate = divDown(t.Rate, B.Hi)
		case Gaussian, Algebraic, Compact:
			t.Width = mulUp(t.Width, B.Hi)
		}
		out[i] = t
	}
	return out
}

// ModulationFamily is f times the carrier e^{iω₀x}:
//
//	f(x)·e^{iω₀x}  →  F(ξ - ω₀).
type ModulationFamily struct {
	Omega0 float64 // ω₀
	Of     Family  // f
}

// NewModulation returns f(x)·e^{iω₀x}.
func NewModulation(omega0 float64, f Family) (ModulationFamily, error) {
	m := ModulationFamily{Omega0: omega0, Of: f}
	return m, m.Validate()
}

// Validate checks ω₀, f and the derived envelopes.
func (m ModulationFamily) Validate() error { return validateRoot(m) }

func (m ModulationFamily) validateNode(prefix string, nodes *int) error {
	if !finite(m.Omega0) {
		return invalidf(prefix+"modulation.omega0", "must be finite, got %g", m.Omega0)
	}
	if err := validateChild(m.Of, prefix+"modulation.of", nodes); err != nil {
		return err
	}
	return validateNodeEnvelopes(m, prefix+"modulation")
}

func (m ModulationFamily) String() string {
	return fmt.Sprintf("modulation(omega0=%g, %v)", m.Omega0, m.Of)
}

// Value encloses f(x)·e^{iω₀x}.
func (m ModulationFamily) Value(x Interval) Complex {
	v := m.Of.Value(x)
	if m.Omega0 == 0 {
		return v
	}
	return v.Mul(Cis(x.Scale(m.Omega0)))
}

// Transform encloses F(ξ - ω₀).
func (m ModulationFamily) Transform(xi Interval) Complex {
	return m.Of.Transform(xi.AddFloat(-m.Omega0))
}

// Spatial is the envelope of f: |f(x)e^{iω₀x}| = |f(x)|.
func (m ModulationFamily) Spatial() Envelope { return m.Of.Spatial() }

// Spectral is the envelope of F moved by ω₀.
func (m ModulationFamily) Spectral() Envelope { return m.Of.Spectral().Shifted(m.Omega0) }

// SumFamily is a finite sum of at least one family:
//
//	Σ_j f_j(x)  →  Σ_j F_j(ξ).
type SumFamily struct {
	Terms []Family // f_j
}

// NewSum returns the sum of the families (the slice is copied).
func NewSum(terms ...Family) (SumFamily, error) {
	s := SumFamily{Terms: append([]Family(nil), terms...)}
	return s, s.Validate()
}

// Validate checks every term and the derived envelopes.
func (s SumFamily) Validate() error { return validateRoot(s) }

func (s SumFamily) validateNode(prefix string, nodes *int) error {
	if len(s.Terms) == 0 {
		return invalidf(prefix+"sum", "must have at least one term")
	}
	for i, t := range s.Terms {
		if err := validateChild(t, fmt.Sprintf("%ssum[%d]", prefix, i), nodes); err != nil {
			return err
		}
	}
	return validateNodeEnvelopes(s, prefix+"sum")
}

func (s SumFamily) String() string {
	parts := make([]string, len(s.Terms))
	for i, t := range s.Terms {
		parts[i] = fmt.Sprint(t)
	}
	return "sum(" + strings.Join(parts, ", ") + ")"
}

// Value encloses Σ_j f_j(x).
func (s SumFamily) Value(x Interval) Complex {
	v := s.Terms[0].Value(x)
	for _, t := range s.Terms[1:] {
		v = v.Add(t.Value(x))
	}
	return v
}

// Transform encloses Σ_j F_j(ξ).
func (s SumFamily) Transform(xi Interval) Complex {
	v := s.Terms[0].Transform(xi)
	for _, t := range s.Terms[1:] {
		v = v.Add(t.Transform(xi))
	}
	return v
}

// Spatial is the sum of the terms' envelopes (|Σf_j| ≤ Σ|f_j|).
func (s SumFamily) Spatial() Envelope {
	var e Envelope
	for _, t := range s.Terms {
		e = append(e, t.Spatial()...)
	}
	return e
}

// Spectral is the sum of the terms' spectral envelopes.
func (s SumFamily) Spectral() Envelope {
	var e Envelope
	for _, t := range s.Terms {
		e = append(e, t.Spectral()...)
	}
	return e
}
