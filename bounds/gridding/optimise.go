package gridding

import (
	"math"
	"sort"
)

// Shape optimisation. The certified bound is expensive (interval
// arithmetic, branch and bound over the band), so β is chosen by
// minimising a float64 estimate of the same bounding function, sampled at
// a grid of frequencies across the band, and only the chosen β is
// certified (Bound). The estimate is not a bound; the certified value is
// what plans report.

// estimateSup returns the float64 estimate of sup over [0, θ_max] of the
// bounding function of k. It samples 9 frequencies across the band and 17
// across its last 8π/W (the bound grows with θ as φ̂(θ) falls, and the
// Kaiser-Bessel jump part oscillates with period 4π/W in θ); for
// Kaiser-Bessel also the frequencies where the nearest alias copy,
// u = W(2π - θ)/2, sits at the centre or a side lobe of its sinc part,
// v = √(u² - β²) in {0, 4.49, 7.73, 10.90, 14.07} (tan v = v), where the
// bound changes fastest with θ. It then refines the largest sample by
// golden-section search between its neighbours.
func estimateSup(k Kernel, thetaMax float64) float64 {
	s := newShapeEstimate(k)
	f := func(theta float64) float64 {
		r := s.ratioEstimate(theta)
		if !(r <= math.MaxFloat64) {
			return math.Inf(1)
		}
		return r
	}
	var xs []float64
	const coarse, fine = 8, 16
	for i := 0; i <= coarse; i++ {
		xs = append(xs, thetaMax*float64(i)/coarse)
	}
	span := math.Min(thetaMax, 8*math.Pi/float64(k.Width))
	for i := 1; i < fine; i++ {
		xs = append(xs, thetaMax-span*float64(i)/fine)
	}
	if k.Type == KaiserBessel {
		w := float64(k.Width)
		for _, v := range sincLobes {
			u := math.Hypot(k.Beta, v)
			if th := 2*math.Pi - 2*u/w; th > 0 && th < thetaMax {
				xs = append(xs, th)
			}
		}
	}
	sort.Float64s(xs)
	best, at := 0.0, 0
	for i, x := range xs {
		v := f(x)
		if math.IsInf(v, 1) {
			return v
		}
		if v > best {
			best, at = v, i
		}
	}
	a := xs[max(at-1, 0)]
	b := xs[min(at+1, len(xs)-1)]
	if b > a {
		_, v := goldenMax(f, a, b, 14)
		best = math.Max(best, v)
	}
	return best
}

// sincLobes are the centre and the first extrema of sin(v)/v (the roots of
// tan v = v, DLMF 4.15 graphs; computed by Newton's method).
var sincLobes = [...]float64{0, 4.493409457909064, 7.725251836937707, 10.904121659428899, 14.066193912831473}

// goldenMax maximises f on [a, b] by golden-section search with n steps
// and returns the best point and value found.
func goldenMax(f func(float64) float64, a, b float64, n int) (float64, float64) {
	const invPhi = 0.6180339887498949 // (√5 - 1)/2
	c := b - invPhi*(b-a)
	d := a + invPhi*(b-a)
	fc, fd := f(c), f(d)
	for i := 0; i < n; i++ {
		if fc > fd {
			b, d, fd = d, c, fc
			c = b - invPhi*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + invPhi*(b-a)
			fd = f(d)
		}
	}
	if fc > fd {
		return c, fc
	}
	return d, fd
}

// newShapeEstimate builds a shape for estimates only: the Gaussian's
// truncation part is summed in float64.
func newShapeEstimate(k Kernel) *shape {
	if k.Type == Gaussian {
		return newShape(k) // the truncation sum is cheap
	}
	return &shape{k: k, w: float64(k.Width)}
}

// betaRange returns the interval searched for β: it contains the
// published choices (Beatty et al. for Kaiser-Bessel, Greengard & Lee for
// the Gaussian) and the optima found by the search for σ ≤ 4.
func betaRange(t KernelType, w int) (lo, hi float64) {
	if t == Gaussian {
		return minGaussianBeta, math.Min(MaxBeta, 0.6*math.Pi*float64(w)+2)
	}
	return 0.1, math.Min(MaxBeta, math.Pi*float64(w)+4)
}

// optimiseBeta returns the β that minimises f(β) over betaRange(t, w), with
// the value there: a scan of 16 points, then golden-section search between
// the neighbours of the best point.
func optimiseBeta(t KernelType, w int, f func(beta float64) float64) (beta, est float64) {
	lo, hi := betaRange(t, w)
	const scan = 16
	bestI, best := 0, math.Inf(1)
	xs := make([]float64, scan+1)
	for i := range xs {
		xs[i] = lo + (hi-lo)*float64(i)/scan
		if v := f(xs[i]); v < best {
			bestI, best = i, v
		}
	}
	a := xs[max(bestI-1, 0)]
	b := xs[min(bestI+1, scan)]
	// Golden-section search on [a, b].
	const invPhi = 0.6180339887498949 // (√5 - 1)/2
	c := b - invPhi*(b-a)
	d := a + invPhi*(b-a)
	fc, fd := f(c), f(d)
	for i := 0; i < 30 && b-a > 1e-4*(1+math.Abs(b)); i++ {
		if fc < fd {
			b, d, fd = d, c, fc
			c = b - invPhi*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + invPhi*(b-a)
			fd = f(d)
		}
	}
	beta, est = c, fc
	if fd < fc {
		beta, est = d, fd
	}
	if best < est {
		beta, est = xs[bestI], best
	}
	return beta, est
}
