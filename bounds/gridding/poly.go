package gridding

import "math"

// kernelPoly evaluates the W values φ(y0 + j), j = 0..W-1, that one point
// spreads to, from y0 = -W/2 + t, t in [0, 1). Piece j of the kernel,
// y in [-W/2 + j, -W/2 + j + 1), is a polynomial of degree p in
// z = 2t - 1, fitted by interpolation at the p + 1 Chebyshev points of the
// first kind (Trefethen, Approximation Theory and Approximation Practice,
// SIAM 2013, ch. 3 and 8; from memory) and stored by monomial coefficients
// so that all W values come from one Horner loop. The degree is the least
// that meets the target error, measured against the float64 kernel on a
// grid of points per piece.
type kernelPoly struct {
	w, p int
	// coef[i*w + j] is the coefficient of z^(p-i) for piece j (Horner
	// order).
	coef []float64
	// maxErr is the largest error measured, relative to max φ.
	maxErr float64
}

// maxPolyDegree limits the degree of the pieces.
const maxPolyDegree = 30

// polyCheckPoints is the number of points per piece at which the fit is
// checked.
const polyCheckPoints = 64

// newKernelPoly fits the kernel with the least degree whose measured error
// relative to max φ is at most target, or, when the error stops falling
// (at a few units in the last place of the kernel's own float64 values),
// the most accurate degree found.
func newKernelPoly(k Kernel, target float64) *kernelPoly {
	var best *kernelPoly
	stalled := 0
	for p := 3; p <= maxPolyDegree && stalled < 3; p++ {
		kp := fitKernelPoly(k, p)
		if kp.maxErr <= target {
			return kp
		}
		if best == nil || kp.maxErr < 0.5*best.maxErr {
			stalled = 0
		} else {
			stalled++
		}
		if best == nil || kp.maxErr < best.maxErr {
			best = kp
		}
	}
	return best
}

func fitKernelPoly(k Kernel, p int) *kernelPoly {
	w := k.Width
	kp := &kernelPoly{w: w, p: p, coef: make([]float64, (p+1)*w)}
	n := p + 1
	nodes := make([]float64, n)
	for i := range nodes {
		nodes[i] = math.Cos(math.Pi * (float64(i) + 0.5) / float64(n))
	}
	vals := make([]float64, n)
	cheb := make([]float64, n)
	mono := make([]float64, n)
	// T_i as monomial coefficients, built by T_{i+1} = 2zT_i - T_{i-1}.
	tPrev := make([]float64, n)
	tCur := make([]float64, n)
	tNext := make([]float64, n)
	peak := k.value(0)
	for j := 0; j < w; j++ {
		base := -float64(w)/2 + float64(j)
		for i, z := range nodes {
			vals[i] = k.value(base + (z+1)/2)
		}
		// Chebyshev coefficients of the interpolant (discrete orthogonality
		// at the first-kind points).
		for i := range cheb {
			s := 0.0
			for m := range nodes {
				s += vals[m] * math.Cos(math.Pi*float64(i)*(float64(m)+0.5)/float64(n))
			}
			cheb[i] = 2 * s / float64(n)
		}
		cheb[0] /= 2
		clear(mono)
		clear(tPrev)
		clear(tCur)
		tPrev[0] = 1 // T_0
		mono[0] += cheb[0]
		if n > 1 {
			tCur[1] = 1 // T_1
			mono[1] += cheb[1]
		}
		for i := 2; i < n; i++ {
			clear(tNext)
			for m := 0; m < n; m++ {
				if m > 0 {
					tNext[m] += 2 * tCur[m-1]
				}
				tNext[m] -= tPrev[m]
			}
			for m := range mono {
				mono[m] += cheb[i] * tNext[m]
			}
			tPrev, tCur, tNext = tCur, tNext, tPrev
		}
		for i := 0; i <= p; i++ {
			kp.coef[i*w+j] = mono[p-i]
		}
	}
	// Measure the error.
	out := make([]float64, w)
	for i := 0; i <= polyCheckPoints; i++ {
		t := float64(i) / polyCheckPoints
		if i == polyCheckPoints {
			t = math.Nextafter(1, 0)
		}
		kp.eval(t, out)
		for j := 0; j < w; j++ {
			e := math.Abs(out[j]-k.value(-float64(w)/2+float64(j)+t)) / peak
			kp.maxErr = math.Max(kp.maxErr, e)
		}
	}
	return kp
}

// eval writes φ(-W/2 + t + j) for j = 0..W-1 into out (len ≥ W).
func (kp *kernelPoly) eval(t float64, out []float64) {
	z := 2*t - 1
	w := kp.w
	out = out[:w]
	copy(out, kp.coef[:w])
	for i := 1; i <= kp.p; i++ {
		c := kp.coef[i*w : (i+1)*w]
		for j := range out {
			out[j] = out[j]*z + c[j]
		}
	}
}
