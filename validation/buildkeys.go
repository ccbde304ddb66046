package validation

import (
	"errors"

	"n2pulse/data"
	"n2pulse/kinetics/design"
)

func init() {
	Register("buildkeys", buildKeyChecks)
}

// buildKeyDesign is an invented scenario: a Blumlein on a 1.6 mm glass-epoxy board, described
// as built.
var buildKeyDesign = string(data.BoardDesign())

// buildKeyChecks change a design's [build] section through Design.Set, as `--set build.…` and
// sweeps do, and compare the re-derived circuit with a worked example and the scaling of the
// parallel-plate formula.
func buildKeyChecks() ([]Check, error) {
	d, err := design.ParseDesign([]byte(buildKeyDesign), "board.toml")
	if err != nil {
		return nil, err
	}
	set := func(d *design.Design, kv ...string) error {
		var errs []error
		for i := 0; i+1 < len(kv); i += 2 {
			errs = append(errs, d.Set(kv[i], kv[i+1]))
		}
		return errors.Join(append(errs, d.Validate())...)
	}
	// The switch-side plates made the worked example's: A = 2.0 cm², d = 2.0 mm, vacuum.
	ex := d.Clone()
	err = set(ex, "build.switch_plate_length", "2 cm", "build.switch_plate_width", "1 cm",
		"build.dielectric_thickness", "2 mm", "build.permittivity", "1")
	cs := []Check{{
		ID: "buildkeys.set.worked_example", Quantity: "C₁ re-derived after --set of the plates to A = 2.0 cm², d = 2.0 mm, ε_r = 1",
		Unit: "F", Computed: ex.Circuit.SwitchCapacitance, Reference: 8.854e-13, Tolerance: 1e-3, Mode: Relative, Kind: Published, Err: err,
		Source: "worked answer C = ε₀A/d = 8.854e-13 F, https://socratic.org/questions/a-parallel-plate-capacitor-has-an-area-of-2-0-cm-2-and-the-plates-are-separated- (seen)",
	}}
	// Sweeping the plate width from 25 cm to 10 cm scales C₁ by 10/25 and leaves C₂.
	w := d.Clone()
	err = set(w, "build.switch_plate_width", "10 cm")
	cs = append(cs, Check{
		ID: "buildkeys.set.width_scaling", Quantity: "C₁(w = 10 cm)/C₁(w = 25 cm) through Design.Set",
		Computed: w.Circuit.SwitchCapacitance / d.Circuit.SwitchCapacitance, Reference: 0.4, Tolerance: 1e-12, Mode: Relative, Kind: Analytic, Err: err,
		Source: "parallel-plate C = ε₀ε_r·l·w/d is linear in w (Serway & Jewett, Physics for Scientists and Engineers, capacitance chapter, from memory)",
	}, Check{
		ID: "buildkeys.set.channel_side_unchanged", Quantity: "C₂ after the switch-side width changes, against the file's",
		Unit: "F", Computed: w.Circuit.ChannelCapacitance, Reference: d.Circuit.ChannelCapacitance, Tolerance: 1e-15, Mode: Relative, Kind: Analytic, Err: err,
		Source: "the two capacitors are separate plate pairs: ε₀ε_r·l·w/d of the channel side does not involve the switch-side width",
	})
	return cs, nil
}
