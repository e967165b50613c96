package bounds

import "math"

// Ray sums for the planner's float64 model (planModel): for an even family
// centred at 0,
//
//	rayVal(x, h) = Σ_{i≥0} |f(x + ih)|,   rayTr(ξ, P) = Σ_{i≥0} |F(ξ + iP)|,   x, ξ ≥ 0,
//
// the omitted samples on one side of a window and the alias copies on one
// side of a frequency, in closed form or by a short recurrence instead of
// a transcendental call per term. They are estimates to about 1e-15
// relative, not bounds: the model only steers the search, and every plan is
// certified in interval arithmetic afterwards.
//
// Where each comes from (u = x/w, e = e^{-u}, E = e^{-h/w}):
//
//	e^{-a|x|}       geometric series          e^{-ax}/(1 - e^{-ah})
//	e^{-x²/(2σ²)}   ratio recurrence          t_{i+1} = t_i·r_i, r_{i+1} = r_i·e^{-h²/σ²}
//	sech u          sech u = 2Σ_j (-1)^j e^{-(2j+1)u}     2Σ_j (-1)^j e^{2j+1}/(1 - E^{2j+1})
//	sech² u         sech² u = 4Σ_j (-1)^j (j+1) e^{-2(j+1)u}
//	1/(a² + x²)     Euler–Maclaurin           (1/h)∫_x^∞ g + g(x)/2 - (h/12)g'(x) + (h³/720)g'''(x)
//
// (the expansions of sech and sech² are geometric series in e^{-2u} < 1,
// valid for u > 0; Euler–Maclaurin: DLMF 2.10.1, from memory, used once the
// step is small against the distance, h ≤ x/16, after explicit terms).

// rayTerms caps the explicit terms of a ray sum before its closed form or
// asymptotic tail takes over.
const rayTerms = 256

// pointRays returns rayVal and rayTr for the even families centred at 0
// that have them, nil otherwise. Some keep the factors of the last step
// they saw (rayStep): each planner gets its own, not for concurrent use.
func pointRays(f Family) (rayVal, rayTr func(x, h float64) float64) {
	switch g := f.(type) {
	case GaussianFamily:
		s := g.Sigma
		amp := s * math.Sqrt(2*math.Pi)
		is := 1 / s
		var cv, ct rayStep
		return func(x, h float64) float64 {
				cv.set(h, s, 0)
				return gaussRayQ(x, h, s, cv.inv, cv.q)
			}, func(xi, P float64) float64 {
				ct.set(P, is, 0)
				return amp * gaussRayQ(xi, P, is, ct.inv, ct.q)
			}
	case ExponentialFamily:
		a := g.Rate
		return func(x, h float64) float64 { return expRay(x, h, a) },
			func(xi, P float64) float64 { return 2 * a * lorentzRay(xi, P, a) }
	case LorentzianFamily:
		a := g.Width
		amp := math.Pi / a
		return func(x, h float64) float64 { return lorentzRay(x, h, a) },
			func(xi, P float64) float64 { return amp * expRay(xi, P, a) }
	case SechFamily:
		w := g.Width
		v := math.Pi * w / 2
		return func(x, h float64) float64 { return sechRay(x/w, h/w) },
			func(xi, P float64) float64 { return math.Pi * w * sechRay(xi*v, P*v) }
	case SechSquaredFamily:
		w := g.Width
		return func(x, h float64) float64 { return sech2Ray(x/w, h/w) }, nil
	case WavePacketFamily:
		s, w0 := g.Sigma, math.Abs(g.Omega0)
		amp := s * math.Sqrt(math.Pi/2)
		is := 1 / s
		var cv rayStep
		return func(x, h float64) float64 {
				cv.set(h, s, w0)
				return wavePacketRayStep(x, w0, &cv)
			},
			func(xi, P float64) float64 {
				// Two Gaussians centred at ±ω₀; the ray from ξ meets the
				// one at ω₀ before or after its centre.
				return amp * (gaussLineRay(xi-w0, P, is) + gaussRay(xi+w0, P, is))
			}
	}
	return nil, nil
}

// expRay returns Σ_{i≥0} e^{-a(x+ih)} for x ≥ 0.
func expRay(x, h, a float64) float64 {
	return math.Exp(-a*x) / -math.Expm1(-a*h)
}

// gaussRay returns Σ_{i≥0} e^{-(x+ih)²/(2σ²)} for x ≥ 0. The ratio of
// consecutive terms r_i = e^{-(2(x+ih)h + h²)/(2σ²)} decreases, so the rest
// after a term t is at most t·r/(1 - r). Steps far below σ use
// Euler–Maclaurin after rayTerms terms.
func gaussRay(x, h, s float64) float64 {
	inv := 0.5 / (s * s)
	return gaussRayQ(x, h, s, inv, math.Exp(-2*h*h*inv))
}

// gaussRayQ is gaussRay given inv = 1/(2σ²) and q = e^{-2h²·inv}.
func gaussRayQ(x, h, s, inv, q float64) float64 {
	t := math.Exp(-x * x * inv)
	r := math.Exp(-(2*x*h + h*h) * inv)
	sum := 0.0
	for i := 0; i < rayTerms; i++ {
		if t == 0 {
			return sum
		}
		sum += t
		if t*r <= 0x1p-60*sum*(1-r) {
			return sum
		}
		t *= r
		r *= q
		x += h
	}
	// Euler–Maclaurin from x: (1/h)∫_x^∞ g + g/2 - (h/12)g' + (h³/720)g'''
	// with g' = -(x/σ²)g, g''' = -(x³/σ⁶ - 3x/σ⁴)g.
	s2 := s * s
	g1 := -x / s2 * t
	g3 := -(x*x*x/(s2*s2*s2) - 3*x/(s2*s2)) * t
	return sum + s*math.Sqrt(math.Pi/2)*math.Erfc(x/(s*math.Sqrt2))/h + t/2 - h/12*g1 + h*h*h/720*g3
}

// gaussLineRay is gaussRay for any x: the terms before the centre are
// summed first, walking towards it.
func gaussLineRay(x, h, s float64) float64 {
	if x >= 0 {
		return gaussRay(x, h, s)
	}
	// The n points x, x+h, … below 0 mirror to -x, -x-h, …: the ray
	// outward from the innermost of them, -(x+(n-1)h), cut after n terms.
	n := math.Ceil(-x / h)
	inner := gaussRay(-(x+(n-1)*h), h, s) - gaussRay(-x+h, h, s)
	return math.Max(inner, 0) + gaussRay(x+n*h, h, s)
}

// wavePacketRay returns Σ_{i≥0} e^{-(x+ih)²/(2σ²)}·|cos(ω₀(x+ih))| for
// x ≥ 0, the Gaussian factor as in gaussRay and the cosine by rotation.
func wavePacketRay(x, h, s, w0 float64) float64 {
	var c rayStep
	c.set(h, s, w0)
	return wavePacketRayStep(x, w0, &c)
}

// rayStep holds what the ray sums of a Gaussian factor e^{-x²/(2σ²)}
// (and a cosine cos ω₀x) at step h need besides the starting point:
// inv = 1/(2σ²), q = e^{-2h²·inv} and sin, cos of ω₀h. A planner's rays
// share one step over many starting points.
type rayStep struct {
	h, inv, q, ds, dc float64
	ok                bool
}

// set computes the step's factors unless they are those of h already.
func (c *rayStep) set(h, s, w0 float64) {
	if c.ok && c.h == h {
		return
	}
	c.h, c.ok = h, true
	c.inv = 0.5 / (s * s)
	c.q = math.Exp(-2 * h * h * c.inv)
	if w0 != 0 {
		c.ds, c.dc = math.Sincos(w0 * h)
	}
}

// wavePacketRayStep is wavePacketRay with the step's factors in c.
func wavePacketRayStep(x, w0 float64, c *rayStep) float64 {
	h, inv, q := c.h, c.inv, c.q
	t := math.Exp(-x * x * inv)
	r := math.Exp(-(2*x*h + h*h) * inv)
	sn, cs := math.Sincos(w0 * x)
	ds, dc := c.ds, c.dc
	sum := 0.0
	for i := 0; i < 4*rayTerms; i++ {
		if t == 0 {
			return sum
		}
		sum += t * math.Abs(cs)
		if t*r <= 0x1p-60*sum*(1-r) {
			return sum
		}
		t *= r
		r *= q
		cs, sn = cs*dc-sn*ds, sn*dc+cs*ds
	}
	return sum
}

// sechRay returns Σ_{i≥0} sech(u + iv) for u ≥ 0, v > 0: explicit terms
// while e^{-u} > 1/4, then the alternating series
// 2Σ_j (-1)^j e^{-(2j+1)u}/(1 - e^{-(2j+1)v}), whose terms fall by e^{-2u}.
func sechRay(u, v float64) float64 {
	sum := 0.0
	for i := 0; u < 1.4 && i < rayTerms; i++ {
		sum += 1 / math.Cosh(u)
		u += v
	}
	e := math.Exp(-u)
	e2 := e * e
	p := e // e^{(2j+1)}
	for j := 0; j < 64; j++ {
		t := 2 * p / -math.Expm1(-float64(2*j+1)*v)
		if j%2 == 0 {
			sum += t
		} else {
			sum -= t
		}
		if t <= 0x1p-60*sum {
			break
		}
		p *= e2
	}
	return sum
}

// sech2Ray returns Σ_{i≥0} sech²(u + iv) for u ≥ 0, v > 0, as sechRay with
// the series 4Σ_j (-1)^j (j+1) e^{-2(j+1)u}.
func sech2Ray(u, v float64) float64 {
	sum := 0.0
	for i := 0; u < 1.4 && i < rayTerms; i++ {
		c := math.Cosh(u)
		sum += 1 / (c * c)
		u += v
	}
	e2 := math.Exp(-2 * u)
	p := e2 // e^{-2(j+1)u}
	for j := 0; j < 128; j++ {
		t := 4 * float64(j+1) * p / -math.Expm1(-2*float64(j+1)*v)
		if j%2 == 0 {
			sum += t
		} else {
			sum -= t
		}
		if t <= 0x1p-60*sum {
			break
		}
		p *= e2
	}
	return sum
}

// lorentzRay returns Σ_{i≥0} 1/(a² + (x+ih)²) for x ≥ 0: explicit terms
// until h ≤ x/16, then Euler–Maclaurin,
//
//	Σ_{i≥0} g(x+ih) = (1/h)∫_x^∞ g + g/2 - (h/12)g' + (h³/720)g''' - (h⁵/30240)g⁽⁵⁾ + (h⁷/1209600)g⁽⁷⁾ - …
//
// (DLMF 2.10.1 with the Bernoulli numbers B₂ … B₈, from memory), with
// ∫_x^∞ dt/(a²+t²) = atan(a/x)/a and the derivatives of
// g = (1/a)·Im(1/(x - ia)), g⁽ⁿ⁾ = (1/a)·Im((-1)ⁿ n!/(x - ia)ⁿ⁺¹). The next
// term is below 1e-13 of the sum for h ≤ x/16.
func lorentzRay(x, h, a float64) float64 {
	a2 := a * a
	sum := 0.0
	for i := 0; 16*h > x && i < rayTerms; i++ {
		sum += 1 / (a2 + x*x)
		x += h
	}
	z := 1 / complex(x, -a)
	z2 := z * z
	d1 := -z2          // (-1)¹ 1!/(x-ia)²
	d3 := 6 * d1 * z2  // (-1)³ 3!/(x-ia)⁴
	d5 := 20 * d3 * z2 // (-1)⁵ 5!/(x-ia)⁶
	d7 := 42 * d5 * z2 // (-1)⁷ 7!/(x-ia)⁸
	h3 := h * h * h
	em := -h/12*imag(d1) + h3/720*imag(d3) - h3*h*h/30240*imag(d5) + h3*h3*h/1209600*imag(d7)
	return sum + math.Atan(a/x)/(a*h) + 0.5/(a2+x*x) + em/a
}

// pointBlock returns the float64 forms of a family's aliasBlock and
// aliasRay, or nil.
func pointBlock(f Family) (block func(x0, P float64, J int) float64, ray func(x0, P float64) float64) {
	b, ok := f.(BSplineFamily)
	if !ok || b.Order < 2 || b.Order > MaxBSplineOrder {
		return nil, nil
	}
	m := b.Order
	// near returns |sin(x0/2)| and δ = |P/2 - kπ|, at least the rounding
	// of P/2 (the certificate's δ is never below it).
	near := func(x0, P float64) (a, delta float64) {
		k := math.Round(P / (2 * math.Pi))
		return math.Abs(math.Sin(x0 / 2)), math.Max(math.Abs(P/2-k*math.Pi), 0x1p-52*P/2)
	}
	block = func(x0, P float64, J int) float64 {
		if !(x0 > 0) || !(P > 0) || J <= 0 {
			return math.Inf(1)
		}
		a, delta := near(x0, P)
		jm := float64(J - 1)
		rho := math.Max(a/(x0/2), (a+jm*delta)/((x0+jm*P)/2))
		return float64(J) * intPowFloat(rho, m)
	}
	ray = func(x0, P float64) float64 {
		if !(x0 > 0) || !(P > 0) {
			return math.Inf(1)
		}
		a, delta := near(x0, P)
		from := func(J int) float64 {
			base := float64(J-1) + x0/P
			return block(x0, P, J) + intPowFloat(2/P, m)*intPowFloat(1/base, m-1)/float64(m-1)
		}
		J := 1
		if a < 1 {
			J = int(math.Min(math.Ceil((1-a)/delta), 0x1p52))
		}
		return math.Min(from(J), from(1))
	}
	return block, ray
}
