package bounds

import (
	"fmt"
	"math"
	"strconv"
)

// Decay names the shape of an envelope term.
type Decay int

const (
	// Exponential decay A·e^{-α|x-c|}. As a spectral envelope it describes
	// a function analytic in the strip |Im z| < α.
	Exponential Decay = iota + 1
	// Gaussian decay A·e^{-(x-c)²/(2σ²)}.
	Gaussian
	// Algebraic decay A·(1+|x-c|/ℓ)^{-q}, q > 0. As a spectral envelope it
	// describes finite smoothness (about q-1 integrable derivatives). Its
	// one-dimensional tails are summable only for q > 1; sums that need an
	// unsummable tail report so instead of returning a bound.
	Algebraic
	// Compact support: at most A for |x-c| ≤ R and 0 beyond. As a spectral
	// envelope it is a band limit R.
	Compact
)

func (d Decay) String() string {
	switch d {
	case Exponential:
		return "exponential"
	case Gaussian:
		return "gaussian"
	case Algebraic:
		return "algebraic"
	case Compact:
		return "compact"
	}
	return "Decay(" + strconv.Itoa(int(d)) + ")"
}

// EnvelopeTerm is one decaying bump A·g(max(0, |x - c| - p)): flat at
// height A within the plateau p of its centre c, decaying beyond it. Which
// shape parameters are used depends on Decay:
//
//	Exponential  Rate α > 0
//	Gaussian     Width σ > 0
//	Algebraic    Width ℓ > 0, Power q > 0 (summable in 1-D for q > 1)
//	Compact      Width R ≥ 0 (half-width of the support or band)
//
// The plateau also absorbs rounding: when a centre is moved or scaled, the
// rounding error of the new centre is added to the plateau, so the
// envelope stays an upper bound.
type EnvelopeTerm struct {
	Decay     Decay
	Amplitude float64 // A ≥ 0
	Center    float64 // c
	Plateau   float64 // p ≥ 0
	Rate      float64 // α, exponential only
	Width     float64 // σ, ℓ or R
	Power     float64 // q, algebraic only
}

// Envelope bounds a function's modulus by a finite sum of terms:
// |g(x)| ≤ Σ_j term_j(x). An empty envelope means g ≡ 0.
type Envelope []EnvelopeTerm

func (t EnvelopeTerm) String() string {
	switch t.Decay {
	case Exponential:
		return fmt.Sprintf("exponential(amplitude=%g, center=%g, rate=%g%s)", t.Amplitude, t.Center, t.Rate, t.plateauString())
	case Gaussian:
		return fmt.Sprintf("gaussian(amplitude=%g, center=%g, width=%g%s)", t.Amplitude, t.Center, t.Width, t.plateauString())
	case Algebraic:
		return fmt.Sprintf("algebraic(amplitude=%g, center=%g, width=%g, power=%g%s)", t.Amplitude, t.Center, t.Width, t.Power, t.plateauString())
	case Compact:
		return fmt.Sprintf("compact(amplitude=%g, center=%g, halfwidth=%g%s)", t.Amplitude, t.Center, t.Width, t.plateauString())
	}
	return t.Decay.String()
}

func (t EnvelopeTerm) plateauString() string {
	if t.Plateau == 0 {
		return ""
	}
	return fmt.Sprintf(", plateau=%g", t.Plateau)
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// Validate checks every term; path prefixes the parameter names in errors,
// as in "spectral[0].rate".
func (e Envelope) Validate(path string) error {
	for i, t := range e {
		if err := t.validate(); err != nil {
			pe := err.(*ParamError)
			pe.Param = fmt.Sprintf("%s[%d].%s", path, i, pe.Param)
			return pe
		}
	}
	return nil
}

// validate checks one term; the error's Param is the field name alone.
func (t EnvelopeTerm) validate() error {
	if !finite(t.Amplitude) || t.Amplitude < 0 {
		return invalidf("amplitude", "must be finite and ≥ 0, got %g", t.Amplitude)
	}
	if !finite(t.Center) {
		return invalidf("center", "must be finite, got %g", t.Center)
	}
	if !finite(t.Plateau) || t.Plateau < 0 {
		return invalidf("plateau", "must be finite and ≥ 0, got %g", t.Plateau)
	}
	switch t.Decay {
	case Exponential:
		if !finite(t.Rate) || t.Rate <= 0 {
			return invalidf("rate", "must be finite and > 0, got %g", t.Rate)
		}
	case Gaussian:
		if !finite(t.Width) || t.Width <= 0 {
			return invalidf("width", "must be finite and > 0, got %g", t.Width)
		}
	case Algebraic:
		if !finite(t.Width) || t.Width <= 0 {
			return invalidf("width", "must be finite and > 0, got %g", t.Width)
		}
		if !finite(t.Power) || t.Power <= 0 {
			return invalidf("power", "must be finite and > 0, got %g", t.Power)
		}
	case Compact:
		if !finite(t.Width) || t.Width < 0 {
			return invalidf("width", "must be finite and ≥ 0, got %g", t.Width)
		}
	default:
		return invalidf("decay", "unknown decay %d", int(t.Decay))
	}
	return nil
}

// Shifted returns the envelope of g(x - c) given the envelope e of g:
// centres move by c, and any rounding of a new centre joins its plateau.
func (e Envelope) Shifted(c float64) Envelope {
	out := make(Envelope, len(e))
	for i, t := range e {
		nc := t.Center + c
		if err := twoSumErr(t.Center, c, nc); err != 0 {
			t.Plateau = addUp(t.Plateau, math.Abs(err))
		}
		t.Center = nc
		out[i] = t
	}
	return out
}

// Scaled returns the envelope with every amplitude multiplied by k ≥ 0,
// rounded upward.
func (e Envelope) Scaled(k float64) Envelope {
	out := make(Envelope, len(e))
	for i, t := range e {
		t.Amplitude = mulUp(t.Amplitude, k)
		out[i] = t
	}
	return out
}

// Dilated returns the envelope of g(x/a) given the envelope e of g, for
// a > 0 (see dilateEnvelope).
func (e Envelope) Dilated(a float64) Envelope {
	return dilateEnvelope(e, false, Point(a))
}

// dilateEnvelope returns an envelope of g(x/b), for every b in the interval
// B (B.Lo > 0), given an envelope e of g; with reflect it is an envelope of
// g(-x/b). A term A·g(max(0, |y - c| - p)) becomes at y = x/b
//
//	A·g(max(0, |x - bc| - bp)/b) ≤ A·g(max(0, |x - c'| - p')/B.Hi)
//
// for any centre c' and p' ≥ p·B.Hi + max_b |bc - c'|, because every
// profile g is non-increasing; so rates are divided by B.Hi (rounded down)
// and widths multiplied by B.Hi (rounded up): every rounding is on the safe
// side.
func dilateEnvelope(e Envelope, reflect bool, B Interval) Envelope {
	out := append(Envelope(nil), e...)
	dilateTerms(out, reflect, B)
	return out
}

// dilateTerms is dilateEnvelope in place.
func dilateTerms(e Envelope, reflect bool, B Interval) {
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
		e[i] = t
	}
}

// twoSumErr returns the exact rounding error (a + b) - s of s = RN(a + b)
// (Knuth's TwoSum).
func twoSumErr(a, b, s float64) float64 {
	bb := s - a
	return (a - (s - bb)) + (b - bb)
}

// Plus returns the envelope of a sum: the terms of both.
func (e Envelope) Plus(f Envelope) Envelope {
	out := make(Envelope, 0, len(e)+len(f))
	return append(append(out, e...), f...)
}

// dist encloses |x - c| for x in the interval.
func dist(x Interval, c float64) Interval {
	return x.AddFloat(-c).Abs()
}

// at returns an upper bound of the term over distances d ≥ dLo ≥ 0.
func (t EnvelopeTerm) at(dLo float64) float64 {
	dLo = addDown(dLo, -t.Plateau)
	if dLo < 0 {
		dLo = 0
	}
	d := Point(dLo)
	A := t.Amplitude
	switch t.Decay {
	case Exponential:
		return mulUp(A, Exp(d.Scale(-t.Rate)).Hi)
	case Gaussian:
		u := d.Div(Point(t.Width)).Sqr().Scale(-0.5)
		return mulUp(A, Exp(u).Hi)
	case Algebraic:
		base := d.Div(Point(t.Width)).AddFloat(1)
		return mulUp(A, Pow(base, -t.Power).Hi)
	case Compact:
		if dLo > t.Width {
			return 0
		}
		return A
	}
	return math.Inf(1)
}

// At returns an upper bound of the envelope over every point of x.
func (e Envelope) At(x Interval) float64 {
	s := 0.0
	for _, t := range e {
		s = addUp(s, t.at(dist(x, t.Center).Lo))
	}
	return s
}

// rayFrom returns B(x0) ≥ Σ_{j≥0} g(x0 + j·h) for x0 > 0, h > 0, where g is
// the term's profile (with its amplitude):
//
//	Exponential  e^{-αx0} / (1 - e^{-αh})                         (exact)
//	Gaussian     min{ g(x0)/(1-ρ), g(x0) + σ√(π/2)·erfc(x0/(σ√2))/h },
//	             ρ = exp(-(2x0h + h²)/(2σ²))
//	Algebraic    a^{-q} + a^{1-q}/(c(q-1)),  a = 1 + x0/ℓ, c = h/ℓ
//	Compact      ⌊(R - x0)/h⌋ + 1 points if x0 ≤ R, else 0
//
// The Gaussian bound takes the ratio of consecutive terms, which decreases
// along the ray (for ρ ≤ e^{-40} simply 1 - ρ ≥ 1 - 2⁻⁵³), and the
// integral comparison for a decreasing g; the algebraic one is the
// integral comparison. Both are in math.md ("Envelopes and their bounds").
func (t EnvelopeTerm) rayFrom(x0, h float64) float64 {
	A := t.Amplitude
	if A == 0 {
		return 0
	}
	X := Point(x0)
	H := Point(h)
	switch t.Decay {
	case Exponential:
		num := Exp(X.Scale(-t.Rate))
		den := Expm1(H.Scale(-t.Rate)).Neg() // 1 - e^{-αh} > 0
		return mulUp(A, num.Div(den).Hi)
	case Gaussian:
		s := Point(t.Width)
		g0 := Exp(X.Div(s).Sqr().Scale(-0.5))
		// ρ ≤ e^{-40} < 2⁻⁵³: 1 - ρ ≥ 1 - 2⁻⁵³, a float64. The float64
		// exponent is within a few ulps of the exact one, so 41 leaves
		// room for its rounding.
		if e := (2*x0*h + h*h) / (2 * t.Width * t.Width); e >= 41 {
			return mulUp(A, divUp(g0.Hi, 1-0x1p-53))
		}
		// 1 - ρ = -expm1(-(2x0h+h²)/(2σ²))
		expo := X.Scale(2).Mul(H).Add(H.Sqr()).Div(s.Sqr().Scale(2))
		oneMinusRho := Expm1(expo.Neg()).Neg()
		b1 := g0.Div(oneMinusRho).Hi
		if oneMinusRho.Lo >= 0.75 {
			// ρ ≤ 1/4: b1 is within 4/3 of the first term, itself a lower
			// bound of the sum; the integral comparison cannot gain much.
			return mulUp(A, b1)
		}
		// σ√(π/2)·erfc(x0/(σ√2))/h
		sqrtHalfPi := Sqrt(Pi.Scale(0.5))
		integral := s.Mul(sqrtHalfPi).Mul(Erfc(X.Div(s.Mul(Sqrt(Point(2)))))).Div(H)
		b2 := g0.Add(integral).Hi
		return mulUp(A, math.Min(b1, b2))
	case Algebraic:
		if t.Power <= 1 {
			return math.Inf(1)
		}
		l := Point(t.Width)
		a := X.Div(l).AddFloat(1)
		c := H.Div(l)
		first := Pow(a, -t.Power)            // a^{-q}
		qm1 := Point(t.Power).AddFloat(-1)   // q - 1, enclosed
		rest := a.Mul(first).Div(c.Mul(qm1)) // a^{1-q}/(c(q-1))
		return mulUp(A, first.Add(rest).Hi)
	case Compact:
		if x0 > t.Width {
			return 0
		}
		n := math.Floor(divUp(addUp(t.Width, -x0), h)) + 1
		return mulUp(A, n)
	}
	return math.Inf(1)
}

// tail returns U(d), an upper bound, valid for every d' ≥ d, on the ray sum
//
//	S(d') = Σ_{j≥0} A·g(max(0, |d' + j·h| - p)).
//
// Beyond the plateau (d > p) the sum is decreasing in d, so U(d) = B(d-p).
// Otherwise the ray crosses the centre. Without a plateau, its points left of
// the centre are at distances e, e+h, … with e ∈ [0, h) and those right of it
// at h-e, 2h-e, …; one of e, h-e is at least h/2, so
//
//	S ≤ S(0) + S(h/2) ≤ g(0) + B(h) + B(h/2).
//
// With a plateau, at most ⌊2p/h⌋+1 points lie on it, and the points on
// either side of it form rays whose reduced distances start in [0, h), so
//
//	S ≤ (⌊2p/h⌋ + 3)·g(0) + 2·B(h).
//
// Taking U(d) = min(B(d-p), C) for d > p, with C the constant above, keeps U
// non-increasing.
func (t EnvelopeTerm) tail(d, h float64) float64 {
	d = addDown(d, -t.Plateau)
	if d >= h {
		// B is non-increasing, so B(d) ≤ B(h) ≤ C: no need for C.
		return t.rayFrom(d, h)
	}
	var b float64 // B(d), for d > 0
	if d > 0 {
		// C ≥ g(0) ≥ A: when B(d) ≤ A, min(B(d), C) = B(d), and C
		// (two more ray bounds) need not be computed.
		if b = t.rayFrom(d, h); b <= t.Amplitude {
			return b
		}
	}
	g0 := t.at(0)
	var c float64
	if t.Plateau == 0 {
		c = addUp(addUp(g0, t.rayFrom(h, h)), t.rayFrom(h/2, h))
	} else {
		n := math.Floor(divUp(mulUp(2, t.Plateau), h)) + 3
		c = addUp(mulUp(n, g0), mulUp(2, t.rayFrom(h, h)))
	}
	if d <= 0 {
		return c
	}
	return math.Min(b, c)
}

// RayTail returns an upper bound, valid for every start point x0 in the
// interval, on the envelope summed along the ray x0, x0+dir·h, x0+2·dir·h, …
// (dir = +1 walks right, -1 walks left):
//
//	Σ_{j≥0} Σ_terms g(|x0 + dir·j·h - c|).
//
// It is +Inf if a term's tail is not summable.
func (e Envelope) RayTail(x0 Interval, dir int, h float64) float64 {
	s := 0.0
	for _, t := range e {
		// Signed distance of the start from the centre, measured along the
		// ray; the worst case over x0 is the smallest.
		var d float64
		if dir >= 0 {
			d = x0.AddFloat(-t.Center).Lo
		} else {
			d = x0.AddFloat(-t.Center).Neg().Lo
		}
		s = addUp(s, t.tail(d, h))
	}
	return s
}

// rayTails is RayTail(right, 1, h) + RayTail(left, -1, h), rounded up. An
// exponential term whose two rays both start beyond its plateau, the usual
// case, shares the denominator 1 - e^{-αh} of rayFrom between them.
func (e Envelope) rayTails(right, left Interval, h float64) float64 {
	s := 0.0
	for _, t := range e {
		dR := addDown(right.AddFloat(-t.Center).Lo, -t.Plateau)
		dL := addDown(left.AddFloat(-t.Center).Neg().Lo, -t.Plateau)
		if t.Decay == Exponential && dR >= h && dL >= h && t.Amplitude > 0 {
			// A·(e^{-α dR} + e^{-α dL})/(1 - e^{-αh}), as rayFrom.
			num := Exp(Point(dR).Scale(-t.Rate)).Add(Exp(Point(dL).Scale(-t.Rate)))
			den := Expm1(Point(h).Scale(-t.Rate)).Neg()
			s = addUp(s, mulUp(t.Amplitude, num.Div(den).Hi))
			continue
		}
		s = addUp(s, addUp(t.tail(right.AddFloat(-t.Center).Lo, h), t.tail(left.AddFloat(-t.Center).Neg().Lo, h)))
	}
	return s
}

// LatticeSum returns an upper bound on Σ_{k∈Z} env(x0 + k·h) valid for
// every x0 in the interval.
func (e Envelope) LatticeSum(x0 Interval, h float64) float64 {
	return addUp(e.RayTail(x0, 1, h), e.RayTail(x0.AddFloat(-h), -1, h))
}

// String lists the terms joined by " + ", or "0" for the empty envelope.
func (e Envelope) String() string {
	if len(e) == 0 {
		return "0"
	}
	s := ""
	for i, t := range e {
		if i > 0 {
			s += " + "
		}
		s += t.String()
	}
	return s
}

// Kinds names the decays of the terms, joined by "+" ("gaussian",
// "exponential+algebraic"), or "none" for the empty envelope.
func (e Envelope) Kinds() string {
	switch len(e) {
	case 0:
		return "none"
	case 1:
		return e[0].Decay.String()
	}
	s := e[0].Decay.String()
	for _, t := range e[1:] {
		s += "+" + t.Decay.String()
	}
	return s
}

// estimate returns a float64 approximation of tail(d, h) without interval
// arithmetic, for deciding how many terms to sum before the rigorous tail
// is computed once. It is not a bound.
func (t EnvelopeTerm) estimate(d, h float64) float64 {
	d -= t.Plateau
	if d < h/2 {
		d = h / 2 // near or past the centre: the tail is of the order of the peak
	}
	A := t.Amplitude
	switch t.Decay {
	case Exponential:
		return A * math.Exp(-t.Rate*d) / -math.Expm1(-t.Rate*h)
	case Gaussian:
		u := d / t.Width
		g := A * math.Exp(-0.5*u*u)
		if r := (2*d*h + h*h) / (2 * t.Width * t.Width); r < 8 {
			return g / -math.Expm1(-r) // 1/(1-ρ); beyond r = 8 it is 1 to 3e-4
		}
		return g
	case Algebraic:
		if t.Power <= 1 {
			return math.Inf(1)
		}
		a := 1 + d/t.Width
		c := h / t.Width
		// a^{-q} + a^{1-q}/(c(q-1)) with one power.
		return A * powNegEstimate(a, t.Power) * (1 + a/(c*(t.Power-1)))
	case Compact:
		if d > t.Width {
			return 0
		}
		return A * (math.Floor((t.Width-d)/h) + 1)
	}
	return math.Inf(1)
}

// powNegEstimate returns a^{-q} in float64 for a ≥ 1, q > 0 (not a bound):
// by repeated multiplication for small integer q (the B-spline orders),
// math.Pow otherwise.
func powNegEstimate(a, q float64) float64 {
	if q == math.Trunc(q) && q <= 16 {
		r := 1.0
		for range int(q) {
			r *= a
		}
		return 1 / r
	}
	return math.Pow(a, -q)
}

// RayEstimate approximates RayTail at the midpoint of x0, in float64; it is
// not a bound (see EnvelopeTerm.estimate).
func (e Envelope) RayEstimate(x0 float64, dir int, h float64) float64 {
	s := 0.0
	for _, t := range e {
		d := x0 - t.Center
		if dir < 0 {
			d = -d
		}
		s += t.estimate(d, h)
	}
	return s
}

// centred reports whether every term is centred at 0, so that the envelope
// is even.
func (e Envelope) centred() bool {
	for _, t := range e {
		if t.Center != 0 {
			return false
		}
	}
	return true
}

// hasDecay reports whether some term has decay d.
func (e Envelope) hasDecay(d Decay) bool {
	for _, t := range e {
		if t.Decay == d {
			return true
		}
	}
	return false
}
