package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/study"
)

// TestSweepUncertainty runs the example design (20 cells) over two pressures with 10 samples per
// point, with 1 and 2 workers: results.csv is the same byte for byte; it has every numeric
// figure's _p05/_p50/_p95 columns, finite and ordered where the figure has a band; the band of
// the 100 Torr point is exactly run --uncertainty's at 100 Torr (same design, seed and
// samples); --json carries the uncertainty block with the band at each optimum and the drivers.
func TestSweepUncertainty(t *testing.T) {
	t.Parallel()
	if testing.Short() {
		t.Skip("runs the model 44 times")
	}
	dirs := []string{t.TempDir(), t.TempDir()}
	var js bytes.Buffer
	for k, w := range []string{"1", "2"} {
		args := []string{"sweep", "../../data/designs/example.toml", "--set", "numerics.cells=20", "--vary", "gas.pressure=60Torr:100Torr:2",
			"--uncertainty", "10", "--seed", "5", "--workers", w, "--out", dirs[k], "--quiet", "--json"}
		var out, errb bytes.Buffer
		if code := run(args, &out, &errb); code != 0 {
			t.Fatalf("exit %d: %s", code, errb.String())
		}
		js = out
	}
	a, err := os.ReadFile(filepath.Join(dirs[0], study.ResultsFile))
	if err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(filepath.Join(dirs[1], study.ResultsFile))
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a, b) {
		t.Error("results.csv differs between 1 and 2 workers")
	}
	tab := readTable(t, a)
	for _, m := range study.NumericMetrics() {
		cols := [3]int{}
		for k, s := range study.BandSuffixes {
			if cols[k] = tab.Column(m + s); cols[k] < 0 {
				t.Fatalf("no column %s%s", m, s)
			}
		}
		for r := range tab.Rows {
			if tab.Rows[r][cols[0]] == "" {
				continue // no band: undefined in most samples
			}
			lo, mid, hi := tab.Float(r, cols[0]), tab.Float(r, cols[1]), tab.Float(r, cols[2])
			if math.IsNaN(lo+mid+hi) || math.IsInf(lo+mid+hi, 0) || !(lo <= mid && mid <= hi) {
				t.Errorf("row %d %s: band %v %v %v; want finite and ordered", r, m, lo, mid, hi)
			}
		}
	}
	// The nominal energy lies inside its band, widened by 10 % of the band's median: the
	// defaults sit inside their ranges, not at a quantile (tolerance: this test's choice).
	for r := range tab.Rows {
		e, lo, hi := tab.Float(r, tab.Column("energy_front_J")), tab.Float(r, tab.Column("energy_front_J_p05")), tab.Float(r, tab.Column("energy_front_J_p95"))
		slack := 0.1 * tab.Float(r, tab.Column("energy_front_J_p50"))
		if !(e >= lo-slack && e <= hi+slack) {
			t.Errorf("row %d: nominal energy %g outside its band %g…%g widened by %g", r, e, lo, hi, slack)
		}
	}
	var one, errb bytes.Buffer
	if code := run([]string{"run", "../../data/designs/example.toml", "--set", "numerics.cells=20", "--set", "gas.pressure=100Torr",
		"--uncertainty", "10", "--seed", "5", "--json"}, &one, &errb); code != 0 {
		t.Fatalf("run: exit %d: %s", code, errb.String())
	}
	var got struct {
		U map[string]any `json:"uncertainty"`
	}
	if err := json.Unmarshal(one.Bytes(), &got); err != nil {
		t.Fatal(err)
	}
	for _, s := range study.BandSuffixes {
		want, _ := got.U["energy_front_J"+s].(float64)
		if v := tab.Float(1, tab.Column("energy_front_J"+s)); !scalar.EqualWithinAbsOrRel(v, want, 0, 1e-12) {
			t.Errorf("100 Torr energy_front_J%s: sweep %g, run %g; want the same", s, v, want)
		}
	}
	var rep struct {
		U struct {
			Samples int                `json:"samples"`
			Seed    uint64             `json:"seed"`
			Optima  map[string]float64 `json:"optima_band"`
			Drivers map[string][]struct {
				Key    string `json:"key"`
				Points int    `json:"points"`
			} `json:"drivers"`
		} `json:"uncertainty"`
	}
	if err := json.Unmarshal(js.Bytes(), &rep); err != nil {
		t.Fatalf("%v\n%s", err, js.String())
	}
	u := rep.U
	if u.Samples != 10 || u.Seed != 5 || u.Optima["energy_total_J_p50"] <= 0 || len(u.Drivers["energy_front_J"]) == 0 || u.Drivers["energy_front_J"][0].Points != 2 {
		t.Errorf("--json uncertainty block %+v; want 10 samples, seed 5, the band at the optima and drivers over 2 points", u)
	}
}

// readTable parses a results table written by WriteCSV.
func readTable(t *testing.T, b []byte) *study.Table {
	t.Helper()
	rows, err := csv.NewReader(bytes.NewReader(b)).ReadAll()
	if err != nil || len(rows) == 0 {
		t.Fatalf("results table: %v", err)
	}
	return &study.Table{Columns: rows[0], Rows: rows[1:]}
}
