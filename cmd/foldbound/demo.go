package main

import (
	"io"

	"github.com/spf13/cobra"
)

func newDemoCmd(stdout, stderr io.Writer) *cobra.Command {
	var call callFlags
	cmd := &cobra.Command{
		Use:   "demo",
		Short: "Run a worked scenario end to end through the client",
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			s, err := call.dial(cmd.Context(), stderr)
			if err != nil {
				return err
			}
			defer s.stop()
			return runDemo(cmd.Context(), s.Client, stdout)
		},
	}
	cmd.Flags().StringVar(&call.addr, "addr", "", "server address; empty runs the service in-process")
	cmd.Flags().DurationVar(&call.timeout, "timeout", 0, "deadline of each call (0: 30s)")
	return cmd
}
