package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/BurntSushi/toml"

	"n2pulse/kinetics/build"
	"n2pulse/kinetics/study"
	"n2pulse/units"
)

func writeBoard(t *testing.T) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "board.toml")
	if err := os.WriteFile(path, []byte(benchBoard), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// fr4Plate is ε₀ε_r·l·w/d of a 15 cm long plate on the 1.6 mm board (parallel-plate formula,
// Serway & Jewett, Physics for Scientists and Engineers, capacitance chapter, from memory).
func fr4Plate(t *testing.T, w float64) float64 {
	t.Helper()
	p, err := build.DielectricPreset("fr4")
	if err != nil {
		t.Fatal(err)
	}
	return units.VacuumPermittivity * p.Permittivity * 0.15 * w / 1.6e-3
}

// run --set build.… re-derives the circuit: the stored energy is ½(C₁ + C₂)V₀² (a Blumlein
// both of whose capacitors charge to V₀, analytic) with the new plate width.
func TestRunSetBuildKey(t *testing.T) {
	t.Parallel()
	path := writeBoard(t)
	var out, errb bytes.Buffer
	args := []string{"run", path, "--json", "--set", "build.switch_plate_width=12 cm", "--set", "numerics.cells=16"}
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("run: exit %d, stderr %q", code, errb.String())
	}
	var s struct {
		Stored  float64  `json:"stored_energy_J"`
		Derived []string `json:"derived"`
	}
	if err := json.Unmarshal(out.Bytes(), &s); err != nil {
		t.Fatal(err)
	}
	want := 0.5 * (fr4Plate(t, 0.12) + fr4Plate(t, 0.25)) * 12e3 * 12e3
	if math.Abs(s.Stored-want) > 1e-9*want || !slices.Contains(s.Derived, "circuit.switch_capacitance") {
		t.Errorf("stored %.9g J, want %.9g J; derived %v", s.Stored, want, s.Derived)
	}

	// An explicit value given with --set wins over the build.
	out.Reset()
	args = append(args, "--set", "circuit.switch_capacitance=1 nF")
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("run: exit %d, stderr %q", code, errb.String())
	}
	s.Derived = nil
	if err := json.Unmarshal(out.Bytes(), &s); err != nil {
		t.Fatal(err)
	}
	want = 0.5 * (1e-9 + fr4Plate(t, 0.25)) * 12e3 * 12e3
	if math.Abs(s.Stored-want) > 1e-9*want || slices.Contains(s.Derived, "circuit.switch_capacitance") {
		t.Errorf("explicit C₁: stored %.9g J, want %.9g J; derived %v", s.Stored, want, s.Derived)
	}

	// A value given through --set is a usage error (exit 2), as through --vary.
	errb.Reset()
	if code := run([]string{"run", path, "--set", "build.dielectric_thickness=1.6 kg"}, &out, &errb); code != 2 ||
		!strings.Contains(errb.String(), "build.dielectric_thickness") || !strings.Contains(errb.String(), "want a number") {
		t.Errorf("bad build value: exit %d, stderr %q", code, errb.String())
	}
}

// bench --set build.… reports the plates as changed.
func TestBenchSetBuildKey(t *testing.T) {
	t.Parallel()
	path := writeBoard(t)
	var out, errb bytes.Buffer
	if code := run([]string{"bench", path, "--json", "--set", "build.switch_plate_width=10 cm"}, &out, &errb); code != 0 {
		t.Fatalf("bench: exit %d, stderr %q", code, errb.String())
	}
	var j struct {
		Derived []string `json:"derived"`
		Bench   struct {
			C1 float64 `json:"switch_capacitance_F"`
			C2 float64 `json:"channel_capacitance_F"`
		} `json:"bench"`
	}
	if err := json.Unmarshal(out.Bytes(), &j); err != nil {
		t.Fatal(err)
	}
	if c1 := fr4Plate(t, 0.10); math.Abs(j.Bench.C1-c1) > 1e-12*c1 || len(j.Derived) != 4 {
		t.Errorf("C₁ %g, want %g; derived %v", j.Bench.C1, c1, j.Derived)
	}
	if c2 := fr4Plate(t, 0.25); math.Abs(j.Bench.C2-c2) > 1e-12*c2 {
		t.Errorf("C₂ %g, want %g", j.Bench.C2, c2)
	}
}

// sweep --vary build.… writes the plate width as an axis and the stored energy follows it.
func TestSweepVaryBuildKey(t *testing.T) {
	t.Parallel()
	path := writeBoard(t)
	dir := filepath.Join(t.TempDir(), "sw")
	var out, errb bytes.Buffer
	args := []string{"sweep", path, "--vary", "build.dielectric_thickness=1mm:2mm:2", "--set", "numerics.cells=16", "--quiet", "--out", dir, "--workers", "2"}
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("sweep: exit %d, stderr %q", code, errb.String())
	}
	csv, err := os.ReadFile(filepath.Join(dir, study.ResultsFile))
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(string(csv)), "\n")
	head := strings.Split(lines[0], ",")
	col := slices.Index(head, "stored_energy_J")
	if len(lines) != 3 || head[1] != "build.dielectric_thickness [m]" || col < 0 {
		t.Fatalf("results:\n%s", csv)
	}
	for i, d := range []float64{1e-3, 2e-3} {
		row := strings.Split(lines[i+1], ",")
		// Both plates are 15 cm × 25 cm: C = ε₀ε_r·l·w/d each, so ½·2C·V₀².
		want := fr4Plate(t, 0.25) * 1.6e-3 / d * 12e3 * 12e3
		var got float64
		if err := json.Unmarshal([]byte(row[col]), &got); err != nil || math.Abs(got-want) > 1e-9*want {
			t.Errorf("d = %g m: stored %s J, want %.9g J (%v)", d, row[col], want, err)
		}
	}
}

// init --all lists the build keys with the others, and its output is TOML (it once held +Inf).
func TestInitAllListsBuildKeys(t *testing.T) {
	t.Parallel()
	var out, errb bytes.Buffer
	if code := run([]string{"init", "--all"}, &out, &errb); code != 0 {
		t.Fatalf("init --all: exit %d, stderr %q", code, errb.String())
	}
	for _, k := range []string{"# build.switch_plate_width = 0  #", `# build.dielectric = ""  #`, "# build.secondary_emission = 0  #",
		"# circuit.switch_capacitance = 0  # required", `optics.excitation_velocity = "infinite"  #`} {
		if !strings.Contains(out.String(), "\n"+k) {
			t.Errorf("init --all lacks %q", k)
		}
	}
	var raw map[string]any
	if _, err := toml.Decode(out.String(), &raw); err != nil {
		t.Errorf("init --all is not TOML: %v", err)
	}
}
