package bounds

import (
	"errors"
	"math"
	"math/big"
	"math/rand/v2"
	"sort"
	"testing"

	"foldbound/internal/bigref"
)

// profileBig evaluates the term A·g(max(0, |x-c| - p)) at distance r = |x-c|
// in math/big, directly from the definitions in EnvelopeTerm's doc comment.
func profileBig(t EnvelopeTerm, r float64) *big.Float {
	d := bigref.Sub(bigref.New(math.Abs(r)), bigref.New(t.Plateau))
	if d.Sign() < 0 {
		d = bigref.Int(0)
	}
	A := bigref.New(t.Amplitude)
	switch t.Decay {
	case Exponential:
		return bigref.Mul(A, bigref.Exp(bigref.Neg(bigref.Mul(bigref.New(t.Rate), d))))
	case Gaussian:
		u := bigref.Quo(d, bigref.New(t.Width))
		return bigref.Mul(A, bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(u, u), bigref.Int(2)))))
	case Algebraic:
		a := bigref.Add(bigref.Int(1), bigref.Quo(d, bigref.New(t.Width)))
		// a^{-q} = exp(-q log a)
		return bigref.Mul(A, bigref.Exp(bigref.Neg(bigref.Mul(bigref.New(t.Power), bigref.Log(a)))))
	case Compact:
		if d.Cmp(bigref.New(t.Width)) > 0 {
			return bigref.Int(0)
		}
		return A
	}
	panic("unknown decay")
}

// raySumBig sums the term along d, d+h, d+2h, … in math/big. Exponential
// and Gaussian sums run until a term is below 2^-200 of the sum; compact
// ones until the support ends. Algebraic sums are summed for 60 terms past
// the plateau and completed by the integral comparison from below,
//
//	Σ_{j>J} g(x_j) ≥ (1/h) ∫_{x_{J+1}}^∞ A(1+y/ℓ)^{-q} dy = Aℓ(1+x_{J+1}/ℓ)^{1-q}/(h(q-1)),
//
// so the reference never exceeds the true sum: the check bound ≥ reference
// is then a necessary condition that is close to sufficient.
func raySumBig(t EnvelopeTerm, d, h float64) *big.Float {
	sum := bigref.Int(0)
	tiny := new(big.Float).SetMantExp(big.NewFloat(1), -200)
	past := 0
	for j := 0; ; j++ {
		x := d + float64(j)*h
		v := profileBig(t, x)
		sum = bigref.Add(sum, v)
		if x <= t.Plateau {
			continue
		}
		past++
		switch t.Decay {
		case Compact:
			if x-t.Plateau > t.Width {
				return sum
			}
		case Algebraic:
			if past == 60 {
				xn := bigref.New(x + h - t.Plateau)
				a := bigref.Add(bigref.Int(1), bigref.Quo(xn, bigref.New(t.Width)))
				pow := bigref.Exp(bigref.Mul(bigref.New(1-t.Power), bigref.Log(a)))
				rest := bigref.Quo(bigref.Mul(bigref.New(t.Amplitude*t.Width), pow), bigref.New(h*(t.Power-1)))
				return bigref.Add(sum, rest)
			}
		default:
			if bigref.Quo(v, bigref.Add(sum, tiny)).Cmp(tiny) < 0 {
				return sum
			}
		}
	}
}

// TestRayTailContainsBruteForce checks U(d) = tail(d, h) ≥ Σ_j g(|d'+jh|)
// for d' at and just above d — the ray sums of math.md ("Envelopes and their
// bounds"), including starts before the centre (shifted and mis-centred
// windows) — against sums computed in math/big. It also reports the
// tightness U(d)/S(d) for d > plateau, where the bound is meant to be close.
func TestRayTailContainsBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	ratios := map[Decay][]float64{}
	for i := 0; i < 160; i++ {
		term := EnvelopeTerm{Amplitude: 0.5 + rng.Float64()*3}
		switch i % 4 {
		case 0:
			term.Decay = Exponential
			term.Rate = 0.2 + 3*rng.Float64()
		case 1:
			term.Decay = Gaussian
			term.Width = 0.3 + 2*rng.Float64()
		case 2:
			term.Decay = Algebraic
			term.Width = 0.5 + 2*rng.Float64()
			term.Power = 4 + 4*rng.Float64() // fast enough for a direct big sum
		case 3:
			term.Decay = Compact
			term.Width = 5 * rng.Float64()
		}
		if i%5 == 0 {
			term.Plateau = rng.Float64()
		}
		h := 0.1 + 2*rng.Float64()
		d := -3 + 12*rng.Float64()
		bound := term.tail(d, h)
		for _, dd := range []float64{d, d + 0.37*h, d + 1.5*h} {
			want := raySumBig(term, dd, h)
			if !bigref.In(0, bound, want) {
				t.Errorf("%v: tail(%g, %g) = %g < ray sum from %g = %g", term, d, h, bound, dd, bigref.Float64(want))
			}
		}
		if term.Decay != Algebraic || term.Power > 1 {
			if d > term.Plateau {
				if s := bigref.Float64(raySumBig(term, d, h)); s > 1e-300 {
					ratios[term.Decay] = append(ratios[term.Decay], bound/s)
				}
			}
		}
	}
	for _, dec := range []Decay{Exponential, Gaussian, Algebraic, Compact} {
		r := ratios[dec]
		sort.Float64s(r)
		if len(r) == 0 {
			continue
		}
		t.Logf("ray tail bound / true sum, %-11v: median %.4g, max %.4g over %d cases", dec, r[len(r)/2], r[len(r)-1], len(r))
	}
}

// The exponential ray sum is a geometric series: the bound is exact up to
// rounding (math.md: "Exact for e^{-a|x|} at t = 0").
func TestRayTailExponentialExact(t *testing.T) {
	term := EnvelopeTerm{Decay: Exponential, Amplitude: 1, Rate: 0.7}
	for _, d := range []float64{0.5, 1, 3, 10} {
		for _, h := range []float64{0.1, 0.5, 2} {
			got := term.tail(d, h)
			want := math.Exp(-0.7*d) / -math.Expm1(-0.7*h)
			if math.Abs(got-want) > 1e-13*want || got < want*(1-1e-15) {
				t.Errorf("tail(%g, %g) = %.17g, want %.17g", d, h, got, want)
			}
		}
	}
}

// Shifted grids: a bound that puts both nearest omitted points at h(K+1)
// underestimates the tail (math.md: "too small by up to cosh(αt)"). Our
// RayTail uses the true distances, so for a window k = -K..K with offset t
// its two rays must contain the exact sum e^{-α(h(K+1)+t)}/(1-e^{-αh}) +
// e^{-α(h(K+1)-t)}/(1-e^{-αh}).
func TestShiftedWindowTails(t *testing.T) {
	env := Envelope{{Decay: Exponential, Amplitude: 1, Rate: 1.3}}
	const h, K = 0.4, 6
	for _, off := range []float64{0, 0.1, -0.15, 0.199} {
		right := env.RayTail(Point(off+h*(K+1)), 1, h)
		left := env.RayTail(Point(off-h*(K+1)), -1, h)
		x := Point(h * (K + 1))
		q := Point(1).Sub(Exp(Point(-1.3 * h)))
		exact := Exp(x.AddFloat(off).Scale(-1.3)).Add(Exp(x.AddFloat(-off).Scale(-1.3))).Div(q)
		naive := Exp(x.Scale(-1.3)).Scale(2).Div(q)
		if got := addUp(right, left); got < exact.Lo {
			t.Errorf("offset %g: rays %g < exact %g", off, got, exact.Lo)
		}
		if off != 0 && naive.Hi >= exact.Lo {
			t.Errorf("offset %g: the naive centred bound %g should be below the exact tail %g", off, naive.Hi, exact.Lo)
		}
	}
}

func TestEnvelopeValidate(t *testing.T) {
	tests := []struct {
		name string
		give EnvelopeTerm
		path string
	}{
		{"nan amplitude", EnvelopeTerm{Decay: Gaussian, Amplitude: math.NaN(), Width: 1}, "e[0].amplitude"},
		{"negative amplitude", EnvelopeTerm{Decay: Gaussian, Amplitude: -1, Width: 1}, "e[0].amplitude"},
		{"inf center", EnvelopeTerm{Decay: Gaussian, Amplitude: 1, Center: math.Inf(1), Width: 1}, "e[0].center"},
		{"zero rate", EnvelopeTerm{Decay: Exponential, Amplitude: 1}, "e[0].rate"},
		{"zero width", EnvelopeTerm{Decay: Gaussian, Amplitude: 1}, "e[0].width"},
		{"zero power", EnvelopeTerm{Decay: Algebraic, Amplitude: 1, Width: 1}, "e[0].power"},
		{"negative half-width", EnvelopeTerm{Decay: Compact, Amplitude: 1, Width: -1}, "e[0].width"},
		{"negative plateau", EnvelopeTerm{Decay: Compact, Amplitude: 1, Plateau: -1}, "e[0].plateau"},
		{"unknown decay", EnvelopeTerm{Decay: 9, Amplitude: 1}, "e[0].decay"},
	}
	for _, tt := range tests {
		err := Envelope{tt.give}.Validate("e")
		var pe *ParamError
		if !errors.Is(err, ErrInvalid) || !errors.As(err, &pe) || pe.Param != tt.path {
			t.Errorf("%s: Validate = %v, want ErrInvalid at %s", tt.name, err, tt.path)
		}
	}
	if err := (Envelope{{Decay: Algebraic, Amplitude: 1, Width: 1, Power: 0.5}}).Validate("e"); err != nil {
		t.Errorf("an unsummable algebraic envelope is a valid description: %v", err)
	}
}

// A plateau is a flat top: the envelope is A within p of the centre.
func TestEnvelopeAtPlateau(t *testing.T) {
	e := Envelope{{Decay: Exponential, Amplitude: 2, Center: 1, Plateau: 0.5, Rate: 1}}
	for _, tt := range []struct{ x, want float64 }{{1, 2}, {1.5, 2}, {0.5, 2}, {2.5, 2 * math.Exp(-1)}} {
		if got := e.At(Point(tt.x)); got < tt.want || got > tt.want*(1+1e-13) {
			t.Errorf("At(%g) = %.17g, want %.17g", tt.x, got, tt.want)
		}
	}
}

// Moving or dilating an envelope by amounts that round keeps it an upper
// bound: the rounding of the new centre joins the plateau.
func TestEnvelopeShiftedDilatedStayBounds(t *testing.T) {
	e := Envelope{{Decay: Gaussian, Amplitude: 1, Center: 0.1, Width: 0.3}}
	s := e.Shifted(0.2) // 0.1 + 0.2 rounds
	if s[0].Plateau == 0 {
		t.Errorf("Shifted(0.2) of centre 0.1: plateau 0, want the rounding error of 0.30000000000000004")
	}
	d := e.Dilated(3)
	for _, x := range []float64{0.3, 0.31, 1, -0.5} {
		// g(x/3) with g centred at 0.1: exp(-(x/3-0.1)²/(2·0.09))
		want := math.Exp(-math.Pow(x/3-0.1, 2) / (2 * 0.09))
		if got := d.At(Point(x)); got < want*(1-1e-15) {
			t.Errorf("Dilated(3).At(%g) = %g < g(x/3) = %g", x, got, want)
		}
	}
}
