package bounds

import (
	"math"
)

// Counting lattice points in balls, and the tail bounds built on it.
//
// Let N(r) = #{v ∈ L : |v - t| ≤ r} for a lattice L of covolume V and any
// centre t, and let b_1*, …, b_n* be the Gram-Schmidt vectors of a basis of
// L. Two upper bounds hold for every r ≥ 0 and every t.
//
// Gram-Schmidt (product) bound:
//
//	N(r) ≤ Π_i (2r/|b_i*| + 1).
//
// Proof: write v - t = Σ_j y_j b_j* with y_j = c_j - z_j, where z_j depends
// only on the integer coordinates c_i, i > j (see walker). |v - t| ≤ r
// forces |y_j|·|b_j*| ≤ r, so, once c_{j+1..n} are fixed, c_j lies in an
// interval of length 2r/|b_j*|, which holds at most ⌊2r/|b_j*|⌋ + 1
// integers; multiplying over j gives the bound (the counting argument behind
// the enumeration of Fincke & Pohst, Math. Comp. 44, 1985, from memory).
//
// Volume (Voronoi) bound:
//
//	V_n (r - ρ)ⁿ / V  ≤  N(r)  ≤  V_n (r + ρ)ⁿ / V,
//
// where V_n = π^{n/2}/Γ(n/2+1) is the volume of the unit ball (DLMF 5.19.4)
// and ρ is any upper bound of the covering radius, here
//
//	ρ = ½ (Σ_i |b_i*|²)^{1/2}
//
// (the nearest-plane algorithm of Babai, Combinatorica 6, 1986, from
// memory, reaches every point of Rⁿ within this distance: it writes the
// remainder as Σ_i e_i b_i* with |e_i| ≤ ½). Proof: the Voronoi cells of
// the lattice points have volume V, disjoint interiors, and each lies within
// ρ of its point. The cells of the N(r) points within r of t lie in the
// ball of radius r + ρ about t, hence N(r)·V ≤ V_n (r+ρ)ⁿ. Every point of
// the ball of radius r - ρ lies in the cell of a lattice point within r of
// t, hence N(r)·V ≥ V_n (r-ρ)ⁿ (Conway & Sloane, Sphere Packings, Lattices
// and Groups, 1988, Ch. 2, from memory, for the Voronoi cell).
//
// The volume bound is asymptotically exact; the product bound is better for
// small r on very unequal bases. Both are polynomials in r with
// non-negative coefficients, and every tail bound below is computed with
// each and the smaller one kept.
//
// Tail bound. For a radial profile P (non-increasing in the distance,
// P(∞) = 0, continuous) and R ≥ 0, summation by parts in the
// Lebesgue-Stieltjes form (the continuous limit of summing the profile
// over shells R < |v - t| ≤ R + Δ, R + Δ < |v - t| ≤ R + 2Δ, …) gives
//
//	Σ_{|v-t|>R} P(|v-t|) = ∫_{(R,∞)} P dN = ∫_R^∞ N(r) |dP(r)| - P(R) N(R)
//	                     ≤ ∫_R^∞ C(r) |dP(r)| - P(R) N_lo(R),
//
// since P(r)N(r) → 0 (P decays faster than rⁿ grows) and dP ≤ 0, for any
// upper bound C ≥ N and lower bound N_lo ≤ N(R). N_lo is the larger of the
// volume lower bound and the number of points certified within R by the
// enumeration. For C(r) = Σ_k a_k r^k the integrals are moments
// M_k(R) = ∫_R^∞ r^k |dP(r)| of the profile's terms, in closed form
// (termMoments). A compact term (a band limit), A up to radius r₀ and 0
// beyond, contributes exactly A·(N(r₀) - N(R)) ≤ A·(C(r₀) - N_lo(R)) for
// R < r₀ and nothing for R ≥ r₀.

// unitBallVolume encloses V_n = π^{n/2}/Γ(n/2+1) for 1 ≤ n ≤ 8
// (DLMF 5.19.4): 2, π, 4π/3, π²/2, 8π²/15, π³/6, 16π³/105, π⁴/24.
func unitBallVolume(n int) Interval {
	switch n {
	case 1:
		return Point(2)
	case 2:
		return Pi
	case 3:
		return Pi.Scale(4).Div(Point(3))
	case 4:
		return Pi.Sqr().Scale(0.5)
	case 5:
		return Pi.Sqr().Scale(8).Div(Point(15))
	case 6:
		return Pi.IntPow(3).Div(Point(6))
	case 7:
		return Pi.IntPow(3).Scale(16).Div(Point(105))
	case 8:
		return Pi.IntPow(4).Div(Point(24))
	}
	return Entire()
}

// pointCounter holds the counting bounds of a lattice whose lengths are
// those of a pointSet times a factor k.
type pointCounter struct {
	n     int
	lam   []float64 // lower bounds of |b_i*|
	rho   float64   // upper bound of the covering radius
	vn    Interval  // unit-ball volume
	covol Interval  // covolume
	gs    []float64 // upper bounds of the coefficients of Π(2r/|b_i*| + 1)
	vol   []float64 // upper bounds of the coefficients of V_n(r+ρ)ⁿ/V
}

// counter returns the counting bounds for the lattice k × (unscaled set);
// k includes the set's own scale.
func (ps *pointSet) counter(k Interval) *pointCounter {
	n := ps.n
	pc := &pointCounter{n: n, lam: make([]float64, n), vn: unitBallVolume(n)}
	sum := Point(0)
	for i, b := range ps.beta {
		pc.lam[i] = Sqrt(b).Mul(k).Lo
		sum = sum.Add(b)
	}
	pc.rho = Sqrt(sum).Mul(k).Scale(0.5).Hi
	pc.covol = ps.covol.Mul(k.IntPow(n))
	// Π_i (1 + (2/λ_i) r): coefficients by repeated multiplication.
	coef := []Interval{Point(1)}
	for _, l := range pc.lam {
		a := Point(2).Div(Point(l))
		next := make([]Interval, len(coef)+1)
		for d, c := range coef {
			next[d] = next[d].Add(c)
			next[d+1] = next[d+1].Add(c.Mul(a))
		}
		coef = next
	}
	pc.gs = make([]float64, n+1)
	for d, c := range coef {
		pc.gs[d] = c.Hi
	}
	// V_n/V · Σ_k binom(n,k) ρ^{n-k} r^k.
	f := pc.vn.Div(pc.covol)
	pc.vol = make([]float64, n+1)
	for d := 0; d <= n; d++ {
		pc.vol[d] = f.Mul(Point(binomial(n, d))).Mul(Point(pc.rho).IntPow(n - d)).Hi
	}
	return pc
}

func binomial(n, k int) float64 {
	b := 1.0
	for i := 1; i <= k; i++ {
		b = b * float64(n-k+i) / float64(i)
	}
	return math.Round(b)
}

// evalPoly returns an upper bound of Σ_k a_k r^k for r ≥ 0.
func evalPoly(a []float64, r float64) float64 {
	s := 0.0
	for d := len(a) - 1; d >= 0; d-- {
		s = addUp(mulUp(s, r), a[d])
	}
	return s
}

// shortest returns a lower bound of the shortest Gram-Schmidt length, which
// is at most the length of the shortest nonzero lattice vector (for a
// reduced basis, within a factor of it).
func (pc *pointCounter) shortest() float64 {
	s := math.Inf(1)
	for _, l := range pc.lam {
		s = math.Min(s, l)
	}
	return s
}

// upper returns an upper bound of N(r).
func (pc *pointCounter) upper(r float64) float64 {
	return math.Min(evalPoly(pc.gs, r), evalPoly(pc.vol, r))
}

// lower returns a lower bound of N(r) from the volume bound.
func (pc *pointCounter) lower(r float64) float64 {
	d := addDown(r, -pc.rho)
	if d <= 0 {
		return 0
	}
	v := pc.vn.Mul(Point(d).IntPow(pc.n)).Div(pc.covol).Lo
	if !(v > 0) {
		return 0
	}
	return math.Floor(v)
}

// radialProfile returns the profile of a radial envelope with every term
// centred at 0: a term centred at c is at most the same term with its
// plateau widened by |c| (|d - c| ≥ d - |c|), and extra widens every
// plateau further (the profile at distance d - extra).
func radialProfile(e Envelope, extra float64) Envelope {
	out := make(Envelope, len(e))
	for i, t := range e {
		t.Plateau = addUp(addUp(t.Plateau, math.Abs(t.Center)), extra)
		t.Center = 0
		out[i] = t
	}
	return out
}

// addUpNZ is addUp that keeps a sum exact when b is 0, so that a bound made
// of zeros stays 0 instead of creeping up by subnormals.
func addUpNZ(a, b float64) float64 {
	if b == 0 {
		return a
	}
	return addUp(a, b)
}

// upperAt returns an upper bound of a centred profile at distance d ≥ 0
// (Envelope.At without the subnormal creep of adding zeros).
func upperAt(prof Envelope, d float64) float64 {
	s := 0.0
	for _, t := range prof {
		s = addUpNZ(s, t.at(d))
	}
	return s
}

// lowerAt returns a lower bound of a term of a centred profile at
// distance d ≥ 0.
func (t EnvelopeTerm) lowerAt(d float64) float64 {
	u := math.Max(0, addUp(d, -t.Plateau))
	U := Point(u)
	A := Point(t.Amplitude)
	switch t.Decay {
	case Exponential:
		return A.Mul(Exp(U.Scale(-t.Rate))).Lo
	case Gaussian:
		return A.Mul(Exp(U.Div(Point(t.Width)).Sqr().Scale(-0.5))).Lo
	case Algebraic:
		return A.Mul(Pow(U.Div(Point(t.Width)).AddFloat(1), -t.Power)).Lo
	case Compact:
		if u > t.Width {
			return 0
		}
		return t.Amplitude
	}
	return 0
}

// termMoments returns upper bounds of M_k(R) = ∫_R^∞ r^k |dP(r)|,
// k = 0..n, for one continuous term of a centred profile with plateau p:
// P(r) = A·g(max(0, r - p)). With R' = max(R, p) (P is flat below p) and
// u = r - p, U = R' - p:
//
//	Exponential  g = e^{-αu}:   M_k = A e^{-αU} Σ_{i=0}^{k} k!/(k-i)! R'^{k-i} α^{-i}
//	Gaussian     g = e^{-u²/(2σ²)}:
//	             M_k = A Σ_j binom(k,j) p^{k-j} K_{j+1}/σ²,  K_j = ∫_U^∞ u^j g du,
//	             K_0 = σ√(π/2) erfc(U/(σ√2)),  K_1 = σ² g(U),
//	             K_j = σ² (U^{j-1} g(U) + (j-1) K_{j-2})       (integration by parts)
//	Algebraic    g = (1 + u/ℓ)^{-q}, q > n, using u^j ≤ ℓ^j (1+u/ℓ)^j:
//	             M_k ≤ A Σ_j binom(k,j) p^{k-j} ℓ^j q/(q-j) (1+U/ℓ)^{j-q}
//
// The exponential one is the upper incomplete gamma function Γ(k+1, ·) in
// closed form (DLMF 8.4.8, 8.4.7). M_k decreases in R, so evaluating at
// lower bounds of R and U gives upper bounds. An algebraic term with
// q ≤ n has no finite moment M_n: the result is +Inf.
func (t EnvelopeTerm) moments(R float64, n int) []float64 {
	M := make([]float64, n+1)
	A := Point(t.Amplitude)
	if t.Amplitude == 0 {
		return M
	}
	p := t.Plateau
	Rp := math.Max(R, p)
	U := Point(math.Max(0, addDown(Rp, -p)))
	P := Point(p)
	switch t.Decay {
	case Exponential:
		a := Point(t.Rate)
		E := A.Mul(Exp(U.Scale(-t.Rate)))
		for k := 0; k <= n; k++ {
			s := Point(0)
			f := Point(1) // k!/(k-i)!
			for i := 0; i <= k; i++ {
				s = s.Add(f.Mul(Point(Rp).IntPow(k - i)).Div(a.IntPow(i)))
				f = f.Scale(float64(k - i))
			}
			M[k] = E.Mul(s).Hi
		}
	case Gaussian:
		s := Point(t.Width)
		s2 := s.Sqr()
		g := Exp(U.Div(s).Sqr().Scale(-0.5))
		K := make([]Interval, n+2)
		K[0] = s.Mul(Sqrt(Pi.Scale(0.5))).Mul(Erfc(U.Div(s.Mul(Sqrt(Point(2))))))
		K[1] = s2.Mul(g)
		for j := 2; j <= n+1; j++ {
			K[j] = s2.Mul(U.IntPow(j - 1).Mul(g).Add(K[j-2].Scale(float64(j - 1))))
		}
		for k := 0; k <= n; k++ {
			sum := Point(0)
			for j := 0; j <= k; j++ {
				term := Point(binomial(k, j)).Mul(P.IntPow(k - j)).Mul(K[j+1].Div(s2))
				sum = sum.Add(term)
			}
			M[k] = A.Mul(sum).Hi
		}
	case Algebraic:
		l := Point(t.Width)
		base := U.Div(l).AddFloat(1)
		for k := 0; k <= n; k++ {
			if t.Power <= float64(k) {
				M[k] = math.Inf(1)
				continue
			}
			sum := Point(0)
			for j := 0; j <= k; j++ {
				qj := Point(t.Power).AddFloat(-float64(j))
				term := Point(binomial(k, j)).Mul(P.IntPow(k - j)).Mul(l.IntPow(j)).
					Mul(Point(t.Power)).Div(qj).Mul(Pow(base, float64(j)-t.Power))
				sum = sum.Add(term)
			}
			M[k] = A.Mul(sum).Hi
		}
	default:
		for k := range M {
			M[k] = math.Inf(1)
		}
	}
	return M
}

// tail returns an upper bound of Σ_{v ∈ L, |v-t|>R} P(|v - t|) for a
// centred profile P, any centre t, given a lower bound nLo of the number of
// points within R (see the comment at the top of this file). It is +Inf
// when the profile is not summable in n dimensions.
func (pc *pointCounter) tail(prof Envelope, R, nLo float64) float64 {
	if R < 0 {
		R = 0
	}
	nLo = math.Max(nLo, pc.lower(R))
	best := math.Inf(1)
	for _, poly := range [][]float64{pc.gs, pc.vol} {
		total := 0.0
		for _, t := range prof {
			var c float64
			if t.Decay == Compact {
				r0 := addUp(t.Plateau, t.Width)
				if R < r0 && t.Amplitude > 0 {
					c = mulUp(t.Amplitude, math.Max(0, addUp(evalPoly(poly, r0), -nLo)))
				}
			} else {
				M := t.moments(R, pc.n)
				s := 0.0
				for k, a := range poly {
					s = addUp(s, mulUp(a, M[k]))
				}
				c = math.Max(0, addUp(s, -mulDown(nLo, t.lowerAt(R))))
			}
			total = addUpNZ(total, c)
		}
		if math.IsNaN(total) {
			total = math.Inf(1)
		}
		best = math.Min(best, total)
	}
	return best
}

// radiusFor returns a radius R whose tail bound (with the volume lower
// bound for the points inside) is at most goal; ok is false if R would hold
// more than maxPoints points, or the profile is not summable. The search
// runs on a fast float64 estimate of the tail (tailEstimate), then steps R
// up by 2% until the rigorous bound meets the goal.
func (pc *pointCounter) radiusFor(prof Envelope, goal, maxPoints float64) (R float64, ok bool) {
	if !summable(prof, pc.n) {
		return 0, false
	}
	R = math.Max(pc.shortest()/2, math.SmallestNonzeroFloat64)
	lo := 0.0
	for pc.tailEstimate(prof, R) > goal {
		if pc.lower(R) > maxPoints || R > math.MaxFloat64/4 {
			return R, false
		}
		lo = R
		R *= 2
	}
	for i := 0; i < 40 && lo > 0 && R-lo > 0.01*R; i++ {
		m := lo + (R-lo)/2
		if pc.tailEstimate(prof, m) <= goal {
			R = m
		} else {
			lo = m
		}
	}
	for i := 0; pc.tail(prof, R, 0) > goal; i++ {
		if pc.lower(R) > maxPoints || i > 2000 || R > math.MaxFloat64/4 {
			return R, false
		}
		R *= 1.02
	}
	return R, true
}

// tailEstimate is pc.tail in plain float64 with the volume polynomial
// only: an estimate to steer the search for a radius, never a bound.
func (pc *pointCounter) tailEstimate(prof Envelope, R float64) float64 {
	nLo := pc.lower(R)
	total := 0.0
	for _, t := range prof {
		A, p := t.Amplitude, t.Plateau
		if A == 0 {
			continue
		}
		if t.Decay == Compact {
			if r0 := p + t.Width; R < r0 {
				total += A * math.Max(0, evalPoly(pc.vol, r0)-nLo)
			}
			continue
		}
		Rp := math.Max(R, p)
		U := Rp - p
		s := 0.0
		switch t.Decay {
		case Exponential:
			a := t.Rate
			E := A * math.Exp(-a*U)
			for k, c := range pc.vol {
				m, f := 0.0, 1.0
				for i := 0; i <= k; i++ {
					m += f * math.Pow(Rp, float64(k-i)) / math.Pow(a, float64(i))
					f *= float64(k - i)
				}
				s += c * E * m
			}
			total += math.Max(0, s-nLo*E)
		case Gaussian:
			sg := t.Width
			s2 := sg * sg
			g := math.Exp(-U * U / (2 * s2))
			K := make([]float64, pc.n+2)
			K[0] = sg * math.Sqrt(math.Pi/2) * math.Erfc(U/(sg*math.Sqrt2))
			K[1] = s2 * g
			for j := 2; j <= pc.n+1; j++ {
				K[j] = s2 * (math.Pow(U, float64(j-1))*g + float64(j-1)*K[j-2])
			}
			for k, c := range pc.vol {
				m := 0.0
				for j := 0; j <= k; j++ {
					m += binomial(k, j) * math.Pow(p, float64(k-j)) * K[j+1] / s2
				}
				s += c * A * m
			}
			total += math.Max(0, s-nLo*A*g)
		default:
			M := t.moments(R, pc.n)
			for k, c := range pc.vol {
				s += c * M[k]
			}
			total += math.Max(0, s-nLo*t.lowerAt(R))
		}
	}
	return total
}

// summable reports whether Σ_{v∈L} P(|v - t|) is finite for every lattice
// in n dimensions: every algebraic term must decay faster than r^{-n}.
func summable(prof Envelope, n int) bool {
	for _, t := range prof {
		if t.Decay == Algebraic && t.Amplitude > 0 && t.Power <= float64(n) {
			return false
		}
	}
	return true
}
