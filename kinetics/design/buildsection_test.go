package design

import (
	"errors"
	"math"
	"slices"
	"strings"
	"testing"

	"n2pulse/data"
	"n2pulse/kinetics/build"
	"n2pulse/units"
)

// boardDesign is an invented scenario: a Blumlein etched on a 1.6 mm glass-epoxy board.
var boardDesign = strings.NewReplacer(
	"\n[build]\n", "\n[switch]\nmodel = \"rompe-weizel\"\n\n[build]\n",
	`rail_height = "5 mm"`, "rail_height = \"5 mm\"\nswitch_gap = \"3 mm\"\nswitch_own_inductance = \"5 nH\"",
).Replace(string(data.BoardDesign()))

// bench evaluates the build of b with the design's circuit values: the derived values and the
// dielectric and Paschen ratings, which do not need the physics kinetics.Bench adds.
func bench(t *testing.T, b *Built) *build.Bench {
	t.Helper()
	r, err := build.Evaluate(b.Spec, b.Design.BenchConditions())
	if err != nil {
		t.Fatal(err)
	}
	return r
}

func TestParseBuiltDesignDerives(t *testing.T) {
	t.Parallel()
	b, err := ParseBuiltDesign([]byte(boardDesign), "board.toml")
	if err != nil {
		t.Fatal(err)
	}
	d := b.Design
	want := []string{"switch.gap", "circuit.switch_capacitance", "circuit.channel_capacitance", "circuit.switch_inductance", "circuit.channel_inductance"}
	if !slices.Equal(b.Derived, want) {
		t.Errorf("derived %v, want %v", b.Derived, want)
	}
	// Textbook formulas (see package build): C = ε₀ε_r·l·w/d, L = μ₀·d·l/(3w) (+5 nH for the
	// switch), rails μ₀·g·h/L.
	c := units.VacuumPermittivity * 4.5 * 0.15 * 0.25 / 1.6e-3
	ls := units.VacuumPermeability*1.6e-3*0.15/(3*0.25) + 5e-9
	lc := units.VacuumPermeability*1.6e-3*0.15/(3*0.25) + units.VacuumPermeability*2e-3*5e-3/0.25
	for _, x := range []struct {
		what      string
		got, want float64
	}{
		{"C₁", d.Circuit.SwitchCapacitance, c}, {"C₂", d.Circuit.ChannelCapacitance, c},
		{"L_s", d.Circuit.SwitchInductance, ls}, {"L_c", d.Circuit.ChannelInductance, lc},
		{"switch gap", d.Switch.Gap, 3e-3},
	} {
		if math.Abs(x.got-x.want) > 1e-12*x.want {
			t.Errorf("%s = %g, want %g", x.what, x.got, x.want)
		}
	}
	if bench(t, b).DielectricMargin <= 0 || bench(t, b).ChannelBreakdown <= 0 {
		t.Errorf("bench incomplete: margin %g, breakdown %g", bench(t, b).DielectricMargin, bench(t, b).ChannelBreakdown)
	}
}

func TestParseBuiltDesignExplicitWins(t *testing.T) {
	t.Parallel()
	text := strings.Replace(boardDesign, `shunt_inductance = "1 uH"`, `shunt_inductance = "1 uH"`+"\nswitch_inductance = \"20 nH\"", 1)
	b, err := ParseBuiltDesign([]byte(text), "board.toml")
	if err != nil {
		t.Fatal(err)
	}
	if b.Design.Circuit.SwitchInductance != 20e-9 || slices.Contains(b.Derived, "circuit.switch_inductance") {
		t.Errorf("explicit L_s lost: %g, derived %v", b.Design.Circuit.SwitchInductance, b.Derived)
	}
	if bench(t, b).DerivedSwitchInductance == 20e-9 || bench(t, b).SwitchInductance != 20e-9 {
		t.Errorf("bench: derived %g, used %g", bench(t, b).DerivedSwitchInductance, bench(t, b).SwitchInductance)
	}
}

func TestParseBuiltDesignErrors(t *testing.T) {
	t.Parallel()
	cases := []struct{ old, new, key, says string }{
		{`rail_height = "5 mm"`, `rail_hieght = "5 mm"`, "build.rail_hieght", "did you mean build.rail_height"},
		{`dielectric_thickness = "1.6 mm"`, `dielectric_thickness = "-1 mm"`, "build.dielectric_thickness", "out of range"},
		{`dielectric = "fr4"`, `dielectric = "cardboard"`, "build.dielectric", "allowed"},
		{`channel_plate_length = "15 cm"`, ``, "circuit.channel_capacitance", "missing"},
		{`dielectric_thickness = "1.6 mm"`, `dielectric_thickness = "1.6 kg"`, "build.dielectric_thickness", "want a number"},
	}
	for _, c := range cases {
		_, err := ParseBuiltDesign([]byte(strings.Replace(boardDesign, c.old, c.new, 1)), "board.toml")
		var ke *KeyError
		if !errors.As(err, &ke) || ke.Key != c.key || !strings.Contains(err.Error(), c.says) {
			t.Errorf("%s: error %v, want a KeyError on %s saying %q", c.new, err, c.key, c.says)
		}
	}
}

func TestFringeCorrectionKey(t *testing.T) {
	t.Parallel()
	for _, v := range []string{"true", `"palmer"`, `"Palmer"`} {
		b, err := ParseBuiltDesign([]byte(boardDesign+"fringe_correction = "+v+"\n"), "board.toml")
		if err != nil {
			t.Fatal(err)
		}
		if bench(t, b).Fringe != "palmer" {
			t.Errorf("fringe_correction = %s: %q", v, bench(t, b).Fringe)
		}
	}
	b, err := ParseBuiltDesign([]byte(boardDesign+"fringe_correction = false\n"), "board.toml")
	if err != nil || bench(t, b).Fringe != "none" {
		t.Errorf("fringe_correction = false: %v %v", err, b)
	}
	if _, err := ParseBuiltDesign([]byte(boardDesign+`fringe_correction = "kirchhoff"`+"\n"), "board.toml"); err == nil || !strings.Contains(err.Error(), "allowed: none, palmer") {
		t.Errorf("kirchhoff: %v", err)
	}
}
