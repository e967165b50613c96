package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestRun runs the bench on two tolerances and checks the table's stable
// column names and summary lines, and that no plan is over its tolerance.
func TestRun(t *testing.T) {
	var out bytes.Buffer
	if err := run([]string{"-tols", "1e-3,1e-8", "-reps", "1", "-base-max", "65536"}, &out); err != nil {
		t.Fatal(err)
	}
	s := out.String()
	for _, want := range []string{"plan_n", "plan_cert", "base_samples", "base_ok", "ratio", "gaussian(1)", "lorentzian(1)",
		"plans over tol (certificate or observed error): 0 of"} {
		if !strings.Contains(s, want) {
			t.Errorf("output lacks %q:\n%s", want, s)
		}
	}
}
