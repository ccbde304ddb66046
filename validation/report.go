package validation

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"

	"n2pulse/internal/atomicfile"
)

// Figure draws the overlay figure of one variation (model curve against measured points) into
// the file path. Validation does not draw: the command passes one built on package plots.
type Figure func(path string, v Variation) error

// WriteReport writes the full validation report into dir (created if needed): checks.md, the
// table of every check with its source in Markdown, checks.csv, the same table for scripts,
// and, when figure is not nil, one overlay figure per experimental variation,
// variation-<case>-<id>.png, listed in checks.md. Every file is written to a temporary file
// and renamed.
//
// The scoreboard (model/measured energy and FWHM of every experiment case against its
// specific loading) is a section of checks.md; when a score drawer is given, its figure
// ScoreboardFigureName too.
func WriteReport(dir string, checks []Check, figure Figure, score ...ScoreFigure) error {
	var sf ScoreFigure
	if len(score) > 0 {
		sf = score[0]
	}
	return WriteReportWith(dir, checks, figure, sf, nil)
}

// WriteReportWith is WriteReport with the optional parts given explicitly: score draws the
// scoreboard figure (nil: none), and apparatus, when not nil, adds the section of the apparatus
// alternatives (ApparatusEnvelope) to checks.md.
func WriteReportWith(dir string, checks []Check, figure Figure, score ScoreFigure, apparatus []EnvelopeRow) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("validation: report: %w", err)
	}
	vars, verr := Variations()
	var figs []string
	for _, v := range vars {
		if figure == nil {
			break
		}
		name := FigureName(v)
		if err := figure(filepath.Join(dir, name), v); err != nil {
			return fmt.Errorf("validation: report: %w", err)
		}
		figs = append(figs, name)
	}
	rows, _ := Scoreboard()
	scoreFig := ""
	if score != nil && len(rows) > 0 {
		if err := score(filepath.Join(dir, ScoreboardFigureName), rows); err != nil {
			return fmt.Errorf("validation: report: %w", err)
		}
		scoreFig = ScoreboardFigureName
	}
	var md bytes.Buffer
	writeMarkdown(&md, checks, vars, figs, verr)
	writeScoreboard(&md, rows, scoreFig)
	writeApparatus(&md, apparatus)
	if err := reportWrite(filepath.Join(dir, "checks.md"), md.Bytes()); err != nil {
		return err
	}
	var cb bytes.Buffer
	if err := writeCSV(&cb, checks); err != nil {
		return err
	}
	return reportWrite(filepath.Join(dir, "checks.csv"), cb.Bytes())
}

// FigureName is the file name of the overlay figure of variation v in the report.
func FigureName(v Variation) string {
	return "variation-" + strings.ReplaceAll(v.ID, "/", "-") + ".png"
}

// Result returns the word the check table prints: pass, FAIL, or DISCREPANCY for an
// experiment (or a check with a known limitation) outside its tolerance.
func (c Check) Result() string {
	switch {
	case c.Pass():
		return "pass"
	case c.Tolerated():
		return "DISCREPANCY"
	}
	return "FAIL"
}

func deviationText(c Check) string {
	d := c.Deviation()
	if math.IsNaN(d) || c.Mode == True {
		return "-"
	}
	if c.Mode == Absolute {
		return fmt.Sprintf("%+.3g", d)
	}
	return fmt.Sprintf("%+.1f%%", 100*d)
}

func computedText(c Check) string {
	if c.Err != nil {
		return "error: " + c.Err.Error()
	}
	if c.Mode == True {
		if c.Computed != 0 {
			return "holds"
		}
		return "does not hold"
	}
	return strings.TrimSpace(fmt.Sprintf("%.4g %s", c.Computed, c.Unit))
}

func writeMarkdown(w *bytes.Buffer, checks []Check, vars []Variation, figs []string, verr error) {
	var pass, fail, disc int
	for _, c := range checks {
		switch c.Result() {
		case "pass":
			pass++
		case "FAIL":
			fail++
		default:
			disc++
		}
	}
	fmt.Fprintf(w, "# n2pulse validation report\n\n")
	fmt.Fprintf(w, "%d checks: %d passed, %d failed, %d discrepancies with experiments.\n\n", len(checks), pass, fail, disc)
	fmt.Fprintf(w, "A *discrepancy* is a published experiment the model misses by more than its tolerance; it\n")
	fmt.Fprintf(w, "stays in the table and is discussed in validation/testdata/experiments/README.md.\n\n")
	fmt.Fprintf(w, "| id | quantity | computed | reference | deviation | tolerance | result | kind | source |\n")
	fmt.Fprintf(w, "| --- | --- | --- | --- | --- | --- | --- | --- | --- |\n")
	for _, c := range checks {
		ref := fmt.Sprintf("%.4g", c.Reference)
		if c.Mode == True {
			ref = "holds"
		}
		fmt.Fprintf(w, "| %s | %s | %s | %s | %s | %s | %s | %s | %s |\n",
			mdCell(c.ID), mdCell(c.Quantity), mdCell(computedText(c)), ref, deviationText(c),
			mdCell(c.ToleranceText()), c.Result(), c.Kind, mdCell(c.Source))
	}
	if len(vars) > 0 || verr != nil {
		fmt.Fprintf(w, "\n## Experimental variations\n\n")
	}
	if verr != nil {
		fmt.Fprintf(w, "The experiment cases could not be run: %s\n\n", mdCell(verr.Error()))
	}
	for i, v := range vars {
		fmt.Fprintf(w, "### %s: %s\n\n", v.ID, v.Title)
		if i < len(figs) { // no figures when WriteReport had no drawer
			fmt.Fprintf(w, "![%s](%s)\n\n", v.ID, figs[i])
		}
		fmt.Fprintf(w, "Source: %s\n\n", v.Source)
		fmt.Fprintf(w, "| %s | measured %s | model %s | how measured |\n| --- | --- | --- | --- |\n", v.XLabel, v.YLabel, v.YLabel)
		for k := range v.MeasuredX {
			m := interpolate(v.ModelX, v.ModelY, v.MeasuredX[k])
			fmt.Fprintf(w, "| %.4g | %.4g | %.4g | %s |\n", v.MeasuredX[k], v.MeasuredY[k], m, mdCell(v.Notes[k]))
		}
		fmt.Fprintf(w, "\nModel scan: ")
		for k := range v.ModelX {
			if k > 0 {
				fmt.Fprintf(w, ", ")
			}
			fmt.Fprintf(w, "(%.4g, %.4g)", v.ModelX[k], v.ModelY[k])
		}
		fmt.Fprintf(w, "\n\n")
	}
}

func mdCell(s string) string {
	return strings.NewReplacer("|", "\\|", "\n", " ").Replace(s)
}

func writeCSV(w *bytes.Buffer, checks []Check) error {
	cw := csv.NewWriter(w)
	rows := [][]string{{"id", "quantity", "unit", "computed", "reference", "tolerance", "low", "high",
		"mode", "deviation", "result", "kind", "source", "error"}}
	modes := map[Mode]string{Relative: "relative", Absolute: "absolute", Factor: "factor", Range: "range", True: "true"}
	for _, c := range checks {
		e := ""
		if c.Err != nil {
			e = c.Err.Error()
		}
		dev := c.Deviation()
		rows = append(rows, []string{c.ID, c.Quantity, c.Unit, fmt.Sprint(c.Computed), fmt.Sprint(c.Reference),
			fmt.Sprint(c.Tolerance), fmt.Sprint(c.Low), fmt.Sprint(c.High), modes[c.Mode], fmt.Sprint(dev),
			c.Result(), c.Kind.String(), c.Source, e})
	}
	if err := cw.WriteAll(rows); err != nil {
		return fmt.Errorf("validation: report: %w", err)
	}
	return nil
}

// reportWrite writes one file of the report atomically.
func reportWrite(path string, b []byte) error {
	if err := atomicfile.WriteFile(path, b); err != nil {
		return fmt.Errorf("validation: report: %w", err)
	}
	return nil
}
