package bounds

import (
	"errors"
	"math"
	"strconv"
	"strings"
)

// Factored is a FamilyND that is a product of one-dimensional families
// across the axes,
//
//	f(x) = Π_j f_j(x_j),   F(ξ) = Π_j F_j(ξ_j)
//
// (Fubini). Its sums on rectangular grids factorise axis by axis
// (AliasSumND). Factors returns Dim() families, one per axis; callers must
// not modify the slice.
type Factored interface {
	FamilyND
	Factors() []Family
}

// Separable is the product f(x) = Π_j f_j(x_j) of one-dimensional families,
// one per axis; its transform is Π_j F_j(ξ_j) (Fubini). Axes must hold
// between 1 and MaxDim valid families (see Validate; the entry points check
// it) and must not be modified after the value is built.
type Separable struct {
	Axes []Family
}

// NewSeparable returns the product of the given families, one per axis.
// The slice is copied.
func NewSeparable(axes ...Family) (Separable, error) {
	s := Separable{Axes: append([]Family(nil), axes...)}
	return s, s.Validate()
}

// Validate checks the dimension and every factor; errors name the factor,
// as in "separable.axes[1].gaussian.sigma".
func (s Separable) Validate() error {
	if len(s.Axes) < 1 || len(s.Axes) > MaxDim {
		return invalidf("separable.axes", "dimension must be between 1 and %d, got %d", MaxDim, len(s.Axes))
	}
	for j, f := range s.Axes {
		if err := Validate(f); err != nil {
			return prefixParam(err, "separable.axes["+strconv.Itoa(j)+"]")
		}
	}
	return nil
}

// prefixParam prefixes the parameter path of a *ParamError with p.
func prefixParam(err error, p string) error {
	var pe *ParamError
	if errors.As(err, &pe) {
		return &ParamError{Param: p + "." + pe.Param, Reason: pe.Reason, Err: pe.Err}
	}
	return err
}

// Dim returns the number of axes.
func (s Separable) Dim() int { return len(s.Axes) }

// Factors returns the one-dimensional factors.
func (s Separable) Factors() []Family { return s.Axes }

func (s Separable) String() string {
	parts := make([]string, len(s.Axes))
	for j, f := range s.Axes {
		if f == nil {
			parts[j] = "<nil>"
			continue
		}
		parts[j] = f.String()
	}
	return "separable(" + strings.Join(parts, " × ") + ")"
}

// Value encloses Π_j f_j(x_j). A point of the wrong dimension gives Entire.
func (s Separable) Value(x []Interval) Complex {
	if len(x) != len(s.Axes) {
		return Complex{entire, entire}
	}
	p := RealC(Point(1))
	for j, f := range s.Axes {
		if f == nil {
			return Complex{entire, entire}
		}
		p = p.Mul(f.Value(x[j]))
	}
	return p
}

// Transform encloses Π_j F_j(ξ_j). A point of the wrong dimension gives
// Entire.
func (s Separable) Transform(xi []Interval) Complex {
	if len(xi) != len(s.Axes) {
		return Complex{entire, entire}
	}
	p := RealC(Point(1))
	for j, f := range s.Axes {
		if f == nil {
			return Complex{entire, entire}
		}
		p = p.Mul(f.Transform(xi[j]))
	}
	return p
}

// Spatial returns a radial envelope of |f| derived from the factors'
// spatial envelopes (productEnvelope).
func (s Separable) Spatial() RadialEnvelope {
	envs := make([]Envelope, len(s.Axes))
	for j, f := range s.Axes {
		envs[j] = f.Spatial()
	}
	return productEnvelope(envs)
}

// Spectral returns a radial envelope of |F| derived from the factors'
// spectral envelopes (productEnvelope).
func (s Separable) Spectral() RadialEnvelope {
	envs := make([]Envelope, len(s.Axes))
	for j, f := range s.Axes {
		envs[j] = f.Spectral()
	}
	return productEnvelope(envs)
}

// productEnvelope bounds Π_j g_j(x_j), where |g_j| ≤ envs[j], by a single
// radial term of |x - C|. Write d_j = |x_j - C_j|, r = |d| (Euclidean), and
// for a term with plateau p_j, e_j = max(0, d_j - p_j), so that
// d_j ≤ e_j + p_j and, by the triangle inequality,
//
//	|e| ≥ max(0, r - |p|).                                        (1)
//
// Each factor's envelope is first reduced to one term centred at C_j
// (collapse), then all factors are brought to the weakest decay present
// (convertTo), and finally, with A = Π A_j and P = |p|:
//
//	Gaussian     Π e^{-e_j²/(2σ_j²)} ≤ e^{-|e|²/(2σmax²)}
//	Exponential  Π e^{-α_j e_j} ≤ e^{-αmin Σ e_j} ≤ e^{-αmin |e|}        (Σ e_j ≥ |e|)
//	Algebraic    Π (1+e_j/ℓ_j)^{-q_j} ≤ (1 + Σ e_j/ℓmax)^{-qmin}
//	                ≤ (1 + |e|/ℓmax)^{-qmin}           (Π(1+a_j) ≥ 1 + Σ a_j)
//
// and then (1) gives the profile A·g(max(0, r - P)) with the weakest
// parameters. If every factor has compact support (d_j ≤ R_j), the product
// vanishes outside the box, hence outside the ball of radius
// √Σ R_j², where it is at most A. An empty factor envelope (g_j ≡ 0)
// gives the empty profile.
func productEnvelope(envs []Envelope) RadialEnvelope {
	n := len(envs)
	center := make([]float64, n)
	terms := make([]EnvelopeTerm, n)
	for j, e := range envs {
		if len(e) == 0 {
			return RadialEnvelope{Center: center}
		}
		terms[j] = collapse(e)
		center[j] = terms[j].Center
	}
	return RadialEnvelope{Center: center, Profile: Envelope{productTerm(terms)}}
}

// decayRank orders decays from strongest to weakest.
func decayRank(d Decay) int {
	switch d {
	case Compact:
		return 0
	case Gaussian:
		return 1
	case Exponential:
		return 2
	}
	return 3 // Algebraic, and anything unknown is treated as the weakest
}

// weakest returns the weakest decay among the terms, Compact only if all
// are compact.
func weakest(ts []EnvelopeTerm) Decay {
	w := Compact
	for _, t := range ts {
		if decayRank(t.Decay) > decayRank(w) {
			w = t.Decay
		}
	}
	return w
}

// collapse bounds a one-dimensional envelope Σ_t A_t g_t(max(0, |x-c_t| - p_t))
// by a single term centred at C, the midpoint of the centres:
//
//   - re-centring: |x - c_t| ≥ |x - C| - |c_t - C|, so the plateau grows
//     by |c_t - C|;
//   - convertTo brings every term to the weakest decay present;
//   - same decay: Σ_t A_t g(max(0, d - p_t); θ_t) ≤ (Σ_t A_t)·g(max(0, d - pmax); θweak),
//     since g decreases in its distance and the weakest parameters (σmax,
//     αmin, ℓmax with qmin) give the largest g.
func collapse(e Envelope) EnvelopeTerm {
	cmin, cmax := e[0].Center, e[0].Center
	for _, t := range e[1:] {
		cmin = math.Min(cmin, t.Center)
		cmax = math.Max(cmax, t.Center)
	}
	C := cmin
	if cmax != cmin {
		C = 0.5*cmin + 0.5*cmax
	}
	ts := make([]EnvelopeTerm, len(e))
	for i, t := range e {
		t.Plateau = addUp(t.Plateau, Point(t.Center).AddFloat(-C).Mag())
		t.Center = C
		ts[i] = t
	}
	if len(ts) == 1 {
		return ts[0]
	}
	w := weakest(ts)
	if w == Compact {
		out := EnvelopeTerm{Decay: Compact, Center: C}
		for _, t := range ts {
			out.Amplitude = addUp(out.Amplitude, t.Amplitude)
			out.Width = math.Max(out.Width, addUp(t.Width, t.Plateau))
		}
		return out
	}
	ts, out := convertTo(ts, w)
	out.Center = C
	for _, t := range ts {
		out.Amplitude = addUp(out.Amplitude, t.Amplitude)
		out.Plateau = math.Max(out.Plateau, t.Plateau)
	}
	return out
}

// productTerm bounds the product of single terms (term j in the variable
// x_j, centred at C_j) by one radial term centred at 0 (see
// productEnvelope).
func productTerm(ts []EnvelopeTerm) EnvelopeTerm {
	w := weakest(ts)
	amp := Point(1)
	if w == Compact {
		r2 := Point(0)
		for _, t := range ts {
			amp = amp.Mul(Point(t.Amplitude))
			r2 = r2.Add(Point(addUp(t.Width, t.Plateau)).Sqr())
		}
		return EnvelopeTerm{Decay: Compact, Amplitude: amp.Hi, Width: Sqrt(r2).Hi}
	}
	ts, out := convertTo(ts, w)
	p2 := Point(0)
	for _, t := range ts {
		amp = amp.Mul(Point(t.Amplitude))
		p2 = p2.Add(Point(t.Plateau).Sqr())
	}
	out.Amplitude = amp.Hi
	out.Plateau = Sqrt(p2).Hi
	return out
}

// convertTo returns copies of the terms, each bounding the original and
// of decay w (not Compact), and a term of decay w holding the weakest
// shape parameters of the copies (amplitude, centre and plateau unset).
// The conversions are
//
//	Compact R, plateau p   ≤  any decay with plateau p + R, same amplitude
//	Gaussian σ → Exponential α:  e^{-e²/(2σ²)} ≤ e^{α²σ²/2}·e^{-αe}
//	                             (e²/(2σ²) + α²σ²/2 ≥ αe, AM-GM), α = αmin
//	                             over the exponential rates and the 1/σ,
//	                             so the factor is at most √e
//	Exponential α → Algebraic q: e^{-αe} ≤ (1 + αe/q)^{-q}, width ℓ = q/α
//	                             ((1 + s/q)^q ≤ e^s)
//	Gaussian σ → Algebraic q:    e^{-e²/(2σ²)} ≤ √e·e^{-e/σ} ≤ √e·(1 + e/(qσ))^{-q}
//
// with q = qmin over the algebraic terms. Rounding only ever weakens the
// bound (smaller rates, larger widths, larger amplitudes).
func convertTo(ts []EnvelopeTerm, w Decay) ([]EnvelopeTerm, EnvelopeTerm) {
	out := make([]EnvelopeTerm, len(ts))
	common := EnvelopeTerm{Decay: w}
	sqrtE := Exp(Point(0.5)).Hi
	switch w {
	case Gaussian:
		for _, t := range ts {
			if t.Decay == Gaussian {
				common.Width = math.Max(common.Width, t.Width)
			}
		}
	case Exponential:
		common.Rate = math.Inf(1)
		for _, t := range ts {
			switch t.Decay {
			case Exponential:
				common.Rate = math.Min(common.Rate, t.Rate)
			case Gaussian:
				common.Rate = math.Min(common.Rate, divDown(1, t.Width))
			}
		}
	case Algebraic:
		common.Power = math.Inf(1)
		for _, t := range ts {
			if t.Decay == Algebraic {
				common.Power = math.Min(common.Power, t.Power)
			}
		}
		for _, t := range ts {
			switch t.Decay {
			case Algebraic:
				common.Width = math.Max(common.Width, t.Width)
			case Exponential:
				common.Width = math.Max(common.Width, divUp(common.Power, t.Rate))
			case Gaussian:
				common.Width = math.Max(common.Width, mulUp(common.Power, t.Width))
			}
		}
	}
	for i, t := range ts {
		c := t
		c.Decay = w
		switch {
		case t.Decay == Compact:
			c.Plateau = addUp(t.Plateau, t.Width)
		case t.Decay == Gaussian && w == Exponential:
			f := Exp(Point(common.Rate).Mul(Point(t.Width)).Sqr().Scale(0.5)).Hi
			c.Amplitude = mulUp(t.Amplitude, f)
		case t.Decay == Gaussian && w == Algebraic:
			c.Amplitude = mulUp(t.Amplitude, sqrtE)
		}
		c.Rate, c.Width, c.Power = common.Rate, common.Width, common.Power
		out[i] = c
	}
	return out, common
}
