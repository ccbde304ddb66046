package study_test

import (
	"context"
	"math"
	"strings"
	"testing"

	"n2pulse/data"
	"n2pulse/kinetics/build"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
	"n2pulse/units"
)

// sweepBoard is an invented scenario: a Blumlein on a 1.6 mm glass-epoxy board, with a coarse
// channel grid so that a sweep of the full model stays cheap.
var sweepBoard = string(data.BoardDesign()) + "\n[numerics]\ncells = 16\n"

// A three-point sweep of the full model over the switch-side plate width, through package
// study: each point's stored energy is ½(C₁ + C₂)V₀² (a Blumlein both of whose capacitors
// charge to V₀, analytic) with C₁ = ε₀ε_r·l·w/d from the plates (parallel-plate formula,
// Serway & Jewett, Physics for Scientists and Engineers, capacitance chapter, from memory).
func TestSweepOverBuildKey(t *testing.T) {
	d, err := design.ParseDesign([]byte(sweepBoard), "board.toml")
	if err != nil {
		t.Fatal(err)
	}
	a, err := study.ParseAxis("build.switch_plate_width=10cm:30cm:3", d)
	if err != nil {
		t.Fatal(err)
	}
	if a.Header() != "build.switch_plate_width [m]" || a.From != 0.1 || a.To != 0.3 {
		t.Errorf("axis %+v, header %q", a, a.Header())
	}
	s := &study.Sweep{Design: d, Axes: []study.Axis{a}, Workers: 2, Dir: t.TempDir()}
	tab, err := s.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	fr4, err := build.DielectricPreset("fr4")
	if err != nil {
		t.Fatal(err)
	}
	c2 := units.VacuumPermittivity * fr4.Permittivity * 0.15 * 0.25 / 1.6e-3
	wc, ec := tab.Column(a.Header()), tab.Column("stored_energy_J")
	if wc < 0 || ec < 0 || len(tab.Rows) != 3 {
		t.Fatalf("table columns %v, %d rows", tab.Columns, len(tab.Rows))
	}
	for r := range tab.Rows {
		if !tab.OK(r) {
			t.Fatalf("point %d failed: %v", r, tab.Rows[r])
		}
		w := tab.Float(r, wc)
		c1 := units.VacuumPermittivity * fr4.Permittivity * 0.15 * w / 1.6e-3
		want := 0.5 * (c1 + c2) * 12e3 * 12e3
		if got := tab.Float(r, ec); math.Abs(got-want) > 1e-9*want {
			t.Errorf("w = %g m: stored energy %.9g J, want %.9g J", w, got, want)
		}
		pd, err := s.PointDesign(r)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(pd.Circuit.SwitchCapacitance-c1) > 1e-12*c1 || pd.Build.SwitchPlateWidth != w {
			t.Errorf("point %d: C₁ %g, want %g; width %g", r, pd.Circuit.SwitchCapacitance, c1, pd.Build.SwitchPlateWidth)
		}
	}
	// The fingerprint of the sweep follows the build.
	other := d.Clone()
	if err := other.Set("build.dielectric_thickness", "1.5 mm"); err != nil {
		t.Fatal(err)
	}
	if study.DesignHash(other) == study.DesignHash(d) {
		t.Error("design hash ignores the build")
	}
	if _, err := study.ParseAxis("build.dielectric_thickness=1mm:10cm:3", d); err == nil || !strings.Contains(err.Error(), "out of range") {
		t.Errorf("axis beyond the build range: %v", err)
	}
}
