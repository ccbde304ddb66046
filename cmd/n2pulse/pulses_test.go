package main

import (
	"bytes"
	"encoding/json"
	"path/filepath"
	"strings"
	"testing"

	"n2pulse/kinetics/study"
)

// tubeDesignPath is the reduced-pressure tube design, which lases twice at 20 Torr in this
// model (kinetics.TestTubeTwoPulses) and once at its own 50 Torr.
var tubeDesignPath = filepath.Join("..", "..", "data", "designs", "tube.toml")

// TestRunSeparatePulses: a run whose output is two separate pulses says so in its text summary
// (a SEPARATE PULSES line and the verdict), in --json (pulses 2, the separation and the
// strongest pulse's width as keys) and the one-pulse run says "separate pulses 1".
func TestRunSeparatePulses(t *testing.T) {
	t.Parallel()
	var out, errb bytes.Buffer
	if code := run([]string{"run", tubeDesignPath, "--set", "gas.pressure=20 Torr"}, &out, &errb); code != 0 {
		t.Fatalf("run: exit %d: %s", code, errb.String())
	}
	for _, want := range []string{"SEPARATE PULSES              2, the first two", "the output is 2 separate pulses", "energy inside the FWHM"} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("summary lacks %q:\n%s", want, out.String())
		}
	}
	out.Reset()
	if code := run([]string{"run", tubeDesignPath, "--set", "gas.pressure=20 Torr", "--json"}, &out, &errb); code != 0 {
		t.Fatalf("run --json: exit %d: %s", code, errb.String())
	}
	var j struct {
		Pulses     int     `json:"pulses"`
		Separation float64 `json:"pulse_separation_s"`
		Strongest  float64 `json:"strongest_pulse_fwhm_s"`
		FWHM       float64 `json:"fwhm_s"`
		Share      float64 `json:"half_max_energy_share"`
		Verdict    string  `json:"verdict"`
	}
	if err := json.Unmarshal(out.Bytes(), &j); err != nil {
		t.Fatal(err)
	}
	if j.Pulses != 2 || !(j.Separation > 0) || !(j.Strongest > 0 && j.Strongest < j.FWHM) || !(j.Share > 0 && j.Share <= 1) ||
		!strings.Contains(j.Verdict, "separate pulses") {
		t.Errorf("--json: %+v; want 2 pulses, a separation, the strongest narrower than the FWHM, a share in (0, 1] and the verdict's clause", j)
	}
	out.Reset()
	if code := run([]string{"run", tubeDesignPath}, &out, &errb); code != 0 {
		t.Fatalf("run at 50 Torr: exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "separate pulses              1\n") || strings.Contains(out.String(), "SEPARATE") {
		t.Errorf("one-pulse summary:\n%s", out.String())
	}
}

// TestSweepSeparatePulses: a sweep row of two pulses carries them in its pulses column and its
// verdict, the one-pulse row says 1, and the sweep's count line names the row.
func TestSweepSeparatePulses(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	var out, errb bytes.Buffer
	args := []string{"sweep", tubeDesignPath, "--vary", "gas.pressure=20Torr:50Torr:2", "--workers", "1", "--out", dir}
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("sweep: exit %d: %s", code, errb.String())
	}
	tab := readTable(t, mustRead(t, filepath.Join(dir, study.ResultsFile)))
	pc, vc, sc := tab.Column("pulses"), tab.Column("verdict"), tab.Column("pulse_separation_s")
	if pc < 0 || vc < 0 || sc < 0 || len(tab.Rows) != 2 {
		t.Fatalf("columns %v, %d rows: want pulses, pulse_separation_s and verdict, 2 rows", tab.Columns, len(tab.Rows))
	}
	if tab.Rows[0][pc] != "2" || !strings.Contains(tab.Rows[0][vc], "2 separate pulses") || !(tab.Float(0, sc) > 0) {
		t.Errorf("20 Torr row: pulses %q, separation %q, verdict %q", tab.Rows[0][pc], tab.Rows[0][sc], tab.Rows[0][vc])
	}
	if tab.Rows[1][pc] != "1" || strings.Contains(tab.Rows[1][vc], "separate pulses") || tab.Rows[1][sc] != "" {
		t.Errorf("50 Torr row: pulses %q, separation %q, verdict %q", tab.Rows[1][pc], tab.Rows[1][sc], tab.Rows[1][vc])
	}
	if !strings.Contains(out.String()+errb.String(), "1 with separate pulses") {
		t.Errorf("sweep output does not count the two-pulse row:\n%s%s", out.String(), errb.String())
	}
}
