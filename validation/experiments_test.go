package validation

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/BurntSushi/toml"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// TestExperimentCasesLoad checks that every case parses as a design file and has a source.
func TestExperimentCasesLoad(t *testing.T) {
	cases, err := loadExperiments(experimentFiles)
	if err != nil {
		t.Fatal(err)
	}
	if len(cases) < 4 {
		t.Fatalf("%d cases, want at least 4", len(cases))
	}
	for _, c := range cases {
		if c.Measured.Energy == nil && c.Measured.FWHM == nil && c.Measured.Lases == nil && len(c.Measured.Variation) == 0 {
			t.Errorf("%s: nothing measured", c.Name)
		}
	}
}

// TestCommonBlock fails when a case file departs from the common block (COMMON.md): the values
// no source gives are set once, not tuned per case.
func TestCommonBlock(t *testing.T) {
	var common map[string]any
	cb, err := experimentFiles.ReadFile(experimentDir + "/common.toml")
	if err != nil {
		t.Fatal(err)
	}
	if _, err := toml.NewDecoder(bytes.NewReader(cb)).Decode(&common); err != nil {
		t.Fatal(err)
	}
	cases, err := loadExperiments(experimentFiles)
	if err != nil {
		t.Fatal(err)
	}
	keys := flatKeys("", common)
	if len(keys) < 10 {
		t.Fatalf("common block has %d keys, want at least 10", len(keys))
	}
	for _, c := range cases {
		for key, value := range keys {
			if key == "channel.width" {
				continue // used only where the source does not give the width
			}
			ref := design.Defaults()
			if err := ref.Set(key, fmt.Sprint(value)); err != nil {
				t.Fatalf("common.toml: %v", err)
			}
			if key == "switch.model" {
				if c.Design.Switch.Model != ref.Switch.Model {
					t.Errorf("%s: switch.model = %s, common block %s", c.Name, c.Design.Switch.Model, ref.Switch.Model)
				}
				continue
			}
			want, err1 := ref.Get(key)
			got, err2 := c.Design.Get(key)
			if err1 != nil || err2 != nil {
				t.Fatalf("%s: %v %v", key, err1, err2)
			}
			if got != want {
				t.Errorf("%s: %s = %g, common block %g", c.Name, key, got, want)
			}
		}
	}
}

// flatKeys flattens a decoded TOML table into dotted keys and their values.
func flatKeys(prefix string, m map[string]any) map[string]any {
	out := map[string]any{}
	for k, v := range m {
		if sub, ok := v.(map[string]any); ok {
			for kk, vv := range flatKeys(prefix+k+".", sub) {
				out[kk] = vv
			}
			continue
		}
		out[prefix+k] = v
	}
	return out
}

func TestOptimum(t *testing.T) {
	// Parabola y = −(x−1.3)² sampled on a coarse grid: the vertex is found exactly (analytic).
	x := []float64{1, 1.2, 1.4, 1.6}
	y := make([]float64, len(x))
	for i := range x {
		y[i] = -(x[i] - 1.3) * (x[i] - 1.3)
	}
	if got := optimum(x, y); math.Abs(got-1.3) > 1e-12 {
		t.Errorf("optimum = %g, want 1.3", got)
	}
	// Monotone data: the optimum is the edge.
	if got := optimum([]float64{1, 2, 3}, []float64{1, 2, 3}); got != 3 {
		t.Errorf("edge optimum = %g, want 3", got)
	}
	if got := interpolate([]float64{0, 1}, []float64{0, 10}, 0.25); got != 2.5 {
		t.Errorf("interpolate = %g, want 2.5", got)
	}
	if got := interpolate([]float64{0, 1}, []float64{0, 10}, 2); !math.IsNaN(got) {
		t.Errorf("interpolate outside = %g, want NaN", got)
	}
}

// TestWriteReport writes the report for a small hand-made table plus the experiment variations
// and checks that every promised file is there and the CSV has one row per check.
func TestWriteReport(t *testing.T) {
	dir := t.TempDir()
	checks := []Check{
		{ID: "a", Quantity: "x", Computed: 1, Reference: 1, Tolerance: 0.1, Mode: Relative, Kind: Analytic, Source: "test"},
		{ID: "b", Quantity: "y | z", Computed: 3, Reference: 1, Tolerance: 2, Mode: Factor, Kind: Experiment, Source: "test"},
	}
	drawn := 0
	figure := func(path string, v Variation) error {
		drawn++
		return os.WriteFile(path, []byte(v.ID), 0o644)
	}
	if err := WriteReport(dir, checks, figure); err != nil {
		t.Fatal(err)
	}
	md, err := os.ReadFile(filepath.Join(dir, "checks.md"))
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(md), "DISCREPANCY") || !strings.Contains(string(md), `y \| z`) {
		t.Errorf("checks.md lacks the discrepancy row or the escaped cell:\n%s", md)
	}
	f, err := os.Open(filepath.Join(dir, "checks.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 1+len(checks) {
		t.Errorf("checks.csv has %d rows, want %d", len(rows), 1+len(checks))
	}
	vars, err := Variations()
	if err != nil {
		t.Fatal(err)
	}
	if drawn != len(vars) {
		t.Errorf("%d figures drawn, want one per variation (%d)", drawn, len(vars))
	}
	for _, v := range vars {
		if _, err := os.Stat(filepath.Join(dir, FigureName(v))); err != nil {
			t.Errorf("figure missing: %v", err)
		}
		if !strings.Contains(string(md), FigureName(v)) {
			t.Errorf("checks.md does not list %s", FigureName(v))
		}
	}
}

// TestExperimentConvergence measures how the compared quantities change between the 20 cells
// of the experiment runs and 200 cells, on every case; the experiment tolerances (factor 2 on
// energy, 40 % on FWHM) must be much wider than this numerical error. The bound of 10 % is our
// choice (common practice, no source: a numerical error well inside the comparison tolerance).
// The FWHM is held to it where a case compares one (a measured FWHM, or a variation of it); the
// RMS width is held to it everywhere. The FWHM of a train of round-trip spikes is ill-posed when a
// spike peaks at half the highest: the 8.8 cm v2 case has its third spike at 0.50 of the peak,
// so its FWHM jumps between 0.67 and 0.92 ns with the cell count (20, 40 cells) while its
// energy and RMS width agree to 0.01 % and 0.07 %; it compares no FWHM. The run flags such a
// width (Summary.FWHMIllConditioned; TestExperimentIllConditionedWidth).
func TestExperimentConvergence(t *testing.T) {
	if testing.Short() {
		t.Skip("runs each case twice more")
	}
	cases, err := loadExperiments(experimentFiles)
	if err != nil {
		t.Fatal(err)
	}
	if len(cases) == 0 {
		t.Fatal("no experiment cases")
	}
	for _, c := range cases {
		t.Run(c.Name, func(t *testing.T) {
			t.Parallel()
			var e, w, rms [2]float64
			comparesWidth := c.Measured.FWHM != nil
			for _, v := range c.Measured.Variation {
				comparesWidth = comparesWidth || v.Quantity == "fwhm"
			}
			for i, n := range []int{20, 200} {
				d := c.Design.Clone()
				d.Numerics.Cells = n
				r, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
				if err != nil {
					t.Fatalf("%s, %d cells: %v", c.Name, n, err)
				}
				e[i], w[i], rms[i] = r.Summary.EnergyFront, r.Summary.FWHM, r.Summary.RMSWidth
			}
			if e[0] == 0 && e[1] == 0 {
				// A case that does not lase at either resolution (no pulse, no width) converges trivially.
				t.Logf("%s: no output at 20 or 200 cells", c.Name)
				return
			}
			de, dw, dr := math.Abs(e[0]/e[1]-1), math.Abs(w[0]/w[1]-1), math.Abs(rms[0]/rms[1]-1)
			t.Logf("%s: energy %.4g J (20 cells) vs %.4g J (200 cells), %.2f%%; FWHM %.4g vs %.4g s, %.2f%%; RMS width %.4g vs %.4g s, %.2f%%",
				c.Name, e[0], e[1], 100*de, w[0], w[1], 100*dw, rms[0], rms[1], 100*dr)
			if !(de <= 0.1 && dr <= 0.1) || comparesWidth && !(dw <= 0.1) {
				t.Errorf("%s: 20 cells differ from 200 cells by %.1f%% (energy), %.1f%% (FWHM, compared: %v), %.1f%% (RMS width); want ≤ 10%%",
					c.Name, 100*de, 100*dw, comparesWidth, 100*dr)
			}
		})
	}
}

// BenchmarkExperimentCase times one light model run of the longest experiment channel.
func BenchmarkExperimentCase(b *testing.B) {
	cases, err := loadExperiments(experimentFiles)
	if err != nil {
		b.Fatal(err)
	}
	var d *design.Design
	for _, c := range cases {
		if c.Name == "tea-transfer-88mm-v1" {
			d = c.Design
		}
	}
	if d == nil {
		b.Fatal("experiment case tea-transfer-88mm-v1 not found")
	}
	for b.Loop() {
		if _, err := kinetics.Run(d, &kinetics.RunSettings{Light: true}); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "runs/s")
}
