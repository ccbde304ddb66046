package main

import (
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"n2pulse/kinetics/study"
	"n2pulse/units"
)

// uncertaintyMetrics are the figures of merit the run command prints a band for, with units.
var uncertaintyMetrics = []struct{ name, label, unit string }{
	{"energy_front_J", "pulse energy, output end", "J"},
	{"energy_total_J", "pulse energy, both ends", "J"},
	{"peak_power_W", "peak power, output end", "W"},
	{"fwhm_s", "FWHM", "s"},
}

// printUncertainty writes the bands of the headline figures of merit and the three constants
// that drive each most.
func printUncertainty(w io.Writer, r *study.UncertaintyResult) {
	fmt.Fprintf(w, "\nuncertainty: %d samples of the uncertain constants (Latin hypercube, seed %d)", r.Samples, r.Seed)
	if r.Failed > 0 {
		fmt.Fprintf(w, "; %d failed and are left out", r.Failed)
	}
	if r.Truncated > 0 {
		fmt.Fprintf(w, "; %d truncated (pulse outlasted the run)", r.Truncated)
	}
	fmt.Fprintln(w)
	ok := r.Samples - r.Failed
	switch {
	case r.MayNotLase():
		fmt.Fprintf(w, "  MAY NOT LASE: %d of %d samples reach the lasing threshold; the band straddles it\n", r.Lasing, ok)
	case r.Lasing == 0:
		fmt.Fprintf(w, "  none of the %d samples reaches the lasing threshold\n", ok)
	default:
		fmt.Fprintf(w, "  all %d samples reach the lasing threshold\n", ok)
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "figure\t5 %\tmedian\t95 %\tdriven most by (rank correlation)")
	for _, m := range uncertaintyMetrics {
		b, ok := r.Metric(m.name)
		if !ok {
			fmt.Fprintf(tw, "%s\t–\t–\t–\tundefined in most samples\n", m.label)
			continue
		}
		var drv []string
		for _, d := range b.Drivers[:min(3, len(b.Drivers))] {
			drv = append(drv, fmt.Sprintf("%s %+.2f", strings.TrimPrefix(d.Key, "levels."), d.RankCorrelation))
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\n", m.label, units.Format(b.P05, m.unit), units.Format(b.P50, m.unit),
			units.Format(b.P95, m.unit), strings.Join(drv, ", "))
	}
	tw.Flush()
	fmt.Fprintln(w, "  the constants, their ranges and sources: package kinetics/design, Spreads (level constants with a published spread or an estimate's range)")
}

// uncertaintyJSON is the "uncertainty" block of run --json: samples, seed, the sampled
// constants, failed, truncated and lasing counts, may_not_lase (the samples straddle the
// threshold), "<figure>_p05", "<figure>_p50" and "<figure>_p95" for
// every numeric figure of merit with a band, and "drivers": per figure, the constants by
// decreasing |rank correlation|. nil gives nil (no block).
func uncertaintyJSON(r *study.UncertaintyResult) map[string]any {
	if r == nil {
		return nil
	}
	out := map[string]any{"samples": r.Samples, "seed": r.Seed, "constants": r.Keys,
		"failed": r.Failed, "truncated": r.Truncated, "lasing": r.Lasing, "may_not_lase": r.MayNotLase()}
	drivers := map[string][]study.Driver{}
	for _, m := range r.Metrics {
		out[m.Metric+"_p05"], out[m.Metric+"_p50"], out[m.Metric+"_p95"] = m.P05, m.P50, m.P95
		drivers[m.Metric] = m.Drivers
	}
	out["drivers"] = drivers
	return out
}
