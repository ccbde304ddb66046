package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"n2pulse/data"
	"n2pulse/internal/usermsg"
)

// TestExitCodeRule checks the one rule of every command (README, "Exit codes"): 2 for a
// mistake in how the command was written, including values given on the command line that
// are unknown, out of range or without a unit (through --set as through --vary); 1 for
// everything else; and that no message carries a package prefix ("study:", "units:").
// Not parallel: the standard-input cases replace stdin.
func TestExitCodeRule(t *testing.T) {
	dir := t.TempDir()
	good := filepath.Join(dir, "good.toml")
	if err := os.WriteFile(good, data.ExampleDesign(), 0o644); err != nil {
		t.Fatal(err)
	}
	bad := filepath.Join(dir, "bad.toml")
	if err := os.WriteFile(bad, []byte("[gas]\npressure = 40\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	taken := filepath.Join(dir, "taken")
	if err := os.MkdirAll(taken, 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(taken, "sweep.json"), []byte("{}"), 0o644); err != nil {
		t.Fatal(err)
	}
	small := []string{"--set", "numerics.cells=20"}
	cases := []struct {
		args  []string
		stdin string
		code  int
		want  string // a fragment of stderr
	}{
		{nil, "", 2, ""},
		{[]string{"frobnicate"}, "", 2, "unknown command"},
		{[]string{"run", "--nosuchflag"}, "", 2, "nosuchflag"},
		{[]string{"run", good, good}, "", 2, "at most one design"},
		{[]string{"run", "--set", "gas.presure=1atm"}, "", 2, "did you mean gas.pressure"},
		{[]string{"run", "--set", "gas.pressure=40"}, "", 2, `"40 Pa"`},
		{[]string{"run", "--set", "gas.pressure=1e9 atm"}, "", 2, "out of range"},
		{[]string{"run", "--set", "gas.oxygen=1"}, "", 2, "no room for nitrogen"},
		{[]string{"run", filepath.Join(dir, "missing.toml")}, "", 1, "no such file"},
		{[]string{"run", bad}, "", 1, "gas.pressure"},
		{append([]string{"run", "-"}, small...), string(data.ExampleDesign()), 0, ""},
		{[]string{"run", "-"}, strings.Repeat("#", 1<<20+1), 1, "longer than"},
		{[]string{"sweep", "--out", filepath.Join(dir, "s1")}, "", 2, "--vary"},
		{[]string{"sweep", "--vary", "gas.presure=1atm:2atm:2"}, "", 2, "did you mean gas.pressure"},
		{[]string{"sweep", "--vary", "gas.pressure=1:2:2"}, "", 2, "has no unit"},
		{[]string{"sweep", "--vary", "gas.pressure=1atm:1e9atm:2"}, "", 2, "out of range"},
		{[]string{"sweep", "--set", "gas.pressure=40", "--vary", "circuit.charge_voltage=8kV:9kV:2"}, "", 2, "has no unit"},
		{[]string{"sweep", "--vary", "gas.pressure=1atm:2atm:2", "--vary", "gas.pressure=1atm:2atm:2"}, "", 2, "varied twice"},
		{[]string{"sweep", "--out", taken, "--vary", "gas.pressure=1atm:2atm:2"}, "", 1, "sweep.json"},
		{[]string{"sweep", "--shard", "4/3", "--vary", "gas.pressure=1atm:2atm:2"}, "", 2, "4/3"},
		{[]string{"sweep", "--metric", "brightness", "--vary", "gas.pressure=1atm:2atm:2"}, "", 2, "brightness"},
		{[]string{"length", "--from", "1m", "--to", "10cm"}, "", 2, "0 < from < to"},
		{[]string{"length", "--from", "5"}, "", 2, "has no unit"},
		{[]string{"length", "--points", "1"}, "", 2, "allowed 3 to 10000"},
		{[]string{"length", "--to", "20m"}, "", 2, "out of range"},
		{[]string{"merge"}, "", 2, "name the shard directories"},
		{[]string{"merge", "--out", filepath.Join(dir, "m"), filepath.Join(dir, "nosuchshard")}, "", 1, "nosuchshard"},
		{[]string{"bench", "--set", "gas.pressure=40"}, "", 2, "has no unit"},
		{[]string{"bench", filepath.Join(dir, "missing.toml")}, "", 1, "no such file"},
		{[]string{"lines", "--pressure", "40"}, "", 2, "has no unit"},
		{[]string{"swarm", "--gas", "xenon"}, "", 2, "want n2 or air"},
		{[]string{"check", "extra"}, "", 2, "takes no arguments"},
		{[]string{"init", "a.toml", "b.toml"}, "", 2, "at most one file"},
		{[]string{"init", good}, "", 1, "exists"},
	}
	for _, c := range cases {
		stdin = strings.NewReader(c.stdin)
		var out, errb bytes.Buffer
		code := run(c.args, &out, &errb)
		msg := errb.String()
		if code != c.code || !strings.Contains(msg, c.want) {
			t.Errorf("n2pulse %q: exit %d, stderr %q; want exit %d and %q", c.args, code, msg, c.code, c.want)
		}
		for _, p := range usermsg.Prefixes {
			if strings.Contains(msg, " "+p) || strings.HasPrefix(msg, p) {
				t.Errorf("n2pulse %q: stderr carries the internal prefix %q: %q", c.args, p, msg)
			}
		}
	}
	stdin = os.Stdin
}
