package study

import (
	"context"
	"fmt"
	"math"
	"reflect"
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
	Samples   int          `json:"samples"`
	Seed      uint64       `json:"seed"`
	Keys      []string     `json:"keys"`      // the sampled constants (design.Spreads)
	Failed    int          `json:"failed"`    // samples whose run failed; left out of every band
	Truncated int          `json:"truncated"` // samples whose pulse outlasted the run; kept, and counted here
	Lasing    int          `json:"lasing"`    // samples that reach the lasing threshold (kinetics.Summary.Lases)
	Metrics   []MetricBand `json:"metrics"`   // one per numeric figure of merit with ≥ 3 defined samples
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
	if run == nil {
		run = ModelRunner
	}
	sums := make([]kinetics.Summary, n)
	ok := make([]bool, n)
	idx := make([]int, n)
	for i := range idx {
		idx[i] = i
	}
	var firstErr error
	err = evaluate(ctx, idx, workers, func(i int) (*design.Design, error) { return designs[i], nil }, run,
		func(o outcome) error {
			if o.err != nil {
				if firstErr == nil {
					firstErr = fmt.Errorf("sample %d: %w", o.i+1, o.err)
				}
				return nil
			}
			sums[o.i], ok[o.i] = o.sum, true
			return nil
		})
	if err != nil {
		return nil, err
	}
	res := &UncertaintyResult{Samples: n, Seed: seed, Keys: keys}
	var good []int
	for i := range ok {
		switch {
		case !ok[i]:
			res.Failed++
		default:
			good = append(good, i)
			if sums[i].Truncated {
				res.Truncated++
			}
			if sums[i].Lases {
				res.Lasing++
			}
		}
	}
	if len(good) == 0 {
		return nil, fmt.Errorf("study: every sample failed; first: %w", firstErr)
	}
	for fi := range summaryType.NumField() {
		f := summaryType.Field(fi)
		name := tableName(f)
		if k := f.Type.Kind(); name == "" || (k != reflect.Float64 && k != reflect.Int) {
			continue
		}
		var ys []float64
		var rows []int
		for _, i := range good {
			v := reflect.ValueOf(sums[i]).Field(fi)
			y := 0.0
			if v.Kind() == reflect.Int {
				y = float64(v.Int())
			} else {
				y = v.Float()
			}
			if math.IsNaN(y) || math.IsInf(y, 0) || (y == 0 && undefinedAtZero[name]) {
				continue
			}
			ys, rows = append(ys, y), append(rows, i)
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
