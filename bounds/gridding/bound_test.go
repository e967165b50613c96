package gridding

import (
	"context"
	"errors"
	"math"
	"math/big"
	"testing"

	"foldbound/bounds"
	"foldbound/internal/bigref"
)

// bigKernelS evaluates the kernel the bound is about in math/big: the
// Gaussian as exp(-y²/(2s²)) with s = k.Sigma(), Kaiser-Bessel as
// I0(β√(1-(2y/W)²)) (DLMF 10.25.2), zero beyond W/2.
func bigKernelS(k Kernel, y *big.Float) *big.Float {
	if k.Type == Gaussian {
		s := bigref.New(k.Sigma())
		return bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(y, y), bigref.Mul(bigref.Int(2), bigref.Mul(s, s)))))
	}
	t := bigref.Quo(bigref.Mul(bigref.Int(2), y), bigref.Int(int64(k.Width)))
	r := bigref.Sub(bigref.Int(1), bigref.Mul(t, t))
	if r.Sign() < 0 {
		return bigref.Int(0)
	}
	return bigref.BesselI0(bigref.Mul(bigref.New(k.Beta), bigref.Sqrt(r)))
}

// bigTransform is φ̂(θ) in math/big: s√(2π)e^{-s²θ²/2} (math.md,
// catalogue) or W·sinh(√(β²-u²))/√(β²-u²), u = Wθ/2 (sin for u > β;
// Jackson et al. 1991, from memory; the tests in package bounds check it
// against quadrature).
func bigTransform(k Kernel, theta float64) *big.Float {
	th := bigref.New(theta)
	if k.Type == Gaussian {
		s := bigref.New(k.Sigma())
		st := bigref.Mul(s, th)
		e := bigref.Exp(bigref.Neg(bigref.Quo(bigref.Mul(st, st), bigref.Int(2))))
		return bigref.Mul(bigref.Mul(s, bigref.Sqrt(bigref.Mul(bigref.Int(2), bigref.Pi()))), e)
	}
	w := bigref.Int(int64(k.Width))
	u := bigref.Quo(bigref.Mul(w, th), bigref.Int(2))
	b := bigref.New(k.Beta)
	z := bigref.Sub(bigref.Mul(b, b), bigref.Mul(u, u))
	switch z.Sign() {
	case 0:
		return w
	case 1:
		r := bigref.Sqrt(z)
		return bigref.Mul(w, bigref.Quo(bigref.Sinh(r), r))
	default:
		r := bigref.Sqrt(bigref.Neg(z))
		return bigref.Mul(w, bigref.Quo(bigref.Sin(r), r))
	}
}

// bigSpreadError returns the exact deapodized error of one point with
// window offset t at frequency θ, in math/big:
//
//	|Σ_{j<W} φ(y_j) e^{-iθy_j} - φ̂(θ)| / φ̂(θ),   y_j = -W/2 + t + j,
//
// the quantity the bounding function bounds (doc.go, steps 1-4).
func bigSpreadError(k Kernel, theta, t float64) float64 {
	var sum bigref.Complex = bigref.C(0, 0)
	th := bigref.New(theta)
	for j := 0; j < k.Width; j++ {
		y := bigref.Add(bigref.New(-float64(k.Width)/2+float64(j)), bigref.New(t))
		v := bigKernelS(k, y)
		sum = sum.Add(bigref.Cis(bigref.Neg(bigref.Mul(th, y))).Scale(v))
	}
	F := bigTransform(k, theta)
	return bigref.Float64(bigref.Quo(sum.Sub(bigref.Real(F)).Abs(), F))
}

// The bounding function (A + T)/φ̂ at a frequency is at least the exact
// error of every point position, computed in math/big; the largest
// exact error over positions shows how tight it is.
func TestBoundingFunctionCoversExactError(t *testing.T) {
	tests := []struct {
		k        Kernel
		thetaMax float64
	}{
		{Kernel{KaiserBessel, 5, 11.34}, math.Pi / 2},
		{Kernel{KaiserBessel, 8, 18.68}, math.Pi / 2},
		{Kernel{KaiserBessel, 9, 16.68}, 0.8 * math.Pi},
		{Kernel{KaiserBessel, 12, 27.77}, math.Pi / 2},
		{Kernel{KaiserBessel, 4, 3}, 2},
		{Kernel{Gaussian, 7, 7.913}, math.Pi / 2},
		{Kernel{Gaussian, 14, 16.02}, math.Pi / 2},
		{Kernel{Gaussian, 19, 17.7}, 0.8 * math.Pi},
		{Kernel{Gaussian, 10, 25}, math.Pi / 2},
	}
	offsets := []float64{0, 1e-9, 0.05, 0.17, 0.31, 0.5, 0.62, 0.83, 0.97, 1 - 1e-9}
	for _, tt := range tests {
		s := newShape(tt.k)
		worstRatio := 0.0
		for _, frac := range []float64{0, 0.23, 0.5, 0.71, 0.9, 0.96, 1} {
			theta := frac * tt.thetaMax
			bound := s.evalPiece(bounds.Point(theta)).upper
			for _, off := range offsets {
				e := bigSpreadError(tt.k, theta, off)
				if e > bound {
					t.Errorf("%v θ=%g t=%g: exact error %.6g > bound %.6g", tt.k, theta, off, e, bound)
				}
				if bound > 0 {
					worstRatio = math.Max(worstRatio, e/bound)
				}
			}
		}
		t.Logf("%v: largest exact error/bound over the sampled (θ, t) = %.3f", tt.k, worstRatio)
	}
}

// Σ_{l≠0}|q̂(θ+2πl)| with its certified tail against 400 copies on each
// side summed in math/big: the enclosure lies above that partial sum (all
// terms are positive) and within 3% of it plus the estimated remainder
// (the terms fall like 1/l², so the remainder beyond L is about L times
// the last term).
func TestKaiserAliasAgainstBigSum(t *testing.T) {
	for _, tt := range []struct {
		k     Kernel
		theta float64
	}{
		{Kernel{KaiserBessel, 8, 18.68}, math.Pi / 2},
		{Kernel{KaiserBessel, 8, 18.68}, 1.3},
		{Kernel{KaiserBessel, 12, 27.77}, 1.2},
		{Kernel{KaiserBessel, 5, 11.34}, 0.4},
	} {
		s := newShape(tt.k)
		p := s.enclose(bounds.Point(tt.theta))
		const copies = 400
		sum := bigref.Int(0)
		var last float64
		for l := 1; l <= copies; l++ {
			for _, sign := range []float64{1, -1} {
				om := tt.theta + sign*2*math.Pi*float64(l)
				q := bigQ(tt.k, om)
				sum = bigref.Add(sum, q)
				last = bigref.Float64(q)
			}
		}
		partial := bigref.Float64(sum)
		remainder := float64(copies) * last
		if p.alias.Hi < partial {
			t.Errorf("%v θ=%g: alias bound %.10g < partial sum %.10g", tt.k, tt.theta, p.alias.Hi, partial)
		}
		if p.alias.Hi > 1.03*(partial+remainder) {
			t.Errorf("%v θ=%g: alias bound %.6g more than 3%% above the sum ≈ %.6g", tt.k, tt.theta, p.alias.Hi, partial+remainder)
		}
		t.Logf("%v θ=%g: alias bound %.6g, 800 copies %.6g (+ ≈%.2g beyond)", tt.k, tt.theta, p.alias.Hi, partial, remainder)
	}
}

// bigQ is |q̂(ω)| = |φ̂(ω) - W sin(u)/u|, u = W|ω|/2, in math/big.
func bigQ(k Kernel, omega float64) *big.Float {
	u := bigref.Quo(bigref.Mul(bigref.Int(int64(k.Width)), bigref.New(math.Abs(omega))), bigref.Int(2))
	box := bigref.Mul(bigref.Int(int64(k.Width)), bigref.Quo(bigref.Sin(u), u))
	return bigref.Abs(bigref.Sub(bigTransform(k, omega), box))
}

// The closed form of the box part (doc.go, step 3) against the finite sum
// in math/big: max over the offset is approached at t → 0 and equals
// T(θ) = |sin(θW/2)|·√(1 + (1/z - cot z)²), z = θ/2.
func TestBoxSupClosedForm(t *testing.T) {
	for _, w := range []int{2, 5, 8, 13} {
		s := &shape{k: Kernel{KaiserBessel, w, 10}, w: float64(w)}
		for _, theta := range []float64{1e-6, 0.1, 0.7, 1.3, math.Pi / 2, 2.4, 3} {
			T := s.boxSup(bounds.Point(theta))
			worst := 0.0
			for i := 0; i < 16; i++ {
				off := float64(i) / 16
				sum := bigref.C(0, 0)
				th := bigref.New(theta)
				for j := 0; j < w; j++ {
					y := bigref.Add(bigref.New(-float64(w)/2+float64(j)), bigref.New(off))
					sum = sum.Add(bigref.Cis(bigref.Neg(bigref.Mul(th, y))))
				}
				// b̂(θ) = 2 sin(θW/2)/θ
				bhat := bigref.Quo(bigref.Mul(bigref.Int(2), bigref.Sin(bigref.Mul(th, bigref.New(float64(w)/2)))), th)
				e := bigref.Float64(sum.Sub(bigref.Real(bhat)).Abs())
				if e > T.Hi {
					t.Errorf("W=%d θ=%g t=%g: |B| = %.17g > T = %.17g", w, theta, off, e, T.Hi)
				}
				if i == 0 && !(T.Lo <= e*(1+1e-12)+1e-300) {
					t.Errorf("W=%d θ=%g: |B(t=0)| = %.17g below the enclosure %v of T", w, theta, e, T)
				}
				worst = math.Max(worst, e)
			}
		}
	}
}

// cotGap against 1/z - cos z/sin z in math/big.
func TestCotGap(t *testing.T) {
	for _, z := range []float64{1e-8, 0.01, 0.2, 0.25, 0.2500001, 0.3, 0.5, 0.9, 1.2, 1.5} {
		g := cotGap(z)
		bz := bigref.New(z)
		want := bigref.Sub(bigref.Quo(bigref.Int(1), bz), bigref.Quo(bigref.Cos(bz), bigref.Sin(bz)))
		if !bigref.In(g.Lo, g.Hi, want) {
			t.Errorf("g(%g) = %.17g, not in %v", z, bigref.Float64(want), g)
		}
		if g.Width() > 1e-11*g.Mag() {
			t.Errorf("g(%g) enclosure %v too wide", z, g)
		}
	}
}

// The Gaussian's truncation part against the omitted samples summed in
// math/big for offsets across the cell: the bound holds for each and is
// attained at t = 0.
func TestGaussianTruncation(t *testing.T) {
	for _, k := range []Kernel{{Gaussian, 7, 7.913}, {Gaussian, 14, 16.02}, {Gaussian, 10, 0.6}, {Gaussian, 28, 32.7}} {
		s := newShape(k)
		T := s.trunc
		for _, off := range []float64{0, 0.1, 0.5, 0.77, 1 - 1e-9} {
			sum := bigref.Int(0)
			for j := 0; j < 400; j++ {
				right := float64(k.Width)/2 + off + float64(j)
				left := float64(k.Width)/2 + 1 - off + float64(j)
				sum = bigref.Add(sum, bigref.Add(bigKernelS(k, bigref.New(right)), bigKernelS(k, bigref.New(left))))
			}
			if !bigref.In(0, T.Hi, sum) {
				t.Errorf("%v t=%g: omitted samples %.17g > bound %.17g", k, off, bigref.Float64(sum), T.Hi)
			}
			if off == 0 && bigref.Float64(sum) < (1-1e-5)*T.Hi {
				t.Errorf("%v: bound %.17g not attained at t = 0 (%.17g)", k, T.Hi, bigref.Float64(sum))
			}
		}
	}
}

// The branch and bound's sup covers the bound at every mode frequency and
// lies within 1% of the largest value found at a point.
func TestBoundBandSup(t *testing.T) {
	ctx := context.Background()
	for _, s := range []Setup{
		{Modes: 64, Grid: 128, Kernel: Kernel{KaiserBessel, 8, 18.68}},
		{Modes: 100, Grid: 125, Kernel: Kernel{KaiserBessel, 9, 16.68}},
		{Modes: 63, Grid: 96, Kernel: Kernel{Gaussian, 13, 13.28}},
		{Modes: 1, Grid: 16, Kernel: Kernel{Gaussian, 13, 13.28}},
	} {
		b, err := Bound(ctx, s, 1)
		if err != nil {
			t.Fatal(err)
		}
		sh := newShape(s.Kernel)
		for k := 0; k <= s.Modes/2; k++ {
			v := sh.evalPiece(bounds.Point(2 * math.Pi * float64(k) / float64(s.Grid))).upper
			if v > b.PerAxis {
				t.Errorf("%+v: bound at mode %d = %.6g > sup %.6g", s, k, v, b.PerAxis)
			}
		}
		if b.Pieces < maxBandPieces && b.PerAxis > 1.01*b.Attained {
			t.Errorf("%+v: sup %.6g more than 1%% above the attained %.6g with %d pieces", s, b.PerAxis, b.Attained, b.Pieces)
		}
		if math.Abs(b.Aliasing+b.Truncation-b.PerAxis) > 1e-12*b.PerAxis {
			t.Errorf("%+v: parts %.6g + %.6g do not add up to %.6g", s, b.Aliasing, b.Truncation, b.PerAxis)
		}
	}
}

// (1 + ε)^d - 1 against math/big.
func TestDimTotal(t *testing.T) {
	for _, eps := range []float64{1e-12, 3.7e-7, 0.01, 0.5} {
		for d := 1; d <= 3; d++ {
			want := bigref.Int(1)
			for range d {
				want = bigref.Mul(want, bigref.Add(bigref.Int(1), bigref.New(eps)))
			}
			want = bigref.Sub(want, bigref.Int(1))
			got := dimTotal(eps, d)
			if !bigref.In(0, got, want) || bigref.RelErr(bigref.New(got), want) > 1e-14 {
				t.Errorf("(1+%g)^%d - 1 = %.17g, want %.17g", eps, d, got, bigref.Float64(want))
			}
		}
	}
}

func TestBoundBadInput(t *testing.T) {
	ctx := context.Background()
	k := Kernel{KaiserBessel, 6, 13}
	tests := []struct {
		s     Setup
		dim   int
		param string
	}{
		{Setup{0, 32, k}, 1, "setup.modes"},
		{Setup{-3, 32, k}, 1, "setup.modes"},
		{Setup{MaxModes + 1, 32, k}, 1, "setup.modes"},
		{Setup{16, 16, k}, 1, "setup.grid"},
		{Setup{4, 5, k}, 1, "setup.grid"},
		{Setup{16, 32, Kernel{KaiserBessel, 1, 13}}, 1, "kernel.width"},
		{Setup{16, 32, Kernel{Gaussian, 6, math.NaN()}}, 1, "kernel.beta"},
		{Setup{16, 32, k}, 0, "dim"},
		{Setup{16, 32, k}, 4, "dim"},
	}
	for _, tt := range tests {
		_, err := Bound(ctx, tt.s, tt.dim)
		var pe *bounds.ParamError
		if !errors.As(err, &pe) || !errors.Is(err, bounds.ErrInvalid) || pe.Param != tt.param {
			t.Errorf("Bound(%+v, %d) error = %v, want ErrInvalid naming %q", tt.s, tt.dim, err, tt.param)
		}
	}
}

// Consistency with the engine: bounds.AliasSum gives the error of the
// untruncated Gaussian on the unit grid at a shift (the aliasing of step 2)
// and of the Kaiser-Bessel kernel on the infinite grid with the midpoint
// value 1/2 at its edges (the average of the two window conventions). Both
// errors, over φ̂, stay below the bounding function.
func TestBoundAgainstAliasSum(t *testing.T) {
	ctx := context.Background()
	for _, k := range []Kernel{{Gaussian, 14, 16.02}, {Gaussian, 7, 7.9}, {KaiserBessel, 8, 18.68}, {KaiserBessel, 5, 11.34}} {
		s := newShape(k)
		var fam bounds.Family
		if k.Type == Gaussian {
			fam = bounds.GaussianFamily{Sigma: k.Sigma()}
		} else {
			fam = bounds.KaiserBesselFamily{Width: float64(k.Width), Beta: k.Beta}
		}
		for _, theta := range []float64{0.2, 1.1, math.Pi / 2} {
			p := s.enclose(bounds.Point(theta))
			for _, shift := range []float64{0, 0.13, 0.5, 0.77} {
				r, err := bounds.AliasSum(ctx, fam, bounds.Grid{Step: 1, Shift: shift}, theta, bounds.Settings{})
				if err != nil {
					t.Fatal(err)
				}
				limit := p.alias.Hi
				if k.Type == KaiserBessel {
					limit += p.trunc.Hi
				}
				// Both are enclosures: a violation is a lower end of
				// |alias| above the upper end of the bound.
				if m := r.Alias.Mig(); m > limit {
					t.Errorf("%v θ=%g s=%g: |alias| ≥ %.17g (AliasSum) > bound %.17g", k, theta, shift, m, limit)
				}
			}
		}
	}
}
