package main

import (
	"fmt"
	"io"
	"math"
	"strings"

	"n2pulse/kinetics/study"
	"n2pulse/plots"
	"n2pulse/report"
)

// sweepBands is how a sweep sampled the uncertain constants: Samples per point (0: none), the
// seed and the constants the base design pins, held in every sample (study.HeldConstants).
type sweepBands struct {
	Samples int
	Seed    uint64
	Held    []string
}

// bandCell formats the number in row r under the named column in the label's display unit,
// "–" when the cell is empty or the column absent.
func bandCell(t *study.Table, r int, column string, l plots.Label) string {
	c := t.Column(column)
	if c < 0 || r < 0 {
		return "–"
	}
	v := t.Float(r, c)
	if math.IsNaN(v) {
		return "–"
	}
	return l.Format(v)
}

// bandFlags counts the rows of a banded table that may not lase and the rows whose note flags
// anything (failed or truncated samples, no band).
func bandFlags(t *study.Table, prefix string) (mayNot, flagged int) {
	cm, cn := t.Column(prefix+study.MayNotLaseColumn), t.Column(prefix+study.BandNoteColumn)
	for _, row := range t.Rows {
		if cm >= 0 && row[cm] == "true" {
			mayNot++
		}
		if cn >= 0 && row[cn] != "" {
			flagged++
		}
	}
	return mayNot, flagged
}

// widthFlagPoints counts the rows of a banded table with at least one sample of separate
// pulses and with at least one sample of an ill-conditioned FWHM.
func widthFlagPoints(t *study.Table, prefix string) (separate, ill int) {
	cs, ci := t.Column(prefix+study.BandSeparatePulsesColumn), t.Column(prefix+study.BandIllConditionedColumn)
	for _, row := range t.Rows {
		if cs >= 0 && row[cs] != "" && row[cs] != "0" {
			separate++
		}
		if ci >= 0 && row[ci] != "" && row[ci] != "0" {
			ill++
		}
	}
	return separate, ill
}

// widthFlagText says at how many of n points some samples make separate pulses or an
// ill-conditioned FWHM, naming the columns that count them; "" when none does.
func widthFlagText(separate, ill, n int) string {
	var parts []string
	if separate > 0 {
		parts = append(parts, fmt.Sprintf("samples with separate pulses at %d of %d points (column %s)", separate, n, study.BandSeparatePulsesColumn))
	}
	if ill > 0 {
		parts = append(parts, fmt.Sprintf("samples with an ill-conditioned FWHM at %d of %d points (column %s)", ill, n, study.BandIllConditionedColumn))
	}
	if len(parts) == 0 {
		return ""
	}
	return "FWHM band: " + strings.Join(parts, ", ") + "; the FWHM band there mixes such widths with clean ones"
}

// driverLine writes the drivers of a figure over a table's rows, the strongest first (at most
// three), as "constant ρ, …".
func driverLine(ds []study.RankedDriver) string {
	var parts []string
	for _, d := range ds[:min(3, len(ds))] {
		parts = append(parts, fmt.Sprintf("%s %+.2f", strings.TrimPrefix(d.Key, "levels."), d.MedianRankCorrelation))
	}
	if len(parts) == 0 {
		return "–"
	}
	return strings.Join(parts, ", ")
}

// printSweepBands writes what the uncertainty samples of a sweep found: the points that may
// not lase or are flagged, and which constants drive the bands over the grid.
func printSweepBands(w io.Writer, t *study.Table, b sweepBands) {
	mayNot, flagged := bandFlags(t, "")
	fmt.Fprintf(w, "\nuncertainty: %d samples of the uncertain constants per point (Latin hypercube, seed %d); 5 %% and 95 %% above are the band at the optimum\n", b.Samples, b.Seed)
	if len(b.Held) > 0 {
		fmt.Fprintf(w, "  held at the design's values, not sampled: %s\n", heldText(b.Held))
	}
	switch {
	case mayNot > 0:
		fmt.Fprintf(w, "  MAY NOT LASE at %d of %d points: the band straddles the lasing threshold (column %s)\n", mayNot, len(t.Rows), study.MayNotLaseColumn)
	default:
		fmt.Fprintf(w, "  no point's band straddles the lasing threshold\n")
	}
	if flagged > 0 {
		fmt.Fprintf(w, "  %d points flagged: column %s of %s says why\n", flagged, study.BandNoteColumn, study.ResultsFile)
	}
	sep, ill := widthFlagPoints(t, "")
	if txt := widthFlagText(sep, ill, len(t.Rows)); txt != "" {
		fmt.Fprintf(w, "  %s\n", txt)
	} else {
		fmt.Fprintln(w, "  no sample at any point makes separate pulses or an ill-conditioned FWHM")
	}
	fmt.Fprintln(w, "  driven most by (median rank correlation over the points):")
	for _, m := range study.DriverMetrics {
		fmt.Fprintf(w, "    %-26s %s\n", plots.LabelOf(m).Text, driverLine(t.Drivers("", m)))
	}
}

// sweepBandJSON is the "uncertainty" block of sweep --json (and merge --json): the sampling,
// the counts of flagged points, the band at each optimum and the drivers over the grid.
type sweepBandJSON struct {
	Samples    int      `json:"samples"`
	Seed       uint64   `json:"seed"`
	Held       []string `json:"held"` // constants held at the design's values in every sample
	MayNotLase int      `json:"points_may_not_lase"`
	Flagged    int      `json:"points_flagged"`
	// SeparatePulses and IllConditionedFWHM count the points with at least one sample of
	// separate pulses / of an ill-conditioned FWHM (columns band_separate_pulses,
	// band_fwhm_ill_conditioned hold the sample counts per point).
	SeparatePulses     int `json:"points_separate_pulses"`
	IllConditionedFWHM int `json:"points_fwhm_ill_conditioned"`
	// Optima holds, per metric of "optima", the band (SI) at the optimum's point: keys
	// "<metric>_p05", "<metric>_p50", "<metric>_p95"; a missing key has no band there.
	Optima  map[string]float64              `json:"optima_band"`
	Drivers map[string][]study.RankedDriver `json:"drivers"`
}

// sweepBandBlock makes the --json block of a banded sweep table.
func sweepBandBlock(t *study.Table, b sweepBands, optima []plots.Best) *sweepBandJSON {
	j := &sweepBandJSON{Samples: b.Samples, Seed: b.Seed, Held: append([]string{}, b.Held...), Optima: map[string]float64{}, Drivers: map[string][]study.RankedDriver{}}
	j.MayNotLase, j.Flagged = bandFlags(t, "")
	j.SeparatePulses, j.IllConditionedFWHM = widthFlagPoints(t, "")
	for _, o := range optima {
		if o.Row < 0 {
			continue
		}
		for _, s := range study.BandSuffixes {
			if c := t.Column(o.Metric + s); c >= 0 {
				if v := t.Float(o.Row, c); !math.IsNaN(v) {
					j.Optima[o.Metric+s] = v
				}
			}
		}
	}
	for _, m := range study.DriverMetrics {
		j.Drivers[m] = t.Drivers("", m)
	}
	return j
}

// sweepBandSection is the report's section on a banded sweep.
func sweepBandSection(t *study.Table, b sweepBands) report.Section {
	mayNot, flagged := bandFlags(t, "")
	sec := report.Section{Heading: "Uncertainty bands",
		Paragraphs: []string{fmt.Sprintf("Every point also ran over %d samples of the uncertain constants (Latin hypercube, seed %d; the varied keys keep their grid values). %s holds each figure's 5 %%, 50 %% and 95 %% values (<figure>_p05, _p50, _p95), the drivers and a note per point.",
			b.Samples, b.Seed, study.ResultsFile)}}
	if len(b.Held) > 0 {
		sec.Paragraphs = append(sec.Paragraphs, "Held at the design's values, not sampled: "+heldText(b.Held)+".")
	}
	if mayNot > 0 {
		sec.Warn = true
		sec.Paragraphs = append(sec.Paragraphs, fmt.Sprintf("MAY NOT LASE at %d of %d points: the band straddles the lasing threshold.", mayNot, len(t.Rows)))
	}
	if flagged > 0 {
		sec.Paragraphs = append(sec.Paragraphs, fmt.Sprintf("%d points flagged (column %s says why).", flagged, study.BandNoteColumn))
	}
	sep, ill := widthFlagPoints(t, "")
	if txt := widthFlagText(sep, ill, len(t.Rows)); txt != "" {
		sec.Paragraphs = append(sec.Paragraphs, txt+".")
	}
	tab := &report.Table{Head: []string{"figure of merit", "driven most by (median rank correlation over the points)"}}
	for _, m := range study.DriverMetrics {
		tab.Rows = append(tab.Rows, []string{plots.LabelOf(m).Text, driverLine(t.Drivers("", m))})
	}
	sec.Table = tab
	return sec
}
