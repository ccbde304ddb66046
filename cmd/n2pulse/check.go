package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"

	"n2pulse/kinetics/study"
	"n2pulse/plots"
	"n2pulse/units"
	"n2pulse/validation"
)

func init() {
	register(command{
		name:    "check",
		summary: "run the validation registry: the model against published and analytic values",
		run:     runCheck,
	})
}

func runCheck(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("check", "[--strict] [--report DIR] [--uncertainty N [--seed S]] [--apparatus] [--json]", stderr)
	strict := fs.Bool("strict", false, "exit 1 also on a discrepancy with a published experiment")
	report := fs.String("report", "", "write the validation report (checks.md, checks.csv, overlay figures) into `DIR`")
	samples := fs.Int("uncertainty", 0, fmt.Sprintf("also run every experiment case with a measured energy over N samples of the uncertain constants (Latin hypercube, %d…%d) and say whether the measured energy lies inside the model's 5–95 %% band", study.MinSamples, study.MaxSamples))
	seed := fs.Uint64("seed", 1, "seed of the --uncertainty samples")
	apparatus := fs.Bool("apparatus", false, "also run every experiment case with a measured energy or FWHM once per apparatus alternative of validation/testdata/experiments/COMMON.md (a switch that holds the charge, loop inductances ×0.5 and ×3, width 1–2× the gap where the source gives none) and say whether the measurement lies inside their range, also for the checks derived from measured variations (best gap, air/N₂ ratio, directions), each alternative's scan run as the default check runs it; apparatus, not model uncertainty; the checks and their verdicts do not change")
	asJSON := fs.Bool("json", false, "print the checks (and the --uncertainty and --apparatus results) as JSON on stdout (SI units; null where a value is not defined)")
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("check: takes no arguments, got %q", fs.Args())
	}
	if err := study.CheckSamples("--uncertainty", *samples); err != nil {
		return usageOf("check: ", err)
	}
	checks := validation.RunAll()
	var envelope []validation.EnvelopeRow
	if *apparatus {
		var err error
		if envelope, err = validation.ApparatusEnvelope(0); err != nil {
			return err
		}
	}
	if *report != "" {
		if err := validation.WriteReportWith(*report, checks, drawVariation, drawScoreboard, envelope); err != nil {
			return err
		}
	}
	var bands []validation.BandRow
	if *samples > 0 {
		var err error
		if bands, err = validation.ExperimentBands(*samples, *seed, 0); err != nil {
			return err
		}
	}
	var failed, discrepant int
	if *asJSON {
		failed, discrepant = countChecks(checks)
		b, err := json.MarshalIndent(checkJSON(checks, failed, discrepant, bands, *samples, *seed, envelope, *apparatus), "", "  ")
		if err != nil {
			return err
		}
		fmt.Fprintf(stdout, "%s\n", b)
	} else {
		failed, discrepant = printChecks(stdout, checks)
		fmt.Fprintf(stdout, "\n%d checks: %d passed, %d failed, %d discrepancies with experiments\n",
			len(checks), len(checks)-failed-discrepant, failed, discrepant)
		if *samples > 0 {
			printExperimentBands(stdout, bands, *samples, *seed)
		}
		if *apparatus {
			printApparatus(stdout, envelope)
		}
	}
	if failed > 0 || (*strict && discrepant > 0) {
		return errSilent
	}
	return nil
}

// widthFlagCell is a check row's count of samples with separate pulses and with an
// ill-conditioned FWHM: "2 separate pulses, 3 ill-conditioned FWHM", "none" when neither.
func widthFlagCell(separate, ill int) string {
	var parts []string
	if separate > 0 {
		parts = append(parts, fmt.Sprintf("%d separate pulses", separate))
	}
	if ill > 0 {
		parts = append(parts, fmt.Sprintf("%d ill-conditioned FWHM", ill))
	}
	if len(parts) == 0 {
		return "none"
	}
	return strings.Join(parts, ", ")
}

// drawVariation draws the report's overlay figure of one experimental variation: the model
// curve against the measured points.
func drawVariation(path string, v validation.Variation) error {
	return plots.Overlay(path, plots.OverlayData{
		Title: v.ID + ": " + v.Title, XLabel: v.XLabel, YLabel: v.YLabel,
		ModelLabel: "model", ModelX: v.ModelX, ModelY: v.ModelY,
		MeasuredLbl: "measured", MeasuredX: v.MeasuredX, MeasuredY: v.MeasuredY,
	})
}

// drawScoreboard draws the report's scoreboard: model/measured energy and FWHM of every
// experiment case against its specific loading.
func drawScoreboard(path string, rows []validation.ScoreRow) error {
	pts := make([]plots.ScorePoint, len(rows))
	for i, r := range rows {
		pts[i] = plots.ScorePoint{Loading: r.EnergyPerMolecule, EnergyRatio: r.EnergyRatio(), FWHMRatio: r.FWHMRatio()}
	}
	return plots.Scoreboard(path, pts)
}

// printChecks writes the check table and counts failures and experiment discrepancies.
func printChecks(w io.Writer, checks []validation.Check) (failed, discrepant int) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "id\tcomputed\treference\tdeviation\ttolerance\tresult\tkind\tsource")
	for _, c := range checks {
		result := "pass"
		switch {
		case c.Pass():
		case c.Tolerated():
			result, discrepant = "DISCREPANCY", discrepant+1
		default:
			result, failed = "FAIL", failed+1
		}
		comp := fmt.Sprintf("%.5g %s", c.Computed, c.Unit)
		if c.Err != nil {
			comp = "error: " + c.Err.Error()
		}
		dev := "-"
		if d := c.Deviation(); !math.IsNaN(d) && c.Mode != validation.True {
			if c.Mode == validation.Absolute {
				dev = fmt.Sprintf("%+.3g", d)
			} else {
				dev = fmt.Sprintf("%+.2f%%", 100*d)
			}
		}
		fmt.Fprintf(tw, "%s\t%s\t%.5g\t%s\t%s\t%s\t%s\t%s\n", c.ID, comp, c.Reference, dev,
			c.ToleranceText(), result, c.Kind, c.Source)
	}
	tw.Flush()
	return failed, discrepant
}

// printExperimentBands writes, per experiment case with a measured energy, the measured value,
// the model's nominal value and its 5–95 % band over the samples, where the measurement lies
// against the band, and how many samples make separate pulses or an ill-conditioned FWHM.
func printExperimentBands(w io.Writer, rows []validation.BandRow, n int, seed uint64) {
	fmt.Fprintf(w, "\nmeasured energy against the model's uncertainty band (%d samples of the uncertain constants, Latin hypercube, seed %d):\n", n, seed)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "case\tend\tmeasured\tmodel\t5 %\tmedian\t95 %\tmeasured lies\tsamples with an ambiguous width")
	inside, ambiguous := 0, 0
	for _, r := range rows {
		if r.Err != nil {
			fmt.Fprintf(tw, "%s\t%s\t%s\t\t\t\t\terror: %v\n", r.Case, r.End, units.Format(r.Measured, "J"), r.Err)
			continue
		}
		pos := r.Position()
		if pos == "inside" {
			inside++
		} else {
			pos = strings.ToUpper(pos) + " the band"
		}
		flags := widthFlagCell(r.SeparatePulses, r.IllConditionedFWHM)
		if flags != "none" {
			ambiguous++
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", r.Case, r.End, units.Format(r.Measured, "J"), units.Format(r.Nominal, "J"),
			units.Format(r.Band.P05, "J"), units.Format(r.Band.P50, "J"), units.Format(r.Band.P95, "J"), pos, flags)
	}
	tw.Flush()
	fmt.Fprintf(w, "%d of %d measured energies lie inside the band; the band covers the constants of package kinetics/design (Spreads), not the circuit and switch values of the common block (those: --apparatus)\n", inside, len(rows))
	if ambiguous > 0 {
		fmt.Fprintf(w, "%d of %d cases have samples with separate pulses or an ill-conditioned FWHM: their energy band holds, the width of those samples is ambiguous\n", ambiguous, len(rows))
	}
}
