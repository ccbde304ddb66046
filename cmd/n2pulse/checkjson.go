package main

import (
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"n2pulse/units"
	"n2pulse/validation"
)

// countChecks counts the failed checks and the discrepancies with experiments, as printChecks
// does.
func countChecks(checks []validation.Check) (failed, discrepant int) {
	for _, c := range checks {
		switch c.Result() {
		case "FAIL":
			failed++
		case "DISCREPANCY":
			discrepant++
		}
	}
	return failed, discrepant
}

// errText is the error's message, or nil (JSON null).
func errText(err error) any {
	if err == nil {
		return nil
	}
	return err.Error()
}

// checkJSON is the document `check --json` prints: every check, the counts, and the
// uncertainty bands and apparatus alternatives when they were asked for (SI units).
func checkJSON(checks []validation.Check, failed, discrepant int, bands []validation.BandRow, n int, seed uint64,
	envelope []validation.EnvelopeRow, apparatus bool) map[string]any {
	cs := make([]map[string]any, 0, len(checks))
	for _, c := range checks {
		computed := nullable(c.Computed)
		if c.Err != nil {
			computed = nil
		}
		cs = append(cs, map[string]any{"id": c.ID, "quantity": c.Quantity, "unit": c.Unit, "computed": computed,
			"reference": nullable(c.Reference), "deviation": nullable(c.Deviation()), "tolerance": c.ToleranceText(),
			"result": c.Result(), "kind": c.Kind.String(), "source": c.Source, "error": errText(c.Err)})
	}
	out := map[string]any{"checks": cs, "count": len(checks), "passed": len(checks) - failed - discrepant,
		"failed": failed, "discrepancies": discrepant}
	if n > 0 {
		rows := make([]map[string]any, 0, len(bands))
		for _, r := range bands {
			rows = append(rows, map[string]any{"case": r.Case, "end": r.End, "measured_J": nullable(r.Measured),
				"nominal_J": nullable(r.Nominal), "p05_J": nullable(r.Band.P05), "p50_J": nullable(r.Band.P50),
				"p95_J": nullable(r.Band.P95), "samples": r.Samples, "held": r.Held, "measured_lies": r.Position(),
				"separate_pulses": r.SeparatePulses, "fwhm_ill_conditioned": r.IllConditionedFWHM, "error": errText(r.Err)})
		}
		out["uncertainty_bands"] = map[string]any{"samples": n, "seed": seed, "cases": rows,
			"note": "model uncertainty over the constants of package kinetics/design (Spreads), not the circuit and switch values of the common block"}
	}
	if apparatus {
		rows := make([]map[string]any, 0, len(envelope))
		for _, r := range envelope {
			runs := make([]map[string]any, 0, len(r.Runs))
			for _, a := range r.Runs {
				runs = append(runs, map[string]any{"name": a.Name, "sets": a.Sets, "why": a.Why,
					"energy_J": nullable(a.Energy), "fwhm_s": nullable(a.FWHM), "fwhm_ill_conditioned": a.FWHMIllConditioned,
					"lases": a.Lases, "error": errText(a.Err)})
			}
			lasing, _ := r.Lasing()
			ill := r.IllConditionedW()
			if ill == nil {
				ill = []string{}
			}
			rows = append(rows, map[string]any{"case": r.Case, "end": r.End,
				"measured_J": nullable(r.Measured), "nominal_J": nullable(r.Nominal),
				"energy_low_J": nullable(r.EnergyLow), "energy_high_J": nullable(r.EnergyHigh),
				"measured_lies": r.MeasuredPosition(), "nominal_lies": r.NominalPosition(),
				"measured_fwhm_s": nullable(r.MeasuredW), "nominal_fwhm_s": nullable(r.NominalW),
				"fwhm_low_s": nullable(r.FWHMLow), "fwhm_high_s": nullable(r.FWHMHigh),
				"measured_fwhm_lies": r.MeasuredWPosition(), "measured_lases": r.MeasuredLases, "nominal_lases": r.NominalLases,
				"alternatives_lasing": lasing, "fwhm_ill_conditioned_alternatives": ill, "alternatives": runs,
				"derived_checks": derivedJSON(r.Derived), "error": errText(r.Err)})
		}
		out["apparatus_alternatives"] = map[string]any{"note": validation.ApparatusNote, "cases": rows}
	}
	return out
}

// derivedJSON is the derived_checks list of one case of the apparatus block: per check its
// measurement, the nominal value, the alternatives' range and each alternative's value, in
// the check's unit (as in "checks").
func derivedJSON(rows []validation.DerivedRow) []map[string]any {
	out := make([]map[string]any, 0, len(rows))
	for _, d := range rows {
		c := d.Nominal
		runs := make([]map[string]any, 0, len(d.Runs))
		for _, r := range d.Runs {
			computed := nullable(r.Check.Computed)
			if r.Check.Err != nil {
				computed = nil
			}
			runs = append(runs, map[string]any{"alternative": r.Alternative, "computed": computed,
				"result": r.Check.Result(), "error": errText(r.Check.Err)})
		}
		nominal := nullable(c.Computed)
		if c.Err != nil {
			nominal = nil
		}
		pass, ran := d.Passing()
		m := map[string]any{"id": c.ID, "quantity": c.Quantity, "unit": c.Unit, "tolerance": c.ToleranceText(),
			"reference": nullable(c.Reference), "nominal": nominal, "nominal_result": c.Result(),
			"low": nullable(d.Low), "high": nullable(d.High), "measured_lies": d.MeasuredPosition(),
			"alternatives_passing": pass, "alternatives_ran": ran, "alternatives": runs, "source": c.Source}
		if c.Mode == validation.Range {
			m["measured_low"], m["measured_high"] = c.Low, c.High
		}
		out = append(out, m)
	}
	return out
}

// fwhmRangeText is the FWHM range of a case's alternatives, with the number of alternatives
// whose FWHM is ill-conditioned.
func fwhmRangeText(r validation.EnvelopeRow) string {
	s := optJ(r.FWHMLow, "s") + " – " + optJ(r.FWHMHigh, "s")
	if n := len(r.IllConditionedW()); n > 0 {
		s += fmt.Sprintf(" (%d ill-conditioned)", n)
	}
	return s
}

// printApparatus writes the apparatus table of `check --apparatus`: per case the measured
// energy and FWHM, the nominal run and the range over the apparatus alternatives, then every
// alternative's run.
func printApparatus(w io.Writer, rows []validation.EnvelopeRow) {
	fmt.Fprintf(w, "\nmeasured energy and FWHM against the APPARATUS ALTERNATIVES (%s):\n", validation.ApparatusNote)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "case\tend\tmeasured\tnominal\talternatives min–max\tmeasured lies\tnominal lies\tmeasured FWHM\tnominal FWHM\tFWHM min–max\tmeasured FWHM lies")
	inside, measured := 0, 0
	for _, r := range rows {
		if r.Err != nil {
			fmt.Fprintf(tw, "%s\t%s\terror: %v\n", r.Case, r.End, r.Err)
			continue
		}
		pos := r.MeasuredPosition()
		if pos != "" {
			measured++
		}
		if pos == "inside" {
			inside++
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", r.Case, r.End,
			optJ(r.Measured, "J"), optJ(r.Nominal, "J"), optJ(r.EnergyLow, "J")+" – "+optJ(r.EnergyHigh, "J"),
			upperOut(pos), upperOut(r.NominalPosition()),
			optJ(r.MeasuredW, "s"), optJ(r.NominalW, "s"), fwhmRangeText(r), upperOut(r.MeasuredWPosition()))
	}
	tw.Flush()
	fmt.Fprintf(w, "%d of %d measured energies lie inside the range of the apparatus alternatives\n", inside, measured)
	for _, r := range rows {
		if r.Err == nil && r.MeasuredLases != nil {
			fmt.Fprintln(w, validation.LasingSentence(r))
		}
	}
	printDerived(w, rows)
	fmt.Fprintln(w)
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "case\talternative\tenergy\tFWHM\tlases\tsets")
	for _, r := range rows {
		for _, a := range r.Runs {
			if a.Err != nil {
				fmt.Fprintf(tw, "%s\t%s\terror: %v\t\t\t%s\n", r.Case, a.Name, a.Err, a.Settings())
				continue
			}
			lases := "no"
			if a.Lases {
				lases = "yes"
			}
			fwhm := optJ(a.FWHM, "s")
			if a.FWHMIllConditioned {
				fwhm += " (ill-conditioned)"
			}
			fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\n", r.Case, a.Name, optJ(a.Energy, "J"), fwhm, lases, a.Settings())
		}
	}
	tw.Flush()
}

// printDerived writes the checks the cases derive from their measured variations against the
// apparatus alternatives: one summary row per check, then every alternative's value.
func printDerived(w io.Writer, rows []validation.EnvelopeRow) {
	if validation.DerivedCount(rows) == 0 {
		return
	}
	fmt.Fprintf(w, "\nchecks derived from the measured variations against the APPARATUS ALTERNATIVES (each alternative's scan run as the default check runs it):\n")
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "id\tmeasured\tnominal\talternatives min–max\tmeasured lies\talternatives passing")
	for _, r := range rows {
		for _, d := range r.Derived {
			pass, ran := d.Passing()
			fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%d of %d\n", d.Nominal.ID, d.MeasuredText(), validation.ValueText(d.Nominal),
				d.RangeText(), upperOut(d.MeasuredPosition()), pass, ran)
		}
	}
	tw.Flush()
	fmt.Fprintln(w)
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "id\talternative\tcomputed\tresult")
	for _, r := range rows {
		for _, d := range r.Derived {
			for _, a := range d.Runs {
				fmt.Fprintf(tw, "%s\t%s\t%s\t%s\n", d.Nominal.ID, a.Alternative, validation.ValueText(a.Check), a.Check.Result())
			}
		}
	}
	tw.Flush()
}

// optJ formats v in unit, or "–" when it is not a number.
func optJ(v float64, unit string) string {
	if v != v {
		return "–"
	}
	return units.Format(v, unit)
}

// upperOut is pos as printed: "inside", "BELOW"/"ABOVE" in capitals, "–" when undefined.
func upperOut(pos string) string {
	switch pos {
	case "":
		return "–"
	case "inside":
		return pos
	}
	return strings.ToUpper(pos)
}
