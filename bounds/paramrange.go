package bounds

// checkEnvelopeRange reports a family whose parameter v, though in its
// mathematical domain, is so large or so small that one of its envelopes
// leaves the float64 range (an amplitude overflows, a rate or width
// underflows to 0). The error is a *ParamError naming param.
func checkEnvelopeRange(f Family, param string, v float64) error {
	if f.Spatial().Validate("spatial") != nil || f.Spectral().Validate("spectral") != nil {
		return invalidf(param, "%g is out of range: an envelope of the family leaves the float64 range", v)
	}
	return nil
}
