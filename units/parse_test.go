package units

import (
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
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
	t.Parallel()
	for _, in := range []string{"", "kV", "12 kQ", "12 nF", "3 cm^x", "12"} {
		if _, err := Parse(in, Voltage); err == nil {
			t.Errorf("Parse(%q, Voltage) gave no error", in)
		}
	}
}

// TestParseTradeUnits checks the units builders use besides the SI. Expected values follow
// from the exact definitions (1 bar = 1e5 Pa; 1 in = 0.0254 m; 1 lb = 0.45359237 kg; g_n =
// 9.80665 m/s²; 0 °C = 273.15 K) and the conventional mmHg, 13.5951 g/cm³ × g_n × 1 mm (NIST
// SP 811 (2008) App. B.8 lists 1.333 224 E+02 Pa; from memory).
func TestParseTradeUnits(t *testing.T) {
	t.Parallel()
	cases := []struct {
		in   string
		dim  Dimension
		want float64
	}{
		{"1 bar", Pressure, 1e5},
		{"40 mbar", Pressure, 4000},
		{"1013.25 hPa", Pressure, 101325},
		{"14.7 psi", Pressure, 14.7 * 6894.757293168361},
		{"760 mmHg", Pressure, 760 * 133.322387415},
		{"20 °C", Temperature, 293.15},
		{"20 ℃", Temperature, 293.15},
		{"-20 degC", Temperature, 253.15},
		{"300 K", Temperature, 300},
		{"2 mil", Length, 50.8e-6},
		{"1 in", Length, 0.0254},
		{"0", Pressure, 0}, // zero may stay bare
		{"0.21", Dimensionless, 0.21},
	}
	for _, c := range cases {
		got, err := Parse(c.in, c.dim)
		if err != nil {
			t.Errorf("Parse(%q): %v", c.in, err)
			continue
		}
		if !scalar.EqualWithinAbsOrRel(got, c.want, 1e-300, 1e-12) {
			t.Errorf("Parse(%q) = %.15g, want %.15g (rel. tol. 1e-12)", c.in, got, c.want)
		}
	}
}

// TestParseRejects covers the inputs that were once accepted wrongly: powers that overflowed
// an 8-bit exponent, a NaN from a huge power of 1, a result beyond float64, and a bare number
// for a dimensioned value that used to be taken as SI.
func TestParseRejects(t *testing.T) {
	t.Parallel()
	cases := []struct {
		in      string
		dim     Dimension
		message string // a fragment the error must contain
	}{
		{"760 Torr m^256", Pressure, "power 256"},
		{"0.2 m^257", Length, "power 257"},
		{"0A100000000", Current, "power 100000000"},
		{"1 m^20 m^20", Dimension{40, 0, 0, 0, 0}, "beyond ±30"},
		{"1e308 km", Length, "out of range"},
		{"1e400 m", Length, "out of range"},
		{"40", Pressure, `"40 Pa"`},
		{"12e3", Voltage, `"12e3 V"`},
		{"20 C", Temperature, "°C or degC"},
		{"-300 °C", Temperature, "absolute zero"},
		{"20 °C", Length, "is a temperature"},
		{"1 °C/s", Dimension{0, 0, -1, 0, 1}, "stands alone"},
	}
	for _, c := range cases {
		v, err := Parse(c.in, c.dim)
		if err == nil {
			t.Errorf("Parse(%q) = %g, want an error containing %q", c.in, v, c.message)
			continue
		}
		if !strings.Contains(err.Error(), c.message) {
			t.Errorf("Parse(%q): error %q does not contain %q", c.in, err, c.message)
		}
	}
	var nu *NoUnitError
	if _, err := Parse("40", Pressure); !errors.As(err, &nu) || nu.Want != Pressure {
		t.Errorf("Parse(\"40\", Pressure) error %v is not a *NoUnitError for Pressure", err)
	}
}

func TestFormat(t *testing.T) {
	cases := map[float64]string{1.234e-6: "1.23 µJ", 0: "0 J", 2.5e3: "2.5 kJ", 7e-10: "700 pJ"}
	for v, want := range cases {
		if got := Format(v, "J"); got != want {
			t.Errorf("Format(%g) = %q, want %q", v, got, want)
		}
	}
	// A pure number takes no SI prefix (a share of 0.25 once printed as "250 m").
	for v, want := range map[float64]string{0.25: "0.25", 1.5e-3: "0.0015", 200: "200", 3e5: "3e+05"} {
		if got := Format(v, ""); got != want {
			t.Errorf("Format(%g, \"\") = %q, want %q", v, got, want)
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

// TestParseDecimalExact checks that a value in a decimal unit is the float64 nearest the
// decimal it denotes, as if typed in SI: "0.1 pF" is the literal 1e-13 (0.1 × 1e-12 in floating
// point is 9.999999999999999e-14, below a range that starts at 1e-13).
func TestParseDecimalExact(t *testing.T) {
	t.Parallel()
	cases := []struct {
		in   string
		dim  Dimension
		want float64
	}{
		{"0.1 pF", Capacitance, 1e-13},
		{"0.1pF", Capacitance, 1e-13},
		{"22.5 mm", Length, 0.0225},
		{"2.5 cm", Length, 0.025},
		{"1e-9 cm3/s", RateConstant, 1e-15},
		{"3 nH", Inductance, 3e-9},
		{"7. ns", Time, 7e-9},
		{"1.1e-3 km", Length, 1.1},
		{"1 mbar", Pressure, 100},
	}
	for _, c := range cases {
		got, err := Parse(c.in, c.dim)
		if err != nil || got != c.want {
			t.Errorf("Parse(%q) = %v (%v), want exactly %v", c.in, got, err, c.want)
		}
	}
}
