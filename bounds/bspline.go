package bounds

import (
	"fmt"
	"math"
)

// MaxBSplineOrder is the largest B-spline order the engine accepts.
const MaxBSplineOrder = 8

// BSplineFamily is the centred cardinal B-spline M_m of order m (degree
// m-1), the m-fold convolution of the unit box 1_{[-1/2, 1/2]}, supported on
// [-m/2, m/2]. Its transform is
//
//	F(ξ) = (sin(ξ/2)/(ξ/2))^m                     (math.md, catalogue)
//
// because the box transforms to sin(ξ/2)/(ξ/2) and convolution multiplies
// transforms. Its values follow the truncated-power formula
//
//	M_m(x) = 1/(m-1)! Σ_{j=0}^{m} (-1)^j C(m,j) (x + m/2 - j)_+^{m-1}
//
// (Schoenberg, Quart. Appl. Math. 4, 1946; de Boor, A Practical Guide to
// Splines, 1978, ch. IX — from memory). The partition of unity
// Σ_k M_m(x - k) = 1 (de Boor, ibid.) is the Poisson formula at h = 1,
// ξ = 0, where every alias term F(2πl), l ≠ 0, vanishes.
//
// Order 1 is the box, which jumps at ±1/2: its value there is 1/2, the
// midpoint convention under which the Poisson formula holds pointwise.
type BSplineFamily struct {
	Order int // m, 1 ≤ m ≤ MaxBSplineOrder
}

// NewBSpline returns the centred cardinal B-spline of order m.
func NewBSpline(m int) (BSplineFamily, error) {
	b := BSplineFamily{Order: m}
	return b, b.Validate()
}

// Validate reports whether the order is between 1 and MaxBSplineOrder.
func (b BSplineFamily) Validate() error {
	if b.Order < 1 || b.Order > MaxBSplineOrder {
		return invalidf("bspline.order", "must be between 1 and %d, got %d", MaxBSplineOrder, b.Order)
	}
	return nil
}

func (b BSplineFamily) String() string { return fmt.Sprintf("bspline(order=%d)", b.Order) }

// Value encloses M_m(x). The truncated-power sum is evaluated at y = -|x|
// (M_m is even), where only the terms with j < m/2 - |x| are non-zero: near
// the edges of the support a single term remains and nothing cancels; at
// the centre of order 8 the largest term is about 7 times the result.
// Every term is monotone in y, so a wide x gives a valid, if loose,
// enclosure, which is then clipped to [0, 1] (0 ≤ M_m ≤ 1, since M_m is an
// average of M_{m-1}).
func (b BSplineFamily) Value(x Interval) Complex {
	return RealC(bsplineValue(b.Order, x))
}

func bsplineValue(m int, x Interval) Interval {
	if m < 1 || m > MaxBSplineOrder {
		return entire
	}
	a := x.Abs()
	half := float64(m) / 2
	if a.Lo > half {
		return Interval{}
	}
	if m == 1 {
		// The box: 1 inside, 1/2 at ±1/2, 0 outside; a reaches the edge
		// unless a.Hi < 1/2.
		if a.Hi < half {
			return Point(1)
		}
		r := Point(0.5)
		if a.Lo < half {
			r = r.Hull(Point(1))
		}
		if a.Hi > half {
			r = r.Hull(Point(0))
		}
		return r
	}
	if v, ok := bsplinePieceValue(m, a); ok {
		return v
	}
	y := a.Neg()
	var sum Interval
	c := 1.0 // (-1)^j C(m, j), exact: small integers
	for j := 0; j <= m; j++ {
		t := y.AddFloat(half - float64(j)) // half - j is exact
		if t.Hi <= 0 {
			break // this and every later truncated power vanish
		}
		p := Interval{math.Max(t.Lo, 0), t.Hi}.IntPow(m - 1)
		sum = sum.Add(p.Scale(c))
		c = -c * float64(m-j) / float64(j+1)
	}
	fact := 1.0 // (m-1)!, exact
	for k := 2; k < m; k++ {
		fact *= float64(k)
	}
	v := sum.Div(Point(fact))
	return Interval{math.Max(v.Lo, 0), math.Min(v.Hi, 1)}
}

// bsplinePieces[m][j] holds the coefficients, in ascending powers of t, of
// the polynomial piece of (m-1)!·M_m on the knot interval [j - m/2, j + 1 - m/2]
// in the local variable t = x + m/2 - j ∈ [0, 1]: by the truncated-power
// formula above, where the terms i ≤ j are the non-zero ones there,
//
//	(m-1)!·M_m = Σ_{i=0}^{j} (-1)^i C(m,i) (t + j - i)^{m-1}
//	           = Σ_r t^r · C(m-1,r) · Σ_{i=0}^{j} (-1)^i C(m,i) (j - i)^{m-1-r}
//
// (binomial expansion; 0⁰ = 1). The coefficients are integers below 2⁴⁰
// for m ≤ 8, exact in float64. Only the pieces j < m/2 are used (M_m is
// even).
var bsplinePieces = func() (p [MaxBSplineOrder + 1][MaxBSplineOrder][MaxBSplineOrder]float64) {
	binom := func(n, k int) int64 {
		r := int64(1)
		for i := 1; i <= k; i++ {
			r = r * int64(n-k+i) / int64(i)
		}
		return r
	}
	ipow := func(b, e int) int64 {
		r := int64(1)
		for range e {
			r *= int64(b)
		}
		return r
	}
	for m := 2; m <= MaxBSplineOrder; m++ {
		for j := 0; j < m; j++ {
			for r := 0; r < m; r++ {
				var c int64
				for i := 0; i <= j; i++ {
					t := binom(m, i) * ipow(j-i, m-1-r)
					if i%2 == 1 {
						t = -t
					}
					c += t
				}
				p[m][j][r] = float64(c * binom(m-1, r))
			}
		}
	}
	return p
}()

// bsplineFact[m] is (m-1)!, exact.
var bsplineFact = [MaxBSplineOrder + 1]float64{0, 1, 1, 2, 6, 24, 120, 720, 5040}

// bsplinePieceValue encloses M_m(x) for x in ±a, a ≥ 0 inside the support,
// by Horner's rule on the polynomial piece at y = -a, for m ≥ 2, when -a
// lies within one knot interval (ok = false otherwise: then the truncated
// powers are summed, which hold across knots). Horner's rule in interval
// arithmetic costs m-1 products and sums, the truncated powers about m²/2
// products.
func bsplinePieceValue(m int, a Interval) (Interval, bool) {
	if m < 2 || m > MaxBSplineOrder {
		return Interval{}, false
	}
	u := a.Neg().AddFloat(float64(m) / 2) // y + m/2, y = -a; m/2 is exact
	if !(u.Lo >= 0) {
		return Interval{}, false // reaches past the support's end
	}
	j := math.Floor(u.Lo)
	if j >= float64(m)/2 && u.Hi == j && j >= 1 {
		j-- // x = 0 on a knot (even m): the end t = 1 of the piece below
	}
	if j >= float64(m)/2 || u.Hi > j+1 {
		return Interval{}, false // past the centre, or a knot inside u
	}
	t := Interval{fmax(0, addDown(u.Lo, -j)), fmin(1, addUp(u.Hi, -j))}
	c := &bsplinePieces[m][int(j)]
	p := Point(c[m-1])
	for r := m - 2; r >= 0; r-- {
		p = p.Mul(t).AddFloat(c[r])
	}
	v := p.Div(Point(bsplineFact[m]))
	return Interval{fmax(v.Lo, 0), fmin(v.Hi, 1)}, true
}

// Transform encloses (sin(ξ/2)/(ξ/2))^m.
func (b BSplineFamily) Transform(xi Interval) Complex {
	return RealC(Sinc(half(xi)).IntPow(b.Order))
}

// half returns x/2, exactly unless an endpoint is subnormal-small.
func half(x Interval) Interval {
	if (x.Lo == 0 || math.Abs(x.Lo) >= 0x1p-1020) && (x.Hi == 0 || math.Abs(x.Hi) >= 0x1p-1020) {
		return Interval{x.Lo * 0.5, x.Hi * 0.5}
	}
	return x.Scale(0.5)
}

// Spatial is compact support on [-m/2, m/2] with height M_m(0) (the
// maximum: M_m is symmetric and unimodal), rounded up.
func (b BSplineFamily) Spatial() Envelope { return b.appendSpatial(nil) }

func (b BSplineFamily) appendSpatial(dst Envelope) Envelope {
	return append(dst, EnvelopeTerm{Decay: Compact, Amplitude: bsplineValue(b.Order, Point(0)).Hi, Width: float64(b.Order) / 2})
}

// Spectral is the algebraic envelope
//
//	|F(ξ)| ≤ min(1, 2/|ξ|)^m = (1 + max(0, |ξ| - 2)/2)^{-m},
//
// from |sin u| ≤ min(|u|, 1) with u = ξ/2: amplitude 1, plateau 2, width 2,
// power m. It touches |F| at ξ = 0 and, asymptotically, at the peaks
// |sin(ξ/2)| = 1. For m = 1 it is not summable (the box transform decays
// like 1/ξ), so alias sums of the box use the spatial side.
func (b BSplineFamily) Spectral() Envelope { return b.appendSpectral(nil) }

func (b BSplineFamily) appendSpectral(dst Envelope) Envelope {
	return append(dst, EnvelopeTerm{Decay: Algebraic, Amplitude: 1, Plateau: 2, Width: 2, Power: float64(b.Order)})
}

// aliasRay bounds every alias copy along a ray, Σ_{j≥0} |F(x0 + jP)|
// for every x0 in the interval, by aliasBlock for the first J copies and
// the envelope |F(ξ)| ≤ (2/|ξ|)^m for the rest:
//
//	Σ_{j≥J} (2/(x0 + jP))^m = (2/P)^m Σ_{j≥J} (j + x0/P)^{-m}
//	                        ≤ (2/P)^m (J - 1 + x0/P)^{1-m} / (m - 1)
//
// (the sum of a decreasing function bounded by its integral from J - 1).
// J is where the two bounds meet, |sin(x0/2)| + Jδ ≈ 1, so at the steps
// of the partition of unity the whole ray is of the order of the rounding
// of P (about 1e-16 for the hat function at h = 1), where summing copies
// until the envelope's remainder is small would need of the order of
// 1/tol copies for m = 2. It returns +Inf where it does not apply.
func (b BSplineFamily) aliasRay(x0, P Interval) float64 {
	m := b.Order
	if m < 2 || m > MaxBSplineOrder || !(x0.Lo > 0) || !(P.Lo > 0) || !x0.IsFinite() || !P.IsFinite() {
		return math.Inf(1)
	}
	hp := half(P)
	k := math.Round(hp.Mid() / math.Pi)
	delta := hp.Sub(Pi.Scale(k)).Mag()
	a := Sin(half(x0)).Mag()
	J := int64(1 << 52)
	if a >= 1 {
		J = 1
	} else if delta > 0 {
		J = int64(math.Min(math.Ceil((1-a)/delta), 0x1p52))
	}
	// Away from the zeros (a not small, as for ξ ≠ 0) the first block
	// costs more than it saves: the envelope from the first copy on
	// (J = 1) is then the better bound.
	return math.Min(b.rayFrom(x0, P, J), b.rayFrom(x0, P, 1))
}

// rayFrom is aliasRay with the block of the first J copies.
func (b BSplineFamily) rayFrom(x0, P Interval, J int64) float64 {
	m := b.Order
	block := b.aliasBlock(x0, P, J)
	// (J - 1 + x0/P) from below, raised to 1 - m < 0: an upper bound.
	base := addDown(float64(J-1), divDown(x0.Lo, P.Hi))
	if !(base > 0) {
		return math.Inf(1)
	}
	inv := divUp(1, base)
	tail := divUp(mulUp(Point(divUp(2, P.Lo)).IntPow(m).Hi, Point(inv).IntPow(m-1).Hi), float64(m-1))
	return addUp(block, tail)
}

// aliasBlock bounds J alias copies of the transform, Σ_{j=0}^{J-1} |F(x0 + jP)|
// for every x0 in the interval, by their nearness to the zeros of
// sin(ξ/2). Write P/2 = kπ + δ with k the nearest integer; then
//
//	|sin((x0 + jP)/2)| = |sin(x0/2 + jδ)| ≤ |sin(x0/2)| + j|δ|,
//	|F(x0 + jP)| ≤ ((|sin(x0/2)| + j|δ|) / ((x0 + jP)/2))^m,
//
// and the ratio, a quotient of two affine functions of j, is largest at
// j = 0 or j = J-1; so the block is at most J times the m-th power of the
// larger of the two. At the steps h = 1/k and ξ = 0 (the partition of
// unity, where every copy vanishes) both ratios are of the order of the
// rounding of P, and the bound is negligible however many copies it
// covers; elsewhere it is large, and the copies are summed instead
// (aliasSummer.blockAlias).
func (b BSplineFamily) aliasBlock(x0, P Interval, J int64) float64 {
	m := b.Order
	if J <= 0 {
		return 0
	}
	if m < 2 || m > MaxBSplineOrder || !(x0.Lo > 0) || !(P.Lo > 0) || !x0.IsFinite() || !P.IsFinite() {
		return math.Inf(1)
	}
	hx, hp := half(x0), half(P)
	k := math.Round(hp.Mid() / math.Pi)
	delta := hp.Sub(Pi.Scale(k)).Mag() // ≥ |P/2 - kπ|
	a := Sin(hx).Mag()                 // ≥ |sin(x0/2)|
	jm := float64(J - 1)
	g0 := divUp(a, hx.Lo)
	g1 := divUp(addUp(a, mulUp(jm, delta)), hx.Add(hp.Scale(jm)).Lo)
	return mulUp(float64(J), Point(math.Max(g0, g1)).IntPow(m).Hi)
}
