package study

import (
	"errors"
	"math"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/data"
	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// quickDesign is the example on a coarse grid, for fast re-runs.
func quickDesign() *design.Design {
	d := design.ExampleDesign()
	d.Numerics.Cells = 50
	return d
}

func runEnergy(t *testing.T, d *design.Design) float64 {
	t.Helper()
	r, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	return r.Summary.EnergyTotal
}

func TestSensitivityAgainstExplicitRuns(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the model")
	}
	d := quickDesign()
	rows, err := Sensitivity(d, []string{"circuit.charge_voltage", "channel.gap"}, 0.01)
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 2 || math.Abs(rows[0].Energy) < math.Abs(rows[1].Energy) {
		t.Fatalf("rows not ranked: %+v", rows)
	}
	for _, r := range rows {
		// Two explicit runs at x·1.01 and x·0.99 (a finite difference in x, not in ln x).
		up, dn := d.Clone(), d.Clone()
		x := r.Value
		if err := up.Set(r.Key, siText(r.Key, 1.01*x)); err != nil {
			t.Fatal(err)
		}
		if err := dn.Set(r.Key, siText(r.Key, 0.99*x)); err != nil {
			t.Fatal(err)
		}
		want := (math.Log(runEnergy(t, up)) - math.Log(runEnergy(t, dn))) / (math.Log(1.01) - math.Log(0.99))
		if math.Abs(r.Energy-want) > 0.05*math.Abs(want) {
			t.Errorf("%s: d ln E/d ln x = %.4g, explicit runs give %.4g", r.Key, r.Energy, want)
		}
	}
}

func TestSensitivityStepConvergence(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the model")
	}
	// Central differences converge as h²: halving the step changes the value by little.
	d := quickDesign()
	a, err := Sensitivity(d, []string{"circuit.channel_capacitance"}, 0.02)
	if err != nil {
		t.Fatal(err)
	}
	b, err := Sensitivity(d, []string{"circuit.channel_capacitance"}, 0.01)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(a[0].Energy-b[0].Energy) > 0.05*math.Abs(b[0].Energy) {
		t.Errorf("step 0.02 gives %.4g, step 0.01 gives %.4g", a[0].Energy, b[0].Energy)
	}
}

func TestSensitivityOneSidedAndErrors(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the model")
	}
	d := quickDesign()
	d.Gas.Temperature = 995 // +1 % leaves the allowed 50–1000 K
	rows, err := Sensitivity(d, []string{"gas.temperature"}, 0.01)
	if err != nil {
		t.Fatal(err)
	}
	if !rows[0].OneSided || rows[0].Problem != "" || rows[0].Energy == 0 {
		t.Errorf("temperature at its limit: %+v", rows[0])
	}
	var ke *design.KeyError
	if _, err := Sensitivity(d, []string{"gas.presure"}, 0.01); !errors.As(err, &ke) || ke.Key != "gas.presure" {
		t.Errorf("unknown key: %v", err)
	}
	if _, err := Sensitivity(d, []string{"circuit.topology"}, 0.01); !errors.As(err, &ke) {
		t.Errorf("text key: %v", err)
	}
	if _, err := Sensitivity(d, []string{"gas.pressure"}, 0.9); err == nil {
		t.Error("no error for a step of 0.9")
	}
}

func TestSensitivityKeys(t *testing.T) {
	d := design.ExampleDesign()
	k := SensitivityKeys(d)
	for _, want := range []string{"circuit.charge_voltage", "channel.gap", "gas.pressure", "switch.spark_constant"} {
		if !slices.Contains(k, want) {
			t.Errorf("%s missing from %v", want, k)
		}
	}
	for _, not := range []string{"numerics.end_time", "gas.nitrogen", "spectroscopy.cross_section", "optics.excitation_velocity", "switch.rise_time", "levels.upper_quenching_oxygen"} {
		if slices.Contains(k, not) {
			t.Errorf("%s should not be varied (in %v)", not, k)
		}
	}
}

// TestSensitivityRederivesBuild checks d ln E / d ln L on the board design, whose circuit is
// derived from its [build] section: the sensitivity must agree with two explicit runs with the
// length set through design.Design.Set (which re-derives the rails' inductance), as a user would set
// it. Tolerance 2 %: the same central difference, so only rounding separates them.
func TestSensitivityRederivesBuild(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the model")
	}
	t.Parallel()
	d, err := design.ParseDesign(data.BoardDesign(), "board.toml")
	if err != nil {
		t.Fatal(err)
	}
	d.Numerics.Cells = 50
	rows, err := Sensitivity(d, []string{"channel.length"}, 0.01)
	if err != nil {
		t.Fatal(err)
	}
	if rows[0].Problem != "" || rows[0].OneSided {
		t.Fatalf("channel.length: %+v", rows[0])
	}
	l := rows[0].Value
	var e [2]float64
	for i, f := range []float64{math.Exp(-0.01), math.Exp(0.01)} {
		c := d.Clone()
		if err := c.Set("channel.length", siText("channel.length", l*f)); err != nil {
			t.Fatal(err)
		}
		e[i] = runEnergy(t, c)
	}
	want := (math.Log(e[1]) - math.Log(e[0])) / 0.02
	if !scalar.EqualWithinAbsOrRel(rows[0].Energy, want, 1e-9, 0.02) {
		t.Errorf("d ln E/d ln L = %.5g, two runs through Set give %.5g", rows[0].Energy, want)
	}
}
