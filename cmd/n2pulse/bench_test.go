package main

import (
	"bytes"
	"encoding/json"
	"n2pulse/data"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// benchBoard is an invented design described as built.
var benchBoard = string(data.BoardDesign())

func TestBenchCommand(t *testing.T) {
	t.Parallel()
	path := filepath.Join(t.TempDir(), "board.toml")
	if err := os.WriteFile(path, []byte(benchBoard), 0o644); err != nil {
		t.Fatal(err)
	}
	var out, errb bytes.Buffer
	if code := run([]string{"bench", path}, &out, &errb); code != 0 {
		t.Fatalf("bench: exit %d, stderr %q", code, errb.String())
	}
	for _, want := range []string{"derived: 150 mm × 250 mm plates", "dielectric field", "margin", "channel static breakdown", "effective C(0) lifetime"} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("bench output lacks %q:\n%s", want, out.String())
		}
	}
	out.Reset()
	if code := run([]string{"bench", path, "--json", "--set", "circuit.charge_voltage=40 kV"}, &out, &errb); code != 0 {
		t.Fatalf("bench --json: exit %d, stderr %q", code, errb.String())
	}
	var j struct {
		Derived []string `json:"derived"`
		Bench   struct {
			Field    float64  `json:"dielectric_field_V_m"`
			Warnings []string `json:"warnings"`
		} `json:"bench"`
	}
	if err := json.Unmarshal(out.Bytes(), &j); err != nil {
		t.Fatal(err)
	}
	// 40 kV across 1.6 mm is 25 MV/m, above the 20 MV/m of the FR-4 preset.
	if j.Bench.Field != 40e3/1.6e-3 || len(j.Derived) != 4 || !strings.Contains(strings.Join(j.Bench.Warnings, "\n"), "over-stressed") {
		t.Errorf("json: field %g, derived %v, warnings %q", j.Bench.Field, j.Derived, j.Bench.Warnings)
	}
	errb.Reset()
	if code := run([]string{"bench", path, path}, &out, &errb); code != 2 {
		t.Errorf("two designs: exit %d, want 2", code)
	}
	bad := filepath.Join(t.TempDir(), "bad.toml")
	os.WriteFile(bad, []byte(strings.Replace(benchBoard, "rail_height", "rail_hieght", 1)), 0o644)
	errb.Reset()
	if code := run([]string{"bench", bad}, &out, &errb); code != 1 || !strings.Contains(errb.String(), "build.rail_hieght") {
		t.Errorf("bad key: exit %d, stderr %q", code, errb.String())
	}
}
