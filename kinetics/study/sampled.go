package study

import (
	"context"
	"fmt"
	"runtime"
	"sync"

	"n2pulse/internal/pool"
	"n2pulse/kinetics/design"
)

// MaxSampledRuns bounds the runs of one study with uncertainty bands: points × (samples + 1),
// the nominal run of each point included. At tens of runs a second on a few cores it is a
// day's computing; past it a study should be split into shards.
const MaxSampledRuns = 2_000_000

// CheckSampledRuns reports a study of points grid points with n samples each (flag names the
// option in the message) whose runs exceed MaxSampledRuns, naming the allowed range of n for
// that many points.
func CheckSampledRuns(flag string, n, points int) error {
	if n <= 0 || points <= 0 {
		return nil
	}
	if runs := int64(points) * int64(n+1); runs > MaxSampledRuns {
		most := MaxSampledRuns/points - 1
		if most < MinSamples {
			return fmt.Errorf("study: %s %d with %d points is %d runs, more than %d: no sample count fits this many points; use fewer points (at most %d) or shards",
				flag, n, points, runs, MaxSampledRuns, MaxSampledRuns/(MinSamples+1))
		}
		return fmt.Errorf("study: %s %d with %d points is %d runs, more than %d: allowed %d…%d samples for this many points, or use fewer points or shards",
			flag, n, points, runs, MaxSampledRuns, MinSamples, most)
	}
	return nil
}

// MinSamples is the fewest samples an uncertainty band is made of.
const MinSamples = 10

// CheckSamples reports a sample count outside 0 (no band) or MinSamples…MaxSamples, naming
// flag.
func CheckSamples(flag string, n int) error {
	if n != 0 && (n < MinSamples || n > MaxSamples) {
		return fmt.Errorf("study: %s %d: want %d…%d samples (or 0 for none)", flag, n, MinSamples, MaxSamples)
	}
	return nil
}

// sampledPoint is what sampledEvaluate hands over for one point: its nominal outcome, its band
// (nil when the point's design failed or samples none of the uncertain constants, with the
// reason in bandErr) and every sample's figures, in sample order.
type sampledPoint struct {
	nominal outcome
	band    *UncertaintyResult
	bandErr error
	// sampleErr is the first failed sample's error (by sample order) when some, not all, failed
	sampleErr error
	figs      []sampleFigures
}

// sampledEvaluate runs, for every point idx[k], its design (designAt) and n samples of the
// uncertain constants it uses (a Latin hypercube of seed; keys in hold are never sampled) on the
// project's worker pool, and hands each point to done once its nominal run and all its samples
// have finished, on the calling goroutine. Jobs go to the pool in point order, so only the
// points in flight hold their samples. The samples of a point depend on its design and the seed
// only, and each result is stored at its sample's place, so nothing depends on the number of
// workers or the order in which runs finish. Cancellation and errors from done behave as in
// evaluate.
func sampledEvaluate(ctx context.Context, idx []int, n int, seed uint64, hold []string, workers int,
	designAt func(i int) (*design.Design, error), run Runner, done func(p sampledPoint) error) error {
	if workers <= 0 {
		workers = runtime.NumCPU()
	}
	type plan struct {
		once    sync.Once
		nominal *design.Design
		err     error // the point's design failed
		samples *samplePlan
		planErr error // the design samples nothing
	}
	type acc struct {
		p      sampledPoint
		values [][]float64
		left   int
		// firstErr is the error of the failed sample with the lowest index, firstBad
		firstErr error
		firstBad int
	}
	var mu sync.Mutex
	plans := map[int]*plan{}
	planOf := func(i int) *plan {
		mu.Lock()
		p, ok := plans[i]
		if !ok {
			p = &plan{}
			plans[i] = p
		}
		mu.Unlock()
		p.once.Do(func() {
			if p.nominal, p.err = designAt(i); p.err == nil {
				p.samples, p.planErr = newSamplePlan(p.nominal, hold, n, seed)
			}
		})
		return p
	}
	type job struct {
		i, s   int // point, sample (0: the nominal run; s: sample s−1)
		o      outcome
		values []float64
	}
	accs := map[int]*acc{}
	per := n + 1
	return pool.Run(ctx, len(idx)*per, workers, func(k int) job {
		j := job{i: idx[k/per], s: k % per}
		j.o.i = j.i
		p := planOf(j.i)
		switch {
		case p.err != nil:
			j.o.err = p.err
		case j.s == 0:
			j.o.sum, j.o.err = safeRun(run, p.nominal)
		case p.planErr != nil:
			j.o.err = p.planErr
		default:
			var d *design.Design
			if d, j.values, j.o.err = p.samples.design(j.s - 1); j.o.err == nil {
				j.o.sum, j.o.err = safeRun(run, d)
			}
		}
		return j
	}, func(_ int, j job) error {
		a := accs[j.i]
		if a == nil {
			a = &acc{left: per, values: make([][]float64, n), p: sampledPoint{figs: make([]sampleFigures, n)}}
			accs[j.i] = a
		}
		a.left--
		if j.s == 0 {
			a.p.nominal = j.o
		} else {
			a.p.figs[j.s-1] = figuresOf(j.o.sum, j.o.err)
			if j.o.err != nil && (a.firstErr == nil || j.s-1 < a.firstBad) {
				a.firstErr, a.firstBad = j.o.err, j.s-1
			}
			a.values[j.s-1] = j.values
		}
		if a.left > 0 {
			return nil
		}
		delete(accs, j.i)
		mu.Lock()
		p := plans[j.i]
		delete(plans, j.i)
		mu.Unlock()
		switch {
		case p.err != nil:
			a.p.bandErr = p.err
		case p.planErr != nil:
			a.p.bandErr = p.planErr
		default:
			var err error
			if a.p.band, err = bandsOf(seed, p.samples.keys, a.values, a.p.figs); err != nil {
				return err
			}
			a.p.band.Held = p.samples.held
			if a.p.band.Failed == n {
				a.p.bandErr = fmt.Errorf("every sample failed; sample %d: %w", a.firstBad+1, a.firstErr)
			} else if a.firstErr != nil {
				a.p.sampleErr = fmt.Errorf("sample %d: %w", a.firstBad+1, a.firstErr)
			}
		}
		return done(a.p)
	})
}
