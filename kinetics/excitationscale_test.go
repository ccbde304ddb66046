package kinetics

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/swarm"
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

// TestExcitationScaleFeedback measures what the excitation scales leave out: scaling a cross
// section changes the electrons' energy distribution too, which a scale on the rate ignores.
// The project's own two-term solver on the default N₂ set, at 200 and 300 Td (where the
// experiment cases deposit most of their energy): σ_C × 1.3 raises k_C by only ×1.22–1.24 (the
// tail is depleted) and lowers k_ion by 9–12 %; σ_B × 1.35 lowers k_C by 5–8 %. These are the
// numbers the README's limitation states (to ±0.01 here); the drift velocity moves under 1 %.
func TestExcitationScaleFeedback(t *testing.T) {
	t.Parallel()
	base, err := swarm.SetMixture(swarm.DefaultSet, 1, 0, 0)
	if err != nil {
		t.Fatal(err)
	}
	scaled := func(label string, f float64) []swarm.Component {
		sp := *base[0].Species
		sp.Processes = append([]swarm.Process(nil), sp.Processes...)
		n := 0
		for i, p := range sp.Processes {
			if p.Label == label {
				p.Sigma = append([]float64(nil), p.Sigma...)
				for k := range p.Sigma {
					p.Sigma[k] *= f
				}
				sp.Processes[i] = p
				n++
			}
		}
		if n != 1 {
			t.Fatalf("%d processes labelled %s; want 1", n, label)
		}
		return []swarm.Component{{Species: &sp, Fraction: 1}}
	}
	solve := func(mix []swarm.Component, td float64) *swarm.Result {
		s, err := swarm.NewSolver(mix, nil)
		if err != nil {
			t.Fatal(err)
		}
		r, err := s.Solve(td * 1e-21)
		if err != nil {
			t.Fatal(err)
		}
		return r
	}
	for _, c := range []struct {
		label    string
		f, td    float64
		kC, kIon float64 // ratios to the unscaled set
	}{
		{"C", 1.3, 200, 1.220, 0.878},
		{"C", 1.3, 300, 1.241, 0.914},
		{"B", 1.35, 200, 0.920, 0.879},
		{"B", 1.35, 300, 0.952, 0.924},
	} {
		r0, r1 := solve(base, c.td), solve(scaled(c.label, c.f), c.td)
		kC0, _ := r0.RateOf("N2", "C")
		kC1, _ := r1.RateOf("N2", "C")
		if got := kC1 / kC0; !scalar.EqualWithinAbsOrRel(got, c.kC, 0.01, 0) {
			t.Errorf("σ_%s ×%g at %g Td: k_C ×%.4f; want ×%.3f ± 0.01", c.label, c.f, c.td, got, c.kC)
		}
		if got := r1.Ionisation / r0.Ionisation; !scalar.EqualWithinAbsOrRel(got, c.kIon, 0.01, 0) {
			t.Errorf("σ_%s ×%g at %g Td: k_ion ×%.4f; want ×%.3f ± 0.01", c.label, c.f, c.td, got, c.kIon)
		}
		if got := r1.DriftVelocity / r0.DriftVelocity; !scalar.EqualWithinAbsOrRel(got, 1, 0.01, 0) {
			t.Errorf("σ_%s ×%g at %g Td: drift ×%.4f; want within 1 %%", c.label, c.f, c.td, got)
		}
	}
}
