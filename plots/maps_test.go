package plots

import (
	"bytes"
	"context"
	"image/png"
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

// bumpRunner stands in for the model when testing the drawing: energy has one maximum at
// 100 Torr and 12 kV; points above 600 Torr fail, leaving holes in the map.
func bumpRunner(d *design.Design) (kinetics.Summary, error) {
	p := d.Gas.Pressure / units.Torr
	v := d.Circuit.ChargeVoltage / 1e3
	if p > 600 {
		return kinetics.Summary{}, os.ErrInvalid
	}
	e := math.Exp(-math.Pow(math.Log(p/100), 2) - math.Pow((v-12)/3, 2))
	return kinetics.Summary{EnergyTotal: 1e-4 * e, PeakPower: 1e5 * e, FWHM: 1e-9 / (1 + p/100), Efficiency: 1e-3 * e}, nil
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

func TestOptimum(t *testing.T) {
	v := []float64{3, math.NaN(), 7, 1, math.Inf(1)}
	if optimum(v, "energy_total_J") != 2 || optimum(v, "fwhm_s") != 3 || optimum([]float64{math.NaN()}, "x") != -1 {
		t.Error("optimum picks the wrong point")
	}
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
