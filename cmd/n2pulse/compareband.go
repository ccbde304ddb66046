package main

import (
	"fmt"
	"io"
	"strconv"
	"strings"
	"text/tabwriter"

	"n2pulse/kinetics/study"
	"n2pulse/plots"
	"n2pulse/report"
)

// ratioTail drops the first design's ratio band (its ratio to itself).
func ratioTail(bs []*study.Band) []*study.Band {
	if len(bs) == 0 {
		return nil
	}
	return bs[1:]
}

// compareBandRows are compare.csv's rows on the samples of each design, under the design
// columns: samples that ran, samples that lase, whether the band straddles the lasing
// threshold, and the drivers of the output-end energy ("key:ρ;…").
func compareBandRows(c *comparison) [][]string {
	rows := [][]string{{study.BandSamplesColumn}, {study.BandLasingColumn}, {study.MayNotLaseColumn}, {"energy_front_J" + study.DriversSuffix}}
	for _, d := range c.Designs {
		u := d.band
		rows[0] = append(rows[0], strconv.Itoa(u.Samples-u.Failed))
		rows[1] = append(rows[1], strconv.Itoa(u.Lasing))
		rows[2] = append(rows[2], strconv.FormatBool(u.MayNotLase()))
		var parts []string
		if b, ok := u.Metric("energy_front_J"); ok {
			for _, dr := range b.Drivers {
				parts = append(parts, dr.Key+":"+strconv.FormatFloat(dr.RankCorrelation, 'f', 3, 64))
			}
		}
		rows[3] = append(rows[3], strings.Join(parts, ";"))
	}
	return rows
}

// printCompareBands writes the constants a design holds (pins), the band of the headline
// figures of each design and of their ratios to the first design, whether a design may not
// lase, and what drives each design's energy.
func printCompareBands(w io.Writer, c *comparison) {
	fmt.Fprintf(w, "\nuncertainty: %d samples of the uncertain constants, the same for every design (Latin hypercube, seed %d)\n", c.Samples, c.Seed)
	for _, d := range c.Designs {
		if len(d.band.Held) > 0 {
			fmt.Fprintf(w, "  %s: held at the design's values, not sampled: %s\n", d.Name, heldText(d.band.Held))
		}
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "figure: 5 % / median / 95 %\t"+strings.Join(designColumns(len(c.Designs)), "\t")+"\t")
	for _, m := range c.Metrics {
		if !isHeadline(m.Metric) {
			continue
		}
		l := plots.LabelOf(m.Metric)
		line := "  " + l.Text + "\t"
		for _, b := range m.Bands {
			line += bandText(b, l.Format) + "\t"
		}
		for _, b := range ratioTail(m.RatioBands) {
			line += bandText(b, func(v float64) string { return strconv.FormatFloat(v, 'g', 3, 64) }) + "\t"
		}
		fmt.Fprintln(tw, line)
	}
	tw.Flush()
	for i, d := range c.Designs {
		u := d.band
		ok := u.Samples - u.Failed
		state := fmt.Sprintf("all %d samples lase", ok)
		switch {
		case u.MayNotLase():
			state = fmt.Sprintf("MAY NOT LASE: %d of %d samples reach the lasing threshold", u.Lasing, ok)
		case u.Lasing == 0:
			state = fmt.Sprintf("none of %d samples lases", ok)
		}
		if u.Failed > 0 {
			state += fmt.Sprintf("; %d samples failed and are left out", u.Failed)
		}
		if u.Truncated > 0 {
			state += fmt.Sprintf("; %d samples truncated (figures cut short)", u.Truncated)
		}
		drv := energyDrivers(u)
		fmt.Fprintf(w, "%s: %s; output-end energy driven most by %s\n", letter(i), state, driverLine(drv))
	}
	fmt.Fprintln(w, "  a ratio's band pairs sample i of each design (the same constants in both), so it is narrower than the two bands side by side when the designs answer the constants alike")
}

// isHeadline reports the figures the text band table shows.
func isHeadline(m string) bool {
	for _, x := range uncertaintyMetrics {
		if x.name == m {
			return true
		}
	}
	return false
}

// bandText writes a band as "5 % / median / 95 %" with format, "–" for none.
func bandText(b *study.Band, format func(float64) string) string {
	if b == nil {
		return "–"
	}
	return format(b.P05) + " / " + format(b.P50) + " / " + format(b.P95)
}

// compareBandSection is report.html's section on a comparison with --uncertainty: the band of
// the headline figures of each design and of each ratio to the first, the designs that may not
// lase and the drivers of each design's energy. head is the figures-of-merit table's header.
func compareBandSection(c *comparison, head []string) report.Section {
	sec := report.Section{Heading: "Uncertainty bands"}
	sec.Paragraphs = append(sec.Paragraphs, fmt.Sprintf("Every design ran over the same %d samples of the uncertain constants (Latin hypercube, seed %d). Each cell is 5 %% / median / 95 %%; a ratio's band pairs sample i of each design (the same constants in both).", c.Samples, c.Seed))
	t := &report.Table{Head: head}
	for _, m := range c.Metrics {
		if !isHeadline(m.Metric) {
			continue
		}
		l := plots.LabelOf(m.Metric)
		row := []string{l.Text}
		for _, b := range m.Bands {
			row = append(row, bandText(b, l.Format))
		}
		for _, b := range ratioTail(m.RatioBands) {
			row = append(row, bandText(b, func(v float64) string { return strconv.FormatFloat(v, 'g', 3, 64) }))
		}
		t.Rows = append(t.Rows, row)
	}
	sec.Table = t
	for i, d := range c.Designs {
		u := d.band
		drv := energyDrivers(u)
		line := fmt.Sprintf("%d of %d samples lase; output-end energy driven most by %s", u.Lasing, u.Samples-u.Failed, driverLine(drv))
		if u.MayNotLase() {
			sec.Warn = true
			line = "MAY NOT LASE, the band straddles the threshold; " + line
		}
		line = letter(i) + ": " + line
		if u.Failed > 0 || u.Truncated > 0 {
			line += fmt.Sprintf("; %d samples failed, %d truncated", u.Failed, u.Truncated)
		}
		sec.List = append(sec.List, line)
	}
	return sec
}

// energyDrivers are the drivers of a study's output-end energy band, as a ranking of one point.
func energyDrivers(u *study.UncertaintyResult) []study.RankedDriver {
	var drv []study.RankedDriver
	if b, ok := u.Metric("energy_front_J"); ok {
		for _, x := range b.Drivers {
			drv = append(drv, study.RankedDriver{Key: x.Key, MedianRankCorrelation: x.RankCorrelation, Points: 1})
		}
	}
	return drv
}
