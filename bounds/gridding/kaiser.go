package gridding

import (
	"math"

	"foldbound/bounds"
)

// The Kaiser-Bessel kernel jumps from I0(0) = 1 to 0 at its edges, so its
// transform decays only like 1/θ and Σ_l |φ̂(θ + 2πl)| diverges. The
// bounding function therefore splits φ = b + q (doc.go, step 3): b is the
// box of height 1 on [-W/2, W/2), whose aliasing is a finite geometric sum
// with a closed-form sup over the point position (the truncation part T),
// and q = φ - b is continuous with |q̂(θ)| = O(θ⁻²), whose copies are
// summed (the aliasing part A).

// kaiserFamily returns the engine's Kaiser-Bessel family for the kernel.
func (s *shape) kaiserFamily() bounds.KaiserBesselFamily {
	return bounds.KaiserBesselFamily{Width: s.w, Beta: s.k.Beta}
}

// kaiserParts encloses, for every θ in theta ⊂ [0, π),
//
//	T(θ) = |sin(θW/2)|·√(1 + g(θ/2)²),   g(z) = 1/z - cot z,
//	A(θ) = Σ_{l≠0} |q̂(θ + 2πl)|,          q̂(ω) = φ̂(ω) - W·sin(u)/u,  u = W|ω|/2,
//	φ̂(θ) = W·sinh(√(β²-u²))/√(β²-u²)     (bounds.KaiserBesselFamily).
func (s *shape) kaiserParts(theta bounds.Interval) parts {
	fam := s.kaiserFamily()
	var sum bounds.Interval
	tail := math.Inf(1)
	for l := 1; l <= maxCopies; l++ {
		lp := twoPi.Scale(float64(l))
		sum = sum.Add(s.kaiserQ(fam, theta.Add(lp))).Add(s.kaiserQ(fam, theta.Sub(lp)))
		x0 := bounds.Point(lp.Lo).Add(twoPi).Sub(bounds.Point(theta.Hi)).Scale(s.w / 2).Lo
		if l < minKaiserCopies || x0 < kaiserTailStart(s.k.Beta) {
			continue
		}
		tail = s.kaiserTail(theta, x0)
		break
	}
	return parts{
		alias: sum.Add(bounds.Interval{Lo: 0, Hi: tail}),
		trunc: s.boxSup(theta),
		den:   fam.Transform(theta).Re,
	}
}

// minKaiserCopies is the least number of copies summed on each side; the
// tail (kaiserTail) takes over once its copies have u ≥ kaiserTailStart(β)
// = max(4β, β²), where δ = u - v ≤ β²/(2u)·(1 + O(β²/u²)) ≤ 1/2: there
// the first-order term |cos u|·δ/v dominates and the tail bound is within
// a few per cent of the true tail. The sum with its tail is then within
// about 3% of Σ_{l≠0}|q̂| (checked against 800 copies in math/big in the
// tests).
const minKaiserCopies = 12

func kaiserTailStart(beta float64) float64 { return math.Max(4*beta, beta*beta) }

// kaiserQ encloses |q̂(ω)| for every ω in omega (|ω| ≥ π). Two bounds are
// valid and the smaller is used: the interval difference φ̂(ω) - W sin(u)/u,
// and, for u > β with v = √(u² - β²),
//
//	|q̂(ω)|/W = |sin v/v - sin u/u| ≤ |u - v|(u + 1)/(uv) ≤ β²(u + 1)/(u²v),
//
// from u(sin v - sin u) + (u - v) sin u, |sin v - sin u| ≤ |u - v| and
// u - v = β²/(u + v) ≤ β²/u; it decreases in u, so u.Lo bounds it.
func (s *shape) kaiserQ(fam bounds.KaiserBesselFamily, omega bounds.Interval) bounds.Interval {
	u := omega.Abs().Scale(s.w / 2)
	box := bounds.Sin(u).Div(u).Scale(s.w)
	d := fam.Transform(omega).Re.Sub(box).Abs()
	b := s.k.Beta
	if u.Lo > b {
		ul := bounds.Point(u.Lo)
		v := bounds.Sqrt(ul.AddFloat(-b).Mul(ul.AddFloat(b)))
		if v.Lo > 0 {
			a := bounds.Point(b).Sqr().Mul(ul.AddFloat(1)).Div(ul.Sqr().Mul(v)).Scale(s.w)
			if a.Hi < d.Hi {
				d = bounds.Interval{Lo: math.Min(d.Lo, a.Hi), Hi: a.Hi}
			}
		}
	}
	return d
}

// kaiserTail bounds Σ_{l>L} (|q̂(θ+2πl)| + |q̂(θ-2πl)|) over θ in theta,
// given x0 = W(2π(L+1) - θ_hi)/2 ≤ u for every omitted copy. Write
// δ = u - v = β²/(u + v) and
//
//	q̂/W = (sin v - sin u)/v + sin u·(1/v - 1/u),
//	|sin v - sin u| = 2|cos(u - δ/2)·sin(δ/2)| ≤ (|cos u| + |sin u|·δ/2)·δ,
//
// so |q̂|/W ≤ |cos u|·δ/v + |sin u|·(δ²/(2v) + δ/(uv)). For u ≥ x0 > β,
// v ≥ c0·u with c0 = √(1 - β²/x0²), and δ ≤ β²/((1 + c0)u). For integer W
// every copy has u = πWl ± Wθ/2, so |cos u| = |cos(Wθ/2)| ≤ C and
// |sin u| = |sin(Wθ/2)| ≤ S for all of them. Hence
//
//	|q̂| ≤ W·[A2/u² + A3/u³],   A2 = Cβ²/((1+c0)c0),   A3 = S(β⁴/(2(1+c0)²) + β²/(1+c0))/c0,
//
// and the copies on each side sit at u ≥ x0 + πW·i, i ≥ 0. Since x^{-p} is
// convex, each term is at most its mean over the cell of width c around it
// (Hermite-Hadamard inequality), so
//
//	Σ_{i≥0} (x0 + ci)^{-p} ≤ (1/c)∫_{x0-c/2}^∞ x^{-p} dx = (x0 - c/2)^{1-p}/(c(p-1)),   c = πW.
//
// It returns +Inf when x0 ≤ β.
func (s *shape) kaiserTail(theta bounds.Interval, x0 float64) float64 {
	if x0 <= s.k.Beta {
		return math.Inf(1)
	}
	b := bounds.Point(s.k.Beta)
	x := bounds.Point(x0)
	c0sq := bounds.Point(1).Sub(b.Div(x).Sqr())
	if c0sq.Lo <= 0 {
		return math.Inf(1)
	}
	c0 := bounds.Sqrt(c0sq)
	c0.Lo = math.Max(c0.Lo, 0x1p-30)
	d1 := c0.AddFloat(1)
	C := bounds.Cos(theta.Scale(s.w / 2)).Abs()
	S := bounds.Sin(theta.Scale(s.w / 2)).Abs()
	b2 := b.Sqr()
	a2 := C.Mul(b2).Div(d1.Mul(c0))
	a3 := S.Mul(b2.Sqr().Div(d1.Sqr().Scale(2)).Add(b2.Div(d1))).Div(c0)
	c := bounds.Pi.Scale(s.w)
	x1 := x.Sub(c.Scale(0.5))
	if x1.Lo <= 0 {
		return math.Inf(1)
	}
	s2 := x1.Mul(c).Recip()
	s3 := x1.Sqr().Mul(c).Scale(2).Recip()
	return a2.Mul(s2).Add(a3.Mul(s3)).Scale(2 * s.w).Hi
}

// boxSup encloses T(θ) = |sin(θW/2)|·√(1 + g(θ/2)²) for θ in theta.
func (s *shape) boxSup(theta bounds.Interval) bounds.Interval {
	z := theta.Abs().Scale(0.5)
	g := bounds.Interval{Lo: cotGap(z.Lo).Lo, Hi: cotGap(z.Hi).Hi}
	sn := bounds.Sin(theta.Scale(s.w / 2)).Abs()
	return sn.Mul(bounds.Sqrt(g.Sqr().AddFloat(1)))
}

// cotGap encloses g(z) = 1/z - cot z for 0 ≤ z < π/2. g is increasing on
// [0, π), so callers bound an interval by its endpoints. For z ≤ 1/4 it
// sums the series
//
//	g(z) = Σ_{n≥1} a_n z^{2n-1} = z/3 + z³/45 + 2z⁵/945 + z⁷/4725 + 2z⁹/93555 + …,   a_n = 2ζ(2n)/π^{2n}
//
// (the series of cot, DLMF 4.19.6, and ζ(2n) by Bernoulli numbers, DLMF
// 25.6.2; from memory, checked against math/big in the tests), whose
// coefficients are positive with ratio a_{n+1}/a_n = ζ(2n+2)/(π²ζ(2n)) <
// 1/π², so the terms from z^11 on sum to at most a_6·z^11/(1 - z²/π²),
// a_6 = 1382/638512875 < 2.2·10⁻⁶. Above 1/4 it evaluates 1/z - cos z/sin z
// in interval arithmetic.
func cotGap(z float64) bounds.Interval {
	if z <= 0 {
		return bounds.Point(0)
	}
	x := bounds.Point(z)
	if z <= 0.25 {
		x2 := x.Sqr()
		// Horner in z²: z·(1/3 + z²(1/45 + z²(2/945 + z²(1/4725 + z²·2/93555)))).
		one := bounds.Point(1)
		h := one.Scale(2).Div(bounds.Point(93555))
		h = h.Mul(x2).Add(one.Div(bounds.Point(4725)))
		h = h.Mul(x2).Add(one.Scale(2).Div(bounds.Point(945)))
		h = h.Mul(x2).Add(one.Div(bounds.Point(45)))
		h = h.Mul(x2).Add(one.Div(bounds.Point(3)))
		head := h.Mul(x)
		rest := x.IntPow(11).Scale(2.2e-6).Div(one.Sub(x.Div(bounds.Pi).Sqr()))
		return bounds.Interval{Lo: head.Lo, Hi: head.Add(rest).Hi}
	}
	return x.Recip().Sub(bounds.Cos(x).Div(bounds.Sin(x)))
}

// kaiserEstimate computes T(θ) and A(θ) in float64.
func (s *shape) kaiserEstimate(theta float64) (alias, trunc float64) {
	w, b := s.w, s.k.Beta
	z := math.Abs(theta) / 2
	g := 0.0
	if z > 1e-4 {
		g = 1/z - 1/math.Tan(z)
	} else {
		g = z / 3
	}
	trunc = math.Abs(math.Sin(theta*w/2)) * math.Sqrt(1+g*g)
	q := func(omega float64) float64 {
		u := math.Abs(omega) * w / 2
		d := math.Abs(s.k.transform(omega) - w*math.Sin(u)/u)
		if u > b {
			v := math.Sqrt((u - b) * (u + b))
			d = math.Min(d, w*b*b*(u+1)/(u*u*v))
		}
		return d
	}
	tail := math.Inf(1)
	cw := math.Abs(math.Cos(theta * w / 2))
	sw := math.Abs(math.Sin(theta * w / 2))
	for l := 1; l <= maxCopies; l++ {
		lp := 2 * math.Pi * float64(l)
		alias += q(theta+lp) + q(theta-lp)
		x0 := (lp + 2*math.Pi - theta) * w / 2
		// The estimate switches to the tail earlier (at u ≥ 4β), which
		// overstates it by a few per cent but halves the work.
		if l < minKaiserCopies || x0 < 4*b {
			continue
		}
		c0 := math.Sqrt(1 - (b/x0)*(b/x0))
		d1 := 1 + c0
		a2 := cw * b * b / (d1 * c0)
		a3 := sw * (b*b*b*b/(2*d1*d1) + b*b/d1) / c0
		c := math.Pi * w
		x1 := x0 - c/2
		tail = 2 * w * (a2/(x1*c) + a3/(2*c*x1*x1))
		break
	}
	return alias + tail, trunc
}
