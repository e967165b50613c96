package bounds

import "math"

// Interval versions of the elementary functions. Each evaluates Go's math
// function at the endpoints that bound the range (using monotonicity or the
// location of extrema) and widens the result as described under "Accuracy"
// in the package documentation.

// Interval constants, each a rigorous enclosure of the named number.
var (
	// Pi encloses π; math.Pi = RN(π) lies below π (π = 3.14159265358979323846…).
	Pi = Interval{math.Pi, nextUp(math.Pi)}
	// TwoPi encloses 2π.
	TwoPi = Pi.Scale(2)
	// SqrtPi encloses √π.
	SqrtPi = Sqrt(Pi)
	// SqrtTwoPi encloses √(2π).
	SqrtTwoPi = Sqrt(TwoPi)
)

// Sqrt returns {√v : v in x, v ≥ 0}; negative parts of x are ignored.
func Sqrt(x Interval) Interval {
	return Interval{sqrtDown(x.Lo), sqrtUp(x.Hi)}
}

// Exp returns e^x.
func Exp(x Interval) Interval {
	return Interval{math.Max(0, widenDown(math.Exp(x.Lo))), widenUp(math.Exp(x.Hi))}
}

// Expm1 returns e^x - 1, accurate near 0.
func Expm1(x Interval) Interval {
	return Interval{math.Max(-1, widenDown(math.Expm1(x.Lo))), widenUp(math.Expm1(x.Hi))}
}

// Log returns ln x. Where x reaches 0 or below, the lower endpoint is -∞;
// if x lies wholly at or below 0 the result is Entire.
func Log(x Interval) Interval {
	if x.Hi <= 0 {
		return entire
	}
	lo := math.Inf(-1)
	if x.Lo > 0 {
		lo = widenDown(math.Log(x.Lo))
	}
	return Interval{lo, widenUp(math.Log(x.Hi))}
}

// Log1p returns ln(1 + x).
func Log1p(x Interval) Interval {
	if x.Hi <= -1 {
		return entire
	}
	lo := math.Inf(-1)
	if x.Lo > -1 {
		lo = widenDown(math.Log1p(x.Lo))
	}
	return Interval{lo, widenUp(math.Log1p(x.Hi))}
}

// Pow returns x^p for real p, computed as exp(p·ln x) in interval
// arithmetic so that no accuracy claim about math.Pow is needed. Parts of x
// below 0 are ignored; for p > 0 the value at 0 is 0.
func Pow(x Interval, p float64) Interval {
	if p == 0 {
		return Point(1)
	}
	if x.Hi <= 0 {
		if p > 0 {
			return Point(0)
		}
		return Interval{math.Inf(1), math.Inf(1)}
	}
	r := Exp(Log(Interval{math.Max(x.Lo, 0), x.Hi}).Scale(p))
	if x.Lo <= 0 {
		if p > 0 {
			r.Lo = 0
		} else {
			r.Hi = math.Inf(1)
		}
	}
	return r
}

// trigAbs is the absolute error we allow for argument reduction in sin and
// cos per unit of |x| (see doc.go, "Accuracy").
const trigAbs = 0x1p-62

// sinPoint returns an enclosure of sin(v).
func sinPoint(v float64) Interval {
	r := math.Sin(v)
	e := math.Abs(v)*trigAbs + libmAbs
	return Interval{math.Max(-1, nextDown(widenDown(r)-e)), math.Min(1, nextUp(widenUp(r)+e))}
}

// cosPoint returns an enclosure of cos(v).
func cosPoint(v float64) Interval {
	r := math.Cos(v)
	e := math.Abs(v)*trigAbs + libmAbs
	return Interval{math.Max(-1, nextDown(widenDown(r)-e)), math.Min(1, nextUp(widenUp(r)+e))}
}

// mayHitPhase reports whether x may contain a point 2π(k + phase) for an
// integer k. It errs on the side of true.
func mayHitPhase(x Interval, phase float64) bool {
	u := Point(x.Lo).Div(TwoPi).AddFloat(-phase)
	v := Point(x.Hi).Div(TwoPi).AddFloat(-phase)
	return math.Ceil(u.Lo) <= math.Floor(v.Hi)
}

// Sin returns sin x.
func Sin(x Interval) Interval {
	if !x.IsFinite() || x.Hi-x.Lo >= 6.28 {
		return Interval{-1, 1}
	}
	if x.Lo == x.Hi {
		return sinPoint(x.Lo)
	}
	r := sinPoint(x.Lo).Hull(sinPoint(x.Hi))
	if mayHitPhase(x, 0.25) {
		r.Hi = 1
	}
	if mayHitPhase(x, 0.75) {
		r.Lo = -1
	}
	return r
}

// Cos returns cos x.
func Cos(x Interval) Interval {
	if !x.IsFinite() || x.Hi-x.Lo >= 6.28 {
		return Interval{-1, 1}
	}
	if x.Lo == x.Hi {
		return cosPoint(x.Lo)
	}
	r := cosPoint(x.Lo).Hull(cosPoint(x.Hi))
	if mayHitPhase(x, 0) {
		r.Hi = 1
	}
	if mayHitPhase(x, 0.5) {
		r.Lo = -1
	}
	return r
}

// Sinh returns sinh x (increasing).
func Sinh(x Interval) Interval {
	return Interval{widenDown(math.Sinh(x.Lo)), widenUp(math.Sinh(x.Hi))}
}

// Cosh returns cosh x (even, least value 1 at 0).
func Cosh(x Interval) Interval {
	a := x.Abs()
	return Interval{math.Max(1, widenDown(math.Cosh(a.Lo))), widenUp(math.Cosh(a.Hi))}
}

// Tanh returns tanh x (increasing).
func Tanh(x Interval) Interval {
	return Interval{math.Max(-1, widenDown(math.Tanh(x.Lo))), math.Min(1, widenUp(math.Tanh(x.Hi)))}
}

// Sech returns sech x = 1/cosh x.
func Sech(x Interval) Interval {
	c := Cosh(x)
	return Interval{math.Max(0, divDown(1, c.Hi)), math.Min(1, divUp(1, c.Lo))}
}

// Erfc returns the complementary error function (decreasing).
func Erfc(x Interval) Interval {
	return Interval{math.Max(0, widenDown(math.Erfc(x.Hi))), math.Min(2, widenUp(math.Erfc(x.Lo)))}
}

// Erf returns the error function (increasing).
func Erf(x Interval) Interval {
	return Interval{math.Max(-1, widenDown(math.Erf(x.Lo))), math.Min(1, widenUp(math.Erf(x.Hi)))}
}
