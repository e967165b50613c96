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
// path from the root, and build their envelopes by appending to one slice
// (the engine asks for envelopes many times per sum).
type composite interface {
	validateNode(prefix string, nodes *int) error
	appendSpatial(dst Envelope) Envelope
	appendSpectral(dst Envelope) Envelope
}

// appendSpatial appends the spatial envelope of f to dst.
func appendSpatial(dst Envelope, f Family) Envelope {
	if e, ok := appendLeafSpatial(dst, f); ok {
		return e
	}
	switch g := f.(type) {
	case AmplitudeFamily:
		return g.appendSpatial(dst)
	case ShiftFamily:
		return g.appendSpatial(dst)
	case DilationFamily:
		return g.appendSpatial(dst)
	case ModulationFamily:
		return g.appendSpatial(dst)
	case SumFamily:
		return g.appendSpatial(dst)
	}
	return append(dst, f.Spatial()...)
}

// appendSpectral appends the spectral envelope of f to dst.
func appendSpectral(dst Envelope, f Family) Envelope {
	if e, ok := appendLeafSpectral(dst, f); ok {
		return e
	}
	switch g := f.(type) {
	case AmplitudeFamily:
		return g.appendSpectral(dst)
	case ShiftFamily:
		return g.appendSpectral(dst)
	case DilationFamily:
		return g.appendSpectral(dst)
	case ModulationFamily:
		return g.appendSpectral(dst)
	case SumFamily:
		return g.appendSpectral(dst)
	}
	return append(dst, f.Spectral()...)
}

// appendLeafSpatial appends the spatial envelope of a catalogue family to
// dst, or reports false for any other family. Its calls are static and it
// does not recurse, so dst does not escape: callers can build envelopes in
// arrays on the stack. (Calls through an interface, and the recursion of
// the composed families, make escape analysis move the array to the heap.)
func appendLeafSpatial(dst Envelope, f Family) (Envelope, bool) {
	switch g := f.(type) {
	case GaussianFamily:
		return g.appendSpatial(dst), true
	case ExponentialFamily:
		return g.appendSpatial(dst), true
	case LorentzianFamily:
		return g.appendSpatial(dst), true
	case SechFamily:
		return g.appendSpatial(dst), true
	case SechSquaredFamily:
		return g.appendSpatial(dst), true
	case WavePacketFamily:
		return g.appendSpatial(dst), true
	case FejerFamily:
		return g.appendSpatial(dst), true
	case BSplineFamily:
		return g.appendSpatial(dst), true
	case KaiserBesselFamily:
		return g.appendSpatial(dst), true
	}
	return dst, false
}

// appendLeafSpectral is appendLeafSpatial for the spectral envelope.
func appendLeafSpectral(dst Envelope, f Family) (Envelope, bool) {
	switch g := f.(type) {
	case GaussianFamily:
		return g.appendSpectral(dst), true
	case ExponentialFamily:
		return g.appendSpectral(dst), true
	case LorentzianFamily:
		return g.appendSpectral(dst), true
	case SechFamily:
		return g.appendSpectral(dst), true
	case SechSquaredFamily:
		return g.appendSpectral(dst), true
	case WavePacketFamily:
		return g.appendSpectral(dst), true
	case FejerFamily:
		return g.appendSpectral(dst), true
	case BSplineFamily:
		return g.appendSpectral(dst), true
	case KaiserBesselFamily:
		return g.appendSpectral(dst), true
	}
	return dst, false
}

// validatesEnvelopes reports whether f's Validate checks its envelopes'
// range (checkEnvelopeRange), so that callers need not check them again.
func validatesEnvelopes(f Family) bool {
	switch f.(type) {
	case ExponentialFamily, FejerFamily, LorentzianFamily, SechFamily, SechSquaredFamily, WavePacketFamily:
		return true
	}
	return false
}

// envelopeStack is the number of envelope terms kept on the stack for a
// catalogue family (they have one or two).
const envelopeStack = 16

// envelopesOf returns the spatial and spectral envelopes of f; for a
// catalogue family in one allocation of the size they need.
func envelopesOf(f Family) (spatial, spectral Envelope) {
	var buf [envelopeStack]EnvelopeTerm
	sp, ok := appendLeafSpatial(buf[:0], f)
	if !ok {
		heap := make(Envelope, 8)
		return appendSpatial(heap[:0:4], f), appendSpectral(heap[4:4], f)
	}
	sc, _ := appendLeafSpectral(sp, f)
	both := make(Envelope, len(sc))
	copy(both, sc)
	n := len(sp)
	return both[:n:n], both[n:]
}

// envelopesInRange reports whether both envelopes of f would pass
// Envelope.Validate; a catalogue family's are built on the stack.
func envelopesInRange(f Family) bool {
	var buf [envelopeStack]EnvelopeTerm
	if sp, ok := appendLeafSpatial(buf[:0], f); ok {
		if !envelopeInRange(sp) {
			return false
		}
		sc, _ := appendLeafSpectral(buf[:0], f)
		return envelopeInRange(sc)
	}
	return envelopeInRange(appendSpatial(nil, f)) && envelopeInRange(appendSpectral(nil, f))
}

// scaleTerms multiplies the amplitudes by k ≥ 0, rounded up (as
// Envelope.Scaled), in place.
func scaleTerms(e Envelope, k float64) {
	for i := range e {
		e[i].Amplitude = mulUp(e[i].Amplitude, k)
	}
}

// shiftTerms moves the centres by c in place; the rounding error of a new
// centre, exact by TwoSum, joins its plateau (as Envelope.Shifted, but an
// exact centre leaves the plateau unchanged).
func shiftTerms(e Envelope, c float64) {
	for i := range e {
		t := &e[i]
		nc := t.Center + c
		if err := math.Abs(twoSumErr(t.Center, c, nc)); err != 0 {
			t.Plateau = addUp(t.Plateau, err)
		}
		t.Center = nc
	}
}

// validateRoot validates the tree rooted at f: parameters and children
// first, then the derived envelopes, once, at the root. A term that leaves
// the float64 range below stays out of range in every ancestor (an
// infinite amplitude or width stays infinite, a zero rate or width stays
// zero) unless an amplitude 0 multiplies it away, which is then harmless; so
// the nodes' own envelopes are examined only to name the first node that
// fails.
//
// A valid tree, the common case, is recognised first by composedValid,
// which builds no parameter paths (they cost allocations on every call).
func validateRoot(f composite) error {
	ff := f.(Family)
	if _, ok := composedValid(ff, 1); ok && envelopesInRange(ff) {
		return nil
	}
	nodes := 1
	if err := f.validateNode("", &nodes); err != nil {
		return err
	}
	if envelopesInRange(ff) {
		return nil
	}
	return locateEnvelopeFailure(ff, "")
}

// composedValid reports whether the node f (counted in nodes) and the
// families below it pass the checks of validateNode and validateChild, and
// returns the number of nodes counted so far. It mirrors them without
// naming parameters; validateRoot runs them for the message when it fails.
func composedValid(f Family, nodes int) (int, bool) {
	var one [1]Family
	var children []Family
	switch g := f.(type) {
	case AmplitudeFamily:
		if !finite(g.Re) || !finite(g.Im) {
			return nodes, false
		}
		one[0] = g.Of
		children = one[:]
	case ShiftFamily:
		if !finite(g.By) {
			return nodes, false
		}
		one[0] = g.Of
		children = one[:]
	case DilationFamily:
		if !finite(g.By) || g.By == 0 {
			return nodes, false
		}
		one[0] = g.Of
		children = one[:]
	case ModulationFamily:
		if !finite(g.Omega0) {
			return nodes, false
		}
		one[0] = g.Of
		children = one[:]
	case SumFamily:
		if len(g.Terms) == 0 {
			return nodes, false
		}
		children = g.Terms
	default:
		return nodes, false
	}
	for _, c := range children {
		if c == nil {
			return nodes, false
		}
		nodes++
		if nodes > MaxComposeNodes {
			return nodes, false
		}
		if _, ok := c.(composite); ok {
			var ok bool
			if nodes, ok = composedValid(c, nodes); !ok {
				return nodes, false
			}
			continue
		}
		// validateLeaf: the family's own checks and its envelopes (which
		// the closed-form families' Validate checks already).
		if v, ok := c.(Validator); ok && v.Validate() != nil {
			return nodes, false
		}
		if !validatesEnvelopes(c) && !envelopesInRange(c) {
			return nodes, false
		}
	}
	return nodes, true
}

// locateEnvelopeFailure returns the error of the deepest composition node
// below (or at) f whose derived envelopes leave the float64 range, with the
// path of the offending term, e.g. "sum[1].amplitude.spatial[0].amplitude".
func locateEnvelopeFailure(f Family, prefix string) error {
	var name string
	var children []Family
	var locs []string
	switch n := f.(type) {
	case AmplitudeFamily:
		name, children, locs = "amplitude", []Family{n.Of}, []string{"amplitude.of."}
	case ShiftFamily:
		name, children, locs = "shift", []Family{n.Of}, []string{"shift.of."}
	case DilationFamily:
		name, children, locs = "dilation", []Family{n.Of}, []string{"dilation.of."}
	case ModulationFamily:
		name, children, locs = "modulation", []Family{n.Of}, []string{"modulation.of."}
	case SumFamily:
		name, children = "sum", n.Terms
		for i := range n.Terms {
			locs = append(locs, fmt.Sprintf("sum[%d].", i))
		}
	default:
		return nil
	}
	for i, c := range children {
		if _, ok := c.(composite); !ok {
			continue
		}
		if !envelopeInRange(c.Spatial()) || !envelopeInRange(c.Spectral()) {
			if err := locateEnvelopeFailure(c, prefix+locs[i]); err != nil {
				return err
			}
		}
	}
	return validateNodeEnvelopes(f, prefix+name)
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
	if err := validateLeaf(f); err != nil {
		var pe *ParamError
		if errors.As(err, &pe) {
			return &ParamError{Param: loc + "." + pe.Param, Reason: pe.Reason, Err: pe.Err}
		}
		return fmt.Errorf("%s: %w", loc, err)
	}
	return nil
}

// validateLeaf is Validate for a family that is not a composition, with a
// quick envelope check first (Envelope.Validate formats a path per term).
func validateLeaf(f Family) error {
	if v, ok := f.(Validator); ok {
		if err := v.Validate(); err != nil {
			return err
		}
	}
	if envelopesInRange(f) {
		return nil
	}
	return Validate(f)
}

// validateNodeEnvelopes checks the envelopes a node derives from its
// children, which can leave the float64 range even when every parameter is
// in its domain. The quick check avoids formatting paths on the common,
// valid path.
func validateNodeEnvelopes(f Family, path string) error {
	sp, sc := f.Spatial(), f.Spectral()
	if envelopeInRange(sp) && envelopeInRange(sc) {
		return nil
	}
	if err := sp.Validate(path + ".spatial"); err != nil {
		return err
	}
	return sc.Validate(path + ".spectral")
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
	return nil
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
func (a AmplitudeFamily) Spatial() Envelope { return a.appendSpatial(nil) }

// Spectral is |c| times the envelope of F.
func (a AmplitudeFamily) Spectral() Envelope { return a.appendSpectral(nil) }

func (a AmplitudeFamily) appendSpatial(dst Envelope) Envelope {
	n := len(dst)
	dst = appendSpatial(dst, a.Of)
	scaleTerms(dst[n:], a.modulus())
	return dst
}

func (a AmplitudeFamily) appendSpectral(dst Envelope) Envelope {
	n := len(dst)
	dst = appendSpectral(dst, a.Of)
	scaleTerms(dst[n:], a.modulus())
	return dst
}

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
	return nil
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

// Spatial is the envelope of f moved by c (the rounding of each new centre
// joins its plateau).
func (s ShiftFamily) Spatial() Envelope { return s.appendSpatial(nil) }

// Spectral is the envelope of F: |F(ξ)e^{-iξc}| = |F(ξ)|.
func (s ShiftFamily) Spectral() Envelope { return s.appendSpectral(nil) }

func (s ShiftFamily) appendSpatial(dst Envelope) Envelope {
	n := len(dst)
	dst = appendSpatial(dst, s.Of)
	shiftTerms(dst[n:], s.By)
	return dst
}

func (s ShiftFamily) appendSpectral(dst Envelope) Envelope { return appendSpectral(dst, s.Of) }

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
	return nil
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
func (d DilationFamily) Spatial() Envelope { return d.appendSpatial(nil) }

func (d DilationFamily) appendSpatial(dst Envelope) Envelope {
	n := len(dst)
	dst = appendSpatial(dst, d.Of)
	dilateTerms(dst[n:], d.By < 0, Point(math.Abs(d.By)))
	return dst
}

// Spectral bounds |a|·|F(aξ)| ≤ |a|·env(aξ) = |a|·env(ξ/(1/a)): the
// envelope of F reflected if a < 0, dilated by an enclosure of 1/|a|, and
// scaled by |a| (rounded up).
func (d DilationFamily) Spectral() Envelope { return d.appendSpectral(nil) }

func (d DilationFamily) appendSpectral(dst Envelope) Envelope {
	abs := math.Abs(d.By)
	n := len(dst)
	dst = appendSpectral(dst, d.Of)
	dilateTerms(dst[n:], d.By < 0, Interval{divDown(1, abs), divUp(1, abs)})
	scaleTerms(dst[n:], abs)
	return dst
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
	return nil
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
func (m ModulationFamily) Spatial() Envelope { return m.appendSpatial(nil) }

// Spectral is the envelope of F moved by ω₀.
func (m ModulationFamily) Spectral() Envelope { return m.appendSpectral(nil) }

func (m ModulationFamily) appendSpatial(dst Envelope) Envelope { return appendSpatial(dst, m.Of) }

func (m ModulationFamily) appendSpectral(dst Envelope) Envelope {
	n := len(dst)
	dst = appendSpectral(dst, m.Of)
	shiftTerms(dst[n:], m.Omega0)
	return dst
}

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
	return nil
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
func (s SumFamily) Spatial() Envelope { return s.appendSpatial(nil) }

func (s SumFamily) appendSpatial(dst Envelope) Envelope {
	for _, t := range s.Terms {
		dst = appendSpatial(dst, t)
	}
	return dst
}

// Spectral is the sum of the terms' spectral envelopes.
func (s SumFamily) Spectral() Envelope { return s.appendSpectral(nil) }

func (s SumFamily) appendSpectral(dst Envelope) Envelope {
	for _, t := range s.Terms {
		dst = appendSpectral(dst, t)
	}
	return dst
}
