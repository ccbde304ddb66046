package kinetics

import (
	"runtime"
	"sync"
	"sync/atomic"

	"n2pulse/kinetics/design"
)

// circuitFeed runs the circuit on its own goroutine while the shot consumes its samples
// (RunSettings.Overlap). The circuit does not depend on the light, so the shot may take step
// k as soon as sample k is final; the samples are the same numbers as those of a circuit
// solved before the shot, so the results are too.
//
// The circuit writes sample k of the waveforms before it publishes a count above k, and
// never writes it again; the shot reads only samples below the published count until the
// circuit is done.
type circuitFeed struct {
	wf    *waveforms
	ready atomic.Int64 // samples final so far

	mu   sync.Mutex
	cond sync.Cond
	done bool  // the circuit has returned (guarded by mu)
	err  error // its error, once done
	st   Stats // its statistics, once done
}

// feedChunk is how many samples ahead of the one it needs a waiting shot asks for, so that
// it is woken about once per this many samples rather than at every integrator step.
const feedChunk = 32

// overlapWanted reports whether a run with settings s overlaps its circuit and shot: when
// the caller asked for it and the process may run two goroutines at once.
func overlapWanted(s *RunSettings) bool {
	return s.Overlap && (runtime.GOMAXPROCS(0) >= 2 || s.overlapAlways)
}

// startCircuit allocates the waveforms of steps samples and starts the circuit filling
// them on a goroutine of its own. The caller must call wait before it returns, whatever
// happens, so that the goroutine never outlives the run.
func startCircuit(c *circuit, d *design.Design, par *Parameters, steps int, series bool) *circuitFeed {
	f := &circuitFeed{wf: newWaveforms(steps, series)}
	f.cond.L = &f.mu
	go func() {
		st, err := fillCircuit(f.wf, c, d, par, steps, series, f)
		f.mu.Lock()
		f.done, f.err, f.st = true, err, st
		f.cond.Broadcast()
		f.mu.Unlock()
	}()
	return f
}

// publish marks the samples below k final and wakes a waiting shot.
func (f *circuitFeed) publish(k int) {
	f.mu.Lock()
	f.ready.Store(int64(k))
	f.cond.Broadcast()
	f.mu.Unlock()
}

// await waits until sample k is final (or, waiting, a few more: feedChunk, up to steps) and
// reports whether it is; false means the circuit stopped on an error before sample k.
func (f *circuitFeed) await(k, steps int) bool {
	if f.ready.Load() > int64(k) {
		return true
	}
	want := int64(min(k+feedChunk, steps-1))
	f.mu.Lock()
	defer f.mu.Unlock()
	for f.ready.Load() <= want && !f.done {
		f.cond.Wait()
	}
	return f.ready.Load() > int64(k)
}

// wait waits for the circuit to return and gives its statistics and error.
func (f *circuitFeed) wait() (Stats, error) {
	f.mu.Lock()
	defer f.mu.Unlock()
	for !f.done {
		f.cond.Wait()
	}
	return f.st, f.err
}
