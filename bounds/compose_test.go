package bounds

import (
	"errors"
	"math"
	"math/big"
	"math/cmplx"
	"strings"
	"testing"

	"foldbound/internal/bigref"
)

func mustFamily[T Family](f T, err error) T {
	if err != nil {
		panic(err)
	}
	return f
}

// The composition rules (shift, dilation, modulation, amplitude, sum;
// math.md, catalogue) against direct quadrature of the composed function
// written out in the test (gonum quad.Legendre; every function here decays
// at least like e^{-|x|/3} beyond the window, which bounds the tail).
func TestComposeTransformQuadrature(t *testing.T) {
	sech := func(u float64) float64 { return 1 / math.Cosh(u) }
	c := complex(2, -3)
	var tests []transformCase
	add := func(fam Family, f func(float64) complex128, X, scale, tailBound float64, breaks ...float64) {
		tests = append(tests, transformCase{
			name: fam.String(), fam: fam, f: f,
			xis: []float64{0, 0.4, -1.3, 3, 7.5},
			lo:  -X, hi: X, scale: scale, breaks: breaks,
			tail: func(float64) (complex128, float64) { return 0, tailBound },
			abs:  1e-14, rel: 1e-12,
		})
	}
	add(mustFamily(NewAmplitude(c, SechFamily{1})),
		func(x float64) complex128 { return c * complex(sech(x), 0) }, 50, 0.5, 4*cmplx.Abs(c)*math.Exp(-50))
	add(mustFamily(NewShift(1.5, SechFamily{0.7})),
		func(x float64) complex128 { return complex(sech((x-1.5)/0.7), 0) }, 45, 0.3, 4*0.7*math.Exp(-43.5/0.7))
	add(mustFamily(NewShift(-2.3, ExponentialFamily{1.2})),
		func(x float64) complex128 { return complex(math.Exp(-1.2*math.Abs(x+2.3)), 0) }, 45, 0.3, 2*math.Exp(-1.2*42.7)/1.2, -2.3)
	add(mustFamily(NewDilation(2.5, WavePacketFamily{1, 3})),
		func(x float64) complex128 {
			u := x / 2.5
			return complex(math.Exp(-u*u/2)*math.Cos(3*u), 0)
		}, 30, 0.2, 1e-40)
	add(mustFamily(NewDilation(-0.6, ShiftFamily{1, SechSquaredFamily{1}})),
		func(x float64) complex128 { s := sech(x/-0.6 - 1); return complex(s*s, 0) }, 20, 0.1, 4*0.6*math.Exp(-2*(20/0.6-1)))
	add(mustFamily(NewModulation(4, ExponentialFamily{2})),
		func(x float64) complex128 { return complex(math.Exp(-2*math.Abs(x)), 0) * cmplx.Exp(complex(0, 4*x)) }, 25, 0.1, math.Exp(-50), 0)
	add(mustFamily(NewSum(
		ShiftFamily{1, SechFamily{1}},
		AmplitudeFamily{0, 0.5, DilationFamily{2, SechSquaredFamily{1}}},
		ModulationFamily{-3, WavePacketFamily{0.6, 1.5}},
	)), func(x float64) complex128 {
		s2 := sech(x / 2)
		return complex(sech(x-1), 0) + complex(0, 0.5*s2*s2) +
			complex(math.Exp(-x*x/(2*0.36))*math.Cos(1.5*x), 0)*cmplx.Exp(complex(0, -3*x))
	}, 50, 0.1, 4*math.Exp(-49)+4*math.Exp(-50))
	add(mustFamily(NewShift(0.7, DilationFamily{-1.3, ModulationFamily{2, SumFamily{[]Family{SechFamily{1}, ExponentialFamily{3}}}}})),
		func(x float64) complex128 {
			u := (x - 0.7) / -1.3
			return complex(sech(u)+math.Exp(-3*math.Abs(u)), 0) * cmplx.Exp(complex(0, 2*u))
		}, 60, 0.1, 4*1.3*math.Exp(-59.3/1.3)+1e-30, 0.7)
	checkTransforms(t, tests)
}

// carrierSamples returns f(x_k)·e^{iωx_k} for ω given in math/big, the
// carrier by the recurrence e^{iωx_{k+1}} = e^{iωx_k}·e^{iωh} (bigref.Cis of
// large arguments is slow).
func carrierSamples(omega *big.Float, f func(x *big.Float) bigref.Complex) func(h, s float64, lo, hi int64) []bigref.Complex {
	return func(h, s float64, lo, hi int64) []bigref.Complex {
		out := pointSamples(f)(h, s, lo, hi)
		z := bigref.Cis(bigref.Mul(omega, bigX(h, s, lo)))
		w := bigref.Cis(bigref.Mul(omega, bigref.New(h)))
		for i := range out {
			out[i] = out[i].Mul(z)
			z = z.Mul(w)
		}
		return out
	}
}

// sechFromExp returns sech u = 2E/(1+E²) from E = e^{-|u|}.
func sechFromExp(e *big.Float) *big.Float {
	return bigref.Quo(bigref.Mul(bigref.Int(2), e), bigref.Add(bigref.Int(1), bigref.Mul(e, e)))
}

// bigSechRef returns sech(u) in math/big.
func bigSechRef(u *big.Float) *big.Float { return bigref.Sech(u) }

// composedRefs lists composed families with math/big references written out
// in the test, and analytic tail bounds from their decay.
func composedRefs() []struct {
	fam Family
	ref bigFamily
	L   float64
} {
	bf := bigref.New
	cis := func(theta *big.Float) bigref.Complex { return bigref.Cis(theta) }
	gauss := func(u *big.Float) *big.Float { // e^{-u²/2}
		return bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(u, u), bigref.Int(2))))
	}
	type entry = struct {
		fam Family
		ref bigFamily
		L   float64
	}
	c := complex(1.5, -0.5)
	return []entry{
		{
			// c·sech(x - 0.8)  →  c·e^{-0.8iξ}·π·sech(πξ/2).
			fam: mustFamily(NewAmplitude(c, ShiftFamily{0.8, SechFamily{1}})),
			L:   1,
			ref: bigFamily{
				samples: func(h, s float64, lo, hi int64) []bigref.Complex {
					es := geometricSamples(bigref.Int(1), bf(0.8), h, s, lo, hi)
					out := make([]bigref.Complex, len(es))
					for i, e := range es {
						out[i] = bigref.C(real(c), imag(c)).Scale(sechFromExp(e))
					}
					return out
				},
				tail: expTail(2*cmplx.Abs(c), 0.8, 1),
				transform: func(xi *big.Float) bigref.Complex {
					F := bigref.Mul(bigref.Pi(), bigSechRef(bigref.Quo(bigref.Mul(bigref.Pi(), xi), bigref.Int(2))))
					return cis(bigref.Neg(bigref.Mul(xi, bf(0.8)))).Scale(F).Mul(bigref.C(real(c), imag(c)))
				},
				specBound: func(d float64) float64 { return cmplx.Abs(c) * 2 * math.Pi * math.Exp(-math.Pi*d/2) },
			},
		},
		{
			// g(x/a)e^{2ix/a}, g = e^{-x²/2}, a = -1.7  →  |a|√(2π)e^{-(aξ-2)²/2}.
			fam: mustFamily(NewDilation(-1.7, ModulationFamily{2, GaussianFamily{1}})),
			L:   1.7,
			ref: bigFamily{
				samples: carrierSamples(bigref.Quo(bf(2), bf(-1.7)), func(x *big.Float) bigref.Complex {
					return bigref.Real(gauss(bigref.Quo(x, bf(-1.7))))
				}),
				tail: gaussTail(1, 0, 1.7),
				transform: func(xi *big.Float) bigref.Complex {
					d := bigref.Sub(bigref.Mul(bf(-1.7), xi), bf(2))
					return bigref.Real(bigref.Mul(bigref.Mul(bf(1.7), bigref.Sqrt(bigref.Mul(bigref.Pi(), bigref.Int(2)))), gauss(d)))
				},
				specBound: func(d float64) float64 { return 1.7 * math.Sqrt(2*math.Pi) * math.Exp(-1.7*1.7*d*d/2) },
				specR:     2 / 1.7,
			},
		},
		{
			// sech²(2(x+1)) + 0.3i·sech(x/2) + e^{-x²/0.72}cos(1.5x)e^{-3ix}.
			fam: mustFamily(NewSum(
				ShiftFamily{-1, SechSquaredFamily{0.5}},
				AmplitudeFamily{0, 0.3, DilationFamily{2, SechFamily{1}}},
				ModulationFamily{-3, WavePacketFamily{0.6, 1.5}},
			)),
			L: 1,
			ref: bigFamily{
				samples: func(h, s float64, lo, hi int64) []bigref.Complex {
					e1 := geometricSamples(bigref.Int(2), bf(-1), h, s, lo, hi)
					e2 := geometricSamples(bf(0.5), nil, h, s, lo, hi)
					ab := make([]bigref.Complex, len(e1))
					for i := range ab {
						s2 := sechFromExp(e1[i])
						ab[i] = bigref.Complex{Re: bigref.Mul(s2, s2), Im: bigref.Mul(bf(0.3), sechFromExp(e2[i]))}
					}
					// e^{-x²/0.72}cos(1.5x)e^{-3ix} = e^{-x²/0.72}(e^{-1.5ix} + e^{-4.5ix})/2.
					g := gaussianSamples(0.6, h, s, lo, hi)
					c1, c2 := cisSamples(-1.5, h, s, lo, hi), cisSamples(-4.5, h, s, lo, hi)
					for i := range ab {
						// Skip Gaussian terms below 2⁻⁶⁰⁰ of the others: big.Float
						// addition aligns mantissas, so adding e^{-10⁵} costs 10⁵ bits.
						if g[i].MantExp(nil) < ab[i].Re.MantExp(nil)-600 {
							continue
						}
						w := c1[i].Add(c2[i]).Scale(bigref.Quo(g[i], bigref.Int(2)))
						ab[i] = ab[i].Add(w)
					}
					return ab
				},
				tail: func(h, s float64, lo, hi int64) float64 {
					return expTail(4, -1, 4)(h, s, lo, hi) + expTail(0.6, 0, 0.5)(h, s, lo, hi) + gaussTail(1, 0, 0.6)(h, s, lo, hi)
				},
				transform: func(xi *big.Float) bigref.Complex {
					// sech²(2(x+1)): e^{-iξ}·(π/4)·ξ/sinh(πξ/4)... written as
					// w·(πwξ)/sinh(πwξ/2) with w = 1/2.
					var a *big.Float
					if xi.Sign() == 0 {
						a = bigref.Int(1)
					} else {
						pw := bigref.Quo(bigref.Pi(), bigref.Int(2))
						a = bigref.Quo(bigref.Mul(bigref.Quo(pw, bigref.Int(2)), xi), bigref.Sinh(bigref.Quo(bigref.Mul(pw, xi), bigref.Int(2))))
					}
					A := cis(xi).Scale(a) // shift by -1: e^{+iξ}
					// 0.3i·2π·sech(πξ).
					B := bigref.Complex{Re: bigref.Int(0), Im: bigref.Mul(bigref.Mul(bf(0.6), bigref.Pi()), bigSechRef(bigref.Mul(bigref.Pi(), xi)))}
					// Wave packet at ξ + 3.
					e := bigref.Add(xi, bf(3))
					g := bigref.Add(gauss(bigref.Mul(bf(0.6), bigref.Sub(e, bf(1.5)))), gauss(bigref.Mul(bf(0.6), bigref.Add(e, bf(1.5)))))
					C := bigref.Real(bigref.Mul(bigref.Mul(bf(0.6), bigref.Sqrt(bigref.Quo(bigref.Pi(), bigref.Int(2)))), g))
					return A.Add(B).Add(C)
				},
				specBound: func(d float64) float64 {
					return 2*math.Exp(-math.Pi*d/8) + 0.6*2*math.Pi*math.Exp(-math.Pi*d) +
						2*0.6*math.Sqrt(math.Pi/2)*math.Exp(-0.36*d*d/2)
				},
				specR: 4.5,
			},
		},
		{
			// (sech u + e^{-3|u|})e^{2iu}, u = (x - 0.7)/(-1.3).
			fam: mustFamily(NewShift(0.7, DilationFamily{-1.3, ModulationFamily{2, SumFamily{[]Family{SechFamily{1}, ExponentialFamily{3}}}}})),
			L:   1.3,
			ref: bigFamily{
				// e^{2iu} = e^{2i(x-0.7)/(-1.3)} = e^{-1.4i/(-1.3)}·e^{i(2/(-1.3))x}.
				// |u| = |x - 0.7|/1.3.
				samples: func(h, s float64, lo, hi int64) []bigref.Complex {
					e1 := geometricSamples(bigref.Quo(bigref.Int(1), bf(1.3)), bf(0.7), h, s, lo, hi)
					e3 := geometricSamples(bigref.Quo(bigref.Int(3), bf(1.3)), bf(0.7), h, s, lo, hi)
					c0 := cis(bigref.Quo(bf(-1.4), bf(-1.3)))
					out := make([]bigref.Complex, len(e1))
					for i := range out {
						out[i] = c0.Scale(bigref.Add(sechFromExp(e1[i]), e3[i]))
					}
					z := bigref.Cis(bigref.Mul(bigref.Quo(bf(2), bf(-1.3)), bigX(h, s, lo)))
					w := bigref.Cis(bigref.Mul(bigref.Quo(bf(2), bf(-1.3)), bigref.New(h)))
					for i := range out {
						out[i] = out[i].Mul(z)
						z = z.Mul(w)
					}
					return out
				},
				tail: func(h, s float64, lo, hi int64) float64 {
					return expTail(2, 0.7, 1/1.3)(h, s, lo, hi) + expTail(1, 0.7, 3/1.3)(h, s, lo, hi)
				},
				transform: func(xi *big.Float) bigref.Complex {
					// G(η) = π sech(πη/2) + 6/(9+η²) at η = aξ - 2, times |a| e^{-0.7iξ}.
					eta := bigref.Sub(bigref.Mul(bf(-1.3), xi), bf(2))
					G := bigref.Add(bigref.Mul(bigref.Pi(), bigSechRef(bigref.Quo(bigref.Mul(bigref.Pi(), eta), bigref.Int(2)))),
						bigref.Quo(bigref.Int(6), bigref.Add(bigref.Int(9), bigref.Mul(eta, eta))))
					return cis(bigref.Neg(bigref.Mul(bf(0.7), xi))).Scale(bigref.Mul(bf(1.3), G))
				},
			},
		},
	}
}

// composeCases returns 40 grids and frequencies for a composed family of
// length scale L: steps 2L to L/5 (the references evaluate f sample by
// sample), shifts and frequencies as in standardCases.
func composeCases(L float64) []containCase {
	var out []containCase
	for _, c := range standardCases(L) {
		if c.g.Step >= 0.2*L {
			out = append(out, c)
		}
	}
	for _, h := range []float64{0.2 * L} {
		nyq := math.Pi / h
		out = append(out,
			containCase{g: Grid{Step: h}},
			containCase{g: Grid{Step: h, Shift: 0.3 * h}, xi: 0.5 * nyq},
			containCase{g: Grid{Step: h, Shift: -1.7 * L}, xi: 0.9 * nyq},
			containCase{g: Grid{Step: h, Shift: 0.5 * h}, xi: 1.3 * nyq},
			containCase{g: Grid{Step: h, Shift: 2.2 * L, Count: 1}, xi: 0.2 * nyq},
			containCase{g: Grid{Step: h, Count: 45}},
			containCase{g: Grid{Step: h, Shift: 0.37 * h, Count: 64}, xi: 0.7 * nyq},
			containCase{g: Grid{Step: h, Shift: -0.8 * L, Count: 81}, xi: 1.0 / L},
		)
	}
	return out
}

// Containment for composed families: math/big lattice sums of the composed
// functions written out in the test lie in AliasSum's enclosures.
func TestComposeContainment(t *testing.T) {
	for _, c := range composedRefs() {
		checkContainment(t, c.fam, c.ref, composeCases(c.L))
	}
}

// The derived envelopes are certified: |f(x)| ≤ Spatial().At(x) and
// |F(ξ)| ≤ Spectral().At(ξ) against the math/big references, including a
// reflecting dilation (whose envelope must move to the mirrored centre).
func TestComposeEnvelopesCertified(t *testing.T) {
	for _, c := range composedRefs() {
		for _, x := range testPoints(60 * c.L) {
			v := bigValue(c.ref, x)
			if b := c.fam.Spatial().At(Point(x)); !bigref.In(math.Inf(-1), b, v.Abs()) {
				t.Errorf("%v: spatial envelope at %g = %.17g, below |f| = %.20g (math/big)", c.fam, x, b, v.Abs())
			}
			xi := x / (c.L * c.L)
			F := c.ref.transform(bigref.New(xi))
			if b := c.fam.Spectral().At(Point(xi)); !bigref.In(math.Inf(-1), b, F.Abs()) {
				t.Errorf("%v: spectral envelope at %g = %.17g, below |F| = %.20g (math/big)", c.fam, xi, b, F.Abs())
			}
		}
	}
	// A reflected, shifted bump: f(x) = sech(x/(-2) - 3), centred at x = -6.
	f := mustFamily(NewDilation(-2, ShiftFamily{3, SechFamily{1}}))
	env := f.Spatial()
	for _, x := range []float64{-6, -20, -40, 6, 20} {
		want := 1 / math.Cosh(x/-2-3)
		if b := env.At(Point(x)); b < want {
			t.Errorf("%v: spatial envelope at %g = %g, below f = %g", f, x, b, want)
		}
	}
	if got := env.At(Point(-40)); got > 1e-6 {
		t.Errorf("%v: spatial envelope at -40 = %g, want the decay of a bump at -6 (≈ 2e^{-17})", f, got)
	}
}

// Bad composed families are ErrInvalid with the path of the parameter.
func TestComposeValidate(t *testing.T) {
	g := GaussianFamily{1}
	nan, inf := math.NaN(), math.Inf(1)
	chain := func(n int) Family { // n nested shifts around a Gaussian: n+1 families
		var f Family = g
		for i := 0; i < n; i++ {
			f = ShiftFamily{By: 0.1, Of: f}
		}
		return f
	}
	manyTerms := func(n int) Family {
		terms := make([]Family, n)
		for i := range terms {
			terms[i] = g
		}
		return SumFamily{Terms: terms}
	}
	tests := []struct {
		name  string
		fam   Family
		param string // exact path, or a prefix ending in "."
	}{
		{"shift NaN", ShiftFamily{By: nan, Of: g}, "shift.by"},
		{"shift +Inf", ShiftFamily{By: inf, Of: g}, "shift.by"},
		{"shift missing", ShiftFamily{By: 1}, "shift.of"},
		{"sum term shift", SumFamily{Terms: []Family{g, g, ShiftFamily{By: inf, Of: g}}}, "sum[2].shift.by"},
		{"sum empty", SumFamily{}, "sum"},
		{"sum nil term", SumFamily{Terms: []Family{g, nil}}, "sum[1]"},
		{"dilation 0", DilationFamily{By: 0, Of: g}, "dilation.by"},
		{"dilation NaN", DilationFamily{By: nan, Of: g}, "dilation.by"},
		{"dilation -Inf", DilationFamily{By: -inf, Of: g}, "dilation.by"},
		{"dilation bad child", DilationFamily{By: 2, Of: GaussianFamily{-1}}, "dilation.of.gaussian.sigma"},
		{"modulation NaN", ModulationFamily{Omega0: nan, Of: g}, "modulation.omega0"},
		{"modulation -Inf", ModulationFamily{Omega0: -inf, Of: g}, "modulation.omega0"},
		{"amplitude re Inf", AmplitudeFamily{Re: inf, Of: g}, "amplitude.re"},
		{"amplitude im NaN", AmplitudeFamily{Re: 1, Im: nan, Of: g}, "amplitude.im"},
		// |c| = √2·1e308 is finite; σ√(2π)|c|, the spectral amplitude, is not.
		{"amplitude overflow", AmplitudeFamily{Re: 1e308, Im: 1e308, Of: g}, "amplitude.spectral[0].amplitude"},
		{"nested overflow", SumFamily{[]Family{g, ShiftFamily{1, AmplitudeFamily{Re: 1e308, Im: 1e308, Of: g}}}}, "sum[1].shift.of.amplitude.spectral[0].amplitude"},
		{"shift overflow", ShiftFamily{By: 1.5e308, Of: ShiftFamily{By: 1.5e308, Of: g}}, "shift.spatial[0].center"},
		{"nested leaf", ModulationFamily{1, SumFamily{[]Family{g, AmplitudeFamily{1, 0, SechFamily{0}}}}}, "modulation.of.sum[1].amplitude.of.sech.width"},
		{"too deep", chain(MaxComposeNodes), "shift.of."},
		{"too many terms", manyTerms(MaxComposeNodes), "sum[63]"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			err := Validate(tt.fam)
			if !errors.Is(err, ErrInvalid) {
				t.Fatalf("Validate = %v, want ErrInvalid", err)
			}
			var pe *ParamError
			if !errors.As(err, &pe) {
				t.Fatalf("Validate = %v, want a *ParamError", err)
			}
			if strings.HasSuffix(tt.param, ".") {
				if !strings.HasPrefix(pe.Param, tt.param) {
					t.Fatalf("Param = %q, want prefix %q", pe.Param, tt.param)
				}
			} else if pe.Param != tt.param {
				t.Fatalf("Param = %q, want %q", pe.Param, tt.param)
			}
		})
	}
	// The largest trees allowed are valid.
	for _, f := range []Family{chain(MaxComposeNodes - 1), manyTerms(MaxComposeNodes - 1)} {
		if err := Validate(f); err != nil {
			t.Errorf("Validate(%d-node tree) = %v, want nil", MaxComposeNodes, err)
		}
	}
}

// dilateEnvelope keeps every rounding on the safe side for an inexact
// factor: the envelope of g(x/b) for b = 1/3 (not a float64) bounds the
// exact envelope far into the tail, where a rate or width rounded the
// wrong way would show (math/big reference of the exact envelope).
func TestDilateEnvelopeRounding(t *testing.T) {
	third := Point(1).Div(Point(3))
	for _, term := range []EnvelopeTerm{
		{Decay: Gaussian, Amplitude: 1, Center: 0.7, Width: 0.9},
		{Decay: Exponential, Amplitude: 1, Center: -1.1, Rate: 1.3},
		{Decay: Algebraic, Amplitude: 1, Center: 0.3, Width: 0.7, Power: 40},
	} {
		for _, reflect := range []bool{false, true} {
			env := dilateEnvelope(Envelope{term}, reflect, third)
			for _, x := range []float64{0.5, 3, 7.7, 11.3, 13.1, 40.9, -5.3, -13.3} {
				// exact: term at y = ±x/b = ±3x.
				y := bigref.Mul(bigref.New(x), bigref.Int(3))
				if reflect {
					y = bigref.Neg(y)
				}
				d := bigref.Abs(bigref.Sub(y, bigref.New(term.Center)))
				var want *big.Float
				switch term.Decay {
				case Gaussian:
					u := bigref.Quo(d, bigref.New(term.Width))
					want = bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(u, u), bigref.Int(2))))
				case Exponential:
					want = bigref.Exp(bigref.Neg(bigref.Mul(bigref.New(term.Rate), d)))
				case Algebraic:
					base := bigref.Add(bigref.Int(1), bigref.Quo(d, bigref.New(term.Width)))
					want = bigref.Exp(bigref.Neg(bigref.Mul(bigref.New(term.Power), bigref.Log(base))))
				}
				if got := env.At(Point(x)); !bigref.In(math.Inf(-1), got, want) {
					t.Errorf("dilateEnvelope(%v, reflect=%v, 1/3).At(%g) = %.17g, below the exact %.20g", term, reflect, x, got, want)
				}
			}
		}
	}
}

// Value and Transform of composed families enclose f and F over wide
// intervals, as for the closed forms (math/big values at points inside;
// never NaN).
func TestComposeWideIntervals(t *testing.T) {
	for _, c := range composedRefs() {
		for i, iv := range []Interval{
			{-0.3, 0.2}, {-3, 5}, {1, 40}, {-100, -2}, {2.5, math.Inf(1)}, {math.Inf(-1), 0.1}, Entire(),
		} {
			for _, side := range []string{"Value", "Transform"} {
				var got Complex
				val := func(v float64) bigref.Complex { return bigValue(c.ref, v) }
				if side == "Value" {
					got = c.fam.Value(iv)
				} else {
					got = c.fam.Transform(iv)
					val = func(v float64) bigref.Complex { return c.ref.transform(bigref.New(v)) }
				}
				if math.IsNaN(got.Re.Lo + got.Re.Hi + got.Im.Lo + got.Im.Hi) {
					t.Fatalf("%v: %s(%v) = %v has NaN", c.fam, side, iv, got)
				}
				a, b := math.Max(iv.Lo, -60), math.Min(iv.Hi, 60)
				for j := 0; j <= 12; j++ {
					p := a + (b-a)*float64(j)/12 + 1e-3*float64(i)
					if p > b {
						p = b
					}
					if v := val(p); !v.In(got.Re.Lo, got.Re.Hi, got.Im.Lo, got.Im.Hi) {
						t.Errorf("%v: %s(%v) = %v, want it to contain %.17g + i%.17g at %g (math/big)", c.fam, side, iv, got, v.Re, v.Im, p)
					}
				}
			}
		}
	}
}
