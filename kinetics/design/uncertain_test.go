package design

import (
	"math"
	"sort"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestSpreadsHoldDefaults checks every uncertain key: it is a numeric design key, its range is
// ordered, contains the default of Defaults and lies inside the key's allowed range (so every
// sampled value can be set), its distribution is known (log-uniform only on positive ranges)
// and it names a source.
func TestSpreadsHoldDefaults(t *testing.T) {
	t.Parallel()
	list := Spreads()
	if len(list) < 7 {
		t.Fatalf("%d uncertain keys, want at least 7", len(list))
	}
	if !sort.SliceIsSorted(list, func(i, j int) bool { return list[i].Key < list[j].Key }) {
		t.Error("Spreads not sorted by key")
	}
	d := Defaults()
	seen := map[string]bool{}
	for _, s := range list {
		if seen[s.Key] {
			t.Errorf("%s listed twice", s.Key)
		}
		seen[s.Key] = true
		lo, hi, _, ok := KeyRange(s.Key)
		if !ok {
			t.Errorf("%s: not a numeric design key", s.Key)
			continue
		}
		def, err := d.Get(s.Key)
		if err != nil {
			t.Fatal(err)
		}
		if !(s.Low < s.High) {
			t.Errorf("%s: range %g…%g not ordered", s.Key, s.Low, s.High)
		}
		if !(def >= s.Low && def <= s.High) {
			t.Errorf("%s: default %g outside its range %g…%g", s.Key, def, s.Low, s.High)
		}
		if s.Low < lo || s.High > hi {
			t.Errorf("%s: range %g…%g leaves the allowed %g…%g", s.Key, s.Low, s.High, lo, hi)
		}
		if s.Distribution != Uniform && s.Distribution != LogUniform {
			t.Errorf("%s: distribution %q", s.Key, s.Distribution)
		}
		if s.Distribution == LogUniform && !(s.Low > 0) {
			t.Errorf("%s: log-uniform from %g", s.Key, s.Low)
		}
		if len(s.Source) < 20 {
			t.Errorf("%s: source %q, want the publication", s.Key, s.Source)
		}
		if got, ok := KeySpread(s.Key); !ok || got != s {
			t.Errorf("KeySpread(%s) = %+v, %v; want %+v", s.Key, got, ok, s)
		}
	}
	if _, ok := KeySpread("channel.length"); ok {
		t.Error("channel.length has a spread, want none (an apparatus key, not a constant)")
	}
}

// TestSpreadPublishedRanges pins two ranges to the spread stated in the reference sheet
// (physics-data.md §3a: k_N2 = 1.0–1.5e-11, k_O2 = 2.7–3.3e-10 cm³/s, converted to m³/s).
func TestSpreadPublishedRanges(t *testing.T) {
	t.Parallel()
	for key, want := range map[string][2]float64{
		"levels.upper_quenching_nitrogen": {1.0e-17, 1.5e-17},
		"levels.upper_quenching_oxygen":   {2.7e-16, 3.3e-16},
	} {
		s, ok := KeySpread(key)
		if !ok {
			t.Errorf("%s: no spread", key)
			continue
		}
		if !scalar.EqualWithinAbsOrRel(s.Low, want[0], 0, 1e-12) || !scalar.EqualWithinAbsOrRel(s.High, want[1], 0, 1e-12) {
			t.Errorf("%s: range %g…%g, want %g…%g", key, s.Low, s.High, want[0], want[1])
		}
	}
}

// TestSpreadQuantile checks the inverse distributions: the ends map to the range's ends, the
// median of a uniform spread is the midpoint and of a log-uniform spread the geometric mean
// (1e-12 relative), and bad input is an error.
func TestSpreadQuantile(t *testing.T) {
	t.Parallel()
	uni := Spread{Key: "u", Low: 2, High: 6, Distribution: Uniform}
	logu := Spread{Key: "l", Low: 0.5, High: 2, Distribution: LogUniform}
	cases := []struct {
		s       Spread
		u, want float64
	}{
		{uni, 0, 2}, {uni, 1, 6}, {uni, 0.5, 4}, {uni, 0.25, 3},
		{logu, 0, 0.5}, {logu, 1, 2}, {logu, 0.5, 1}, {logu, 0.25, math.Sqrt(0.5)},
	}
	for _, c := range cases {
		got, err := c.s.Quantile(c.u)
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbsOrRel(got, c.want, 0, 1e-12) {
			t.Errorf("%s Quantile(%g) = %.15g, want %g", c.s.Distribution, c.u, got, c.want)
		}
	}
	for _, u := range []float64{-0.1, 1.1, math.NaN()} {
		if _, err := uni.Quantile(u); err == nil {
			t.Errorf("Quantile(%g): no error", u)
		}
	}
	if _, err := (Spread{Key: "x", Low: 0, High: 1, Distribution: LogUniform}).Quantile(0.5); err == nil {
		t.Error("log-uniform from 0: no error")
	}
	if _, err := (Spread{Key: "x", Low: 0, High: 1, Distribution: "normal"}).Quantile(0.5); err == nil {
		t.Error("unknown distribution: no error")
	}
	// every shipped spread maps its whole range inside itself
	for _, s := range Spreads() {
		for _, u := range []float64{0, 0.5, 1} {
			x, err := s.Quantile(u)
			if err != nil || x < s.Low || x > s.High {
				t.Errorf("%s Quantile(%g) = %g, %v; want inside %g…%g", s.Key, u, x, err, s.Low, s.High)
			}
		}
	}
}
