package bounds

import (
	"fmt"
	"math"
)

// MaxKaiserBeta is the largest shape parameter β the Kaiser-Bessel family
// accepts: I0(β) and sinh(β)/β stay finite (I0(700) ≈ 1.5·10³⁰²) and the
// series for I0 needs fewer than 700 terms.
const MaxKaiserBeta = 700

// KaiserBesselFamily is the Kaiser-Bessel window of width W and shape β,
// the usual gridding kernel of non-uniform FFTs (J. F. Kaiser, "Nonrecursive
// digital filter design using the I0-sinh window function", Proc. IEEE
// ISCAS 1974; J. I. Jackson et al., "Selection of a convolution function for
// Fourier inversion using gridding", IEEE Trans. Med. Imaging 10(3), 1991 —
// both from memory):
//
//	f(x) = I0(β √(1 - (2x/W)²))     |x| < W/2
//	     = 1/2                      |x| = W/2
//	     = 0                        |x| > W/2
//
// with I0 the modified Bessel function (DLMF 10.25.2). f jumps from
// I0(0) = 1 to 0 at the edges; the value 1/2 there is the midpoint
// convention under which the Poisson formula holds pointwise. The
// transform is
//
//	F(ξ) = W·sinh(√(β² - u²))/√(β² - u²),   u = Wξ/2
//
// (sin(√(u² - β²))/√(u² - β²) for |u| > β), from the integral
// ∫_{-1}^{1} I0(β√(1-t²)) e^{-iωt} dt = 2 sinh(√(β²-ω²))/√(β²-ω²)
// (from memory; checked against quadrature in the tests). With β = 0 the
// window is the box of width W and F(ξ) = W·sin(u)/u.
type KaiserBesselFamily struct {
	Width float64 // W > 0, the support is [-W/2, W/2]
	Beta  float64 // β, 0 ≤ β ≤ MaxKaiserBeta
}

// NewKaiserBessel returns the Kaiser-Bessel window of width W and shape β.
func NewKaiserBessel(width, beta float64) (KaiserBesselFamily, error) {
	k := KaiserBesselFamily{Width: width, Beta: beta}
	return k, k.Validate()
}

// Validate reports whether W is finite, positive and normal, and β is
// finite and in [0, MaxKaiserBeta].
func (k KaiserBesselFamily) Validate() error {
	if !finite(k.Width) || k.Width < 0x1p-1000 || k.Width > 0x1p1000 {
		return invalidf("kaiser_bessel.width", "must be finite and between 2^-1000 and 2^1000, got %g", k.Width)
	}
	if !finite(k.Beta) || k.Beta < 0 || k.Beta > MaxKaiserBeta {
		return invalidf("kaiser_bessel.beta", "must be between 0 and %d, got %g", MaxKaiserBeta, k.Beta)
	}
	return nil
}

func (k KaiserBesselFamily) String() string {
	return fmt.Sprintf("kaiser_bessel(width=%g, beta=%g)", k.Width, k.Beta)
}

// Value encloses f(x). Inside the support it evaluates I0 from
// y = (β²/4)(1 - |t|)(1 + |t|), t = 2x/W, which keeps relative accuracy of
// 1 - t² near the edges; the edge itself is detected exactly (2|x| = W).
func (k KaiserBesselFamily) Value(x Interval) Complex {
	a := x.Abs()
	W := k.Width
	lo2, hi2 := 2*a.Lo, 2*a.Hi // exact (W ≤ 2^1000 keeps them finite where it matters)
	if lo2 > W {
		return Complex{}
	}
	if lo2 == W && hi2 == W {
		return RealC(Point(0.5))
	}
	if hi2 < W {
		return RealC(k.inside(a))
	}
	// The interval reaches the edge: join the inside values, the midpoint
	// value and, beyond the edge, 0.
	r := Point(0.5)
	if lo2 < W {
		r = r.Hull(k.inside(Interval{a.Lo, W / 2}))
	}
	if hi2 > W {
		r = r.Hull(Point(0))
	}
	return RealC(r)
}

// inside encloses I0(β√(1-(2a/W)²)) for 0 ≤ a ≤ W/2.
func (k KaiserBesselFamily) inside(a Interval) Interval {
	t := a.Scale(2).Div(Point(k.Width))
	t.Hi = math.Min(t.Hi, 1)
	t.Lo = math.Min(t.Lo, t.Hi)
	oneMinus := Interval{math.Max(0, addDown(1, -t.Hi)), addUp(1, -t.Lo)}
	onePlus := t.AddFloat(1)
	b := Point(k.Beta)
	y := b.Sqr().Scale(0.25).Mul(oneMinus).Mul(onePlus)
	lo, hi := besselI0Quarter(math.Max(y.Lo, 0), math.Max(y.Hi, 0))
	return Interval{lo, hi}
}

// Transform encloses W·S(β² - u²), u = Wξ/2, with S(z) = sinh(√z)/√z
// (sinhcSqrt); β² - u² is formed as (β - |u|)(β + |u|).
func (k KaiserBesselFamily) Transform(xi Interval) Complex {
	u := xi.Scale(k.Width).Scale(0.5).Abs()
	b := Point(k.Beta)
	z := b.Sub(u).Mul(b.Add(u))
	return RealC(SinhcSqrt(z).Scale(k.Width))
}

// Spatial is compact support on [-W/2, W/2] with height I0(β), the
// maximum (at x = 0; I0 is increasing on [0, ∞)), rounded up.
func (k KaiserBesselFamily) Spatial() Envelope { return k.appendSpatial(nil) }

func (k KaiserBesselFamily) appendSpatial(dst Envelope) Envelope {
	return append(dst, EnvelopeTerm{Decay: Compact, Amplitude: BesselI0(Point(k.Beta)).Hi, Width: divUp(k.Width, 2)})
}

// Spectral is a two-term envelope, in u = W|ξ|/2:
//
//	|F| ≤ W·sinh(β)/β                 for u ≤ β   (compact term)
//	|F| ≤ W·min(1, 1/(u - β))         for u > β   (algebraic term, q = 1)
//
// The first holds because S(z) increases with z (its series has positive
// coefficients for z ≥ 0, and |S| ≤ 1 ≤ S(0) for z < 0), so |F| peaks at
// ξ = 0. The second because for u > β, |F| = W|sin v|/v with
// v = √(u² - β²) ≥ u - β, and |sin v|/v ≤ min(1, 1/v). As an envelope term
// the second is W·(1 + max(0, |ξ| - p)/ℓ)^{-1} with plateau p = 2(β+1)/W and
// width ℓ = 2/W (it is ≥ W ≥ |F| on the plateau). The power 1 is the true
// decay (f jumps at ±W/2), so the spectral side of the Poisson formula is
// not summable and alias sums use the spatial side.
func (k KaiserBesselFamily) Spectral() Envelope { return k.appendSpectral(nil) }

func (k KaiserBesselFamily) appendSpectral(dst Envelope) Envelope {
	W := Point(k.Width)
	peak := SinhcSqrt(Point(k.Beta).Sqr()).Mul(W).Hi
	band := Point(k.Beta).Scale(2).Div(W).Hi
	plateau := Point(k.Beta).AddFloat(1).Scale(2).Div(W).Hi
	width := Point(2).Div(W).Lo
	return append(dst, EnvelopeTerm{Decay: Compact, Amplitude: peak, Width: band},
		EnvelopeTerm{Decay: Algebraic, Amplitude: W.Hi, Plateau: plateau, Width: width, Power: 1})
}
