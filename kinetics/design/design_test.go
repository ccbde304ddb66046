package design

import (
	"errors"
	"math"
	"strings"
	"testing"

	"n2pulse/data"
)

func TestExampleDesign(t *testing.T) {
	t.Parallel()
	d := ExampleDesign()
	if d.Channel.Length != 0.2 || d.Circuit.ChargeVoltage != 14e3 || d.Circuit.Topology != Blumlein {
		t.Fatalf("example decoded wrong: %+v", d.Circuit)
	}
	if math.Abs(d.Gas.Pressure-101325) > 1e-9 {
		t.Errorf("pressure %g Pa, want 101325", d.Gas.Pressure)
	}
	if !math.IsInf(d.Optics.ExcitationVelocity, 1) {
		t.Errorf("excitation velocity %g, want +Inf", d.Optics.ExcitationVelocity)
	}
}

// minimalDesign gives only the keys every design file must give (an invented bench-top
// Blumlein), its [gas] section last so that a test can append gas keys.
const minimalDesign = `[channel]
length = "20 cm"
gap = "2 mm"
width = "3 mm"
[circuit]
topology = "blumlein"
charge_voltage = "10 kV"
switch_capacitance = "2 nF"
channel_capacitance = "2 nF"
switch_inductance = "10 nH"
channel_inductance = "2 nH"
[gas]
pressure = "1 atm"
`

func TestDesignErrors(t *testing.T) {
	t.Parallel()
	base := minimalDesign
	if _, err := ParseDesign([]byte(base), "base.toml"); err != nil {
		t.Fatalf("valid design rejected: %v", err)
	}
	cases := []struct{ extra, key, want string }{
		{"presure = 3\n", "gas.presure", "did you mean gas.pressure"},
		{"[optics]\nfront_reflectivity = 1.5\n", "optics.front_reflectivity", "out of range"},
		{"[switch]\nmodel = \"magic\"\n", "switch.model", "allowed: ideal"},
		{"[numerics]\nend_time = \"12 kV\"\n", "numerics.end_time", "want s"},
	}
	for _, c := range cases {
		_, err := ParseDesign([]byte(base+c.extra), "x.toml")
		var ke *KeyError
		if !errors.As(err, &ke) || ke.Key != c.key || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: got %v, want KeyError on %s containing %q", c.extra, err, c.key, c.want)
		}
	}
	missing := strings.Replace(base, "gap = \"2 mm\"\n", "", 1)
	if _, err := ParseDesign([]byte(missing), "m.toml"); err == nil || !strings.Contains(err.Error(), "channel.gap") {
		t.Errorf("missing gap: %v", err)
	}
}

func TestSet(t *testing.T) {
	t.Parallel()
	d := ExampleDesign()
	if err := d.Set("gas.pressure", "40 Torr"); err != nil {
		t.Fatal(err)
	}
	if math.Abs(d.Gas.Pressure-40*133.322368) > 1e-3 {
		t.Errorf("pressure %g", d.Gas.Pressure)
	}
	if err := d.Set("numerics.cells", "400"); err != nil || d.Numerics.Cells != 400 {
		t.Errorf("cells: %v %d", err, d.Numerics.Cells)
	}
	if err := d.Set("optics.excitation_velocity", "c"); err != nil || d.Optics.ExcitationVelocity != 299792458 {
		t.Errorf("velocity: %v %g", err, d.Optics.ExcitationVelocity)
	}
	if err := d.Set("numerics.cells", "2.5"); err == nil {
		t.Error("fractional cells accepted")
	}
	if err := d.Set("circuit.charge_voltage", "-3 kV"); err == nil || !strings.Contains(err.Error(), "100 to 1e+06 V") {
		t.Errorf("negative voltage: %v", err)
	}
}

// TestBareNumbers checks the one rule for numbers without a unit: a dimensioned key refuses
// them, from the command line and from a design file, and the error names the key and
// suggests the unit; 0 and dimensionless keys stay bare; the trade's units are accepted.
func TestBareNumbers(t *testing.T) {
	t.Parallel()
	d := ExampleDesign()
	for _, c := range []struct{ key, value, want string }{
		{"gas.pressure", "40", `"40 Pa"`},
		{"channel.length", "0.2", `"0.2 m"`},
		{"gas.temperature", "20 C", "°C or degC"},
		{"build.dielectric_thickness", "0.0003", `"0.0003 m"`},
	} {
		err := d.Clone().Set(c.key, c.value)
		var ke *KeyError
		if !errors.As(err, &ke) || ke.Key != c.key || !strings.Contains(err.Error(), c.want) {
			t.Errorf("Set(%s, %q): got %v, want a KeyError on %s containing %q", c.key, c.value, err, c.key, c.want)
		}
	}
	for _, c := range []struct {
		key, value string
		want       float64
	}{
		{"gas.temperature", "20 °C", 293.15},
		{"gas.pressure", "1013.25 mbar", 101325},
		{"gas.oxygen", "0.21", 0.21},
		{"channel.stray_capacitance", "0", 0},
	} {
		c2 := d.Clone()
		if err := c2.Set(c.key, c.value); err != nil {
			t.Errorf("Set(%s, %q): %v", c.key, c.value, err)
			continue
		}
		if got, _ := c2.Get(c.key); math.Abs(got-c.want) > 1e-9*math.Abs(c.want) {
			t.Errorf("Set(%s, %q) gives %g, want %g (rel. tol. 1e-9)", c.key, c.value, got, c.want)
		}
	}
	file := strings.Replace(string(data.ExampleDesign()), `pressure = "760 Torr"`, "pressure = 101325", 1)
	_, err := ParseDesign([]byte(file), "bare.toml")
	if err == nil || !strings.Contains(err.Error(), "gas.pressure") || !strings.Contains(err.Error(), `pressure = "101325 Pa"`) {
		t.Errorf("bare pressure in a design file: got %v, want an error naming gas.pressure and the quoted form", err)
	}
}
