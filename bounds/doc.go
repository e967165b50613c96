// Package bounds is foldbound's engine: exact alias sums, certified error
// bounds and grid plans for sampled sums — the trapezoidal rule, sampled
// Fourier transforms and lattice sums — by the Poisson summation formula.
//
// Every number this package calls a bound or an enclosure is computed in
// outward-rounded interval arithmetic (Interval, Complex) and contains the
// exact value. The package knows nothing of the wire: no gRPC, no logging,
// no protobuf.
//
// # Conventions
//
// Transforms are non-unitary and angular, per axis:
//
//	F(ξ) = ∫ f(x) e^{-iξx} dx.
//
// Convention converts to the unitary and ordinary-frequency conventions.
// A one-dimensional grid has step h > 0, shift s and count N (Grid); its
// samples are x_k = s + hk. The sampled sum at frequency ξ is
//
//	T(h, s, ξ) = h Σ_k f(s + hk) e^{-iξ(s+hk)},
//
// the trapezoidal rule for ∫ f when ξ = 0. The Poisson summation formula
//
//	h Σ_{k∈Z} f(s+hk) e^{-iξ(s+hk)} = Σ_{l∈Z} F(ξ + 2πl/h) e^{i2πls/h}
//
// (Stein & Weiss, Introduction to Fourier Analysis on Euclidean Spaces,
// 1971, Ch. VII, from memory) makes the error of the infinite grid exactly
// the alias sum Σ_{l≠0}; a finite grid adds the truncation, the sum over the
// samples it omits. Symbols: h step, s shift, N count, ξ angular frequency,
// P = 2π/h the alias period, Ξ a band's half-width.
//
// # What it computes
//
//   - AliasSum: T, F(ξ) and T - F = alias + truncation for a Family, as
//     enclosures, summing whichever side of the Poisson formula is cheaper
//     and keeps relative accuracy (Method says which).
//   - FamilyBudget and EnvelopeBudget: itemised certified error budgets
//     (aliasing, truncation, rounding) for a given grid, at a frequency or
//     as a sup over a band, for the grid's shift or for every shift.
//   - PeriodicRule and StripBound: the N-point rule over a period and the
//     aliasing of Fourier coefficients.
//   - PlanGrid and PlanGridND: the cheapest grid (step, count, shift per
//     axis) whose certified budget meets a tolerance, for every shift by
//     default, under a cost model (CostModel: samples, FFT-friendly sizes,
//     per-sample and per-transform prices); PlanBatch plans many at once.
//   - AliasSumND and FamilyBudgetND: alias sums and budgets on rectangular
//     grids in n ≤ MaxDim dimensions for separable families (Separable,
//     RadialGaussian), composed axis by axis.
//   - LatticeAliasSum: alias sums on a general lattice W·Z^n (Lattice,
//     with the square, hexagonal, body- and face-centred cubic and D4
//     lattices built in), summed over shells of the dual lattice with a
//     certified lattice-point counting bound for the rest;
//     LatticeAliasBound, PlanLattice and CompareLattices size and rank
//     lattices for an isotropic spectral envelope.
//
// The subpackages apply the engine to two trades: scan plans the sampling
// of tomographic scans and checks them by reconstruction; gridding plans
// the kernels of non-uniform FFTs.
//
// Functions are described either exactly, as a Family with a closed-form
// transform (Gaussian, two-sided exponential, Lorentzian, sech, sech²,
// B-splines of orders 1 to 8, Fejér, wave packet, Kaiser-Bessel, and their
// shifts, dilations, modulations, amplitudes and sums), or only by their decay, as
// an Envelope: exponential, Gaussian, algebraic or compact, on the spatial
// side (decay of |f|) and the spectral side (decay of |F|; compact is a band
// limit). Tails of infinite sums are bounded in closed form from the
// envelopes (see EnvelopeTerm and math.md, "Envelopes and their bounds").
// The B-splines also bound whole rays of alias copies near the zeros of
// their transform in closed form (BSplineFamily.aliasRay), so that at the
// steps of their partition of unity (h = 1, 1/2, …) the certified aliasing
// is of the order of rounding and a plan needs only the samples that cover
// the support.
//
// # Accuracy
//
// Sums, products, quotients and square roots round exactly as true
// directed rounding would, using exact error terms (TwoSum; a fused
// multiply-add for products, quotients and roots), down to 2⁻⁹⁶⁸; below
// that they step one ulp outward. Long sums keep the rounding errors of
// their additions as exact error terms and round once at the end.
//
// The other elementary functions rest on Go's math package, whose results
// we assume are within 4 ulps of the exact value (measured on amd64
// against math/big on tens of thousands of inputs: at most 2.44 ulps, for
// Sinh, and 2.36 for Erfc). Each result is widened by 2⁻⁴⁹ relative (at
// least 7 ulps) plus 2⁻¹⁰⁶⁰ absolute, which also covers underflow. For Sin,
// Cos and Sincos we add |x|·2⁻⁸⁰ for |x| < 2²⁹ (Cody–Waite argument
// reduction; bound derived from Go's code, |x|·2⁻⁹⁹) and 2⁻⁵⁰ above
// (Payne–Hanek; measured 2⁻⁵³). Known defects are avoided: the early
// overflow of math.Exp, Sinh, Cosh and Expm1 near ln MaxFloat64, and
// math.Log of subnormal numbers (Go issue 56600). math.Pow is never used:
// powers are IntPow, Sqrt, or exp(p·log x) in interval arithmetic.
//
// Enclosures of single evaluations are about 4e-15 wide; sampled sums of
// thousands of terms stay near 1e-14 relative.
//
// # Errors
//
// Entry points never panic on their inputs and never return NaN. Errors
// wrap one of ErrInvalid (a parameter outside its domain), ErrWorkLimit
// (more terms than Settings.MaxTerms), ErrInfeasible (a request no grid can
// meet in double precision) or ErrNotFinite (overflow), usually through a
// *ParamError that names the parameter by its path ("grid.step",
// "sum[2].shift.by"); or the context's error when it is cancelled or its
// deadline passes, which long loops check.
package bounds
