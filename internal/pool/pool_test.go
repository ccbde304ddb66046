package pool

import (
	"context"
	"errors"
	"sync/atomic"
	"testing"
)

func TestEachRunsEveryJobOnce(t *testing.T) {
	t.Parallel()
	for _, workers := range []int{0, 1, 3, 100} {
		var calls [50]atomic.Int32
		Each(len(calls), workers, func(k int) { calls[k].Add(1) })
		for k := range calls {
			if got := calls[k].Load(); got != 1 {
				t.Errorf("workers %d: job %d ran %d times, want 1", workers, k, got)
			}
		}
	}
}

func TestRunBoundsConcurrency(t *testing.T) {
	t.Parallel()
	var now, peak atomic.Int32
	sum := 0
	err := Run(context.Background(), 40, 2, func(k int) int {
		if c := now.Add(1); c > peak.Load() {
			peak.Store(c)
		}
		defer now.Add(-1)
		return k
	}, func(k, v int) error {
		if k != v {
			t.Errorf("result of job %d handed as job %d", v, k)
		}
		sum += v // done runs on the calling goroutine: no lock needed
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if sum != 40*39/2 {
		t.Errorf("sum of results %d, want %d", sum, 40*39/2)
	}
	if p := peak.Load(); p > 2 {
		t.Errorf("%d jobs at once, want at most 2", p)
	}
}

func TestRunStopsOnDoneError(t *testing.T) {
	t.Parallel()
	stop := errors.New("stop")
	var started atomic.Int32
	handed := 0
	err := Run(context.Background(), 1000, 1, func(k int) int { started.Add(1); return k }, func(k, v int) error {
		handed++
		return stop
	})
	if !errors.Is(err, stop) {
		t.Fatalf("Run returned %v, want the error of done", err)
	}
	if handed != 1 {
		t.Errorf("done called %d times after it failed, want 1", handed)
	}
	if s := started.Load(); s > 3 {
		t.Errorf("%d jobs started after the stop, want at most 3 (one worker, jobs in flight)", s)
	}
}

func TestRunCancelledHandsInFlight(t *testing.T) {
	t.Parallel()
	ctx, cancel := context.WithCancel(context.Background())
	handed := 0
	err := Run(ctx, 1000, 1, func(k int) int {
		if k == 0 {
			cancel()
		}
		return k
	}, func(k, v int) error { handed++; return nil })
	if !errors.Is(err, context.Canceled) {
		t.Fatalf("Run returned %v, want context.Canceled", err)
	}
	if handed < 1 || handed > 3 {
		t.Errorf("%d results handed after cancel, want the 1–3 in flight", handed)
	}
}
