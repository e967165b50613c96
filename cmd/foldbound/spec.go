package main

import (
	"fmt"
	"strconv"
	"strings"
	"unicode"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
)

// This file parses the compact function and envelope notation of the
// command line:
//
//	gaussian(sigma=0.7)
//	shift(by=0.25, wave-packet(sigma=2, omega0=6))
//	sum(gaussian(sigma=1), scale(re=0.5, lorentzian(a=2)))
//	separable(gaussian(sigma=1), sech(w=2))
//	exponential(amplitude=3.1416, rate=1)      (an envelope term)

// node is a parsed spec: name(key=value, …, sub, …).
type node struct {
	name string
	keys []string
	vals map[string]float64
	subs []*node
}

type specParser struct {
	s   string
	pos int
}

func parseSpec(s string) (*node, error) {
	p := &specParser{s: s}
	n, err := p.node()
	if err != nil {
		return nil, err
	}
	p.space()
	if p.pos != len(p.s) {
		return nil, p.errorf("unexpected %q", p.s[p.pos:])
	}
	return n, nil
}

func (p *specParser) errorf(format string, args ...any) error {
	return fmt.Errorf("spec %q at offset %d: %s", p.s, p.pos, fmt.Sprintf(format, args...))
}

func (p *specParser) space() {
	for p.pos < len(p.s) && unicode.IsSpace(rune(p.s[p.pos])) {
		p.pos++
	}
}

func (p *specParser) ident() string {
	p.space()
	start := p.pos
	for p.pos < len(p.s) {
		c := rune(p.s[p.pos])
		if unicode.IsLetter(c) || unicode.IsDigit(c) || c == '-' || c == '_' {
			p.pos++
			continue
		}
		break
	}
	return strings.ToLower(p.s[start:p.pos])
}

func (p *specParser) peek(c byte) bool {
	p.space()
	return p.pos < len(p.s) && p.s[p.pos] == c
}

func (p *specParser) node() (*node, error) {
	name := p.ident()
	if name == "" {
		return nil, p.errorf("expected a name")
	}
	n := &node{name: name, vals: map[string]float64{}}
	if !p.peek('(') {
		return n, nil
	}
	p.pos++
	if p.peek(')') {
		p.pos++
		return n, nil
	}
	for {
		save := p.pos
		id := p.ident()
		if p.peek('=') {
			p.pos++
			p.space()
			start := p.pos
			for p.pos < len(p.s) && !strings.ContainsRune(",)", rune(p.s[p.pos])) && !unicode.IsSpace(rune(p.s[p.pos])) {
				p.pos++
			}
			v, err := strconv.ParseFloat(p.s[start:p.pos], 64)
			if err != nil {
				return nil, p.errorf("%s: %v", id, err)
			}
			if _, dup := n.vals[id]; dup {
				return nil, p.errorf("%s given twice", id)
			}
			n.keys = append(n.keys, id)
			n.vals[id] = v
		} else {
			p.pos = save
			sub, err := p.node()
			if err != nil {
				return nil, err
			}
			n.subs = append(n.subs, sub)
		}
		switch {
		case p.peek(','):
			p.pos++
		case p.peek(')'):
			p.pos++
			return n, nil
		default:
			return nil, p.errorf("expected ',' or ')'")
		}
	}
}

// params checks n's keys against the allowed ones, fills defaults, and
// returns the values in the order of names.
func (n *node) params(subs int, names []string, defaults map[string]float64) ([]float64, error) {
	if subs >= 0 && len(n.subs) != subs {
		return nil, fmt.Errorf("%s takes %d inner function(s), got %d", n.name, subs, len(n.subs))
	}
	out := make([]float64, len(names))
	for _, k := range n.keys {
		found := false
		for _, name := range names {
			found = found || name == k
		}
		if !found {
			return nil, fmt.Errorf("%s has no parameter %q (it takes %s)", n.name, k, strings.Join(names, ", "))
		}
	}
	for i, name := range names {
		v, ok := n.vals[name]
		if !ok {
			if v, ok = defaults[name]; !ok {
				return nil, fmt.Errorf("%s needs %s=", n.name, name)
			}
		}
		out[i] = v
	}
	return out, nil
}

// familyNames lists the function names the notation knows, for help text.
const familyNames = `gaussian(sigma), two-sided-exponential(a), lorentzian(a), sech(w), sech2(w),
wave-packet(sigma, omega0), fejer(omega), bspline(order), kaiser-bessel(width, beta);
scale(re, im, F), shift(by, F), dilate(factor, F), modulate(omega0, F), sum(F, …);
separable(F1, …, Fn), radial-gaussian(dim, sigma)`

// family converts a parsed spec to a Family message. Values are passed
// through as given; the server checks them.
func (n *node) family() (*pb.Family, error) {
	one := func(names ...string) ([]float64, error) { return n.params(0, names, nil) }
	sub := func() (*pb.Family, error) { return n.subs[0].family() }
	var (
		v   []float64
		err error
	)
	switch n.name {
	case "gaussian":
		if v, err = one("sigma"); err == nil {
			return client.Gaussian(v[0]), nil
		}
	case "two-sided-exponential", "exponential":
		if v, err = one("a"); err == nil {
			return client.TwoSidedExponential(v[0]), nil
		}
	case "lorentzian":
		if v, err = one("a"); err == nil {
			return client.Lorentzian(v[0]), nil
		}
	case "sech":
		if v, err = one("w"); err == nil {
			return client.Sech(v[0]), nil
		}
	case "sech2", "sech-squared":
		if v, err = one("w"); err == nil {
			return client.SechSquared(v[0]), nil
		}
	case "wave-packet":
		if v, err = one("sigma", "omega0"); err == nil {
			return client.WavePacket(v[0], v[1]), nil
		}
	case "fejer":
		if v, err = one("omega"); err == nil {
			return client.Fejer(v[0]), nil
		}
	case "bspline", "b-spline":
		if v, err = one("order"); err == nil {
			if v[0] != float64(int32(v[0])) {
				return nil, fmt.Errorf("bspline: order must be an integer, got %g", v[0])
			}
			return client.BSpline(int32(v[0])), nil
		}
	case "kaiser-bessel":
		if v, err = one("width", "beta"); err == nil {
			return client.KaiserBessel(v[0], v[1]), nil
		}
	case "scale":
		if v, err = n.params(1, []string{"re", "im"}, map[string]float64{"im": 0}); err == nil {
			f, err := sub()
			return client.Scaled(complex(v[0], v[1]), f), err
		}
	case "shift":
		if v, err = n.params(1, []string{"by"}, nil); err == nil {
			f, err := sub()
			return client.Shifted(f, v[0]), err
		}
	case "dilate":
		if v, err = n.params(1, []string{"factor"}, nil); err == nil {
			f, err := sub()
			return client.Dilated(f, v[0]), err
		}
	case "modulate":
		if v, err = n.params(1, []string{"omega0"}, nil); err == nil {
			f, err := sub()
			return client.Modulated(f, v[0]), err
		}
	case "sum", "separable":
		if _, err = n.params(-1, nil, nil); err != nil {
			return nil, err
		}
		fs := make([]*pb.Family, len(n.subs))
		for i, s := range n.subs {
			if fs[i], err = s.family(); err != nil {
				return nil, err
			}
		}
		if n.name == "sum" {
			return client.Sum(fs...), nil
		}
		return client.Separable(fs...), nil
	case "radial-gaussian":
		if v, err = one("dim", "sigma"); err == nil {
			if v[0] != float64(int32(v[0])) {
				return nil, fmt.Errorf("radial-gaussian: dim must be an integer, got %g", v[0])
			}
			return client.RadialGaussian(int32(v[0]), v[1]), nil
		}
	default:
		return nil, fmt.Errorf("unknown function %q; known: %s", n.name, familyNames)
	}
	return nil, err
}

// envelopeNames lists the envelope terms the notation knows.
const envelopeNames = `exponential(amplitude, rate), gaussian(amplitude, width),
algebraic(amplitude, width, power), compact(amplitude, width); each also takes
center= and plateau= (default 0); amplitude defaults to 1`

// envelopeTerm converts a parsed spec to an envelope term.
func (n *node) envelopeTerm() (*pb.EnvelopeTerm, error) {
	def := map[string]float64{"amplitude": 1, "center": 0, "plateau": 0}
	t := &pb.EnvelopeTerm{}
	var (
		v   []float64
		err error
	)
	switch n.name {
	case "exponential":
		t.Decay = pb.Decay_DECAY_EXPONENTIAL
		if v, err = n.params(0, []string{"amplitude", "center", "plateau", "rate"}, def); err == nil {
			t.Rate = v[3]
		}
	case "gaussian":
		t.Decay = pb.Decay_DECAY_GAUSSIAN
		if v, err = n.params(0, []string{"amplitude", "center", "plateau", "width"}, def); err == nil {
			t.Width = v[3]
		}
	case "algebraic":
		t.Decay = pb.Decay_DECAY_ALGEBRAIC
		if v, err = n.params(0, []string{"amplitude", "center", "plateau", "width", "power"}, def); err == nil {
			t.Width, t.Power = v[3], v[4]
		}
	case "compact":
		t.Decay = pb.Decay_DECAY_COMPACT
		if v, err = n.params(0, []string{"amplitude", "center", "plateau", "width"}, def); err == nil {
			t.Width = v[3]
		}
	default:
		return nil, fmt.Errorf("unknown envelope term %q; known: %s", n.name, envelopeNames)
	}
	if err != nil {
		return nil, err
	}
	t.Amplitude, t.Center, t.Plateau = v[0], v[1], v[2]
	return t, nil
}

func parseFamily(s string) (*pb.Family, error) {
	n, err := parseSpec(s)
	if err != nil {
		return nil, err
	}
	return n.family()
}

func parseEnvelope(specs []string) ([]*pb.EnvelopeTerm, error) {
	var out []*pb.EnvelopeTerm
	for _, s := range specs {
		n, err := parseSpec(s)
		if err != nil {
			return nil, err
		}
		t, err := n.envelopeTerm()
		if err != nil {
			return nil, err
		}
		out = append(out, t)
	}
	return out, nil
}
