package main

import (
	"bytes"
	"encoding/json"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"n2pulse/kinetics"
	"n2pulse/kinetics/study"
)

// v2CasePath is the 8.8 cm v2 experiment case, whose FWHM this model flags as ill-conditioned
// at 18 kV (a round-trip spike tops out at half the peak; validation
// TestExperimentIllConditionedWidth) and at 14 kV, but not at 16 kV.
var v2CasePath = filepath.Join("..", "..", "validation", "testdata", "experiments", "tea-transfer-88mm-v2.toml")

// TestRunIllConditionedWidth: an ill-conditioned FWHM says so in the text summary (an
// FWHM ILL-CONDITIONED line with the widths at 45 % and 55 %), the verdict and --json
// (fwhm_ill_conditioned, fwhm_45_s > fwhm_55_s, a leap fwhm_jump_s above a tenth of the
// FWHM); a well-conditioned one (the example design) prints its two widths and no flag.
func TestRunIllConditionedWidth(t *testing.T) {
	t.Parallel()
	var out, errb bytes.Buffer
	if code := run([]string{"run", v2CasePath}, &out, &errb); code != 0 {
		t.Fatalf("run: exit %d: %s", code, errb.String())
	}
	for _, want := range []string{"FWHM ILL-CONDITIONED         972 ps at 45 % of the peak, 650 ps at 55 %; an edge leaps by 232 ps", "the FWHM of 666 ps is ill-conditioned"} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("summary lacks %q:\n%s", want, out.String())
		}
	}
	out.Reset()
	if code := run([]string{"run", v2CasePath, "--json"}, &out, &errb); code != 0 {
		t.Fatalf("run --json: exit %d: %s", code, errb.String())
	}
	var j struct {
		Ill     *bool   `json:"fwhm_ill_conditioned"`
		W45     float64 `json:"fwhm_45_s"`
		W55     float64 `json:"fwhm_55_s"`
		Jump    float64 `json:"fwhm_jump_s"`
		FWHM    float64 `json:"fwhm_s"`
		Verdict string  `json:"verdict"`
	}
	if err := json.Unmarshal(out.Bytes(), &j); err != nil {
		t.Fatal(err)
	}
	if j.Ill == nil || !*j.Ill || !(j.W45 > j.W55 && j.W55 > 0) || !(j.Jump > 0.1*j.FWHM) || !strings.Contains(j.Verdict, "is ill-conditioned") {
		t.Errorf("--json: %+v; want fwhm_ill_conditioned true, fwhm_45_s > fwhm_55_s > 0, a leap above a tenth of the FWHM, the verdict's clause", j)
	}
	out.Reset()
	if code := run([]string{"run", filepath.Join("..", "..", "data", "designs", "example.toml")}, &out, &errb); code != 0 {
		t.Fatalf("run example: exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "width at 45 % / 55 % of peak 1.39 ns / 1.34 ns (well-conditioned FWHM)") || strings.Contains(out.String(), "ill-conditioned:") ||
		strings.Contains(out.String(), "ILL-CONDITIONED") {
		t.Errorf("well-conditioned summary:\n%s", out.String())
	}
}

// TestSweepIllConditionedWidth: sweep rows carry the flag in their fwhm_ill_conditioned column
// and verdict (14 and 18 kV flagged, 16 kV not); the count line counts them and the shortest
// FWHM's optimum (14 kV, an ill-conditioned one) is marked.
func TestSweepIllConditionedWidth(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	var out, errb bytes.Buffer
	args := []string{"sweep", v2CasePath, "--vary", "circuit.charge_voltage=14kV:18kV:3", "--workers", "1", "--out", dir}
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("sweep: exit %d: %s", code, errb.String())
	}
	tab := readTable(t, mustRead(t, filepath.Join(dir, study.ResultsFile)))
	ic, vc := tab.Column("fwhm_ill_conditioned"), tab.Column("verdict")
	if ic < 0 || vc < 0 || tab.Column("fwhm_45_s") < 0 || tab.Column("fwhm_55_s") < 0 || tab.Column("fwhm_jump_s") < 0 || len(tab.Rows) != 3 {
		t.Fatalf("columns %v, %d rows: want fwhm_ill_conditioned, fwhm_45_s, fwhm_55_s, fwhm_jump_s and verdict, 3 rows", tab.Columns, len(tab.Rows))
	}
	for r, want := range []bool{true, false, true} {
		flagged := tab.Rows[r][ic] == "true"
		if flagged != want || strings.Contains(tab.Rows[r][vc], "is ill-conditioned") != want {
			t.Errorf("row %d: fwhm_ill_conditioned %q, verdict %q; want flagged %v in both", r, tab.Rows[r][ic], tab.Rows[r][vc], want)
		}
	}
	all := out.String() + errb.String()
	for _, want := range []string{"2 with an ill-conditioned FWHM", "edge, ill-conditioned", "ill-conditioned: the shortest FWHM"} {
		if !strings.Contains(all, want) {
			t.Errorf("sweep output lacks %q:\n%s", want, all)
		}
	}
}

// TestLengthTableIllConditionedWidth: the printed length table marks an ill-conditioned FWHM
// in its cell and counts such cells under the table; a well-conditioned one is unmarked.
// Made-up points.
func TestLengthTableIllConditionedWidth(t *testing.T) {
	t.Parallel()
	r := &study.LengthResult{Curves: []study.LengthCurve{{Velocity: math.Inf(1), Useful: math.NaN(), Rule: "made up", Points: []study.LengthPoint{
		{Length: 0.1, Summary: kinetics.Summary{Pulses: 1, EnergyFront: 1e-4, FWHM: 1.5e-9, FWHMIllConditioned: true}},
		{Length: 0.2, Summary: kinetics.Summary{Pulses: 1, EnergyFront: 2e-4, FWHM: 2.5e-9}},
	}}}}
	var out bytes.Buffer
	printLength(&out, r)
	s := out.String()
	if !strings.Contains(s, "1.5 (ill-conditioned)") || strings.Contains(s, "2.5 (ill-conditioned)") ||
		!strings.Contains(s, "(ill-conditioned) on 1 FWHM cells") {
		t.Errorf("length table:\n%s", s)
	}
}
