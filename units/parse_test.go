package units

import (
	"math"
	"testing"
)

func TestParse(t *testing.T) {
	cases := []struct {
		in   string
		dim  Dimension
		want float64
	}{
		{"12 kV", Voltage, 12e3},
		{"3.3nF", Capacitance, 3.3e-9},
		{"40 Torr", Pressure, 40 * 101325.0 / 760},
		{"1 atm", Pressure, 101325},
		{"25 cm", Length, 0.25},
		{"1e-9 cm3/s", RateConstant, 1e-15},
		{"1e10 cm^-3", Density, 1e16},
		{"1e10 cm⁻³", Density, 1e16},
		{"100 Td", ReducedField, 1e-19},
		{"5 nH", Inductance, 5e-9},
		{"0.1 ohm", Resistance, 0.1},
		{"2 Ω", Resistance, 2},
		{"300 K", Temperature, 300},
		{"0.02 /cm", Attenuation, 2},
		{"30 kV/cm", ElectricField, 3e6},
		{"1 atm cm2 V-2 s-1", SparkConstant, 101325 * 1e-4},
		{"2.5", Dimensionless, 2.5},
		{"50 %", Dimensionless, 0.5},
		{"20 ns", Time, 20e-9},
	}
	for _, c := range cases {
		got, err := Parse(c.in, c.dim)
		if err != nil {
			t.Errorf("Parse(%q): %v", c.in, err)
			continue
		}
		if math.Abs(got-c.want) > 1e-12*math.Abs(c.want) {
			t.Errorf("Parse(%q) = %g, want %g", c.in, got, c.want)
		}
	}
}

func TestParseErrors(t *testing.T) {
	for _, in := range []string{"", "kV", "12 kQ", "12 nF", "3 cm^x"} {
		if _, err := Parse(in, Voltage); err == nil {
			t.Errorf("Parse(%q, Voltage) gave no error", in)
		}
	}
}

func TestFormat(t *testing.T) {
	cases := map[float64]string{1.234e-6: "1.23 µJ", 0: "0 J", 2.5e3: "2.5 kJ", 7e-10: "700 pJ"}
	for v, want := range cases {
		if got := Format(v, "J"); got != want {
			t.Errorf("Format(%g) = %q, want %q", v, got, want)
		}
	}
}

func TestUnitOf(t *testing.T) {
	t.Parallel()
	for text, want := range map[string]string{"20Torr": "Torr", " 14 kV ": "kV", "1e8 cm-3": "cm-3", "101325": "", "Torr": "", "-3.5e-2mm": "mm"} {
		if got := UnitOf(text); got != want {
			t.Errorf("UnitOf(%q) = %q, want %q", text, got, want)
		}
	}
}
