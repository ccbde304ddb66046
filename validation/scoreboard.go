package validation

import (
	"bytes"
	"fmt"
	"math"

	"n2pulse/units"
)

// ScoreRow is one experiment case on the scoreboard: how hard the model drove the gas and how
// far its pulse energy and width are from the measured ones. The trend of the ratios with
// the loading is the point of the board: a model that converts a fixed share of the
// electrons' power into light errs more the harder the gas is driven.
type ScoreRow struct {
	Case              string
	EnergyPerMolecule float64 // energy into the plasma per molecule of the discharge volume [eV]
	SpecificEnergy    float64 // energy into the plasma per discharge volume [J/m³]
	CurrentDensity    float64 // peak current density [A/m²]
	UniformGlow       bool    // the shot keeps the limits of a uniform glow
	Lases             bool    // the model gives laser output above the spontaneous-emission floor
	Energy, Measured  float64 // model and measured pulse energy at the measured end(s) [J]; NaN when not measured
	FWHM, MeasuredW   float64 // model and measured pulse width (FWHM) [s]; NaN when not measured
	Err               error   // the run failed
}

// EnergyRatio is model/measured pulse energy (NaN when not measured or failed).
func (r ScoreRow) EnergyRatio() float64 { return r.Energy / r.Measured }

// FWHMRatio is model/measured pulse width (NaN when not measured or failed).
func (r ScoreRow) FWHMRatio() float64 { return r.FWHM / r.MeasuredW }

// ScoreFigure draws the scoreboard figure (ratios against loading) into path. Validation does
// not draw: the command passes one built on package plots.
type ScoreFigure func(path string, rows []ScoreRow) error

// ScoreboardFigureName is the file name of the scoreboard figure in the report.
const ScoreboardFigureName = "scoreboard.png"

// Scoreboard returns one row per experiment case, in case order. The model runs once per
// process, shared with Variations and the "experiments" registry group.
func Scoreboard() ([]ScoreRow, error) {
	r := experimentResults()
	return r.scores, r.err
}

// scoreRow builds the row of case c from its base run j.
func scoreRow(c *expCase, j *job) ScoreRow {
	row := ScoreRow{Case: c.Name, Energy: math.NaN(), Measured: math.NaN(), FWHM: math.NaN(), MeasuredW: math.NaN(), Err: j.err}
	s := j.sum
	if j.err == nil {
		row.EnergyPerMolecule, row.SpecificEnergy, row.CurrentDensity = s.EnergyPerMolecule, s.SpecificEnergy, s.PeakCurrentDensity
		row.UniformGlow, row.Lases = s.UniformGlow, s.Lases
	}
	m := c.Measured
	if m.Energy != nil {
		if v, err := units.Parse(m.Energy.Value, units.Energy); err == nil {
			row.Measured = v
			if j.err == nil {
				row.Energy = s.EnergyFront
				if m.Energy.End == "total" {
					row.Energy = s.EnergyTotal
				}
			}
		}
	}
	if m.FWHM != nil {
		if v, err := units.Parse(m.FWHM.Value, units.Time); err == nil {
			row.MeasuredW = v
			if j.err == nil {
				row.FWHM = s.FWHM
			}
		}
	}
	return row
}

// writeScoreboard writes the scoreboard section of checks.md; fig is the figure's file name
// or "" when none was drawn.
func writeScoreboard(w *bytes.Buffer, rows []ScoreRow, fig string) {
	if len(rows) == 0 {
		return
	}
	fmt.Fprintf(w, "\n## Scoreboard: model/measured against the specific loading\n\n")
	fmt.Fprintf(w, "Energy at the end(s) the source measured; FWHM of the output-end pulse. The loading is the\n")
	fmt.Fprintf(w, "model's energy into the plasma per molecule of the discharge volume (gap × width × length).\n")
	fmt.Fprintf(w, "\"no\" in the glow column: outside the uniform-glow regime, so the model is an upper bound.\n\n")
	if fig != "" {
		fmt.Fprintf(w, "![scoreboard](%s)\n\n", fig)
	}
	fmt.Fprintf(w, "| case | eV per molecule | J/cm³ | kA/cm² | uniform glow | energy model / measured | ratio | FWHM model / measured | ratio |\n")
	fmt.Fprintf(w, "| --- | --- | --- | --- | --- | --- | --- | --- | --- |\n")
	for _, r := range rows {
		if r.Err != nil {
			fmt.Fprintf(w, "| %s | error: %s | | | | | | | |\n", r.Case, mdCell(r.Err.Error()))
			continue
		}
		fmt.Fprintf(w, "| %s | %.3g | %.3g | %.3g | %s | %s / %s | %s | %s / %s | %s |\n", r.Case,
			r.EnergyPerMolecule, r.SpecificEnergy*1e-6, r.CurrentDensity*1e-7, yesNo(r.UniformGlow),
			scoreValue(r.Energy*1e6, "µJ"), scoreValue(r.Measured*1e6, "µJ"), scoreValue(r.EnergyRatio(), ""),
			scoreValue(r.FWHM*1e9, "ns"), scoreValue(r.MeasuredW*1e9, "ns"), scoreValue(r.FWHMRatio(), ""))
	}
}

// scoreValue prints v with its unit, or "–" when v is NaN.
func scoreValue(v float64, unit string) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "–"
	}
	if unit == "" {
		return fmt.Sprintf("%.3g", v)
	}
	return fmt.Sprintf("%.3g %s", v, unit)
}
