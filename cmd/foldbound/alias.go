package main

import (
	"io"

	"github.com/spf13/cobra"

	pb "foldbound/api/foldbound/v1"
)

func newAliasCmd(stdout, stderr io.Writer) *cobra.Command {
	var (
		call callFlags
		subj subjectFlags
		grid gridFlags
		set  settingsFlags
		xi   []float64
	)
	cmd := &cobra.Command{
		Use:   "alias",
		Short: "Sampled sum, exact transform and their difference (aliasing + truncation) as enclosures",
		Long: `alias computes, for a function with a closed-form transform sampled on a grid,
the sampled sum T = h Σ f(x_k) e^{-i xi x_k}, the exact transform F(xi) (the
integral at xi = 0) and the error T - F split into aliasing and truncation,
each as a certified enclosure.`,
		Example: `  foldbound alias --family 'gaussian(sigma=0.7)' --step 0.5 --count 13
  foldbound alias --family 'gaussian(sigma=1)' --step 1 --xi 0.5 --convention ordinary --json
  foldbound alias --request req.json --addr localhost:8440`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			req := &pb.AliasSumRequest{}
			build := func() error {
				f, _, dim, err := subj.subject()
				if err != nil {
					return err
				}
				if req.Grids, err = grid.grids(dim); err != nil {
					return err
				}
				if req.Xi, err = perAxis("xi", xi, dim); err != nil {
					return err
				}
				if req.Settings, req.Convention, err = set.settings(); err != nil {
					return err
				}
				req.Family = f
				return nil
			}
			return ask(cmd, &call, stdout, stderr, req, build, (*session).AliasSum, printAliasSum)
		},
	}
	fs := cmd.Flags()
	call.register(fs)
	subj.register(fs, false)
	grid.register(fs)
	set.register(fs)
	fs.Float64SliceVar(&xi, "xi", nil, "frequency per axis in the convention's unit (default 0: the integral)")
	return cmd
}
