package validation

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestExperimentBands: one row per experiment case with a measured energy, in case order; the
// measured value is the one the scoreboard reads from the case's measured file (the builders'
// reports cited there) and the nominal energy the scoreboard's run of the case; every row has
// an ordered band over the 10 samples and a position that agrees with it. A sample count
// outside 10…100000 is an error. Each row counts its samples with separate pulses and with an
// ill-conditioned FWHM.
func TestExperimentBands(t *testing.T) {
	if testing.Short() {
		t.Skip("runs every experiment case 11 times")
	}
	rows, err := ExperimentBands(10, 1, 0)
	if err != nil {
		t.Fatal(err)
	}
	score, err := Scoreboard()
	if err != nil {
		t.Fatal(err)
	}
	var want []ScoreRow
	for _, s := range score {
		if !math.IsNaN(s.Measured) {
			want = append(want, s)
		}
	}
	if len(rows) != len(want) || len(rows) == 0 {
		t.Fatalf("%d rows; want one per case with a measured energy (%d)", len(rows), len(want))
	}
	for i, r := range rows {
		s := want[i]
		if r.Err != nil {
			t.Errorf("%s: %v", r.Case, r.Err)
			continue
		}
		if r.Case != s.Case || r.Measured != s.Measured || !scalar.EqualWithinAbsOrRel(r.Nominal, s.Energy, 0, 1e-9) {
			t.Errorf("row %d: %s measured %g J, nominal %g J; the scoreboard has %s, %g J, %g J", i, r.Case, r.Measured, r.Nominal, s.Case, s.Measured, s.Energy)
		}
		b := r.Band
		if r.Samples < 3 || r.Samples > 10 || !(b.P05 > 0 && b.P05 <= b.P50 && b.P50 <= b.P95) {
			t.Errorf("%s: band %+v over %d samples; want 0 < p05 ≤ p50 ≤ p95 over 3…10", r.Case, b, r.Samples)
		}
		var pos string
		switch {
		case r.Measured < b.P05:
			pos = "below"
		case r.Measured > b.P95:
			pos = "above"
		default:
			pos = "inside"
		}
		if r.Position() != pos {
			t.Errorf("%s: position %q for %g J against %g…%g J; want %q", r.Case, r.Position(), r.Measured, b.P05, b.P95, pos)
		}
	}
	// The rows carry the study's counts of samples with separate pulses and with an
	// ill-conditioned FWHM: the 8.8 cm cases' round-trip spikes make 4 (v1) and 3 (v2) of 10
	// samples ill-conditioned at seed 1 (the model's own behaviour, as run --uncertainty 10
	// counts it), the 11 mm cases none; no case makes separate pulses.
	wantFlags := map[string][2]int{"tea-transfer-88mm-v1": {0, 4}, "tea-transfer-88mm-v2": {0, 3}, "tea-blumlein-11mm-air": {0, 0}, "tea-blumlein-11mm-n2": {0, 0}}
	for _, r := range rows {
		w, ok := wantFlags[r.Case]
		if !ok {
			w = [2]int{0, 0}
		}
		if r.SeparatePulses != w[0] || r.IllConditionedFWHM != w[1] {
			t.Errorf("%s: %d samples with separate pulses, %d with an ill-conditioned FWHM; want %d, %d", r.Case, r.SeparatePulses, r.IllConditionedFWHM, w[0], w[1])
		}
	}
	for _, n := range []int{0, 5, 100001} {
		if _, err := ExperimentBands(n, 1, 0); err == nil {
			t.Errorf("%d samples: no error", n)
		}
	}
}
