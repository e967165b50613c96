package main

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"

	"github.com/spf13/cobra"
	"google.golang.org/grpc/status"
	"google.golang.org/protobuf/encoding/protojson"

	pb "foldbound/api/foldbound/v1"
	"foldbound/client"
)

func newBatchCmd(stdout, stderr io.Writer) *cobra.Command {
	var call callFlags
	cmd := &cobra.Command{
		Use:   "batch",
		Short: "Answer many requests over one stream (newline-delimited protojson)",
		Long: `batch reads one foldbound.v1.BatchRequest per line (protojson) from --request
and answers them over the Batch stream, resuming with the unanswered items
if the connection drops. Items without an id get their line number. With
--json it prints one BatchResponse per line, in input order.`,
		Example: `  foldbound batch --request jobs.ndjson --json > answers.ndjson`,
		Args:    cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			if call.request == "" {
				return errors.New("--request FILE is required ('-' for stdin)")
			}
			items, err := readItems(call.request)
			if err != nil {
				return err
			}
			s, err := call.dial(cmd.Context(), stderr)
			if err != nil {
				return err
			}
			defer s.stop()
			res, err := s.Batch(cmd.Context(), items)
			if err != nil {
				return err
			}
			if call.json {
				for _, r := range res {
					b, err := protojson.Marshal(r)
					if err != nil {
						return err
					}
					if _, err := fmt.Fprintf(stdout, "%s\n", b); err != nil {
						return err
					}
				}
				return nil
			}
			t := newTable(stdout)
			t.row("id", "answer")
			for _, r := range res {
				t.row(r.GetId(), summary(r))
			}
			return t.flush()
		},
	}
	call.register(cmd.Flags())
	return cmd
}

func readItems(name string) ([]*pb.BatchRequest, error) {
	var in io.Reader = os.Stdin
	if name != "-" {
		f, err := os.Open(name)
		if err != nil {
			return nil, err
		}
		defer f.Close()
		in = f
	}
	var items []*pb.BatchRequest
	sc := bufio.NewScanner(in)
	sc.Buffer(make([]byte, 0, 64<<10), 16<<20)
	for line := 1; sc.Scan(); line++ {
		b := bytes.TrimSpace(sc.Bytes())
		if len(b) == 0 {
			continue
		}
		it := &pb.BatchRequest{}
		if err := protojson.Unmarshal(b, it); err != nil {
			return nil, fmt.Errorf("%s:%d: %w", name, line, err)
		}
		if it.GetId() == "" {
			it.Id = strconv.Itoa(line)
		}
		items = append(items, it)
	}
	return items, sc.Err()
}

// summary is a one-line description of a batch answer.
func summary(r *pb.BatchResponse) string {
	switch x := r.GetResult().(type) {
	case *pb.BatchResponse_AliasSum:
		e := x.AliasSum.GetError()
		return fmt.Sprintf("alias sum of %s: error T - F = %s + i(%s)", x.AliasSum.GetFamily(), fmtInterval(e.GetRe()), fmtInterval(e.GetIm()))
	case *pb.BatchResponse_ErrorBudget:
		b := x.ErrorBudget.GetBudget()
		return fmt.Sprintf("budget: total %s (aliasing %s, truncation %s, rounding %s)",
			fmtBound(b.GetTotal()), fmtBound(b.GetAliasing()), fmtBound(b.GetTruncation()), fmtBound(b.GetRounding()))
	case *pb.BatchResponse_PlanScan:
		p := x.PlanScan.GetPlan()
		return fmt.Sprintf("scan plan: standard %d, interlaced %d line integrals (sampling mathematics, not a scan protocol)",
			p.GetStandard().GetSamples(), p.GetInterlaced().GetSamples())
	case *pb.BatchResponse_LatticeAliasSum:
		a := x.LatticeAliasSum.GetAlias()
		return fmt.Sprintf("lattice sum of %s on %s: alias sum = %s + i(%s)", x.LatticeAliasSum.GetFamily(),
			x.LatticeAliasSum.GetLattice().GetName(), fmtInterval(a.GetRe()), fmtInterval(a.GetIm()))
	case *pb.BatchResponse_CompareLattices:
		best := x.CompareLattices.GetPlans()[0]
		return fmt.Sprintf("lattice comparison: %s saves %.2f%% against the rectangular grid", best.GetLattice().GetName(), 100*best.GetSaving())
	case *pb.BatchResponse_PlanKernel:
		if len(x.PlanKernel.GetOptions()) == 0 {
			return "kernel plan: no option"
		}
		o := x.PlanKernel.GetOptions()[0]
		return fmt.Sprintf("kernel plan: σ = %g, W = %d, β = %.4g, total %s", o.GetOversampling(), o.GetKernel().GetWidth(), o.GetKernel().GetBeta(), fmtBound(o.GetTotal()))
	case *pb.BatchResponse_PlanGrid:
		p := x.PlanGrid
		return fmt.Sprintf("plan: %d samples, total %s", p.GetTotalSamples(), fmtBound(p.GetBudget().GetTotal()))
	}
	st := status.Convert(client.ItemErr(r))
	return fmt.Sprintf("error %v: %s", st.Code(), st.Message())
}
