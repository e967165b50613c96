package main

import (
	"io"

	"github.com/spf13/cobra"

	pb "foldbound/api/foldbound/v1"
)

func newBudgetCmd(stdout, stderr io.Writer) *cobra.Command {
	var (
		call       callFlags
		subj       subjectFlags
		grid       gridFlags
		set        settingsFlags
		xi, band   []float64
		anyShift   bool
		sampleUlps float64
	)
	cmd := &cobra.Command{
		Use:   "budget",
		Short: "Certified error budget of a grid: aliasing + truncation + rounding",
		Long: `budget bounds the error of a given grid, itemised into aliasing, truncation
and floating-point rounding, for a function with a closed-form transform
(--family) or one known only by its decay (--spatial, --spectral envelope
terms), at one frequency or as a certified supremum over a band
|xi - center| ≤ half-width, for the grid's shift or for every shift.`,
		Example: `  foldbound budget --family 'gaussian(sigma=0.7)' --step 0.5 --count 13 --any-shift
  foldbound budget --spatial 'algebraic(width=1, power=2)' --spectral 'exponential(amplitude=3.1416, rate=1)' --step 1
  foldbound budget --family 'gaussian(sigma=2)' --step 0.25 --count 64 --xi 3 --band 1.5 --json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			req := &pb.ErrorBudgetRequest{}
			build := func() error {
				f, env, dim, err := subj.subject()
				if err != nil {
					return err
				}
				if f != nil {
					req.Subject = &pb.ErrorBudgetRequest_Family{Family: f}
				} else {
					req.Subject = &pb.ErrorBudgetRequest_Envelopes{Envelopes: env}
				}
				if req.Grids, err = grid.grids(dim); err != nil {
					return err
				}
				req.Frequency = &pb.Band{}
				if req.Frequency.Center, err = perAxis("xi", xi, dim); err != nil {
					return err
				}
				if req.Frequency.HalfWidth, err = perAxis("band", band, dim); err != nil {
					return err
				}
				if req.Settings, req.Convention, err = set.settings(); err != nil {
					return err
				}
				req.WorstCaseShift = anyShift
				req.SampleUlps = sampleUlps
				return nil
			}
			return ask(cmd, &call, stdout, stderr, req, build, (*session).ErrorBudget, printErrorBudget)
		},
	}
	fs := cmd.Flags()
	call.register(fs)
	subj.register(fs, true)
	grid.register(fs)
	set.register(fs)
	fs.Float64SliceVar(&xi, "xi", nil, "frequency (band centre) per axis in the convention's unit (default 0: the integral)")
	fs.Float64SliceVar(&band, "band", nil, "band half-width per axis: the bound holds for |xi - center| ≤ band (default 0)")
	fs.BoolVar(&anyShift, "any-shift", false, "bound the error for every shift of the grid, not only --shift")
	fs.Float64Var(&sampleUlps, "sample-ulps", 0, "error of each sample value in units of 2^-53 (0: correctly rounded)")
	return cmd
}
