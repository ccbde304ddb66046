package kinetics

import (
	"fmt"
	"maps"
	"math"
	"slices"
	"sort"
	"strings"

	"n2pulse/kinetics/build"
	"n2pulse/kinetics/spectro"
	"n2pulse/units"
)

// buildField is one key of the [build] section of a design file.
type buildField struct {
	key      string
	dim      units.Dimension
	unit     string // SI unit shown in sweep headers ("" for a pure number or text)
	num      func(s *build.Spec) *float64
	str      func(s *build.Spec) *string
	choices  func() []string
	min, max float64 // allowed closed range in SI
	help     string
}

var buildFields = []buildField{
	{key: "build.switch_plate_length", dim: units.Length, unit: "m", num: func(s *build.Spec) *float64 { return &s.SwitchPlateLength }, min: 1e-3, max: 10, help: "switch-side capacitor plate, along the current away from the switch edge"},
	{key: "build.switch_plate_width", dim: units.Length, unit: "m", num: func(s *build.Spec) *float64 { return &s.SwitchPlateWidth }, min: 1e-3, max: 10, help: "switch-side capacitor plate, along the switch edge"},
	{key: "build.channel_plate_length", dim: units.Length, unit: "m", num: func(s *build.Spec) *float64 { return &s.ChannelPlateLength }, min: 1e-3, max: 10, help: "channel-side capacitor plate, along the current away from the rails"},
	{key: "build.channel_plate_width", dim: units.Length, unit: "m", num: func(s *build.Spec) *float64 { return &s.ChannelPlateWidth }, min: 1e-3, max: 10, help: "channel-side capacitor plate, along the rails"},
	{key: "build.dielectric", str: func(s *build.Spec) *string { return &s.Dielectric }, choices: build.DielectricKeys, help: "dielectric preset between the plates"},
	{key: "build.dielectric_thickness", dim: units.Length, unit: "m", num: func(s *build.Spec) *float64 { return &s.DielectricThickness }, min: 1e-6, max: 0.05, help: "dielectric thickness between the plates"},
	{key: "build.permittivity", dim: units.Dimensionless, num: func(s *build.Spec) *float64 { return &s.Permittivity }, min: 1, max: 1e4, help: "relative permittivity (overrides the preset)"},
	{key: "build.dielectric_strength", dim: units.ElectricField, unit: "V/m", num: func(s *build.Spec) *float64 { return &s.DielectricStrength }, min: 1e5, max: 1e10, help: "short-time dielectric strength (overrides the preset)"},
	{key: "build.fringe_correction", str: func(s *build.Spec) *string { return (*string)(&s.Fringe) }, choices: func() []string { return []string{string(build.NoFringe), string(build.Palmer)} }, help: "edge-field correction of the plate capacitance: \"none\" or \"palmer\" (true means palmer)"},
	{key: "build.rail_length", dim: units.Length, unit: "m", num: func(s *build.Spec) *float64 { return &s.RailLength }, min: 1e-3, max: 10, help: "electrode rail length (default: channel.length)"},
	{key: "build.rail_height", dim: units.Length, unit: "m", num: func(s *build.Spec) *float64 { return &s.RailHeight }, min: 0, max: 0.5, help: "rail height from the plate to the discharge"},
	{key: "build.rail_gap", dim: units.Length, unit: "m", num: func(s *build.Spec) *float64 { return &s.RailGap }, min: 1e-4, max: 0.2, help: "rail separation (default: channel.gap)"},
	{key: "build.switch_gap", dim: units.Length, unit: "m", num: func(s *build.Spec) *float64 { return &s.SwitchGap }, min: 1e-5, max: 0.1, help: "spark-gap length (also sets switch.gap)"},
	{key: "build.switch_own_inductance", dim: units.Inductance, unit: "H", num: func(s *build.Spec) *float64 { return &s.SwitchOwnInductance }, min: 0, max: 1e-5, help: "inductance of the spark channel and its leads, added to the switch loop"},
	{key: "build.switch_gas", str: func(s *build.Spec) *string { return &s.SwitchGas }, choices: func() []string { return []string{"air", "nitrogen"} }, help: "gas in the spark gap"},
	{key: "build.secondary_emission", dim: units.Dimensionless, num: func(s *build.Spec) *float64 { return &s.SecondaryEmission }, min: 1e-6, max: 0.9, help: "secondary-emission coefficient γ of the channel cathode (default: copper)"},
}

// BuildKeys returns the keys of the [build] section of a design file, sorted.
func BuildKeys() []string {
	k := make([]string, 0, len(buildFields))
	for _, f := range buildFields {
		k = append(k, f.key)
	}
	sort.Strings(k)
	return k
}

// BuildKeyHelp returns the one-line description of a [build] key and whether it exists.
func BuildKeyHelp(key string) (string, bool) {
	for _, f := range buildFields {
		if f.key == key {
			return f.help, true
		}
	}
	return "", false
}

var buildIndex = func() map[string]*buildField {
	m := make(map[string]*buildField, len(buildFields))
	for i := range buildFields {
		m[buildFields[i].key] = &buildFields[i]
	}
	return m
}()

// setBuild assigns one decoded TOML value of the [build] section (or the text of Set).
func setBuild(s *build.Spec, key string, v any) error {
	f := buildIndex[key]
	if f == nil {
		return &KeyError{Key: key, Problem: "unknown key" + suggest(key)}
	}
	if on, isBool := v.(bool); isBool && key == "build.fringe_correction" {
		*f.str(s) = string(build.NoFringe)
		if on {
			*f.str(s) = string(build.Palmer)
		}
		return nil
	}
	if f.str != nil {
		t, ok := v.(string)
		if !ok {
			return &KeyError{Key: key, Value: fmt.Sprint(v), Problem: "want text in quotes"}
		}
		c, err := choose(key, t, f.choices())
		if err != nil {
			return err
		}
		*f.str(s) = c
		return nil
	}
	var x float64
	given := fmt.Sprint(v)
	switch y := v.(type) {
	case int64:
		x = float64(y)
	case float64:
		x = y
	case string:
		p, err := units.Parse(strings.TrimSpace(y), f.dim)
		if err != nil {
			return &KeyError{Key: key, Value: y, Problem: fmt.Sprintf("%v (want a number in %s or with a unit)", strings.TrimPrefix(err.Error(), "units: "), f.dim)}
		}
		x = p
	default:
		return &KeyError{Key: key, Value: given, Problem: "want a number or a quoted value with a unit"}
	}
	if _, text := v.(string); !text {
		if err := bareNumber(key, f.dim, x); err != nil {
			return err
		}
	}
	if math.IsNaN(x) || x < f.min || x > f.max {
		return &KeyError{Key: key, Value: given, Problem: fmt.Sprintf("out of range: allowed %g to %g %s", f.min, f.max, f.dim)}
	}
	*f.num(s) = x
	return nil
}

// Built is a design read together with its [build] section.
type Built struct {
	Design  *Design      // the design; its Build and Derived are those of the file too
	Spec    build.Spec   // the [build] section as given, in SI (a copy of Design.Build)
	Bench   *build.Bench // derived circuit values, stresses and warnings
	Derived []string     // design keys whose values came from the build, not the file (as Design.Derived)
}

// ParseBuiltDesign decodes a TOML design that may describe the laser as built: a [build]
// section of plates, dielectric, rails and switch gap gives the circuit keys the file leaves
// out (explicit circuit values win). Without a [build] section it reads the design like
// ParseDesign and rates the stresses the circuit values allow.
func ParseBuiltDesign(b []byte, name string) (*Built, error) {
	flat, err := decodeFlat(b, name)
	if err != nil {
		return nil, err
	}
	out, err := parseBuilt(flat)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", name, err)
	}
	return out, nil
}

// derivable maps the design keys the build can give to the build's values.
var derivable = []struct {
	key string
	get func(b *build.Bench) float64
	set func(d *Design) *float64
}{
	{"circuit.switch_capacitance", func(b *build.Bench) float64 { return b.DerivedSwitchCapacitance }, func(d *Design) *float64 { return &d.Circuit.SwitchCapacitance }},
	{"circuit.channel_capacitance", func(b *build.Bench) float64 { return b.DerivedChannelCapacitance }, func(d *Design) *float64 { return &d.Circuit.ChannelCapacitance }},
	{"circuit.switch_inductance", func(b *build.Bench) float64 { return b.DerivedSwitchInductance }, func(d *Design) *float64 { return &d.Circuit.SwitchInductance }},
	{"circuit.channel_inductance", func(b *build.Bench) float64 { return b.DerivedChannelInductance }, func(d *Design) *float64 { return &d.Circuit.ChannelInductance }},
}

// parseBuilt reads a flattened design with an optional build section.
func parseBuilt(flat map[string]any) (*Built, error) {
	keys := slices.Sorted(maps.Keys(flat))
	d := Defaults()
	d.given = make(map[string]bool, len(flat))
	out := &Built{Design: d}
	for _, k := range keys {
		var err error
		d.given[k] = true
		if strings.HasPrefix(k, "build.") {
			err = setBuild(&d.Build, k, flat[k])
		} else {
			err = d.setValue(k, flat[k])
		}
		if err != nil {
			return nil, err
		}
	}
	for _, k := range requiredKeys {
		if _, ok := flat[k]; !ok {
			return nil, &KeyError{Key: k, Problem: "missing: every design must give it"}
		}
	}
	if err := d.BalanceMixture(keys); err != nil {
		return nil, err
	}
	if _, ok := flat["switch.gap"]; !ok && d.Build.SwitchGap > 0 {
		d.Switch.Gap = d.Build.SwitchGap
		out.Derived = append(out.Derived, "switch.gap")
	}
	for _, x := range derivable {
		_, given := flat[x.key]
		plates := d.Build.HasSwitchPlates()
		if strings.Contains(x.key, "channel_") {
			plates = d.Build.HasChannelPlates()
		}
		if !given && !plates {
			return nil, &KeyError{Key: x.key, Problem: "missing: give it, or describe the capacitor plates and dielectric in [build]"}
		}
	}
	bench, derived, err := d.ApplyBuild(&d.Build)
	if err != nil {
		return nil, err
	}
	out.Bench, out.Derived = bench, append(out.Derived, derived...)
	out.Spec, d.Derived = d.Build, append([]string(nil), out.Derived...)
	if err := d.Validate(); err != nil {
		return nil, err
	}
	for _, x := range derivable {
		if err := fieldIndex[x.key].setNumber(d, *x.set(d), units.Format(*x.set(d), fieldIndex[x.key].unit)+" (from [build])"); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// ApplyBuild fills the design's zero circuit values (capacitances, loop inductances) from the
// build s and returns the bench report and the design keys it filled. Non-zero circuit values
// are kept: explicit values win over derived ones.
func (d *Design) ApplyBuild(s *build.Spec) (*build.Bench, []string, error) {
	b, err := build.Evaluate(*s, d.benchConditions())
	if err != nil {
		return nil, nil, fmt.Errorf("design: [build]: %w", err)
	}
	var derived []string
	for _, x := range derivable {
		if p := x.set(d); *p == 0 && x.get(b) > 0 {
			*p = x.get(b)
			derived = append(derived, x.key)
		}
	}
	return b, derived, nil
}

// Bench rates the stresses of a design given by circuit values only (no [build] section):
// channel breakdown, shunt, switch against the upper-level lifetime.
func (d *Design) Bench() (*build.Bench, error) {
	b, err := build.Evaluate(build.Spec{}, d.benchConditions())
	if err != nil {
		return nil, fmt.Errorf("design: %w", err)
	}
	return b, nil
}

func (d *Design) benchConditions() build.Conditions {
	c := d.Circuit
	cond := build.Conditions{
		Transfer:           c.Topology == ChargeTransfer,
		ChargeVoltage:      c.ChargeVoltage,
		ChannelLength:      d.Channel.Length,
		ChannelGap:         d.Channel.Gap,
		GapCapacitance:     gapCapacitance(d.Channel),
		Pressure:           d.Gas.Pressure,
		Temperature:        d.Gas.Temperature,
		Nitrogen:           d.Gas.Nitrogen,
		Shunt:              c.ShuntInductance > 0 || c.ShuntResistance > 0,
		UpperLifetime:      d.EffectiveUpperLifetime(),
		SwitchCapacitance:  c.SwitchCapacitance,
		ChannelCapacitance: c.ChannelCapacitance,
		SwitchInductance:   c.SwitchInductance,
		ChannelInductance:  c.ChannelInductance,
	}
	switch d.Switch.Model {
	case RompeWeizelSwitch:
		cond.SwitchGap, cond.SwitchPressure = d.Switch.Gap, d.Switch.Pressure
	case ExponentialSwitch:
		cond.SwitchRiseTime = d.Switch.RiseTime
	}
	return cond
}

// fallbackUpperLifetime is the radiative lifetime of C(0) used when package spectro cannot
// give one: 40.8 ns, Capitelli et al., Plasma Kinetics in Atmospheric Gases (Springer 2000),
// p. 157, via air-plasma mechanism files (seen, secondary).
const fallbackUpperLifetime = 40.8e-9

// EffectiveUpperLifetime returns the lifetime of C(0) in the design's gas without electrons
// or stimulated emission, 1/(1/τ_C + Σk_q·N) = τ_C/(1 + p/p_q) [s] (Stern–Volmer), with τ_C
// from spectroscopy.upper_lifetime, else package spectro, else 40.8 ns.
func (d *Design) EffectiveUpperLifetime() float64 {
	return 1 / d.Levels.UpperDecayRate(d.radiativeUpperLifetime(), d.Gas)
}

// radiativeUpperLifetime is τ_C, the radiative lifetime of C(0) [s]: spectroscopy.upper_lifetime,
// else package spectro at the design's p and T, else 40.8 ns.
func (d *Design) radiativeUpperLifetime() float64 {
	if tau := d.Spectroscopy.UpperLifetime; tau != 0 {
		return tau
	}
	if lp, err := spectro.Laser(d.Gas.Pressure, d.Gas.Temperature); err == nil && lp.UpperLifetime > 0 {
		return lp.UpperLifetime
	}
	return fallbackUpperLifetime
}

// hasBuild reports whether a flattened design has a [build] section: the hook by which
// ParseDesign hands such a design to parseBuilt.
func hasBuild(flat map[string]any) bool {
	for k := range flat {
		if strings.HasPrefix(k, "build.") {
			return true
		}
	}
	return false
}

// isBuildKey reports whether key belongs to the [build] section.
func isBuildKey(key string) bool { return strings.HasPrefix(key, "build.") }

// rederivedBy reports whether a change of key can change the circuit values derived from the
// build: any build key, and the channel length and gap (the rails default to them).
func rederivedBy(key string) bool {
	return isBuildKey(key) || key == "channel.length" || key == "channel.gap"
}

// rederive recomputes the derived circuit values from d.Build after a key has changed. A
// derivable circuit key is derived when it is listed in d.Derived or is zero; the others were
// given and win. switch.gap follows build.switch_gap unless switch.gap was given. On an
// inconsistent build (a dielectric without its thickness, say) the design keeps its previous
// circuit values and the error is returned; Validate reports it too.
func (d *Design) rederive() error {
	if d.Build == (build.Spec{}) {
		return nil
	}
	circuit, gap := d.Circuit, d.Switch.Gap
	var derived []string
	if d.Build.SwitchGap > 0 && !d.given["switch.gap"] {
		d.Switch.Gap = d.Build.SwitchGap
		derived = append(derived, "switch.gap")
	}
	for _, x := range derivable {
		if slices.Contains(d.Derived, x.key) {
			*x.set(d) = 0
		}
	}
	_, got, err := d.ApplyBuild(&d.Build)
	if err != nil {
		d.Circuit, d.Switch.Gap = circuit, gap
		return err
	}
	d.Derived = append(derived, got...)
	return nil
}

// setBuildText assigns a build key from text, as on the command line; build.fringe_correction
// also takes true (palmer) and false (none), as in a design file.
func (d *Design) setBuildText(key, value string) error {
	var v any = strings.TrimSpace(value)
	if key == "build.fringe_correction" {
		switch strings.ToLower(strings.TrimSpace(value)) {
		case "true":
			v = true
		case "false":
			v = false
		}
	}
	return setBuild(&d.Build, key, v)
}

// buildString lists the build keys as dotted key = value lines, in SI.
func (d *Design) buildString(b *strings.Builder) {
	for _, f := range buildFields {
		if f.str != nil {
			fmt.Fprintf(b, "%s = %q\n", f.key, *f.str(&d.Build))
		} else {
			fmt.Fprintf(b, "%s = %g\n", f.key, *f.num(&d.Build))
		}
	}
}
