package plots

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/units"
)

// TestLabelOf checks the words and display units of metrics and design keys, and values
// written in them (conversion factors: 1 Torr = 101325/760 Pa, by definition).
func TestLabelOf(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		key, typed string
		v          float64
		text, want string
	}{
		{"energy_total_J", "", 9.568e-4, "pulse energy, both ends", "957 µJ"},
		{"efficiency", "", 6.93e-4, "efficiency (pulse / stored energy)", "0.0693 %"},
		{"peak_electron_density_m3", "", 1.26e21, "peak electron density", "1.26×10^15 /cm³"},
		{"peak_gain_per_m", "", 256, "peak gain", "2.56 1/cm"},
		{"gas.pressure [Pa]", "", 101325, "pressure", "760 Torr"},
		{"gas.pressure [Pa]", "mbar", 101325, "pressure", "1010 mbar"},
		{"circuit.charge_voltage [V]", "kV", 14e3, "charge voltage", "14 kV"},
		{"circuit.charge_voltage [V]", "", 14e3, "charge voltage", "14 kV"},
		{"channel.gap [m]", "mm", 1.5e-3, "channel gap", "1.5 mm"},
		{"gas.oxygen", "", 0.21, "oxygen fraction", "0.21"},
		{"new_width_s", "", 2e-9, "new width", "2 ns"},
	} {
		l := LabelOf(c.key).Typed(c.typed)
		if l.Text != c.text {
			t.Errorf("LabelOf(%q).Text = %q, want %q", c.key, l.Text, c.text)
		}
		if got := l.Format(c.v); got != c.want {
			t.Errorf("LabelOf(%q).Typed(%q).Format(%g) = %q, want %q", c.key, c.typed, c.v, got, c.want)
		}
	}
	l := LabelOf("gas.pressure [Pa]").Typed("Torr")
	if !scalar.EqualWithinAbsOrRel(l.Scale, 1/units.Torr, 0, 1e-15) || !scalar.EqualWithinAbsOrRel(units.Torr, 101325.0/760, 0, 1e-15) {
		t.Errorf("Torr scale %g", l.Scale)
	}
	if LabelOf("fwhm_s").Optimum() != "minimum" || LabelOf("energy_total_J").Optimum() != "maximum" {
		t.Error("optimum words")
	}
	if u := LabelOf("gas.pressure [Pa]").Typed("kV").Unit; u != "Torr" {
		t.Errorf("a unit of another dimension must be ignored, got %q", u)
	}
}
