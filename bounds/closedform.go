package bounds

// Helpers shared by the closed-form families (exponential.go,
// lorentzian.go, sech.go, sechsq.go, wavepacket.go, fejer.go).

// ln2 encloses ln 2 = 0.69314718055994530942….
var ln2 = Log(Point(2))

// cappedExponential returns the envelope term of
//
//	A·min(1, B·e^{-α|x|}) = A·e^{-α·max(0, |x| - ln(B)/α)},  B ≥ 1,
//
// given A rounded up, lnB ≥ ln B and α rounded down: the plateau ln(B)/α is
// rounded up, so the term stays an upper bound.
func cappedExponential(A, lnB, alpha float64) EnvelopeTerm {
	return EnvelopeTerm{Decay: Exponential, Amplitude: A, Rate: alpha, Plateau: divUp(lnB, alpha)}
}

// divPos returns x/w for a float64 w > 0, increasing in x: two divisions
// instead of the eight of Interval.Div.
func divPos(x Interval, w float64) Interval {
	return Interval{divDown(x.Lo, w), divUp(x.Hi, w)}
}

// checkEnvelopeRange reports a family whose parameter v, though in its
// mathematical domain, is so large or so small that one of its envelopes
// leaves the float64 range (an amplitude overflows, a rate or width
// underflows to 0). The error is a *ParamError naming param.
func checkEnvelopeRange(f Family, param string, v float64) error {
	if !envelopesInRange(f) {
		return invalidf(param, "%g is out of range: an envelope of the family leaves the float64 range", v)
	}
	return nil
}

// envelopeInRange reports whether Envelope.Validate would accept e, without
// formatting the parameter paths it would need for a message (Validate runs
// on every AliasSum call).
func envelopeInRange(e Envelope) bool {
	pos := func(v float64) bool { return finite(v) && v > 0 }
	for _, t := range e {
		if !finite(t.Amplitude) || t.Amplitude < 0 || !finite(t.Center) || !finite(t.Plateau) || t.Plateau < 0 {
			return false
		}
		switch t.Decay {
		case Exponential:
			if !pos(t.Rate) {
				return false
			}
		case Gaussian:
			if !pos(t.Width) {
				return false
			}
		case Algebraic:
			if !pos(t.Width) || !pos(t.Power) {
				return false
			}
		case Compact:
			if !finite(t.Width) || t.Width < 0 {
				return false
			}
		default:
			return false
		}
	}
	return true
}
