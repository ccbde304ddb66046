package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestLinesJSON(t *testing.T) {
	t.Parallel()
	var out, errb bytes.Buffer
	if code := run([]string{"lines", "--json", "--pressure", "40 Torr", "--temperature", "300 K"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var got struct {
		Bands []map[string]float64 `json:"bands"`
		Tau   float64              `json:"lifetime_C0_s"`
	}
	if err := json.Unmarshal(out.Bytes(), &got); err != nil {
		t.Fatal(err)
	}
	if len(got.Bands) != 25 {
		t.Fatalf("%d bands, want 25 (v′, v″ ≤ 4)", len(got.Bands))
	}
	for _, k := range []string{"v_upper", "v_lower", "origin_air_nm", "head_air_nm", "head_vacuum_nm", "fcf", "einstein_A_s"} {
		if _, ok := got.Bands[0][k]; !ok {
			t.Errorf("band JSON lacks key %q", k)
		}
	}
	// (0,0) head in air: Pearse & Gaydon 337.13 nm (from memory, physics-data.md §1d), ±0.05 nm
	if h := got.Bands[0]["head_air_nm"]; math.Abs(h-337.13) > 0.05 {
		t.Errorf("(0,0) head %.3f nm", h)
	}
	if got.Tau < 30e-9 || got.Tau > 50e-9 {
		t.Errorf("lifetime %g s", got.Tau)
	}
}

func TestLinesTableAndPlot(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	fig := filepath.Join(dir, "band.svg")
	var out, errb bytes.Buffer
	if code := run([]string{"lines", "--plot", fig}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "P(8)") || !strings.Contains(out.String(), "head air") {
		t.Errorf("table output:\n%s", out.String())
	}
	if st, err := os.Stat(fig); err != nil || st.Size() < 1000 {
		t.Errorf("figure %s: %v", fig, err)
	}
}

func TestLinesBadInput(t *testing.T) {
	t.Parallel()
	for _, args := range [][]string{
		{"lines", "--pressure", "40 K"},
		{"lines", "--temperature", "-5 K"},
		{"lines", "--pressure", "1e9 atm"},
		{"lines", "extra"},
	} {
		var out, errb bytes.Buffer
		if code := run(args, &out, &errb); code != 2 {
			t.Errorf("%q: exit %d, want 2 (%s)", args, code, errb.String())
		}
	}
}
