package server

import (
	"fmt"
	"math"

	pb "foldbound/api/foldbound/v1"
	"foldbound/bounds"
	"foldbound/bounds/scan"
)

// This file converts validated wire requests to engine values and engine
// results back to wire messages. It assumes the checks of validate.go have
// passed.

// kindName returns the name of the family kind set in f, e.g. "gaussian".
func kindName(f *pb.Family) string {
	m := f.ProtoReflect()
	if fd := m.WhichOneof(m.Descriptor().Oneofs().ByName("kind")); fd != nil {
		return string(fd.Name())
	}
	return "kind"
}

// notInEngine reports a family kind that the engine of this build lacks.
func notInEngine(path string, f *pb.Family) error {
	return &unimplementedError{field: path + "." + kindName(f), what: "this family is not available in this server's engine yet"}
}

// family1D converts a validated one-dimensional family tree. Each leaf is
// checked by the engine as it is built, so that an engine-only rule (an
// envelope leaving the float64 range) is reported at the leaf's wire path.
func family1D(path string, f *pb.Family) (bounds.Family, error) {
	leaf := func(g bounds.Family) (bounds.Family, error) {
		if err := bounds.Validate(g); err != nil {
			return nil, atWirePath(err, path+"."+kindName(f))
		}
		return g, nil
	}
	sub := func(name string, g *pb.Family) (bounds.Family, error) {
		return family1D(path+"."+kindName(f)+"."+name, g)
	}
	switch k := f.GetKind().(type) {
	case *pb.Family_Gaussian:
		return leaf(bounds.GaussianFamily{Sigma: k.Gaussian.GetSigma()})
	case *pb.Family_TwoSidedExponential:
		return leaf(bounds.ExponentialFamily{Rate: k.TwoSidedExponential.GetA()})
	case *pb.Family_Lorentzian:
		return leaf(bounds.LorentzianFamily{Width: k.Lorentzian.GetA()})
	case *pb.Family_Sech:
		return leaf(bounds.SechFamily{Width: k.Sech.GetW()})
	case *pb.Family_SechSquared:
		return leaf(bounds.SechSquaredFamily{Width: k.SechSquared.GetW()})
	case *pb.Family_WavePacket:
		return leaf(bounds.WavePacketFamily{Sigma: k.WavePacket.GetSigma(), Omega0: k.WavePacket.GetOmega0()})
	case *pb.Family_Fejer:
		return leaf(bounds.FejerFamily{Omega: k.Fejer.GetOmega()})
	case *pb.Family_BSpline:
		return leaf(bounds.BSplineFamily{Order: int(k.BSpline.GetOrder())})
	case *pb.Family_KaiserBessel:
		return leaf(bounds.KaiserBesselFamily{Width: k.KaiserBessel.GetWidth(), Beta: k.KaiserBessel.GetBeta()})
	case *pb.Family_Amplitude:
		of, err := sub("of", k.Amplitude.GetOf())
		if err != nil {
			return nil, err
		}
		z := k.Amplitude.GetFactor()
		return bounds.AmplitudeFamily{Re: z.GetRe(), Im: z.GetIm(), Of: of}, nil
	case *pb.Family_Shift:
		of, err := sub("of", k.Shift.GetOf())
		if err != nil {
			return nil, err
		}
		return bounds.ShiftFamily{By: k.Shift.GetBy(), Of: of}, nil
	case *pb.Family_Dilation:
		of, err := sub("of", k.Dilation.GetOf())
		if err != nil {
			return nil, err
		}
		return bounds.DilationFamily{By: k.Dilation.GetFactor(), Of: of}, nil
	case *pb.Family_Modulation:
		of, err := sub("of", k.Modulation.GetOf())
		if err != nil {
			return nil, err
		}
		return bounds.ModulationFamily{Omega0: k.Modulation.GetOmega0(), Of: of}, nil
	case *pb.Family_Sum:
		terms := make([]bounds.Family, len(k.Sum.GetTerms()))
		for i, t := range k.Sum.GetTerms() {
			var err error
			if terms[i], err = family1D(fmt.Sprintf("%s.sum.terms[%d]", path, i), t); err != nil {
				return nil, err
			}
		}
		return bounds.SumFamily{Terms: terms}, nil
	}
	return nil, notInEngine(path, f)
}

// rootFamily1D converts a validated one-dimensional family and checks the
// composed tree as a whole (node budget, derived envelopes in range).
func rootFamily1D(path string, f *pb.Family) (bounds.Family, error) {
	g, err := family1D(path, f)
	if err != nil {
		return nil, err
	}
	if err := bounds.Validate(g); err != nil {
		return nil, wirePaths(err)
	}
	return g, nil
}

// familyND converts a validated family tree of dimension dim to an
// n-dimensional engine family; one-dimensional kinds become a Separable
// with one axis.
func familyND(path string, f *pb.Family, dim int) (bounds.FamilyND, error) {
	switch k := f.GetKind().(type) {
	case *pb.Family_Separable:
		axes := make([]bounds.Family, len(k.Separable.GetFactors()))
		for i, g := range k.Separable.GetFactors() {
			var err error
			if axes[i], err = rootFamily1D(fmt.Sprintf("%s.separable.factors[%d]", path, i), g); err != nil {
				return nil, err
			}
		}
		return bounds.Separable{Axes: axes}, nil
	case *pb.Family_RadialGaussian:
		c := k.RadialGaussian.GetCenter()
		if len(c) == 0 {
			c = make([]float64, dim)
		}
		return bounds.RadialGaussian{Sigma: k.RadialGaussian.GetSigma(), Center: append([]float64(nil), c...)}, nil
	}
	f1, err := rootFamily1D(path, f)
	if err != nil {
		return nil, err
	}
	return bounds.Separable{Axes: []bounds.Family{f1}}, nil
}

// separableFactors converts a validated family of dimension dim to the
// one-dimensional factors of a separable product, for the calls on
// rectangular grids that work axis by axis (plans and n-D budgets); it also
// returns the family's name. what names the call in the error for a
// family that does not factor.
func separableFactors(f *pb.Family, dim int, what string) ([]bounds.Family, string, error) {
	g, err := familyND("family", f, dim)
	if err != nil {
		return nil, "", err
	}
	fac, ok := g.(bounds.Factored)
	if !ok {
		return nil, "", &bounds.ParamError{Param: "family", Err: bounds.ErrInvalid,
			Reason: what + " on rectangular grids need a separable family (a product of one-dimensional factors)"}
	}
	return fac.Factors(), g.String(), nil
}

// engineGrid converts a validated grid.
func engineGrid(g *pb.Grid) bounds.Grid {
	return bounds.Grid{Step: g.GetStep(), Shift: g.GetShift(), Count: g.GetCount()}
}

func engineConvention(c pb.Convention) bounds.Convention {
	switch c {
	case pb.Convention_CONVENTION_UNITARY:
		return bounds.Unitary
	case pb.Convention_CONVENTION_ORDINARY:
		return bounds.Ordinary
	}
	return bounds.Angular
}

func wireConvention(c bounds.Convention) *pb.ConventionUsed {
	u := &pb.ConventionUsed{Formula: c.Formula(), FrequencyUnit: "radians per length unit"}
	switch c {
	case bounds.Unitary:
		u.Convention = pb.Convention_CONVENTION_UNITARY
	case bounds.Ordinary:
		u.Convention = pb.Convention_CONVENTION_ORDINARY
		u.FrequencyUnit = "cycles per length unit"
	default:
		u.Convention = pb.Convention_CONVENTION_ANGULAR
	}
	return u
}

// angular converts a frequency given in convention c to the float64
// angular frequency the engine is called with: exact for the angular
// conventions, 2πν rounded to nearest for the ordinary one.
func angular(c bounds.Convention, v float64) float64 {
	x := c.ToAngular(v)
	if x.Lo == x.Hi {
		return x.Lo
	}
	return x.Mid()
}

// engineSettings converts validated settings, applying the server's work
// limits: 0 becomes DefaultTerms, values above MaxTerms are lowered.
func (lim Limits) engineSettings(s *pb.Settings) bounds.Settings {
	n := s.GetMaxTerms()
	switch {
	case n == 0:
		n = lim.DefaultTerms
	case n > lim.MaxTerms:
		n = lim.MaxTerms
	}
	side := bounds.AutoSide
	switch s.GetSide() {
	case pb.Side_SIDE_SPATIAL:
		side = bounds.SpatialSide
	case pb.Side_SIDE_SPECTRAL:
		side = bounds.SpectralSide
	}
	return bounds.Settings{Tol: s.GetTol(), MaxTerms: n, Side: side}
}

func wireSide(s bounds.Side) pb.Side {
	switch s {
	case bounds.SpatialSide:
		return pb.Side_SIDE_SPATIAL
	case bounds.SpectralSide:
		return pb.Side_SIDE_SPECTRAL
	}
	return pb.Side_SIDE_UNSPECIFIED
}

// outputs rescales engine results (angular convention) to the request's
// convention in n dimensions.
type outputs struct {
	scale bounds.Interval
}

func newOutputs(c bounds.Convention, n int) outputs {
	return outputs{scale: c.OutputScale(n)}
}

func (o outputs) complex(z bounds.Complex) *pb.ComplexInterval {
	z = z.MulReal(o.scale)
	return &pb.ComplexInterval{
		Re: &pb.Interval{Lo: z.Re.Lo, Hi: z.Re.Hi},
		Im: &pb.Interval{Lo: z.Im.Lo, Hi: z.Im.Hi},
	}
}

// bound rescales an upper bound, rounding up.
func (o outputs) bound(v float64) float64 {
	if v == 0 {
		return 0
	}
	return bounds.Point(v).Mul(o.scale).Hi
}

func (o outputs) method(m bounds.Method, maxTerms int64) *pb.Method {
	return &pb.Method{
		Side:            wireSide(m.Side),
		AliasTerms:      m.AliasTerms,
		TruncationTerms: m.TruncationTerms,
		Remainder:       o.bound(m.Remainder),
		RemainderFrom:   m.RemainderFrom,
		MaxTerms:        maxTerms,
	}
}

func (o outputs) sampledSum(r bounds.SampledSum) *pb.AliasSumResponse {
	return &pb.AliasSumResponse{
		Sampled:    o.complex(r.Sampled),
		Exact:      o.complex(r.Exact),
		Error:      o.complex(r.Error),
		Alias:      o.complex(r.Alias),
		Truncation: o.complex(r.Truncation),
	}
}

// finiteResult reports whether every float of a result is finite; the
// engine promises it, and the server checks before answering.
func finiteResult(vs ...float64) bool {
	for _, v := range vs {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// engineEnvelope converts validated envelope terms.
func engineEnvelope(ts []*pb.EnvelopeTerm) bounds.Envelope {
	env := make(bounds.Envelope, len(ts))
	for i, t := range ts {
		var d bounds.Decay
		switch t.GetDecay() {
		case pb.Decay_DECAY_EXPONENTIAL:
			d = bounds.Exponential
		case pb.Decay_DECAY_GAUSSIAN:
			d = bounds.Gaussian
		case pb.Decay_DECAY_ALGEBRAIC:
			d = bounds.Algebraic
		case pb.Decay_DECAY_COMPACT:
			d = bounds.Compact
		}
		env[i] = bounds.EnvelopeTerm{Decay: d, Amplitude: t.GetAmplitude(), Center: t.GetCenter(),
			Plateau: t.GetPlateau(), Rate: t.GetRate(), Width: t.GetWidth(), Power: t.GetPower()}
	}
	return env
}

// engineBand converts axis i of a validated band given in convention c to
// an angular band that contains it: exact in the angular conventions; in
// the ordinary one a single frequency is 2πν rounded to nearest (as for
// AliasSum) and a band's ends are rounded outward.
func engineBand(c bounds.Convention, b *pb.Band, i int) bounds.Band {
	var center, half float64
	if cs := b.GetCenter(); len(cs) > i {
		center = cs[i]
	}
	if hs := b.GetHalfWidth(); len(hs) > i {
		half = hs[i]
	}
	if half == 0 {
		return bounds.Band{Center: angular(c, center)}
	}
	lo, hi := c.ToAngular(center).Sub(c.ToAngular(half)), c.ToAngular(center).Add(c.ToAngular(half))
	x := bounds.Interval{Lo: lo.Lo, Hi: hi.Hi}
	m := x.Mid()
	return bounds.Band{Center: m, HalfWidth: math.Max(bounds.Point(x.Hi).Sub(bounds.Point(m)).Hi, bounds.Point(m).Sub(bounds.Point(x.Lo)).Hi)}
}

// budget converts an engine budget to the request's convention.
func (o outputs) budget(b bounds.Budget) *pb.ErrorBudget {
	out := &pb.ErrorBudget{
		Aliasing:   o.bound(b.Aliasing),
		Truncation: o.bound(b.Truncation),
		Rounding:   o.bound(b.Rounding),
		Exact:      b.Exact,
		Pieces:     int32(min(b.Pieces, math.MaxInt32)),
	}
	out.Total = o.bound(b.Total)
	// The rescaled parts are rounded up one by one; keep total ≥ their sum.
	if s := bounds.Point(out.Aliasing).Add(bounds.Point(out.Truncation)).Add(bounds.Point(out.Rounding)).Hi; s > out.Total {
		out.Total = s
	}
	return out
}

func wireScanPlan(r scan.Result) *pb.ScanPlan {
	p := &pb.ScanPlan{
		Geometry:     pb.ScanGeometry_SCAN_GEOMETRY_PARALLEL_BEAM,
		Radius:       r.Radius,
		Bandwidth:    r.Bandwidth,
		BandwidthBy:  r.BandwidthBy,
		SourceRadius: r.SourceRadius,
		FanAngle:     r.FanAngle,
		ShortScan:    r.ShortScan,
		Standard:     wireScanLayout(r.Standard),
		Interlaced:   wireScanLayout(r.Interlaced),
		Caution:      r.Caution,
	}
	if r.Geometry == scan.FanBeam {
		p.Geometry = pb.ScanGeometry_SCAN_GEOMETRY_FAN_BEAM
	}
	return p
}

func wireScanVerification(v scan.Verification) *pb.ScanVerification {
	out := &pb.ScanVerification{
		Phantom:          v.Description,
		Level:            v.Level,
		PhantomRadius:    v.Radius,
		PhantomBandwidth: v.Bandwidth,
		ImageSize:        int32(v.Size),
		ImageWidth:       v.Width,
		Window:           v.Window.String(),
		Note:             v.Note,
		Caution:          v.Caution,
	}
	for _, b := range v.Phantom.Blobs {
		out.Blobs = append(out.Blobs, &pb.ScanBlob{X: b.X, Y: b.Y, SigmaU: b.SigmaU, SigmaV: b.SigmaV, Angle: b.Angle, Amplitude: b.Amplitude})
	}
	for _, c := range v.Cases {
		wc := &pb.ScanVerificationCase{
			Label:            c.Label,
			Scheme:           pb.ScanScheme_SCAN_SCHEME_STANDARD,
			Views:            int64(c.Views),
			Detectors:        int64(c.Detectors),
			DetectorSpacing:  c.Spacing,
			DetectorAngle:    c.Angle,
			Oversampling:     int32(c.Oversample),
			RelativeRmsError: c.Error.RelRMS,
			MaxAbsError:      c.Error.MaxAbs,
			Peak:             c.Error.Peak,
			Pixels:           int64(c.Error.Pixels),
			RatioToPlanned:   c.Ratio,
			Seconds:          c.Elapsed.Seconds(),
		}
		if c.Scheme == scan.Interlaced {
			wc.Scheme = pb.ScanScheme_SCAN_SCHEME_INTERLACED
		}
		out.Cases = append(out.Cases, wc)
	}
	return out
}

func wireScanLayout(l scan.Layout) *pb.ScanLayout {
	out := &pb.ScanLayout{
		Scheme:          pb.ScanScheme_SCAN_SCHEME_STANDARD,
		Offered:         l.Offered,
		DetectorSpacing: l.DetectorSpacing,
		DetectorAngle:   l.DetectorAngle,
		Detectors:       int64(l.Detectors),
		Views:           int64(l.Views),
		Arc:             l.Arc,
		ViewStep:        l.ViewStep,
		Samples:         l.Samples,
		Condition:       l.Condition,
		Source:          l.Source,
		Note:            l.Note,
	}
	if l.Scheme == scan.Interlaced {
		out.Scheme = pb.ScanScheme_SCAN_SCHEME_INTERLACED
	}
	return out
}
