package design

import (
	"fmt"
	"maps"
	"slices"
	"sort"
	"strings"

	"n2pulse/kinetics/build"
	"n2pulse/units"
)

// BuildKeys returns the keys of the [build] section of a design file, sorted.
func BuildKeys() []string {
	var k []string
	for _, f := range fieldList {
		if isBuildKey(f.key) {
			k = append(k, f.key)
		}
	}
	sort.Strings(k)
	return k
}

// BuildKeyHelp returns the one-line description of a [build] key and whether it exists.
func BuildKeyHelp(key string) (string, bool) {
	if f, ok := fieldIndex[key]; ok && isBuildKey(key) {
		return f.help, true
	}
	return "", false
}

// Built is a design read together with its [build] section. The bench report of the
// stresses is physics: kinetics.Bench gives it.
type Built struct {
	Design  *Design    // the design; its Build and Derived are those of the file too
	Spec    build.Spec // the [build] section as given, in SI (a copy of Design.Build)
	Derived []string   // design keys whose values came from the build, not the file (as Design.Derived)
}

// ParseBuiltDesign decodes a TOML design that may describe the laser as built: a [build]
// section of plates, dielectric, rails and switch gap gives the circuit keys the file leaves
// out (explicit circuit values win). Without a [build] section it reads the design like
// ParseDesign.
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
		if err = d.setValue(k, flat[k]); err != nil {
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
	derived, err := d.ApplyBuild(&d.Build)
	if err != nil {
		return nil, err
	}
	out.Derived = append(out.Derived, derived...)
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
// build s and returns the design keys it filled. Non-zero circuit values are kept: explicit
// values win over derived ones.
func (d *Design) ApplyBuild(s *build.Spec) ([]string, error) {
	b, err := build.Evaluate(*s, d.BenchConditions())
	if err != nil {
		return nil, fmt.Errorf("design: [build]: %w", err)
	}
	var derived []string
	for _, x := range derivable {
		if p := x.set(d); *p == 0 && x.get(b) > 0 {
			*p = x.get(b)
			derived = append(derived, x.key)
		}
	}
	return derived, nil
}

// BenchConditions returns the design values package build needs besides the build itself.
// The two that are physics, the gap capacitance and the effective lifetime of C(0), are left
// zero here (the circuit values the build derives do not depend on them); kinetics.Bench fills
// them for the full report of stresses.
func (d *Design) BenchConditions() build.Conditions {
	c := d.Circuit
	cond := build.Conditions{
		Transfer:           c.Topology == ChargeTransfer,
		ChargeVoltage:      c.ChargeVoltage,
		ChannelLength:      d.Channel.Length,
		ChannelGap:         d.Channel.Gap,
		Pressure:           d.Gas.Pressure,
		Temperature:        d.Gas.Temperature,
		Nitrogen:           d.Gas.Nitrogen,
		Shunt:              c.ShuntInductance > 0 || c.ShuntResistance > 0,
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
	got, err := d.ApplyBuild(&d.Build)
	if err != nil {
		d.Circuit, d.Switch.Gap = circuit, gap
		return err
	}
	d.Derived = append(derived, got...)
	return nil
}
