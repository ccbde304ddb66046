package main

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"n2pulse/kinetics/study"
)

// update regenerates the golden files instead of comparing against them.
var update = flag.Bool("update", false, "rewrite testdata/golden from the current model")

// goldenSweep is the small sweep whose results.csv is kept as a golden file: 3 × 2 points of
// the example design on a coarse channel grid.
var goldenSweep = []string{"sweep", "data/designs/example.toml",
	"--vary", "gas.pressure=100Torr:760Torr:3:log",
	"--vary", "circuit.charge_voltage=10kV:16kV:2",
	"--set", "numerics.cells=60", "--workers", "1", "--quiet"}

// TestGolden pins the program's output: `run --json` of every shipped design (data/designs) and
// every experiment case (validation/testdata/experiments), and the results.csv of a small
// sweep, byte for byte against testdata/golden. It guards refactors that must not change
// behaviour (moving code between packages, replacing helpers by library calls).
//
// A change that is meant to move model results (new physics, new data, a fixed bug) will fail
// this test on purpose: regenerate the files with
//
//	go test ./cmd/n2pulse -run TestGolden -update
//
// and commit them together with the change and its before/after table.
func TestGolden(t *testing.T) {
	t.Parallel()
	root := filepath.Join("..", "..")
	var designs []string
	for _, pattern := range []string{"data/designs/*.toml", "validation/testdata/experiments/*.toml"} {
		m, err := filepath.Glob(filepath.Join(root, pattern))
		if err != nil {
			t.Fatal(err)
		}
		for _, p := range m {
			base := filepath.Base(p)
			if strings.HasSuffix(base, ".measured.toml") || base == "common.toml" {
				continue
			}
			designs = append(designs, p)
		}
	}
	if len(designs) < 7 {
		t.Fatalf("found %d designs and experiment cases, want at least 7 (2 shipped + 5 cases)", len(designs))
	}
	for _, p := range designs {
		name := filepath.Base(filepath.Dir(p)) + "-" + strings.TrimSuffix(filepath.Base(p), ".toml") + ".json"
		t.Run(name, func(t *testing.T) {
			t.Parallel()
			var out, errb bytes.Buffer
			if code := run([]string{"run", p, "--json"}, &out, &errb); code != 0 {
				t.Fatalf("run %s: exit %d\n%s", p, code, errb.String())
			}
			checkGolden(t, name, out.Bytes())
		})
	}
	t.Run("sweep-results.csv", func(t *testing.T) {
		t.Parallel()
		dir := t.TempDir()
		args := append([]string{}, goldenSweep...)
		args[1] = filepath.Join(root, args[1])
		args = append(args, "--out", dir)
		var out, errb bytes.Buffer
		if code := run(args, &out, &errb); code != 0 {
			t.Fatalf("sweep: exit %d\n%s", code, errb.String())
		}
		got, err := os.ReadFile(filepath.Join(dir, study.ResultsFile))
		if err != nil {
			t.Fatal(err)
		}
		checkGolden(t, "sweep-results.csv", got)
	})
}

// checkGolden compares got with testdata/golden/name, or rewrites that file under -update.
func checkGolden(t *testing.T, name string, got []byte) {
	t.Helper()
	path := filepath.Join("testdata", "golden", name)
	if *update {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run with -update to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("%s differs from the golden file (%d bytes, want %d); if the change is meant to move results, regenerate with -update\ngot:\n%s", name, len(got), len(want), got)
	}
}
