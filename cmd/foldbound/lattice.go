package main

import (
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	pb "foldbound/api/foldbound/v1"
)

func newLatticeCmd(stdout, stderr io.Writer) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "lattice",
		Short: "Alias sums on sampling lattices, and which lattice needs the fewest samples",
		Args:  cobra.NoArgs,
	}
	cmd.AddCommand(newLatticeSumCmd(stdout, stderr), newLatticeCompareCmd(stdout, stderr))
	return cmd
}

// latticeFlags select one lattice.
type latticeFlags struct {
	name      string
	generator string
	dim       int32
	scale     float64
}

func (l *latticeFlags) register(fs *pflag.FlagSet, scaled bool) {
	fs.StringVar(&l.name, "lattice", "", "built-in lattice: integer (with --dim), square, cubic, hexagonal, bcc, fcc, d4")
	fs.StringVar(&l.generator, "generator", "", "generator matrix by rows, columns are basis vectors, e.g. '1,0.5; 0,0.8660254037844386'")
	fs.Int32Var(&l.dim, "dim", 0, "dimension of the integer lattice")
	if scaled {
		fs.Float64Var(&l.scale, "scale", 0, "scale factor a of the lattice a·L (0: 1)")
	}
}

func (l *latticeFlags) lattice() (*pb.Lattice, error) {
	switch {
	case l.name != "" && l.generator != "":
		return nil, errors.New("give --lattice or --generator, not both")
	case l.generator != "":
		rows, err := parseMatrix(l.generator)
		if err != nil {
			return nil, err
		}
		g := &pb.Generator{Dim: int32(len(rows))}
		for _, r := range rows {
			g.Entries = append(g.Entries, r...)
		}
		return &pb.Lattice{Kind: &pb.Lattice_Generator{Generator: g}, Scale: l.scale}, nil
	case l.name != "":
		out := &pb.Lattice{Dim: l.dim, Scale: l.scale}
		var n pb.LatticeName
		switch strings.ToLower(l.name) {
		case "integer":
			n = pb.LatticeName_LATTICE_NAME_INTEGER
		case "square":
			n, out.Dim = pb.LatticeName_LATTICE_NAME_INTEGER, 2
		case "cubic":
			n, out.Dim = pb.LatticeName_LATTICE_NAME_INTEGER, 3
		case "hexagonal":
			n = pb.LatticeName_LATTICE_NAME_HEXAGONAL
		case "bcc":
			n = pb.LatticeName_LATTICE_NAME_BODY_CENTRED_CUBIC
		case "fcc":
			n = pb.LatticeName_LATTICE_NAME_FACE_CENTRED_CUBIC
		case "d4":
			n = pb.LatticeName_LATTICE_NAME_D4
		default:
			return nil, fmt.Errorf("--lattice %q: want integer, square, cubic, hexagonal, bcc, fcc or d4", l.name)
		}
		out.Kind = &pb.Lattice_Named{Named: n}
		return out, nil
	}
	return nil, errors.New("--lattice or --generator is required")
}

// parseMatrix reads rows separated by ';' of numbers separated by ','.
func parseMatrix(s string) ([][]float64, error) {
	var rows [][]float64
	for _, r := range strings.Split(s, ";") {
		var row []float64
		for _, v := range strings.Split(r, ",") {
			x, err := strconv.ParseFloat(strings.TrimSpace(v), 64)
			if err != nil {
				return nil, fmt.Errorf("--generator: %w", err)
			}
			row = append(row, x)
		}
		rows = append(rows, row)
	}
	return rows, nil
}

func newLatticeSumCmd(stdout, stderr io.Writer) *cobra.Command {
	var (
		call      callFlags
		family    string
		lat       latticeFlags
		set       settingsFlags
		xi, shift []float64
	)
	cmd := &cobra.Command{
		Use:   "sum",
		Short: "Lattice sum, exact transform and alias sum of a family on a lattice, as enclosures",
		Example: `  foldbound lattice sum --family 'radial-gaussian(dim=2, sigma=1)' --lattice hexagonal --scale 1.6
  foldbound lattice sum --family 'separable(gaussian(sigma=1), sech(w=1))' --generator '1,0.5; 0,0.9' --json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			req := &pb.LatticeAliasSumRequest{}
			build := func() error {
				if family == "" {
					return errors.New("--family is required")
				}
				f, err := parseFamily(family)
				if err != nil {
					return err
				}
				dim := dimOf(f)
				req.Family = f
				if req.Lattice, err = lat.lattice(); err != nil {
					return err
				}
				if req.Shift, err = perAxis("shift", shift, dim); err != nil {
					return err
				}
				if req.Xi, err = perAxis("xi", xi, dim); err != nil {
					return err
				}
				if req.Settings, req.Convention, err = set.settings(); err != nil {
					return err
				}
				return nil
			}
			return ask(cmd, &call, stdout, stderr, req, build, (*session).LatticeAliasSum, printLatticeSum)
		},
	}
	fs := cmd.Flags()
	call.register(fs)
	fs.StringVar(&family, "family", "", "the function, e.g. 'radial-gaussian(dim=2, sigma=1)'")
	lat.register(fs, true)
	set.register(fs)
	fs.Float64SliceVar(&shift, "shift", nil, "shift of the lattice per axis (default 0)")
	fs.Float64SliceVar(&xi, "xi", nil, "frequency per axis in the convention's unit (default 0: the integral)")
	return cmd
}

func newLatticeCompareCmd(stdout, stderr io.Writer) *cobra.Command {
	var (
		call       callFlags
		dim        int32
		spectral   []string
		band, tol  float64
		wholeBand  bool
		generators []string
		set        settingsFlags
	)
	cmd := &cobra.Command{
		Use:   "compare",
		Short: "Rank lattices by samples per unit volume for an isotropic spectrum and a tolerance",
		Long: `compare finds, for an isotropic spectral envelope |F(ξ)| ≤ E(|ξ|) and a
tolerance, the coarsest scale of every built-in lattice of the dimension
(and of any --generator given) whose certified alias bound is within the
tolerance, for the integral (--band 0), for the frequencies |ξ| ≤ --band, or
for the whole band of a band-limited envelope (--whole-band), and ranks them
by samples per unit volume with the saving against the rectangular grid.`,
		Example: `  foldbound lattice compare --dim 2 --spectral 'compact(width=3.1416)' --whole-band --tol 1e-9
  foldbound lattice compare --dim 3 --spectral 'gaussian(width=2)' --band 1 --tol 1e-8`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			req := &pb.CompareLatticesRequest{}
			build := func() error {
				terms, err := parseEnvelope(spectral)
				if err != nil {
					return err
				}
				if !cmd.Flags().Changed("tol") {
					return errors.New("--tol is required")
				}
				req.Dim, req.Spectral, req.Band, req.WholeBand, req.Tol = dim, terms, band, wholeBand, tol
				for _, g := range generators {
					l, err := (&latticeFlags{generator: g}).lattice()
					if err != nil {
						return err
					}
					req.Candidates = append(req.Candidates, l)
				}
				if req.Settings, req.Convention, err = set.settings(); err != nil {
					return err
				}
				return nil
			}
			return ask(cmd, &call, stdout, stderr, req, build, (*session).CompareLattices, printCompare)
		},
	}
	fs := cmd.Flags()
	call.register(fs)
	fs.Int32Var(&dim, "dim", 2, "dimension, 1 to 8")
	fs.StringArrayVar(&spectral, "spectral", nil, "isotropic envelope term of |F| as a function of |ξ|, e.g. 'compact(width=3.1416)' (repeatable)")
	fs.Float64Var(&band, "band", 0, "radius of the frequencies covered (0: the integral)")
	fs.BoolVar(&wholeBand, "whole-band", false, "cover the whole band of a band-limited (compact) envelope")
	fs.Var(strictFloat{&tol}, "tol", "tolerance for the certified alias bound (required, > 0)")
	fs.StringArrayVar(&generators, "generator", nil, "an extra candidate lattice by rows, e.g. '1,0.5; 0,0.9' (repeatable)")
	set.register(fs)
	return cmd
}

func printLatticeSum(w io.Writer, req *pb.LatticeAliasSumRequest, r *pb.LatticeAliasSumResponse) error {
	t := newTable(w)
	li := r.GetLattice()
	t.row("lattice sum", r.GetFamily())
	t.row("lattice", fmt.Sprintf("%s, %d-D, %s samples per unit volume", li.GetName(), li.GetDim(), fmtInterval(li.GetDensity())))
	t.row("shift", fmtFloats(req.GetShift()))
	t.row("frequency", fmtBand(&pb.Band{Center: req.GetXi()}, r.GetConvention()))
	t.row("convention", fmtConvention(r.GetConvention()))
	t.row("")
	t.row("quantity", "real part", "imaginary part")
	for _, q := range []struct {
		name string
		z    *pb.ComplexInterval
	}{{"lattice sum T", r.GetSampled()}, {"exact F", r.GetExact()}, {"alias sum T - F", r.GetAlias()}} {
		t.row(q.name, fmtInterval(q.z.GetRe()), fmtInterval(q.z.GetIm()))
	}
	if err := t.flush(); err != nil {
		return err
	}
	m := r.GetMethod()
	_, err := fmt.Fprintf(w, "\nmethod: %s side of the lattice Poisson formula, %d points within radius %.4g, remainder ≤ %s (%s); %d nodes visited of %d allowed\n",
		sideName(m.GetSide()), m.GetPoints(), m.GetRadius(), fmtBound(m.GetRemainder()), m.GetRemainderFrom(), m.GetVisited(), m.GetMaxTerms())
	return err
}

func printCompare(w io.Writer, req *pb.CompareLatticesRequest, r *pb.CompareLatticesResponse) error {
	target := "the integral (ξ = 0)"
	switch {
	case req.GetWholeBand():
		target = fmt.Sprintf("the whole band |ξ| ≤ %.6g", r.GetBand())
	case r.GetBand() > 0:
		target = fmt.Sprintf("|ξ| ≤ %.6g", r.GetBand())
	}
	fmt.Fprintf(w, "lattice comparison in %d-D: alias bound ≤ %g for %s, every shift\n\n", req.GetDim(), req.GetTol(), target)
	t := newTable(w)
	t.row("lattice", "scale", "samples per unit volume", "alias bound", "saving vs rectangular")
	for _, p := range r.GetPlans() {
		d := p.GetDensity()
		t.row(p.GetLattice().GetName(), fmt.Sprintf("%.6g", p.GetScale()), fmt.Sprintf("%.6g", d.GetLo()+(d.GetHi()-d.GetLo())/2),
			fmtBound(p.GetAliasing()), fmt.Sprintf("%.2f%%", 100*p.GetSaving()))
	}
	return t.flush()
}
