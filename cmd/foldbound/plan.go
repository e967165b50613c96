package main

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	pb "foldbound/api/foldbound/v1"
)

func newPlanCmd(stdout, stderr io.Writer) *cobra.Command {
	var (
		call                    callFlags
		subj                    subjectFlags
		set                     settingsFlags
		tol                     float64
		xi, band, spacing       []float64
		fixedShift              []float64
		fftSizes                bool
		perSample, perTransform float64
		sampleUlps              float64
		maxSamples              int64
	)
	cmd := &cobra.Command{
		Use:   "plan",
		Short: "Cheapest grid whose certified error is within a tolerance",
		Long: `plan returns the cheapest grid (step, count, shift per axis) whose certified
error budget (aliasing + truncation + rounding) is within --tol, for the
integral or for a sampled transform over a band, for every shift unless
--fixed-shift is given. The plan is re-verified before it is returned.`,
		Example: `  foldbound plan --family 'gaussian(sigma=0.7)' --tol 1e-12
  foldbound plan --family 'wave-packet(sigma=2, omega0=6)' --tol 1e-9 --xi 6 --band 2 --fft-sizes
  foldbound plan --request plan.json --json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			req := &pb.PlanGridRequest{}
			build := func() error {
				f, env, dim, err := subj.subject()
				if err != nil {
					return err
				}
				if f != nil {
					req.Subject = &pb.PlanGridRequest_Family{Family: f}
				} else {
					req.Subject = &pb.PlanGridRequest_Envelopes{Envelopes: env}
				}
				if !cmd.Flags().Changed("tol") {
					return fmt.Errorf("--tol is required")
				}
				req.Tol = tol
				req.Frequency = &pb.Band{}
				if req.Frequency.Center, err = perAxis("xi", xi, dim); err != nil {
					return err
				}
				if req.Frequency.HalfWidth, err = perAxis("band", band, dim); err != nil {
					return err
				}
				if req.FrequencySpacing, err = perAxis("spacing", spacing, dim); err != nil {
					return err
				}
				if req.Shift, err = perAxis("fixed-shift", fixedShift, dim); err != nil {
					return err
				}
				req.Cost = &pb.CostModel{PerSample: perSample, PerTransform: perTransform}
				if fftSizes {
					req.Cost.Sizes = pb.SizeRule_SIZE_RULE_FFT_FRIENDLY
				}
				req.SampleUlps = sampleUlps
				req.MaxSamples = maxSamples
				if req.Settings, req.Convention, err = set.settings(); err != nil {
					return err
				}
				return nil
			}
			return ask(cmd, &call, stdout, stderr, req, build, (*session).PlanGrid, printPlan)
		},
	}
	fs := cmd.Flags()
	call.register(fs)
	subj.register(fs, true)
	set.register(fs)
	fs.Var(strictFloat{&tol}, "tol", "absolute error tolerance of the total budget (required, > 0)")
	fs.Float64SliceVar(&xi, "xi", nil, "band centre per axis in the convention's unit (default 0: the integral)")
	fs.Float64SliceVar(&band, "band", nil, "band half-width per axis (default 0)")
	fs.Float64SliceVar(&spacing, "spacing", nil, "required frequency spacing of the transform per axis (0: none)")
	fs.Float64SliceVar(&fixedShift, "fixed-shift", nil, "plan for this shift per axis instead of every shift")
	fs.BoolVar(&fftSizes, "fft-sizes", false, "allow only FFT-friendly counts 2^a 3^b 5^c 7^d")
	fs.Float64Var(&perSample, "per-sample", 0, "cost of one sample (0 with --per-transform 0: count samples)")
	fs.Float64Var(&perTransform, "per-transform", 0, "cost per N log2 N of a transform of the samples (0: none)")
	fs.Float64Var(&sampleUlps, "sample-ulps", 0, "error of each sample value in units of 2^-53 (0: correctly rounded)")
	fs.Int64Var(&maxSamples, "max-samples", 0, "largest acceptable total sample count (0: the server's limit)")
	return cmd
}

// strictFloat is a float64 flag that refuses values float64 cannot
// represent: strconv.ParseFloat returns 0 without error for 1e-400, and
// a tolerance must not silently become 0.
type strictFloat struct{ v *float64 }

func (f strictFloat) String() string {
	if f.v == nil {
		return "0"
	}
	return strconv.FormatFloat(*f.v, 'g', -1, 64)
}

func (f strictFloat) Type() string { return "float" }

func (f strictFloat) Set(s string) error {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return err
	}
	mant := strings.ToLower(s)
	if strings.HasPrefix(strings.TrimLeft(mant, "+-"), "0x") {
		mant = mant[strings.Index(mant, "0x")+2:]
		if i := strings.IndexByte(mant, 'p'); i >= 0 {
			mant = mant[:i]
		}
	} else if i := strings.IndexByte(mant, 'e'); i >= 0 {
		mant = mant[:i]
	}
	if v == 0 && strings.ContainsAny(mant, "123456789abcdef") {
		return fmt.Errorf("%s underflows float64 to 0 (the smallest positive float64 is about 4.9e-324)", s)
	}
	if v != 0 && math.Abs(v) < 0x1p-1022 {
		return fmt.Errorf("%s is subnormal in float64; tolerances must be at least 2.2250738585072014e-308", s)
	}
	*f.v = v
	return nil
}
