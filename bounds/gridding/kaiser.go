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
		tail = s.kaiserTail(x0)
		if tail <= kaiserTailGoal*sum.Lo {
			break
		}
	}
	return parts{
		alias: sum.Add(bounds.Interval{Lo: 0, Hi: tail}),
		trunc: s.boxSup(theta),
		den:   fam.Transform(theta).Re,
	}
}

// kaiserTailGoal is the relative size of the unevaluated tail of Σ|q̂| at
// which summation stops (the tail decays like 1/L).
const kaiserTailGoal = 1e-2

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

// kaiserTail bounds Σ_{l>L} (|q̂(θ+2πl)| + |q̂(θ-2πl)|) given
// x0 = W(2π(L+1) - θ)/2, the least u of the omitted copies. For x0 > β and
// u ≥ x0, v ≥ c0·u with c0 = √(1 - β²/x0²), so |q̂| ≤ (Wβ²/c0)(u⁻² + u⁻³);
// the copies on each side sit at u ≥ x0 + πW·i, i ≥ 0, and by comparison
// with an integral
//
//	Σ_{i≥0} (x0 + ci)^{-p} ≤ x0^{-p} + x0^{1-p}/(c(p-1)),   c = πW.
//
// It returns +Inf when x0 ≤ β.
func (s *shape) kaiserTail(x0 float64) float64 {
	b := bounds.Point(s.k.Beta)
	x := bounds.Point(x0)
	if x0 <= s.k.Beta {
		return math.Inf(1)
	}
	c0sq := bounds.Point(1).Sub(b.Div(x).Sqr())
	if c0sq.Lo <= 0 {
		return math.Inf(1)
	}
	c0 := bounds.Sqrt(c0sq)
	c := bounds.Pi.Scale(s.w)
	s2 := x.Sqr().Recip().Add(x.Recip().Div(c))
	s3 := x.IntPow(3).Recip().Add(x.Sqr().Recip().Div(c.Scale(2)))
	return b.Sqr().Scale(2 * s.w).Div(c0).Mul(s2.Add(s3)).Hi
}

// boxSup encloses T(θ) = |sin(θW/2)|·√(1 + g(θ/2)²) for θ in theta.
func (s *shape) boxSup(theta bounds.Interval) bounds.Interval {
	z := theta.Abs().Scale(0.5)
	g := bounds.Interval{Lo: cotGap(z.Lo).Lo, Hi: cotGap(z.Hi).Hi}
	sn := bounds.Sin(theta.Scale(s.w / 2)).Abs()
	return sn.Mul(bounds.Sqrt(g.Sqr().AddFloat(1)))
}

// cotGap encloses g(z) = 1/z - cot z for 0 ≤ z < π/2. g is increasing on
// [0, π), so callers bound an interval by its endpoints. Near 0 it uses the
// series
//
//	g(z) = Σ_{n≥1} a_n z^{2n-1} = z/3 + z³/45 + 2z⁵/945 + …,   a_n = 2ζ(2n)/π^{2n}
//
// (the series of cot, DLMF 4.19.6, and ζ(2n) by Bernoulli numbers, DLMF
// 25.6.2; from memory), whose coefficients are positive with ratio
// a_{n+1}/a_n = ζ(2n+2)/(π²ζ(2n)) < 1/π², so the terms from z⁵ on sum to
// at most (2/945)z⁵/(1 - z²/π²).
func cotGap(z float64) bounds.Interval {
	if z <= 0 {
		return bounds.Point(0)
	}
	x := bounds.Point(z)
	if z <= 0.5 {
		head := x.Div(bounds.Point(3)).Add(x.IntPow(3).Div(bounds.Point(45)))
		rest := x.IntPow(5).Scale(2).Div(bounds.Point(945)).Div(bounds.Point(1).Sub(x.Div(bounds.Pi).Sqr()))
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
	for l := 1; l <= maxCopies; l++ {
		lp := 2 * math.Pi * float64(l)
		alias += q(theta+lp) + q(theta-lp)
		x0 := (lp + 2*math.Pi - theta) * w / 2
		if x0 > b {
			c0 := math.Sqrt(1 - (b/x0)*(b/x0))
			c := math.Pi * w
			tail = 2 * w * b * b / c0 * (1/(x0*x0) + 1/(x0*c) + 1/(x0*x0*x0) + 1/(2*c*x0*x0))
			if tail <= kaiserTailGoal*alias {
				break
			}
		}
	}
	return alias + tail, trunc
}
