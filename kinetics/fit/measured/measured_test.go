package measured

import (
	"errors"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestParse(t *testing.T) {
	t.Parallel()
	text := "# demo points (invented)\n" +
		"channel.gap [mm], gas.pressure, energy_front [uJ], energy_front_uncertainty [%], fwhm [ns], fwhm_uncertainty [ps], note\n" +
		"1.2, 760 Torr, 48, 10, 1.1, 100, first\n" +
		"1.6, 1 atm, 61, 10, , , no width\n"
	s, err := Parse([]byte(text), "p.csv")
	if err != nil {
		t.Fatal(err)
	}
	if len(s.Points) != 2 || len(s.Keys) != 2 || len(s.Quantities) != 2 || !s.Uncertain {
		t.Fatalf("got %+v", s)
	}
	p := s.Points[0]
	if p.Line != 3 || p.Settings[0] != (Setting{"channel.gap", "1.2 mm"}) || p.Settings[1].Value != "760 Torr" || p.Note != "first" {
		t.Errorf("point 1: %+v", p)
	}
	// 48 µJ ± 10 %, 1.1 ns ± 100 ps (exact unit conversions).
	want := []Value{{"energy_front", 48e-6, 4.8e-6}, {"fwhm", 1.1e-9, 1e-10}}
	for i, w := range want {
		g := p.Values[i]
		if g.Quantity != w.Quantity || !scalar.EqualWithinAbsOrRel(g.Value, w.Value, 0, 1e-12) || !scalar.EqualWithinAbsOrRel(g.Uncertainty, w.Uncertainty, 0, 1e-12) {
			t.Errorf("value %d: %+v, want %+v", i, g, w)
		}
	}
	if len(s.Points[1].Values) != 1 {
		t.Errorf("point 2 has %d values, want 1 (the width left empty)", len(s.Points[1].Values))
	}
}

// TestParseErrors: every mistake names its line and column and what is allowed.
func TestParseErrors(t *testing.T) {
	t.Parallel()
	cases := []struct{ name, text, want string }{
		{"empty", "", "empty"},
		{"unknown column", "channel.gapp [mm], energy_front [uJ]\n1, 2\n", `line 1, column "channel.gapp [mm]": neither a design key nor a measured quantity (energy_front, energy_rear, energy_total, peak_power, fwhm) (did you mean channel.gap?)`},
		{"no unit", "channel.gap [mm], energy_front\n1, 2\n", `column "energy_front": give the unit in the header, e.g. "energy_front [uJ]"`},
		{"wrong unit", "channel.gap [mm], energy_front [ns]\n1, 2\n", `unit "ns" is not one of J`},
		{"no measured column", "channel.gap [mm]\n1\n", "no measured column"},
		{"twice", "channel.gap [mm], channel.gap [cm], energy_front [uJ]\n1, 1, 2\n", "channel.gap appears twice"},
		{"not a number", "channel.gap [mm], energy_front [uJ]\n1, 2\n1.5, lots\n", `line 3, column "energy_front [uJ]": "lots" is not a number`},
		{"zero", "channel.gap [mm], energy_front [uJ]\n1, 0\n", "line 2, column \"energy_front [uJ]\": 0 uJ: a measured value must be above zero"},
		{"key out of range", "channel.gap [mm], energy_front [uJ]\n1, 2\n900, 3\n", `line 3, column "channel.gap [mm]": channel.gap = 900 mm: out of range`},
		{"key without unit", "channel.gap, energy_front [uJ]\n1.5, 2\n", `line 2, column "channel.gap": channel.gap = 1.5: "1.5" has no unit`},
		{"empty key cell", "channel.gap [mm], energy_front [uJ]\n, 2\n", "line 2, column \"channel.gap [mm]\": empty"},
		{"ragged", "channel.gap [mm], energy_front [uJ]\n1, 2, 3\n", "line 2: this row has a different number of cells"},
		{"no value", "channel.gap [mm], energy_front [uJ]\n1, \n", "line 2: no measured value"},
		{"mixed uncertainty", "channel.gap [mm], energy_front [uJ], energy_front_uncertainty [uJ]\n1, 2, 0.2\n2, 3,\n", "1 measured values carry an uncertainty and 1 do not"},
		{"orphan uncertainty", "channel.gap [mm], energy_front [uJ], fwhm_uncertainty [ns]\n1, 2, 0.2\n", `column "fwhm_uncertainty [ns]": no column "fwhm"`},
		{"uncertainty alone", "channel.gap [mm], energy_front [uJ], fwhm [ns], fwhm_uncertainty [ns]\n1, 2, , 0.2\n", "an uncertainty without a measured fwhm"},
		{"percent", "channel.gap [mm], energy_front [uJ], energy_front_uncertainty [%]\n1, 2, 0\n", "above 0 and at most 1000"},
		{"no rows", "channel.gap [mm], energy_front [uJ]\n# nothing\n", "no measured points"},
	}
	for _, c := range cases {
		_, err := Parse([]byte(c.text), "m.csv")
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want it to contain %q", c.name, err, c.want)
			continue
		}
		var e *Error
		if !errors.As(err, &e) || e.File != "m.csv" {
			t.Errorf("%s: %v is not a *measured.Error of m.csv", c.name, err)
		}
	}
}

func TestParseTooLarge(t *testing.T) {
	t.Parallel()
	b := []byte("channel.gap [mm], energy_front [uJ]\n" + strings.Repeat("1, 2\n", MaxPoints+1))
	if _, err := Parse(b, "big.csv"); err == nil || !strings.Contains(err.Error(), "more than 1000 measured points") {
		t.Errorf("error %v", err)
	}
}
