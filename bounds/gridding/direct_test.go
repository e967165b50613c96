package gridding

import (
	"context"
	"math"
	"testing"

	"foldbound/internal/bigref"
)

// Direct1 and Direct2 against the same sums in math/big (bigref.Cis at
// 320 bits): every output within 5u·Σ|c_j| (u = 2⁻⁵³), the accuracy
// claimed in direct.go.
func TestDirectAgainstBig(t *testing.T) {
	ctx := context.Background()
	const n, points = 33, 60
	x, c := RandomInput(points, 11)
	x[0], x[1] = -math.Pi, math.Pi // the ends of the interval
	var norm float64
	for _, v := range c {
		norm += math.Hypot(real(v), imag(v))
	}
	f, err := Direct1(ctx, n, x, c)
	if err != nil {
		t.Fatal(err)
	}
	worst := 0.0
	for i, got := range f {
		k := bigref.Int(int64(i - n/2))
		sum := bigref.C(0, 0)
		for j := range x {
			ph := bigref.Cis(bigref.Neg(bigref.Mul(k, bigref.New(x[j]))))
			sum = sum.Add(bigref.C(real(c[j]), imag(c[j])).Mul(ph))
		}
		e := bigref.Float64(bigref.C(real(got), imag(got)).Sub(sum).Abs()) / norm
		worst = math.Max(worst, e)
		if e > 5*unitRoundoff {
			t.Errorf("Direct1: f_%d = %v, error %.3g·Σ|c| > 5u", i-n/2, got, e)
		}
	}
	t.Logf("Direct1: largest error %.2g·Σ|c_j| (%.2f u)", worst, worst/unitRoundoff)

	_, fk := RandomInput(n, 12)
	var fnorm float64
	for _, v := range fk {
		fnorm += math.Hypot(real(v), imag(v))
	}
	g, err := Direct2(ctx, x, fk)
	if err != nil {
		t.Fatal(err)
	}
	for j, got := range g {
		sum := bigref.C(0, 0)
		for i, v := range fk {
			ph := bigref.Cis(bigref.Mul(bigref.Int(int64(i-n/2)), bigref.New(x[j])))
			sum = sum.Add(bigref.C(real(v), imag(v)).Mul(ph))
		}
		if e := bigref.Float64(bigref.C(real(got), imag(got)).Sub(sum).Abs()) / fnorm; e > 5*unitRoundoff {
			t.Errorf("Direct2: c_%d = %v, error %.3g·Σ|f| > 5u", j, got, e)
		}
	}
}
