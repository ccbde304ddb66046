package plots

import (
	"context"
	"image/color"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
	"n2pulse/units"
)

// TestFillBetween: a point without a band splits the fill, a lone point makes none, and each
// polygon runs along the high values forward and back along the low ones.
func TestFillBetween(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	x := []float64{1, 2, 3, 4, 5, 6, 7}
	lo := []float64{0, 1, nan, 2, 3, 4, nan}
	hi := []float64{10, 11, 12, 12, 13, 14, 15}
	polys := fillBetween(x, lo, hi, color.Black)
	if len(polys) != 2 {
		t.Fatalf("%d polygons, want 2 (points 1–2 and 4–6)", len(polys))
	}
	want := [][]float64{{1, 10}, {2, 11}, {2, 1}, {1, 0}}
	got := polys[0].XYs[0]
	if len(got) != len(want) {
		t.Fatalf("first polygon %v, want %v", got, want)
	}
	for i, w := range want {
		if got[i].X != w[0] || got[i].Y != w[1] {
			t.Errorf("first polygon vertex %d = %v, want %v", i, got[i], w)
		}
	}
	if n := len(polys[1].XYs[0]); n != 6 {
		t.Errorf("second polygon has %d vertices, want 6", n)
	}
}

// TestBandFigures draws a banded one-key sweep and a banded length scan (known runners, 10
// samples): the sweep curve says in its title that the band is shaded; the length figure's
// legend names the band of each curve with its sample count.
func TestBandFigures(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	a, err := study.ParseAxis("gas.pressure=20Torr:760Torr:6:log", d)
	if err != nil {
		t.Fatal(err)
	}
	s := &study.Sweep{Design: d, Axes: []study.Axis{a}, Runner: bumpRunner, Workers: 2, Dir: t.TempDir(), Samples: 10, Seed: 1}
	tab, err := s.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	if _, err := SweepFigures(tab, s.Axes, []string{"energy_total_J"}, dir); err != nil {
		t.Fatal(err)
	}
	if svg, err := os.ReadFile(filepath.Join(dir, "curve-energy_total_J.svg")); err != nil || !strings.Contains(string(svg), "shaded: 5–95 % over the uncertainty samples") {
		t.Errorf("banded sweep curve: %v; want the band named in the title", err)
	}
	ls := &study.LengthScan{Design: d, From: 0.05, To: 0.6, Points: 5, TravellingWave: units.SpeedOfLight, Workers: 2, Samples: 10, Seed: 1,
		Runner: func(d *design.Design) (kinetics.Summary, error) {
			e := 1e-4 * (1 - math.Exp(-d.Channel.Length/0.1)) * d.Levels.UpperQuenchingNitrogen / 1.25e-17
			return kinetics.Summary{EnergyFront: e, PeakPower: 1e5 * e, FWHM: 1e-9, InversionDuration: 1e-9, Lases: true}, nil
		}}
	r, err := ls.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	files, err := LengthFigure(r, filepath.Join(dir, "length"))
	if err != nil {
		t.Fatal(err)
	}
	svg, err := os.ReadFile(files[1])
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"5–95 % over 10 samples (simultaneous)", "5–95 % over 10 samples (front at c)"} {
		if !strings.Contains(string(svg), want) {
			t.Errorf("length figure lacks the legend %q", want)
		}
	}
}

// TestMapMayNotLase draws a banded two-key sweep whose samples lase only below a quenching
// constant of 1.25e-17 at pressures above 150 Torr: the map's title explains the triangles
// that mark those cells, and a sweep without bands has no such line.
func TestMapMayNotLase(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	var axes []study.Axis
	for _, v := range []string{"gas.pressure=50Torr:300Torr:4", "circuit.charge_voltage=8kV:12kV:3"} {
		a, err := study.ParseAxis(v, d)
		if err != nil {
			t.Fatal(err)
		}
		axes = append(axes, a)
	}
	run := func(d *design.Design) (kinetics.Summary, error) {
		p := d.Gas.Pressure / units.Torr
		return kinetics.Summary{EnergyTotal: 1e-6 * p * d.Circuit.ChargeVoltage / 1e3, Lases: p < 150 || d.Levels.UpperQuenchingNitrogen < 1.25e-17}, nil
	}
	const line = "triangles: may not lase"
	for _, samples := range []int{10, 0} {
		s := &study.Sweep{Design: d, Axes: axes, Runner: run, Workers: 2, Dir: t.TempDir(), Samples: samples, Seed: 1}
		tab, err := s.Run(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		dir := t.TempDir()
		if _, err := SweepFigures(tab, axes, []string{"energy_total_J"}, dir); err != nil {
			t.Fatal(err)
		}
		svg, err := os.ReadFile(filepath.Join(dir, "map-energy_total_J.svg"))
		if err != nil {
			t.Fatal(err)
		}
		if got := strings.Contains(string(svg), line); got != (samples > 0) {
			t.Errorf("%d samples: map names the may-not-lase marks %v, want %v", samples, got, samples > 0)
		}
	}
}
