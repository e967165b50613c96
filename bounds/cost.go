package bounds

import (
	"math"
	"strconv"
)

// Sizes restricts the sample counts a plan may use on each axis.
type Sizes int

const (
	// AnySize allows every count N ≥ 1.
	AnySize Sizes = iota
	// SmoothSizes allows only counts N = 2^a·3^b·5^c·7^d (7-smooth
	// numbers), the sizes for which fast Fourier transforms of mixed radix
	// are efficient (common practice, no source).
	SmoothSizes
)

func (s Sizes) String() string {
	switch s {
	case AnySize:
		return "any"
	case SmoothSizes:
		return "smooth"
	}
	return "Sizes(" + strconv.Itoa(int(s)) + ")"
}

// CostModel prices a grid. The cost of a grid of M samples in total (the
// product of the per-axis counts) is
//
//	cost = PerSample·M + PerTransform·M·log₂M,
//
// the price of evaluating the integrand at every sample plus that of a fast
// Fourier transform of the samples. The zero value counts samples
// (PerSample = 1, PerTransform = 0, any size). Both prices grow with M, so
// on one axis the cheapest plan is the one with the fewest admissible
// samples; across axes the prices decide how the tolerance is split.
type CostModel struct {
	Sizes        Sizes
	PerSample    float64 // cost of one integrand sample; 0 means 1 when PerTransform is 0 too
	PerTransform float64 // cost per M·log₂M of the transform; 0 means no transform
}

// Validate checks the cost model; path names it in errors.
func (c CostModel) Validate(path string) error {
	if c.Sizes != AnySize && c.Sizes != SmoothSizes {
		return invalidf(path+".sizes", "unknown size rule %d", int(c.Sizes))
	}
	if !finite(c.PerSample) || c.PerSample < 0 {
		return invalidf(path+".per_sample", "must be finite and ≥ 0, got %g", c.PerSample)
	}
	if !finite(c.PerTransform) || c.PerTransform < 0 {
		return invalidf(path+".per_transform", "must be finite and ≥ 0, got %g", c.PerTransform)
	}
	return nil
}

// Cost returns the price of a grid with m samples in total.
func (c CostModel) Cost(m float64) float64 {
	ps, pt := c.PerSample, c.PerTransform
	if ps == 0 && pt == 0 {
		ps = 1
	}
	cost := ps * m
	if pt > 0 && m > 1 {
		cost += pt * m * math.Log2(m)
	}
	return cost
}

// Admissible reports whether n is an allowed count.
func (c CostModel) Admissible(n int64) bool {
	if n < 1 {
		return false
	}
	if c.Sizes == SmoothSizes {
		return isSmooth(n)
	}
	return true
}

// Next returns the least allowed count ≥ n (n ≥ 1), or 0 beyond MaxCount.
func (c CostModel) Next(n int64) int64 {
	if n < 1 {
		n = 1
	}
	if n > MaxCount {
		return 0
	}
	if c.Sizes == SmoothSizes {
		m := nextSmooth(n)
		if m > MaxCount {
			return 0
		}
		return m
	}
	return n
}

// Prev returns the greatest allowed count ≤ n, or 0 if there is none.
func (c CostModel) Prev(n int64) int64 {
	if n < 1 {
		return 0
	}
	if c.Sizes == SmoothSizes {
		return prevSmooth(n)
	}
	return n
}

// isSmooth reports whether n ≥ 1 has no prime factor above 7.
func isSmooth(n int64) bool {
	if n < 1 {
		return false
	}
	for _, p := range [...]int64{2, 3, 5, 7} {
		for n%p == 0 {
			n /= p
		}
	}
	return n == 1
}

// nextSmooth returns the least 7-smooth number ≥ n, for 1 ≤ n ≤ 2^53. It
// enumerates 2^a·3^b·5^c·7^d directly: there are about 10⁴ such numbers
// below 2^53, but the loops prune every branch that passes the best one.
func nextSmooth(n int64) int64 {
	if n <= 1 {
		return 1
	}
	best := int64(1)
	for best < n {
		best *= 2 // a power of two ≥ n is always a candidate
	}
	for p7 := int64(1); p7 < best; p7 *= 7 {
		for p5 := p7; p5 < best; p5 *= 5 {
			for p3 := p5; p3 < best; p3 *= 3 {
				// Smallest power of two taking p3 to at least n.
				v := p3
				for v < n {
					v *= 2
				}
				if v < best {
					best = v
				}
			}
		}
	}
	return best
}

// prevSmooth returns the greatest 7-smooth number ≤ n, for n ≥ 1.
func prevSmooth(n int64) int64 {
	best := int64(1)
	for p7 := int64(1); p7 <= n; p7 *= 7 {
		for p5 := p7; p5 <= n; p5 *= 5 {
			for p3 := p5; p3 <= n; p3 *= 3 {
				v := p3
				for v <= n/2 {
					v *= 2
				}
				if v > best {
					best = v
				}
			}
		}
	}
	return best
}
