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

// refFamily pairs a family with its math/big reference.
type refFamily struct {
	fam Family
	ref bigFamily
}

// closedFormFamilies lists the families of this change, each at a few
// parameters, with their references.
func closedFormFamilies() []refFamily {
	var out []refFamily
	for _, a := range []float64{1, 0.3, 7} {
		out = append(out, refFamily{ExponentialFamily{a}, bigExponential(a)})
		out = append(out, refFamily{LorentzianFamily{a}, bigLorentzian(a)})
		out = append(out, refFamily{SechFamily{a}, bigSech(a)})
		out = append(out, refFamily{SechSquaredFamily{a}, bigSechSquared(a)})
		out = append(out, refFamily{FejerFamily{a}, bigFejer(a)})
	}
	for _, p := range []struct{ s, w float64 }{{1, 0}, {1, 3}, {0.4, -12}, {3, 0.5}} {
		out = append(out, refFamily{WavePacketFamily{p.s, p.w}, bigWavePacket(p.s, p.w)})
	}
	return out
}

// bigValue returns f(x) from a reference.
func bigValue(ref bigFamily, x float64) bigref.Complex {
	return ref.samples(1, x, 0, 0)[0]
}

// testPoints returns points from 0 out to |x| = R, denser near 0, with
// both signs and a few irrational-looking offsets.
func testPoints(R float64) []float64 {
	var pts []float64
	for i := 0; i <= 120; i++ {
		u := float64(i) / 120
		x := R * u * u * u
		pts = append(pts, x, -x*0.999, x+1e-3*R*math.Sqrt2)
	}
	return pts
}

// The envelopes are certified: |f(x)| ≤ Spatial().At(x) and
// |F(ξ)| ≤ Spectral().At(ξ) against math/big values, at points from the
// centre far into the tails (where rounding of rates and widths matters).
// The log gives the tightness: the largest and median ratio envelope/|f|.
func TestClosedFormEnvelopesCertified(t *testing.T) {
	for _, rf := range closedFormFamilies() {
		check := func(side string, env Envelope, scale float64, val func(float64) bigref.Complex) {
			var ratios []float64
			for _, x := range testPoints(scale) {
				v := val(x)
				bound := env.At(Point(x))
				if !bigref.In(math.Inf(-1), bound, v.Abs()) {
					t.Errorf("%v: %s envelope at %g = %.17g, below the modulus %.20g (math/big)", rf.fam, side, x, bound, v.Abs())
				}
				if m := bigref.Float64(v.Abs()); m > 1e-300 {
					ratios = append(ratios, bound/m)
				}
			}
			sort.Float64s(ratios)
			t.Logf("%v: %s envelope/|value| over %d points: median %.3g, max %.3g", rf.fam, side, len(ratios), ratios[len(ratios)/2], ratios[len(ratios)-1])
		}
		L := spatialScale(rf.fam)
		check("spatial", rf.fam.Spatial(), 200*L, func(x float64) bigref.Complex { return bigValue(rf.ref, x) })
		check("spectral", rf.fam.Spectral(), 200/L, func(xi float64) bigref.Complex { return rf.ref.transform(bigref.New(xi)) })
	}
}

// spatialScale returns the family's length scale.
func spatialScale(f Family) float64 {
	switch f := f.(type) {
	case ExponentialFamily:
		return 1 / f.Rate
	case LorentzianFamily:
		return f.Width
	case SechFamily:
		return f.Width
	case SechSquaredFamily:
		return f.Width
	case FejerFamily:
		return 2 / f.Omega
	case WavePacketFamily:
		return f.Sigma
	}
	return 1
}

// Value and Transform enclose f and F over wide intervals too (the engine
// takes sups over bands by evaluating on subintervals): for random
// intervals, some containing 0 or reaching to ±∞, the result contains the
// math/big values at points inside and is never NaN.
func TestClosedFormWideIntervals(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 1))
	for _, rf := range closedFormFamilies() {
		L := spatialScale(rf.fam)
		for trial := 0; trial < 24; trial++ {
			for _, side := range []string{"Value", "Transform"} {
				scale := L
				if side == "Transform" {
					scale = 1 / L
				}
				lo := scale * 20 * (rng.Float64() - 0.5) * math.Pow(10, 2*rng.Float64()-1)
				hi := lo + scale*math.Pow(10, 3*rng.Float64()-2)
				switch trial % 10 {
				case 0:
					hi = math.Inf(1)
				case 1:
					lo = math.Inf(-1)
				case 2:
					lo, hi = math.Inf(-1), math.Inf(1)
				case 3:
					m := math.Abs(hi)
					lo, hi = -m, m
				}
				x := Interval{lo, hi}
				var got Complex
				var val func(float64) bigref.Complex
				if side == "Value" {
					got = rf.fam.Value(x)
					val = func(v float64) bigref.Complex { return bigValue(rf.ref, v) }
				} else {
					got = rf.fam.Transform(x)
					val = func(v float64) bigref.Complex { return rf.ref.transform(bigref.New(v)) }
				}
				if math.IsNaN(got.Re.Lo) || math.IsNaN(got.Re.Hi) || math.IsNaN(got.Im.Lo) || math.IsNaN(got.Im.Hi) {
					t.Fatalf("%v: %s(%v) = %v has NaN", rf.fam, side, x, got)
				}
				a, b := math.Max(lo, -1e6*scale), math.Min(hi, 1e6*scale)
				for i := 0; i <= 10; i++ {
					p := a + (b-a)*float64(i)/10
					if i == 10 {
						p = b
					}
					v := val(p)
					if !v.In(got.Re.Lo, got.Re.Hi, got.Im.Lo, got.Im.Hi) {
						t.Errorf("%v: %s(%v) = %v, want it to contain the value %.17g at %g (math/big)", rf.fam, side, x, got, v.Re, p)
					}
				}
			}
		}
	}
}

// Point evaluations are tight: the relative width of Value and Transform
// at points stays at a few ulps per operation wherever the value is not
// tiny (> 1e-200) and not near a zero of an oscillating factor (at least
// 0.1 of the envelope there). Arguments are rounded outward (x/w, ω₀x and
// the like), so the width grows with the argument, e.g. that of cosh(u) by
// about u·2⁻⁵¹, and near a zero of cos(ω₀x) by |ω₀x|·2⁻⁵¹/|cos ω₀x|.
func TestClosedFormPointWidths(t *testing.T) {
	for _, rf := range closedFormFamilies() {
		L := spatialScale(rf.fam)
		worst := 0.0
		for _, x := range testPoints(30 * L) {
			xi := x / (L * L)
			for _, p := range []struct {
				z   Complex
				env float64
			}{
				{rf.fam.Value(Point(x)), rf.fam.Spatial().At(Point(x))},
				{rf.fam.Transform(Point(xi)), rf.fam.Spectral().At(Point(xi))},
			} {
				if m := p.z.Mag(); m > 1e-200 && m >= 0.1*p.env {
					worst = math.Max(worst, relWidth(p.z, m))
				}
			}
		}
		if worst > 1e-12 {
			t.Errorf("%v: point enclosures up to %.3g relative width, want ≤ 1e-12", rf.fam, worst)
		}
		t.Logf("%v: worst relative width of point enclosures %.2g", rf.fam, worst)
	}
}

// Bad parameters are reported as ErrInvalid with the parameter's name.
func TestClosedFormBadParameters(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	tests := []struct {
		name  string
		make  func() error
		param string
	}{
		{"exponential NaN", func() error { _, err := NewExponential(nan); return err }, "exponential.rate"},
		{"exponential +Inf", func() error { _, err := NewExponential(inf); return err }, "exponential.rate"},
		{"exponential -Inf", func() error { _, err := NewExponential(-inf); return err }, "exponential.rate"},
		{"exponential 0", func() error { _, err := NewExponential(0); return err }, "exponential.rate"},
		{"exponential negative", func() error { _, err := NewExponential(-1); return err }, "exponential.rate"},
		{"exponential underflow", func() error { _, err := NewExponential(1e-310); return err }, "exponential.rate"},
		{"lorentzian NaN", func() error { _, err := NewLorentzian(nan); return err }, "lorentzian.width"},
		{"lorentzian +Inf", func() error { _, err := NewLorentzian(inf); return err }, "lorentzian.width"},
		{"lorentzian 0", func() error { _, err := NewLorentzian(0); return err }, "lorentzian.width"},
		{"lorentzian negative", func() error { _, err := NewLorentzian(-2); return err }, "lorentzian.width"},
		{"lorentzian tiny", func() error { _, err := NewLorentzian(1e-200); return err }, "lorentzian.width"},
		{"sech NaN", func() error { _, err := NewSech(nan); return err }, "sech.width"},
		{"sech -Inf", func() error { _, err := NewSech(-inf); return err }, "sech.width"},
		{"sech 0", func() error { _, err := NewSech(0); return err }, "sech.width"},
		{"sech negative", func() error { _, err := NewSech(-0.5); return err }, "sech.width"},
		{"sech huge", func() error { _, err := NewSech(1e308); return err }, "sech.width"},
		{"sech2 NaN", func() error { _, err := NewSechSquared(nan); return err }, "sech2.width"},
		{"sech2 +Inf", func() error { _, err := NewSechSquared(inf); return err }, "sech2.width"},
		{"sech2 0", func() error { _, err := NewSechSquared(0); return err }, "sech2.width"},
		{"sech2 negative", func() error { _, err := NewSechSquared(-3); return err }, "sech2.width"},
		{"wavepacket sigma NaN", func() error { _, err := NewWavePacket(nan, 1); return err }, "wavepacket.sigma"},
		{"wavepacket sigma +Inf", func() error { _, err := NewWavePacket(inf, 1); return err }, "wavepacket.sigma"},
		{"wavepacket sigma 0", func() error { _, err := NewWavePacket(0, 1); return err }, "wavepacket.sigma"},
		{"wavepacket sigma negative", func() error { _, err := NewWavePacket(-1, 1); return err }, "wavepacket.sigma"},
		{"wavepacket omega0 NaN", func() error { _, err := NewWavePacket(1, nan); return err }, "wavepacket.omega0"},
		{"wavepacket omega0 +Inf", func() error { _, err := NewWavePacket(1, inf); return err }, "wavepacket.omega0"},
		{"wavepacket omega0 -Inf", func() error { _, err := NewWavePacket(1, -inf); return err }, "wavepacket.omega0"},
		{"fejer NaN", func() error { _, err := NewFejer(nan); return err }, "fejer.omega"},
		{"fejer +Inf", func() error { _, err := NewFejer(inf); return err }, "fejer.omega"},
		{"fejer 0", func() error { _, err := NewFejer(0); return err }, "fejer.omega"},
		{"fejer negative", func() error { _, err := NewFejer(-1); return err }, "fejer.omega"},
		{"fejer tiny", func() error { _, err := NewFejer(1e-310); return err }, "fejer.omega"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			err := tt.make()
			if !errors.Is(err, ErrInvalid) {
				t.Fatalf("err = %v, want ErrInvalid", err)
			}
			var pe *ParamError
			if !errors.As(err, &pe) || pe.Param != tt.param {
				t.Fatalf("err = %v, want a *ParamError naming %q", err, tt.param)
			}
		})
	}
	// Valid parameters, including ω₀ = 0 and negative ω₀, are accepted.
	for _, f := range []Family{ExponentialFamily{2}, LorentzianFamily{1e-3}, SechFamily{1e5},
		SechSquaredFamily{0.01}, WavePacketFamily{1, 0}, WavePacketFamily{1, -3}, FejerFamily{100}} {
		if err := Validate(f); err != nil {
			t.Errorf("Validate(%v) = %v, want nil", f, err)
		}
	}
}

// xOverSinh and fejerSinc, the helpers with series near 0, against math/big
// on points and intervals: containment everywhere, widths of a few ulps
// at points.
func TestSeriesHelpers(t *testing.T) {
	xs := func(v float64) *big.Float { return bigref.New(v) }
	q := func(v float64) *big.Float {
		if v == 0 {
			return bigref.Int(1)
		}
		return bigref.Quo(xs(v), bigref.Sinh(xs(v)))
	}
	sinc := func(v float64) *big.Float {
		if v == 0 {
			return bigref.Int(1)
		}
		return bigref.Quo(bigref.Sin(xs(v)), xs(v))
	}
	helpers := []struct {
		name string
		f    func(Interval) Interval
		ref  func(float64) *big.Float
	}{
		{"XOverSinh", XOverSinh, q},
		{"Sinc", Sinc, sinc},
	}
	var pts []float64
	for _, v := range []float64{0, 1e-300, 1e-20, 1e-8, 1e-3, 0.03, 0.0625, 0x1p-4 + 0x1p-56, 0.07, 0.5, 1, 3, 3.14159, math.Pi, 4.49, 4.4934, 5, 10, 50, 300, 700, 711, 800, 1e4, 1e10} {
		pts = append(pts, v, -v)
	}
	for _, h := range helpers {
		worst := 0.0
		for _, v := range pts {
			got := h.f(Point(v))
			want := h.ref(v)
			if !bigref.In(got.Lo, got.Hi, want) {
				t.Errorf("%s(%g) = %v, want it to contain %.20g (math/big)", h.name, v, got, want)
			}
			// Relative widths away from the zeros of sin (where the
			// absolute error of argument reduction dominates).
			if m := got.Mag(); m > 1e-280 && math.Abs(v) < 1e3 && m > 1e-3/math.Max(1, math.Abs(v)) {
				worst = math.Max(worst, got.Width()/m)
			}
			for _, w := range []float64{1e-9, 0.01, 0.5, 3, 100} {
				iv := Interval{v, v + w}
				gi := h.f(iv)
				for i := 0; i <= 8; i++ {
					p := v + w*float64(i)/8
					if !bigref.In(gi.Lo, gi.Hi, h.ref(p)) {
						t.Errorf("%s(%v) = %v, want it to contain the value at %g (math/big)", h.name, iv, gi, p)
					}
				}
			}
		}
		if worst > 1e-14 {
			t.Errorf("%s: point enclosures up to %.3g relative width", h.name, worst)
		}
		t.Logf("%s: worst relative width at points %.2g", h.name, worst)
	}
}
