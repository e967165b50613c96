package main

import (
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"

	pb "foldbound/api/foldbound/v1"
)

func newKernelCmd(stdout, stderr io.Writer) *cobra.Command {
	var (
		call         callFlags
		modes        int64
		dim          int32
		tol          float64
		shape        string
		oversampling []float64
		points       float64
		spread, fft  float64
		anyGridSize  bool
		verify       int32
		seed         uint64
	)
	cmd := &cobra.Command{
		Use:   "kernel",
		Short: "Gridding kernels of a non-uniform FFT that meet a tolerance, cheapest first",
		Long: `kernel plans the gridding kernel of a non-uniform FFT: for each candidate
oversampling ratio σ, the smallest kernel width W (grid cells) whose
certified kernel error meets --tol, with its best shape β, and the cost of
spreading and FFT by a cost model; the cheapest is recommended. --verify N
runs the gridded transform of the recommendation against the directly summed
non-uniform DFT on N random points.`,
		Example: `  foldbound kernel --modes 256 --tol 1e-9 --verify 1000
  foldbound kernel --modes 512 --dim 2 --tol 1e-6 --shape gaussian --oversampling 1.25,2 --json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			req := &pb.PlanKernelRequest{}
			build := func() error {
				if !cmd.Flags().Changed("tol") {
					return fmt.Errorf("--tol is required")
				}
				req.Modes, req.Dim, req.Tol, req.Oversampling = modes, dim, tol, oversampling
				req.Points, req.SpreadCost, req.FftCost, req.AnyGridSize = points, spread, fft, anyGridSize
				req.VerifyPoints, req.VerifySeed = verify, seed
				switch strings.ToLower(shape) {
				case "kaiser-bessel", "":
					req.Shape = pb.KernelShape_KERNEL_SHAPE_KAISER_BESSEL
				case "gaussian":
					req.Shape = pb.KernelShape_KERNEL_SHAPE_GAUSSIAN
				default:
					return fmt.Errorf("--shape %q: want kaiser-bessel or gaussian", shape)
				}
				return nil
			}
			return ask(cmd, &call, stdout, stderr, req, build, (*session).PlanKernel, printKernel)
		},
	}
	fs := cmd.Flags()
	call.register(fs)
	fs.Int64Var(&modes, "modes", 256, "Fourier modes N per axis")
	fs.Int32Var(&dim, "dim", 1, "dimension, 1 to 3")
	fs.Var(strictFloat{&tol}, "tol", "tolerance relative to Σ|c_j| (required, 0 < tol < 1)")
	fs.StringVar(&shape, "shape", "kaiser-bessel", "kernel shape: kaiser-bessel or gaussian")
	fs.Float64SliceVar(&oversampling, "oversampling", nil, "candidate oversampling ratios σ > 1 (default 1.25,1.5,2)")
	fs.Float64Var(&points, "points", 0, "non-uniform points for the cost model (0: N^dim)")
	fs.Float64Var(&spread, "spread-cost", 0, "cost per point and grid cell spread (0 with --fft-cost 0: measured defaults)")
	fs.Float64Var(&fft, "fft-cost", 0, "cost per grid point and factor log2 of the grid size")
	fs.BoolVar(&anyGridSize, "any-grid-size", false, "keep M = ⌈σN⌉ instead of rounding up to 2^a 3^b 5^c")
	fs.Int32Var(&verify, "verify", 0, "verify the recommendation on this many random points (0: no)")
	fs.Uint64Var(&seed, "seed", 1, "seed of the verification points")
	return cmd
}

func printKernel(w io.Writer, req *pb.PlanKernelRequest, r *pb.PlanKernelResponse) error {
	dim := max(req.GetDim(), 1)
	fmt.Fprintf(w, "gridding kernels for %d modes per axis in %d-D, tolerance %g\n", req.GetModes(), dim, req.GetTol())
	fmt.Fprintf(w, "transform: %s\n\n", r.GetConvention())
	t := newTable(w)
	t.row("σ", "grid M", "kernel", "W", "β (published)", "certified bound", "rounding est.", "cost")
	for _, o := range r.GetOptions() {
		k := o.GetKernel()
		t.row(fmt.Sprintf("%g", o.GetOversampling()), fmt.Sprint(o.GetGrid()),
			strings.ToLower(strings.ReplaceAll(strings.TrimPrefix(k.GetShape().String(), "KERNEL_SHAPE_"), "_", "-")),
			fmt.Sprint(k.GetWidth()), fmt.Sprintf("%.4g (%.4g)", k.GetBeta(), o.GetPublishedBeta()),
			fmtBound(o.GetBound().GetTotal()), fmtBound(o.GetRounding()), fmt.Sprintf("%.4g", o.GetCost()))
	}
	if err := t.flush(); err != nil {
		return err
	}
	for _, n := range r.GetNotes() {
		fmt.Fprintf(w, "note: %s\n", n)
	}
	if len(r.GetOptions()) > 0 {
		fmt.Fprintf(w, "\nrecommended: the first row (cheapest by the cost model)\n")
	}
	if v := r.GetVerification(); v != nil {
		fmt.Fprintf(w, "verification on %d random points (seed %d): observed error %.3g ≤ promised %.3g (mode %d)\n",
			v.GetPoints(), v.GetSeed(), v.GetObserved(), v.GetTotal(), v.GetObservedMode())
	}
	return nil
}
