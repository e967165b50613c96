// Package scan plans the sampling of parallel-beam and fan-beam tomography
// scans from the radius of the object and its essential bandwidth, and
// checks the plans by reconstructing an analytic phantom.
//
// Plan turns an object radius ρ and a band limit Ω (or a resolution δ)
// into detector spacing, detector count, number of views and total number
// of line integrals, for the standard and the interlaced scheme. Phantom,
// ParallelSinogram, FanSinogram, ReconstructParallel, ReconstructFan and
// Phantom.Compare form the verification path: Gaussian blobs with
// closed-form projections, filtered backprojection, and the error of the
// reconstruction over the object disc. Verify runs that path for a plan:
// FitPhantom builds a phantom of the plan's radius and band limit, and it
// is reconstructed at the planned layout and at the same layout
// undersampled (see "Verification of a plan" below).
//
// # Caution
//
// Every plan carries the constant Caution: the conditions below are
// sampling mathematics of the Radon transform, not scan protocols. Dose,
// safety and clinical use are matters for licensed practice and local
// regulations.
//
// # Conventions
//
// The object f lives in the disc |x| ≤ ρ and is essentially band-limited:
// its transform f̂(ξ) = ∫ f(x) e^{-ix·ξ} dx (angular, non-unitary; package
// bounds, Angular) is negligible for |ξ| > Ω. Ω is in radians per unit of
// length. A resolution δ is read as
//
//	Ω = π/δ          (the Nyquist relation of a spacing δ; common practice, no source)
//
// The Radon transform is g(φ, s) = ∫_{x·θ = s} f, θ = (cos φ, sin φ); it is
// 2π-periodic in φ and g(φ+π, s) = g(φ, −s). A fan-beam source sits at
// a = R·(cos β, sin β), R > ρ; its ray at angle α from the central ray
// (anticlockwise) is the line
//
//	φ = β + α − π/2,   s = R sin α      (fan-to-parallel relations)
//
// so the ray spacing at the rotation axis is Δs = R·Δα.
//
// # Derivation of the sampling conditions
//
// Step 1, the two bandwidths of g. By the projection-slice theorem
//
//	ĝ(φ, σ) = ∫ g(φ, s) e^{−iσs} ds = f̂(σθ)      (Natterer 1999 §2; Natterer 1986 Ch. II, from memory)
//
// g has the band limit Ω in s. In φ, the Jacobi–Anger expansion
// e^{−it cos ϑ} = Σ_k (−i)^k J_k(t) e^{ikϑ} (DLMF §10.12, from memory)
// gives the Fourier coefficients, with x = |x|(cos ψ, sin ψ),
//
//	ĝ_k(σ) = (1/2π) ∫_0^{2π} ĝ(φ, σ) e^{−ikφ} dφ = (−i)^k ∫ f(x) J_k(σ|x|) e^{−ikψ} dx,
//
// and J_k(t) is exponentially small for |k| > t (Debye's expansions, DLMF
// §10.19(ii), from memory). With |x| ≤ ρ the essential support of ĝ_k(σ)
// is the bowtie
//
//	K(ρ, Ω) = {(k, σ) : |σ| ≤ Ω, |k| ≤ ρ|σ|}.
//
// Step 2, Poisson summation. Samples of g on a lattice L = W·Z² in the
// (φ, s) plane see the spectrum Σ_{m ∈ L*} ĝ(· − m), L* = 2π W^{−T} Z²
// (math.md, "Lattices in n dimensions"). When the translates K + m, m ≠ 0,
// do not meet K, filtering to K recovers g, up to the part of the spectrum
// outside K. Scans that cover the circle evenly have (2π, 0) ∈ L, so k runs
// over the integers.
//
// Step 3, when two bowties miss each other. For K = K(a, Ω) and a translate
// by (k0, σ0), comparing the upper and lower cones of both (lattice.go):
//
//	K ∩ (K + (k0, σ0)) has no interior point ⇔ |σ0| ≥ 2Ω or |k0| ≥ a·max(|σ0|, 2Ω − |σ0|)
//
// (upper cone against the shifted lower cone: they meet iff |k0| < a|σ0|;
// two upper or two lower cones meet iff |σ0| < Ω and |k0| < a(2Ω − |σ0|)).
// The tests check this against a brute-force search, and check every
// lattice below against it point by point.
//
// Step 4, standard parallel scheme: p directions over 180°, rays s = lΔs.
// By g(φ+π, s) = g(φ, −s) the data fill the full-circle lattice
// W = diag(π/p, Δs), so L* = {(2p·m1, 2π·m2/Δs)}. The points (2p, 0) and
// (0, 2π/Δs) give 2p ≥ 2ρΩ and 2π/Δs ≥ 2Ω; all other points are then clear:
//
//	Δs ≤ π/Ω,   p ≥ ρΩ view directions over 180°
//
// These are the conditions of Natterer 1986 Ch. III (from memory) and
// Natterer 1999 §2 (Nyquist condition in s, angular bandwidth ρΩ; text
// re-read). Plan takes q = ⌈ρΩ/π⌉, Δs = ρ/q, the 2q+1 rays l = −q..q, and
// p = ⌈ρΩ⌉; about 2ρ²Ω²/π samples, and p/(2q+1) → π/2.
//
// Step 5, interlaced parallel scheme. For even p, Kruse (1989, as quoted
// by Natterer 1999 §2) keeps only the rays (j, l) of the standard scheme
// with j + l even: spacing Δs = 2ρ/q on each view, shifted by Δs/2 on odd
// views. For even p the mirror images fill the full-circle lattice with
// generators (π/p, Δs/2) and (0, Δs); its dual is
// L* = {((2m1 − m2)·p, 2π·m2/Δs)}. The points with m2 = 0 give p ≥ ρΩ,
// m2 = ±2 give Δs ≤ 2π/Ω, and m2 = ±1, at σ0 = 2π/Δs ∈ [Ω, 2Ω], give
// p ≥ ρ·2π/Δs:
//
//	Δs ≤ 2π/Ω,   p ≥ K = 2πρ/Δs (≥ ρΩ),   p even
//
// about half the samples of the standard scheme. This lattice condition is
// not enough for a reconstruction: the translate at (p, 2π/Δs) carries the
// apex of a copy, where the low frequencies and the bulk of the energy of f
// sit, to the corner (ρΩ', Ω') of K, Ω' = 2π/Δs, inside the pass band of
// the ramp filter. In the disc such a component acts through J_p(σ|x|),
// σ ≈ Ω', |x| ≤ ρ, of size about e^{−p(α − tanh α)} where ρΩ' = p·sech α
// (Debye, DLMF §10.19(ii), from memory). Asking for ε = 10⁻³, i.e.
// pα³/3 ≥ ln(1/ε), and using 1/sech α ≈ 1 + α²/2:
//
//	p ≥ K + c·K^{1/3},   c = ½(3 ln(1/ε))^{2/3} ≈ 3.77      (derived here)
//
// In the standard scheme the apices of the copies land at (2p, 0), where
// J_2p(σ|x|) with σ ≈ 0 is negligible, and at |σ| = 2Ω', outside the
// filter, so no margin is needed. Both facts are confirmed numerically: the
// interlaced reconstruction fails at p = K (relative error of order 1) and
// succeeds from about K + 3K^{1/3} on, for K = 75, 151 and 299 alike; the
// standard one needs no margin.
//
// Step 6, fan beam. The relations φ = β + α − π/2, s = R sin α have the
// Jacobian ∂(φ, s)/∂(β, α) = [[1, 1], [0, R cos α]]. Near the ray at s the
// bowtie narrows to |k| ≤ |σ|·√(ρ² − s²) (a point x on that ray has
// |x·θ⊥| ≤ √(ρ² − s²)). A component (k, σ) of g oscillates in α with
// frequency k + σR cos α and in β with frequency k.
//
// (a) Plain fan-beam filtered backprojection, which is what Plan plans for,
// filters each fan on its own: the trapezoidal rule in α needs the Nyquist
// condition for the α-bandwidth Ω(R cos α + √(ρ² − R² sin²α)) ≤ Ω(R + ρ).
// The backprojection sums, for a point x, the rays through x; as the source
// moves, their direction turns at dφ/dβ = R cos α'/|x − a| ≤ R/(R − ρ), which
// stretches the angular bandwidth 2ρΩ of the parallel case (over 360°):
//
//	Δα ≤ π/(Ω(R+ρ))   (RΔα ≤ (π/Ω)·R/(R+ρ) at the axis),
//	p ≥ 2ρΩ·R/(R − ρ) source positions over 360°      (derived here)
//
// As R → ∞ these tend to the parallel conditions (Δs = π/Ω; 2ρΩ views over
// 360° are ρΩ over 180°). Plan takes q = ⌈αmax·Ω(R+ρ)/π⌉, αmax = arcsin(ρ/R),
// Δα = αmax/q with 2q+1 rays, and p = ⌈2ρΩR/(R−ρ)⌉. For a short scan the
// sources cover 180° plus the fan angle 2αmax (Parker 1982, from memory) at
// the same step; its redundancy weighting is not checked here.
//
// (b) Information level, not planned. Mapping the rectangular (β, α)
// lattice by the Jacobian, its dual points near the central ray are
// (2B·m1, (m2·D − 2B·m1)/R), B = π/Δβ, D = 2π/Δα. Step 3 gives D ≥ 2ΩR
// from (0, D/R), and B ≥ ΩρR/(R+ρ) from (2B, −2B/R) and (2B, (D − 2B)/R):
//
//	Δα ≤ π/(ΩR),   p ≥ 2ρΩ·R/(R + ρ) over 360°      (derived here)
//
// so the data determine f with fewer sources than parallel beams need. Only
// a reconstruction that interpolates across sources can use this; plain
// filtered backprojection at that source count was measured 56× (R = 2ρ)
// and 3× (R = 4ρ) worse than at the planned count. A finer Δα here needs
// more sources (the pair is a lattice optimum). With the detector grid
// shifted by Δα/2 on alternate sources (interlaced fan) the same analysis
// gives Δα ≤ 2π/(ΩR), p ≥ 4πρ/((R − ρ)Δα), p even, which saves samples
// against (b) only for R > 3ρ (ratio (R+ρ)/(2(R−ρ))). Plan does not offer
// an interlaced fan layout, since nothing here verifies it by
// reconstruction. Natterer (1993) gives fan-beam conditions; they were not
// re-read, so which of these forms they take is not claimed.
//
// # Where derivation and memory differ
//
// The design note recalled "Δs ≤ π/Ω, p ≥ Ωρ; interlaced schemes halve the
// count". The standard conditions are confirmed. For the interlaced scheme
// the derivation ties the views to the spacing (p ≥ 2πρ/Δs) and the
// reconstruction needs the Debye margin c·K^{1/3}; the count is about half
// only for large ρΩ (0.58 of the standard at ρΩ = 149, 0.504 at ρΩ = 10⁴).
// For the fan beam the planned conditions come from the derivation and the
// reconstruction tests, not from a source.
//
// # Counting and rounding
//
// Counts are ceilings of exact rationals (math/big) where the formula is
// rational in the inputs, such as ρΩ for a given Ω, and otherwise of the
// upper end of an outward-rounded enclosure (bounds.Interval); such an
// irrational value straddles an integer only within rounding distance.
// Every returned layout therefore satisfies its stated conditions exactly.
//
// # Reconstruction
//
// Filtered projections are the trapezoidal sums Q(t) = Δs Σ_l g_l h(t − s_l)
// with the band-limited kernel h of a Window (Ram-Lak, Shepp-Logan, Hann,
// closed forms in Window.kernel), computed for t on a grid Δs/M by a
// zero-padded real FFT (gonum dsp/fourier) and interpolated linearly in the
// backprojection. M = 1 is the classical algorithm; M = 4 removes most of
// the interpolation error at the Nyquist spacing; interlaced data need
// M = 64. A 256×256 image from 400 views takes about 55 ms (M = 1) or
// 110 ms (M = 4) of CPU time on one core (amd64, BenchmarkReconstructParallel).
//
// # Verification of a plan
//
// Verify reconstructs the phantom FitPhantom(ρ, Ω, 10⁻³) (the demo layout
// fitted so that every blob is below 10⁻³ of its peak outside the disc
// and its transform below 10⁻³ of its peak beyond Ω) at the planned
// standard layout, with half the views, with twice the detector spacing
// (angle), and at the interlaced layout when it is offered, with
// filtered projections oversampled 16-fold (64-fold for interlaced data).
// Measured at 128×128 pixels (TestVerifyPlans), the relative RMS error
// over the disc is, for parallel-beam plans with ρΩ from 40 to 300,
// 0.9e-4 to 3.4e-4 at the plan, 31× to 55× that with half the views,
// 180× to 250× with twice the spacing, and 0.9e-3 to 3.5e-3 at the
// interlaced plan; for fan-beam plans (R/ρ = 2 to 4, ρΩ = 50 to 200)
// 2.6e-5 to 5.6e-5 at the plan, 100× to 160× with half the sources and
// 210× to 275× with twice the detector angle. The planned error is the
// part of the phantom's spectrum beyond Ω aliased back: sampling twice as
// densely in both directions lowers it a further 4× to 10×, twice the
// views alone do not. The interlaced error does not fall with more
// views; it is the plain reconstruction of that lattice. Fan-beam
// verification covers full scans with R > √2·ρ only (no short-scan
// weighting).
//
// # Errors
//
// Entry points return *bounds.ParamError values naming the field
// ("scan.radius", "fbp.size", "phantom.blobs[2].sigma_u", ...) and wrapping
// bounds.ErrInvalid or bounds.ErrWorkLimit, or the context's error.
//
// # Sources
//
//   - F. Natterer, The Mathematics of Computerized Tomography, Teubner/Wiley
//     1986; SIAM Classics 2001, Ch. II–III (from memory).
//   - F. Natterer, Numerical methods in tomography, Acta Numerica 8 (1999)
//     107–141, §2 (preprint text re-read; its formulas are images and were
//     not read).
//   - Kruse (1989), as quoted by Natterer (1999) for the interlaced scheme.
//   - F. Natterer, Sampling in fan beam tomography, SIAM J. Appl. Math. 53
//     (1993) 358–380 (from memory, not re-read).
//   - A. C. Kak, M. Slaney, Principles of Computerized Tomographic Imaging,
//     IEEE Press 1988, Ch. 3 and 5 (from memory).
//   - D. L. Parker, Optimal short scan convolution reconstruction for fan
//     beam CT, Med. Phys. 9 (1982) 254–257 (from memory).
//   - NIST Digital Library of Mathematical Functions, §10.12, §10.19
//     (section numbers from memory).
package scan
