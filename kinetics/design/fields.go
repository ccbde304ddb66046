package design

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"
	"strconv"
	"strings"

	"n2pulse/kinetics/build"
	"n2pulse/kinetics/swarm"
	"n2pulse/units"
)

// field is one key of a design file, design and [build] keys alike: its dotted name, its
// dimension, where it lives in a Design and the range of values that make physical sense.
type field struct {
	key      string
	dim      units.Dimension
	unit     string // unit shown in messages and sweep headers
	num      func(d *Design) *float64
	str      func(d *Design) *string
	choices  func() []string   // allowed values of a string field
	aliases  map[string]string // other words for a choice (build.fringe_correction: true, false)
	min, max float64           // allowed closed range of a numeric field (in SI)
	zeroOK   bool              // zero is also allowed (meaning "none" or "computed")
	integer  bool
	help     string
}

// crossSectionChoices are the values of numerics.cross_sections: "default" and the shipped sets.
func crossSectionChoices() []string { return append([]string{"default"}, swarm.Sets()...) }

// list returns the fixed choices of a string field.
func list(c ...string) func() []string { return func() []string { return c } }

var fieldList = []field{
	{key: "name", str: func(d *Design) *string { return &d.Name }, help: "short name of the design"},
	{key: "description", str: func(d *Design) *string { return &d.Description }, help: "free text"},

	{key: "channel.length", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Channel.Length }, min: 1e-3, max: 10, help: "electrode length along the optical axis"},
	{key: "channel.gap", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Channel.Gap }, min: 1e-4, max: 0.2, help: "electrode separation"},
	{key: "channel.width", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Channel.Width }, min: 1e-5, max: 0.2, help: "discharge width across the rails"},
	{key: "channel.electrode_width", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Channel.ElectrodeWidth }, min: 1e-5, max: 1, zeroOK: true, help: "electrode face width for the gap capacitance (0: the discharge width)"},
	{key: "channel.stray_capacitance", dim: units.Capacitance, unit: "F", num: func(d *Design) *float64 { return &d.Channel.StrayCapacitance }, min: 0, max: 1e-6, help: "capacitance in parallel with the gap"},
	{key: "channel.aperture", dim: units.Area, unit: "m²", num: func(d *Design) *float64 { return &d.Channel.Aperture }, min: 1e-10, max: 1e-2, zeroOK: true, help: "optical cross-section (0: gap × width)"},

	{key: "gas.pressure", dim: units.Pressure, unit: "Pa", num: func(d *Design) *float64 { return &d.Gas.Pressure }, min: 10, max: 1e6, help: "gas pressure"},
	{key: "gas.temperature", dim: units.Temperature, unit: "K", num: func(d *Design) *float64 { return &d.Gas.Temperature }, min: 50, max: 1000, help: "gas temperature"},
	{key: "gas.nitrogen", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Gas.Nitrogen }, min: 0, max: 1, help: "N₂ mole fraction"},
	{key: "gas.oxygen", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Gas.Oxygen }, min: 0, max: 1, help: "O₂ mole fraction"},
	{key: "gas.helium", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Gas.Helium }, min: 0, max: 1, help: "He mole fraction"},

	{key: "circuit.topology", str: func(d *Design) *string { return (*string)(&d.Circuit.Topology) }, choices: list(string(Blumlein), string(ChargeTransfer)), help: "circuit topology"},
	{key: "circuit.charge_voltage", dim: units.Voltage, unit: "V", num: func(d *Design) *float64 { return &d.Circuit.ChargeVoltage }, min: 100, max: 1e6, help: "charging voltage V₀"},
	{key: "circuit.switch_capacitance", dim: units.Capacitance, unit: "F", num: func(d *Design) *float64 { return &d.Circuit.SwitchCapacitance }, min: 1e-13, max: 1e-4, help: "switch-side capacitor (Blumlein C₁, transfer storage)"},
	{key: "circuit.channel_capacitance", dim: units.Capacitance, unit: "F", num: func(d *Design) *float64 { return &d.Circuit.ChannelCapacitance }, min: 1e-13, max: 1e-4, help: "channel-side capacitor (Blumlein C₂, transfer peaking)"},
	{key: "circuit.switch_inductance", dim: units.Inductance, unit: "H", num: func(d *Design) *float64 { return &d.Circuit.SwitchInductance }, min: 1e-11, max: 1e-4, help: "switch loop inductance"},
	{key: "circuit.channel_inductance", dim: units.Inductance, unit: "H", num: func(d *Design) *float64 { return &d.Circuit.ChannelInductance }, min: 1e-11, max: 1e-4, help: "channel loop inductance"},
	{key: "circuit.shunt_inductance", dim: units.Inductance, unit: "H", num: func(d *Design) *float64 { return &d.Circuit.ShuntInductance }, min: 1e-9, max: 10, zeroOK: true, help: "inductor across the channel loop (0: none)"},
	{key: "circuit.shunt_resistance", dim: units.Resistance, unit: "Ω", num: func(d *Design) *float64 { return &d.Circuit.ShuntResistance }, min: 1e-2, max: 1e9, zeroOK: true, help: "resistor across the channel loop (0: none)"},

	{key: "switch.model", str: func(d *Design) *string { return (*string)(&d.Switch.Model) }, choices: list(string(IdealSwitch), string(ExponentialSwitch), string(RompeWeizelSwitch)), help: "switch model"},
	{key: "switch.on_resistance", dim: units.Resistance, unit: "Ω", num: func(d *Design) *float64 { return &d.Switch.OnResistance }, min: 0, max: 1e3, help: "resistance of the closed switch"},
	{key: "switch.off_resistance", dim: units.Resistance, unit: "Ω", num: func(d *Design) *float64 { return &d.Switch.OffResistance }, min: 1, max: 1e12, help: "resistance at closure (exponential and spark models)"},
	{key: "switch.rise_time", dim: units.Time, unit: "s", num: func(d *Design) *float64 { return &d.Switch.RiseTime }, min: 1e-12, max: 1e-6, help: "time constant of the exponential model"},
	{key: "switch.gap", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Switch.Gap }, min: 1e-5, max: 0.1, help: "spark length (Rompe–Weizel)"},
	{key: "switch.pressure", dim: units.Pressure, unit: "Pa", num: func(d *Design) *float64 { return &d.Switch.Pressure }, min: 100, max: 1e7, help: "spark-gap gas pressure (Rompe–Weizel)"},
	{key: "switch.spark_constant", dim: units.SparkConstant, unit: "Pa m² V⁻² s⁻¹", num: func(d *Design) *float64 { return &d.Switch.SparkConstant }, min: 1e-3, max: 1e6, help: "Rompe–Weizel constant a"},

	{key: "discharge.seed_density", dim: units.Density, unit: "m⁻³", num: func(d *Design) *float64 { return &d.Discharge.SeedDensity }, min: 1, max: 1e22, help: "preionisation electron density at closure"},
	{key: "discharge.recombination", dim: units.RateConstant, unit: "m³/s", num: func(d *Design) *float64 { return &d.Discharge.Recombination }, min: 0, max: 1e-10, help: "electron–ion recombination coefficient, one for every ion (0: each ion's published coefficient at T_e = ⅔ of the mean electron energy, weighted by the N₂⁺/N₄⁺/O₂⁺ shares)"},
	{key: "discharge.recombination_scale", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Discharge.RecombinationScale }, min: 0.1, max: 10, help: "factor on the computed per-ion recombination coefficients (estimate ×0.5–2: the fits are used far above the temperatures they were measured at); no effect when discharge.recombination is set"},

	{key: "levels.upper_quenching_nitrogen", dim: units.RateConstant, unit: "m³/s", num: func(d *Design) *float64 { return &d.Levels.UpperQuenchingNitrogen }, min: 0, max: 1e-14, help: "C(0) quenching by N₂"},
	{key: "levels.upper_quenching_oxygen", dim: units.RateConstant, unit: "m³/s", num: func(d *Design) *float64 { return &d.Levels.UpperQuenchingOxygen }, min: 0, max: 1e-14, help: "C(0) quenching by O₂"},
	{key: "levels.upper_quenching_helium", dim: units.RateConstant, unit: "m³/s", num: func(d *Design) *float64 { return &d.Levels.UpperQuenchingHelium }, min: 0, max: 1e-14, help: "C(0) quenching by He"},
	{key: "levels.upper_electron_mixing", dim: units.RateConstant, unit: "m³/s", num: func(d *Design) *float64 { return &d.Levels.UpperElectronMixing }, min: 0, max: 1e-10, help: "electron-induced loss of C(0) (no published value; free parameter)"},
	{key: "levels.upper_electron_scale", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Levels.UpperElectronScale }, min: 0, max: 10, help: "factor on the estimated electron collisions with C(0) (Born–Bethe superelastic C → B plus Lotz ionisation; range 0.5–2; 0: off)"},
	{key: "levels.upper_excitation_scale", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Levels.UpperExcitationScale }, min: 0.1, max: 10, help: "factor on the electron-impact excitation rate X → C³Πu of the swarm table where it pumps C (±30 %, Itikawa 2006; scales the pump only, not the electrons' energy distribution)"},
	{key: "levels.lower_excitation_scale", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Levels.LowerExcitationScale }, min: 0.1, max: 10, help: "factor on the electron-impact excitation rate X → B³Πg of the swarm table where it feeds B(0) and the manifold (±35 %, Itikawa 2006; scales the pump only)"},
	{key: "levels.upper_relaxation_nitrogen", dim: units.RateConstant, unit: "m³/s", num: func(d *Design) *float64 { return &d.Levels.UpperRelaxationNitrogen }, min: 0, max: 1e-14, help: "vibrational relaxation C(v=1) → C(0) by N₂ (0: C(v=1) left out)"},
	{key: "levels.upper_v1_quenching_nitrogen", dim: units.RateConstant, unit: "m³/s", num: func(d *Design) *float64 { return &d.Levels.UpperV1QuenchingNitrogen }, min: 0, max: 1e-14, help: "electronic quenching of C(v=1) by N₂"},
	{key: "levels.lower_lifetime", dim: units.Time, unit: "s", num: func(d *Design) *float64 { return &d.Levels.LowerLifetime }, min: 1e-9, max: 1e-3, help: "radiative lifetime of B(0)"},
	{key: "levels.lower_removal_nitrogen", dim: units.RateConstant, unit: "m³/s", num: func(d *Design) *float64 { return &d.Levels.LowerRemovalNitrogen }, min: 0, max: 1e-14, help: "removal of B(0) by N₂"},
	{key: "levels.lower_removal_oxygen", dim: units.RateConstant, unit: "m³/s", num: func(d *Design) *float64 { return &d.Levels.LowerRemovalOxygen }, min: 0, max: 1e-14, help: "removal of B(0) by O₂"},
	{key: "levels.manifold_share", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Levels.ManifoldShare }, min: 0, max: 1, help: "share of the B(v>0)/W/B′ manifold's relaxation by N₂ that ends in B(0) (no measured value; derived 0.25, range 0.05–0.37)"},
	{key: "levels.manifold_relaxation_nitrogen", dim: units.RateConstant, unit: "m³/s", num: func(d *Design) *float64 { return &d.Levels.ManifoldRelaxationNitrogen }, min: 0, max: 1e-14, help: "collisional relaxation of the B(v>0)/W/B′ manifold by N₂"},
	{key: "levels.manifold_relaxation_oxygen", dim: units.RateConstant, unit: "m³/s", num: func(d *Design) *float64 { return &d.Levels.ManifoldRelaxationOxygen }, min: 0, max: 1e-14, help: "removal of the B(v>0)/W/B′ manifold by O₂"},
	{key: "levels.recombination_upper_share", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Levels.RecombinationUpperShare }, min: 0, max: 1, help: "share of electron–N₄⁺ recombination that leaves N₂(C), taken into C(0) (0: no recombination products)"},
	{key: "levels.recombination_lower_share", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Levels.RecombinationLowerShare }, min: 0, max: 1, help: "share of electron–N₄⁺ recombination that leaves N₂(B), taken into the B(v>0)/W/B′ manifold"},
	{key: "levels.fast_heating_share", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Levels.FastHeatingShare }, min: 0, max: 1, help: "share of the electrons' electronic, dissociation and ionisation energy that heats the gas within the shot (estimate 0.1, range 0–0.3); the gas temperature lowers the gain cross section"},

	{key: "optics.rear_reflectivity", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Optics.RearReflectivity }, min: 0, max: 1, help: "power reflectivity at the rear end (z = 0)"},
	{key: "optics.front_reflectivity", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Optics.FrontReflectivity }, min: 0, max: 0.999, help: "power reflectivity at the output end (z = L)"},
	{key: "optics.loss", dim: units.Attenuation, unit: "m⁻¹", num: func(d *Design) *float64 { return &d.Optics.Loss }, min: 0, max: 100, help: "distributed loss"},
	{key: "optics.excitation_velocity", dim: units.Speed, unit: "m/s", num: func(d *Design) *float64 { return &d.Optics.ExcitationVelocity }, min: -1e12, max: math.Inf(1), help: `speed of the excitation front: "infinite" (simultaneous), "c", or a speed; negative runs from the output end`},

	{key: "spectroscopy.cross_section", dim: units.Area, unit: "m²", num: func(d *Design) *float64 { return &d.Spectroscopy.CrossSection }, min: 1e-24, max: 1e-14, zeroOK: true, help: "effective stimulated-emission cross section (0: computed)"},
	{key: "spectroscopy.degeneracy_ratio", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Spectroscopy.DegeneracyRatio }, min: 0.01, max: 100, zeroOK: true, help: "effective g_C/g_B (0: computed)"},
	{key: "spectroscopy.einstein_a00", dim: units.Frequency, unit: "s⁻¹", num: func(d *Design) *float64 { return &d.Spectroscopy.EinsteinA00 }, min: 1e5, max: 1e9, zeroOK: true, help: "Einstein A of the (0,0) band (0: computed)"},
	{key: "spectroscopy.upper_lifetime", dim: units.Time, unit: "s", num: func(d *Design) *float64 { return &d.Spectroscopy.UpperLifetime }, min: 1e-10, max: 1e-6, zeroOK: true, help: "radiative lifetime of C(0) (0: computed)"},
	{key: "spectroscopy.upper_share", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Spectroscopy.UpperShare }, min: 1e-3, max: 1, zeroOK: true, help: "fraction of C excitation into v = 0 (0: computed)"},
	{key: "spectroscopy.lower_share", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Spectroscopy.LowerShare }, min: 1e-3, max: 1, zeroOK: true, help: "fraction of B excitation into v = 0 (0: computed)"},
	{key: "spectroscopy.wavelength", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Spectroscopy.Wavelength }, min: 1e-7, max: 1e-6, zeroOK: true, help: "vacuum wavelength of the laser line (0: computed)"},

	{key: "numerics.cells", dim: units.Dimensionless, integer: true, min: 4, max: 20000, help: "cells along the channel"},
	{key: "numerics.end_time", dim: units.Time, unit: "s", num: func(d *Design) *float64 { return &d.Numerics.EndTime }, min: 1e-10, max: 1e-5, help: "end of the simulation after switch closure"},
	{key: "numerics.tolerance", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Numerics.Tolerance }, min: 1e-12, max: 1e-2, help: "relative tolerance of the circuit integrator"},
	{key: "numerics.swarm_table", str: func(d *Design) *string { return &d.Numerics.SwarmTable }, help: "path of a swarm table CSV (empty: built in, or solved for the mixture)"},
	{key: "numerics.cross_sections", str: func(d *Design) *string { return &d.Numerics.CrossSections }, choices: crossSectionChoices, help: "N₂ electron cross-section set of the swarm table (default: " + swarm.DefaultSet + "; phelps1985 and itikawa2006 are the swarm-checked sets)"},

	// The [build] section: the laser as built (see package build).
	{key: "build.switch_plate_length", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Build.SwitchPlateLength }, min: 1e-3, max: 10, help: "switch-side capacitor plate, along the current away from the switch edge"},
	{key: "build.switch_plate_width", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Build.SwitchPlateWidth }, min: 1e-3, max: 10, help: "switch-side capacitor plate, along the switch edge"},
	{key: "build.channel_plate_length", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Build.ChannelPlateLength }, min: 1e-3, max: 10, help: "channel-side capacitor plate, along the current away from the rails"},
	{key: "build.channel_plate_width", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Build.ChannelPlateWidth }, min: 1e-3, max: 10, help: "channel-side capacitor plate, along the rails"},
	{key: "build.dielectric", str: func(d *Design) *string { return &d.Build.Dielectric }, choices: build.DielectricKeys, help: "dielectric preset between the plates"},
	{key: "build.dielectric_thickness", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Build.DielectricThickness }, min: 1e-6, max: 0.05, help: "dielectric thickness between the plates"},
	{key: "build.permittivity", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Build.Permittivity }, min: 1, max: 1e4, help: "relative permittivity (overrides the preset)"},
	{key: "build.dielectric_strength", dim: units.ElectricField, unit: "V/m", num: func(d *Design) *float64 { return &d.Build.DielectricStrength }, min: 1e5, max: 1e10, help: "short-time dielectric strength (overrides the preset)"},
	{key: "build.fringe_correction", str: func(d *Design) *string { return (*string)(&d.Build.Fringe) }, choices: list(string(build.NoFringe), string(build.Palmer)), aliases: map[string]string{"true": string(build.Palmer), "false": string(build.NoFringe)}, help: "edge-field correction of the plate capacitance: \"none\" or \"palmer\" (true means palmer)"},
	{key: "build.rail_length", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Build.RailLength }, min: 1e-3, max: 10, help: "electrode rail length (default: channel.length)"},
	{key: "build.rail_height", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Build.RailHeight }, min: 0, max: 0.5, help: "rail height from the plate to the discharge"},
	{key: "build.rail_gap", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Build.RailGap }, min: 1e-4, max: 0.2, help: "rail separation (default: channel.gap)"},
	{key: "build.switch_gap", dim: units.Length, unit: "m", num: func(d *Design) *float64 { return &d.Build.SwitchGap }, min: 1e-5, max: 0.1, help: "spark-gap length (also sets switch.gap)"},
	{key: "build.switch_own_inductance", dim: units.Inductance, unit: "H", num: func(d *Design) *float64 { return &d.Build.SwitchOwnInductance }, min: 0, max: 1e-5, help: "inductance of the spark channel and its leads, added to the switch loop"},
	{key: "build.switch_gas", str: func(d *Design) *string { return &d.Build.SwitchGas }, choices: list("air", "nitrogen"), help: "gas in the spark gap"},
	{key: "build.secondary_emission", dim: units.Dimensionless, num: func(d *Design) *float64 { return &d.Build.SecondaryEmission }, min: 1e-6, max: 0.9, help: "secondary-emission coefficient γ of the channel cathode (default: copper)"}}

var fieldIndex = func() map[string]*field {
	m := make(map[string]*field, len(fieldList))
	for i := range fieldList {
		m[fieldList[i].key] = &fieldList[i]
	}
	return m
}()

// Keys returns every dotted key a design file accepts, the [build] keys included, sorted.
func Keys() []string {
	k := make([]string, 0, len(fieldList))
	for _, f := range fieldList {
		k = append(k, f.key)
	}
	sort.Strings(k)
	return k
}

// KeyUnit returns the SI unit of a numeric design key ("" for dimensionless or text keys) and
// whether the key exists; the [build] keys are included.
func KeyUnit(key string) (unit string, ok bool) {
	f, ok := fieldIndex[key]
	if !ok {
		return "", false
	}
	return f.unit, true
}

// KeyRange returns the allowed closed range [lo, hi] of a numeric design key in SI, whether 0
// is allowed besides it (meaning "none" or "computed"), and whether the key is numeric.
func KeyRange(key string) (lo, hi float64, zeroOK, ok bool) {
	f, found := fieldIndex[key]
	if !found || (f.num == nil && !f.integer) {
		return 0, 0, false, false
	}
	return f.min, f.max, f.zeroOK, true
}

// KeyInteger reports whether a design key takes whole numbers only (numerics.cells).
func KeyInteger(key string) bool {
	f, ok := fieldIndex[key]
	return ok && f.integer
}

// KeyError is a design value that is unknown, malformed or out of range.
type KeyError struct {
	Key     string // dotted key
	Value   string // the value as given
	Problem string // what is wrong and what is allowed
}

func (e *KeyError) Error() string {
	if e.Value == "" {
		return fmt.Sprintf("design: %s: %s", e.Key, e.Problem)
	}
	return fmt.Sprintf("design: %s = %s: %s", e.Key, e.Value, e.Problem)
}

// Set assigns one design key from text, as on the command line: Set("gas.pressure", "40 Torr").
// Numbers carry any unit of the key's dimension; a bare number is refused for a dimensioned
// key unless it is 0 (the error suggests the unit).
//
// The [build] keys are accepted too (Set("build.switch_plate_width", "12 cm")). After a build
// key, the channel length or the channel gap changes, the circuit values derived from the build
// (those listed in Derived) are recomputed; circuit values given explicitly win. Setting a
// derived circuit key makes it explicit. A build that is not yet consistent (a dielectric
// preset whose thickness comes in a later Set, say) leaves the derived values as they were;
// Validate reports it.
func (d *Design) Set(key, value string) error {
	if err := d.set(key, value); err != nil {
		return err
	}
	if d.given == nil {
		d.given = map[string]bool{}
	}
	d.given[key] = true
	if d.assigned == nil {
		d.assigned = map[string]bool{}
	}
	d.assigned[key] = true
	if i := slices.Index(d.Derived, key); i >= 0 {
		d.Derived = slices.Delete(slices.Clone(d.Derived), i, i+1)
	}
	if rederivedBy(key) {
		_ = d.rederive() // an inconsistent build is reported by Validate
	}
	return nil
}

// Pinned reports whether the user fixed the value of key, so that an uncertainty study holds
// it instead of sampling it. The rule: a key assigned by Set (as run's --set does, or a
// sweep's grid) is pinned, whatever its value; a key written in the design file is pinned when
// its value differs from the default of Defaults. So a file that lists every key at its
// default, as `n2pulse init` writes one, pins nothing, and a constant written at its default
// value in a file is sampled: to hold a constant at its default, give it with --set.
func (d *Design) Pinned(key string) bool {
	if d.assigned[key] {
		return true
	}
	if !d.given[key] {
		return false
	}
	f, ok := fieldIndex[key]
	if !ok {
		return false
	}
	def := Defaults()
	switch {
	case f.str != nil:
		return *f.str(d) != *f.str(def)
	case f.integer:
		return d.Numerics.Cells != def.Numerics.Cells
	}
	return *f.num(d) != *f.num(def)
}

// set assigns one key from text without the bookkeeping of Set.
func (d *Design) set(key, value string) error {
	f, ok := fieldIndex[key]
	if !ok {
		return &KeyError{Key: key, Problem: "unknown key" + suggest(key)}
	}
	if f.str != nil {
		return f.setString(d, value)
	}
	v, err := f.parse(value)
	if err != nil {
		return err
	}
	return f.setNumber(d, v, value)
}

// Get returns the value of a numeric design key in SI; a numeric [build] key that is not
// given reads 0.
func (d *Design) Get(key string) (float64, error) {
	f, ok := fieldIndex[key]
	if !ok {
		return 0, &KeyError{Key: key, Problem: "unknown key" + suggest(key)}
	}
	switch {
	case f.integer:
		return float64(d.Numerics.Cells), nil
	case f.num != nil:
		return *f.num(d), nil
	}
	return 0, &KeyError{Key: key, Problem: "is a text key, not a number"}
}

func (f *field) parse(text string) (float64, error) {
	t := strings.TrimSpace(text)
	if f.key == "optics.excitation_velocity" {
		switch strings.ToLower(t) {
		case "infinite", "inf", "simultaneous":
			return infinite, nil
		case "c":
			return units.SpeedOfLight, nil
		case "-c":
			return -units.SpeedOfLight, nil
		}
		if strings.HasSuffix(t, " c") || strings.HasSuffix(t, "c") && !strings.HasSuffix(t, "/s") {
			if k, err := strconv.ParseFloat(strings.TrimSpace(strings.TrimSuffix(t, "c")), 64); err == nil {
				return k * units.SpeedOfLight, nil
			}
		}
	}
	v, err := units.Parse(t, f.dim)
	var nu *units.NoUnitError
	if errors.As(err, &nu) {
		return 0, &KeyError{Key: f.key, Value: text, Problem: nu.Error()}
	}
	if err != nil {
		return 0, &KeyError{Key: f.key, Value: text, Problem: fmt.Sprintf("%v (want %s)", strings.TrimPrefix(err.Error(), "units: "), f.want())}
	}
	return v, nil
}

// bareNumber is the one rule for a number without a unit, from a design file or the command
// line: it stands for itself only in a dimensionless key or as 0; for any other dimensioned
// key it is an error that suggests the unit (a builder writing pressure = 40 means Torr or
// mbar, never pascal).
func bareNumber(key string, dim units.Dimension, x float64) error {
	if dim == units.Dimensionless || x == 0 {
		return nil
	}
	text := strconv.FormatFloat(x, 'g', -1, 64)
	return &KeyError{Key: key, Value: text, Problem: (&units.NoUnitError{Text: text, Want: dim}).Error() +
		"; in a design file quote it: " + key[strings.LastIndex(key, ".")+1:] + " = \"" + text + " " + dim.String() + "\""}
}

func (f *field) want() string {
	if f.dim == units.Dimensionless {
		return "a number"
	}
	return "a number in " + f.dim.String() + " or with a unit"
}

func (f *field) setNumber(d *Design, v float64, given string) error {
	if math.IsNaN(v) || (v == 0 && f.zeroOK) {
		if math.IsNaN(v) {
			return &KeyError{Key: f.key, Value: given, Problem: "not a number"}
		}
	} else if v < f.min || v > f.max {
		return &KeyError{Key: f.key, Value: given, Problem: "out of range: allowed " + f.rangeText()}
	}
	if f.integer {
		if v != math.Trunc(v) {
			return &KeyError{Key: f.key, Value: given, Problem: "must be a whole number, allowed " + f.rangeText()}
		}
		d.Numerics.Cells = int(v)
		return nil
	}
	*f.num(d) = v
	return nil
}

func (f *field) setString(d *Design, v string) error {
	if f.choices != nil {
		if a, ok := f.aliases[strings.ToLower(strings.TrimSpace(v))]; ok {
			v = a
		}
		c, err := choose(f.key, v, f.choices())
		if err != nil {
			return err
		}
		v = c
	}
	*f.str(d) = v
	return nil
}

// choose is the one rule for keys with a fixed set of values, design and [build] keys alike:
// the value matches a choice regardless of case, and the choice is kept as listed.
func choose(key, v string, choices []string) (string, error) {
	for _, c := range choices {
		if strings.EqualFold(strings.TrimSpace(v), c) {
			return c, nil
		}
	}
	return "", &KeyError{Key: key, Value: strconv.Quote(v), Problem: "allowed: " + strings.Join(choices, ", ")}
}

func (f *field) rangeText() string {
	u := f.unit
	lo, hi := fmt.Sprintf("%g", f.min), fmt.Sprintf("%g", f.max)
	if math.IsInf(f.max, 1) {
		hi = "infinite"
	}
	s := lo + " to " + hi
	if u != "" {
		s += " " + u
	}
	if f.zeroOK {
		s += ", or 0"
	}
	return s
}

// suggest is the one "did you mean" of the key registry, design and [build] keys alike: the
// nearest known key within four edits, or "".
func suggest(key string) string {
	best, bestD := "", 1<<30
	for _, k := range Keys() {
		if d := editDistance(key, k); d < bestD {
			best, bestD = k, d
		}
	}
	if bestD <= 4 {
		return fmt.Sprintf(" (did you mean %s?)", best)
	}
	return ""
}

func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur := make([]int, len(b)+1)
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			c := 1
			if a[i-1] == b[j-1] {
				c = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+c)
		}
		prev = cur
	}
	return prev[len(b)]
}
