package gridding

import "math"

// unitRoundoff is u = 2⁻⁵³, the unit roundoff of float64.
const unitRoundoff = 0x1p-53

// RoundingEstimate estimates the floating-point error of the gridded
// transform of a setup in d dimensions, relative to Σ|c_j| (type 1) or
// Σ|f_k| (type 2). It is a first-order estimate, not a bound:
//
//	ρ = u·[dπN + κ^d·(d(2W + 20) + 5·log2(M^d) + 4)],   κ = φ̂(0)/φ̂(θ_max),
//
// where dπN is the effect of rounding a position to grid units
// (|δu| ≤ uM moves the point by 2πu, which changes e^{-ikx} by up to
// |k|·2πu ≤ πNu per axis; the exact sum is as sensitive to its input),
// 2W + 20 covers the evaluation of the kernel's W values per axis by
// polynomials of degree up to 2W, 5·log2(M^d) the FFT's stages, and 4 the
// deapodization; each grid value and FFT output is accumulated from terms
// whose moduli sum to at most φ̂(0)^d·Σ|c_j|, and division by φ̂(θ)^d
// scales the error by at most κ^d (first-order analysis of sums and of the
// FFT as in Higham, Accuracy and Stability of Numerical Algorithms, 2nd
// ed., 2002, §4.2 and §24.1, from memory). The tests compare it with
// measured errors.
func RoundingEstimate(s Setup, dim int) float64 {
	k := s.Kernel
	kappa := k.transform(0) / k.transform(s.thetaMax())
	d := float64(dim)
	md := d * math.Log2(float64(s.Grid))
	return unitRoundoff * (d*math.Pi*float64(s.Modes) +
		math.Pow(kappa, d)*(d*(2*float64(k.Width)+20)+5*md+4))
}
