package main

import (
	"fmt"
	"path/filepath"
	"strings"
	"sync"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
	"n2pulse/plots"
	"n2pulse/report"
	"n2pulse/units"
	"n2pulse/validation"
)

// reportMetrics are the figures of merit a run's report lists, in this order.
var reportMetrics = []string{"energy_front_J", "energy_rear_J", "energy_total_J", "peak_power_W", "half_max_width_s", "fwhm_s",
	"pulses", "pulse_separation_s", "strongest_pulse_fwhm_s", "half_max_energy_share", "fwhm_45_s", "fwhm_55_s", "rise_s", "delay_s", "efficiency", "stored_energy_J", "deposited_energy_J", "peak_gain_per_m", "gain_length",
	"inversion_duration_s", "termination_time_s", "peak_reduced_field_Td", "peak_current_A", "peak_electron_density_m3"}

// summaryValues reads the summary's numbers by their JSON names.
func summaryValues(s kinetics.Summary) map[string]float64 {
	vals, _ := metricRows([]compared{{Summary: s}})
	out := map[string]float64{}
	for _, r := range vals {
		out[r.Metric] = r.Values[0]
	}
	return out
}

// metricTable lists metrics in words and display units.
func metricTable(s kinetics.Summary, metrics []string) *report.Table {
	vals := summaryValues(s)
	t := &report.Table{Head: []string{"figure of merit", "value"}}
	for _, m := range metrics {
		v, ok := vals[m]
		if !ok || (m == "pulse_separation_s" && s.Pulses < 2) {
			continue
		}
		t.Rows = append(t.Rows, []string{plots.LabelOf(m).Text, plots.LabelOf(m).Format(v)})
	}
	return t
}

// designTable lists every key of a design in words and display units, with the key itself
// (as written in a design file) for reproducing the run.
func designTable(listing string) *report.Table {
	t := &report.Table{Head: []string{"", "value", "design key"}}
	for _, line := range strings.Split(listing, "\n") {
		k, v, ok := strings.Cut(line, " = ")
		if !ok {
			continue
		}
		v = strings.Trim(v, `"`)
		if k == "name" || k == "description" {
			t.Rows = append(t.Rows, []string{k, v, k})
			continue
		}
		t.Rows = append(t.Rows, []string{keyLabel(k).Text, displayValue(k, v), k})
	}
	return t
}

// energySection is the energy account of a shot, when the run kept one.
func energySection(s kinetics.Summary) (report.Section, bool) {
	e := s.Energy
	if !(e.Stored > 0) {
		return report.Section{}, false
	}
	t := &report.Table{Head: []string{"where the stored energy went", "energy", "share of stored"}}
	row := func(name string, v float64) {
		t.Rows = append(t.Rows, []string{name, units.Format(v, "J"), fmt.Sprintf("%.3g %%", 100*v/e.Stored)})
	}
	row("stored in the capacitors", e.Stored)
	row("switch", e.Switch)
	row("shunt", e.Shunt)
	row("plasma", e.Plasma)
	row("left in the circuit", e.LeftInCircuit)
	p := e.PlasmaSplit
	for _, c := range []struct {
		name string
		v    float64
	}{{"  plasma: elastic collisions", p.Elastic}, {"  plasma: vibration", p.Vibrational}, {"  plasma: A state", p.StateA},
		{"  plasma: B state", p.StateB}, {"  plasma: W state", p.StateW}, {"  plasma: B′ state", p.StateBPrime},
		{"  plasma: C state", p.StateC}, {"  plasma: other electronic states", p.OtherElectronic},
		{"  plasma: ionisation", p.Ionisation}, {"  plasma: attachment", p.Attachment}} {
		if c.v != 0 {
			row(c.name, c.v)
		}
	}
	row("put into C(0)", e.UpperLevel)
	row("laser pulse, both ends", e.Laser)
	return report.Section{Heading: "Energy account", Table: t,
		Paragraphs: []string{"The switch, the shunt, the plasma and what is left in the circuit add up to the stored energy within the energy balance residual " +
			fmt.Sprintf("(%.1e)", s.EnergyBalanceResidual) + "; C(0) is part of the plasma's C channel and the laser pulse part of C(0)."}}, true
}

// validationSection runs the validation registry once per process and says how the model
// stands: how many checks of which kind pass, and which kinds of laser it has been compared
// with.
var validationSection = sync.OnceValue(func() report.Section {
	checks := validation.RunAll()
	var failed, discrepant int
	kinds := map[string]int{}
	for _, c := range checks {
		kinds[c.Kind.String()]++
		if !c.Pass() {
			if c.Tolerated() {
				discrepant++
			} else {
				failed++
			}
		}
	}
	s := report.Section{Heading: "Validation status of the model"}
	s.Paragraphs = append(s.Paragraphs, fmt.Sprintf("%d checks against outside values: %d pass, %d fail, %d discrepancies with measured lasers (run `n2pulse check` for the table, `n2pulse check --report DIR` for the figures).",
		len(checks), len(checks)-failed-discrepant, failed, discrepant))
	for _, k := range []string{"published", "analytic", "experiment", "common practice, no source", "from memory"} {
		if kinds[k] > 0 {
			s.List = append(s.List, fmt.Sprintf("%d %s", kinds[k], k))
		}
	}
	cases, err := validation.Cases()
	if err != nil {
		s.Paragraphs = append(s.Paragraphs, "The experiment cases could not be read: "+err.Error())
		return s
	}
	var lasers []string
	for _, c := range cases {
		lasers = append(lasers, fmt.Sprintf("%s (%s; %s)", c.Laser(), c.Name, c.SourceKind))
	}
	s.Paragraphs = append(s.Paragraphs, "Lasers the model has been compared with: "+strings.Join(lasers, "; ")+
		". A design unlike these (another pressure, circuit or size) is predicted by the same physics but has not been checked against a measurement.")
	return s
})

// figureSection reads the SVG figures listed as id → file in dir.
func figureSection(heading, dir string, figs [][3]string) (report.Section, error) {
	s := report.Section{Heading: heading}
	for _, f := range figs {
		fig, err := report.FigureFile(filepath.Join(dir, f[1]), f[0], f[2])
		if err != nil {
			return s, err
		}
		s.Figures = append(s.Figures, fig)
	}
	return s, nil
}

// warningSection lists warnings, or says there are none.
func warningSection(ws []string) report.Section {
	if len(ws) == 0 {
		return report.Section{Heading: "Warnings", Paragraphs: []string{"None: the run did what was asked."}}
	}
	return report.Section{Heading: "Warnings", List: ws, Warn: true}
}

// writeRunReport writes report.html for one shot into dir, after its figures.
func writeRunReport(dir string, d *design.Design, r *kinetics.Result, u *study.UncertaintyResult, env *study.Envelope) error {
	s := r.Summary
	name := d.Name
	if name == "" {
		name = "design"
	}
	p := report.Page{Title: "n2pulse: " + name, Subtitle: d.Description, Caution: safetyNotice}
	verdict := report.Section{Heading: "Summary and verdict", Paragraphs: []string{"Verdict: " + s.Verdict}, Table: metricTable(s, reportMetrics)}
	if s.Advice != "" {
		verdict.Paragraphs = append(verdict.Paragraphs, "What to change: "+s.Advice)
	}
	if c := caution(s.StoredEnergy, s.EnergyTotal); c != "" {
		verdict.Paragraphs = append(verdict.Paragraphs, c)
	}
	p.Sections = append(p.Sections, verdict, warningSection(r.Warnings))
	if e, ok := energySection(s); ok {
		p.Sections = append(p.Sections, e)
	}
	if u != nil {
		p.Sections = append(p.Sections, uncertaintySection(u, env))
	}
	pulseCaption := "The shot: circuit, E/N, electron density, laser levels (whole run) and the output at both ends (zoomed on the pulse; the span is shaded above)."
	if env != nil {
		pulseCaption += fmt.Sprintf(" The light band under the output-end power is its 5–95 %% range over %d samples of the uncertain constants, aligned at switch closure.", env.Samples)
	}
	figs, err := figureSection("Figures", dir, [][3]string{
		{"pulse-report", "pulse-report.svg", pulseCaption},
		{"gain-map", "gain-map.svg", "Small-signal gain along the channel against time."},
	})
	if err != nil {
		return err
	}
	p.Sections = append(p.Sections, figs, report.Section{Heading: "Design", Table: designTable(d.String())}, validationSection())
	return report.Write(filepath.Join(dir, report.FileName), p)
}

// writeSweepReport writes report.html for a finished sweep into dir: the grid, the optimum of
// each metric, the points left out, the figures, the base design and the validation status.
func writeSweepReport(dir, name, listing string, tab *study.Table, axes []study.Axis, metrics []string, figs []string, bands sweepBands) error {
	if name == "" {
		name = "design"
	}
	p := report.Page{Title: "n2pulse sweep: " + name, Caution: safetyNotice}
	var grid []string
	for _, a := range axes {
		l := plots.LabelOf(a.Key + " [" + a.Unit + "]").Typed(a.Display)
		spacing := "evenly spaced"
		if a.Log {
			spacing = "evenly spaced in the logarithm"
		}
		grid = append(grid, fmt.Sprintf("%s from %s to %s, %d values %s (%s)", l.Text, l.Format(a.From), l.Format(a.To), a.N, spacing, a.Key))
	}
	opt := &report.Table{Head: []string{"figure of merit", "optimum", "value", "where", "note"}}
	var edges []string
	for _, m := range metrics {
		l := plots.LabelOf(m)
		b := plots.Optimum(tab, axes, m)
		if b.Row < 0 {
			opt.Rows = append(opt.Rows, []string{l.Text, "—", "no point with a value", "", ""})
			continue
		}
		var at []string
		for _, a := range axes {
			al := plots.LabelOf(a.Key + " [" + a.Unit + "]").Typed(a.Display)
			at = append(at, al.Text+" "+al.Format(b.At[a.Header()]))
		}
		note := ""
		if len(b.Edge) > 0 {
			note = "on the edge of the grid: extend the range"
			edges = append(edges, l.Text)
		}
		opt.Rows = append(opt.Rows, []string{l.Text, b.Word, l.Format(b.Value), strings.Join(at, ", "), note})
	}
	sum := report.Section{Heading: "Grid and optima", List: grid, Table: opt,
		Paragraphs: []string{tableCounts(tab) + "; points that failed, were cut short (truncated) or do not lase are never an optimum."}}
	p.Sections = append(p.Sections, sum)
	if bands.Samples > 0 {
		p.Sections = append(p.Sections, sweepBandSection(tab, bands))
	}
	var left []string
	for r := range tab.Rows {
		if !tab.OK(r) {
			left = append(left, fmt.Sprintf("point %s: %s", tab.Rows[r][0], tab.Rows[r][tab.Column(study.StatusColumn)]))
		}
	}
	if c := tab.Column("pulse_separation_s"); c >= 0 {
		for _, r := range multiPulseRows(tab) {
			left = append(left, fmt.Sprintf("point %s: %s separate pulses, the first two %s apart: its FWHM spans them (the strongest alone: strongest_pulse_fwhm_s)",
				tab.Rows[r][0], tab.Rows[r][tab.Column("pulses")], units.Format(tab.Float(r, c), "s")))
		}
	}
	if c := tab.Column("fwhm_s"); c >= 0 {
		for _, r := range illWidthRows(tab) {
			left = append(left, fmt.Sprintf("point %s: its FWHM of %s is ill-conditioned (fwhm_45_s, fwhm_55_s, fwhm_jump_s): a small change can move it a long way",
				tab.Rows[r][0], units.Format(tab.Float(r, c), "s")))
		}
	}
	if len(edges) > 0 {
		left = append(left, "the optimum of "+strings.Join(edges, ", ")+" lies on the edge of the grid: the best may lie beyond the range swept")
	}
	if len(left) > 20 {
		left = append(left[:20], fmt.Sprintf("… and %d more (see results.csv)", len(left)-20))
	}
	p.Sections = append(p.Sections, warningSection(left))
	fs := report.Section{Heading: "Figures"}
	for _, f := range figs {
		if filepath.Ext(f) != ".svg" {
			continue
		}
		id := strings.TrimSuffix(filepath.Base(f), ".svg")
		fig, err := report.FigureFile(f, id, plots.LabelOf(strings.TrimPrefix(strings.TrimPrefix(id, "map-"), "curve-")).Text)
		if err != nil {
			return err
		}
		fs.Figures = append(fs.Figures, fig)
	}
	if len(fs.Figures) == 0 {
		fs.Paragraphs = []string{"No figure: sweeps of one or two keys are drawn; see results.csv."}
	}
	p.Sections = append(p.Sections, fs, report.Section{Heading: "Base design", Table: designTable(listing)}, validationSection())
	return report.Write(filepath.Join(dir, report.FileName), p)
}

// writeCompareReport writes report.html for a comparison into dir.
func writeCompareReport(dir string, c *comparison) error {
	var names []string
	for _, d := range c.Designs {
		names = append(names, d.Name)
	}
	p := report.Page{Title: "n2pulse comparison: " + strings.Join(names, ", "), Caution: safetyNotice}
	head := append([]string{""}, designColumns(len(c.Designs))...)
	var who []string
	for i, d := range c.Designs {
		who = append(who, fmt.Sprintf("%s: %s (%s) — %s", letter(i), d.Name, d.File, d.Summary.Verdict))
	}
	keys := &report.Table{Head: head[:len(c.Designs)+1]}
	for _, k := range c.Differ {
		row := []string{keyLabel(k.Key).Text + " (" + k.Key + ")"}
		for _, v := range k.Values {
			row = append(row, displayValue(k.Key, v))
		}
		keys.Rows = append(keys.Rows, row)
	}
	merit := &report.Table{Head: head}
	for _, m := range c.Metrics {
		l := plots.LabelOf(m.Metric)
		row := []string{l.Text}
		for _, v := range m.Values {
			row = append(row, l.Format(v))
		}
		for _, r := range m.Ratios[1:] {
			if r == nil {
				row = append(row, "—")
			} else {
				row = append(row, fmt.Sprintf("%.3g", *r))
			}
		}
		merit.Rows = append(merit.Rows, row)
	}
	var warns []string
	for i, d := range c.Designs {
		for _, w := range d.result.Warnings {
			warns = append(warns, letter(i)+": "+w)
		}
	}
	fig, err := report.FigureFile(filepath.Join(dir, "compare.svg"), "compare", "Output-end pulses, aligned at switch closure.")
	if err != nil {
		return err
	}
	p.Sections = append(p.Sections,
		report.Section{Heading: "Designs and verdicts", List: who},
		report.Section{Heading: "Keys that differ", Table: keys},
		report.Section{Heading: "Figures of merit", Table: merit})
	if c.Samples > 0 {
		p.Sections = append(p.Sections, compareBandSection(c, head))
	}
	p.Sections = append(p.Sections,
		warningSection(warns),
		report.Section{Heading: "Pulses", Figures: []report.Figure{fig}},
		validationSection())
	return report.Write(filepath.Join(dir, report.FileName), p)
}
