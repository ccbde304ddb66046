package kinetics

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
)

// TestExcitationScales: levels.upper_excitation_scale and levels.lower_excitation_scale scale
// the electron-impact pump of C and of B where the level kinetics use it, and nothing else.
// The circuit does not see them (the plasma energy and its split are the same to the last
// bit), and with recombination into C switched off the energy put into C(0) scales exactly with
// the C factor (C(0) and C(v=1) are linear in their pump), while the B factor leaves it alone
// and lowers the output. Example design, 20 cells.
func TestExcitationScales(t *testing.T) {
	t.Parallel()
	run := func(kv ...string) Summary {
		t.Helper()
		d := design.ExampleDesign()
		kv = append([]string{"numerics.cells", "20", "levels.recombination_upper_share", "0"}, kv...)
		for i := 0; i < len(kv); i += 2 {
			if err := d.Set(kv[i], kv[i+1]); err != nil {
				t.Fatal(err)
			}
		}
		r, err := Run(d, &RunSettings{Light: true})
		if err != nil {
			t.Fatal(err)
		}
		return r.Summary
	}
	base := run()
	up := run("levels.upper_excitation_scale", "1.3")
	low := run("levels.lower_excitation_scale", "1.35")
	for name, s := range map[string]Summary{"C ×1.3": up, "B ×1.35": low} {
		if s.Energy.Plasma != base.Energy.Plasma || s.Energy.PlasmaSplit != base.Energy.PlasmaSplit {
			t.Errorf("%s: plasma energy %g J (split %+v); want the unscaled %g J, the circuit does not see the scale", name, s.Energy.Plasma, s.Energy.PlasmaSplit, base.Energy.Plasma)
		}
	}
	if r := up.Energy.UpperLevel / base.Energy.UpperLevel; !scalar.EqualWithinAbsOrRel(r, 1.3, 0, 1e-12) {
		t.Errorf("C ×1.3: energy into C(0) ×%.15g; want ×1.3", r)
	}
	if !(up.EnergyTotal > base.EnergyTotal) {
		t.Errorf("C ×1.3: output %g J, not above the unscaled %g J", up.EnergyTotal, base.EnergyTotal)
	}
	if low.Energy.UpperLevel != base.Energy.UpperLevel {
		t.Errorf("B ×1.35: energy into C(0) %g J; want the unscaled %g J", low.Energy.UpperLevel, base.Energy.UpperLevel)
	}
	if !(low.EnergyTotal < base.EnergyTotal) {
		t.Errorf("B ×1.35: output %g J, not below the unscaled %g J", low.EnergyTotal, base.EnergyTotal)
	}
}
