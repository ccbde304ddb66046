package study

import (
	"context"
	"fmt"
	"math"

	"gonum.org/v1/gonum/interp"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// MaxEnvelopeSamples bounds the samples an Envelope is made of, since each keeps its trace on
// the grid: a study of more samples draws its envelope from its first MaxEnvelopeSamples (a
// random subset of the hypercube, unbiased but no longer stratified).
const MaxEnvelopeSamples = 10000

// maxEnvelopeGrid bounds the times of an envelope's grid.
const maxEnvelopeGrid = 5000

// Envelope is the band of the output-end power over the samples of an uncertainty study: at
// every time of Time [s after switch closure] the 5, 50 and 95 % values [W] over the samples
// that ran. The traces are aligned at switch closure, the zero of every run's time.
type Envelope struct {
	Time          []float64
	P05, P50, P95 []float64
	Samples       int // samples whose traces make the envelope
}

// UncertaintyEnvelope is Uncertainty (the same samples, bands and drivers) whose samples also
// keep their output-end power, interpolated linearly onto grid [s after switch closure, strictly
// increasing] and zero outside the sample's run, for the Envelope of the power over the samples.
// Each sample runs the full model with waveforms (kinetics.Run) with memLimit [bytes] (0: the
// default); only the first MaxEnvelopeSamples samples keep a trace.
func UncertaintyEnvelope(ctx context.Context, base *design.Design, n int, seed uint64, workers int, memLimit int64, grid []float64) (*UncertaintyResult, *Envelope, error) {
	if len(grid) < 2 || len(grid) > maxEnvelopeGrid {
		return nil, nil, fmt.Errorf("study: envelope grid of %d times, want 2…%d", len(grid), maxEnvelopeGrid)
	}
	for i, t := range grid {
		if math.IsNaN(t) || math.IsInf(t, 0) || (i > 0 && !(t > grid[i-1])) {
			return nil, nil, fmt.Errorf("study: envelope grid time %d (%g s): want finite, strictly increasing times", i, t)
		}
	}
	designs, keys, values, err := UncertainDesigns(base, n, seed)
	if err != nil {
		return nil, nil, err
	}
	index := make(map[*design.Design]int, n)
	for i, d := range designs {
		index[d] = i
	}
	kept := min(n, MaxEnvelopeSamples)
	traces := make([][]float64, kept) // slot i written only by the run of sample i
	run := func(d *design.Design) (kinetics.Summary, error) {
		i := index[d]
		r, err := kinetics.Run(d, &kinetics.RunSettings{Light: i >= kept, MemoryLimit: memLimit})
		if err != nil {
			return kinetics.Summary{}, err
		}
		if i < kept {
			traces[i] = onGrid(r.Time, r.PowerFront, grid)
		}
		return r.Summary, nil
	}
	res, err := uncertaintyOf(ctx, designs, keys, values, seed, workers, run)
	if err != nil {
		return nil, nil, err
	}
	res.Held = HeldConstants(base)
	env := &Envelope{Time: append([]float64(nil), grid...)}
	col := make([]float64, 0, kept)
	for k := range grid {
		col = col[:0]
		for _, tr := range traces {
			if tr != nil {
				col = append(col, tr[k])
			}
		}
		if len(col) == 0 {
			return res, nil, nil
		}
		b, err := BandOf(col)
		if err != nil {
			return nil, nil, err
		}
		env.P05, env.P50, env.P95 = append(env.P05, b.P05), append(env.P50, b.P50), append(env.P95, b.P95)
		env.Samples = len(col)
	}
	return res, env, nil
}

// onGrid interpolates the series (t, y) linearly at the times of grid, zero outside t's span;
// NaN values of y count as zero.
func onGrid(t, y, grid []float64) []float64 {
	out := make([]float64, len(grid))
	if len(t) < 2 || len(t) != len(y) {
		return out
	}
	// gonum's PiecewiseLinear wants strictly increasing x: keep the last of equal times.
	xs, ys := make([]float64, 0, len(t)), make([]float64, 0, len(t))
	for i := range t {
		v := y[i]
		if math.IsNaN(v) {
			v = 0
		}
		if len(xs) > 0 && !(t[i] > xs[len(xs)-1]) {
			ys[len(ys)-1] = v
			continue
		}
		xs, ys = append(xs, t[i]), append(ys, v)
	}
	if len(xs) < 2 {
		return out
	}
	var pl interp.PiecewiseLinear
	if err := pl.Fit(xs, ys); err != nil {
		return out
	}
	for k, g := range grid {
		if g >= xs[0] && g <= xs[len(xs)-1] {
			out[k] = pl.Predict(g)
		}
	}
	return out
}
