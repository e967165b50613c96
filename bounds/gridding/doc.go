// Package gridding plans the gridding kernels of non-uniform FFTs — the
// oversampling ratio σ, the kernel width W in grid cells and the kernel's
// shape parameter β — from a certified bound on the error the kernel
// causes, and checks the plans by running the transform they are for.
//
// Bound computes the certified kernel error of one configuration (Setup),
// Plan finds for each candidate σ the smallest W that meets a tolerance
// with its best β and recommends the cheapest by a cost model, and
// Transform (Type1, Type2 and Type1In2D), Direct1, Direct2 and Verify form
// the verification path: the gridded transform (spreading, gonum's FFT,
// deapodization) against the non-uniform DFT summed directly.
//
// # Conventions
//
// Type 1 and type 2 transforms with N modes per axis, k = -⌊N/2⌋, …,
// ⌈N/2⌉-1 (so |k| ≤ N/2), and points x_j in [-π, π]:
//
//	type 1   f_k = Σ_j c_j e^{-ik·x_j}
//	type 2   c_j = Σ_k f_k e^{ik·x_j}
//
// The oversampled grid has M > N points per axis, spacing h = 2π/M; a
// point sits at u = x/h in grid units. The kernel φ lives on the unit grid
// (Kernel): W grid points m with m - u in [-W/2, W/2) receive φ(m - u).
// Transforms are F(ξ) = ∫ f(x) e^{-iξx} dx as in package bounds; the mode k
// meets the kernel's transform at θ_k = kh = 2πk/M, |θ_k| ≤ θ_max =
// 2π⌊N/2⌋/M ≤ π/σ. Errors are relative to Σ_j|c_j| (type 1) or Σ_k|f_k|
// (type 2).
//
// # The gridded transform
//
// Type 1 spreads, transforms and divides:
//
//	g_m = Σ_j c_j φ(m - u_j)            (m taken modulo M)
//	G_k = Σ_{m<M} g_m e^{-2πikm/M}      (gonum dsp/fourier, CmplxFFT)
//	f̃_k = G_k / φ̂(θ_k)                 (deapodization)
//
// and type 2 runs the same steps backwards. The W values of φ per point
// come from piecewise Chebyshev interpolants (poly.go) whose degree is
// chosen so that their error is negligible against the tolerance.
//
// # The error statement
//
// Theorem. In exact arithmetic, for every input and every mode k,
//
//	|f̃_k - f_k| ≤ ε·Σ_j |c_j|     (type 1),     |c̃_j - c_j| ≤ ε·Σ_k |f_k|     (type 2),
//
// where ε is the sup over |θ| ≤ θ_max of the bounding function
// (A(θ) + T(θ))/φ̂(θ) of steps 2-4, an upper bound of the per-mode error
// ε(θ) of step 1. In d dimensions with a tensor-product kernel ε becomes
// (1 + ε)^d - 1 (step 6). Bound returns ε, certified; rounding is estimated
// separately (RoundingEstimate).
//
// Step 1, the exact error of each point. Since e^{-iθ_k m} has period M in
// m, the FFT of the periodic grid equals the sum over all grid points of
// the line, and θ_k u_j = k x_j, so
//
//	G_k = Σ_j c_j e^{-ikx_j} S(θ_k, u_j),   S(θ, u) = Σ_{m∈Z} φ_W(m - u) e^{-iθ(m-u)},
//
// φ_W the kernel with its window. Hence
//
//	f̃_k - f_k = Σ_j c_j e^{-ikx_j}·(S(θ_k, u_j) - φ̂(θ_k))/φ̂(θ_k),
//
// and by the triangle inequality |f̃_k - f_k| ≤ ε(θ_k)·Σ_j|c_j| with
//
//	ε(θ) = sup_u |S(θ, u) - φ̂(θ)| / φ̂(θ)    (φ̂(θ) > 0 on the band).
//
// The bound is sharp: one point at the worst position attains it (the
// tests sweep one point across a cell). For type 2, φ being real,
// c̃_j = Σ_k f_k e^{ikx_j}·conj(S(θ_k, u_j))/φ̂(θ_k), and the same argument
// gives |c̃_j - c_j| ≤ max_k ε(θ_k)·Σ_k|f_k|.
//
// Step 2, aliasing (Poisson summation, unit step; math.md). For the
// untruncated kernel, g(y) = φ(y - u)e^{-iθ(y-u)} has ĝ(ω) = e^{-iωu}φ̂(θ+ω),
// so
//
//	S(θ, u) = Σ_{l∈Z} φ̂(θ + 2πl) e^{-2πilu},   S - φ̂(θ) = Σ_{l≠0} φ̂(θ + 2πl) e^{-2πilu},
//
// and ε(θ) ≤ Σ_{l≠0} |φ̂(θ + 2πl)| / φ̂(θ). On the grid of spacing 2π/M,
// with ψ(x) = φ(x/h) and ψ̂(ξ) = hφ̂(hξ), this is the usual aliasing ratio
// Σ_{l≠0}|ψ̂(k + lM)|/|ψ̂(k)| of the gridding literature (Jackson et al.
// 1991; Beatty, Nishimura & Pauly 2005; Dutt & Rokhlin 1993; all from
// memory), with two corrections the kernels here need.
//
// Step 3, the Kaiser-Bessel kernel. φ(y) = I0(β√(1-(2y/W)²)) jumps from
// I0(0) = 1 to 0 at |y| = W/2, so |φ̂(θ)| decays only like 1/θ and the sum
// of step 2 diverges. Split φ_W = b + q with b the box of height 1 on
// [-W/2, W/2) and q = φ - 1 there, 0 outside: q is continuous (q(±W/2) = 0)
// with |q̂(θ)| = O(θ⁻²), so step 2 applies to q. For b the sum over the W
// points y_j = -W/2 + t + j, t in [0, 1), is geometric:
//
//	Σ_j e^{-iθy_j} - b̂(θ) = sin(θW/2)·[e^{iθ(1/2-t)}/sin(θ/2) - 2/θ],   b̂(θ) = 2 sin(θW/2)/θ,
//
// whose modulus is largest at t = 0 (φ = θ(1/2 - t) ranges over
// (-θ/2, θ/2], and |e^{iφ}/sin(θ/2) - 2/θ| grows with |φ|), where it is
//
//	T(θ) = |sin(θW/2)|·√(1 + (2/θ - cot(θ/2))²)      (derived here)
//
// So ε(θ) ≤ (T(θ) + Σ_{l≠0}|q̂(θ + 2πl)|)/φ̂(θ), with q̂ = φ̂ - W sin(u)/u,
// u = Wθ/2. The copies are summed in interval arithmetic until
// u ≥ max(4β, β²) and the rest is bounded in closed form (kaiser.go,
// kaiserTail: first-order term |cos(Wθ/2)|·β²/(2u²) per copy, summed by
// the Hermite-Hadamard inequality); the tests compare the result with 800
// copies summed in math/big (within 2%).
//
// Step 4, the truncated Gaussian. φ(y) = exp(-y²/(2s²)), s = W/√(8β), cut
// to the W points of the window. S is the untruncated sum of step 2 minus
// the omitted points, which sit at W/2 + t + j and W/2 + 1 - t + j, j ≥ 0.
// Beyond the inflection point (W/2 ≥ s, i.e. β ≥ 1/2) each term is convex
// in t, so their sum is largest at t = 0:
//
//	ε(θ) ≤ (Σ_{l≠0} φ̂(θ + 2πl) + φ(W/2) + 2Σ_{j≥1} φ(W/2 + j)) / φ̂(θ)
//
// with φ̂(θ) = s√(2π)e^{-s²θ²/2} (deapodization by the untruncated
// transform). The tests find the bound attained to within 1% at t = 0.
//
// Step 5, the sup over the band. ε = sup over 0 ≤ θ ≤ θ_max (the bounding
// functions are even) by branch and bound: the band is cut into intervals,
// each bounded in outward-rounded interval arithmetic (bounds.Interval,
// bounds.GaussianFamily, bounds.KaiserBesselFamily), and the interval with
// the largest bound is bisected until that bound is within 1% of the value
// at a single frequency (ErrorBound.Attained), or 256 intervals are used.
// Every unevaluated tail is bounded and included, so ε is certified.
//
// Step 6, d dimensions. With φ(y_1)…φ(y_d) on an M^d grid, S factorises,
// S_d = Π_i S(θ_i, u_i), and φ̂_d = Π_i φ̂(θ_i), so with
// S(θ_i, u_i)/φ̂(θ_i) = 1 + e_i, |e_i| ≤ ε:
//
//	|S_d/φ̂_d - 1| = |Π(1 + e_i) - 1| ≤ Π(1 + |e_i|) - 1 ≤ (1 + ε)^d - 1.
//
// Step 7, shapes and rates (derived here). For the Gaussian at the band
// edge θ = π/σ the aliasing ratio is about e^{-2πs²(π-θ)} and the
// truncation ratio e^{-β + s²θ²/2}/(s√(2π)); with s² = W²/(8β) they are
// equal when
//
//	β = π(W/2)(1 - 1/(2σ)),   error ≈ e^{-πW(σ-1)/(2σ-1)},
//
// which is exactly the choice τ = πM_sp/(M²R(R - 1/2)) of Greengard & Lee
// (2004, from memory) with M_sp = W/2, R = σ. For Kaiser-Bessel the jump
// term is about e^{-√(β² - (πW/(2σ))²)}, while the nearest alias copy, at
// u = πW(1 - 1/(2σ)), leaves the main lobe (u > β) only for β below that
// value; placing the first zero of its sinc, √(u² - β²) = π, at the band
// edge gives β = π√(W²(1 - 1/(2σ))² - 1), close to Beatty et al.'s
// β = π√(W²/σ²·(σ - 1/2)² - 0.8) (from memory), and
//
//	error ≈ e^{-πW√(1-1/σ)}.
//
// Plan optimises β numerically on the certified bounding function; the
// optima land within 3% of Beatty's formula (Kaiser-Bessel) and within 5%
// of Greengard & Lee's (Gaussian) for σ = 1.25 to 2 (TestPlanAnchors), and
// the measured rates per cell of width are within 3% of those above.
//
// # Rounding
//
// Bound is for exact arithmetic. RoundingEstimate adds a first-order
// estimate (not a bound) of the floating-point error, dominated by the
// rounding of positions to grid units (πN·2⁻⁵³ per axis; the exact sum is
// as sensitive to its input) and by the deapodization factor
// κ = φ̂(0)/φ̂(θ_max), which grows with β and limits how far a tolerance
// can be pushed at small σ: the Gaussian at σ = 1.25 stops near 4·10⁻⁸ for
// N = 256 whatever W. Plans meet the tolerance with
// Bound.Total + RoundingEstimate.
//
// # Plans
//
// For each candidate σ (default 1.25, 1.5, 2) the grid is M = ⌈σN⌉, rounded
// up to 2^a·3^b·5^c, and the smallest W that meets the tolerance is found
// from the rate of step 7, with β optimised for each W on a float64
// estimate of the bounding function and the result certified by Bound.
// Options are ranked by the cost model
//
//	cost = Spread·P·W^d + FFT·M^d·log2(M^d)
//
// with P points (default N^d) and weights in nanoseconds measured on this
// package (DefaultCostModel). A tolerance nothing meets is reported with
// bounds.ErrInfeasible and the smallest total found.
//
// # Measured
//
// Acceptance (TestGriddedAgainstDirect, N = 256, 4096 points, 20 random
// sets per option, tolerances 10⁻³ to 10⁻¹², both kernels, every σ that
// meets the tolerance, 49 options in all): the observed error never
// exceeded the planned total. Random points with random strengths reach
// only 0.005-0.03 of it (the errors of 4096 points add like a random
// walk); one point swept across a cell, for which the bound is sharp,
// reaches 0.46-0.83 of it for Kaiser-Bessel and 0.6-0.99 for the Gaussian
// (0.23 at 10⁻¹², where the rounding estimate is most of the total).
// Against exact errors computed in math/big
// (TestBoundingFunctionCoversExactError) the bounding function is attained
// to within 1% for the Gaussian and reached to 0.55-0.88 for
// Kaiser-Bessel, whose jump and aliasing parts do not peak at the same
// position. In two dimensions (TestType1In2DAgainstDirect) one point
// reaches 0.46-0.92 of (1 + ε)² - 1.
//
// Cost, in CPU time of one thread (getrusage; amd64, a shared machine
// under load, so wall-clock benchmark figures run higher): the gridded
// type-1 transform of 4096 points to 256 modes (M = 512) takes 0.7-1.0 ms
// at full precision, the direct sum 40 ms (BenchmarkType1); a plan for 256
// modes takes 25-40 ms for Kaiser-Bessel, whose bounds sum many alias
// copies in interval arithmetic, and 2-9 ms for the Gaussian
// (BenchmarkPlan); one certified bound 3 ms and 7 µs (BenchmarkBound).
// DefaultCostModel gives the cost per point and cell of spreading and per
// M·log2 M of the FFT.
//
// # Errors
//
// Entry points return *bounds.ParamError values naming the field
// ("kernel.oversampling[1]", "plan.tolerance", "setup.grid", "x[17]") and
// wrapping bounds.ErrInvalid, bounds.ErrWorkLimit or bounds.ErrInfeasible,
// or the context's error. They never panic on input and never return NaN.
//
// # Sources
//
//   - J. I. Jackson, C. H. Meyer, D. G. Nishimura, A. Macovski, Selection
//     of a convolution function for Fourier inversion using gridding, IEEE
//     Trans. Med. Imaging 10(3) (1991) 473-478 (from memory).
//   - P. J. Beatty, D. G. Nishimura, J. M. Pauly, Rapid gridding
//     reconstruction with a minimal oversampling ratio, IEEE Trans. Med.
//     Imaging 24(6) (2005) 799-808 (from memory; the β formula as recalled).
//   - A. Dutt, V. Rokhlin, Fast Fourier transforms for nonequispaced data,
//     SIAM J. Sci. Comput. 14 (1993) 1368-1393 (from memory).
//   - L. Greengard, J.-Y. Lee, Accelerating the nonuniform fast Fourier
//     transform, SIAM Review 46 (2004) 443-454 (from memory; the τ formula
//     as recalled).
//   - J. F. Kaiser, Nonrecursive digital filter design using the I0-sinh
//     window function, Proc. IEEE ISCAS (1974) (from memory).
//   - N. J. Higham, Accuracy and Stability of Numerical Algorithms, 2nd
//     ed., SIAM 2002, §4.2-4.3, §24.1 (from memory).
//   - L. N. Trefethen, Approximation Theory and Approximation Practice,
//     SIAM 2013, ch. 3 and 8 (Chebyshev interpolation; from memory).
//   - NIST Digital Library of Mathematical Functions, 4.19.6, 10.25.2,
//     25.6.2 (equation numbers from memory).
package gridding
