package main

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"google.golang.org/protobuf/encoding/protojson"

	pb "foldbound/api/foldbound/v1"
)

// binary is the foldbound command, built once by TestMain.
var binary string

func TestMain(m *testing.M) {
	dir, err := os.MkdirTemp("", "foldbound-cli")
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	binary = filepath.Join(dir, "foldbound")
	out, err := exec.Command("go", "build", "-o", binary, ".").CombinedOutput()
	if err != nil {
		fmt.Fprintf(os.Stderr, "go build: %v\n%s", err, out)
		os.RemoveAll(dir)
		os.Exit(1)
	}
	code := m.Run()
	os.RemoveAll(dir)
	os.Exit(code)
}

// runCLI runs the binary with args and returns stdout, stderr and the exit
// code.
func runCLI(t *testing.T, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, binary, args...)
	cmd.Env = append(os.Environ(), "FOLDBOUND_ADDR=")
	var o, e bytes.Buffer
	cmd.Stdout, cmd.Stderr = &o, &e
	err := cmd.Run()
	if ee, ok := err.(*exec.ExitError); ok {
		return o.String(), e.String(), ee.ExitCode()
	} else if err != nil {
		t.Fatalf("%v: %v", args, err)
	}
	return o.String(), e.String(), 0
}

// sqrt2Pi is √(2π) to 21 digits (OEIS A019727).
const sqrt2Pi = 2.50662827463100050242

func TestAliasCommand(t *testing.T) {
	args := []string{"alias", "--family", "gaussian(sigma=1)", "--step", "1"}
	out, errOut, code := runCLI(t, args...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{"alias sum   gaussian(sigma=1)", "sampled sum T", "exact F", "  aliasing", "angular convention", "method: spectral side"} {
		if !strings.Contains(out, want) {
			t.Errorf("human output lacks %q:\n%s", want, out)
		}
	}
	out, errOut, code = runCLI(t, append(args, "--json")...)
	if code != 0 {
		t.Fatalf("--json: exit %d: %s", code, errOut)
	}
	var res pb.AliasSumResponse
	if err := protojson.Unmarshal([]byte(out), &res); err != nil {
		t.Fatalf("--json output is not an AliasSumResponse: %v\n%s", err, out)
	}
	if re := res.GetExact().GetRe(); re.GetLo() > sqrt2Pi || re.GetHi() < sqrt2Pi-1e-15 {
		t.Errorf("exact = %v, want it to contain √(2π) = %.17g", re, sqrt2Pi)
	}
}

func TestAliasFromRequestFile(t *testing.T) {
	dir := t.TempDir()
	req := filepath.Join(dir, "req.json")
	js := `{"family": {"gaussian": {"sigma": 1}}, "grids": [{"step": 0.5, "count": 41}], "xi": [0.25], "convention": "CONVENTION_ORDINARY"}`
	if err := os.WriteFile(req, []byte(js), 0o600); err != nil {
		t.Fatal(err)
	}
	out, errOut, code := runCLI(t, "alias", "--request", req, "--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var res pb.AliasSumResponse
	if err := protojson.Unmarshal([]byte(out), &res); err != nil {
		t.Fatal(err)
	}
	// Ordinary convention: F(ν) = √(2π) exp(-(2πν)²/2) (math.md, Conventions).
	want := sqrt2Pi * math.Exp(-math.Pow(2*math.Pi*0.25, 2)/2)
	if re := res.GetExact().GetRe(); math.Abs((re.GetLo()+re.GetHi())/2-want) > 1e-15 {
		t.Errorf("exact = %v, want %.17g", re, want)
	}
	if res.GetConvention().GetConvention() != pb.Convention_CONVENTION_ORDINARY {
		t.Errorf("convention = %v, want ordinary", res.GetConvention().GetConvention())
	}
	if _, errOut, code := runCLI(t, "alias", "--request", req, "--step", "1"); code == 0 || !strings.Contains(errOut, "drop --step") {
		t.Errorf("--request with --step: exit %d, %q; want a refusal", code, errOut)
	}
}

func TestBudgetCommand(t *testing.T) {
	args := []string{"budget", "--spatial", "algebraic(width=1, power=2)", "--spectral", "exponential(amplitude=3.141592653589793, rate=1)", "--step", "1"}
	out, errOut, code := runCLI(t, args...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{"error budget", "aliasing", "truncation", "rounding", "total", "envelope bounds"} {
		if !strings.Contains(out, want) {
			t.Errorf("human output lacks %q:\n%s", want, out)
		}
	}
	out, errOut, code = runCLI(t, append(args, "--json")...)
	if code != 0 {
		t.Fatalf("--json: exit %d: %s", code, errOut)
	}
	var res pb.ErrorBudgetResponse
	if err := protojson.Unmarshal([]byte(out), &res); err != nil {
		t.Fatal(err)
	}
	// Lorentzian envelope on the unit grid: the bound equals 2π/(e^{2π}-1)
	// (Trefethen & Weideman 2014, Thm 5.1, from memory; geometric series).
	want := 2 * math.Pi / math.Expm1(2*math.Pi)
	if got := res.GetBudget().GetAliasing(); got < want || got > want*(1+1e-12) {
		t.Errorf("aliasing = %.17g, want %.17g (tight)", got, want)
	}
}

func TestPlanCommand(t *testing.T) {
	out, errOut, code := runCLI(t, "plan", "--family", "gaussian(sigma=0.7)", "--tol", "1e-12")
	if code != 0 {
		t.Fatalf("plan: exit %d: %s", code, errOut)
	}
	for _, want := range []string{"certified bound", "aliasing", "truncation", "rounding", "verified"} {
		if !strings.Contains(out, want) {
			t.Errorf("plan output lacks %q:\n%s", want, out)
		}
	}
	out, errOut, code = runCLI(t, "plan", "--family", "gaussian(sigma=0.7)", "--tol", "1e-12", "--json")
	if code != 0 {
		t.Fatalf("plan --json: exit %d: %s", code, errOut)
	}
	var res pb.PlanGridResponse
	if err := protojson.Unmarshal([]byte(out), &res); err != nil {
		t.Fatal(err)
	}
	// The planned grid's float64 trapezoidal sum of exp(-x²/(2·0.49)) is
	// within the tolerance of 0.7·√(2π) (the Gaussian integral, DLMF 7.7.6
	// by substitution, from memory), at the planned shift and half a step off.
	g := res.GetAxes()[0].GetGrid()
	for _, frac := range []float64{0, 0.5} {
		n := g.GetCount()
		var s float64
		for k := -((n - 1) / 2); k <= n/2; k++ {
			x := g.GetShift() + frac*g.GetStep() + g.GetStep()*float64(k)
			s += math.Exp(-x * x / (2 * 0.49))
		}
		if err := math.Abs(g.GetStep()*s - 0.7*math.Sqrt(2*math.Pi)); err > 1e-12 {
			t.Errorf("planned grid %v shifted %g steps: error %g > 1e-12", g, frac, err)
		}
	}
	_, errOut, code = runCLI(t, "plan", "--family", "gaussian(sigma=0.7)", "--tol", "1e-300")
	if code == 0 || !strings.Contains(errOut, "OutOfRange") {
		t.Errorf("plan --tol 1e-300: exit %d, %q; want OutOfRange", code, errOut)
	}
}

func TestScanCommand(t *testing.T) {
	out, errOut, code := runCLI(t, "scan", "--radius", "20", "--resolution", "0.25")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{"CAUTION: ", "not a scan protocol", "standard", "interlaced", "line integrals"} {
		if !strings.Contains(out, want) {
			t.Errorf("human output lacks %q:\n%s", want, out)
		}
	}
	out, errOut, code = runCLI(t, "scan", "--geometry", "fan", "--radius", "250", "--bandwidth", "6.283185307179586", "--source-radius", "570", "--json")
	if code != 0 {
		t.Fatalf("--json: exit %d: %s", code, errOut)
	}
	var res pb.PlanScanResponse
	if err := protojson.Unmarshal([]byte(out), &res); err != nil {
		t.Fatal(err)
	}
	// Fan angle 2·arcsin(ρ/R) (elementary geometry).
	if got, want := res.GetPlan().GetFanAngle(), 2*math.Asin(250.0/570); math.Abs(got-want) > 1e-15 {
		t.Errorf("fan angle = %g, want %g", got, want)
	}
	if !strings.Contains(res.GetPlan().GetCaution(), "licensed practice") {
		t.Errorf("--json output lacks the caution: %v", res.GetPlan().GetCaution())
	}
}

// TestScanVerify runs the reconstruction check from the command line:
// the planned layout must reconstruct better than the same layout with half
// the views or twice the detector spacing (the sampling conditions of
// Natterer, Acta Numerica 8 (1999) §2, text re-read).
func TestScanVerify(t *testing.T) {
	out, errOut, code := runCLI(t, "scan", "--radius", "20", "--resolution", "0.5", "--verify", "--image-size", "64")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{"reconstruction check", "planned", "half the views", "twice the detector spacing", "relative RMS error", "not a scan protocol"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
	out, errOut, code = runCLI(t, "scan", "--radius", "20", "--resolution", "0.5", "--verify", "--image-size", "64", "--json")
	if code != 0 {
		t.Fatalf("--json: exit %d: %s", code, errOut)
	}
	var res pb.PlanScanResponse
	if err := protojson.Unmarshal([]byte(out), &res); err != nil {
		t.Fatal(err)
	}
	cases := res.GetVerification().GetCases()
	if len(cases) < 3 || cases[0].GetLabel() != "planned" {
		t.Fatalf("verification cases = %v; want planned first and two undersampled", cases)
	}
	for _, c := range cases[1:3] {
		if c.GetRelativeRmsError() <= 2*cases[0].GetRelativeRmsError() {
			t.Errorf("%s: relative RMS error %g, want above twice the planned %g", c.GetLabel(), c.GetRelativeRmsError(), cases[0].GetRelativeRmsError())
		}
	}
	for _, tt := range []struct {
		args []string
		want string
	}{
		{[]string{"--image-size", "64"}, "--image-size needs --verify"},
		{[]string{"--verify", "--image-size", "4096"}, "ResourceExhausted"},
		{[]string{"--verify", "--image-size", "8"}, "InvalidArgument"},
	} {
		args := append([]string{"scan", "--radius", "20", "--resolution", "0.5"}, tt.args...)
		_, errOut, code := runCLI(t, args...)
		if code == 0 || !strings.Contains(errOut, tt.want) {
			t.Errorf("scan %v: exit %d, %q; want an error with %q", tt.args, code, errOut, tt.want)
		}
	}
}

func TestLatticeCommands(t *testing.T) {
	out, errOut, code := runCLI(t, "lattice", "sum", "--family", "radial-gaussian(dim=2, sigma=1)", "--lattice", "hexagonal", "--scale", "1.6")
	if code != 0 {
		t.Fatalf("lattice sum: exit %d: %s", code, errOut)
	}
	for _, want := range []string{"lattice sum T", "alias sum T - F", "hexagonal, 2-D"} {
		if !strings.Contains(out, want) {
			t.Errorf("lattice sum output lacks %q:\n%s", want, out)
		}
	}
	out, errOut, code = runCLI(t, "lattice", "sum", "--family", "radial-gaussian(dim=2, sigma=1)", "--generator", "1,0; 0,1", "--json")
	if code != 0 {
		t.Fatalf("lattice sum --json: exit %d: %s", code, errOut)
	}
	var sum pb.LatticeAliasSumResponse
	if err := protojson.Unmarshal([]byte(out), &sum); err != nil {
		t.Fatal(err)
	}
	// On Z² the sum of exp(-|x|²/2) is the square of the 1-D sum (Fubini),
	// whose alias error is 2√(2π) Σ_{l≥1} e^{-2π²l²} (DLMF §20.7(viii), from
	// memory).
	oneD := sqrt2Pi * (1 + 2*math.Exp(-2*math.Pi*math.Pi))
	if re := sum.GetSampled().GetRe(); math.Abs((re.GetLo()+re.GetHi())/2-oneD*oneD) > 1e-13 {
		t.Errorf("sampled = %v, want %.17g", re, oneD*oneD)
	}

	args := []string{"lattice", "compare", "--dim", "2", "--spectral", "compact(width=3.141592653589793)", "--whole-band", "--tol", "1e-9"}
	out, errOut, code = runCLI(t, args...)
	if code != 0 {
		t.Fatalf("lattice compare: exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "hexagonal") || !strings.Contains(out, "13.40%") {
		t.Errorf("lattice compare output lacks the hexagonal saving of 13.40%% (Petersen & Middleton 1962, from memory):\n%s", out)
	}
	out, errOut, code = runCLI(t, append(args, "--json")...)
	if code != 0 {
		t.Fatalf("lattice compare --json: exit %d: %s", code, errOut)
	}
	var cmp pb.CompareLatticesResponse
	if err := protojson.Unmarshal([]byte(out), &cmp); err != nil {
		t.Fatal(err)
	}
	if got := cmp.GetPlans()[0].GetSaving(); math.Abs(got-(1-math.Sqrt(3)/2)) > 0.005 {
		t.Errorf("best saving = %g, want 1 - √3/2", got)
	}
}

func TestKernelCommand(t *testing.T) {
	out, errOut, code := runCLI(t, "kernel", "--modes", "128", "--tol", "1e-9", "--verify", "300")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{"gridding kernels for 128 modes", "kaiser-bessel", "recommended", "verification on 300 random points"} {
		if !strings.Contains(out, want) {
			t.Errorf("human output lacks %q:\n%s", want, out)
		}
	}
	out, errOut, code = runCLI(t, "kernel", "--modes", "128", "--tol", "1e-6", "--shape", "gaussian", "--json")
	if code != 0 {
		t.Fatalf("--json: exit %d: %s", code, errOut)
	}
	var res pb.PlanKernelResponse
	if err := protojson.Unmarshal([]byte(out), &res); err != nil {
		t.Fatal(err)
	}
	if len(res.GetOptions()) == 0 || res.GetOptions()[0].GetTotal() > 1e-6 {
		t.Errorf("options %v: want at least one within 1e-6", res.GetOptions())
	}
}

func TestBadInputFromTheCommandLine(t *testing.T) {
	tests := []struct {
		name string
		args []string
		want string
	}{
		{"tolerance below float64", []string{"plan", "--family", "gaussian(sigma=1)", "--tol", "1e-400"}, `"1e-400" for "--tol" flag: 1e-400 underflows float64 to 0`},
		{"tolerance zero", []string{"plan", "--family", "gaussian(sigma=1)", "--tol", "0"}, "InvalidArgument desc = tol: must be > 0"},
		{"negative width", []string{"alias", "--family", "gaussian(sigma=-1)", "--step", "1"}, "InvalidArgument desc = family.gaussian.sigma"},
		{"unknown function", []string{"alias", "--family", "gausian(sigma=1)", "--step", "1"}, `unknown function "gausian"`},
		{"missing step", []string{"alias", "--family", "gaussian(sigma=1)"}, "--step is required"},
		{"count over the limit", []string{"alias", "--family", "gaussian(sigma=1)", "--step", "1e-9", "--count", "1000000000000000"}, "ResourceExhausted desc = grids[0].count"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, errOut, code := runCLI(t, tt.args...)
			if code != 1 || !strings.Contains(errOut, tt.want) {
				t.Errorf("exit %d, stderr %q; want exit 1 and %q", code, errOut, tt.want)
			}
		})
	}
}

func TestBatchCommand(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "jobs.ndjson")
	lines := `{"id": "a", "aliasSum": {"family": {"gaussian": {"sigma": 1}}, "grids": [{"step": 1}]}}
{"errorBudget": {"family": {"gaussian": {"sigma": 1}}, "grids": [{"step": 1, "count": 21}], "worstCaseShift": true}}
{"id": "c", "aliasSum": {"family": {"gaussian": {"sigma": -1}}, "grids": [{"step": 1}]}}
`
	if err := os.WriteFile(file, []byte(lines), 0o600); err != nil {
		t.Fatal(err)
	}
	out, errOut, code := runCLI(t, "batch", "--request", file)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{"a   alias sum of gaussian(sigma=1)", "2   budget: total", "c   error InvalidArgument: family.gaussian.sigma"} {
		if !strings.Contains(out, want) {
			t.Errorf("human output lacks %q:\n%s", want, out)
		}
	}
	out, errOut, code = runCLI(t, "batch", "--request", file, "--json")
	if code != 0 {
		t.Fatalf("--json: exit %d: %s", code, errOut)
	}
	var ids []string
	sc := bufio.NewScanner(strings.NewReader(out))
	for sc.Scan() {
		var r pb.BatchResponse
		if err := protojson.Unmarshal(sc.Bytes(), &r); err != nil {
			t.Fatalf("line %q: %v", sc.Text(), err)
		}
		ids = append(ids, r.GetId())
	}
	if strings.Join(ids, ",") != "a,2,c" {
		t.Errorf("ids in output order = %v, want a,2,c", ids)
	}
}

func TestDemoCommand(t *testing.T) {
	out, errOut, code := runCLI(t, "demo")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{"Tarnwick", "halving habit", "certified plan", "FFT-friendly", "NOT within tolerance", "within tolerance"} {
		if !strings.Contains(out, want) {
			t.Errorf("demo output lacks %q", want)
		}
	}
}

// TestServeCommand starts `foldbound serve` on a free port, calls it with
// --addr, and stops it with SIGTERM.
func TestServeCommand(t *testing.T) {
	ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, binary, "serve", "--listen", "127.0.0.1:0", "--log-level", "debug")
	stderr, err := cmd.StderrPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	lines := bufio.NewScanner(stderr)
	var addr string
	for addr == "" && lines.Scan() {
		var ev struct {
			Message string `json:"message"`
			Addr    string `json:"addr"`
		}
		if json.Unmarshal(lines.Bytes(), &ev) == nil && ev.Message == "serving" {
			addr = ev.Addr
		}
	}
	if addr == "" {
		_ = cmd.Process.Kill()
		_ = cmd.Wait()
		t.Fatal("serve did not log its address")
	}
	var rest bytes.Buffer
	copied := make(chan struct{})
	go func() {
		defer close(copied)
		for lines.Scan() {
			rest.Write(lines.Bytes())
			rest.WriteByte('\n')
		}
	}()

	out, errOut, code := runCLI(t, "alias", "--addr", addr, "--family", "gaussian(sigma=1)", "--step", "0.5", "--count", "21")
	if code != 0 || !strings.Contains(out, "sampled sum T") {
		t.Errorf("alias --addr: exit %d, %s%s", code, out, errOut)
	}
	if err := cmd.Process.Signal(syscall.SIGTERM); err != nil {
		t.Fatal(err)
	}
	if err := cmd.Wait(); err != nil {
		t.Errorf("serve after SIGTERM: %v", err)
	}
	<-copied
	log := rest.String()
	for _, want := range []string{`"method":"/foldbound.v1.SamplingService/AliasSum"`, `"code":"OK"`, `"request_id":`, `"message":"stopped gracefully"`} {
		if !strings.Contains(log, want) {
			t.Errorf("serve log lacks %s:\n%s", want, log)
		}
	}
}
