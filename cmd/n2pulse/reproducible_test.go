package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"testing"

	"n2pulse/kinetics/study"
)

// TestHeliumSweepReproducible: a sweep of a 50 % He mixture (a table solved at start-up, not
// shipped) writes the same results.csv byte for byte from a cold cache on one worker, from the
// warm cache on one worker and from a cold cache on two workers (issue 11 item 2: the three gave
// three different files when the fresh table was used at full precision and the cached one at 8
// digits). Separate processes, so that nothing is shared in memory; the cache is
// $XDG_CACHE_HOME/n2pulse.
func TestHeliumSweepReproducible(t *testing.T) {
	t.Parallel()
	if testing.Short() {
		t.Skip("builds the command and runs 12 model points")
	}
	bin := buildBinary(t)
	sweep := func(cache, workers string) []byte {
		out := filepath.Join(t.TempDir(), "sweep")
		cmd := exec.Command(bin, "sweep", "--vary", "gas.pressure=100Torr:300Torr:2", "--vary", "circuit.charge_voltage=12kV:14kV:2",
			"--set", "gas.helium=0.5", "--set", "gas.nitrogen=0.5", "--set", "numerics.cells=40", "--quiet",
			"--workers", workers, "--out", out)
		cmd.Env = append(os.Environ(), "XDG_CACHE_HOME="+cache)
		if b, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("sweep (cache %s, %s workers): %v\n%s", cache, workers, err, b)
		}
		b, err := os.ReadFile(filepath.Join(out, study.ResultsFile))
		if err != nil || len(b) == 0 {
			t.Fatalf("no results: %v", err)
		}
		return b
	}
	c1 := t.TempDir()
	cold := sweep(c1, "1")
	// the He table is cached (the report may cache other mixtures too)
	found := false
	files, _ := filepath.Glob(filepath.Join(c1, "n2pulse", "swarm-*.csv"))
	for _, f := range files {
		b, _ := os.ReadFile(f)
		found = found || bytes.Contains(b, []byte("N2=0.500000 O2=0.000000 He=0.500000"))
	}
	if !found {
		t.Fatalf("no cached table of the He mixture among %v", files)
	}
	warm := sweep(c1, "1")
	cold2 := sweep(t.TempDir(), "2")
	if !bytes.Equal(cold, warm) {
		t.Error("warm-cache sweep differs from the cold-cache sweep")
	}
	if !bytes.Equal(cold, cold2) {
		t.Error("cold-cache sweep on 2 workers differs from the one on 1 worker")
	}
}
