package main

import (
	"strings"
	"testing"

	"google.golang.org/protobuf/encoding/protojson"
)

func TestParseFamily(t *testing.T) {
	tests := []struct {
		give string
		want string // protojson of the family, compact
	}{
		{"gaussian(sigma=0.7)", `{"gaussian":{"sigma":0.7}}`},
		{" shift( by = 0.25 , wave-packet(sigma=2, omega0=6) ) ", `{"shift":{"by":0.25,"of":{"wavePacket":{"sigma":2,"omega0":6}}}}`},
		{"sum(gaussian(sigma=1), scale(re=0.5, lorentzian(a=2)))", `{"sum":{"terms":[{"gaussian":{"sigma":1}},{"amplitude":{"factor":{"re":0.5},"of":{"lorentzian":{"a":2}}}}]}}`},
		{"separable(gaussian(sigma=1), sech(w=2))", `{"separable":{"factors":[{"gaussian":{"sigma":1}},{"sech":{"w":2}}]}}`},
		{"bspline(order=4)", `{"bSpline":{"order":4}}`},
		{"radial-gaussian(dim=3, sigma=1.5)", `{"radialGaussian":{"dim":3,"sigma":1.5}}`},
	}
	for _, tt := range tests {
		f, err := parseFamily(tt.give)
		if err != nil {
			t.Errorf("parseFamily(%q): %v", tt.give, err)
			continue
		}
		b, _ := protojson.Marshal(f)
		got := strings.ReplaceAll(string(b), " ", "")
		if got != tt.want {
			t.Errorf("parseFamily(%q) = %s, want %s", tt.give, got, tt.want)
		}
	}
}

func TestParseFamilyErrors(t *testing.T) {
	tests := []struct{ give, want string }{
		{"gaussian", "needs sigma="},
		{"gaussian(sigma=1, width=2)", `no parameter "width"`},
		{"gaussian(sigma=x)", "sigma"},
		{"shift(by=1)", "takes 1 inner function"},
		{"gaussian(sigma=1", "expected ',' or ')'"},
		{"bspline(order=2.5)", "integer"},
		{"wobble(q=1)", "unknown function"},
	}
	for _, tt := range tests {
		_, err := parseFamily(tt.give)
		if err == nil || !strings.Contains(err.Error(), tt.want) {
			t.Errorf("parseFamily(%q) = %v, want an error containing %q", tt.give, err, tt.want)
		}
	}
}

func TestParseEnvelope(t *testing.T) {
	terms, err := parseEnvelope([]string{"exponential(amplitude=2, rate=3)", "compact(width=6.5, center=1)"})
	if err != nil {
		t.Fatal(err)
	}
	if len(terms) != 2 || terms[0].GetRate() != 3 || terms[0].GetAmplitude() != 2 || terms[1].GetWidth() != 6.5 || terms[1].GetAmplitude() != 1 || terms[1].GetCenter() != 1 {
		t.Errorf("parseEnvelope = %v", terms)
	}
	if _, err := parseEnvelope([]string{"gaussian(rate=1)"}); err == nil {
		t.Error("gaussian(rate=1): want an error")
	}
}
