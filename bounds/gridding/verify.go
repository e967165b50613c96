package gridding

import (
	"context"
	"math"
	"math/rand/v2"
)

// Check reports one verification run: the gridded type-1 transform
// against the direct sum on random points.
type Check struct {
	Setup  Setup
	Points int
	Seed   uint64
	// Observed is max_k |f̃_k - f_k| / Σ_j|c_j|, the gridded result f̃
	// against the direct sum f (Direct1).
	Observed float64
	// ObservedMode is the mode k where Observed was found.
	ObservedMode int
	// Bound is the certified kernel error, Rounding the estimate, Total
	// their sum: the plan's promise Observed ≤ Total.
	Bound    ErrorBound
	Rounding float64
	Total    float64
}

// Tightness returns Observed/Total.
func (c Check) Tightness() float64 { return c.Observed / c.Total }

// RandomInput returns n points uniform on [-π, π) and strengths with real
// and imaginary parts uniform on [-1, 1), from a PCG generator seeded with
// (seed, n).
func RandomInput(n int, seed uint64) ([]float64, []complex128) {
	r := rand.New(rand.NewPCG(seed, uint64(n)))
	x := make([]float64, n)
	c := make([]complex128, n)
	for i := range x {
		x[i] = math.Pi * (2*r.Float64() - 1)
		c[i] = complex(2*r.Float64()-1, 2*r.Float64()-1)
	}
	return x, c
}

// Verify runs the gridded type-1 transform of setup s on RandomInput(points,
// seed) against Direct1 and reports the observed error beside the bound.
func Verify(ctx context.Context, s Setup, points int, seed uint64) (Check, error) {
	if points < 1 || points > MaxPointCount {
		return Check{}, invalid("points", "must be between 1 and %d, got %d", MaxPointCount, points)
	}
	b, err := Bound(ctx, s, 1)
	if err != nil {
		return Check{}, err
	}
	tr, err := NewTransform(s, b.Total)
	if err != nil {
		return Check{}, err
	}
	x, c := RandomInput(points, seed)
	ref, err := Direct1(ctx, s.Modes, x, c)
	if err != nil {
		return Check{}, err
	}
	got, err := tr.Type1(ctx, x, c)
	if err != nil {
		return Check{}, err
	}
	obs, mode := MaxError(got, ref, c)
	ch := Check{Setup: s, Points: points, Seed: seed, Observed: obs, ObservedMode: mode - s.Modes/2, Bound: b}
	ch.Rounding = RoundingEstimate(s, 1)
	ch.Total = b.Total + ch.Rounding
	return ch, nil
}

// MaxError returns max_i |got_i - want_i| / Σ|c_j| and the index where it
// occurs.
func MaxError(got, want, c []complex128) (float64, int) {
	var norm float64
	for _, v := range c {
		norm += math.Hypot(real(v), imag(v))
	}
	worst, at := 0.0, 0
	for i := range got {
		d := got[i] - want[i]
		if e := math.Hypot(real(d), imag(d)); e > worst {
			worst, at = e, i
		}
	}
	if norm == 0 {
		return 0, at
	}
	return worst / norm, at
}
