package study

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"n2pulse/internal/usermsg"
)

// Columns of a results table with uncertainty bands (sweep --uncertainty, length
// --uncertainty): after each figure of merit's band columns (BandSuffixes) come the samples that
// ran, the samples that lase, whether the band straddles the lasing threshold, the samples
// with separate pulses and with an ill-conditioned FWHM, the drivers of DriverMetrics and a
// note that says why a row is flagged.
const (
	BandSamplesColumn = "band_samples" // samples that ran (failed ones are left out)
	BandLasingColumn  = "band_lasing"  // of those, the samples that reach the lasing threshold
	MayNotLaseColumn  = "may_not_lase" // "true" when some samples lase and some do not
	// BandSeparatePulsesColumn counts the samples whose output is two or more separate pulses
	// (UncertaintyResult.SeparatePulses): their FWHM spans them all.
	BandSeparatePulsesColumn = "band_separate_pulses"
	// BandIllConditionedColumn counts the samples whose FWHM is ill-conditioned
	// (UncertaintyResult.IllConditionedFWHM).
	BandIllConditionedColumn = "band_fwhm_ill_conditioned"
	// BandNoteColumn is empty for a clean band, else why the row is flagged: may not lase,
	// failed or truncated samples, samples with separate pulses or an ill-conditioned FWHM,
	// no band at all.
	BandNoteColumn = "band_note"
	// DriversSuffix ends the column that lists every sampled constant with its rank correlation
	// to a figure of merit, strongest first: "key:ρ;key:ρ;…".
	DriversSuffix = "_drivers"
)

// BandSuffixes end the names of a figure of merit's band columns: 5 %, 50 % and 95 %.
var BandSuffixes = [3]string{"_p05", "_p50", "_p95"}

// DriverMetrics are the figures of merit whose drivers a table row lists.
var DriverMetrics = []string{"energy_front_J", "peak_power_W", "fwhm_s"}

// bandColumns returns the band columns of metrics, each name behind prefix.
func bandColumns(prefix string, metrics []string) []string {
	var cols []string
	for _, m := range metrics {
		for _, s := range BandSuffixes {
			cols = append(cols, prefix+m+s)
		}
	}
	cols = append(cols, prefix+BandSamplesColumn, prefix+BandLasingColumn, prefix+MayNotLaseColumn,
		prefix+BandSeparatePulsesColumn, prefix+BandIllConditionedColumn)
	for _, m := range DriverMetrics {
		cols = append(cols, prefix+m+DriversSuffix)
	}
	return append(cols, prefix+BandNoteColumn)
}

// bandCells returns the cells of bandColumns for one point, with note its band_note.
func bandCells(p sampledPoint, metrics []string, note string) []string {
	cells := make([]string, 0, 3*len(metrics)+6+len(DriverMetrics))
	u := p.band
	for _, m := range metrics {
		b, ok := MetricBand{}, false
		if u != nil {
			b, ok = u.Metric(m)
		}
		if !ok {
			cells = append(cells, "", "", "")
			continue
		}
		cells = append(cells, formatNumber(b.P05), formatNumber(b.P50), formatNumber(b.P95))
	}
	if u == nil {
		cells = append(cells, "0", "0", "false", "0", "0")
	} else {
		cells = append(cells, strconv.Itoa(u.Samples-u.Failed), strconv.Itoa(u.Lasing), strconv.FormatBool(u.MayNotLase()),
			strconv.Itoa(u.SeparatePulses), strconv.Itoa(u.IllConditionedFWHM))
	}
	for _, m := range DriverMetrics {
		var parts []string
		if u != nil {
			if b, ok := u.Metric(m); ok {
				for _, d := range b.Drivers {
					parts = append(parts, d.Key+":"+strconv.FormatFloat(d.RankCorrelation, 'f', 3, 64))
				}
			}
		}
		cells = append(cells, strings.Join(parts, ";"))
	}
	return append(cells, note)
}

// bandNote says why a point's band is flagged, or "" when it is not.
func bandNote(p sampledPoint) string {
	u := p.band
	if u == nil {
		msg := "no band"
		if p.bandErr != nil {
			msg += ": " + p.bandErr.Error()
		}
		return oneLine(msg)
	}
	var parts []string
	ran := u.Samples - u.Failed
	switch {
	case p.bandErr != nil:
		parts = append(parts, "no band: "+p.bandErr.Error())
	case u.MayNotLase():
		parts = append(parts, fmt.Sprintf("may not lase: %d of %d samples reach the lasing threshold", u.Lasing, ran))
	case u.Lasing == 0 && p.nominal.err == nil && p.nominal.sum.Lases:
		parts = append(parts, fmt.Sprintf("may not lase: the design lases but none of %d samples does", ran))
	}
	if u.Failed > 0 && u.Failed < u.Samples {
		msg := fmt.Sprintf("%d of %d samples failed and are left out", u.Failed, u.Samples)
		if p.sampleErr != nil {
			msg += " (" + p.sampleErr.Error() + ")"
		}
		parts = append(parts, msg)
	}
	if u.Truncated > 0 {
		parts = append(parts, fmt.Sprintf("%d samples truncated: their pulse outlasted the longest run, their figures are cut short", u.Truncated))
	}
	if u.SeparatePulses > 0 {
		parts = append(parts, fmt.Sprintf("%d of %d samples make separate pulses: their FWHM spans them, the FWHM band mixes widths of one pulse and of several", u.SeparatePulses, ran))
	}
	if u.IllConditionedFWHM > 0 {
		parts = append(parts, fmt.Sprintf("%d of %d samples have an ill-conditioned FWHM: part of the FWHM band may be edges leaping between spikes", u.IllConditionedFWHM, ran))
	}
	return oneLine(strings.Join(parts, "; "))
}

// oneLine removes line breaks, runs of spaces and package prefixes from a message for a cell.
func oneLine(s string) string {
	return usermsg.Strip(strings.Join(strings.Fields(s), " "))
}

// RankedDriver is one sampled constant's hold on a figure of merit over the points of a study:
// the median of its rank correlation over the points whose band lists it.
type RankedDriver struct {
	Key                   string  `json:"key"`
	MedianRankCorrelation float64 `json:"median_rank_correlation"`
	Points                int     `json:"points"`
}

// Drivers ranks the constants listed in a table's drivers column (metric + DriversSuffix, with
// prefix) over its rows by the median of their rank correlation, largest magnitude first; nil
// when the table has no such column.
func (t *Table) Drivers(prefix, metric string) []RankedDriver {
	c := t.Column(prefix + metric + DriversSuffix)
	if c < 0 {
		return nil
	}
	rhos := map[string][]float64{}
	var order []string
	for _, row := range t.Rows {
		for _, part := range strings.Split(row[c], ";") {
			key, v, ok := strings.Cut(part, ":")
			x, err := strconv.ParseFloat(v, 64)
			if !ok || err != nil || math.IsNaN(x) {
				continue
			}
			if _, seen := rhos[key]; !seen {
				order = append(order, key)
			}
			rhos[key] = append(rhos[key], x)
		}
	}
	out := make([]RankedDriver, 0, len(order))
	for _, k := range order {
		b, err := BandOf(rhos[k])
		if err != nil {
			continue
		}
		out = append(out, RankedDriver{Key: k, MedianRankCorrelation: b.P50, Points: len(rhos[k])})
	}
	sort.SliceStable(out, func(a, b int) bool {
		return math.Abs(out[a].MedianRankCorrelation) > math.Abs(out[b].MedianRankCorrelation)
	})
	return out
}
