package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestLengthUncertainty runs `length --uncertainty 10` on the example design (20 cells, three
// lengths): --json gives every point a band with p05 ≤ p50 ≤ p95 of the output-end energy and a
// note, and each curve the count of samples in its useful-length band; length.csv has the band
// columns; an absurd sample count for the grid is a usage error naming --uncertainty before
// anything runs.
func TestLengthUncertainty(t *testing.T) {
	t.Parallel()
	if testing.Short() {
		t.Skip("runs the model 33 times")
	}
	dir := t.TempDir()
	args := []string{"length", "../../data/designs/example.toml", "--set", "numerics.cells=20", "--points", "3", "--from", "10cm", "--to", "40cm",
		"--uncertainty", "10", "--seed", "2", "--json", "--out", dir}
	var out, errb bytes.Buffer
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var got struct {
		Curves []struct {
			UsefulSamples *int `json:"useful_length_samples"`
			Points        []struct {
				U map[string]any `json:"uncertainty"`
			} `json:"points"`
		} `json:"curves"`
	}
	if err := json.Unmarshal(out.Bytes(), &got); err != nil {
		t.Fatalf("%v\n%s", err, out.String())
	}
	c := got.Curves[0]
	if c.UsefulSamples == nil || *c.UsefulSamples > 10 || len(c.Points) != 3 {
		t.Fatalf("curve: useful_length_samples %v, %d points; want a count ≤ 10 and 3 points", c.UsefulSamples, len(c.Points))
	}
	for k, p := range c.Points {
		lo, _ := p.U["energy_front_J_p05"].(float64)
		mid, _ := p.U["energy_front_J_p50"].(float64)
		hi, _ := p.U["energy_front_J_p95"].(float64)
		if _, ok := p.U["note"].(string); !ok || !(lo > 0 && lo <= mid && mid <= hi) || p.U["samples"] != 10.0 {
			t.Errorf("point %d: uncertainty %v; want 10 samples, 0 < p05 ≤ p50 ≤ p95 and a note", k, p.U)
		}
	}
	csv, err := os.ReadFile(filepath.Join(dir, "length.csv"))
	if err != nil {
		t.Fatal(err)
	}
	tab := readTable(t, csv)
	for _, col := range []string{"energy_front_J_p05", "energy_front_J_p50", "energy_front_J_p95", "useful_length_m_p50", "useful_length_beyond", "may_not_lase", "band_note"} {
		if tab.Column(col) < 0 {
			t.Errorf("length.csv has no column %q", col)
		}
	}
	var o, e bytes.Buffer
	bad := []string{"length", "../../data/designs/example.toml", "--points", "10000", "--uncertainty", "1000"}
	if code := run(bad, &o, &e); code != 2 || !strings.Contains(e.String(), "--uncertainty 1000") || !strings.Contains(e.String(), "10…199") {
		t.Errorf("%v: exit %d, %q; want 2 and the allowed range 10…199", bad, code, e.String())
	}
}
