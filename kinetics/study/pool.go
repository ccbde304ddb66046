package study

import (
	"context"
	"fmt"
	"runtime"
	"strings"

	"n2pulse/internal/pool"
	"n2pulse/internal/usermsg"
	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// Runner computes the figures of merit of one design. The default is the full model
// (kinetics.Run with light results); tests and studies may pass their own.
type Runner func(d *design.Design) (kinetics.Summary, error)

// outcome is one finished point.
type outcome struct {
	i   int
	sum kinetics.Summary
	err error
}

// evaluate runs the designs of the points idx on the project's worker pool (internal/pool) and hands each outcome to
// done, one at a time on the calling goroutine, in completion order. Points are independent and
// share nothing: no lock is held while a design runs. When ctx is cancelled no new point starts;
// the points in flight finish and are handed to done before evaluate returns ctx.Err(). An error
// from done stops the pool the same way and is returned.
func evaluate(ctx context.Context, idx []int, workers int, designAt func(i int) (*design.Design, error),
	run Runner, done func(o outcome) error) error {
	if workers <= 0 {
		workers = runtime.NumCPU()
	}
	return pool.Run(ctx, len(idx), workers, func(k int) outcome {
		o := outcome{i: idx[k]}
		d, err := designAt(o.i)
		if err == nil {
			o.sum, o.err = safeRun(run, d)
		} else {
			o.err = err
		}
		return o
	}, func(_ int, o outcome) error { return done(o) })
}

// safeRun turns a panic inside the model into the point's error, so one bad point never
// sinks a sweep.
func safeRun(run Runner, d *design.Design) (s kinetics.Summary, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("study: model panicked: %v", r)
		}
	}()
	return run(d)
}

// statusOf is the status cell of a point: "ok", "truncated" (the pulse outlasted the
// longest run) or "failed: <error>" on one line.
func statusOf(s kinetics.Summary, err error) string {
	if err == nil {
		if s.Truncated {
			return StatusTruncated
		}
		return StatusOK
	}
	msg := strings.Join(strings.Fields(err.Error()), " ")
	return "failed: " + usermsg.Strip(msg)
}
