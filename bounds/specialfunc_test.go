package bounds

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// refSincBig returns sin(t)/t (1 at 0) for t given in high precision.
func refSincBig(t *big.Float) *big.Float {
	if t.Sign() == 0 {
		return bint(1, workPrec)
	}
	s, _ := refSinCosBig(t)
	return s.Quo(s, t)
}

// refSinhcBig returns sinh(t)/t (1 at 0).
func refSinhcBig(t *big.Float) *big.Float {
	if t.Sign() == 0 {
		return bint(1, workPrec)
	}
	s := refSinh(newF(workPrec).Set(t))
	return s.Quo(s, t)
}

// refSinhcSeries returns Σ z^k/(2k+1)! (for |z| ≤ 400), the definition of
// SinhcSqrt, summed with extra bits for the cancellation at z < 0.
func refSinhcSeries(z float64) *big.Float {
	wp := uint(workPrec + 64 + 2*math.Sqrt(math.Abs(z)))
	Z := bf(z, wp)
	t := bint(1, wp)
	sum := bint(1, wp)
	for k := int64(0); ; k++ {
		t.Mul(t, Z)
		t.Quo(t, bint((2*k+2)*(2*k+3), wp))
		if t.Sign() == 0 || (t.MantExp(nil) < -int(wp) && float64(k) > math.Sqrt(math.Abs(z))) {
			return sum
		}
		sum.Add(sum, t)
	}
}

// refSinhcSqrt returns sinh(√z)/√z, sin(√-z)/√-z for z < 0: by the series
// for |z| ≤ 400, by the closed forms beyond.
func refSinhcSqrt(z float64) *big.Float {
	switch {
	case math.Abs(z) <= 400:
		return refSinhcSeries(z)
	case z > 0:
		return refSinhcBig(newF(workPrec).Sqrt(bf(z, workPrec)))
	}
	return refSincBig(newF(workPrec).Sqrt(bf(-z, workPrec)))
}

// refBesselI0 returns I₀(x) = Σ (x²/4)^k/(k!)² (DLMF 10.25.2), all terms
// positive, summed until a term is below 2^-workPrec of the sum and past
// the largest term.
func refBesselI0(x float64) *big.Float {
	wp := uint(workPrec + 32)
	q := bf(x, wp)
	q.Mul(q, q)
	q.SetMantExp(q, -2)
	t := bint(1, wp)
	sum := bint(1, wp)
	for k := int64(1); ; k++ {
		t.Mul(t, q)
		t.Quo(t, bint(k*k, wp))
		if negligible(t, sum, wp) && float64(k) > math.Abs(x)/2 {
			return sum
		}
		sum.Add(sum, t)
	}
}

func specialCases() []elemCase {
	return []elemCase{
		{
			name: "Sinc", iv: Sinc, ref: func(x float64) *big.Float { return refSincBig(bf(x, workPrec)) },
			gen:   mix(uni(-10, 10), uni(-1.1, 1.1), logu(-60, 60), uni(4, 5), logu(-1074, -1000)),
			edges: symmetric(neighbours(2, 0, 5e-324, 1e-300, 0x1p-26, 1, 4.49, 4.493409457909064, math.Pi, 2*math.Pi, 1e5, 1e300)...),
			crit:  []float64{0, 4.493409457909064, -4.493409457909064, 7.725251836937707},
		},
		{
			name: "Sinhc", iv: Sinhc, ref: func(x float64) *big.Float { return refSinhcBig(bf(x, workPrec)) },
			gen:   mix(uni(-3, 3), uni(-720, 720), logu(-60, 9)),
			edges: symmetric(neighbours(2, 0, 5e-324, 1e-300, 0x1p-26, 1, 21, 22, 709.5, 710.4, 715)...),
			crit:  []float64{0},
		},
		{
			name: "XOverSinh", iv: XOverSinh, ref: func(x float64) *big.Float { r := refSinhcBig(bf(x, workPrec)); return r.Quo(bint(1, 64), r) },
			gen:   mix(uni(-3, 3), uni(-800, 800), logu(-60, 12)),
			edges: symmetric(neighbours(2, 0, 5e-324, 1e-300, 0x1p-26, 1, 21, 22, 700, 709.5, 710.4, 745, 800, 1e4)...),
			crit:  []float64{0},
		},
		{
			name: "SinhcSqrt", iv: SinhcSqrt, ref: refSinhcSqrt,
			gen:   mix(uni(-30, 30), uni(-2, 2), uni(-1000, 1000), logu(-60, 19), logu(-1074, -1000)),
			edges: neighbours(2, 0, 1, -1, 5e-324, -5e-324, -20, -20.19, -22, math.Pi*math.Pi, -math.Pi*math.Pi, 400, -400, 1e5, -1e5, -1e300),
			crit:  []float64{0, -20.190728556426629, -59.67951594410},
		},
		{
			name: "BesselI0", iv: BesselI0, ref: refBesselI0,
			gen:   mix(uni(-50, 50), uni(-3, 3), logu(-60, 9.5), uni(700, 716)),
			edges: symmetric(neighbours(2, 0, 5e-324, 1e-300, 0x1p-26, 1, 2, 5, 10, 40, 100, 700, 713.9, 714, 715)...),
			crit:  []float64{0},
		},
	}
}

// TestSpecialContainment checks Sinc, Sinhc, XOverSinh, SinhcSqrt and
// BesselI0 against math/big references on points and wide intervals.
func TestSpecialContainment(t *testing.T) {
	t.Parallel()
	for i, c := range specialCases() {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			runContainment(t, c, 200+uint64(i))
		})
	}
}

// TestSpecialReferences checks the references of specialfunc_test.go against
// published values and each other.
func TestSpecialReferences(t *testing.T) {
	t.Parallel()
	// I₀ values (A&S Table 9.8 to 9-10 digits; from memory).
	i0 := []struct {
		x, want float64
	}{
		{1, 1.266065878}, {2, 2.279585302}, {5, 27.23987182}, {10, 2815.716628},
	}
	for _, tt := range i0 {
		if got := f64(refBesselI0(tt.x)); math.Abs(got-tt.want) > 1e-9*tt.want {
			t.Errorf("I0(%g) = %.12g, want %.10g", tt.x, got, tt.want)
		}
	}
	// I₀(715) > MaxFloat64: BesselI0 returns [MaxFloat64, +Inf] beyond.
	if refBesselI0(besselI0Overflow).Cmp(bf(math.MaxFloat64, 64)) <= 0 {
		t.Errorf("I0(%d) ≤ MaxFloat64, want above", besselI0Overflow)
	}
	// Series and closed form of sinh(√z)/√z agree (DLMF 4.33.1, 4.19.1).
	for _, z := range []float64{-400, -59.7, -20, -1, 0.5, 30, 400} {
		s := refSinhcSeries(z)
		var c *big.Float
		if z > 0 {
			c = refSinhcBig(newF(workPrec).Sqrt(bf(z, workPrec)))
		} else {
			c = refSincBig(newF(workPrec).Sqrt(bf(-z, workPrec)))
		}
		if !agreeBits(s, c, 250) {
			t.Errorf("sinhc(√%g): series %s, closed form %s", z, s.Text('g', 25), c.Text('g', 25))
		}
	}
	// The first minimum of sin(x)/x, cos t₁ at tan t₁ = t₁, is above
	// sincMinValue, and sin(x)/x decreases up to sincFirstMin.
	t1 := 4.493409457909064
	if m := f64(refSincBig(bf(t1, workPrec))); m <= sincMinValue || t1 <= sincFirstMin {
		t.Errorf("sinc(t1) = %g, sincMinValue %g, sincFirstMin %g", m, sincMinValue, sincFirstMin)
	}
}

// TestSpecialTightness reports relative widths of the special functions at
// points used by the Kaiser–Bessel window (β up to 40).
func TestSpecialTightness(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(15, 16))
	var worst [3]float64
	for i := 0; i < 300; i++ {
		beta := randUniform(r, 1, 40)
		z := randUniform(r, -1600, beta*beta)
		for j, w := range []float64{
			BesselI0(Point(beta)).RelWidth(),
			SinhcSqrt(Point(z)).RelWidth(),
			Sinc(Point(randUniform(r, -20, 20))).RelWidth(),
		} {
			worst[j] = math.Max(worst[j], w)
		}
	}
	t.Logf("max relative width: BesselI0(β ≤ 40) %.3g, SinhcSqrt(z ∈ [-1600, β²]) %.3g, Sinc(|x| ≤ 20) %.3g", worst[0], worst[1], worst[2])
	if worst[0] > 1e-13 {
		t.Errorf("BesselI0 relative width %g, want ≤ 1e-13 for β ≤ 40", worst[0])
	}
}
