package main

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"n2pulse/kinetics/study"
	"n2pulse/validation"
)

// TestCheckBandsWidthFlags: check --uncertainty's rows count, per case, the samples with
// separate pulses and with an ill-conditioned FWHM (text column and a closing line; --json
// separate_pulses and fwhm_ill_conditioned per case). Made-up rows: one clean case, one with
// 3 ill-conditioned samples, one with 2 separate pulses and 1 ill-conditioned sample.
func TestCheckBandsWidthFlags(t *testing.T) {
	t.Parallel()
	band := study.Band{P05: 1e-3, P50: 1.2e-3, P95: 1.5e-3}
	rows := []validation.BandRow{
		{Case: "clean", End: "front", Measured: 1.1e-3, Nominal: 1.2e-3, Band: band, Samples: 10},
		{Case: "spiky", End: "front", Measured: 1.1e-3, Nominal: 1.2e-3, Band: band, Samples: 10, IllConditionedFWHM: 3},
		{Case: "double", End: "total", Measured: 2e-3, Nominal: 1.2e-3, Band: band, Samples: 10, SeparatePulses: 2, IllConditionedFWHM: 1},
	}
	var out bytes.Buffer
	printExperimentBands(&out, rows, 10, 1)
	lines := strings.Split(out.String(), "\n")
	for _, c := range []struct{ name, want string }{{"clean", "none"}, {"spiky", "3 ill-conditioned FWHM"}, {"double", "2 separate pulses, 1 ill-conditioned FWHM"}} {
		found := false
		for _, l := range lines {
			if strings.HasPrefix(l, c.name+" ") && strings.HasSuffix(strings.TrimRight(l, " "), c.want) {
				found = true
			}
		}
		if !found {
			t.Errorf("no row of %s ending in %q:\n%s", c.name, c.want, out.String())
		}
	}
	if !strings.Contains(out.String(), "2 of 3 cases have samples with separate pulses or an ill-conditioned FWHM") {
		t.Errorf("no closing count line:\n%s", out.String())
	}
	b, err := json.Marshal(checkJSON(nil, 0, 0, rows, 10, 1, nil, false))
	if err != nil {
		t.Fatal(err)
	}
	var j struct {
		Bands struct {
			Cases []struct {
				Case     string `json:"case"`
				Separate *int   `json:"separate_pulses"`
				Ill      *int   `json:"fwhm_ill_conditioned"`
			} `json:"cases"`
		} `json:"uncertainty_bands"`
	}
	if err := json.Unmarshal(b, &j); err != nil {
		t.Fatal(err)
	}
	want := [][2]int{{0, 0}, {0, 3}, {2, 1}}
	if len(j.Bands.Cases) != 3 {
		t.Fatalf("json: %d cases, want 3: %s", len(j.Bands.Cases), b)
	}
	for i, c := range j.Bands.Cases {
		if c.Separate == nil || c.Ill == nil || *c.Separate != want[i][0] || *c.Ill != want[i][1] {
			t.Errorf("json case %s: separate_pulses %v, fwhm_ill_conditioned %v; want %d, %d", c.Case, c.Separate, c.Ill, want[i][0], want[i][1])
		}
	}
	// No case with either: no closing line.
	out.Reset()
	printExperimentBands(&out, rows[:1], 10, 1)
	if strings.Contains(out.String(), "cases have samples with") {
		t.Errorf("clean rows print the closing line:\n%s", out.String())
	}
}
