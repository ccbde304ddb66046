package study

import (
	"errors"
	"math"
	"testing"

	"n2pulse/kinetics"
)

// TestUncertaintyCountsWidthFlags: the uncertainty result counts the samples with separate
// pulses (Pulses ≥ 2) and with an ill-conditioned FWHM, as it counts truncated ones; failed
// samples count in neither. Five made-up samples: two with 2 or 3 pulses, two ill-conditioned
// (one of them also with pulses), one failed with both flags set.
func TestUncertaintyCountsWidthFlags(t *testing.T) {
	t.Parallel()
	sums := []kinetics.Summary{
		{Pulses: 1, EnergyFront: 1, FWHM: 1e-9},
		{Pulses: 2, EnergyFront: 1, FWHM: 1e-9},
		{Pulses: 1, EnergyFront: 1, FWHM: 1e-9, FWHMIllConditioned: true},
		{Pulses: 3, EnergyFront: 1, FWHM: 1e-9, FWHMIllConditioned: true},
		{Pulses: 2, EnergyFront: 1, FWHM: 1e-9, FWHMIllConditioned: true},
	}
	figs := make([]sampleFigures, len(sums))
	values := make([][]float64, len(sums))
	for i, s := range sums {
		var err error
		if i == len(sums)-1 {
			err = errors.New("failed sample")
		}
		figs[i] = figuresOf(s, err)
		values[i] = []float64{float64(i)}
	}
	res, err := bandsOf(1, []string{"k"}, values, figs)
	if err != nil {
		t.Fatal(err)
	}
	if res.Failed != 1 || res.SeparatePulses != 2 || res.IllConditionedFWHM != 2 {
		t.Errorf("failed %d, separate pulses %d, ill-conditioned FWHM %d; want 1, 2, 2", res.Failed, res.SeparatePulses, res.IllConditionedFWHM)
	}
}

// TestLengthTableWidthFlag: each curve of a length table carries the FWHM's flag per row
// (fwhm_ill_conditioned, "true"/"false"), next to pulses; a failed point leaves it empty.
// Made-up points.
func TestLengthTableWidthFlag(t *testing.T) {
	t.Parallel()
	r := &LengthResult{Curves: []LengthCurve{{Velocity: math.Inf(1), Useful: math.NaN(), Points: []LengthPoint{
		{Length: 0.1, Summary: kinetics.Summary{Pulses: 1, EnergyFront: 1, FWHM: 1e-9, FWHMIllConditioned: true}},
		{Length: 0.2, Summary: kinetics.Summary{Pulses: 1, EnergyFront: 1, FWHM: 1e-9}},
		{Length: 0.3, Err: errors.New("failed point")},
	}}}}
	tab := r.Table()
	c, pc := tab.Column("fwhm_ill_conditioned"), tab.Column("pulses")
	if c < 0 || pc < 0 || len(tab.Rows) != 3 {
		t.Fatalf("columns %v, %d rows: want pulses and fwhm_ill_conditioned, 3 rows", tab.Columns, len(tab.Rows))
	}
	for i, want := range []string{"true", "false", ""} {
		if len(tab.Rows[i]) != len(tab.Columns) || tab.Rows[i][c] != want {
			t.Errorf("row %d: %q (%d cells of %d), want fwhm_ill_conditioned %q", i, tab.Rows[i], len(tab.Rows[i]), len(tab.Columns), want)
		}
	}
}
