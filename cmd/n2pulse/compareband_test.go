package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestCompareUncertainty compares the example and the board design (20 cells) with 10 samples:
// every design gets its band of each figure and an "uncertainty" block; the ratio band of the
// first design to itself is exactly 1; the paired ratio band of the second is ordered and its
// median lies between the ratio of the two medians ± 25 % (tolerance: this test's choice; the
// pairing narrows the band, it does not move the centre far); compare.csv carries the same
// numbers in its <name>_p05/_p50/_p95 and ratio columns, finite; report.html has the section
// on the bands.
func TestCompareUncertainty(t *testing.T) {
	t.Parallel()
	if testing.Short() {
		t.Skip("runs the model 22 times")
	}
	dir := t.TempDir()
	args := []string{"compare", "../../data/designs/example.toml", "../../data/designs/board.toml", "--set", "numerics.cells=20",
		"--uncertainty", "10", "--seed", "3", "--json", "--out", dir}
	var out, errb bytes.Buffer
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	type band struct{ P05, P50, P95 float64 }
	var c struct {
		Samples int `json:"uncertainty_samples"`
		Designs []struct {
			Name string         `json:"name"`
			U    map[string]any `json:"uncertainty"`
		} `json:"designs"`
		Metrics []struct {
			Metric     string  `json:"metric"`
			Bands      []*band `json:"bands"`
			RatioBands []*band `json:"ratio_to_first_bands"`
		} `json:"metrics"`
	}
	if err := json.Unmarshal(out.Bytes(), &c); err != nil {
		t.Fatalf("%v\n%s", err, out.String())
	}
	if c.Samples != 10 || len(c.Designs) != 2 || c.Designs[1].U["energy_front_J_p50"] == nil {
		t.Fatalf("samples %d, %d designs, second design's block %v", c.Samples, len(c.Designs), c.Designs[1].U)
	}
	if html := string(mustRead(t, filepath.Join(dir, "report.html"))); !strings.Contains(html, "Uncertainty bands") || !strings.Contains(html, "same 10 samples") {
		t.Error("report.html lacks the section on the bands")
	}
	tab := readTable(t, mustRead(t, filepath.Join(dir, "compare.csv")))
	for _, m := range c.Metrics {
		if m.Metric != "energy_front_J" {
			continue
		}
		a, b, r0, r := m.Bands[0], m.Bands[1], m.RatioBands[0], m.RatioBands[1]
		if *r0 != (band{1, 1, 1}) {
			t.Errorf("ratio band of the first design to itself %+v, want 1, 1, 1", *r0)
		}
		if !(r.P05 <= r.P50 && r.P50 <= r.P95) || !scalar.EqualWithinAbsOrRel(r.P50, b.P50/a.P50, 0, 0.25) {
			t.Errorf("ratio band %+v, want ordered with median near %g", *r, b.P50/a.P50)
		}
		row := -1
		for k := range tab.Rows {
			if tab.Rows[k][0] == "energy_front_J" {
				row = k
			}
		}
		if row < 0 {
			t.Fatal("compare.csv has no energy_front_J row")
		}
		for _, chk := range []struct {
			col  string
			want float64
		}{
			{c.Designs[0].Name + "_p05", a.P05}, {c.Designs[1].Name + "_p95", b.P95},
			{"ratio " + c.Designs[1].Name + "/" + c.Designs[0].Name + "_p50", r.P50},
		} {
			col := tab.Column(chk.col)
			if col < 0 {
				t.Errorf("compare.csv has no column %q", chk.col)
				continue
			}
			if v := tab.Float(row, col); math.IsNaN(v) || v != chk.want {
				t.Errorf("compare.csv %s = %v, want %v as in --json", chk.col, v, chk.want)
			}
		}
	}
}

func mustRead(t *testing.T, path string) []byte {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return b
}
