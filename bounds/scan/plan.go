package scan

import (
	"fmt"
	"math"
	"math/big"

	"foldbound/bounds"
)

// Caution travels with every scan plan. Plans are sampling mathematics only.
const Caution = "These are sampling conditions from the mathematics of the Radon " +
	"transform (object radius and essential band limit), not a scan protocol. " +
	"Radiation dose, safety and clinical use are matters for licensed practice " +
	"and local regulations."

// MaxSamples is the largest total number of line integrals a plan may ask
// for; larger plans fail with bounds.ErrWorkLimit.
const MaxSamples = 1e9

// Geometry names the ray geometry of a scan.
type Geometry int

const (
	// ParallelBeam measures parallel line bundles, one bundle per view
	// direction; views cover 180°.
	ParallelBeam Geometry = iota
	// FanBeam measures fans of rays from a point source moving on a circle
	// of radius R around the object; equiangular detectors.
	FanBeam
)

func (g Geometry) String() string {
	switch g {
	case ParallelBeam:
		return "parallel-beam"
	case FanBeam:
		return "fan-beam"
	}
	return fmt.Sprintf("Geometry(%d)", int(g))
}

// Scheme names the sampling lattice of a scan.
type Scheme int

const (
	// Standard samples every view on the same detector grid.
	Standard Scheme = iota
	// Interlaced doubles the detector spacing and shifts the detector grid
	// by half a spacing from one view to the next.
	Interlaced
)

func (s Scheme) String() string {
	switch s {
	case Standard:
		return "standard"
	case Interlaced:
		return "interlaced"
	}
	return fmt.Sprintf("Scheme(%d)", int(s))
}

// Request describes the object to be scanned. Lengths are in any one unit
// (say mm); the bandwidth is in radians per that unit.
type Request struct {
	Geometry Geometry

	// Radius ρ > 0 of a disc, centred on the rotation axis, outside which
	// the object is zero.
	Radius float64

	// Bandwidth Ω > 0 is the essential band limit: the 2-D transform
	// f̂(ξ) = ∫ f(x) e^{-ix·ξ} dx is negligible for |ξ| > Ω (angular
	// frequency, rad per unit length). Leave it 0 to give Resolution.
	Bandwidth float64

	// Resolution δ > 0 is used when Bandwidth is 0; the plan then takes
	// Ω = π/δ (see ResolutionRule).
	Resolution float64

	// SourceRadius R > ρ is the distance from the rotation axis to the
	// source (fan beam only).
	SourceRadius float64

	// ShortScan asks for source positions over 180° plus the fan angle
	// instead of 360° (fan beam only).
	ShortScan bool
}

// ResolutionRule states how a resolution δ becomes a bandwidth.
const ResolutionRule = "Ω = π/δ: the Nyquist relation of a sample spacing δ " +
	"(common practice, no source)"

// Layout is one sampling scheme meeting the sampling conditions.
type Layout struct {
	Scheme Scheme

	// Offered is false when the scheme is not recommended for this
	// geometry; Note says why and the other fields are zero.
	Offered bool

	// DetectorSpacing is the spacing Δs of parallel rays (parallel beam),
	// or R·Δα, the spacing of the rays at the rotation axis (fan beam), in
	// length units.
	DetectorSpacing float64

	// DetectorAngle is the angle Δα between neighbouring rays of a fan
	// (fan beam only), in radians.
	DetectorAngle float64

	// Detectors is the number of detector readings per view. Where the
	// interlaced scheme alternates between two grids it is the larger of
	// the two counts.
	Detectors int

	// Views is the number of view directions (parallel beam) or source
	// positions (fan beam) over Arc, spaced ViewStep apart.
	Views    int
	Arc      float64 // angular range of the views, radians
	ViewStep float64 // angle between successive views, radians

	// Samples is the total number of line integrals measured.
	Samples int64

	// Condition states the sampling conditions the layout satisfies;
	// Source says where they come from and how they were checked.
	Condition string
	Source    string
	Note      string
}

// Result is a scan plan: the standard and the interlaced layout for one
// object and geometry.
type Result struct {
	Geometry     Geometry
	Radius       float64 // ρ
	Bandwidth    float64 // Ω used
	BandwidthBy  string  // "given", or ResolutionRule
	SourceRadius float64 // R (fan beam)
	FanAngle     float64 // full fan angle 2·arcsin(ρ/R) (fan beam), radians
	ShortScan    bool

	Standard   Layout
	Interlaced Layout

	// Caution is always the package constant Caution.
	Caution string
}

// Plan returns the standard and the interlaced sampling layouts for a
// parallel-beam or fan-beam scan of an object of radius ρ and essential
// bandwidth Ω. The conditions, their derivation and sources are given in
// the package documentation:
//
//	parallel, standard:    Δs ≤ π/Ω,  p ≥ ρΩ views over 180°
//	parallel, interlaced:  Δs ≤ 2π/Ω, p ≥ K + 3.77·K^{1/3}, K = 2πρ/Δs, p even
//	fan, standard:         Δα ≤ π/(Ω(R+ρ)), p ≥ 2ρΩ·R/(R−ρ) sources over 360°
//	fan, interlaced:       not offered
//
// Counts are exact ceilings (package doc, "Counting and rounding"), so
// every returned layout satisfies its conditions. Errors are
// *bounds.ParamError wrapping bounds.ErrInvalid (a bad field, named
// "scan.radius", "scan.bandwidth", ...) or bounds.ErrWorkLimit (more than
// MaxSamples line integrals).
func Plan(req Request) (Result, error) {
	omega, by, err := req.validate()
	if err != nil {
		return Result{}, err
	}
	b := band{iv: omega}
	if req.Bandwidth != 0 {
		b.w = rat(req.Bandwidth)
	} else {
		b.wPi = new(big.Rat).Inv(rat(req.Resolution))
	}
	res := Result{
		Geometry:    req.Geometry,
		Radius:      req.Radius,
		Bandwidth:   omega.Mid(),
		BandwidthBy: by,
		ShortScan:   req.ShortScan,
		Caution:     Caution,
	}
	switch req.Geometry {
	case ParallelBeam:
		res.Standard, res.Interlaced, err = planParallel(req.Radius, b)
	case FanBeam:
		res.SourceRadius = req.SourceRadius
		res.FanAngle = 2 * math.Asin(req.Radius/req.SourceRadius)
		res.Standard, res.Interlaced, err = planFan(req.Radius, req.SourceRadius, b, req.ShortScan)
	}
	if err != nil {
		return Result{}, err
	}
	return res, nil
}

// validate checks every field and returns an enclosure of Ω.
func (req Request) validate() (bounds.Interval, string, error) {
	if req.Geometry != ParallelBeam && req.Geometry != FanBeam {
		return bounds.Interval{}, "", invalid("scan.geometry", "unknown geometry %d", int(req.Geometry))
	}
	if err := positive("scan.radius", req.Radius); err != nil {
		return bounds.Interval{}, "", err
	}
	var omega bounds.Interval
	by := "given"
	switch {
	case req.Bandwidth != 0 && req.Resolution != 0:
		return bounds.Interval{}, "", invalid("scan.resolution", "give either scan.bandwidth or scan.resolution, not both")
	case req.Bandwidth != 0:
		if err := positive("scan.bandwidth", req.Bandwidth); err != nil {
			return bounds.Interval{}, "", err
		}
		omega = bounds.Point(req.Bandwidth)
	case req.Resolution != 0:
		if err := positive("scan.resolution", req.Resolution); err != nil {
			return bounds.Interval{}, "", err
		}
		omega = bounds.Pi.Div(bounds.Point(req.Resolution))
		by = ResolutionRule
	default:
		return bounds.Interval{}, "", invalid("scan.bandwidth", "must be finite and > 0 (or give scan.resolution), got 0")
	}
	if !omega.IsFinite() {
		return bounds.Interval{}, "", invalid("scan.resolution", "bandwidth π/δ overflows, got δ = %g", req.Resolution)
	}
	switch req.Geometry {
	case ParallelBeam:
		if req.SourceRadius != 0 {
			return bounds.Interval{}, "", invalid("scan.source_radius", "applies to fan beam only")
		}
		if req.ShortScan {
			return bounds.Interval{}, "", invalid("scan.short_scan", "applies to fan beam only")
		}
	case FanBeam:
		if err := positive("scan.source_radius", req.SourceRadius); err != nil {
			return bounds.Interval{}, "", err
		}
		if !(req.SourceRadius > req.Radius) {
			return bounds.Interval{}, "", invalid("scan.source_radius",
				"must exceed scan.radius (the source must lie outside the object), got R = %g, ρ = %g",
				req.SourceRadius, req.Radius)
		}
		if !(req.Radius/req.SourceRadius >= 1e-12) {
			return bounds.Interval{}, "", invalid("scan.source_radius",
				"R/ρ = %g exceeds 10¹²; use the parallel-beam plan", req.SourceRadius/req.Radius)
		}
	}
	// ρΩ is the leading size of every count; screen it before rounding.
	if rw := bounds.Point(req.Radius).Mul(omega); !(rw.Hi <= MaxSamples) {
		return bounds.Interval{}, "", workLimit("scan.bandwidth", "ρΩ = %g implies more than %g samples", rw.Hi, float64(MaxSamples))
	}
	return omega, by, nil
}

// band holds the bandwidth Ω: an enclosure, and the exact rational Ω (when
// given) or Ω/π = 1/δ (when given as a resolution δ).
type band struct {
	iv  bounds.Interval
	w   *big.Rat
	wPi *big.Rat
}

// ceilCount returns ⌈x.Hi⌉, at least lo, as a float64 (callers check size).
// It is the exact ceiling of the enclosed value unless x straddles an
// integer, which happens for an irrational value (a factor π or an arcsine)
// only within rounding distance of that integer.
func ceilCount(x bounds.Interval, lo float64) float64 {
	return math.Max(lo, math.Ceil(x.Hi))
}

// ceilRat returns ⌈v⌉, at least lo, for a rational v ≥ 0, exactly: counts
// from rational formulas (ρΩ, 2ρΩR/(R−ρ)) with round inputs are often
// integers, which an enclosure would round up by one needlessly.
func ceilRat(v *big.Rat, lo float64) float64 {
	q, r := new(big.Int).QuoRem(v.Num(), v.Denom(), new(big.Int))
	if r.Sign() > 0 {
		q.Add(q, big.NewInt(1))
	}
	f, _ := new(big.Float).SetInt(q).Float64()
	return math.Max(lo, f)
}

// rat returns the product of the float64 factors as an exact rational.
func rat(factors ...float64) *big.Rat {
	r := big.NewRat(1, 1)
	for _, f := range factors {
		r.Mul(r, new(big.Rat).SetFloat64(f))
	}
	return r
}

// evenUp returns the least even integer ≥ v (v ≥ 0 an integer value).
func evenUp(v float64) float64 { return 2 * math.Ceil(v/2) }

// checkSamples rejects totals above MaxSamples.
func checkSamples(total float64) error {
	if !(total <= MaxSamples) {
		return workLimit("scan.samples", "plan needs %.4g line integrals, more than the limit %g", total, float64(MaxSamples))
	}
	return nil
}

// planParallel returns the parallel-beam layouts (package doc, "Parallel beam").
func planParallel(rho float64, b band) (std, inter Layout, err error) {
	r := bounds.Point(rho)
	rw := r.Mul(b.iv) // ρΩ

	// Standard: q ≥ ρΩ/π, Δs = ρ/q ≤ π/Ω, rays s_l = lΔs, |l| ≤ q; p ≥ ρΩ.
	// Each count is exact where its value is rational.
	q := ceilCount(rw.Div(bounds.Pi), 1)
	p := ceilCount(rw, 1)
	if b.w != nil {
		p = ceilRat(new(big.Rat).Mul(rat(rho), b.w), 1)
	} else {
		q = ceilRat(new(big.Rat).Mul(rat(rho), b.wPi), 1)
	}
	if err := checkSamples(p * (2*q + 1)); err != nil {
		return std, inter, err
	}
	ds := r.Div(bounds.Point(q)).Lo
	std = Layout{
		Scheme:          Standard,
		Offered:         true,
		DetectorSpacing: ds,
		Detectors:       int(2*q + 1),
		Views:           int(p),
		Arc:             math.Pi,
		ViewStep:        math.Pi / p,
		Samples:         int64(p) * int64(2*q+1),
		Condition:       "Δs ≤ π/Ω and p ≥ ρΩ view directions over 180°",
		Source: "Nyquist condition in s and angular essential bandwidth ρΩ: Natterer, " +
			"Acta Numerica 8 (1999) §2 (text re-read), and The Mathematics of Computerized " +
			"Tomography (1986) Ch. III (from memory); derived in the package documentation " +
			"and checked by filtered backprojection in the tests",
	}

	// Interlaced (Kruse 1989, quoted by Natterer 1999): keep the standard
	// rays (j, l) with j + l even, p even. Spacing 2Δs ≤ 2π/Ω on each view,
	// shifted by Δs between views. The lattice needs p ≥ K = 2πρ/(2Δs) = πq;
	// the Debye margin c·K^{1/3} keeps the aliased low frequencies, which
	// this lattice parks at the corner of the bowtie, out of the disc.
	k := bounds.Pi.Scale(q)
	kc := k.Add(bounds.Point(math.Cbrt(k.Hi)).Mul(debyeMargin()))
	pi := evenUp(ceilCount(kc, 2))
	if err := checkSamples(pi * (2*q + 1) / 2); err != nil {
		return std, inter, err
	}
	inter = Layout{
		Scheme:          Interlaced,
		Offered:         true,
		DetectorSpacing: r.Div(bounds.Point(q)).Scale(2).Lo,
		Detectors:       int(q) + 1, // q+1 on one parity of views, q on the other
		Views:           int(pi),
		Arc:             math.Pi,
		ViewStep:        math.Pi / pi,
		Samples:         int64(pi) * int64(2*q+1) / 2,
		Condition: "Δs ≤ 2π/Ω with the detector grid shifted by Δs/2 on alternate views; " +
			"p ≥ K + c·K^{1/3} view directions over 180°, K = 2πρ/Δs (≥ ρΩ), c = " +
			"(3 ln 10³)^{2/3}/2 ≈ 3.77 (Debye margin), p even",
		Source: "lattice condition p ≥ K derived in the package documentation; it matches the " +
			"statement of Kruse (1989) quoted by Natterer, Acta Numerica 8 (1999) §2 (text " +
			"re-read): for even p the rays with j + l odd of the standard scheme can be " +
			"omitted. The margin c·K^{1/3} is derived from Debye's asymptotics of J_k " +
			"(DLMF §10.19(ii), from memory) and checked by filtered backprojection in the " +
			"tests: without it the reconstruction fails",
		Note: "needs a reconstruction adapted to the lattice: filtered backprojection with " +
			"the kernel cut off at 2π/Δs and filtered projections oversampled 64-fold " +
			"before linear interpolation (ReconstructParallel with Interlaced data)",
	}
	if inter.Samples >= std.Samples {
		inter = Layout{Scheme: Interlaced, Note: fmt.Sprintf("not offered: at ρΩ = %.3g the "+
			"interlaced scheme (%d samples) is not cheaper than the standard one (%d)",
			rw.Mid(), inter.Samples, std.Samples)}
	}
	return std, inter, nil
}

// debyeEps is the relative level at which the interlaced margin puts the
// leaked Bessel terms: J_k(t) ≤ e^{−k(α − tanh α)} for t = k·sech α, and
// k(α − tanh α) ≈ kα³/3 ≥ ln(1/ε) gives 1/sech α − 1 ≈ α²/2, so
// k ≥ K/sech α ≈ K + ½(3 ln(1/ε))^{2/3}·K^{1/3}.
const debyeEps = 1e-3

// debyeMargin encloses c = ½(3 ln(1/ε))^{2/3}.
func debyeMargin() bounds.Interval {
	l := bounds.Log(bounds.Point(1 / debyeEps)).Scale(3)
	return bounds.Pow(l, 2.0/3).Scale(0.5)
}

// asinEncl encloses arcsin(x) for 0 < x < 1, widening math.Asin by 2⁻⁴⁹
// relative (the accuracy assumption of package bounds for math functions).
func asinEncl(x float64) bounds.Interval {
	a := math.Asin(x)
	w := math.Abs(a)*0x1p-49 + 0x1p-1070
	return bounds.Interval{Lo: a - w, Hi: a + w}
}

// planFan returns the fan-beam layouts (package doc, "Fan beam").
func planFan(rho, bigR float64, b band, short bool) (std, inter Layout, err error) {
	omega := b.iv
	r := bounds.Point(rho)
	R := bounds.Point(bigR)
	x := r.Div(R)
	x.Hi = math.Min(x.Hi, 1)
	amax := asinEncl(x.Lo).Hull(asinEncl(x.Hi)) // half fan angle arcsin(ρ/R)
	wR := omega.Mul(R)                          // ΩR

	// arc returns the source arc, the view count for a given source step
	// bound over 360°, and the step actually used.
	arc := func(pFull float64) (views, step, span float64) {
		step = 2 * math.Pi / pFull
		if !short {
			return pFull, step, 2 * math.Pi
		}
		span = math.Pi + 2*amax.Mid()
		sp := bounds.Pi.Add(amax.Scale(2))
		views = math.Min(pFull, math.Ceil(sp.Div(bounds.TwoPi.Div(bounds.Point(pFull))).Hi)+1)
		return views, step, span
	}

	// Standard: Δα = αmax/q ≤ π/(Ω(R+ρ)), q ≥ αmax·Ω(R+ρ)/π;
	// p ≥ 2ρΩ·R/(R−ρ) over 360°.
	q := ceilCount(amax.Mul(omega.Mul(R.Add(r))).Div(bounds.Pi), 1)
	p := ceilCount(r.Mul(wR).Scale(2).Div(R.Sub(r)), 2)
	if b.w != nil {
		v := new(big.Rat).Mul(rat(2, rho, bigR), b.w)
		p = ceilRat(v.Quo(v, new(big.Rat).Sub(rat(bigR), rat(rho))), 2)
	}
	views, step, span := arc(p)
	if err := checkSamples(views * (2*q + 1)); err != nil {
		return std, inter, err
	}
	da := amax.Div(bounds.Point(q)).Lo
	std = Layout{
		Scheme:          Standard,
		Offered:         true,
		DetectorSpacing: R.Scale(da).Lo,
		DetectorAngle:   da,
		Detectors:       int(2*q + 1),
		Views:           int(views),
		Arc:             span,
		ViewStep:        step,
		Samples:         int64(views) * int64(2*q+1),
		Condition: "Δα ≤ π/(Ω(R+ρ)) (ray spacing RΔα ≤ (π/Ω)·R/(R+ρ) at the rotation axis) " +
			"and p ≥ 2ρΩ·R/(R−ρ) source positions over 360°",
		Source: "derived in the package documentation from the fan-to-parallel relations " +
			"φ = β+α−π/2, s = R sin α: Nyquist in α for the α-bandwidth Ω(R+ρ) of one fan, " +
			"and the trapezoidal rule in β at the source-side stretch dφ/dβ ≤ R/(R−ρ); " +
			"tends to the parallel conditions as R → ∞; checked by fan-beam filtered " +
			"backprojection in the tests. Natterer, SIAM J. Appl. Math. 53 (1993) gives " +
			"fan-beam conditions (from memory; constants not re-read)",
	}
	if short {
		std.Note = "short scan: 180° plus the fan angle is the completeness condition for " +
			"fan data (Parker, Med. Phys. 9 (1982), from memory); its reconstruction needs a " +
			"redundancy weighting, not checked here. The source spacing is the 360° one"
	}

	inter = Layout{Scheme: Interlaced, Note: "not offered for fan beam: the interlaced fan " +
		"lattice (package documentation) needs a reconstruction adapted to it, which this " +
		"package does not verify"}
	return std, inter, nil
}
