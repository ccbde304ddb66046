package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestCompare runs the two shipped designs side by side with one --set for both: the set key
// no longer differs, the stored energy follows ½(C₁+C₂)V² of the example (4 nF + 4 nF at
// 10 kV = 0.4 J, its own design values), every ratio is the quotient of the two values, the
// table names the differing keys in words and display units, and the files are written.
func TestCompare(t *testing.T) {
	t.Parallel()
	a := filepath.Join("..", "..", "data", "designs", "example.toml")
	b := filepath.Join("..", "..", "data", "designs", "board.toml")
	dir := t.TempDir()
	var out, errb bytes.Buffer
	args := []string{"compare", a, b, "--set", "circuit.charge_voltage=10kV", "--set", "numerics.cells=60", "--out", dir, "--json"}
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var c struct {
		Designs []struct {
			Name    string         `json:"name"`
			Summary map[string]any `json:"summary"`
		} `json:"designs"`
		Differ []struct {
			Key    string   `json:"key"`
			Values []string `json:"values"`
		} `json:"differing_keys"`
		Metrics []struct {
			Metric string     `json:"metric"`
			Values []float64  `json:"values"`
			Ratios []*float64 `json:"ratio_to_first"`
		} `json:"metrics"`
		Files []string `json:"files"`
	}
	if err := json.Unmarshal(out.Bytes(), &c); err != nil {
		t.Fatalf("%v\n%s", err, out.String())
	}
	if len(c.Designs) != 2 {
		t.Fatalf("%d designs, want 2", len(c.Designs))
	}
	if stored := c.Designs[0].Summary["stored_energy_J"].(float64); !scalar.EqualWithinAbsOrRel(stored, 0.4, 0, 1e-12) {
		t.Errorf("stored energy of A %g J, want 0.4 J", stored)
	}
	gap := false
	for _, k := range c.Differ {
		if k.Key == "circuit.charge_voltage" {
			t.Errorf("charge voltage differs after --set applied to both: %v", k.Values)
		}
		gap = gap || (k.Key == "channel.gap" && k.Values[0] == "0.0015" && k.Values[1] == "0.002")
	}
	if !gap {
		t.Errorf("channel.gap 1.5 mm against 2 mm not among the differing keys: %+v", c.Differ)
	}
	for _, m := range c.Metrics {
		if m.Values[0] == 0 {
			continue
		}
		if m.Ratios[1] == nil || !scalar.EqualWithinAbsOrRel(*m.Ratios[1], m.Values[1]/m.Values[0], 0, 1e-12) {
			t.Errorf("%s: ratio %v, want %g", m.Metric, m.Ratios[1], m.Values[1]/m.Values[0])
		}
	}
	if len(c.Files) != 4 {
		t.Errorf("files %v, want compare.csv, .png, .svg, report.html", c.Files)
	}
	if html, err := os.ReadFile(filepath.Join(dir, "report.html")); err != nil || !strings.Contains(string(html), `<figure id="compare">`) ||
		!strings.Contains(string(html), "<h2>Keys that differ</h2>") || !strings.Contains(string(html), "channel gap (channel.gap)") {
		t.Errorf("compare report.html: %v, or it lacks the figure or the differing keys", err)
	}
	for _, f := range c.Files {
		if st, err := os.Stat(f); err != nil || st.Size() == 0 {
			t.Errorf("%s: %v", f, err)
		}
	}

	out.Reset()
	errb.Reset()
	if code := run([]string{"compare", a, b, "--set", "numerics.cells=60", "--out", ""}, &out, &errb); code != 0 {
		t.Fatalf("table: exit %d: %s", code, errb.String())
	}
	text := out.String()
	for _, want := range []string{"A: bench-top atmospheric Blumlein", "keys that differ", "channel gap", "1.5 mm", "2 mm", "charge voltage", "14 kV", "12 kV", "B / A", "pulse energy, both ends", "Caution"} {
		if !strings.Contains(text, want) {
			t.Errorf("no %q in the table:\n%s", want, text)
		}
	}
	if strings.Contains(text, "circuit.charge_voltage") || strings.Contains(text, "energy_total_J") {
		t.Errorf("raw key names in the table:\n%s", text)
	}
	if code := run([]string{"compare", a}, &out, &errb); code != 2 {
		t.Errorf("one design: exit %d, want 2", code)
	}
}
