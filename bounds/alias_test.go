package bounds

import (
	"context"
	"errors"
	"math"
	"math/big"
	"testing"
	"time"

	"foldbound/internal/bigref"
)

// gaussianSampledBig sums h Σ_k exp(-x_k²/(2σ²)) e^{-iξx_k} over indices
// lo..hi in math/big, with x_k = s + hk exactly.
func gaussianSampledBig(sigma, h, s, xi float64, lo, hi int64) bigref.Complex {
	sum := bigref.C(0, 0)
	twoS2 := bigref.Mul(bigref.Int(2), bigref.Mul(bigref.New(sigma), bigref.New(sigma)))
	for k := lo; k <= hi; k++ {
		x := bigref.Add(bigref.New(s), bigref.Mul(bigref.New(h), bigref.Int(k)))
		v := bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(x, x), twoS2)))
		term := bigref.Real(v)
		if xi != 0 {
			term = term.Mul(bigref.Cis(bigref.Neg(bigref.Mul(bigref.New(xi), x))))
		}
		sum = sum.Add(term)
	}
	return sum.Scale(bigref.New(h))
}

// gaussianTransformBig is σ√(2π) exp(-σ²ξ²/2) (DLMF 7.7.6 by substitution).
func gaussianTransformBig(sigma, xi float64) *big.Float {
	s := bigref.New(sigma)
	twoPi := bigref.Mul(bigref.Int(2), bigref.Pi())
	u := bigref.Mul(bigref.Mul(s, s), bigref.Mul(bigref.New(xi), bigref.New(xi)))
	return bigref.Mul(bigref.Mul(s, bigref.Sqrt(twoPi)), bigref.Exp(bigref.Neg(bigref.Quo(u, bigref.Int(2)))))
}

func inC(z Complex, w bigref.Complex) bool {
	return w.In(z.Re.Lo, z.Re.Hi, z.Im.Lo, z.Im.Hi)
}

// inCRef is inC for a reference that carries its own rounding error (a
// math/big sum with phases at 320 bits is exact to about 2^-300 of its
// terms' magnitude): the reference may lie outside z by at most slack.
func inCRef(z Complex, w bigref.Complex, slack float64) bool {
	return w.In(z.Re.Lo-slack, z.Re.Hi+slack, z.Im.Lo-slack, z.Im.Hi+slack)
}

// On a finite grid the sampled sum is a finite sum: the enclosure of T and
// of the error T - F must contain the math/big values, on every side of the
// Poisson formula the engine may use, and E = Alias + Truncation.
func TestAliasSumFiniteGridContainsBigSum(t *testing.T) {
	ctx := context.Background()
	tests := []struct {
		sigma, h, s, xi float64
		n               int64
	}{
		{1, 0.5, 0, 0, 21},
		{1, 0.5, 0.1, 0, 21},
		{1, 0.5, 0.1, 0.7, 22},
		{0.7, 0.9, -0.33, 1.9, 15},
		{2, 1.3, 0.5, -0.4, 31},
		{1, 0.25, 0.01, 3, 61},
		{1, 2.5, 1.1, 0.3, 5},
		{0.3, 0.05, 0.02, 10, 41},
	}
	// And a parameter grid: 72 more points, coarse to fine.
	for _, sigma := range []float64{0.5, 1, 2} {
		for _, h := range []float64{0.3, 0.9, 1.7} {
			for _, s := range []float64{0, 0.27} {
				for _, xi := range []float64{0, 1.3} {
					for _, n := range []int64{9, 24} {
						tests = append(tests, struct {
							sigma, h, s, xi float64
							n               int64
						}{sigma, h, s * h, xi, n})
					}
				}
			}
		}
	}
	for _, tt := range tests {
		g := GaussianFamily{Sigma: tt.sigma}
		grid := Grid{Step: tt.h, Shift: tt.s, Count: tt.n}
		lo, hi := grid.Indices()
		wantT := gaussianSampledBig(tt.sigma, tt.h, tt.s, tt.xi, lo, hi)
		wantE := wantT.Sub(bigref.Real(gaussianTransformBig(tt.sigma, tt.xi)))
		for _, side := range []Side{AutoSide, SpatialSide, SpectralSide} {
			r, err := AliasSum(ctx, g, grid, tt.xi, Settings{Side: side})
			if err != nil {
				t.Fatalf("%+v %v: %v", tt, side, err)
			}
			if !inC(r.Sampled, wantT) {
				t.Errorf("%+v %v: T = %v, want %v", tt, side, r.Sampled, bigref.Float64(wantT.Re))
			}
			if !inC(r.Error, wantE) {
				t.Errorf("%+v %v: E = %v, want %.17g%+.17gi", tt, side, r.Error, bigref.Float64(wantE.Re), bigref.Float64(wantE.Im))
			}
			sum := r.Alias.Add(r.Truncation)
			if !inC(sum, wantE) {
				t.Errorf("%+v %v: Alias + Truncation = %v does not contain E", tt, side, sum)
			}
		}
	}
}

// The two sides of the Poisson formula must agree: both enclosures of the
// infinite-grid sum contain the same number, so they must intersect, and on
// the spectral side a tiny alias error keeps its relative accuracy.
func TestAliasSumSidesAgree(t *testing.T) {
	ctx := context.Background()
	g := GaussianFamily{Sigma: 1}
	for _, h := range []float64{0.3, 0.6, 1, 1.7, 2.6, 4} {
		for _, s := range []float64{0, 0.13, -0.41} {
			for _, xi := range []float64{0, 0.8, -2.2} {
				grid := Grid{Step: h, Shift: s}
				sp, err1 := AliasSum(ctx, g, grid, xi, Settings{Side: SpatialSide})
				sc, err2 := AliasSum(ctx, g, grid, xi, Settings{Side: SpectralSide})
				if err1 != nil || err2 != nil {
					t.Fatal(err1, err2)
				}
				_, okRe := sp.Sampled.Re.Intersect(sc.Sampled.Re)
				_, okIm := sp.Sampled.Im.Intersect(sc.Sampled.Im)
				if !okRe || !okIm {
					t.Errorf("h=%g s=%g ξ=%g: spatial T %v and spectral T %v are disjoint", h, s, xi, sp.Sampled, sc.Sampled)
				}
				if m := sc.Error.Mag(); m > 1e-290 && sc.Error.Re.Width() > 1e-12*m+1e-300 && sc.Error.Im.Width() > 1e-12*m+1e-300 {
					t.Errorf("h=%g s=%g ξ=%g: spectral error %v is not known to 1e-12", h, s, xi, sc.Error)
				}
			}
		}
	}
}

// A fine grid has an alias error of order exp(-2π²σ²/h²): 1e-30 and below
// must still come out with relative accuracy, not as ±1e-16 noise.
func TestAliasSumTinyErrorRelativeAccuracy(t *testing.T) {
	g := GaussianFamily{Sigma: 1}
	r, err := AliasSum(context.Background(), g, Grid{Step: 0.5}, 0, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	// Σ_{l≠0} F(4πl) = 2√(2π) e^{-8π²} + … (the l = ±1 terms dominate).
	want := 2 * math.Sqrt(2*math.Pi) * math.Exp(-8*math.Pi*math.Pi)
	if got := r.Error.Re.Mid(); math.Abs(got-want) > 1e-12*want {
		t.Errorf("E(h=0.5) = %.17g, want %.17g", got, want)
	}
	if r.Method.Side != SpectralSide {
		t.Errorf("side = %v, want spectral for a tiny alias error", r.Method.Side)
	}
}

func TestAliasSumBadInput(t *testing.T) {
	ctx := context.Background()
	g := GaussianFamily{Sigma: 1}
	inf := math.Inf(1)
	tests := []struct {
		name  string
		f     Family
		grid  Grid
		xi    float64
		set   Settings
		param string
	}{
		{"nil family", nil, Grid{Step: 1}, 0, Settings{}, "family"},
		{"nan sigma", GaussianFamily{Sigma: math.NaN()}, Grid{Step: 1}, 0, Settings{}, "gaussian.sigma"},
		{"zero step", g, Grid{Step: 0}, 0, Settings{}, "grid.step"},
		{"negative step", g, Grid{Step: -1}, 0, Settings{}, "grid.step"},
		{"inf step", g, Grid{Step: inf}, 0, Settings{}, "grid.step"},
		{"nan shift", g, Grid{Step: 1, Shift: math.NaN()}, 0, Settings{}, "grid.shift"},
		{"negative count", g, Grid{Step: 1, Count: -3}, 0, Settings{}, "grid.count"},
		{"huge count", g, Grid{Step: 1, Count: 1 << 60}, 0, Settings{}, "grid.count"},
		{"inf xi", g, Grid{Step: 1}, inf, Settings{}, "xi"},
		{"nan tol", g, Grid{Step: 1}, 0, Settings{Tol: math.NaN()}, "settings.tol"},
		{"negative max terms", g, Grid{Step: 1}, 0, Settings{MaxTerms: -1}, "settings.max_terms"},
		{"bad side", g, Grid{Step: 1}, 0, Settings{Side: 7}, "settings.side"},
	}
	for _, tt := range tests {
		_, err := AliasSum(ctx, tt.f, tt.grid, tt.xi, tt.set)
		var pe *ParamError
		if !errors.Is(err, ErrInvalid) || !errors.As(err, &pe) || pe.Param != tt.param {
			t.Errorf("%s: err = %v, want ErrInvalid naming %s", tt.name, err, tt.param)
		}
	}
}

func TestAliasSumWorkLimit(t *testing.T) {
	// 10^6 samples of a finite grid summed directly, with a limit of 1000.
	g := GaussianFamily{Sigma: 1e5}
	_, err := AliasSum(context.Background(), g, Grid{Step: 1, Count: 1_000_001}, 0, Settings{MaxTerms: 1000, Side: SpatialSide})
	if !errors.Is(err, ErrWorkLimit) {
		t.Errorf("err = %v, want ErrWorkLimit", err)
	}
}

func TestAliasSumHonoursContext(t *testing.T) {
	g := GaussianFamily{Sigma: 1e5}
	ctx, cancel := context.WithTimeout(context.Background(), time.Millisecond)
	defer cancel()
	time.Sleep(2 * time.Millisecond)
	_, err := AliasSum(ctx, g, Grid{Step: 1, Count: 1_000_001}, 0, Settings{Side: SpatialSide})
	if !errors.Is(err, context.DeadlineExceeded) {
		t.Errorf("err = %v, want context.DeadlineExceeded", err)
	}
}

func BenchmarkAliasSumGaussian(b *testing.B) {
	ctx := context.Background()
	g := GaussianFamily{Sigma: 1}
	for _, tt := range []struct {
		name string
		grid Grid
		xi   float64
	}{
		{"infinite/h=0.5", Grid{Step: 0.5, Shift: 0.3}, 0},
		{"infinite/h=1.5", Grid{Step: 1.5, Shift: 0.3}, 0.4},
		{"finite/N=33", Grid{Step: 0.5, Shift: 0.1, Count: 33}, 0},
	} {
		b.Run(tt.name, func(b *testing.B) {
			b.ReportAllocs()
			var sink SampledSum
			for i := 0; i < b.N; i++ {
				sink, _ = AliasSum(ctx, g, tt.grid, tt.xi, Settings{})
			}
			_ = sink
		})
	}
}
