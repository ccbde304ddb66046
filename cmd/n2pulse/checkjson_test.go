package main

import (
	"bytes"
	"encoding/json"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestCheckApparatus: `check --apparatus --json` carries the apparatus block, labelled as
// apparatus and not model uncertainty, with the measured energies of the cases' sources (the
// builders' reports cited in validation/testdata/experiments/*.measured.toml: 11, 23, 34 and
// 89 µJ; the mirrorless 11 mm laser did not lase) and a range over the alternatives; the text output carries the same table; without
// --apparatus neither output has it, and the check counts do not change; `check --uncertainty 10
// --json` carries one ordered band per case with a measured energy.
func TestCheckApparatus(t *testing.T) {
	var o, e bytes.Buffer
	if code := run([]string{"check", "--apparatus", "--json"}, &o, &e); code != 0 {
		t.Fatalf("check --apparatus --json: exit %d: %s", code, e.String())
	}
	var doc struct {
		Count, Passed, Failed, Discrepancies int
		Checks                               []map[string]any
		Apparatus                            *struct {
			Note  string
			Cases []struct {
				Case         string
				MeasuredJ    *float64 `json:"measured_J"`
				LowJ         *float64 `json:"energy_low_J"`
				HighJ        *float64 `json:"energy_high_J"`
				MeasuredLies string   `json:"measured_lies"`
				Lases        *bool    `json:"measured_lases"`
				Lasing       int      `json:"alternatives_lasing"`
				Alternatives []map[string]any
				Derived      []struct {
					ID           string
					MeasuredLow  *float64 `json:"measured_low"`
					MeasuredHigh *float64 `json:"measured_high"`
					Nominal      *float64
					Low, High    *float64
					MeasuredLies string `json:"measured_lies"`
					Passing      int    `json:"alternatives_passing"`
					Ran          int    `json:"alternatives_ran"`
					Alternatives []struct {
						Alternative string
						Computed    *float64
					}
				} `json:"derived_checks"`
			}
		} `json:"apparatus_alternatives"`
	}
	if err := json.Unmarshal(o.Bytes(), &doc); err != nil {
		t.Fatalf("%v\n%s", err, o.String())
	}
	if doc.Apparatus == nil || !strings.Contains(doc.Apparatus.Note, "not model uncertainty") {
		t.Fatalf("no labelled apparatus block: %+v", doc.Apparatus)
	}
	want := map[string]float64{"tea-blumlein-11mm-air": 11e-6, "tea-blumlein-11mm-n2": 23e-6, "tea-transfer-88mm-v1": 34e-6, "tea-transfer-88mm-v2": 89e-6}
	if len(doc.Apparatus.Cases) != len(want)+1 {
		t.Errorf("%d cases, want %d", len(doc.Apparatus.Cases), len(want)+1)
	}
	ratio := false
	for _, c := range doc.Apparatus.Cases {
		for _, a := range c.Alternatives {
			if _, ok := a["fwhm_ill_conditioned"].(bool); !ok {
				t.Errorf("%s/%v: no fwhm_ill_conditioned", c.Case, a["name"])
			}
		}
		for _, d := range c.Derived {
			if d.ID != "exp.tea-transfer-88mm-v1.oxygen.ratio" {
				continue
			}
			// The source's air/N₂ ratio, 0.20–0.25 (same page, section 'Version 1 - Performance').
			ratio = true
			lo, hi := math.Inf(1), math.Inf(-1)
			for _, a := range d.Alternatives {
				if a.Computed == nil {
					t.Errorf("%s/%s: no value", d.ID, a.Alternative)
					continue
				}
				lo, hi = math.Min(lo, *a.Computed), math.Max(hi, *a.Computed)
			}
			if d.MeasuredLow == nil || d.MeasuredHigh == nil || *d.MeasuredLow != 0.20 || *d.MeasuredHigh != 0.25 || d.Nominal == nil ||
				d.Low == nil || d.High == nil || *d.Low != lo || *d.High != hi || len(d.Alternatives) != 10 || d.Ran != 10 || d.MeasuredLies == "" {
				t.Errorf("%s: %+v", d.ID, d)
			}
		}
	}
	if !ratio {
		t.Error("the apparatus block lacks the 8.8 cm v1 air/N₂ ratio")
	}
	for _, c := range doc.Apparatus.Cases {
		if c.Case == "tea-blumlein-11mm-n2-mirrorless" {
			// The source says only that it did not lase (same video description).
			if c.MeasuredJ != nil || c.Lases == nil || *c.Lases || c.Lasing < 0 || c.Lasing > len(c.Alternatives) {
				t.Errorf("%s: measured %v J, lases %v, %d of %d alternatives lase", c.Case, c.MeasuredJ, c.Lases, c.Lasing, len(c.Alternatives))
			}
			continue
		}
		m, ok := want[c.Case]
		if !ok || c.MeasuredJ == nil || !scalar.EqualWithinAbsOrRel(*c.MeasuredJ, m, 0, 1e-12) {
			t.Errorf("%s: measured %v, want %g J", c.Case, c.MeasuredJ, m)
			continue
		}
		if c.LowJ == nil || c.HighJ == nil || !(*c.LowJ > 0 && *c.LowJ <= *c.HighJ) || len(c.Alternatives) < 8 || c.MeasuredLies == "" {
			t.Errorf("%s: range %v…%v over %d alternatives, measured lies %q", c.Case, c.LowJ, c.HighJ, len(c.Alternatives), c.MeasuredLies)
		}
	}
	if doc.Count != len(doc.Checks) || doc.Passed+doc.Failed+doc.Discrepancies != doc.Count || doc.Failed != 0 {
		t.Errorf("counts %d = %d + %d + %d over %d checks", doc.Count, doc.Passed, doc.Failed, doc.Discrepancies, len(doc.Checks))
	}
	o.Reset()
	if code := run([]string{"check", "--json"}, &o, &e); code != 0 || strings.Contains(o.String(), "apparatus_alternatives") {
		t.Errorf("check --json: exit %d; apparatus block present without --apparatus", code)
	}
	var plain struct{ Count, Discrepancies int }
	if err := json.Unmarshal(o.Bytes(), &plain); err != nil || plain.Count != doc.Count || plain.Discrepancies != doc.Discrepancies {
		t.Errorf("check --json: %d checks, %d discrepancies (%v); with --apparatus %d, %d", plain.Count, plain.Discrepancies, err, doc.Count, doc.Discrepancies)
	}
	// --uncertainty in JSON: one row per case with a measured energy, an ordered band.
	o.Reset()
	if code := run([]string{"check", "--uncertainty", "10", "--json"}, &o, &e); code != 0 {
		t.Fatalf("check --uncertainty 10 --json: exit %d: %s", code, e.String())
	}
	var unc struct {
		Bands *struct {
			Samples int
			Cases   []struct {
				Case         string
				MeasuredJ    float64  `json:"measured_J"`
				P05          *float64 `json:"p05_J"`
				P50          *float64 `json:"p50_J"`
				P95          *float64 `json:"p95_J"`
				MeasuredLies string   `json:"measured_lies"`
			}
		} `json:"uncertainty_bands"`
	}
	if err := json.Unmarshal(o.Bytes(), &unc); err != nil || unc.Bands == nil || unc.Bands.Samples != 10 || len(unc.Bands.Cases) != len(want) {
		t.Fatalf("check --uncertainty 10 --json: %v, %+v", err, unc.Bands)
	}
	for _, c := range unc.Bands.Cases {
		if m, ok := want[c.Case]; !ok || c.MeasuredJ != m || c.P05 == nil || c.P50 == nil || c.P95 == nil ||
			!(*c.P05 <= *c.P50 && *c.P50 <= *c.P95) || c.MeasuredLies == "" {
			t.Errorf("uncertainty row %+v", c)
		}
	}
	o.Reset()
	if code := run([]string{"check", "--apparatus"}, &o, &e); code != 0 || !strings.Contains(o.String(), "APPARATUS ALTERNATIVES") ||
		!strings.Contains(o.String(), "switch-holding-pressure") || !strings.Contains(o.String(), "corner-slow") ||
		!strings.Contains(o.String(), "checks derived from the measured variations") || !strings.Contains(o.String(), "exp.tea-transfer-88mm-v1.oxygen.ratio") {
		t.Errorf("check --apparatus: exit %d, text lacks the apparatus tables", code)
	}
}
