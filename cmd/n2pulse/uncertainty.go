package main

import (
	"context"
	"fmt"
	"io"
	"runtime"
	"strings"
	"text/tabwriter"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
	"n2pulse/plots"
	"n2pulse/report"
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
	if r.SeparatePulses > 0 {
		fmt.Fprintf(w, "; %d with separate pulses (their FWHM spans them)", r.SeparatePulses)
	}
	if r.IllConditionedFWHM > 0 {
		fmt.Fprintf(w, "; %d with an ill-conditioned FWHM (it may leap with a small change)", r.IllConditionedFWHM)
	}
	fmt.Fprintln(w)
	if len(r.Held) > 0 {
		fmt.Fprintf(w, "  held at the design's values, not sampled: %s\n", heldText(r.Held))
	}
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
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\n", m.label, units.Format(b.P05, m.unit), units.Format(b.P50, m.unit),
			units.Format(b.P95, m.unit), topDrivers(b.Drivers))
	}
	tw.Flush()
	fmt.Fprintln(w, "  the constants, their ranges and sources: package kinetics/design, Spreads (level constants with a published spread or an estimate's range)")
}

// uncertaintyJSON is the "uncertainty" block of run --json: samples, seed, the sampled
// constants, "held" (the constants the design pins, held at its values: study.HeldConstants), failed, truncated and lasing counts,
// separate_pulses and fwhm_ill_conditioned (samples with two or more pulses, with an ill-conditioned FWHM), may_not_lase (the samples straddle the
// threshold), "<figure>_p05", "<figure>_p50" and "<figure>_p95" for
// every numeric figure of merit with a band, and "drivers": per figure, the constants by
// decreasing |rank correlation|. nil gives nil (no block).
func uncertaintyJSON(r *study.UncertaintyResult) map[string]any {
	if r == nil {
		return nil
	}
	held := r.Held
	if held == nil {
		held = []string{}
	}
	out := map[string]any{"samples": r.Samples, "seed": r.Seed, "constants": r.Keys, "held": held,
		"failed": r.Failed, "truncated": r.Truncated, "lasing": r.Lasing,
		"separate_pulses": r.SeparatePulses, "fwhm_ill_conditioned": r.IllConditionedFWHM, "may_not_lase": r.MayNotLase()}
	drivers := map[string][]study.Driver{}
	for _, m := range r.Metrics {
		out[m.Metric+"_p05"], out[m.Metric+"_p50"], out[m.Metric+"_p95"] = m.P05, m.P50, m.P95
		drivers[m.Metric] = m.Drivers
	}
	out["drivers"] = drivers
	return out
}

// envelopeTimes is the number of times on which the output-power band of the pulse report is
// computed, spread evenly over the power panel's window.
const envelopeTimes = 400

// runUncertainty runs the uncertainty study of run --uncertainty: n samples of seed on one
// worker per CPU, each run with its share of the memory limit (0: the default). With
// envelope (the run writes --out), the samples also keep their output-end power for the band
// of the pulse report, on the window the report shows for the nominal shot r.
func runUncertainty(d *design.Design, r *kinetics.Result, n int, seed uint64, limit int64, envelope bool) (*study.UncertaintyResult, *study.Envelope, error) {
	if limit <= 0 {
		limit = kinetics.DefaultMemoryLimit
	}
	workers := runtime.NumCPU()
	share := limit / int64(workers)
	if !envelope {
		u, err := study.Uncertainty(context.Background(), d, n, seed, workers, study.MemoryRunner(share))
		return u, nil, err
	}
	lo, hi, err := plots.PowerWindow(r.Time, r.PowerFront, r.PowerRear)
	if err != nil {
		return nil, nil, err
	}
	grid := make([]float64, envelopeTimes)
	for k := range grid {
		grid[k] = lo + (hi-lo)*float64(k)/float64(envelopeTimes-1)
	}
	return study.UncertaintyEnvelope(context.Background(), d, n, seed, workers, share, grid)
}

// uncertaintySection is report.html's section on a run's uncertainty study: the sampling, the
// lasing verdict over the samples, and the band and drivers of the headline figures.
func uncertaintySection(u *study.UncertaintyResult, env *study.Envelope) report.Section {
	ok := u.Samples - u.Failed
	sec := report.Section{Heading: "Uncertainty bands"}
	sec.Paragraphs = append(sec.Paragraphs, fmt.Sprintf("%d samples of the uncertain constants (Latin hypercube, seed %d): %s. The constants, their ranges and sources are listed in package kinetics/design (Spreads).",
		u.Samples, u.Seed, strings.Join(u.Keys, ", ")))
	if len(u.Held) > 0 {
		sec.Paragraphs = append(sec.Paragraphs, "Held at the design's values, not sampled: "+heldText(u.Held)+".")
	}
	switch {
	case u.MayNotLase():
		sec.Warn = true
		sec.Paragraphs = append(sec.Paragraphs, fmt.Sprintf("MAY NOT LASE: %d of %d samples reach the lasing threshold; the band straddles it.", u.Lasing, ok))
	case u.Lasing == 0:
		sec.Warn = true
		sec.Paragraphs = append(sec.Paragraphs, fmt.Sprintf("None of the %d samples reaches the lasing threshold.", ok))
	default:
		sec.Paragraphs = append(sec.Paragraphs, fmt.Sprintf("All %d samples reach the lasing threshold.", ok))
	}
	if u.Failed > 0 || u.Truncated > 0 {
		sec.Warn = true
		sec.Paragraphs = append(sec.Paragraphs, fmt.Sprintf("%d samples failed and are left out; %d were truncated (their pulse outlasted the run, their figures are cut short).", u.Failed, u.Truncated))
	}
	if u.SeparatePulses > 0 || u.IllConditionedFWHM > 0 {
		sec.Paragraphs = append(sec.Paragraphs, fmt.Sprintf("%d samples made separate pulses (their FWHM spans them) and %d an ill-conditioned FWHM (it may leap with a small change): the FWHM band mixes such widths with single, steady ones.", u.SeparatePulses, u.IllConditionedFWHM))
	}
	if env != nil && env.Samples < u.Samples-u.Failed {
		sec.Paragraphs = append(sec.Paragraphs, fmt.Sprintf("The band of the output power in the pulse report is drawn from the first %d samples.", env.Samples))
	}
	t := &report.Table{Head: []string{"figure of merit", "5 %", "median", "95 %", "driven most by (rank correlation)"}}
	for _, m := range uncertaintyMetrics {
		b, found := u.Metric(m.name)
		if !found {
			t.Rows = append(t.Rows, []string{m.label, "–", "–", "–", "undefined in most samples"})
			continue
		}
		t.Rows = append(t.Rows, []string{m.label, units.Format(b.P05, m.unit), units.Format(b.P50, m.unit), units.Format(b.P95, m.unit), topDrivers(b.Drivers)})
	}
	sec.Table = t
	return sec
}

// topDrivers writes the three constants that drive a band most, "constant ρ, …", without the
// "levels." prefix.
func topDrivers(ds []study.Driver) string {
	var drv []string
	for _, d := range ds[:min(3, len(ds))] {
		drv = append(drv, fmt.Sprintf("%s %+.2f", strings.TrimPrefix(d.Key, "levels."), d.RankCorrelation))
	}
	return strings.Join(drv, ", ")
}

// heldText lists the held constants without the "levels." prefix and says why they are held.
func heldText(held []string) string {
	var ks []string
	for _, k := range held {
		ks = append(ks, strings.TrimPrefix(k, "levels."))
	}
	return strings.Join(ks, ", ") + " (given with --set, or in the design file at a value other than the default)"
}

// heldIf returns the constants d pins (study.HeldConstants) when a study samples (n > 0), else nil.
func heldIf(n int, d *design.Design) []string {
	if n <= 0 {
		return nil
	}
	return study.HeldConstants(d)
}
