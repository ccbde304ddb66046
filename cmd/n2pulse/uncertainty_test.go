package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestRunUncertainty runs `run --uncertainty 10` on the example design with few cells: the band
// table lists the four headline figures with their drivers, and the same seed prints the same
// table; a sample count below 10 and --json with --uncertainty are usage errors (exit code 2).
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
	for _, want := range []string{"seed 4", "pulse energy, output end", "pulse energy, both ends", "peak power, output end", "FWHM", "upper_quenching_nitrogen"} {
		if !strings.Contains(table, want) {
			t.Errorf("uncertainty section lacks %q:\n%s", want, table)
		}
	}
	if code := run(args, &out2, &errb); code != 0 || out2.String() != out1.String() {
		t.Errorf("second run with the same seed: exit %d, output differs: %v", code, out2.String() != out1.String())
	}
	for _, bad := range [][]string{
		{"run", "../../data/designs/example.toml", "--uncertainty", "5"},
		{"run", "../../data/designs/example.toml", "--uncertainty", "20", "--json"},
	} {
		var o, e bytes.Buffer
		if code := run(bad, &o, &e); code != 2 || !strings.Contains(e.String(), "--uncertainty") {
			t.Errorf("%v: exit %d, message %q; want 2 naming --uncertainty", bad, code, e.String())
		}
	}
}
