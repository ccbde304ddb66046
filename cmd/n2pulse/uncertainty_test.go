package main

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"
)

// TestRunUncertainty runs `run --uncertainty 10` on the example design with few cells: the band
// table lists the four headline figures with their drivers, and the same seed prints the same
// table; with --json the block "uncertainty" carries the bands as <figure>_p05/_p50/_p95 in
// order and the drivers; a sample count below 10 is a usage error (exit code 2).
func TestRunUncertainty(t *testing.T) {
	t.Parallel()
	args := []string{"run", "../../data/designs/example.toml", "--set", "numerics.cells=20", "--uncertainty", "10", "--seed", "4"}
	var out1, out2, errb bytes.Buffer
	if code := run(args, &out1, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	_, table, ok := strings.Cut(out1.String(), "\nuncertainty: 10 samples")
	if !ok {
		t.Fatalf("no uncertainty section in:\n%s", out1.String())
	}
	for _, want := range []string{"seed 4", "pulse energy, output end", "pulse energy, both ends", "peak power, output end", "FWHM", "upper_quenching_nitrogen", "samples reach the lasing threshold"} {
		if !strings.Contains(table, want) {
			t.Errorf("uncertainty section lacks %q:\n%s", want, table)
		}
	}
	if code := run(args, &out2, &errb); code != 0 || out2.String() != out1.String() {
		t.Errorf("second run with the same seed: exit %d, output differs: %v", code, out2.String() != out1.String())
	}
	var js, e bytes.Buffer
	if code := run(append(args, "--json"), &js, &e); code != 0 {
		t.Fatalf("--json: exit %d: %s", code, e.String())
	}
	var got struct {
		Energy      float64 `json:"energy_total_J"`
		Uncertainty struct {
			Samples int                          `json:"samples"`
			P05     float64                      `json:"energy_total_J_p05"`
			P50     float64                      `json:"energy_total_J_p50"`
			P95     float64                      `json:"energy_total_J_p95"`
			Drivers map[string][]json.RawMessage `json:"drivers"`
		} `json:"uncertainty"`
	}
	if err := json.Unmarshal(js.Bytes(), &got); err != nil {
		t.Fatal(err)
	}
	u := got.Uncertainty
	if u.Samples != 10 || !(u.P05 > 0 && u.P05 <= u.P50 && u.P50 <= u.P95) || len(u.Drivers["energy_total_J"]) == 0 {
		t.Errorf("--json uncertainty block %+v; want 10 samples, 0 < p05 ≤ p50 ≤ p95 and drivers", u)
	}
	for _, bad := range [][]string{
		{"run", "../../data/designs/example.toml", "--uncertainty", "5"},
		{"run", "../../data/designs/example.toml", "--uncertainty", "100001"},
	} {
		var o, e bytes.Buffer
		if code := run(bad, &o, &e); code != 2 || !strings.Contains(e.String(), "--uncertainty") {
			t.Errorf("%v: exit %d, message %q; want 2 naming --uncertainty", bad, code, e.String())
		}
	}
}
