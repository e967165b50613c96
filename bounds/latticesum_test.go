package bounds

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"
	"testing"

	"foldbound/internal/bigref"
)

// detRat returns det g exactly by Laplace expansion along the first row
// (n ≤ 4 in these tests), written independently of the engine.
func detRat(g [][]float64) *big.Rat {
	n := len(g)
	if n == 1 {
		return new(big.Rat).SetFloat64(g[0][0])
	}
	d := new(big.Rat)
	for j := 0; j < n; j++ {
		minor := make([][]float64, 0, n-1)
		for i := 1; i < n; i++ {
			row := append(append([]float64(nil), g[i][:j]...), g[i][j+1:]...)
			minor = append(minor, row)
		}
		t := new(big.Rat).SetFloat64(g[0][j])
		t.Mul(t, detRat(minor))
		if j%2 == 1 {
			t.Neg(t)
		}
		d.Add(d, t)
	}
	return d
}

// refRadius returns ρ with exp(-ρ²/(2σ²)) = 1e-40: samples farther than ρ
// from the centre are left out of the direct sums. Their sum is below
// 1e-40 times the number of points in each unit shell summed over shells,
// under 1e-30 for the lattices here (common practice, no source).
func refRadius(sigma float64) float64 { return sigma * math.Sqrt(2*40*math.Ln10) }

const refTruncation = 1e-30

// directSumFloat sums T = |det W| Σ f(x) e^{-iξ·x} over x = G·k + s in
// float64 with Neumaier's compensated summation, and returns the error
// allowance. Derivation: x_i = s_i + Σ_j G_ij k_j is computed with absolute
// error ≤ 2n·u·Σ_j |G_ij k_j| + u|s_i|; for these well-conditioned G that is
// ≤ 4n·u·|x_i| plus ulps of s, so the exponent |x-c|²/(2σ²) is off by at
// most ≈ 8n·u·xmag/σ² and the phase (ω-ξ)·x by ≈ 8n·u·xmag, with
// xmag = Σ|x_i|(|x_i|+|c_i|+|ω_i|+|ξ_i|); exp, cos and sin add 1 ulp each
// and the products 2u. Each term is thus within |t|·u·(8n·xmag(1+1/σ²) + 4)
// of its value; we allow 4 times that, plus 4u·Σ|t| for the compensated
// sum and the rounding of |det W|, plus the truncation.
func directSumFloat(tl testLattice, g radialGaussianND, shift, xi []float64) (complex128, float64) {
	n := len(tl.good)
	covol, _ := new(big.Rat).Abs(detRat(tl.good)).Float64()
	var re, im, cre, cim, allow, abs float64
	const u = 0x1p-53
	neumaier := func(s, c *float64, v float64) {
		t := *s + v
		if math.Abs(*s) >= math.Abs(v) {
			*c += (*s - t) + v
		} else {
			*c += (v - t) + *s
		}
		*s = t
	}
	forEachPoint(tl.good, shift, g.c, refRadius(g.sigma), func(_ []int64, x []float64) {
		v, xmag := refGaussianTerm(g, x, xi)
		neumaier(&re, &cre, real(v))
		neumaier(&im, &cim, imag(v))
		a := math.Hypot(real(v), imag(v))
		abs += a
		allow += 4 * a * u * (8*float64(n)*xmag*(1+1/(g.sigma*g.sigma)) + 4)
	})
	sum := complex((re+cre)*covol, (im+cim)*covol)
	return sum, covol*(allow+4*u*abs) + refTruncation
}

// directSumBig sums T in 320-bit arithmetic with the reference functions
// of internal/bigref: sample positions, |x-c|² and the phase exactly, exp,
// cos and sin to about 96 digits. Its error is negligible next to the
// truncation, which is returned as the allowance.
func directSumBig(tl testLattice, g radialGaussianND, shift, xi []float64) (bigref.Complex, float64) {
	n := len(tl.good)
	covol := new(big.Float).SetPrec(bigref.Prec).SetRat(new(big.Rat).Abs(detRat(tl.good)))
	sum := bigref.C(0, 0)
	twoS2 := bigref.Mul(bigref.Int(2), bigref.Mul(bigref.New(g.sigma), bigref.New(g.sigma)))
	forEachPoint(tl.good, shift, g.c, refRadius(g.sigma), func(k []int64, _ []float64) {
		r2 := bigref.Int(0)
		ph := bigref.Int(0)
		for i := 0; i < n; i++ {
			x := bigref.New(shift[i])
			for j := 0; j < n; j++ {
				x = bigref.Add(x, bigref.Mul(bigref.New(tl.good[i][j]), bigref.Int(k[j])))
			}
			d := bigref.Sub(x, bigref.New(g.c[i]))
			r2 = bigref.Add(r2, bigref.Mul(d, d))
			ph = bigref.Add(ph, bigref.Mul(bigref.Sub(bigref.New(g.omega[i]), bigref.New(xi[i])), x))
		}
		m := bigref.Exp(bigref.Neg(bigref.Quo(r2, twoS2)))
		if ph.Sign() == 0 {
			sum = sum.Add(bigref.Real(m))
		} else {
			sum = sum.Add(bigref.Cis(ph).Scale(m))
		}
	})
	return sum.Scale(covol), refTruncation
}

// TestLatticePoissonIdentity checks the lattice Poisson summation formula
// (math.md, "Lattices in n dimensions"; Stein & Weiss, Introduction to
// Fourier Analysis on Euclidean Spaces, 1971, Ch. VII, from memory): the
// enclosure of T computed on either side contains the direct spatial sum
// computed independently by the test.
func TestLatticePoissonIdentity(t *testing.T) {
	lats := append(namedTestLattices(), randomTestLattices(t)...)
	for _, tl := range lats {
		n := tl.lat.Dim()
		scale := math.Pow(tl.lat.Covolume().Mid(), 1/float64(n))
		sigma := 0.5 * scale
		shift := make([]float64, n)
		xi := make([]float64, n)
		c := make([]float64, n)
		omega := make([]float64, n)
		for i := 0; i < n; i++ {
			shift[i] = 0.3*scale - 0.1*float64(i)
			xi[i] = (1.1 - 0.4*float64(i)) / scale
			c[i] = 0.2 * float64(i+1) * scale
			omega[i] = 0.7 / scale * float64(i%2)
		}
		tests := []struct {
			name     string
			g        radialGaussianND
			shift    []float64
			xi       []float64
			side     Side
			bigRef   bool
			minAlias float64 // the alias must be at least this relative to |F|
		}{
			{"plain", newRadialGaussianND(n, sigma, nil, nil), make([]float64, n), make([]float64, n), SpectralSide, n == 2, 1e-9},
			{"shifted", newRadialGaussianND(n, sigma, c, omega), shift, xi, SpectralSide, n == 2, 1e-12},
			{"shifted-spatial", newRadialGaussianND(n, sigma, c, omega), shift, xi, SpatialSide, n == 2, 1e-12},
			{"wide-auto", newRadialGaussianND(n, 0.3*scale, c, nil), shift, xi, AutoSide, false, 1e-4},
		}
		for _, tt := range tests {
			t.Run(tl.name+"/"+tt.name, func(t *testing.T) {
				r, err := LatticeAliasSum(context.Background(), tt.g, tl.lat, tt.shift, tt.xi, Settings{Side: tt.side})
				if err != nil {
					t.Fatal(err)
				}
				if rel := r.Alias.Mag() / r.Exact.Mag(); rel < tt.minAlias {
					t.Errorf("alias/F = %.3g: too small for a meaningful check (want ≥ %g)", rel, tt.minAlias)
				}
				var ok bool
				var desc string
				if tt.bigRef {
					ref, allow := directSumBig(tl, tt.g, tt.shift, tt.xi)
					z := r.Sampled.Inflate(allow)
					ok = bigref.In(z.Re.Lo, z.Re.Hi, ref.Re) && bigref.In(z.Im.Lo, z.Im.Hi, ref.Im)
					desc = fmt.Sprintf("%.20g + i%.20g (320-bit)", bigref.Float64(ref.Re), bigref.Float64(ref.Im))
				} else {
					ref, allow := directSumFloat(tl, tt.g, tt.shift, tt.xi)
					ok = r.Sampled.Inflate(allow).Contains(ref)
					desc = fmt.Sprintf("%v ± %.3g (float64)", ref, allow)
				}
				if !ok {
					t.Errorf("T = %v (%v), want %s", r.Sampled, r.Method.Side, desc)
				}
				t.Logf("cond %.3g side %v: alias/F = %.3g, points %d, visited %d, remainder %.3g, width(T)/|T| = %.2g",
					tl.lat.Condition(), r.Method.Side, r.Alias.Mag()/r.Exact.Mag(), r.Method.Points,
					r.Method.Visited, r.Method.Remainder, r.Sampled.Re.Width()/r.Sampled.Mag())
			})
		}
	}
}

func TestLatticeAliasSumErrors(t *testing.T) {
	hex := Hexagonal()
	g2 := newRadialGaussianND(2, 0.5, nil, nil)
	g3 := newRadialGaussianND(3, 0.5, nil, nil)
	ctx := context.Background()
	cancelled, cancel := context.WithCancel(ctx)
	cancel()
	tests := []struct {
		name     string
		ctx      context.Context
		f        FamilyND
		lat      Lattice
		shift    []float64
		xi       []float64
		set      Settings
		sentinel error
		param    string
	}{
		{"nil family", ctx, nil, hex, nil, nil, Settings{}, ErrInvalid, "family"},
		{"dimension mismatch", ctx, g3, hex, nil, nil, Settings{}, ErrInvalid, "family"},
		{"zero lattice", ctx, g2, Lattice{}, nil, nil, Settings{}, ErrInvalid, "lattice"},
		{"nan shift", ctx, g2, hex, []float64{0, math.NaN()}, nil, Settings{}, ErrInvalid, "shift[1]"},
		{"inf xi", ctx, g2, hex, nil, []float64{math.Inf(-1), 0}, Settings{}, ErrInvalid, "xi[0]"},
		{"short xi", ctx, g2, hex, nil, []float64{0}, Settings{}, ErrInvalid, "xi"},
		{"bad tol", ctx, g2, hex, nil, nil, Settings{Tol: -1}, ErrInvalid, "settings.tol"},
		{"work limit", ctx, newRadialGaussianND(2, 0.01, nil, nil), hex, nil, nil, Settings{MaxTerms: 1000, Side: SpectralSide}, ErrWorkLimit, "settings.max_terms"},
		{"work limit spatial", ctx, newRadialGaussianND(2, 30, nil, nil), hex, nil, nil, Settings{MaxTerms: 1000, Side: SpatialSide}, ErrWorkLimit, "settings.max_terms"},
		{"unsummable", ctx, algebraicND{n: 2, q: 2}, hex, nil, nil, Settings{Side: SpectralSide}, ErrInvalid, "family"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := LatticeAliasSum(tt.ctx, tt.f, tt.lat, tt.shift, tt.xi, tt.set)
			checkParamErr(t, err, tt.sentinel, tt.param)
		})
	}
	if _, err := LatticeAliasSum(cancelled, g2, hex, nil, nil, Settings{}); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled context: err = %v, want context.Canceled", err)
	}
}

// algebraicND is a stand-in family with an algebraic spectral envelope of
// power q, for error paths only (its values are not used).
type algebraicND struct {
	n int
	q float64
}

func (a algebraicND) Dim() int                        { return a.n }
func (a algebraicND) String() string                  { return "algebraic-stand-in" }
func (a algebraicND) Value(x []Interval) Complex      { return Complex{} }
func (a algebraicND) Transform(xi []Interval) Complex { return Complex{} }
func (a algebraicND) Spatial() RadialEnvelope {
	return RadialEnvelope{Center: make([]float64, a.n), Profile: Envelope{{Decay: Algebraic, Amplitude: 1, Width: 1, Power: a.q}}}
}
func (a algebraicND) Spectral() RadialEnvelope {
	return RadialEnvelope{Center: make([]float64, a.n), Profile: Envelope{{Decay: Algebraic, Amplitude: 1, Width: 1, Power: a.q}}}
}

var sinkLattice LatticeSampledSum

// BenchmarkLatticeAliasSum times alias sums of a radial Gaussian
// (σ = 0.5, shifted lattice, ξ ≠ 0) at tolerance 1e-15 on the 2-D
// hexagonal and 3-D body-centred cubic lattices; lattice construction
// (exact reduction) is outside the loop.
func BenchmarkLatticeAliasSum(b *testing.B) {
	for _, bc := range []struct {
		name string
		lat  Lattice
	}{
		{"hexagonal-2d", Hexagonal()},
		{"bcc-3d", BodyCentredCubic()},
	} {
		n := bc.lat.Dim()
		g := newRadialGaussianND(n, 0.5, nil, nil)
		shift := make([]float64, n)
		xi := make([]float64, n)
		shift[0], xi[n-1] = 0.25, 0.8
		for _, side := range []Side{SpectralSide, SpatialSide} {
			b.Run(bc.name+"/"+side.String(), func(b *testing.B) {
				b.ReportAllocs()
				set := Settings{Tol: 1e-15, Side: side}
				for i := 0; i < b.N; i++ {
					r, err := LatticeAliasSum(context.Background(), g, bc.lat, shift, xi, set)
					if err != nil {
						b.Fatal(err)
					}
					sinkLattice = r
				}
			})
		}
	}
}

// TestLatticeSeparable checks the lattice sums in dimensions 1 and 8
// against the one-dimensional engine: on a cubic grid hZⁿ + s the radial
// Gaussian is a product of one-dimensional Gaussians, so the sampled sum
// factorises axis by axis (math.md, "Lattices in n dimensions":
// rectangular grids are the diagonal case, a separable f factorises).
func TestLatticeSeparable(t *testing.T) {
	const h, sigma, s0, xi0 = 0.75, 0.45, 0.2, 0.9
	g1 := GaussianFamily{Sigma: sigma}
	one, err := AliasSum(context.Background(), g1, Grid{Step: h, Shift: s0}, xi0, Settings{})
	if err != nil {
		t.Fatal(err)
	}
	for _, n := range []int{1, 2, 8} {
		gen := make([][]float64, n)
		shift := make([]float64, n)
		xi := make([]float64, n)
		for i := range gen {
			gen[i] = make([]float64, n)
			gen[i][i] = h
			shift[i], xi[i] = s0, xi0
		}
		lat, err := NewLattice(gen)
		if err != nil {
			t.Fatal(err)
		}
		want := RealC(Point(1))
		for i := 0; i < n; i++ {
			want = want.Mul(one.Sampled)
		}
		for _, side := range []Side{SpectralSide, SpatialSide} {
			if n == 8 && side == SpatialSide {
				continue // about 10⁷ samples in 8-D; the spectral side needs a few
			}
			r, err := LatticeAliasSum(context.Background(), newRadialGaussianND(n, sigma, nil, nil), lat, shift, xi, Settings{Side: side})
			if err != nil {
				t.Fatalf("n=%d %v: %v", n, side, err)
			}
			_, okRe := r.Sampled.Re.Intersect(want.Re)
			_, okIm := r.Sampled.Im.Intersect(want.Im)
			if !okRe || !okIm {
				t.Errorf("n=%d %v: T = %v, want %v (1-D engine to the power n)", n, side, r.Sampled, want)
			}
			t.Logf("n=%d %v: alias/F %.3g, points %d", n, side, r.Alias.Mag()/r.Exact.Mag(), r.Method.Points)
		}
	}
}

func TestNewLatticeNeverPanics(t *testing.T) {
	// Generators drawn from special values must give a lattice or an
	// error wrapping ErrInvalid, never a panic.
	vals := []float64{0, 1, -1, 0.5, 1e-300, -1e300, math.SmallestNonzeroFloat64, math.MaxFloat64, math.NaN(), math.Inf(1), 3e-8, 1 + 0x1p-52}
	rng := newTestRand(5)
	for trial := 0; trial < 1000; trial++ {
		n := 1 + rng.IntN(3)
		g := make([][]float64, n)
		for i := range g {
			g[i] = make([]float64, n)
			for j := range g[i] {
				g[i][j] = vals[rng.IntN(len(vals))]
			}
		}
		l, err := NewLattice(g)
		if err != nil {
			if !errors.Is(err, ErrInvalid) {
				t.Fatalf("NewLattice(%v): err = %v, want ErrInvalid", g, err)
			}
			continue
		}
		if c := l.Covolume(); !c.IsFinite() || c.Lo <= 0 {
			t.Fatalf("NewLattice(%v): covolume %v", g, c)
		}
	}
}
