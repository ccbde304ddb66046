package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"n2pulse/kinetics/swarm"
)

func TestSwarmCommand(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	out := filepath.Join(dir, "air.csv")
	png := filepath.Join(dir, "air.png")
	var so, se bytes.Buffer
	if code := run([]string{"swarm", "--gas", "air", "--out", out, "--plot", png}, &so, &se); code != 0 {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	f, err := os.Open(out)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	tb, err := swarm.ReadCSV(f, out)
	if err != nil {
		t.Fatal(err)
	}
	if n := len(tb.Rows()); n < 60 {
		t.Errorf("%d rows", n)
	}
	if st, err := os.Stat(png); err != nil || st.Size() < 1000 {
		t.Errorf("plot: %v", err)
	}
	so.Reset()
	if code := run([]string{"swarm", "--nitrogen", "0.9", "--helium", "0.1", "--cells", "60"}, &so, &se); code != 0 {
		t.Fatalf("mixture: exit %d: %s", code, se.String())
	}
	if !strings.Contains(so.String(), "mixture (mole fractions): N2 0.9, He 0.1") {
		t.Errorf("stdout header: %.300s", so.String())
	}
	// columns named by species and state, no numbered legend (issue 14 item 6)
	if !strings.Contains(so.String(), ",k_N2_C3Pi_u_m3_s,") || !strings.Contains(so.String(), ",k_He_ion_m3_s") ||
		strings.Contains(so.String(), "k_N2_15_m3_s") {
		t.Errorf("rate columns not named by state: %.2000s", so.String())
	}
	// another cross-section set: its file named in the header
	so.Reset()
	if code := run([]string{"swarm", "--cross-sections", "itikawa2006", "--cells", "60"}, &so, &se); code != 0 {
		t.Fatalf("--cross-sections itikawa2006: exit %d: %s", code, se.String())
	}
	if !strings.Contains(so.String(), "data/xsec-n2-itikawa.txt") {
		t.Errorf("header does not name the Itikawa set's file: %.600s", so.String())
	}
	for _, args := range [][]string{
		{"swarm", "--gas", "xenon"},
		{"swarm", "--nitrogen", "0.5"},
		{"swarm", "--plot", "x.jpg"},
		{"swarm", "--cells", "3"},
		{"swarm", "extra"},
		{"swarm", "--cross-sections", "mine"},
	} {
		if code := run(args, &so, &se); code != 2 {
			t.Errorf("%v: exit %d, want 2", args, code)
		}
	}
}
