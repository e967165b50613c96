package bounds

import "math"

// MaxCount is the largest sample count per axis the engine accepts on a
// finite grid (2⁵³, beyond which float64 indices are no longer exact).
const MaxCount = 1 << 53

// Grid is a one-dimensional sample grid x_k = Shift + Step·k.
//
// A finite grid (Count = N ≥ 1) holds the N samples with indices
// k = -⌊(N-1)/2⌋, …, ⌊N/2⌋, so an odd count is centred on Shift. Count = 0
// means the infinite grid k ∈ Z, for which only Shift modulo Step matters.
type Grid struct {
	Step  float64 // h > 0
	Shift float64 // s, the position of sample k = 0
	Count int64   // N ≥ 1, or 0 for the infinite grid
}

// Infinite reports whether g has no truncation.
func (g Grid) Infinite() bool { return g.Count == 0 }

// Indices returns the first and last sample index of a finite grid.
func (g Grid) Indices() (lo, hi int64) {
	return -((g.Count - 1) / 2), g.Count / 2
}

// At encloses the sample position x_k = Shift + Step·k; it is a point when
// the position is a float64, so samples exactly on a jump of f get the
// midpoint value the family defines there.
func (g Grid) At(k int64) Interval {
	return position(g.Step, k, Point(g.Shift))
}

// position encloses s + h·k for every s in the interval. The product and
// the sum are rounded to nearest and their exact errors, from FMA and
// TwoSum, say which way (if any) to widen.
func position(h float64, k int64, s Interval) Interval {
	kf := float64(k)
	p := h * kf
	P := Point(p)
	if e := math.FMA(h, kf, -p); e > 0 {
		P.Hi = nextUp(p)
	} else if e < 0 {
		P.Lo = nextDown(p)
	}
	if P.Lo == P.Hi && s.Lo == s.Hi {
		r := p + s.Lo
		x := Point(r)
		if e := twoSumErr(p, s.Lo, r); e > 0 {
			x.Hi = nextUp(r)
		} else if e < 0 {
			x.Lo = nextDown(r)
		}
		return x
	}
	return P.Add(s)
}

// Window returns the interval [x_first, x_last] covered by a finite grid.
func (g Grid) Window() Interval {
	lo, hi := g.Indices()
	return g.At(lo).Hull(g.At(hi))
}

// Validate checks the grid; path names it in errors ("grid", "grid[1]").
func (g Grid) Validate(path string) error {
	if !finite(g.Step) || g.Step <= 0 {
		return invalidf(path+".step", "must be finite and > 0, got %g", g.Step)
	}
	if !finite(g.Shift) {
		return invalidf(path+".shift", "must be finite, got %g", g.Shift)
	}
	if g.Count < 0 || g.Count > MaxCount {
		return invalidf(path+".count", "must be 0 (infinite) or between 1 and 2^53, got %d", g.Count)
	}
	if g.Count > 0 {
		lo, hi := g.Indices()
		if w := g.At(lo).Hull(g.At(hi)); !w.IsFinite() {
			return invalidf(path, "window overflows float64")
		}
	}
	if math.Abs(g.Shift)/g.Step > 1<<52 {
		return invalidf(path+".shift", "|shift|/step = %g exceeds 2^52; sample positions would not be distinct", math.Abs(g.Shift)/g.Step)
	}
	return nil
}
