package study

import (
	"errors"
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
