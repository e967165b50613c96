// Command foldbound answers sampling questions by the Poisson summation
// formula: how wrong a sample grid is (aliasing, truncation, rounding, as
// certified bounds) and which grid is the cheapest one within a
// tolerance. It serves the foldbound gRPC service, calls one (--addr), or
// runs one in-process on a loopback port when no address is given.
//
//	foldbound serve                 serve SamplingService
//	foldbound alias  …              sampled sum, exact transform, error
//	foldbound budget …              certified error budget of a grid
//	foldbound plan   …              cheapest certified grid
//	foldbound scan   …              tomography scan sampling (mathematics only)
//	foldbound lattice sum|compare   alias sums on lattices, lattice comparison
//	foldbound kernel …              gridding kernels of a non-uniform FFT
//	foldbound batch  --request F    many requests over one stream
//	foldbound demo                  a worked scenario, end to end
package main

import (
	"context"
	"fmt"
	"io"
	"os"
)

func main() {
	if err := run(context.Background(), os.Args[1:], os.Stdout, os.Stderr); err != nil {
		fmt.Fprintln(os.Stderr, "foldbound:", err)
		os.Exit(1)
	}
}

// run executes the command line args, writing results to stdout and
// diagnostics to stderr.
func run(ctx context.Context, args []string, stdout, stderr io.Writer) error {
	root := newRoot(stdout, stderr)
	root.SetArgs(args)
	return root.ExecuteContext(ctx)
}
