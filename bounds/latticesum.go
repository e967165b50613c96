package bounds

import (
	"context"
	"fmt"
	"math"
)

// LatticeSampledSum is the answer of LatticeAliasSum: the sampled sum of a
// family on a shifted lattice L + s at one frequency, the exact transform
// and the alias sum, each as a complex enclosure.
//
//	Sampled  T = |det W| Σ_{k∈Zⁿ} f(Wk+s) e^{-iξ·(Wk+s)}
//	Exact    F(ξ)
//	Alias    Σ_{m∈L*, m≠0} F(ξ+m) e^{im·s} = T - F(ξ)
//
// An infinite lattice has no truncation, so the error of the sampled sum
// is the alias sum. With ξ = 0, T is the lattice rule for ∫ f.
type LatticeSampledSum struct {
	Sampled Complex
	Exact   Complex
	Alias   Complex
	Method  LatticeMethod
}

// LatticeMethod says how a LatticeSampledSum was computed.
type LatticeMethod struct {
	// Side is the side of the lattice Poisson formula that was summed:
	// dual-lattice copies of F (spectral) or samples of f (spatial).
	Side Side
	// Points counts the terms summed: dual points m ≠ 0 or samples.
	Points int64
	// Visited counts the enumeration nodes visited, the work charged
	// against Settings.MaxTerms.
	Visited int64
	// Radius is the radius about the envelope's centre within which every
	// lattice point was summed (|ξ + m - c| on the spectral side,
	// |Wk + s - c| on the spatial side).
	Radius float64
	// Remainder bounds the modulus of the points not summed (from the
	// counting bound and the radial envelope); it is included in the
	// enclosures.
	Remainder float64
	// RemainderFrom names the envelope that bounded the remainder.
	RemainderFrom string
}

// SampledSum returns r in the shape of a one-dimensional answer: Error and
// Alias are the alias sum, Truncation is zero, and the method's terms are
// the points summed.
func (r LatticeSampledSum) SampledSum() SampledSum {
	return SampledSum{
		Sampled: r.Sampled,
		Exact:   r.Exact,
		Error:   r.Alias,
		Alias:   r.Alias,
		Method: Method{Side: r.Method.Side, AliasTerms: r.Method.Points,
			Remainder: r.Method.Remainder, RemainderFrom: r.Method.RemainderFrom},
	}
}

// LatticeAliasSum computes the sampled sum of f on the shifted lattice
// L + s at angular frequency ξ, the exact transform F(ξ) and the alias sum,
// by the lattice Poisson summation formula (math.md, "Lattices in n
// dimensions"; Stein & Weiss, Introduction to Fourier Analysis on Euclidean
// Spaces, 1971, Ch. VII, from memory):
//
//	|det W| Σ_{k∈Zⁿ} f(Wk+s) e^{-iξ·(Wk+s)} = Σ_{m∈L*} F(ξ+m) e^{im·s},
//	L* = 2π W^{-T} Zⁿ.
//
// On the spectral side the dual-lattice points are enumerated in growing
// balls about the centre of the spectral envelope (walker, from the
// LLL-reduced dual basis) and the points outside are bounded by the
// counting bound times the radial envelope (pointCounter.tail); the alias
// sum then keeps its relative accuracy however small it is against F(ξ).
// On the spatial side the samples are enumerated likewise about the centre
// of the spatial envelope and Alias = T - F(ξ). AutoSide picks the side
// that needs fewer points, preferring the spectral side when the alias sum
// is tiny against F(ξ).
//
// Errors wrap ErrInvalid (a *ParamError names the field: "family",
// "lattice", "shift[1]", "xi[0]", "settings.…"; also an envelope that is
// not summable on the side required), ErrWorkLimit (more enumeration nodes
// than set.MaxTerms), ErrNotFinite, or the context's error.
func LatticeAliasSum(ctx context.Context, f FamilyND, lat Lattice, shift, xi []float64, set Settings) (LatticeSampledSum, error) {
	if err := checkLatticeArgs(f, lat, shift, xi, set); err != nil {
		return LatticeSampledSum{}, err
	}
	if err := ctx.Err(); err != nil {
		return LatticeSampledSum{}, fmt.Errorf("bounds: lattice alias sum: %w", err)
	}
	s := newLatticeSummer(ctx, f, lat, shift, xi, set)
	res, err := s.run()
	if err != nil {
		return LatticeSampledSum{}, err
	}
	if !res.Sampled.IsFinite() || !res.Exact.IsFinite() || !res.Alias.IsFinite() {
		return LatticeSampledSum{}, fmt.Errorf("bounds: lattice alias sum of %v: %w", f, ErrNotFinite)
	}
	return res, nil
}

func checkLatticeArgs(f FamilyND, lat Lattice, shift, xi []float64, set Settings) error {
	if f == nil {
		return invalidf("family", "missing")
	}
	if err := lat.Validate("lattice"); err != nil {
		return err
	}
	n := lat.Dim()
	if f.Dim() != n {
		return invalidf("family", "%v has dimension %d, the lattice %d", f, f.Dim(), n)
	}
	if v, ok := f.(Validator); ok {
		if err := v.Validate(); err != nil {
			return err
		}
	}
	if err := validateRadial(f.Spatial(), n, "family.spatial"); err != nil {
		return err
	}
	if err := validateRadial(f.Spectral(), n, "family.spectral"); err != nil {
		return err
	}
	if err := checkVector(shift, n, "shift"); err != nil {
		return err
	}
	if err := checkVector(xi, n, "xi"); err != nil {
		return err
	}
	return set.Validate()
}

// validateRadial checks a radial envelope of dimension n.
func validateRadial(e RadialEnvelope, n int, path string) error {
	if len(e.Center) != n {
		return invalidf(path+".center", "has %d components, want %d", len(e.Center), n)
	}
	for i, c := range e.Center {
		if !finite(c) {
			return invalidf(fmt.Sprintf("%s.center[%d]", path, i), "must be finite, got %g", c)
		}
	}
	return e.Profile.Validate(path + ".profile")
}

// checkVector checks a vector of n finite components; nil means zero.
func checkVector(v []float64, n int, path string) error {
	if v == nil {
		return nil
	}
	if len(v) != n {
		return invalidf(path, "has %d components, want %d", len(v), n)
	}
	for i, x := range v {
		if !finite(x) {
			return invalidf(fmt.Sprintf("%s[%d]", path, i), "must be finite, got %g", x)
		}
	}
	return nil
}

// latticeSummer holds the state of one lattice alias sum.
type latticeSummer struct {
	f     FamilyND
	lat   Lattice
	n     int
	shift []float64
	xi    []float64
	set   Settings
	w     *work
	F     Complex // F(ξ)
}

func newLatticeSummer(ctx context.Context, f FamilyND, lat Lattice, shift, xi []float64, set Settings) *latticeSummer {
	n := lat.Dim()
	if shift == nil {
		shift = make([]float64, n)
	}
	if xi == nil {
		xi = make([]float64, n)
	}
	return &latticeSummer{f: f, lat: lat, n: n, shift: shift, xi: xi, set: set,
		w: &work{ctx: ctx, limit: set.maxTerms(), what: "lattice alias sum"}}
}

// goal is the remainder accepted for a sum of magnitude about scale (as
// in the one-dimensional sums).
func (s *latticeSummer) goal(scale float64) float64 {
	return math.Max(s.set.Tol, math.Max(relGoal*scale, 0x1p-1022))
}

func (s *latticeSummer) run() (LatticeSampledSum, error) {
	box := make([]Interval, s.n)
	for i, v := range s.xi {
		box[i] = Point(v)
	}
	s.F = s.f.Transform(box)
	side := s.set.Side
	if side == AutoSide {
		var err error
		side, err = s.chooseSide()
		if err != nil {
			return LatticeSampledSum{}, err
		}
	}
	if side == SpectralSide {
		return s.spectral()
	}
	return s.spatial()
}

// target returns center - v as an interval vector.
func target(center, v []float64) []Interval {
	t := make([]Interval, len(center))
	for i := range center {
		t[i] = Point(center[i]).Sub(Point(v[i]))
	}
	return t
}

func normBound(t []Interval) float64 {
	s := Point(0)
	for _, v := range t {
		s = s.Add(v.Sqr())
	}
	return Sqrt(s).Hi
}

// chooseSide picks the side with fewer predicted points; the spectral side
// is preferred when it is cheap or when the alias sum is tiny against F(ξ),
// which the spatial side would lose to rounding.
func (s *latticeSummer) chooseSide() (Side, error) {
	d := s.lat.d
	spec, spat := s.f.Spectral(), s.f.Spatial()
	specProf, spatProf := radialProfile(spec.Profile, 0), radialProfile(spat.Profile, 0)
	specOK, spatOK := summable(specProf, s.n), summable(spatProf, s.n)
	switch {
	case !specOK && !spatOK:
		return 0, invalidf("family", "%v: neither envelope is summable in %d dimensions", s.f, s.n)
	case !specOK:
		return SpatialSide, nil
	case !spatOK:
		return SpectralSide, nil
	}
	limit := float64(s.set.maxTerms())
	// The nearest alias copy: at least the shortest dual vector away from
	// the origin, so at distance ≥ λ - |t| from the envelope's centre.
	pcd := d.dual.counter(d.dual.scale)
	first := specProf.At(Point(math.Max(0, pcd.shortest()-normBound(target(spec.Center, s.xi)))))
	Fm := s.F.Mag()
	Rs, okS := pcd.radiusFor(specProf, s.goal(math.Max(first, 0x1p-60*Fm)), limit)
	pcp := d.primal.counter(Point(1))
	Rx, okX := pcp.radiusFor(spatProf, s.goal(Fm)/d.covol.Hi, limit)
	specPts, spatPts := math.Inf(1), math.Inf(1)
	if okS {
		specPts = pcd.upper(Rs)
	}
	if okX {
		spatPts = pcp.upper(Rx)
	}
	tiny := first < 1e-8*Fm
	if specPts < 64 || specPts <= 4*spatPts || (tiny && specPts <= limit) {
		return SpectralSide, nil
	}
	return SpatialSide, nil
}

// shells sums visit over the points of ps (lengths scaled by k) about the
// target t in growing balls until the tail bound of the profile, times
// factor, is at most goal(|sum so far|). It returns the radius reached,
// the remainder bound (times factor), and the points certified inside.
func (s *latticeSummer) shells(ps *pointSet, k Interval, t []Interval, prof Envelope, factor float64,
	goal func() float64, visit func(c []int64) error) (R, rem float64, err error) {
	if !summable(prof, s.n) {
		return 0, 0, invalidf("family", "%v: envelope %v is not summable in %d dimensions", s.f, prof, s.n)
	}
	pc := ps.counter(k)
	tau := ps.targetCoords(t, k)
	limit := float64(s.w.limit)
	nIn := 0.0
	prev2 := -1.0
	R = -1
	for pass := 0; ; pass++ {
		g := goal()
		if R >= 0 {
			rem = mulUp(factor, pc.tail(prof, R, nIn))
			if rem <= g || pass >= 12 {
				return R, rem, nil
			}
		}
		Rn, ok := pc.radiusFor(prof, divDown(g, factor), limit)
		if !ok {
			return 0, 0, workLimitf("settings.max_terms", "%s needs more than %d lattice points", s.w.what, s.w.limit)
		}
		if Rn <= R {
			Rn = 2 * R
		}
		rho2 := Point(Rn).Div(k).Sqr().Hi
		R2lo := Point(Rn).Sqr().Lo
		k2 := k.Sqr()
		wk := walker{ps: ps, tau: tau, rho2: rho2, prev2: prev2, w: s.w,
			visit: func(c []int64, d2 Interval) error {
				if d2.Mul(k2).Hi <= R2lo {
					nIn++
				}
				return visit(c)
			}}
		if err := wk.run(); err != nil {
			return 0, 0, err
		}
		prev2 = rho2
		R = Rn
	}
}

func isZero(c []int64) bool {
	for _, v := range c {
		if v != 0 {
			return false
		}
	}
	return true
}

// spectral sums the alias copies F(ξ+m) e^{im·s} over the dual lattice.
func (s *latticeSummer) spectral() (LatticeSampledSum, error) {
	d := s.lat.d
	ps := d.dual
	k := ps.scale
	spec := s.f.Spectral()
	prof := radialProfile(spec.Profile, 0)
	// Phase e^{im·s} = e^{i2π c·σ} with σ_j = Σ_i B_ij s_i (B the unscaled
	// reduced dual basis W^{-T}U, so m = 2πBc).
	sigma := make([]Interval, s.n)
	zeroShift := true
	for j := 0; j < s.n; j++ {
		for i := 0; i < s.n; i++ {
			sigma[j] = sigma[j].Add(ps.basis[i][j].Scale(s.shift[i]))
		}
		if s.shift[j] != 0 {
			zeroShift = false
		}
	}
	m := make([]Interval, s.n)
	var sum Complex
	var points int64
	Fm := s.F.Mag()
	visit := func(c []int64) error {
		if isZero(c) {
			return nil // the exact term F(ξ)
		}
		ps.point(m, c, k)
		for i := range m {
			m[i] = m[i].AddFloat(s.xi[i])
		}
		v := s.f.Transform(m)
		if !zeroShift {
			var u Interval
			for j, cj := range c {
				if cj != 0 {
					u = u.Add(sigma[j].Scale(float64(cj)))
				}
			}
			u = u.AddFloat(-math.Round(u.Mid()))
			v = v.Mul(Cis(TwoPi.Mul(u)))
		}
		sum = sum.Add(v)
		points++
		return nil
	}
	// The first ball aims at the size of the nearest alias copy, so that a
	// small alias sum is not summed to 2⁻¹²⁰ of F(ξ); later balls aim at
	// 2⁻⁶⁰ of the sum found.
	t := target(spec.Center, s.xi)
	first := prof.At(Point(math.Max(0, ps.counter(k).shortest()-normBound(t))))
	pass0 := true
	goal := func() float64 {
		if pass0 {
			pass0 = false
			return s.goal(math.Max(first, 0x1p-60*Fm))
		}
		return s.goal(math.Max(sum.Mag(), 0x1p-60*Fm))
	}
	R, rem, err := s.shells(ps, k, t, prof, 1, goal, visit)
	if err != nil {
		return LatticeSampledSum{}, err
	}
	alias := sum.Inflate(rem)
	return LatticeSampledSum{
		Sampled: s.F.Add(alias),
		Exact:   s.F,
		Alias:   alias,
		Method: LatticeMethod{Side: SpectralSide, Points: points, Visited: s.w.used,
			Radius: R, Remainder: rem, RemainderFrom: spec.Profile.String()},
	}, nil
}

// spatial sums |det W| f(x) e^{-iξ·x} over the samples x = Wk + s.
func (s *latticeSummer) spatial() (LatticeSampledSum, error) {
	d := s.lat.d
	ps := d.primal
	k := Point(1)
	spat := s.f.Spatial()
	prof := radialProfile(spat.Profile, 0)
	// ξ·x = Σ_j c_j a_j + ξ·s with a_j = Σ_i B_ij ξ_i.
	a := make([]Interval, s.n)
	var xs Interval
	zeroXi := true
	for j := 0; j < s.n; j++ {
		for i := 0; i < s.n; i++ {
			a[j] = a[j].Add(ps.basis[i][j].Scale(s.xi[i]))
		}
		xs = xs.Add(Point(s.xi[j]).Mul(Point(s.shift[j])))
		if s.xi[j] != 0 {
			zeroXi = false
		}
	}
	x := make([]Interval, s.n)
	var sum Complex
	var points int64
	covol := d.covol
	Fm := s.F.Mag()
	goal := func() float64 { return s.goal(math.Max(sum.Mag()*covol.Lo, Fm)) }
	visit := func(c []int64) error {
		ps.point(x, c, k)
		for i := range x {
			x[i] = x[i].AddFloat(s.shift[i])
		}
		v := s.f.Value(x)
		if !zeroXi {
			ph := xs
			for j, cj := range c {
				if cj != 0 {
					ph = ph.Add(a[j].Scale(float64(cj)))
				}
			}
			v = v.Mul(Cis(ph.Neg()))
		}
		sum = sum.Add(v)
		points++
		return nil
	}
	R, rem, err := s.shells(ps, k, target(spat.Center, s.shift), prof, covol.Hi, goal, visit)
	if err != nil {
		return LatticeSampledSum{}, err
	}
	T := sum.MulReal(covol).Inflate(rem)
	return LatticeSampledSum{
		Sampled: T,
		Exact:   s.F,
		Alias:   T.Sub(s.F),
		Method: LatticeMethod{Side: SpatialSide, Points: points, Visited: s.w.used,
			Radius: R, Remainder: rem, RemainderFrom: spat.Profile.String()},
	}, nil
}
