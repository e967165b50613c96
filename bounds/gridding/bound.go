package gridding

import (
	"context"
	"fmt"
	"math"

	"foldbound/bounds"
)

// Limits on sizes.
const (
	// MaxModes is the largest number of modes per axis a setup or a plan
	// accepts (the rounding estimate alone exceeds 10⁻³ beyond it).
	MaxModes = 1 << 40
	// MaxDim is the largest dimension a plan accepts.
	MaxDim = 3
	// maxPlanGrid is the largest grid per axis a setup may describe
	// (MaxModes·MaxOversampling).
	maxPlanGrid = 1 << 44
)

// Setup is one gridding configuration for N modes per axis: the
// oversampled grid of M points per axis and the kernel.
type Setup struct {
	Modes  int    // N ≥ 1: modes k = -⌊N/2⌋, …, ⌈N/2⌉-1 per axis
	Grid   int    // M ≥ N, M ≥ W: points of the oversampled grid per axis
	Kernel Kernel // the gridding kernel
}

// Oversampling returns M/N.
func (s Setup) Oversampling() float64 { return float64(s.Grid) / float64(s.Modes) }

// Validate checks the setup; errors name the field ("setup.grid").
func (s Setup) Validate() error {
	if s.Modes < 1 || s.Modes > MaxModes {
		return invalid("setup.modes", "must be between 1 and 2^40, got %d", s.Modes)
	}
	if err := s.Kernel.Validate(); err != nil {
		return err
	}
	if s.Grid <= s.Modes || s.Grid > maxPlanGrid {
		return invalid("setup.grid", "must exceed the number of modes %d (oversampling > 1) and be at most 2^44, got %d", s.Modes, s.Grid)
	}
	if s.Grid < s.Kernel.Width {
		return invalid("setup.grid", "must be at least the kernel width %d, got %d", s.Kernel.Width, s.Grid)
	}
	return nil
}

// maxMode returns ⌊N/2⌋, the largest |k| of the modes.
func (s Setup) maxMode() int { return s.Modes / 2 }

// thetaMax encloses θ_max = 2π⌊N/2⌋/M from above: the band [0, θ_max]
// holds every mode frequency |θ_k| = 2π|k|/M.
func (s Setup) thetaMax() float64 {
	return twoPi.Scale(float64(s.maxMode())).Div(bounds.Point(float64(s.Grid))).Hi
}

// ErrorBound is the certified kernel error of a setup: for every mode k
// and every input, the deapodized gridded result f̃ satisfies
//
//	|f̃_k - f_k| ≤ Total · Σ_j |c_j|        (type 1; type 2 with Σ_k |f_k|)
//
// in exact arithmetic (doc.go, steps 1-5). Rounding is not included.
type ErrorBound struct {
	// PerAxis is the certified sup over the band |θ| ≤ θ_max of the
	// one-axis bounding function (A(θ) + T(θ))/φ̂(θ).
	PerAxis float64
	// Aliasing and Truncation are A/φ̂ and T/φ̂ on the piece of the band
	// where the sup was found (upper bounds there); for Kaiser-Bessel
	// Truncation is the part of the jump at the kernel's edges.
	Aliasing, Truncation float64
	// Total is (1 + PerAxis)^d - 1 for the dimension d, rounded upward.
	Total float64
	// Attained is the largest value of the one-axis bound found at a single
	// frequency; PerAxis/Attained measures how far the sup over the band
	// could be from its value at a point (at most 1% unless Pieces reached
	// its limit).
	Attained float64
	// WorstMode is the mode number k = θM/(2π) near which the sup lies.
	WorstMode float64
	// Pieces is the number of frequency intervals the band was cut into.
	Pieces int
}

// maxBandPieces limits the branch and bound over the band.
const maxBandPieces = 256

// Bound computes the certified kernel error of a setup in d dimensions
// (1 ≤ d ≤ MaxDim, a tensor-product kernel on an M^d grid with N^d
// modes). Errors wrap bounds.ErrInvalid (a *bounds.ParamError names the
// field) or the context's error.
func Bound(ctx context.Context, s Setup, dim int) (ErrorBound, error) {
	if err := s.Validate(); err != nil {
		return ErrorBound{}, err
	}
	if dim < 1 || dim > MaxDim {
		return ErrorBound{}, invalid("dim", "must be between 1 and %d, got %d", MaxDim, dim)
	}
	b, err := newShape(s.Kernel).supOverBand(ctx, s.thetaMax())
	if err != nil {
		return ErrorBound{}, err
	}
	b.WorstMode = b.WorstMode * float64(s.Grid) / (2 * math.Pi)
	b.Total = dimTotal(b.PerAxis, dim)
	if !finite(b.Total) {
		return ErrorBound{}, fmt.Errorf("gridding: bound of %v: %w", s.Kernel, bounds.ErrNotFinite)
	}
	return b, nil
}

// dimTotal returns (1 + ε)^d - 1 = Σ_{j=1}^{d} C(d, j)·ε^j rounded upward
// (summed by the binomial theorem, which keeps relative accuracy for
// small ε): with per-axis relative errors |e_i| ≤ ε,
// |Π(1 + e_i) - 1| ≤ Π(1 + |e_i|) - 1 (doc.go, step 6).
func dimTotal(eps float64, d int) float64 {
	e := bounds.Point(eps)
	var sum bounds.Interval
	binom := 1.0
	for j := 1; j <= d; j++ {
		binom = binom * float64(d-j+1) / float64(j) // exact for d ≤ 3
		sum = sum.Add(e.IntPow(j).Scale(binom))
	}
	return sum.Hi
}

// piece is one frequency interval with the upper bound of the bounding
// function over it.
type piece struct {
	theta               bounds.Interval
	upper, alias, trunc float64
}

// evalPiece bounds (A + T)/φ̂ over theta.
func (s *shape) evalPiece(theta bounds.Interval) piece {
	p := s.enclose(theta)
	if !(p.den.Lo > 0) {
		inf := math.Inf(1)
		return piece{theta, inf, inf, inf}
	}
	den := bounds.Point(p.den.Lo)
	a := bounds.Point(p.alias.Hi).Div(den).Hi
	t := bounds.Point(p.trunc.Hi).Div(den).Hi
	u := bounds.Point(p.alias.Hi).Add(bounds.Point(p.trunc.Hi)).Div(den).Hi
	if math.IsNaN(u) {
		u = math.Inf(1)
	}
	return piece{theta, u, a, t}
}

// supOverBand bounds sup over 0 ≤ θ ≤ thetaMax of the bounding function
// (even in θ) by branch and bound: the band is cut into pieces, each
// bounded in interval arithmetic, and the piece with the largest bound is
// bisected until that bound is within 1% of a value the bound takes at a
// single frequency, or maxBandPieces pieces are used.
func (s *shape) supOverBand(ctx context.Context, thetaMax float64) (ErrorBound, error) {
	if err := ctx.Err(); err != nil {
		return ErrorBound{}, fmt.Errorf("gridding: kernel bound: %w", err)
	}
	attained := 0.0
	point := func(x float64) {
		attained = math.Max(attained, s.evalPiece(bounds.Point(x)).upper)
	}
	var ps []piece
	if thetaMax == 0 {
		ps = []piece{s.evalPiece(bounds.Point(0))}
		attained = ps[0].upper
	} else {
		const initial = 8
		for i := 0; i < initial; i++ {
			lo := thetaMax * float64(i) / initial
			hi := thetaMax * float64(i+1) / initial
			if i == initial-1 {
				hi = thetaMax
			}
			ps = append(ps, s.evalPiece(bounds.Interval{Lo: lo, Hi: hi}))
			point(hi)
		}
	}
	worst := 0
	for {
		worst = 0
		for i, p := range ps {
			if p.upper > ps[worst].upper {
				worst = i
			}
		}
		w := ps[worst]
		if w.upper <= 1.01*attained || len(ps) >= maxBandPieces || w.theta.Lo == w.theta.Hi {
			break
		}
		if err := ctx.Err(); err != nil {
			return ErrorBound{}, fmt.Errorf("gridding: kernel bound: %w", err)
		}
		m := w.theta.Mid()
		if m <= w.theta.Lo || m >= w.theta.Hi {
			break
		}
		ps[worst] = s.evalPiece(bounds.Interval{Lo: w.theta.Lo, Hi: m})
		ps = append(ps, s.evalPiece(bounds.Interval{Lo: m, Hi: w.theta.Hi}))
		point(m)
	}
	w := ps[worst]
	return ErrorBound{
		PerAxis:    w.upper,
		Aliasing:   w.alias,
		Truncation: w.trunc,
		Attained:   attained,
		WorstMode:  w.theta.Mid(),
		Pieces:     len(ps),
	}, nil
}
