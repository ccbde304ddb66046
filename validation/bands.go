package validation

import (
	"context"
	"fmt"
	"math"

	"n2pulse/kinetics"
	"n2pulse/kinetics/study"
	"n2pulse/units"
)

// BandRow is one experiment case's measured pulse energy set against the model's uncertainty
// band at the same end(s): the nominal run and the 5/50/95 % band over the samples of the
// uncertain constants (study.Uncertainty).
type BandRow struct {
	Case     string
	Source   string     // the case's source, as its measured file cites it
	End      string     // "front" or "total": the end(s) the source measured
	Measured float64    // [J]
	Nominal  float64    // the model with every constant at its value [J]
	Band     study.Band // over the samples [J]
	Samples  int        // samples with a defined energy
	Held     []string   // constants the case pins, not sampled (study.HeldConstants)
	// SeparatePulses and IllConditionedFWHM count the samples whose output is separate pulses
	// or whose FWHM is ill-conditioned (study.UncertaintyResult): the energy band holds, their
	// width is ambiguous.
	SeparatePulses, IllConditionedFWHM int
	Err                                error // the case could not be run or banded
}

// Position says where the measured energy lies against the band: "inside" (5 % ≤ measured ≤
// 95 %), "below" or "above" the band, or "" when the row has no band.
func (r BandRow) Position() string {
	switch {
	case r.Err != nil || r.Samples == 0:
		return ""
	case r.Measured < r.Band.P05:
		return "below"
	case r.Measured > r.Band.P95:
		return "above"
	}
	return "inside"
}

// ExperimentBands runs every experiment case whose source states a pulse energy n times with
// the uncertain constants sampled by a Latin hypercube of the given seed (study.Uncertainty,
// workers goroutines, 0: one per CPU) and returns one row per such case, in case order. A case
// that fails carries its error in its row; an error is returned only when the cases cannot be
// read or n is out of range.
func ExperimentBands(n int, seed uint64, workers int) ([]BandRow, error) {
	if err := study.CheckSamples("samples", n); err != nil || n == 0 {
		return nil, fmt.Errorf("validation: %d samples, want %d…%d", n, study.MinSamples, study.MaxSamples)
	}
	cases, err := loadExperiments(experimentFiles)
	if err != nil {
		return nil, err
	}
	var rows []BandRow
	for i := range cases {
		c := &cases[i]
		e := c.Measured.Energy
		if e == nil {
			continue
		}
		row := BandRow{Case: c.Name, Source: c.Measured.Source, End: e.End, Measured: math.NaN(), Nominal: math.NaN()}
		if row.Measured, err = units.Parse(e.Value, units.Energy); err != nil {
			row.Err = fmt.Errorf("validation: %s: measured energy %q: %w", c.Name, e.Value, err)
			rows = append(rows, row)
			continue
		}
		metric := "energy_front_J"
		if e.End == "total" {
			metric = "energy_total_J"
		}
		d := c.Design.Clone()
		r, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
		if err != nil {
			row.Err = fmt.Errorf("validation: %s: %w", c.Name, err)
			rows = append(rows, row)
			continue
		}
		row.Nominal = r.Summary.EnergyFront
		if e.End == "total" {
			row.Nominal = r.Summary.EnergyTotal
		}
		u, err := study.Uncertainty(context.Background(), d, n, seed, workers, nil)
		if err != nil {
			row.Err = fmt.Errorf("validation: %s: %w", c.Name, err)
			rows = append(rows, row)
			continue
		}
		row.Held = u.Held
		row.SeparatePulses, row.IllConditionedFWHM = u.SeparatePulses, u.IllConditionedFWHM
		if b, ok := u.Metric(metric); ok {
			row.Band, row.Samples = b.Band, b.Samples
		} else {
			row.Err = fmt.Errorf("validation: %s: fewer than three samples define %s", c.Name, metric)
		}
		rows = append(rows, row)
	}
	return rows, nil
}
