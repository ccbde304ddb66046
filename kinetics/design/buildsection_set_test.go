package design

import (
	"errors"
	"math"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/build"
	"n2pulse/units"
)

func parseBoard(t *testing.T, text string) *Design {
	t.Helper()
	d, err := ParseDesign([]byte(text), "board.toml")
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// permittivity returns ε_r of a dielectric preset (data/materials.toml names its source).
func permittivity(t *testing.T, key string) float64 {
	t.Helper()
	p, err := build.DielectricPreset(key)
	if err != nil {
		t.Fatal(err)
	}
	return p.Permittivity
}

func closeTo(t *testing.T, what string, got, want, rel float64) {
	t.Helper()
	if !scalar.EqualWithinAbsOrRel(got, want, 0, rel) {
		t.Errorf("%s = %.10g, want %.10g (rel %.1g)", what, got, want, rel)
	}
}

// The board design keeps its [build] section: the values as given, in SI.
func TestDesignKeepsBuild(t *testing.T) {
	t.Parallel()
	d := parseBoard(t, boardDesign)
	if d.Build.SwitchPlateWidth != 0.25 || d.Build.DielectricThickness != 1.6e-3 || d.Build.Dielectric != "fr4" {
		t.Errorf("build %+v", d.Build)
	}
	want := []string{"switch.gap", "circuit.switch_capacitance", "circuit.channel_capacitance", "circuit.switch_inductance", "circuit.channel_inductance"}
	if !slices.Equal(d.Derived, want) {
		t.Errorf("derived %v, want %v", d.Derived, want)
	}
	for key, want := range map[string]float64{"build.switch_plate_width": 0.25, "build.rail_height": 5e-3, "build.switch_own_inductance": 5e-9, "build.permittivity": 0} {
		if got, err := d.Get(key); err != nil || got != want {
			t.Errorf("Get(%s) = %g, %v; want %g", key, got, err, want)
		}
	}
}

// A sweep over the switch-side plate width, as study does it (Clone, Set, Validate): C₁
// follows the parallel-plate formula C = ε₀ε_r·l·w/d, linear in w, and the plate loop
// L_s = μ₀·d·l/(3w) + 5 nH falls as 1/w; the channel side does not move. Parallel-plate
// formula: Serway & Jewett, Physics for Scientists and Engineers, capacitance chapter (from
// memory), as in package build's worked examples; the edge-fed loop L'·l/3 is checked there
// against the integral of ½L'I².
func TestSetBuildPlateWidthScales(t *testing.T) {
	t.Parallel()
	base := parseBoard(t, boardDesign)
	c2, lc := base.Circuit.ChannelCapacitance, base.Circuit.ChannelInductance
	eps := permittivity(t, "fr4") // the design's dielectric preset
	for _, w := range []float64{0.05, 0.10, 0.12, 0.18, 0.25, 0.40} {
		d := base.Clone()
		if err := d.Set("build.switch_plate_width", units.Format(w, "m")); err != nil {
			t.Fatal(err)
		}
		if err := d.Validate(); err != nil {
			t.Fatal(err)
		}
		closeTo(t, "C₁", d.Circuit.SwitchCapacitance, units.VacuumPermittivity*eps*0.15*w/1.6e-3, 1e-12)
		closeTo(t, "C₁/w ratio", d.Circuit.SwitchCapacitance/base.Circuit.SwitchCapacitance, w/0.25, 1e-12)
		closeTo(t, "L_s", d.Circuit.SwitchInductance, units.VacuumPermeability*1.6e-3*0.15/(3*w)+5e-9, 1e-12)
		if d.Circuit.ChannelCapacitance != c2 || d.Circuit.ChannelInductance != lc {
			t.Errorf("w = %g: channel side moved: %g F, %g H", w, d.Circuit.ChannelCapacitance, d.Circuit.ChannelInductance)
		}
		if got, _ := d.Get("build.switch_plate_width"); math.Abs(got-w) > 1e-15 {
			t.Errorf("Get(build.switch_plate_width) = %g, want %g", got, w)
		}
		if !slices.Contains(d.Derived, "circuit.switch_capacitance") {
			t.Errorf("C₁ no longer derived: %v", d.Derived)
		}
	}
	if base.Build.SwitchPlateWidth != 0.25 || base.Circuit.SwitchCapacitance != units.VacuumPermittivity*eps*0.15*0.25/1.6e-3 {
		t.Errorf("Clone shares the build: base width %g, C₁ %g", base.Build.SwitchPlateWidth, base.Circuit.SwitchCapacitance)
	}
}

// The dielectric thickness enters both capacitances as 1/d and the plate loops as d.
func TestSetBuildThickness(t *testing.T) {
	t.Parallel()
	d := parseBoard(t, boardDesign)
	c1, c2 := d.Circuit.SwitchCapacitance, d.Circuit.ChannelCapacitance
	if err := d.Set("build.dielectric_thickness", "0.8 mm"); err != nil {
		t.Fatal(err)
	}
	closeTo(t, "C₁(d/2)", d.Circuit.SwitchCapacitance, 2*c1, 1e-12)
	closeTo(t, "C₂(d/2)", d.Circuit.ChannelCapacitance, 2*c2, 1e-12)
	// ε₀ε_r·l·w/d with the pet preset after a preset change.
	if err := d.Set("build.dielectric", "PET"); err != nil {
		t.Fatal(err)
	}
	if d.Build.Dielectric != "pet" {
		t.Errorf("preset %q, want pet", d.Build.Dielectric)
	}
	closeTo(t, "C₁(pet)", d.Circuit.SwitchCapacitance, units.VacuumPermittivity*permittivity(t, "pet")*0.15*0.25/0.8e-3, 1e-12)
}

// Explicit circuit values win over the build; setting a derived key makes it explicit.
func TestSetBuildExplicitWins(t *testing.T) {
	t.Parallel()
	text := strings.Replace(boardDesign, `shunt_inductance = "1 uH"`, `shunt_inductance = "1 uH"`+"\nswitch_inductance = \"20 nH\"", 1)
	d := parseBoard(t, text)
	if err := d.Set("build.switch_plate_width", "10 cm"); err != nil {
		t.Fatal(err)
	}
	if d.Circuit.SwitchInductance != 20e-9 {
		t.Errorf("explicit L_s replaced: %g", d.Circuit.SwitchInductance)
	}
	closeTo(t, "C₁", d.Circuit.SwitchCapacitance, units.VacuumPermittivity*permittivity(t, "fr4")*0.15*0.10/1.6e-3, 1e-12)

	if err := d.Set("circuit.switch_capacitance", "2 nF"); err != nil {
		t.Fatal(err)
	}
	if slices.Contains(d.Derived, "circuit.switch_capacitance") {
		t.Errorf("C₁ still derived after Set: %v", d.Derived)
	}
	if err := d.Set("build.switch_plate_width", "30 cm"); err != nil {
		t.Fatal(err)
	}
	if d.Circuit.SwitchCapacitance != 2e-9 {
		t.Errorf("explicit C₁ replaced by the build: %g", d.Circuit.SwitchCapacitance)
	}
	if err := d.Validate(); err != nil {
		t.Fatal(err)
	}
}

// The rails default to the channel's length and gap: a longer channel lowers the rail loop
// μ₀·g·h/L of the derived channel inductance.
func TestSetChannelLengthRederivesRails(t *testing.T) {
	t.Parallel()
	d := parseBoard(t, boardDesign)
	plate := units.VacuumPermeability * 1.6e-3 * 0.15 / (3 * 0.25)
	if err := d.Set("channel.length", "50 cm"); err != nil {
		t.Fatal(err)
	}
	closeTo(t, "L_c", d.Circuit.ChannelInductance, plate+units.VacuumPermeability*2e-3*5e-3/0.5, 1e-12)
	if err := d.Set("build.rail_length", "25 cm"); err != nil {
		t.Fatal(err)
	}
	closeTo(t, "L_c(rail 25 cm)", d.Circuit.ChannelInductance, plate+units.VacuumPermeability*2e-3*5e-3/0.25, 1e-12)
}

// switch.gap follows build.switch_gap unless the design gives it.
func TestSetBuildSwitchGap(t *testing.T) {
	t.Parallel()
	d := parseBoard(t, boardDesign)
	if err := d.Set("build.switch_gap", "4 mm"); err != nil {
		t.Fatal(err)
	}
	if d.Switch.Gap != 4e-3 || !slices.Contains(d.Derived, "switch.gap") {
		t.Errorf("switch.gap %g, derived %v", d.Switch.Gap, d.Derived)
	}
	if err := d.Set("switch.gap", "2 mm"); err != nil {
		t.Fatal(err)
	}
	if err := d.Set("build.switch_gap", "5 mm"); err != nil {
		t.Fatal(err)
	}
	if d.Switch.Gap != 2e-3 || slices.Contains(d.Derived, "switch.gap") {
		t.Errorf("explicit switch.gap lost: %g, derived %v", d.Switch.Gap, d.Derived)
	}
}

// A design without [build] takes build keys one at a time; until the build is consistent
// Validate names what is missing, and the explicit circuit values stay.
func TestSetBuildOnPlainDesign(t *testing.T) {
	t.Parallel()
	d := ExampleDesign()
	c1 := d.Circuit.SwitchCapacitance
	if err := d.Set("build.dielectric", "fr4"); err != nil {
		t.Fatal(err)
	}
	if err := d.Validate(); err == nil || !strings.Contains(err.Error(), "build.dielectric_thickness") {
		t.Errorf("dielectric without thickness: %v", err)
	}
	for _, kv := range [][2]string{{"build.dielectric_thickness", "1 mm"}, {"build.switch_plate_length", "10 cm"}, {"build.switch_plate_width", "10 cm"}} {
		if err := d.Set(kv[0], kv[1]); err != nil {
			t.Fatal(err)
		}
	}
	if err := d.Validate(); err != nil {
		t.Fatal(err)
	}
	if d.Circuit.SwitchCapacitance != c1 || len(d.Derived) != 0 {
		t.Errorf("explicit C₁ %g replaced (%g), derived %v", c1, d.Circuit.SwitchCapacitance, d.Derived)
	}
	b, err := build.Evaluate(d.Build, d.BenchConditions())
	if err != nil {
		t.Fatal(err)
	}
	closeTo(t, "bench C₁ from the plates", b.DerivedSwitchCapacitance, units.VacuumPermittivity*permittivity(t, "fr4")*0.1*0.1/1e-3, 1e-12)
}

func TestSetBuildErrors(t *testing.T) {
	t.Parallel()
	d := parseBoard(t, boardDesign)
	cases := []struct{ key, value, says string }{
		{"build.rail_hieght", "5 mm", "did you mean build.rail_height"},
		{"build.dielectric_thickness", "-1 mm", "out of range: allowed 1e-06 to 0.05"},
		{"build.dielectric_thickness", "1.6 kg", "want a number"},
		{"build.dielectric", "cardboard", "allowed: "},
		{"build.fringe_correction", "kirchhoff", "allowed: none, palmer"},
		{"build.permittivity", "0.5", "out of range"},
	}
	before := d.String()
	for _, c := range cases {
		err := d.Set(c.key, c.value)
		var ke *KeyError
		if !errors.As(err, &ke) || ke.Key != c.key || !strings.Contains(err.Error(), c.says) {
			t.Errorf("Set(%s, %q): %v, want a KeyError saying %q", c.key, c.value, err, c.says)
		}
	}
	if d.String() != before {
		t.Error("a rejected Set changed the design")
	}
	if _, err := d.Get("build.dielectric"); err == nil || !strings.Contains(err.Error(), "text key") {
		t.Errorf("Get(build.dielectric): %v", err)
	}
	if _, err := d.Get("biuld.rail_height"); err == nil || !strings.Contains(err.Error(), "did you mean build.rail_height") {
		t.Errorf("Get(biuld.rail_height): %v", err)
	}
	if err := d.Set("build.fringe_correction", "true"); err != nil || d.Build.Fringe != "palmer" {
		t.Errorf("fringe true: %v, %q", err, d.Build.Fringe)
	}
}

func TestBuildKeysListed(t *testing.T) {
	t.Parallel()
	keys := Keys()
	for _, k := range BuildKeys() {
		if !slices.Contains(keys, k) {
			t.Errorf("Keys lacks %s", k)
		}
	}
	if !slices.IsSorted(keys) {
		t.Error("Keys not sorted")
	}
	for k, want := range map[string]string{"build.switch_plate_width": "m", "build.switch_own_inductance": "H", "build.dielectric_strength": "V/m", "build.permittivity": "", "build.dielectric": ""} {
		if u, ok := KeyUnit(k); !ok || u != want {
			t.Errorf("KeyUnit(%s) = %q, %v; want %q", k, u, ok, want)
		}
	}
	d := parseBoard(t, boardDesign)
	s := d.String()
	for _, want := range []string{"build.switch_plate_width = 0.25\n", `build.dielectric = "fr4"` + "\n", "build.permittivity = 0\n"} {
		if !strings.Contains(s, want) {
			t.Errorf("String lacks %q", want)
		}
	}
	c := d.Clone()
	if err := c.Set("build.switch_plate_width", "20 cm"); err != nil {
		t.Fatal(err)
	}
	if c.String() == s || d.String() != s {
		t.Error("String does not follow the build, or Clone shares it")
	}
	if err := c.Set("circuit.channel_capacitance", "1 nF"); err != nil {
		t.Fatal(err)
	}
	if !slices.Contains(d.Derived, "circuit.channel_capacitance") {
		t.Errorf("Clone shares Derived: %v", d.Derived)
	}
}

// BenchmarkSetBuildKey measures one Set of a build key on a built design: the parse of the
// value, the bench evaluation and the re-derived circuit.
func BenchmarkSetBuildKey(b *testing.B) {
	d, err := ParseDesign([]byte(boardDesign), "board.toml")
	if err != nil {
		b.Fatal(err)
	}
	widths := []string{"10 cm", "25 cm"}
	for i := 0; b.Loop(); i++ {
		if err := d.Set("build.switch_plate_width", widths[i%2]); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "sets/s")
}
