package main

import (
	"bytes"
	"encoding/json"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

// TestRunUncertainty runs `run --uncertainty 10` on the example design with few cells: the band
// table lists the four headline figures with their drivers, and the same seed prints the same
// table; with --json the block "uncertainty" carries the bands as <figure>_p05/_p50/_p95 in
// order and the drivers; a sample count below 10 is a usage error (exit code 2).
func TestRunUncertainty(t *testing.T) {
	t.Parallel()
	args := []string{"run", "../../data/designs/example.toml", "--set", "numerics.cells=20", "--uncertainty", "10", "--seed", "4"}
	var out1, out2, errb bytes.Buffer
	if code := run(args, &out1, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	_, table, ok := strings.Cut(out1.String(), "\nuncertainty: 10 samples")
	if !ok {
		t.Fatalf("no uncertainty section in:\n%s", out1.String())
	}
	for _, want := range []string{"seed 4", "pulse energy, output end", "pulse energy, both ends", "peak power, output end", "FWHM", "manifold_share", "samples reach the lasing threshold"} {
		if !strings.Contains(table, want) {
			t.Errorf("uncertainty section lacks %q:\n%s", want, table)
		}
	}
	if code := run(args, &out2, &errb); code != 0 || out2.String() != out1.String() {
		t.Errorf("second run with the same seed: exit %d, output differs: %v", code, out2.String() != out1.String())
	}
	var js, e bytes.Buffer
	if code := run(append(args, "--json"), &js, &e); code != 0 {
		t.Fatalf("--json: exit %d: %s", code, e.String())
	}
	var got struct {
		Energy      float64 `json:"energy_total_J"`
		Uncertainty struct {
			Samples int                          `json:"samples"`
			P05     float64                      `json:"energy_total_J_p05"`
			P50     float64                      `json:"energy_total_J_p50"`
			P95     float64                      `json:"energy_total_J_p95"`
			Drivers map[string][]json.RawMessage `json:"drivers"`
		} `json:"uncertainty"`
	}
	if err := json.Unmarshal(js.Bytes(), &got); err != nil {
		t.Fatal(err)
	}
	u := got.Uncertainty
	if u.Samples != 10 || !(u.P05 > 0 && u.P05 <= u.P50 && u.P50 <= u.P95) || len(u.Drivers["energy_total_J"]) == 0 {
		t.Errorf("--json uncertainty block %+v; want 10 samples, 0 < p05 ≤ p50 ≤ p95 and drivers", u)
	}
	for _, bad := range [][]string{
		{"run", "../../data/designs/example.toml", "--uncertainty", "5"},
		{"run", "../../data/designs/example.toml", "--uncertainty", "100001"},
	} {
		var o, e bytes.Buffer
		if code := run(bad, &o, &e); code != 2 || !strings.Contains(e.String(), "--uncertainty") {
			t.Errorf("%v: exit %d, message %q; want 2 naming --uncertainty", bad, code, e.String())
		}
	}
}

// TestRunUncertaintyOut runs `run --uncertainty 10 --out DIR` on the example design (20 cells):
// summary.json carries the uncertainty block, the same numbers as run --json prints; the pulse
// report shades the band of the output power over the 10 samples; report.html has the band
// section. Without --uncertainty summary.json has no such block.
func TestRunUncertaintyOut(t *testing.T) {
	t.Parallel()
	if testing.Short() {
		t.Skip("runs the model 22 times")
	}
	dir, plain := t.TempDir(), t.TempDir()
	base := []string{"run", "../../data/designs/example.toml", "--set", "numerics.cells=20"}
	var out, errb bytes.Buffer
	if code := run(append(append([]string{}, base...), "--uncertainty", "10", "--seed", "6", "--out", dir), &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var js bytes.Buffer
	if code := run(append(append([]string{}, base...), "--uncertainty", "10", "--seed", "6", "--json"), &js, &errb); code != 0 {
		t.Fatalf("--json: exit %d: %s", code, errb.String())
	}
	if code := run(append(append([]string{}, base...), "--out", plain), &out, &errb); code != 0 {
		t.Fatalf("plain: exit %d: %s", code, errb.String())
	}
	type block struct {
		U map[string]any `json:"uncertainty"`
	}
	var file, printed, none block
	for _, c := range []struct {
		b   []byte
		dst *block
	}{{mustRead(t, filepath.Join(dir, "summary.json")), &file}, {js.Bytes(), &printed}, {mustRead(t, filepath.Join(plain, "summary.json")), &none}} {
		if err := json.Unmarshal(c.b, c.dst); err != nil {
			t.Fatal(err)
		}
	}
	if none.U != nil {
		t.Errorf("summary.json without --uncertainty has an uncertainty block: %v", none.U)
	}
	for _, k := range []string{"energy_front_J_p05", "energy_front_J_p50", "energy_front_J_p95", "samples", "may_not_lase"} {
		if file.U[k] == nil || file.U[k] != printed.U[k] {
			t.Errorf("summary.json %s = %v, run --json %v; want present and equal", k, file.U[k], printed.U[k])
		}
	}
	if svg := string(mustRead(t, filepath.Join(dir, "pulse-report.svg"))); !strings.Contains(svg, "5–95 % of 10 samples") {
		t.Error("pulse-report.svg has no band of the 10 samples")
	}
	if html := string(mustRead(t, filepath.Join(dir, "report.html"))); !strings.Contains(html, "Uncertainty bands") || !strings.Contains(html, "5–95 % range over 10 samples") {
		t.Error("report.html lacks the uncertainty section or the band's caption")
	}
}

// TestRunUncertaintyHeld: a constant given with --set, even at its default value, is held: the
// text says so, --json lists it under "held" and not among the sampled "constants", and it
// drives nothing.
func TestRunUncertaintyHeld(t *testing.T) {
	t.Parallel()
	args := []string{"run", "../../data/designs/example.toml", "--set", "numerics.cells=20", "--set", "levels.manifold_share=0.25",
		"--uncertainty", "10", "--seed", "4"}
	var out, errb bytes.Buffer
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "held at the design's values, not sampled: manifold_share (given with --set") {
		t.Errorf("no held line in:\n%s", out.String())
	}
	var js bytes.Buffer
	if code := run(append(args, "--json"), &js, &errb); code != 0 {
		t.Fatalf("--json: exit %d: %s", code, errb.String())
	}
	var got struct {
		Uncertainty struct {
			Constants []string `json:"constants"`
			Held      []string `json:"held"`
		} `json:"uncertainty"`
	}
	if err := json.Unmarshal(js.Bytes(), &got); err != nil {
		t.Fatal(err)
	}
	u := got.Uncertainty
	if len(u.Held) != 1 || u.Held[0] != "levels.manifold_share" || len(u.Constants) == 0 || slices.Contains(u.Constants, "levels.manifold_share") {
		t.Errorf("constants %v, held %v; want manifold_share held only", u.Constants, u.Held)
	}
}

// TestSweepUncertaintyHeld: a banded sweep holds a constant given with --set (at its default
// value here) and says so in the text and in "held" of its --json block; resuming the sweep
// without that --set is refused, naming the held constants.
func TestSweepUncertaintyHeld(t *testing.T) {
	t.Parallel()
	if testing.Short() {
		t.Skip("runs the model 22 times")
	}
	dir := t.TempDir()
	args := []string{"sweep", "../../data/designs/example.toml", "--set", "numerics.cells=20", "--vary", "gas.pressure=60Torr:100Torr:2",
		"--uncertainty", "10", "--seed", "5", "--out", dir, "--quiet"}
	held := []string{"--set", "levels.manifold_share=0.25"}
	var out, errb bytes.Buffer
	if code := run(append(append([]string{}, args...), held...), &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "held at the design's values, not sampled: manifold_share") {
		t.Errorf("no held line in:\n%s", out.String())
	}
	var js bytes.Buffer
	if code := run([]string{"merge", dir, "--out", t.TempDir(), "--json"}, &js, &errb); code != 0 {
		t.Fatalf("merge: exit %d: %s", code, errb.String())
	}
	var rep struct {
		U struct {
			Held []string `json:"held"`
		} `json:"uncertainty"`
	}
	if err := json.Unmarshal(js.Bytes(), &rep); err != nil {
		t.Fatalf("%v\n%s", err, js.String())
	}
	if !slices.Equal(rep.U.Held, []string{"levels.manifold_share"}) {
		t.Errorf("merge --json: held %v; want [levels.manifold_share]", rep.U.Held)
	}
	var o, e bytes.Buffer
	if code := run(append(append([]string{}, args...), "--resume"), &o, &e); code == 0 || !strings.Contains(e.String(), "constants held") {
		t.Errorf("resume without the --set: exit %d, %q; want a refusal naming the held constants", code, e.String())
	}
}

// TestCheckUncertaintyUsage: check --uncertainty takes 10…100000 samples; another count is a
// usage error (exit 2) naming the flag, given before the registry runs.
func TestCheckUncertaintyUsage(t *testing.T) {
	t.Parallel()
	var o, e bytes.Buffer
	if code := run([]string{"check", "--uncertainty", "5"}, &o, &e); code != 2 || !strings.Contains(e.String(), "--uncertainty 5") {
		t.Errorf("check --uncertainty 5: exit %d, %q; want 2 naming --uncertainty", code, e.String())
	}
}
