package study

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestBandOf checks the quantiles of a shuffled 1…101 (exact: at position 100·p the type-7
// quantile of 1…101 is 1 + 100p: 6, 51, 96), of a two-value sample (interpolated: 1.2, 3, 4.8), of one value
// and the errors.
func TestBandOf(t *testing.T) {
	t.Parallel()
	xs := make([]float64, 101)
	for i := range xs {
		xs[(i*37)%101] = float64(i + 1) // a permutation of 1…101
	}
	b, err := BandOf(xs)
	if err != nil {
		t.Fatal(err)
	}
	want := func(p float64) float64 { return 1 + 100*p }
	for _, c := range []struct {
		name      string
		got, want float64
	}{{"p05", b.P05, want(0.05)}, {"p50", b.P50, want(0.5)}, {"p95", b.P95, want(0.95)}} {
		if !scalar.EqualWithinAbsOrRel(c.got, c.want, 1e-12, 1e-12) {
			t.Errorf("%s = %g, want %g", c.name, c.got, c.want)
		}
	}
	two, err := BandOf([]float64{5, 1})
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(two.P05, 1.2, 1e-12, 1e-12) || two.P50 != 3 || !scalar.EqualWithinAbsOrRel(two.P95, 4.8, 1e-12, 1e-12) {
		t.Errorf("band of {5, 1} = %+v, want 1.2, 3, 4.8", two)
	}
	one, err := BandOf([]float64{7})
	if err != nil || one != (Band{7, 7, 7}) {
		t.Errorf("band of {7} = %+v, %v; want 7, 7, 7", one, err)
	}
	if xs[0] != 1 {
		t.Error("BandOf reordered its input")
	}
	if _, err := BandOf(nil); err == nil {
		t.Error("no samples: no error")
	}
	if _, err := BandOf([]float64{1, math.NaN(), 3}); err == nil {
		t.Error("NaN sample: no error")
	}
}

// TestRankCorrelation checks Spearman's ρ against cases with known values: any increasing
// function gives 1, a decreasing one −1, ties take mean ranks (ρ of x = 1…5 with y = 1,2,2,2,3
// is 2/√5: ranks 1,3,3,3,5 against 1…5, Σdx·dy = 8, Σdx² = 10, Σdy² = 8), no spread gives 0, and bad lengths are errors.
func TestRankCorrelation(t *testing.T) {
	t.Parallel()
	x := []float64{0.3, 1.7, 2.2, 5, 9.1, 12}
	inc, dec := make([]float64, len(x)), make([]float64, len(x))
	for i, v := range x {
		inc[i] = math.Exp(v)
		dec[i] = -v * v * v
	}
	cases := []struct {
		name string
		x, y []float64
		want float64
	}{
		{"increasing", x, inc, 1},
		{"decreasing", x, dec, -1},
		{"ties", []float64{1, 2, 3, 4, 5}, []float64{1, 2, 2, 2, 3}, 2 / math.Sqrt(5)},
		{"no spread", x, []float64{4, 4, 4, 4, 4, 4}, 0},
	}
	for _, c := range cases {
		got, err := RankCorrelation(c.x, c.y)
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbsOrRel(got, c.want, 1e-12, 1e-12) {
			t.Errorf("%s: ρ = %.16g, want %.16g", c.name, got, c.want)
		}
	}
	if _, err := RankCorrelation([]float64{1, 2, 3}, []float64{1, 2}); err == nil {
		t.Error("lengths 3 and 2: no error")
	}
	if _, err := RankCorrelation([]float64{1, 2}, []float64{1, 2}); err == nil {
		t.Error("2 values: no error")
	}
}
