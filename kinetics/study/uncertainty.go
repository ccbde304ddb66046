package study

import (
	"context"
	"fmt"
	"math"
	"reflect"
	"slices"
	"sort"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// Driver is one sampled constant's hold on a figure of merit: Spearman's rank correlation of
// the constant's sampled values with the figure over the samples.
type Driver struct {
	Key             string  `json:"key"`
	RankCorrelation float64 `json:"rank_correlation"`
}

// MetricBand is the band of one numeric figure of merit over the samples and the constants
// that drive it, the strongest (largest |ρ|) first.
type MetricBand struct {
	Metric  string   `json:"metric"`
	Band             // P05, P50, P95
	Samples int      `json:"samples"` // samples with a defined value of this figure
	Drivers []Driver `json:"drivers"`
}

// UncertaintyResult is the outcome of an uncertainty study of one design.
type UncertaintyResult struct {
	Samples   int      `json:"samples"`
	Seed      uint64   `json:"seed"`
	Keys      []string `json:"keys"`      // the sampled constants (design.Spreads)
	Held      []string `json:"held"`      // constants the design uses but pins, held at its values (HeldConstants)
	Failed    int      `json:"failed"`    // samples whose run failed; left out of every band
	Truncated int      `json:"truncated"` // samples whose pulse outlasted the run; kept, and counted here
	Lasing    int      `json:"lasing"`    // samples that reach the lasing threshold (kinetics.Summary.Lases)
	// SeparatePulses counts the samples whose output is two or more separate pulses
	// (kinetics.Summary.Pulses ≥ 2): their FWHM spans them all, so the FWHM band mixes widths
	// of one pulse and of several.
	SeparatePulses int `json:"separate_pulses"`
	// IllConditionedFWHM counts the samples whose FWHM is ill-conditioned
	// (kinetics.Summary.FWHMIllConditioned): part of the FWHM band's spread may be edges
	// leaping between spikes rather than the constants' effect.
	IllConditionedFWHM int          `json:"fwhm_ill_conditioned"`
	Metrics            []MetricBand `json:"metrics"` // one per numeric figure of merit with ≥ 3 defined samples
	// figs are the samples' figures, for bands of ratios between two studies (RatioBand).
	figs []sampleFigures
}

// Uncertainty runs base n times with the constants of design.Spreads drawn by a Latin
// hypercube of the given seed (UncertainDesigns) on workers goroutines (0: one per CPU), and
// returns the 5/50/95 % band of every numeric figure of merit with its drivers. The samples are
// made before any runs, so the result does not depend on workers. run nil means ModelRunner.
// A sample whose run fails is counted and left out; if every sample fails, the first error is
// returned.
func Uncertainty(ctx context.Context, base *design.Design, n int, seed uint64, workers int, run Runner) (*UncertaintyResult, error) {
	designs, keys, values, err := UncertainDesigns(base, n, seed)
	if err != nil {
		return nil, err
	}
	res, err := uncertaintyOf(ctx, designs, keys, values, seed, workers, run)
	if err != nil {
		return nil, err
	}
	res.Held = HeldConstants(base)
	return res, nil
}

// uncertaintyOf runs the sample designs (made by UncertainDesigns: keys, values) and makes
// their result, as Uncertainty.
func uncertaintyOf(ctx context.Context, designs []*design.Design, keys []string, values [][]float64, seed uint64, workers int, run Runner) (*UncertaintyResult, error) {
	n := len(designs)
	if run == nil {
		run = ModelRunner
	}
	figs := make([]sampleFigures, n)
	idx := make([]int, n)
	for i := range idx {
		idx[i] = i
	}
	var firstErr error
	err := evaluate(ctx, idx, workers, func(i int) (*design.Design, error) { return designs[i], nil }, run,
		func(o outcome) error {
			if o.err != nil && firstErr == nil {
				firstErr = fmt.Errorf("sample %d: %w", o.i+1, o.err)
			}
			figs[o.i] = figuresOf(o.sum, o.err)
			return nil
		})
	if err != nil {
		return nil, err
	}
	res, err := bandsOf(seed, keys, values, figs)
	if err != nil {
		return nil, err
	}
	res.figs = figs
	if res.Failed == n {
		return nil, fmt.Errorf("study: every sample failed; first: %w", firstErr)
	}
	return res, nil
}

// sampleFigures is what one sample keeps of its run: the numeric figures of merit in
// NumericMetrics order (NaN where undefined), whether it lased, was cut short, made separate
// pulses or an ill-conditioned FWHM, or that it failed.
type sampleFigures struct {
	vals               []float64
	ok                 bool
	lases, truncated   bool
	separate, illWidth bool // two or more separate pulses; an ill-conditioned FWHM
}

// figuresOf reads the numeric figures of merit of a run (err nil) into a sampleFigures: an
// undefined value (NaN, infinite, or 0 for the metrics of undefinedAtZero) is NaN.
func figuresOf(s kinetics.Summary, err error) sampleFigures {
	if err != nil {
		return sampleFigures{}
	}
	f := sampleFigures{ok: true, lases: s.Lases, truncated: s.Truncated, separate: s.Pulses >= 2, illWidth: s.FWHMIllConditioned}
	v := reflect.ValueOf(s)
	for fi := range summaryType.NumField() {
		field := summaryType.Field(fi)
		name := tableName(field)
		if k := field.Type.Kind(); name == "" || (k != reflect.Float64 && k != reflect.Int) {
			continue
		}
		x := v.Field(fi)
		y := 0.0
		if x.Kind() == reflect.Int {
			y = float64(x.Int())
		} else {
			y = x.Float()
		}
		if math.IsInf(y, 0) || (y == 0 && undefinedAtZero[name]) {
			y = math.NaN()
		}
		f.vals = append(f.vals, y)
	}
	return f
}

// bandsOf makes the result of an uncertainty study from its samples: figs[i] and values[i]
// (the sampled constants, in keys order) of sample i. A figure of merit gets a band when at
// least three samples define it. It does not fail when every sample failed (Failed says so).
func bandsOf(seed uint64, keys []string, values [][]float64, figs []sampleFigures) (*UncertaintyResult, error) {
	res := &UncertaintyResult{Samples: len(figs), Seed: seed, Keys: keys}
	var good []int
	for i, f := range figs {
		if !f.ok {
			res.Failed++
			continue
		}
		good = append(good, i)
		if f.truncated {
			res.Truncated++
		}
		if f.lases {
			res.Lasing++
		}
		if f.separate {
			res.SeparatePulses++
		}
		if f.illWidth {
			res.IllConditionedFWHM++
		}
	}
	if len(good) == 0 {
		return res, nil
	}
	for m, name := range NumericMetrics() {
		var ys []float64
		var rows []int
		for _, i := range good {
			if y := figs[i].vals[m]; !math.IsNaN(y) {
				ys, rows = append(ys, y), append(rows, i)
			}
		}
		if len(ys) < 3 {
			continue
		}
		b, err := BandOf(ys)
		if err != nil {
			return nil, err
		}
		mb := MetricBand{Metric: name, Band: b, Samples: len(ys)}
		for j, key := range keys {
			xs := make([]float64, len(rows))
			for k, i := range rows {
				xs[k] = values[i][j]
			}
			rho, err := RankCorrelation(xs, ys)
			if err != nil {
				return nil, err
			}
			mb.Drivers = append(mb.Drivers, Driver{Key: key, RankCorrelation: rho})
		}
		sort.SliceStable(mb.Drivers, func(a, c int) bool {
			return math.Abs(mb.Drivers[a].RankCorrelation) > math.Abs(mb.Drivers[c].RankCorrelation)
		})
		res.Metrics = append(res.Metrics, mb)
	}
	return res, nil
}

// MayNotLase reports whether the samples straddle the lasing threshold: some lase and some do
// not.
func (r *UncertaintyResult) MayNotLase() bool {
	ok := r.Samples - r.Failed
	return r.Lasing > 0 && r.Lasing < ok
}

// Metric returns the band of a named figure of merit and whether it has one.
func (r *UncertaintyResult) Metric(name string) (MetricBand, bool) {
	for _, m := range r.Metrics {
		if m.Metric == name {
			return m, true
		}
	}
	return MetricBand{}, false
}

// RatioBand returns the band of the ratio b/a of a figure of merit between two designs studied
// with the same samples (the same seed, count and sampled constants, so that sample i of each
// carries the same constant values: a paired comparison, whose band is narrower than the two
// bands side by side when both designs answer the constants alike). Samples where either
// failed, either value is undefined or a's is 0 are left out; ok is false when the studies are
// not paired or fewer than three ratios remain.
func RatioBand(a, b *UncertaintyResult, metric string) (Band, bool) {
	m := slices.Index(NumericMetrics(), metric)
	if a == nil || b == nil || m < 0 || a.Seed != b.Seed || len(a.figs) != len(b.figs) || !slices.Equal(a.Keys, b.Keys) {
		return Band{}, false
	}
	var rs []float64
	for i := range a.figs {
		fa, fb := a.figs[i], b.figs[i]
		if !fa.ok || !fb.ok {
			continue
		}
		x, y := fa.vals[m], fb.vals[m]
		if r := y / x; x != 0 && !math.IsNaN(r) && !math.IsInf(r, 0) {
			rs = append(rs, r)
		}
	}
	if len(rs) < 3 {
		return Band{}, false
	}
	band, err := BandOf(rs)
	return band, err == nil
}
