package bounds

import "strconv"

// Convention names a Fourier-transform convention. The engine computes in
// the non-unitary angular convention
//
//	F(ξ) = ∫ f(x) e^{-iξx} dx;
//
// the others are rescalings of it (math.md, "Conventions"):
//
//	Unitary    F_u(ξ) = (2π)^{-n/2} F(ξ)          (same ξ)
//	Ordinary   F_o(ν) = F(2πν)                    (ν = ξ/2π, cycles per unit)
//
// Sampled sums follow the same rescaling, so the Poisson identity holds in
// every convention.
type Convention int

const (
	// Angular is the non-unitary angular convention used internally.
	Angular Convention = iota
	// Unitary is the unitary angular convention.
	Unitary
	// Ordinary is the convention in ordinary frequency (cycles per unit).
	Ordinary
)

func (c Convention) String() string {
	switch c {
	case Angular:
		return "angular"
	case Unitary:
		return "unitary"
	case Ordinary:
		return "ordinary"
	}
	return "Convention(" + strconv.Itoa(int(c)) + ")"
}

// Formula returns the transform written out in convention c.
func (c Convention) Formula() string {
	switch c {
	case Unitary:
		return "F(xi) = (2*pi)^(-n/2) * integral f(x) exp(-i xi.x) dx"
	case Ordinary:
		return "F(nu) = integral f(x) exp(-2*pi*i nu.x) dx"
	}
	return "F(xi) = integral f(x) exp(-i xi.x) dx"
}

// ToAngular converts a frequency given in convention c to angular
// frequency ξ, enclosed.
func (c Convention) ToAngular(v float64) Interval {
	if c == Ordinary {
		return TwoPi.Scale(v)
	}
	return Point(v)
}

// FromAngular converts an angular frequency enclosure to convention c.
func (c Convention) FromAngular(xi Interval) Interval {
	if c == Ordinary {
		return xi.Div(TwoPi)
	}
	return xi
}

// OutputScale encloses the factor by which values in the angular convention
// (transforms, sampled sums, errors) are multiplied to express them in
// convention c, for dimension n.
func (c Convention) OutputScale(n int) Interval {
	if c == Unitary {
		return Pow(TwoPi, -float64(n)/2)
	}
	return Point(1)
}

// Valid reports whether c is a known convention.
func (c Convention) Valid() bool { return c >= Angular && c <= Ordinary }
