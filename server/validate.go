package server

import (
	"fmt"
	"math"

	"google.golang.org/grpc/codes"
	"google.golang.org/protobuf/encoding/protowire"
	"google.golang.org/protobuf/reflect/protoreflect"

	pb "foldbound/api/foldbound/v1"
	"foldbound/bounds"
	"foldbound/bounds/scan"
)

// maxViolations caps the violations collected for one request.
const maxViolations = 16

// checker collects the rule violations of one request. Paths are the
// proto field names joined by dots, with [i] for list elements.
type checker struct {
	lim   Limits
	vs    []violation // broken rules of the contract: InvalidArgument
	over  []violation // this server's size limits: ResourceExhausted
	nodes int         // family nodes seen
}

func (c *checker) bad(field, format string, args ...any) {
	if len(c.vs) < maxViolations {
		c.vs = append(c.vs, violation{field, fmt.Sprintf(format, args...)})
	}
}

func (c *checker) limit(field, format string, args ...any) {
	if len(c.over) < maxViolations {
		c.over = append(c.over, violation{field, fmt.Sprintf(format, args...)})
	}
}

// err returns the collected violations as an error, contract rules first.
func (c *checker) err() error {
	if len(c.vs) > 0 {
		return &requestError{code: codes.InvalidArgument, violations: c.vs}
	}
	if len(c.over) > 0 {
		return &requestError{code: codes.ResourceExhausted, violations: c.over}
	}
	return nil
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

func (c *checker) finite(field string, v float64) {
	if !finite(v) {
		c.bad(field, "must be finite, got %g", v)
	}
}

func (c *checker) positive(field string, v float64) {
	if !finite(v) || v <= 0 {
		c.bad(field, "must be finite and > 0, got %g", v)
	}
}

func (c *checker) nonNegative(field string, v float64) {
	if !finite(v) || v < 0 {
		c.bad(field, "must be finite and ≥ 0, got %g", v)
	}
}

// unknownFields reports fields the server does not know anywhere in m: a
// client built from a newer contract may mean something this server would
// otherwise silently ignore. An unknown field of a Family is an unknown
// family kind.
func (c *checker) unknownFields(path string, m protoreflect.Message) {
	if raw := m.GetUnknown(); len(raw) > 0 {
		num, _, _ := protowire.ConsumeTag(raw)
		field := path
		if field == "" {
			field = string(m.Descriptor().Name())
		}
		if m.Descriptor().FullName() == "foldbound.v1.Family" {
			c.bad(field, "unknown family kind (field %d is not known to this server)", num)
		} else {
			c.bad(field, "unknown field %d (not known to this server; is the client newer?)", num)
		}
	}
	m.Range(func(fd protoreflect.FieldDescriptor, v protoreflect.Value) bool {
		name := string(fd.Name())
		if path != "" {
			name = path + "." + name
		}
		switch {
		case fd.IsList() && fd.Message() != nil:
			l := v.List()
			for i := 0; i < l.Len(); i++ {
				c.unknownFields(fmt.Sprintf("%s[%d]", name, i), l.Get(i).Message())
			}
		case fd.Message() != nil && !fd.IsMap():
			c.unknownFields(name, v.Message())
		}
		return len(c.vs) < maxViolations
	})
}

// family checks a family tree and returns its dimension (0 if unknown).
// n-dimensional kinds are allowed only where root is true.
func (c *checker) family(path string, f *pb.Family, depth int, root bool) int {
	if f == nil {
		c.bad(path, "required")
		return 0
	}
	c.nodes++
	if c.nodes == c.lim.MaxFamilyNodes+1 {
		c.bad(path, "family tree has more than %d nodes", c.lim.MaxFamilyNodes)
	}
	if c.nodes > c.lim.MaxFamilyNodes {
		return 0
	}
	if depth > c.lim.MaxFamilyDepth {
		c.bad(path, "family tree nested deeper than %d levels", c.lim.MaxFamilyDepth)
		return 0
	}
	switch k := f.GetKind().(type) {
	case nil:
		if len(f.ProtoReflect().GetUnknown()) == 0 { // else reported by unknownFields
			c.bad(path, "no family kind set (one of gaussian, two_sided_exponential, lorentzian, sech, sech_squared, wave_packet, fejer, b_spline, kaiser_bessel, amplitude, shift, dilation, modulation, sum, separable, radial_gaussian)")
		}
		return 0
	case *pb.Family_Gaussian:
		c.positive(path+".gaussian.sigma", k.Gaussian.GetSigma())
	case *pb.Family_TwoSidedExponential:
		c.positive(path+".two_sided_exponential.a", k.TwoSidedExponential.GetA())
	case *pb.Family_Lorentzian:
		c.positive(path+".lorentzian.a", k.Lorentzian.GetA())
	case *pb.Family_Sech:
		c.positive(path+".sech.w", k.Sech.GetW())
	case *pb.Family_SechSquared:
		c.positive(path+".sech_squared.w", k.SechSquared.GetW())
	case *pb.Family_WavePacket:
		c.positive(path+".wave_packet.sigma", k.WavePacket.GetSigma())
		c.finite(path+".wave_packet.omega0", k.WavePacket.GetOmega0())
	case *pb.Family_Fejer:
		c.positive(path+".fejer.omega", k.Fejer.GetOmega())
	case *pb.Family_BSpline:
		if m := k.BSpline.GetOrder(); m < 1 || m > bounds.MaxBSplineOrder {
			c.bad(path+".b_spline.order", "must be between 1 and %d, got %d", bounds.MaxBSplineOrder, m)
		}
	case *pb.Family_KaiserBessel:
		if w := k.KaiserBessel.GetWidth(); !finite(w) || w < 0x1p-1000 || w > 0x1p1000 {
			c.bad(path+".kaiser_bessel.width", "must be finite and between 2^-1000 and 2^1000, got %g", w)
		}
		if b := k.KaiserBessel.GetBeta(); !finite(b) || b < 0 || b > bounds.MaxKaiserBeta {
			c.bad(path+".kaiser_bessel.beta", "must be between 0 and %d, got %g", bounds.MaxKaiserBeta, b)
		}
	case *pb.Family_Amplitude:
		p := path + ".amplitude"
		if z := k.Amplitude.GetFactor(); z == nil {
			c.bad(p+".factor", "required")
		} else {
			c.finite(p+".factor.re", z.GetRe())
			c.finite(p+".factor.im", z.GetIm())
		}
		c.family(p+".of", k.Amplitude.GetOf(), depth+1, false)
	case *pb.Family_Shift:
		p := path + ".shift"
		c.finite(p+".by", k.Shift.GetBy())
		c.family(p+".of", k.Shift.GetOf(), depth+1, false)
	case *pb.Family_Dilation:
		p := path + ".dilation"
		c.positive(p+".factor", k.Dilation.GetFactor())
		c.family(p+".of", k.Dilation.GetOf(), depth+1, false)
	case *pb.Family_Modulation:
		p := path + ".modulation"
		c.finite(p+".omega0", k.Modulation.GetOmega0())
		c.family(p+".of", k.Modulation.GetOf(), depth+1, false)
	case *pb.Family_Sum:
		p := path + ".sum.terms"
		terms := k.Sum.GetTerms()
		if len(terms) == 0 {
			c.bad(p, "must have at least 1 term")
		}
		for i, t := range terms {
			c.family(fmt.Sprintf("%s[%d]", p, i), t, depth+1, false)
		}
	case *pb.Family_Separable:
		p := path + ".separable"
		if !root {
			c.bad(p, "n-dimensional families are allowed only at the root of a family tree")
			return 0
		}
		n := len(k.Separable.GetFactors())
		if n < 1 || n > bounds.MaxDim {
			c.bad(p+".factors", "dimension must be between 1 and %d (one factor per axis), got %d", bounds.MaxDim, n)
			return 0
		}
		for i, t := range k.Separable.GetFactors() {
			c.family(fmt.Sprintf("%s.factors[%d]", p, i), t, depth+1, false)
		}
		return n
	case *pb.Family_RadialGaussian:
		p := path + ".radial_gaussian"
		r := k.RadialGaussian
		if !root {
			c.bad(p, "n-dimensional families are allowed only at the root of a family tree")
			return 0
		}
		c.positive(p+".sigma", r.GetSigma())
		n := int(r.GetDim())
		if n < 1 || n > bounds.MaxDim {
			c.bad(p+".dim", "must be between 1 and %d, got %d", bounds.MaxDim, r.GetDim())
			return 0
		}
		if m := len(r.GetCenter()); m != 0 && m != n {
			c.bad(p+".center", "must be empty or have dim = %d entries, got %d", n, m)
		}
		for i, v := range r.GetCenter() {
			c.finite(fmt.Sprintf("%s.center[%d]", p, i), v)
		}
		return n
	default:
		c.bad(path, "family kind %T is not supported", k)
		return 0
	}
	return 1
}

// grids checks one grid per axis of a dim-dimensional function.
func (c *checker) grids(path string, gs []*pb.Grid, dim int) {
	if dim > 0 && len(gs) != dim {
		c.bad(path, "need one grid per axis: got %d grids for a %d-dimensional function", len(gs), dim)
	}
	for i, g := range gs {
		p := fmt.Sprintf("%s[%d]", path, i)
		if g == nil {
			c.bad(p, "required")
			continue
		}
		h, s, n := g.GetStep(), g.GetShift(), g.GetCount()
		c.positive(p+".step", h)
		c.finite(p+".shift", s)
		switch {
		case n < 0:
			c.bad(p+".count", "must be ≥ 0 (0 is the infinite grid), got %d", n)
		case n > c.lim.MaxCount:
			c.limit(p+".count", "%d samples exceed this server's limit of %d per axis", n, c.lim.MaxCount)
		}
		if finite(h) && h > 0 && finite(s) {
			if math.Abs(s)/h > 1<<52 {
				c.bad(p+".shift", "|shift|/step = %g exceeds 2^52; sample positions would not be distinct", math.Abs(s)/h)
			} else if n > 0 && math.IsInf(math.Abs(s)+h*float64(n), 0) {
				c.bad(p, "window shift ± step·count/2 overflows float64")
			}
		}
	}
}

// perAxis checks a list that is empty or has one entry per axis.
func (c *checker) perAxis(path string, vs []float64, dim int, rule func(string, float64)) {
	if len(vs) != 0 && dim > 0 && len(vs) != dim {
		c.bad(path, "must be empty or have one entry per axis (%d), got %d", dim, len(vs))
	}
	for i, v := range vs {
		rule(fmt.Sprintf("%s[%d]", path, i), v)
	}
}

func (c *checker) band(path string, b *pb.Band, dim int) {
	c.perAxis(path+".center", b.GetCenter(), dim, c.finite)
	c.perAxis(path+".half_width", b.GetHalfWidth(), dim, c.nonNegative)
}

func (c *checker) settings(path string, s *pb.Settings) {
	c.nonNegative(path+".tol", s.GetTol())
	if s.GetMaxTerms() < 0 {
		c.bad(path+".max_terms", "must be ≥ 0 (0 is the server's default), got %d", s.GetMaxTerms())
	}
	if _, ok := pb.Side_name[int32(s.GetSide())]; !ok {
		c.bad(path+".side", "unknown side %d", s.GetSide())
	}
}

func (c *checker) convention(path string, v pb.Convention) {
	if _, ok := pb.Convention_name[int32(v)]; !ok {
		c.bad(path, "unknown convention %d", v)
	}
}

func (c *checker) envelopes(path string, e *pb.Envelopes) {
	if e == nil {
		c.bad(path, "required")
		return
	}
	c.envelope(path+".spatial", e.GetSpatial())
	c.envelope(path+".spectral", e.GetSpectral())
}

func (c *checker) envelope(path string, ts []*pb.EnvelopeTerm) {
	if len(ts) > c.lim.MaxEnvelopeTerms {
		c.bad(path, "has %d terms, more than the limit of %d", len(ts), c.lim.MaxEnvelopeTerms)
		return
	}
	for i, t := range ts {
		p := fmt.Sprintf("%s[%d]", path, i)
		if t == nil {
			c.bad(p, "required")
			continue
		}
		c.nonNegative(p+".amplitude", t.GetAmplitude())
		c.finite(p+".center", t.GetCenter())
		c.nonNegative(p+".plateau", t.GetPlateau())
		unused := func(name string, v float64) {
			if v != 0 {
				c.bad(p+"."+name, "is not used by %v and must be 0, got %g", t.GetDecay(), v)
			}
		}
		switch t.GetDecay() {
		case pb.Decay_DECAY_EXPONENTIAL:
			c.positive(p+".rate", t.GetRate())
			unused("width", t.GetWidth())
			unused("power", t.GetPower())
		case pb.Decay_DECAY_GAUSSIAN:
			c.positive(p+".width", t.GetWidth())
			unused("rate", t.GetRate())
			unused("power", t.GetPower())
		case pb.Decay_DECAY_ALGEBRAIC:
			c.positive(p+".width", t.GetWidth())
			c.positive(p+".power", t.GetPower())
			unused("rate", t.GetRate())
		case pb.Decay_DECAY_COMPACT:
			c.nonNegative(p+".width", t.GetWidth())
			unused("rate", t.GetRate())
			unused("power", t.GetPower())
		default:
			c.bad(p+".decay", "must be one of DECAY_EXPONENTIAL, DECAY_GAUSSIAN, DECAY_ALGEBRAIC, DECAY_COMPACT, got %v", t.GetDecay())
		}
	}
}

// subject checks the family-or-envelopes oneof and returns the dimension.
func (c *checker) subject(family *pb.Family, env *pb.Envelopes, unset bool) int {
	switch {
	case family != nil:
		return c.family("family", family, 1, true)
	case env != nil:
		c.envelopes("envelopes", env)
		return 1
	case unset:
		c.bad("subject", "one of family or envelopes is required")
	}
	return 0
}

// smallestNormal is the smallest positive normal float64, 2^-1022.
const smallestNormal = 0x1p-1022

func (c *checker) tolerance(path string, tol float64) {
	switch {
	case !finite(tol) || tol < 0:
		c.bad(path, "must be finite and > 0, got %g", tol)
	case tol == 0:
		c.bad(path, "must be > 0, got 0 (a JSON literal below 2.2e-308, such as 1e-400, arrives as 0)")
	case tol < smallestNormal:
		c.bad(path, "%g is subnormal; the smallest accepted tolerance is 2^-1022 = 2.2250738585072014e-308", tol)
	}
}

// checkAliasSum validates an AliasSumRequest and returns the dimension.
func (lim Limits) checkAliasSum(r *pb.AliasSumRequest) (int, error) {
	c := &checker{lim: lim}
	c.unknownFields("", r.ProtoReflect())
	dim := c.family("family", r.GetFamily(), 1, true)
	c.grids("grids", r.GetGrids(), dim)
	c.perAxis("xi", r.GetXi(), dim, c.finite)
	c.convention("convention", r.GetConvention())
	c.settings("settings", r.GetSettings())
	return dim, c.err()
}

// checkErrorBudget validates an ErrorBudgetRequest and returns the
// dimension.
func (lim Limits) checkErrorBudget(r *pb.ErrorBudgetRequest) (int, error) {
	c := &checker{lim: lim}
	c.unknownFields("", r.ProtoReflect())
	dim := c.subject(r.GetFamily(), r.GetEnvelopes(), r.GetSubject() == nil)
	c.grids("grids", r.GetGrids(), dim)
	c.band("frequency", r.GetFrequency(), dim)
	c.convention("convention", r.GetConvention())
	c.settings("settings", r.GetSettings())
	c.nonNegative("sample_ulps", r.GetSampleUlps())
	return dim, c.err()
}

// checkPlanGrid validates a PlanGridRequest and returns the dimension.
func (lim Limits) checkPlanGrid(r *pb.PlanGridRequest) (int, error) {
	c := &checker{lim: lim}
	c.unknownFields("", r.ProtoReflect())
	dim := c.subject(r.GetFamily(), r.GetEnvelopes(), r.GetSubject() == nil)
	c.tolerance("tol", r.GetTol())
	c.band("frequency", r.GetFrequency(), dim)
	c.perAxis("frequency_spacing", r.GetFrequencySpacing(), dim, c.nonNegative)
	c.perAxis("shift", r.GetShift(), dim, c.finite)
	cost := r.GetCost()
	if _, ok := pb.SizeRule_name[int32(cost.GetSizes())]; !ok {
		c.bad("cost.sizes", "unknown size rule %d", cost.GetSizes())
	}
	c.nonNegative("cost.per_sample", cost.GetPerSample())
	c.nonNegative("cost.per_transform", cost.GetPerTransform())
	c.nonNegative("sample_ulps", r.GetSampleUlps())
	if r.GetMaxSamples() < 0 {
		c.bad("max_samples", "must be ≥ 0 (0 is the server's limit), got %d", r.GetMaxSamples())
	}
	c.convention("convention", r.GetConvention())
	c.settings("settings", r.GetSettings())
	return dim, c.err()
}

// checkPlanScan validates a PlanScanRequest.
func (lim Limits) checkPlanScan(r *pb.PlanScanRequest) error {
	c := &checker{lim: lim}
	c.unknownFields("", r.ProtoReflect())
	geo := r.GetGeometry()
	if geo != pb.ScanGeometry_SCAN_GEOMETRY_PARALLEL_BEAM && geo != pb.ScanGeometry_SCAN_GEOMETRY_FAN_BEAM {
		c.bad("geometry", "must be SCAN_GEOMETRY_PARALLEL_BEAM or SCAN_GEOMETRY_FAN_BEAM, got %v", geo)
	}
	c.positive("radius", r.GetRadius())
	bw, res := r.GetBandwidth(), r.GetResolution()
	switch {
	case bw != 0 && res != 0:
		c.bad("resolution", "give either bandwidth or resolution, not both")
	case bw != 0:
		c.positive("bandwidth", bw)
	case res != 0:
		c.positive("resolution", res)
	default:
		c.bad("bandwidth", "one of bandwidth or resolution is required (> 0)")
	}
	switch geo {
	case pb.ScanGeometry_SCAN_GEOMETRY_PARALLEL_BEAM:
		if r.GetSourceRadius() != 0 {
			c.bad("source_radius", "applies to the fan beam only; must be 0, got %g", r.GetSourceRadius())
		}
		if r.GetShortScan() {
			c.bad("short_scan", "applies to the fan beam only")
		}
	case pb.ScanGeometry_SCAN_GEOMETRY_FAN_BEAM:
		c.positive("source_radius", r.GetSourceRadius())
		if R, rho := r.GetSourceRadius(), r.GetRadius(); finite(R) && finite(rho) && R > 0 && rho > 0 && !(R > rho) {
			c.bad("source_radius", "must exceed radius (the source lies outside the object), got %g ≤ %g", R, rho)
		}
	}
	switch n := r.GetVerifyImageSize(); {
	case n != 0 && !r.GetVerify():
		c.bad("verify_image_size", "applies only with verify; must be 0, got %d", n)
	case n < 0 || (n > 0 && n < minVerifySize):
		c.bad("verify_image_size", "must be 0 (meaning %d) or between %d and %d, got %d", scan.DefaultVerifySize, minVerifySize, scan.MaxVerifySize, n)
	case n > scan.MaxVerifySize:
		c.limit("verify_image_size", "%d pixels per side exceed the limit of %d", n, scan.MaxVerifySize)
	}
	return c.err()
}

// minVerifySize is the smallest image size of a scan verification that
// the service accepts: fewer pixels say little about a reconstruction.
const minVerifySize = 16
