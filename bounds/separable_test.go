package bounds

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"foldbound/internal/bigref"
)

// randomTerm returns an envelope term of a random decay with random
// parameters, for the envelope-product tests.
func randomTerm(r *rand.Rand) EnvelopeTerm {
	t := EnvelopeTerm{
		Decay:     []Decay{Exponential, Gaussian, Algebraic, Compact}[r.IntN(4)],
		Amplitude: 0.1 + 3*r.Float64(),
		Center:    r.Float64()*4 - 2,
	}
	if r.IntN(3) == 0 {
		t.Plateau = r.Float64()
	}
	switch t.Decay {
	case Exponential:
		t.Rate = 0.2 + 3*r.Float64()
	case Gaussian:
		t.Width = 0.2 + 2*r.Float64()
	case Algebraic:
		t.Width = 0.2 + 2*r.Float64()
		t.Power = 0.5 + 6*r.Float64()
	case Compact:
		t.Width = 3 * r.Float64()
	}
	return t
}

// TestProductEnvelope checks the inequalities behind productEnvelope
// (documented there: the triangle inequality, Σe_j ≥ |e|,
// Π(1+a_j) ≥ 1 + Σa_j, AM-GM and (1+s/q)^q ≤ e^s) on random envelopes: the
// product of the factor envelopes, evaluated at random points, never
// exceeds the radial profile at |x - C|. The factor envelopes are the
// worst functions they admit, so this checks the derivation itself. Slack
// 1e-12 relative: the inequalities are equalities for isotropic Gaussians
// and both sides carry rounding of a few ulps; 1e-300 absolute, since
// Envelope.At reports 0 as a subnormal.
func TestProductEnvelope(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 1))
	for trial := 0; trial < 400; trial++ {
		n := 1 + r.IntN(4)
		envs := make([]Envelope, n)
		for j := range envs {
			envs[j] = make(Envelope, 1+r.IntN(3))
			for i := range envs[j] {
				envs[j][i] = randomTerm(r)
			}
			if trial%4 == 0 { // single-type products, the common case
				for i := range envs[j] {
					envs[j][i] = envs[0][0]
					envs[j][i].Center = r.Float64()
				}
			}
		}
		rad := productEnvelope(envs)
		if err := rad.Profile.Validate("profile"); err != nil {
			t.Fatalf("envelopes %v: product profile invalid: %v", envs, err)
		}
		for p := 0; p < 200; p++ {
			x := make([]float64, n)
			prod := 1.0
			var r2 Interval
			scale := []float64{0.3, 2, 10, 40}[p%4]
			for j := range x {
				x[j] = (r.Float64()*2 - 1) * scale
				prod *= envs[j].At(Point(x[j]))
				r2 = r2.Add(Point(x[j]).AddFloat(-rad.Center[j]).Sqr())
			}
			bound := rad.Profile.At(Sqrt(r2))
			// Envelope.At rounds sums upward, so zero reads as a subnormal.
			if prod > bound*(1+1e-12)+1e-300 {
				t.Fatalf("envelopes %v at x = %v: product %g exceeds the radial bound %g (%v)", envs, x, prod, bound, rad.Profile)
			}
		}
	}
}

// sepCases are separable products used below and in aliasnd_test.go.
func sepFamilies() []Separable {
	return []Separable{
		{Axes: []Family{GaussianFamily{Sigma: 0.8}, BSplineFamily{Order: 4}}},
		{Axes: []Family{KaiserBesselFamily{Width: 4, Beta: 9.2}, BSplineFamily{Order: 2}}},
		{Axes: []Family{BSplineFamily{Order: 1}, GaussianFamily{Sigma: 1.3}, KaiserBesselFamily{Width: 2, Beta: 2.3}}},
		{Axes: []Family{BSplineFamily{Order: 8}, BSplineFamily{Order: 3}}},
	}
}

// refAxisOf returns the math/big reference of a one-dimensional family
// used in these tests.
func refAxisOf(t *testing.T, f Family) refAxis {
	switch f := f.(type) {
	case GaussianFamily:
		return refGaussian(f.Sigma, 0)
	case shiftedGaussian:
		return refGaussian(f.sigma, f.center)
	case BSplineFamily:
		return refBSpline(f.Order)
	case KaiserBesselFamily:
		return refKaiserBessel(f.Width, f.Beta)
	}
	t.Fatalf("no reference for %v", f)
	return refAxis{}
}

// TestSeparableValues checks values and transforms of products against the
// math/big references of their factors, and the radial envelopes against
// sampled values.
func TestSeparableValues(t *testing.T) {
	r := rand.New(rand.NewPCG(2, 2))
	for _, s := range sepFamilies() {
		if err := s.Validate(); err != nil {
			t.Fatal(err)
		}
		spat, spec := s.Spatial(), s.Spectral()
		for p := 0; p < 60; p++ {
			x := make([]Interval, s.Dim())
			xi := make([]Interval, s.Dim())
			want := bigref.Real(bigref.Int(1))
			wantF := bigref.Real(bigref.Int(1))
			var r2, q2 Interval
			for j, f := range s.Axes {
				a := refAxisOf(t, f)
				xv := (r.Float64()*2 - 1) * 3
				fv := (r.Float64()*2 - 1) * 12
				x[j], xi[j] = Point(xv), Point(fv)
				var v bigref.Complex
				if a.sigma > 0 {
					d := bigref.Sub(bigref.New(xv), bigref.New(a.center))
					v = bigref.Real(bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(d, d), bigref.Mul(bigref.Int(2), bigref.Mul(bigref.New(a.sigma), bigref.New(a.sigma)))))))
				} else {
					v = bigref.Real(a.value(bigref.New(xv)))
				}
				want = want.Mul(v)
				wantF = wantF.Mul(a.transform(fv))
				r2 = r2.Add(Point(xv).AddFloat(-spat.Center[j]).Sqr())
				q2 = q2.Add(Point(fv).AddFloat(-spec.Center[j]).Sqr())
			}
			v := s.Value(x)
			if !want.In(v.Re.Lo, v.Re.Hi, v.Im.Lo, v.Im.Hi) {
				t.Errorf("%v: f(%v) = %v, want it to contain %.17g", s, x, v, bigref.Float64(want.Re))
			}
			F := s.Transform(xi)
			if !wantF.In(F.Re.Lo, F.Re.Hi, F.Im.Lo, F.Im.Hi) {
				t.Errorf("%v: F(%v) = %v, want it to contain %.17g", s, xi, F, bigref.Float64(wantF.Re))
			}
			if env := spat.Profile.At(Sqrt(r2)); !bigref.In(0, env, want.Abs()) {
				t.Errorf("%v: |f(%v)| = %g above the radial envelope %g", s, x, bigref.Float64(want.Abs()), env)
			}
			if env := spec.Profile.At(Sqrt(q2)); !bigref.In(0, env, wantF.Abs()) {
				t.Errorf("%v: |F(%v)| = %g above the radial envelope %g", s, xi, bigref.Float64(wantF.Abs()), env)
			}
		}
	}
}

// TestSeparableInvalid checks the dimension and factor checks.
func TestSeparableInvalid(t *testing.T) {
	nine := make([]Family, 9)
	for j := range nine {
		nine[j] = GaussianFamily{Sigma: 1}
	}
	tests := []struct {
		name  string
		axes  []Family
		param string
	}{
		{"empty", nil, "separable.axes"},
		{"too many axes", nine, "separable.axes"},
		{"nil factor", []Family{GaussianFamily{Sigma: 1}, nil}, "separable.axes[1].family"},
		{"bad sigma", []Family{GaussianFamily{Sigma: -1}}, "separable.axes[0].gaussian.sigma"},
		{"bad order", []Family{GaussianFamily{Sigma: 1}, BSplineFamily{Order: 0}}, "separable.axes[1].bspline.order"},
		{"bad beta", []Family{KaiserBesselFamily{Width: 1, Beta: math.NaN()}}, "separable.axes[0].kaiser_bessel.beta"},
	}
	for _, tt := range tests {
		_, err := NewSeparable(tt.axes...)
		var pe *ParamError
		if !errors.Is(err, ErrInvalid) || !errors.As(err, &pe) || pe.Param != tt.param {
			t.Errorf("%s: NewSeparable = %v, want ErrInvalid naming %q", tt.name, err, tt.param)
		}
	}
	if s := (Separable{Axes: []Family{GaussianFamily{Sigma: 1}, BSplineFamily{Order: 2}}}).String(); !strings.Contains(s, "gaussian(sigma=1) × bspline(order=2)") {
		t.Errorf("String() = %q, want the factors joined by ×", s)
	}
}
