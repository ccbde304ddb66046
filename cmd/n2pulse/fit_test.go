package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/fit/measured"
	"n2pulse/kinetics/study"
)

const fitDemoDesign = "../../kinetics/fit/testdata/small-transfer.toml"

// fitDemoData writes a measured file made by the model itself from the demo design with a
// discharge width of 1.5 mm (no noise; a 5 % uncertainty stated), at three gaps.
func fitDemoData(t *testing.T, dir string) string {
	t.Helper()
	var b strings.Builder
	b.WriteString("# made by the model (test data)\nchannel.gap [mm], energy_front [uJ], energy_front_uncertainty [%], fwhm [ns], fwhm_uncertainty [%]\n")
	for _, g := range []string{"1.4", "1.9", "2.4"} {
		d, err := design.LoadDesign(fitDemoDesign)
		if err != nil {
			t.Fatal(err)
		}
		if err := d.Set("channel.width", "1.5 mm"); err != nil {
			t.Fatal(err)
		}
		if err := d.Set("channel.gap", g+" mm"); err != nil {
			t.Fatal(err)
		}
		s, err := study.ModelRunner(d)
		if err != nil {
			t.Fatal(err)
		}
		fmt.Fprintf(&b, "%s, %.9g, 5, %.9g, 5\n", g, s.EnergyFront*1e6, s.RMSWidth*1e9)
	}
	path := filepath.Join(dir, "measured.csv")
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// TestFitCommand: `fit` recovers the width the data were made with, writes fitted.toml (which
// reads back as a design with that width), residuals.csv, fit.json and the figures, and says
// which key the data do not determine (the O₂ quenching constant in pure N₂).
func TestFitCommand(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	data := fitDemoData(t, dir)
	out := filepath.Join(dir, "out")
	args := []string{"fit", fitDemoDesign, "--measured", data, "--free", "channel.width=0.5:5 mm",
		"--free", "levels.upper_quenching_oxygen=1e-11:1e-9 cm3/s", "--starts", "1", "--out", out, "--json"}
	var stdout, stderr bytes.Buffer
	if code := run(args, &stdout, &stderr); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr.String())
	}
	var got struct {
		Params []struct {
			Key        string   `json:"key"`
			Value      float64  `json:"value"`
			Determined bool     `json:"determined"`
			Low        *float64 `json:"ci95_low"`
			High       *float64 `json:"ci95_high"`
			Why        string   `json:"why"`
		} `json:"params"`
		Undetermined []string `json:"undetermined"`
		Residuals    []any    `json:"residuals"`
		Files        []string `json:"files"`
	}
	if err := json.Unmarshal(stdout.Bytes(), &got); err != nil {
		t.Fatalf("%v\n%s", err, stdout.String())
	}
	w := got.Params[0]
	// Exact data: the optimum is the width they were made with, to the minimiser's tolerance.
	if w.Key != "channel.width" || !w.Determined || !scalar.EqualWithinAbsOrRel(w.Value, 1.5e-3, 0, 2e-3) || w.Low == nil || !(*w.Low < w.Value && w.Value < *w.High) {
		t.Errorf("width: %+v, want 1.5 mm, determined, inside its interval", w)
	}
	if q := got.Params[1]; q.Determined || q.Low != nil || !strings.Contains(q.Why, "do not change") {
		t.Errorf("O₂ quenching: %+v, want not determined, no interval", q)
	}
	if len(got.Undetermined) != 1 || len(got.Residuals) != 6 || len(got.Files) != 5 {
		t.Errorf("undetermined %v, %d residuals, files %v; want 1, 6, 5", got.Undetermined, len(got.Residuals), got.Files)
	}
	fitted, err := design.LoadDesign(filepath.Join(out, "fitted.toml"))
	if err != nil {
		t.Fatalf("fitted.toml does not read back: %v", err)
	}
	if v, _ := fitted.Get("channel.width"); !scalar.EqualWithinAbsOrRel(v, w.Value, 0, 1e-5) {
		t.Errorf("fitted.toml width %g, fit %g", v, w.Value)
	}
	for _, f := range []string{"residuals.csv", "fit.json", "fit-energy_front.png", "fit-fwhm.png"} {
		if st, err := os.Stat(filepath.Join(out, f)); err != nil || st.Size() == 0 {
			t.Errorf("%s: %v", f, err)
		}
	}
	// The text form names the key it cannot determine.
	var text, e bytes.Buffer
	if code := run(append(args[:len(args)-3], "--out", ""), &text, &e); code != 0 {
		t.Fatalf("text: exit %d: %s", code, e.String())
	}
	for _, want := range []string{"levels.upper_quenching_oxygen is not determined by these data", "NOT DETERMINED", "residuals (model against measured)", "χ² ="} {
		if !strings.Contains(text.String(), want) {
			t.Errorf("text output lacks %q:\n%s", want, text.String())
		}
	}
}

// TestFitUsage: mistakes on the command line exit 2 with a message naming the flag; a broken
// measured file exits 1 naming its line and column.
func TestFitUsage(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.csv")
	if err := os.WriteFile(bad, []byte("channel.gap [mm], energy_front [uJ]\n1.5, 40\n2.0, x\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	good := filepath.Join(dir, "good.csv")
	if err := os.WriteFile(good, []byte("channel.gap [mm], energy_front [uJ]\n1.5, 40\n2.0, 45\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		args []string
		code int
		want string
	}{
		{[]string{"fit", fitDemoDesign, "--free", "channel.width"}, 2, "--measured FILE is required"},
		{[]string{"fit", fitDemoDesign, "--measured", good}, 2, "at least one --free"},
		{[]string{"fit", fitDemoDesign, "--measured", good, "--free", "channel.widht"}, 2, "did you mean channel.width"},
		{[]string{"fit", fitDemoDesign, "--measured", good, "--free", "channel.width=2 mm"}, 2, "want KEY=LO:HI"},
		{[]string{"fit", fitDemoDesign, "--measured", good, "--free", "channel.width=2:1 mm"}, 2, "want 0 < LO < HI"},
		{[]string{"fit", fitDemoDesign, "--measured", good, "--free", "channel.width=1:2 kV"}, 2, "channel.width"},
		{[]string{"fit", fitDemoDesign, "--measured", good, "--free", "channel.gap"}, 2, "either measured or fitted"},
		{[]string{"fit", fitDemoDesign, "--measured", good, "--free", "numerics.cells"}, 2, "not a numeric key that varies continuously"},
		{[]string{"fit", fitDemoDesign, "--measured", good, "--free", "channel.width", "--starts", "0"}, 2, "--starts 0"},
		{[]string{"fit", fitDemoDesign, "--measured", bad, "--free", "channel.width"}, 1, `line 3, column "energy_front [uJ]": "x" is not a number`},
	}
	for _, c := range cases {
		var o, e bytes.Buffer
		if code := run(c.args, &o, &e); code != c.code || !strings.Contains(e.String(), c.want) {
			t.Errorf("%v: exit %d, %q; want %d and %q", c.args[3:], code, e.String(), c.code, c.want)
		}
	}
}

// TestFitNoScatter: one point, one free key, no uncertainty (150 µJ, which the demo design
// reaches inside the width range, at about 3.5 mm): nothing is left to estimate the scatter, so --json carries null intervals and residuals and the key is not determined.
func TestFitNoScatter(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	data := filepath.Join(dir, "one.csv")
	if err := os.WriteFile(data, []byte("channel.gap [mm], energy_front [uJ]\n1.8, 150\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	var o, e bytes.Buffer
	if code := run([]string{"fit", fitDemoDesign, "--measured", data, "--free", "channel.width=0.5:5 mm", "--starts", "1", "--out", "", "--json"}, &o, &e); code != 0 {
		t.Fatalf("exit %d: %s", code, e.String())
	}
	var got struct {
		Params []struct {
			Determined bool     `json:"determined"`
			Low        *float64 `json:"ci95_low"`
			Why        string   `json:"why"`
		} `json:"params"`
		Residuals []struct {
			Normalised *float64 `json:"normalised"`
		} `json:"residuals"`
		Scatter *float64 `json:"relative_scatter"`
	}
	if err := json.Unmarshal(o.Bytes(), &got); err != nil {
		t.Fatalf("%v\n%s", err, o.String())
	}
	if p := got.Params[0]; p.Determined || p.Low != nil || !strings.Contains(p.Why, "no interval") || got.Residuals[0].Normalised != nil || got.Scatter != nil {
		t.Errorf("got %+v", got)
	}
}

// TestFitExamples: the measured files the README runs parse, with the points it describes.
func TestFitExamples(t *testing.T) {
	t.Parallel()
	for file, want := range map[string]struct {
		points, values int
		uncertain      bool
	}{
		"../../examples/fit/demo-tea-transfer.csv":      {6, 9, true},
		"../../examples/fit/tea-transfer-88mm-gaps.csv": {2, 2, false},
	} {
		s, err := measured.ReadFile(file)
		if err != nil {
			t.Fatal(err)
		}
		n := 0
		for _, p := range s.Points {
			n += len(p.Values)
		}
		if len(s.Points) != want.points || n != want.values || s.Uncertain != want.uncertain {
			t.Errorf("%s: %d points, %d values, uncertain %v; want %+v", file, len(s.Points), n, s.Uncertain, want)
		}
	}
}
