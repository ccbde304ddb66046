package study

import (
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/stat"
)

// Band is the spread of one figure of merit over the samples of an uncertainty study: the
// median and the 5 % and 95 % quantiles.
type Band struct {
	P05 float64 `json:"p05"`
	P50 float64 `json:"p50"`
	P95 float64 `json:"p95"`
}

// BandOf returns the 5, 50 and 95 % quantiles of xs, interpolated linearly between the order
// statistics at position (n−1)·p (type 7 of Hyndman & Fan, Am. Stat. 50, 361 (1996), from
// memory: the median of an odd sample is its middle value, which gonum's stat.LinInterp, an
// interpolation of the empirical distribution at n·p, does not give). NaN values are an error:
// a failed sample must be left out or reported, never averaged over. Infinite values (a
// quantity beyond a scan's range) sort to the ends, and a quantile that reaches them is
// infinite.
func BandOf(xs []float64) (Band, error) {
	if len(xs) == 0 {
		return Band{}, fmt.Errorf("study: band of no samples")
	}
	s := append([]float64(nil), xs...)
	for i, x := range s {
		if math.IsNaN(x) {
			return Band{}, fmt.Errorf("study: sample %d is NaN", i+1)
		}
	}
	sort.Float64s(s)
	q := func(p float64) float64 {
		h := float64(len(s)-1) * p
		i := int(math.Floor(h))
		if i >= len(s)-1 {
			return s[len(s)-1]
		}
		if h == float64(i) {
			return s[i]
		}
		if math.IsInf(s[i+1], 0) {
			return s[i+1] // among infinite values: no interpolation
		}
		return s[i] + (h-float64(i))*(s[i+1]-s[i])
	}
	return Band{P05: q(0.05), P50: q(0.5), P95: q(0.95)}, nil
}

// RankCorrelation returns Spearman's rank correlation of x and y: the Pearson correlation of
// their ranks, ties given their mean rank. It measures how monotonically a figure of merit y
// follows a sampled constant x, whatever the shape of the dependence; in a Latin-hypercube study
// it ranks which constants drive the band. It is 0 when either has no spread.
func RankCorrelation(x, y []float64) (float64, error) {
	if len(x) != len(y) {
		return 0, fmt.Errorf("study: rank correlation of %d and %d values", len(x), len(y))
	}
	if len(x) < 3 {
		return 0, fmt.Errorf("study: rank correlation of %d values, want at least 3", len(x))
	}
	rx, ry := ranks(x), ranks(y)
	if constant(rx) || constant(ry) {
		return 0, nil
	}
	return stat.Correlation(rx, ry, nil), nil
}

// ranks returns the rank (1…n) of every value of x, tied values sharing their mean rank.
func ranks(x []float64) []float64 {
	idx := make([]int, len(x))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return x[idx[a]] < x[idx[b]] })
	r := make([]float64, len(x))
	for i := 0; i < len(idx); {
		j := i
		for j+1 < len(idx) && x[idx[j+1]] == x[idx[i]] {
			j++
		}
		mean := float64(i+j)/2 + 1
		for k := i; k <= j; k++ {
			r[idx[k]] = mean
		}
		i = j + 1
	}
	return r
}

func constant(x []float64) bool {
	for _, v := range x {
		if v != x[0] {
			return false
		}
	}
	return true
}
