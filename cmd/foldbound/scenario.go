package main

import (
	"context"
	"io"

	"foldbound/client"
)

// runDemo is the demo scenario.
func runDemo(ctx context.Context, c *client.Client, w io.Writer) error {
	return nil
}
