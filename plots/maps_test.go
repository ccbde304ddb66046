package plots

import (
	"bytes"
	"context"
	"html"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
	"n2pulse/units"
)

// bumpRunner stands in for the model when testing the drawing: energy has one maximum at
// 100 Torr and 12 kV; points from 400 to 600 Torr do not lase (their width is reported as 0,
// the smallest of all, which must never be chosen), points above 600 Torr fail.
func bumpRunner(d *design.Design) (kinetics.Summary, error) {
	p := d.Gas.Pressure / units.Torr
	v := d.Circuit.ChargeVoltage / 1e3
	if p > 600 {
		return kinetics.Summary{}, os.ErrInvalid
	}
	e := math.Exp(-math.Pow(math.Log(p/100), 2) - math.Pow((v-12)/3, 2))
	s := kinetics.Summary{EnergyTotal: 1e-4 * e, PeakPower: 1e5 * e, FWHM: 1e-9 / (1 + p/100), Efficiency: 1e-3 * e, Lases: p < 400}
	if !s.Lases {
		s.FWHM = 0
	}
	return s, nil
}

func sweepTable(t *testing.T, vary ...string) (*study.Table, []study.Axis) {
	t.Helper()
	d := design.ExampleDesign()
	var axes []study.Axis
	for _, v := range vary {
		a, err := study.ParseAxis(v, d)
		if err != nil {
			t.Fatal(err)
		}
		axes = append(axes, a)
	}
	s := &study.Sweep{Design: d, Axes: axes, Runner: bumpRunner, Workers: 2, Dir: t.TempDir()}
	tab, err := s.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	return tab, axes
}

func checkFigures(t *testing.T, files []string, n int) {
	t.Helper()
	if len(files) != n {
		t.Fatalf("%d files, want %d: %v", len(files), n, files)
	}
	for _, f := range files {
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		switch filepath.Ext(f) {
		case ".png":
			img, err := png.Decode(bytes.NewReader(b))
			if err != nil || img.Bounds().Dx() < 300 {
				t.Errorf("%s: %v %v", f, err, img.Bounds())
			}
		case ".svg":
			if !bytes.Contains(b, []byte("<svg")) {
				t.Errorf("%s is not SVG", f)
			}
		}
	}
}

func TestSweepMaps(t *testing.T) {
	tab, axes := sweepTable(t, "gas.pressure=20Torr:760Torr:9:log", "circuit.charge_voltage=8kV:16kV:5")
	dir := t.TempDir()
	files, err := SweepFigures(tab, axes, nil, dir)
	if err != nil {
		t.Fatal(err)
	}
	checkFigures(t, files, 2*len(DefaultMapMetrics))
	if filepath.Base(files[0]) != "map-energy_total_J.png" {
		t.Errorf("first file %s", files[0])
	}
	if _, err := SweepFigures(tab, axes, []string{"nosuch"}, dir); err == nil || !strings.Contains(err.Error(), "nosuch") {
		t.Errorf("unknown metric: %v", err)
	}
	if _, err := SweepFigures(&study.Table{Columns: tab.Columns, Rows: tab.Rows[:10]}, axes, nil, dir); err == nil {
		t.Error("accepted a partial table")
	}
}

func TestSweepCurves(t *testing.T) {
	tab, axes := sweepTable(t, "gas.pressure=20Torr:760Torr:12:log")
	files, err := SweepFigures(tab, axes, []string{"energy_total_J", "fwhm_s"}, t.TempDir())
	if err != nil {
		t.Fatal(err)
	}
	checkFigures(t, files, 4)
}

func TestLengthFigure(t *testing.T) {
	s := &study.LengthScan{Design: design.ExampleDesign(), From: 0.05, To: 0.6, Points: 8,
		TravellingWave: units.SpeedOfLight, Workers: 2,
		Runner: func(d *design.Design) (kinetics.Summary, error) {
			e := 1e-4 * (1 - math.Exp(-d.Channel.Length/0.1))
			return kinetics.Summary{EnergyFront: e, PeakPower: 1e5 * e, FWHM: 1e-9, InversionDuration: 1e-9}, nil
		}}
	r, err := s.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	files, err := LengthFigure(r, filepath.Join(t.TempDir(), "length"))
	if err != nil {
		t.Fatal(err)
	}
	checkFigures(t, files, 2)
}

// TestOptimumMasked checks that points without a pulse or a result are never the optimum, that
// a width is minimised, and that an optimum on the last grid value is flagged.
func TestOptimumMasked(t *testing.T) {
	t.Parallel()
	tab, axes := sweepTable(t, "gas.pressure=20Torr:760Torr:9:log", "circuit.charge_voltage=8kV:16kV:5")
	w := Optimum(tab, axes, "fwhm_s")
	if w.Row < 0 || w.Word != "minimum" {
		t.Fatalf("fwhm optimum %+v", w)
	}
	p := w.At["gas.pressure [Pa]"] / units.Torr
	// The narrowest lasing pulse is at the highest lasing pressure: the grid is 20·38^(k/8) Torr,
	// k = 6 gives 305 Torr; k = 7 (480 Torr) does not lase, k = 8 (760 Torr) fails.
	if p >= 400 || !(w.Value > 0) {
		t.Errorf("fwhm minimum at %.4g Torr, value %g: chose a point that does not lase", p, w.Value)
	}
	if want := 20 * math.Pow(38, 6.0/8); !scalar.EqualWithinAbsOrRel(p, want, 0, 1e-9) {
		t.Errorf("fwhm minimum at %.6g Torr, want %.6g Torr", p, want)
	}
	// 9 × 5 points; the 5 at k = 7 do not lase and the 5 at k = 8 fail.
	if w.Masked != 10 {
		t.Errorf("masked %d points, want 10", w.Masked)
	}
	e := Optimum(tab, axes, "energy_total_J")
	if len(e.Edge) != 0 || !scalar.EqualWithinAbsOrRel(e.At["circuit.charge_voltage [V]"], 12e3, 0, 1e-12) {
		t.Errorf("energy optimum %+v: want 12 kV, inside the grid", e)
	}
	rising, raxes := sweepTable(t, "gas.pressure=20Torr:90Torr:5", "circuit.charge_voltage=12kV:12kV:1")
	r := Optimum(rising, raxes, "energy_total_J")
	if len(r.Edge) != 1 || r.Edge[0] != "gas.pressure" {
		t.Errorf("rising energy: edge %v, want [gas.pressure]", r.Edge)
	}
}

// TestSweepFigureText reads the SVG text of a sweep map and of a sweep curve: labels in words
// with the units the user typed (Torr, kV) or SI-prefixed ones (µJ, ps), no raw key names or
// bare SI units.
func TestSweepFigureText(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		vary   []string
		file   string
		want   []string
		metric string
	}{
		{[]string{"gas.pressure=20Torr:760Torr:9:log", "circuit.charge_voltage=8kV:16kV:5"}, "map-energy_total_J.svg",
			[]string{"pressure [Torr], log scale", "charge voltage [kV]", "pulse energy, both ends", "[µJ]", "maximum 95.7 µJ at 123 Torr, 12 kV",
				"grey: 5 failed, 5 no laser pulse"}, "energy_total_J"},
		{[]string{"gas.pressure=20Torr:90Torr:5"}, "curve-fwhm_s.svg",
			[]string{"pressure [Torr]", "pulse width (FWHM) [ps]", "minimum 526 ps at 90 Torr", "extend the range of pressure"}, "fwhm_s"},
	} {
		tab, axes := sweepTable(t, c.vary...)
		dir := t.TempDir()
		if _, err := SweepFigures(tab, axes, []string{c.metric}, dir); err != nil {
			t.Fatal(err)
		}
		b, err := os.ReadFile(filepath.Join(dir, c.file))
		if err != nil {
			t.Fatal(err)
		}
		text := svgText(string(b))
		for _, w := range c.want {
			if !strings.Contains(text, w) {
				t.Errorf("%s: no %q in its text:\n%s", c.file, w, text)
			}
		}
		for _, bad := range []string{"energy_total_J", "fwhm_s", "gas.pressure", "circuit.charge_voltage", "[Pa]", "[V]", "[J]", "[s]", "e+", "e-0"} {
			if strings.Contains(text, bad) {
				t.Errorf("%s: raw %q in its text:\n%s", c.file, bad, text)
			}
		}
	}
}

// svgText joins the text elements of an SVG file, one per line.
func svgText(svg string) string {
	var out []string
	for _, part := range strings.Split(svg, "<text")[1:] {
		_, rest, ok := strings.Cut(part, ">")
		if !ok {
			continue
		}
		body, _, _ := strings.Cut(rest, "</text>")
		out = append(out, html.UnescapeString(body))
	}
	return strings.Join(out, "\n")
}
