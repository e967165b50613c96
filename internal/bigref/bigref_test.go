package bigref

import (
	"math"
	"testing"
)

// The references are checked against values known to many digits (digits
// of π, e, ln 2 from any handbook, e.g. DLMF 3.12.1, 4.2.21, 4.2.16 — from
// memory) and against identities, not against the engine.
func TestConstants(t *testing.T) {
	tests := []struct {
		name string
		got  float64
		want string
	}{
		{"pi", Float64(Pi()), "3.14159265358979323846264338327950288419716939937510"},
		{"e", Float64(Exp(Int(1))), "2.71828182845904523536028747135266249775724709369995"},
		{"ln2", Float64(Log(Int(2))), "0.69314718055994530941723212145817656807550013436025"},
		{"I0(1)", Float64(BesselI0(Int(1))), "1.26606587775200833559824462521471753760767031135496"},
	}
	for _, tt := range tests {
		w, _, _ := New(0).Parse(tt.want, 10)
		if RelErr(New(tt.got), w) > 1e-16 {
			t.Errorf("%s = %.17g, want %s", tt.name, tt.got, tt.want)
		}
	}
}

// Identities at full precision: sin² + cos² = 1, exp(log x) = x,
// sinh' relations, for a spread of arguments including large ones.
func TestIdentities(t *testing.T) {
	for _, x := range []float64{1e-30, 1e-5, 0.3, 1, 2.5, 10, 100, 700, 1e5, 1e15, -3.7} {
		bx := New(x)
		s, c := Sin(bx), Cos(bx)
		one := Add(Mul(s, s), Mul(c, c))
		if e := RelErr(one, Int(1)); e > 1e-80 {
			t.Errorf("sin²+cos² at %g: error %g", x, e)
		}
		if x > 0 {
			if e := RelErr(Exp(Log(bx)), bx); e > 1e-80 {
				t.Errorf("exp(log %g): error %g", x, e)
			}
		}
		if math.Abs(x) < 20 { // cosh² - sinh² cancels ~2.9|x| bits
			ch, sh := Cosh(bx), Sinh(bx)
			if e := RelErr(Sub(Mul(ch, ch), Mul(sh, sh)), Int(1)); e > 1e-60 {
				t.Errorf("cosh²-sinh² at %g: error %g", x, e)
			}
		}
		if got, want := Float64(Sin(bx)), math.Sin(x); math.Abs(got-want) > 1e-15*math.Max(1, math.Abs(x)*1e-10) && math.Abs(x) < 1e6 {
			t.Errorf("Sin(%g) = %g, math.Sin %g", x, got, want)
		}
	}
}
