package bounds

import (
	"context"
	"fmt"
	"runtime"
	"sync"
)

// PlanResult is one answer of PlanBatch: the plan of the request at the
// same index, or the error that request met.
type PlanResult struct {
	Plan Plan
	Err  error
}

// PlanNDResult is one answer of PlanBatchND.
type PlanNDResult struct {
	Plan PlanND
	Err  error
}

// PlanBatch plans many requests concurrently on at most workers goroutines
// (GOMAXPROCS when workers ≤ 0) and returns the results in request order.
// Requests are independent: one request's error does not stop the others.
// When ctx is cancelled, the requests not yet started get the context's
// error and the call returns once the running ones finish. PlanBatch keeps
// no state between calls and is safe for concurrent use.
func PlanBatch(ctx context.Context, reqs []PlanRequest, workers int) []PlanResult {
	out := make([]PlanResult, len(reqs))
	runBatch(ctx, len(reqs), workers, func(i int) {
		out[i].Plan, out[i].Err = PlanGrid(ctx, reqs[i])
	}, func(i int, err error) {
		out[i].Err = err
	})
	return out
}

// PlanBatchND is PlanBatch for n-dimensional requests.
func PlanBatchND(ctx context.Context, reqs []PlanNDRequest, workers int) []PlanNDResult {
	out := make([]PlanNDResult, len(reqs))
	runBatch(ctx, len(reqs), workers, func(i int) {
		out[i].Plan, out[i].Err = PlanGridND(ctx, reqs[i])
	}, func(i int, err error) {
		out[i].Err = err
	})
	return out
}

// runBatch calls do(i) for i = 0 … n-1 on a bounded pool of goroutines,
// each index once; indices not started before ctx ends get skip(i, err).
// Every goroutine has ended when it returns.
func runBatch(ctx context.Context, n, workers int, do func(int), skip func(int, error)) {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, n)
	next := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				do(i)
			}
		}()
	}
	i := 0
feed:
	for ; i < n; i++ {
		select {
		case next <- i:
		case <-ctx.Done():
			break feed
		}
	}
	close(next)
	wg.Wait()
	for ; i < n; i++ {
		skip(i, fmt.Errorf("bounds: plan %d not started: %w", i, ctx.Err()))
	}
}
