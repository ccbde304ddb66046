// Package pool is the one worker pool of the project: independent jobs on a fixed number of
// goroutines, their results handed back one at a time on the calling goroutine. Sweeps
// (kinetics/study), sensitivities and the validation registry all run through it.
package pool

import (
	"context"
	"runtime"
	"sync"
)

// Run calls work(k) for k = 0 … n−1 on at most workers goroutines (runtime.GOMAXPROCS(0) when
// workers ≤ 0) and hands each result to done, one at a time on the calling goroutine, in
// completion order; done may be nil. Jobs share nothing through the pool: no lock is held
// while work runs.
//
// When ctx is cancelled no new job starts; the jobs in flight finish and are still handed to
// done before Run returns ctx.Err(). An error from done stops the pool the same way, except
// that the results still in flight are dropped, and is returned.
func Run[T any](ctx context.Context, n, workers int, work func(k int) T, done func(k int, v T) error) error {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, max(n, 1))
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()

	type result struct {
		k int
		v T
	}
	jobs := make(chan int)
	results := make(chan result)
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for k := range jobs {
				results <- result{k, work(k)}
			}
		}()
	}
	go func() {
		defer close(jobs)
		for k := range n {
			select {
			case jobs <- k:
			case <-ctx.Done():
				return
			}
		}
	}()
	go func() {
		wg.Wait()
		close(results)
	}()

	var firstErr error
	for r := range results {
		if firstErr != nil || done == nil {
			continue // drain the jobs in flight
		}
		if err := done(r.k, r.v); err != nil {
			firstErr = err
			cancel()
		}
	}
	if firstErr != nil {
		return firstErr
	}
	return ctx.Err()
}

// Each calls work(k) for k = 0 … n−1 on at most workers goroutines (GOMAXPROCS when ≤ 0) and
// returns when every call has returned. work usually writes its result into slot k of a slice
// the caller owns.
func Each(n, workers int, work func(k int)) {
	_ = Run(context.Background(), n, workers, func(k int) struct{} { work(k); return struct{}{} }, nil)
}
