package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/study"
)

// TestSweepJSONAndBlocks runs the golden 3 × 2 sweep with --json: the optima are those of
// results.csv (the largest energy of its rows, in SI), and results.dat holds the 6 rows in 3
// blocks of 2 (one per pressure) separated by single blank lines, with NaN for empty cells;
// report.html is written beside them.
func TestSweepJSONAndBlocks(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	args := append([]string{}, goldenSweep...)
	args[1] = filepath.Join("..", "..", args[1])
	args = append(args, "--out", dir, "--json")
	var out, errb bytes.Buffer
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var rep struct {
		Points int `json:"points"`
		Optima []struct {
			Metric string             `json:"metric"`
			Word   string             `json:"optimum"`
			Value  float64            `json:"value"`
			At     map[string]float64 `json:"at"`
		} `json:"optima"`
		Files []string `json:"files"`
	}
	if err := json.Unmarshal(out.Bytes(), &rep); err != nil {
		t.Fatalf("%v\n%s", err, out.String())
	}
	if rep.Points != 6 || len(rep.Optima) != 4 {
		t.Fatalf("points %d, optima %d; want 6 and 4", rep.Points, len(rep.Optima))
	}
	tab, err := os.ReadFile(filepath.Join(dir, study.ResultsFile))
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(string(tab)), "\n")
	head := strings.Split(lines[0], ",")
	col := -1
	for i, h := range head {
		if h == "energy_total_J" {
			col = i
		}
	}
	best := 0.0
	for _, l := range lines[1:] {
		var v float64
		if err := json.Unmarshal([]byte(strings.Split(l, ",")[col]), &v); err == nil && v > best {
			best = v
		}
	}
	if e := rep.Optima[0]; e.Metric != "energy_total_J" || e.Word != "maximum" || !scalar.EqualWithinAbsOrRel(e.Value, best, 0, 1e-15) {
		t.Errorf("energy optimum %+v, want the maximum %g of results.csv", e, best)
	}
	dat, err := os.ReadFile(filepath.Join(dir, study.DataFile))
	if err != nil {
		t.Fatal(err)
	}
	blocks := strings.Split(strings.TrimSpace(string(dat)), "\n\n")
	if len(blocks) != 3 {
		t.Fatalf("results.dat has %d blocks, want 3:\n%s", len(blocks), dat)
	}
	for i, b := range blocks {
		rows := 0
		for _, l := range strings.Split(b, "\n") {
			if !strings.HasPrefix(l, "#") {
				rows++
				if strings.Contains(l, ",") || strings.Contains(l, "true") {
					t.Errorf("block %d row %q: want space-separated numbers", i, l)
				}
			}
		}
		if rows != 2 {
			t.Errorf("block %d has %d rows, want 2", i, rows)
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "report.html")); err != nil {
		t.Error(err)
	}
}

// TestLengthJSON checks length --json: one curve per excitation velocity (null for a
// simultaneous discharge, 299792458 m/s for "c"), every length in SI, each point's summary, the
// useful-length rule in words.
func TestLengthJSON(t *testing.T) {
	t.Parallel()
	var out, errb bytes.Buffer
	args := []string{"length", "--from", "5cm", "--to", "15cm", "--points", "3", "--travelling-wave", "c", "--set", "numerics.cells=30", "--json"}
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var r struct {
		Curves []struct {
			Velocity *float64 `json:"excitation_velocity_m_s"`
			Rule     string   `json:"useful_length_rule"`
			Points   []struct {
				Length  float64         `json:"length_m"`
				Summary json.RawMessage `json:"summary"`
			} `json:"points"`
		} `json:"curves"`
	}
	if err := json.Unmarshal(out.Bytes(), &r); err != nil {
		t.Fatalf("%v\n%s", err, out.String())
	}
	if len(r.Curves) != 2 || r.Curves[0].Velocity != nil || r.Curves[1].Velocity == nil || *r.Curves[1].Velocity != 299792458 {
		t.Fatalf("curves: %+v", r.Curves)
	}
	for _, c := range r.Curves {
		if c.Rule == "" || len(c.Points) != 3 {
			t.Errorf("curve: rule %q, %d points", c.Rule, len(c.Points))
		}
		for k, p := range c.Points {
			if want := 0.05 * float64(k+1); !scalar.EqualWithinAbsOrRel(p.Length, want, 1e-15, 1e-12) || len(p.Summary) == 0 {
				t.Errorf("point %d: length %g m (want %g), summary %d bytes", k, p.Length, want, len(p.Summary))
			}
		}
	}
}
