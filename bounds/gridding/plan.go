package gridding

import (
	"context"
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"

	"foldbound/bounds"
)

// DefaultOversampling returns the candidate oversampling ratios a plan
// tries when the request gives none: 1.25, 1.5 and 2 (a new slice each
// time).
func DefaultOversampling() []float64 { return []float64{1.25, 1.5, 2} }

// Limits on plan requests.
const (
	// MaxCandidates bounds the number of candidate oversampling ratios.
	MaxCandidates = 64
	// MaxOversampling bounds each candidate ratio.
	MaxOversampling = 16.0
	// MaxPoints bounds the number of non-uniform points in the cost model.
	MaxPoints = 1e18
)

// CostModel weighs the two stages of a gridded transform in d dimensions
// with P points and an M^d grid:
//
//	cost = Spread·P·W^d + FFT·M^d·log2(M^d)
//
// The zero value means DefaultCostModel.
type CostModel struct {
	Spread float64 // per point and grid cell touched, ≥ 0
	FFT    float64 // per grid point and factor log2 of the grid size, ≥ 0
}

// DefaultCostModel holds weights in nanoseconds of CPU time measured on
// this package (amd64, one thread, TestType1 harness with getrusage):
// spreading costs 5-25 ns per point and grid cell, depending on W and on
// the degree of the kernel polynomials the tolerance needs (about 10 at
// W = 8 and tolerance 1e-9), and gonum's complex FFT, including its set-up,
// 7-13 ns per M·log2 M.
var DefaultCostModel = CostModel{Spread: 10, FFT: 10}

// Request asks for the kernels that meet a tolerance.
type Request struct {
	// Modes is N, the number of Fourier modes per axis (k from -⌊N/2⌋ to
	// ⌈N/2⌉-1).
	Modes int
	// Dim is the dimension d, 1 to MaxDim; 0 means 1.
	Dim int
	// Tolerance bounds the error of every output, relative to Σ|c_j|
	// (type 1) or Σ|f_k| (type 2); 0 < Tolerance < 1.
	Tolerance float64
	// Kernel is the kernel family to plan for.
	Kernel KernelType
	// Oversampling lists candidate ratios σ > 1; nil means
	// DefaultOversampling.
	Oversampling []float64
	// Points is the number of non-uniform points for the cost model; 0
	// means N^d.
	Points float64
	// Cost weighs spreading against the FFT; the zero value means
	// DefaultCostModel.
	Cost CostModel
	// AnyGridSize keeps M = ⌈σN⌉; otherwise M is rounded up to the next
	// size 2^a·3^b·5^c, which gonum's FFT handles fastest.
	AnyGridSize bool
}

// Option is one configuration that meets the tolerance: the smallest
// kernel width for one candidate oversampling ratio, with its best shape.
type Option struct {
	// Oversampling is the requested σ; Setup.Oversampling() is M/N.
	Oversampling float64
	Setup        Setup
	// Tau is the Gaussian's τ (Kernel.Tau), 0 for Kaiser-Bessel.
	Tau float64
	// Published is the shape a published formula gives for this σ and W
	// (Beatty et al. for Kaiser-Bessel, Greengard & Lee for the Gaussian;
	// both from memory), for comparison with the optimised Setup.Kernel.Beta.
	Published float64
	// Bound is the certified kernel error (exact arithmetic).
	Bound ErrorBound
	// Rounding is RoundingEstimate, an estimate, not a bound.
	Rounding float64
	// Total = Bound.Total + Rounding ≤ Request.Tolerance.
	Total float64
	// SpreadCost and FFTCost are the two terms of the cost model, Cost
	// their sum.
	SpreadCost, FFTCost, Cost float64
}

// Result is a kernel plan.
type Result struct {
	Request Request // with defaults filled in
	// Options holds one Option per candidate ratio that meets the
	// tolerance with W ≤ MaxWidth, cheapest first.
	Options []Option
	// Best is Options[0], the recommended configuration.
	Best Option
	// Notes says which candidates could not meet the tolerance and why.
	Notes []string
	// Convention states the transform the bound refers to.
	Convention string
}

// Convention is the transform pair the plans are for.
const Convention = "type 1: f_k = Σ_j c_j e^{-ik·x_j}; type 2: c_j = Σ_k f_k e^{ik·x_j}; " +
	"x_j in [-π, π]^d, integer modes k with -⌊N/2⌋ ≤ k_i < ⌈N/2⌉; errors relative to Σ|c_j| (type 1) or Σ|f_k| (type 2)"

func (r *Request) normalise() error {
	if r.Dim == 0 {
		r.Dim = 1
	}
	if r.Dim < 1 || r.Dim > MaxDim {
		return invalid("plan.dim", "must be between 1 and %d, got %d", MaxDim, r.Dim)
	}
	if r.Modes < 1 {
		return invalid("plan.modes", "must be at least 1, got %d", r.Modes)
	}
	if r.Modes > MaxModes {
		return workLimit("plan.modes", "at most 2^40 modes per axis, got %d", r.Modes)
	}
	if !finite(r.Tolerance) || r.Tolerance <= 0 || r.Tolerance >= 1 {
		return invalid("plan.tolerance", "must be finite, > 0 and < 1, got %g", r.Tolerance)
	}
	if r.Kernel == 0 {
		r.Kernel = KaiserBessel
	}
	if !r.Kernel.valid() {
		return invalid("kernel.type", "unknown kernel type %d", int(r.Kernel))
	}
	if r.Oversampling == nil {
		r.Oversampling = DefaultOversampling()
	} else {
		r.Oversampling = append([]float64(nil), r.Oversampling...)
	}
	if len(r.Oversampling) == 0 || len(r.Oversampling) > MaxCandidates {
		return invalid("kernel.oversampling", "need 1 to %d candidate ratios, got %d", MaxCandidates, len(r.Oversampling))
	}
	for i, s := range r.Oversampling {
		if !finite(s) || s <= 1 || s > MaxOversampling {
			return invalid(fmt.Sprintf("kernel.oversampling[%d]", i), "must be > 1 and ≤ %g, got %g", MaxOversampling, s)
		}
	}
	if !finite(r.Points) || r.Points < 0 {
		return invalid("plan.points", "must be finite and ≥ 0, got %g", r.Points)
	}
	if r.Points > MaxPoints {
		return workLimit("plan.points", "at most 1e18 points, got %g", r.Points)
	}
	if r.Points == 0 {
		r.Points = math.Pow(float64(r.Modes), float64(r.Dim))
	}
	if !finite(r.Cost.Spread) || r.Cost.Spread < 0 {
		return invalid("cost.spread", "must be finite and ≥ 0, got %g", r.Cost.Spread)
	}
	if !finite(r.Cost.FFT) || r.Cost.FFT < 0 {
		return invalid("cost.fft", "must be finite and ≥ 0, got %g", r.Cost.FFT)
	}
	if r.Cost == (CostModel{}) {
		r.Cost = DefaultCostModel
	}
	return nil
}

// Plan returns, for each candidate oversampling ratio, the smallest kernel
// width that meets the tolerance with its best shape parameter, and
// recommends the cheapest by the cost model.
//
// For each σ the grid is M = ⌈σN⌉ (rounded up to 2^a·3^b·5^c unless
// AnyGridSize). For each width W, β is optimised on a float64 estimate of
// the bounding function (optimiseBeta, started from the whole range that
// contains the published choices); the smallest W whose estimate meets the
// tolerance is found by bisection, then certified with Bound, moving to
// W + 1 while the certified total exceeds the tolerance. An option meets
// the tolerance when
//
//	Bound(setup, d).Total + RoundingEstimate(setup, d) ≤ Tolerance.
//
// Errors wrap bounds.ErrInvalid or bounds.ErrWorkLimit (a
// *bounds.ParamError names the field, such as "kernel.oversampling[1]"),
// bounds.ErrInfeasible when no candidate meets the tolerance (the message
// gives the smallest total found), or the context's error.
func Plan(ctx context.Context, req Request) (Result, error) {
	if err := req.normalise(); err != nil {
		return Result{}, err
	}
	res := Result{Request: req, Convention: Convention}
	bestTotal := math.Inf(1)
	bestNote := ""
	for _, sigma := range req.Oversampling {
		m, err := gridSize(req.Modes, sigma, req.AnyGridSize)
		if err != nil {
			return Result{}, err
		}
		opt, achievable, err := planOne(ctx, req, sigma, m)
		if err != nil {
			return Result{}, err
		}
		if opt == nil {
			note := fmt.Sprintf("σ = %g (M = %d): no width up to %d meets %g; smallest total found %.3g at %v",
				sigma, m, min(MaxWidth, m), req.Tolerance, achievable.Total, achievable.Setup.Kernel)
			res.Notes = append(res.Notes, note)
			if achievable.Total < bestTotal {
				bestTotal = achievable.Total
				bestNote = fmt.Sprintf("%.3g (%v, σ = %g, M = %d)", achievable.Total, achievable.Setup.Kernel, sigma, m)
			}
			continue
		}
		res.Options = append(res.Options, *opt)
	}
	if len(res.Options) == 0 {
		return Result{}, infeasible("plan.tolerance",
			"no %v kernel meets %g for N = %d in %d dimension(s) with oversampling %s; the smallest certified error plus rounding estimate found is %s",
			req.Kernel, req.Tolerance, req.Modes, req.Dim, ratios(req.Oversampling), bestNote)
	}
	sort.SliceStable(res.Options, func(i, j int) bool { return res.Options[i].Cost < res.Options[j].Cost })
	res.Best = res.Options[0]
	return res, nil
}

func ratios(s []float64) string {
	parts := make([]string, len(s))
	for i, v := range s {
		parts[i] = fmt.Sprintf("%g", v)
	}
	return strings.Join(parts, ", ")
}

// gridSize returns M = ⌈σN⌉, rounded up to 2^a·3^b·5^c unless any.
func gridSize(n int, sigma float64, any bool) (int, error) {
	mf := math.Ceil(sigma * float64(n))
	if mf > maxPlanGrid {
		// Unreachable with MaxModes and MaxOversampling; kept as a guard.
		// 2^44 is itself 2-smooth, so rounding up stays within it.
		return 0, workLimit("plan.modes", "grid of %g points per axis exceeds 2^44", mf)
	}
	m := int(mf)
	if m <= n {
		m = n + 1
	}
	if !any {
		m = nextSmooth(m)
	}
	return m, nil
}

// nextSmooth returns the least 2^a·3^b·5^c ≥ n.
func nextSmooth(n int) int {
	best := math.MaxInt
	for p2 := 1; p2 < 2*n && p2 > 0; p2 *= 2 {
		for p3 := p2; p3 < 2*n; p3 *= 3 {
			for p5 := p3; p5 < 2*n; p5 *= 5 {
				if p5 >= n && p5 < best {
					best = p5
				}
			}
		}
	}
	return best
}

// candidate is a configuration with its estimate or certified bound.
type candidate struct {
	kernel Kernel
	est    float64 // estimated total (kernel estimate, d dims, plus rounding)
}

// planOne finds the option for one oversampling ratio, or nil with the
// best option found when no width meets the tolerance.
//
// The estimated total falls with W while the kernel error dominates and
// then rises with the rounding estimate, whose factor κ = φ̂(0)/φ̂(θ_max)
// grows with W (the shape β grows with W). The search starts from the
// width the asymptotic rate predicts (guessWidth), moves down while the
// estimate still meets the tolerance and up until it does, and gives up
// when the estimate stops falling. The chosen width is then certified,
// moving up while the certified total exceeds the tolerance and falls.
func planOne(ctx context.Context, req Request, sigma float64, m int) (*Option, Option, error) {
	d := req.Dim
	base := Setup{Modes: req.Modes, Grid: m}
	theta := base.thetaMax()
	cache := map[int]candidate{}
	estimate := func(w int) candidate {
		if c, ok := cache[w]; ok {
			return c
		}
		total := func(beta float64) float64 {
			k := Kernel{Type: req.Kernel, Width: w, Beta: beta}
			s := base
			s.Kernel = k
			return dimTotal(estimateSup(k, theta), d) + RoundingEstimate(s, d)
		}
		beta, est := optimiseBeta(req.Kernel, w, total)
		c := candidate{kernel: Kernel{Type: req.Kernel, Width: w, Beta: beta}, est: est}
		cache[w] = c
		return c
	}
	check := func() error {
		if err := ctx.Err(); err != nil {
			return fmt.Errorf("gridding: plan: %w", err)
		}
		return nil
	}
	maxW := min(MaxWidth, m)
	// A 2% margin for the certification.
	meets := func(w int) bool { return estimate(w).est <= req.Tolerance/1.02 }
	w := min(max(guessWidth(req.Kernel, sigma, req.Tolerance/float64(d)), MinWidth), maxW)
	if err := check(); err != nil {
		return nil, Option{}, err
	}
	if meets(w) {
		for w > MinWidth && meets(w-1) {
			w--
		}
	} else {
		for {
			if err := check(); err != nil {
				return nil, Option{}, err
			}
			if w == maxW || estimate(w+1).est >= estimate(w).est {
				// Past the smallest estimate (or started beyond it): walk
				// down to it, to report what is achievable.
				for w > MinWidth && estimate(w-1).est < estimate(w).est {
					w--
				}
				o, err := certify(ctx, req, sigma, m, estimate(w).kernel)
				return nil, o, err
			}
			w++
			if meets(w) {
				break
			}
		}
	}
	var last Option
	for ; w <= maxW; w++ {
		o, err := certify(ctx, req, sigma, m, estimate(w).kernel)
		if err != nil {
			return nil, Option{}, err
		}
		if o.Total <= req.Tolerance {
			return &o, o, nil
		}
		if last.Setup.Grid != 0 && o.Total >= last.Total {
			// Past the smallest certified total.
			return nil, last, nil
		}
		last = o
	}
	return nil, last, nil
}

// guessWidth returns the width at which the kernel error reaches tol by
// the asymptotic rates of doc.go, step 7: e^{-πW√(1-1/σ)} for
// Kaiser-Bessel and e^{-πW(σ-1)/(2σ-1)} for the Gaussian.
func guessWidth(t KernelType, sigma, tol float64) int {
	rate := math.Pi * (sigma - 1) / (2*sigma - 1)
	if t == KaiserBessel {
		rate = math.Pi * math.Sqrt(1-1/sigma)
	}
	return int(math.Ceil(math.Log(1/tol) / rate))
}

// certify computes the certified bound and the cost of one configuration.
func certify(ctx context.Context, req Request, sigma float64, m int, k Kernel) (Option, error) {
	s := Setup{Modes: req.Modes, Grid: m, Kernel: k}
	b, err := Bound(ctx, s, req.Dim)
	if errors.Is(err, bounds.ErrNotFinite) {
		// The transform reaches 0 in the band: this shape cannot serve.
		inf := math.Inf(1)
		return Option{Oversampling: sigma, Setup: s, Bound: ErrorBound{PerAxis: inf, Total: inf}, Total: inf, Cost: inf}, nil
	}
	if err != nil {
		return Option{}, err
	}
	o := Option{Oversampling: sigma, Setup: s, Bound: b}
	o.Rounding = RoundingEstimate(s, req.Dim)
	o.Total = bounds.Point(b.Total).Add(bounds.Point(o.Rounding)).Hi
	if k.Type == Gaussian {
		o.Tau = k.Tau(m)
		o.Published = greengardLeeBeta(sigma, k.Width)
	} else {
		o.Published = beattyBeta(sigma, k.Width)
	}
	d := float64(req.Dim)
	o.SpreadCost = req.Cost.Spread * req.Points * math.Pow(float64(k.Width), d)
	md := math.Pow(float64(m), d)
	o.FFTCost = req.Cost.FFT * md * math.Log2(md)
	o.Cost = o.SpreadCost + o.FFTCost
	return o, nil
}
