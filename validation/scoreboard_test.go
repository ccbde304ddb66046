package validation

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestScoreboard: one row per experiment case, whose ratios are the computed/reference of the
// case's own energy and FWHM checks (the same runs), whose loading is that of a uniform glow
// exactly when the run says so, and the report shows the section and draws its figure.
func TestScoreboard(t *testing.T) {
	rows, err := Scoreboard()
	if err != nil {
		t.Fatal(err)
	}
	cases, err := loadExperiments(experimentFiles)
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != len(cases) {
		t.Fatalf("%d rows, want one per case (%d)", len(rows), len(cases))
	}
	checks := experimentResults().checks
	byID := map[string]Check{}
	for _, c := range checks {
		byID[c.ID] = c
	}
	for _, r := range rows {
		if r.Err != nil {
			t.Errorf("%s: %v", r.Case, r.Err)
			continue
		}
		if !(r.EnergyPerMolecule > 0 && r.SpecificEnergy > 0 && r.CurrentDensity > 0) {
			t.Errorf("%s: loading %g eV, %g J/m³, %g A/m²", r.Case, r.EnergyPerMolecule, r.SpecificEnergy, r.CurrentDensity)
		}
		for _, q := range []struct {
			id    string
			ratio float64
		}{{"energy", r.EnergyRatio()}, {"fwhm", r.FWHMRatio()}} {
			c, ok := byID["exp."+r.Case+"."+q.id]
			if !ok {
				if !math.IsNaN(q.ratio) {
					t.Errorf("%s: %s ratio %g without a measurement", r.Case, q.id, q.ratio)
				}
				continue
			}
			if want := c.Computed / c.Reference; !scalar.EqualWithinAbsOrRel(q.ratio, want, 0, 1e-9) {
				t.Errorf("%s: %s ratio %g, the check says %g", r.Case, q.id, q.ratio, want)
			}
		}
	}
	var md bytes.Buffer
	writeScoreboard(&md, rows, ScoreboardFigureName)
	for _, r := range rows {
		if !strings.Contains(md.String(), "| "+r.Case+" |") {
			t.Errorf("scoreboard table lacks %s", r.Case)
		}
	}
	dir := t.TempDir()
	drawn := 0
	score := func(path string, rs []ScoreRow) error {
		drawn++
		return os.WriteFile(path, []byte("x"), 0o644)
	}
	if err := WriteReport(dir, nil, nil, score); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(filepath.Join(dir, "checks.md"))
	if err != nil {
		t.Fatal(err)
	}
	if drawn != 1 || !strings.Contains(string(b), "## Scoreboard") || !strings.Contains(string(b), "("+ScoreboardFigureName+")") {
		t.Errorf("report: scoreboard drawn %d times; section or figure link missing", drawn)
	}
}
