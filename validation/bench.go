package validation

import (
	"errors"
	"math"

	"n2pulse/kinetics"
	"n2pulse/kinetics/build"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
	"n2pulse/units"
)

// torrCM is 1 Torr·cm in Pa m.
const torrCM = units.Torr * 0.01

func init() {
	Register("bench", benchChecks)
	Register("sensitivity", sensitivityChecks)
}

// sensitivityChecks compares Sensitivity with explicit runs and the bench's stored energy with
// the run's.
func sensitivityChecks() ([]Check, error) {
	d := design.ExampleDesign()
	rows, err := study.Sensitivity(d, []string{"circuit.charge_voltage"}, 0.01)
	if err != nil {
		return nil, err
	}
	energy := func(v float64) (float64, *kinetics.Result, error) {
		c := d.Clone()
		c.Circuit.ChargeVoltage = v
		r, err := kinetics.Run(c, &kinetics.RunSettings{Light: true})
		if err != nil {
			return 0, nil, err
		}
		return r.Summary.EnergyTotal, r, nil
	}
	v0 := d.Circuit.ChargeVoltage
	up, _, err1 := energy(1.01 * v0)
	dn, _, err2 := energy(0.99 * v0)
	_, base, err3 := energy(v0)
	err = errors.Join(err1, err2, err3)
	explicit := (math.Log(up) - math.Log(dn)) / (math.Log(1.01) - math.Log(0.99))
	cs := []Check{{
		ID: "sensitivity.energy.charge_voltage", Quantity: "d ln E/d ln V₀ of the example against two explicit runs at V₀ ± 1 %",
		Computed: rows[0].Energy, Reference: explicit, Tolerance: 0.05, Mode: Relative, Kind: Analytic, Err: err,
		Source: "finite-difference identity: (ln E(1.01V₀) − ln E(0.99V₀)) / (ln 1.01 − ln 0.99)",
	}}
	b, berr := kinetics.Bench(d, build.Spec{})
	c := Check{
		ID: "sensitivity.bench.stored_energy", Quantity: "stored energy, bench against run (example)", Unit: "J",
		Tolerance: 1e-9, Mode: Relative, Kind: Analytic, Err: errors.Join(berr, err3),
		Source: "½(C₁ + C₂)V₀² of a Blumlein both of whose capacitors charge to V₀",
	}
	if berr == nil && err3 == nil {
		c.Computed, c.Reference = b.StoredEnergy, base.Summary.StoredEnergy
	}
	return append(cs, c), nil
}

// benchChecks compares the bench formulas of package build with textbook formulas, worked
// examples, published breakdown data and the tables the dielectric presets come from.
func benchChecks() ([]Check, error) {
	pc, err := paschenChecks()
	if err != nil {
		return nil, err
	}
	cs := append(plateChecks(), pc...)
	return append(cs, dielectricChecks()...), nil
}

// plateChecks compare the parallel-plate capacitance and line formulas with worked examples
// and the textbook relations between them.
func plateChecks() []Check {
	var cs []Check
	// Parallel-plate capacitance.
	p := build.Plates{Length: 0.02, Width: 0.01, Thickness: 1e-3, Permittivity: 1}
	cs = append(cs, Check{
		ID: "bench.plate.capacitance.2cm2_1mm", Quantity: "parallel-plate C, A = 2.00 cm², d = 1.00 mm, air",
		Unit: "F", Computed: p.Capacitance(build.NoFringe), Reference: 1.77e-12, Tolerance: 0.005, Mode: Relative, Kind: FromMemory,
		Source: "Serway & Jewett, Physics for Scientists and Engineers, worked example 'Parallel-plate capacitor' (from memory)",
	})
	p.Thickness = 2e-3
	cs = append(cs, Check{
		ID: "bench.plate.capacitance.2cm2_2mm", Quantity: "parallel-plate C, A = 2.0 cm², d = 2.0 mm, air",
		Unit: "F", Computed: p.Capacitance(build.NoFringe), Reference: 8.854e-13, Tolerance: 1e-3, Mode: Relative, Kind: Published,
		Source: "worked answer C = ε₀A/d = 8.854e-13 F, https://socratic.org/questions/a-parallel-plate-capacitor-has-an-area-of-2-0-cm-2-and-the-plates-are-separated- (seen)",
	})
	// Parallel-plate line: Z₀ = sqrt(μ/ε)·d/W, L = μd/W, C = εW/d.
	line := build.Plates{Length: 1, Width: 0.01, Thickness: 1e-4, Permittivity: 1}
	eta0 := math.Sqrt(units.VacuumPermeability / units.VacuumPermittivity)
	cs = append(cs,
		Check{
			ID: "bench.line.impedance.strip", Quantity: "parallel-plate line Z₀, w = 10 mm over d = 0.1 mm of air",
			Unit: "Ω", Computed: line.Impedance(), Reference: eta0 * 0.01, Tolerance: 1e-9, Mode: Relative, Kind: Analytic,
			Source: "Z₀ = sqrt(μ/ε)·d/W, transmission-line parameter sheet https://davidwoolsey.com/physics/reference/transmissonline.html (seen); geometry of the microstrip problem of Ida, Engineering Electromagnetics, Fig. 14.34 (problem statement seen)",
		},
		Check{
			ID: "bench.line.impedance.sqrtLC", Quantity: "Z₀ against sqrt(L'/C') on 1.6 mm FR-4, w = 25 cm",
			Unit: "Ω", Computed: fr4().Impedance(), Reference: math.Sqrt(fr4().InductancePerLength() / fr4().CapacitancePerLength()),
			Tolerance: 1e-9, Mode: Relative, Kind: Analytic, Source: "lossless line Z₀ = sqrt(L/C), same sheet (seen)",
		},
		Check{
			ID: "bench.line.transit.fr4", Quantity: "one-way transit of 15 cm of FR-4 line against l·sqrt(L'C')",
			Unit: "s", Computed: fr4().TransitTime(), Reference: 0.15 * math.Sqrt(fr4().InductancePerLength()*fr4().CapacitancePerLength()),
			Tolerance: 1e-9, Mode: Relative, Kind: Analytic, Source: "TEM phase velocity 1/sqrt(L'C') = c/sqrt(ε_r), same sheet (seen)",
		},
	)
	return cs
}

// paschenChecks compare the Paschen breakdown of N₂ and air with published minima and the
// breakdown of 1 cm of N₂ at one atmosphere.
func paschenChecks() ([]Check, error) {
	var cs []Check
	n2, err := build.Gas("nitrogen")
	if err != nil {
		return nil, err
	}
	pdMin, vMin := n2.Minimum()
	cs = append(cs,
		Check{
			ID: "bench.paschen.n2.vmin", Quantity: "N₂ Paschen minimum sparking potential (A = 12, B = 342, γ = 0.066)",
			Unit: "V", Computed: vMin, Reference: 250, Low: 0.85 * 240, High: 1.15 * 275, Mode: Range, Kind: FromMemory,
			Source: "experimental N₂ minimum 240–275 V, tables in Raizer (1991) and Naidu & Kamaraju, High Voltage Engineering (from memory); widened ±15 % for γ of the cathode",
		},
		Check{
			ID: "bench.paschen.n2.pdmin", Quantity: "N₂ Paschen minimum (pd)_min",
			Unit: "Torr cm", Computed: pdMin / torrCM, Reference: 0.8, Low: 0.5, High: 1.2, Mode: Range, Kind: FromMemory,
			Source: "experimental 0.7–1.0 Torr cm, same tables (from memory); widened for γ",
		},
	)
	v1, err := n2.Breakdown(build.ReducedPD(101300, 0.01, 293.15))
	cs = append(cs, Check{
		ID: "bench.paschen.n2.1atm_1cm", Quantity: "uniform-field breakdown of 1 cm of N₂ at 101.3 kPa",
		Unit: "V", Computed: v1, Err: err, Reference: 30.4e3, Tolerance: 0.15, Mode: Relative, Kind: Published,
		Source: "about 30.4 kV, chapter on sparking in gases, Taylor & Francis, doi:10.1201/9780203025260-14 (abstract seen); Townsend fit extrapolated to E/p ≈ 40 V cm⁻¹ Torr⁻¹, hence 15 %",
	})
	air, err := build.Gas("air")
	if err != nil {
		return nil, err
	}
	_, vAir := air.Minimum()
	cs = append(cs, Check{
		ID: "bench.paschen.air.vmin", Quantity: "air Paschen minimum (A = 15, B = 365, γ = 0.01)",
		Unit: "V", Computed: vAir, Reference: 327, Tolerance: 0.10, Mode: Relative, Kind: Published,
		Source: "327 V minimum breakdown of air, http://www.highvoltageconnection.com/articles/paschen-curve.html (seen)",
	})
	return cs, nil
}

// dielectricChecks check that the dielectric presets equal the tables they come from.
func dielectricChecks() []Check {
	var cs []Check
	for _, x := range []struct {
		id, key string
		eps     bool
		ref     float64
		src     string
	}{
		{"bench.dielectric.ptfe.permittivity", "ptfe", true, 2.03, "solid PTFE 2.03, http://joysignal.com/support/glossary/dielectric-constant (seen)"},
		{"bench.dielectric.fr4.permittivity", "fr4", true, 4.5, "FR-4 = 4.5, http://joysignal.com/support/glossary/dielectric-constant (seen)"},
		{"bench.dielectric.polyethylene.permittivity", "polyethylene", true, 2.21, "polyethylene 2.21, http://radiopolyus.ru/spravka/110-xarakteristiki-dielektricheskix-materialov (seen)"},
		{"bench.dielectric.polyethylene.strength", "polyethylene", false, 40e6, "polyethylene 40 kV/mm, http://radiopolyus.ru/spravka/110-xarakteristiki-dielektricheskix-materialov (seen)"},
		{"bench.dielectric.glass.strength", "glass", false, 30e6, "glass (plate) 30 MV/m, https://electronicsreference.com/references/dielectric-strength (seen)"},
		{"bench.dielectric.ptfe.strength", "ptfe", false, 19.7e6, "PTFE 19.7–173 MV/m (low end), https://electronicsreference.com/references/dielectric-strength (seen)"},
	} {
		d, err := build.DielectricPreset(x.key)
		c := Check{ID: x.id, Reference: x.ref, Mode: Relative, Tolerance: 1e-12, Kind: Published, Source: x.src, Err: err}
		if x.eps {
			c.Quantity, c.Computed = x.key+" preset relative permittivity", d.Permittivity
		} else {
			c.Quantity, c.Unit, c.Computed = x.key+" preset dielectric strength", "V/m", d.Strength
		}
		cs = append(cs, c)
	}
	return cs
}

func fr4() build.Plates {
	return build.Plates{Length: 0.15, Width: 0.25, Thickness: 1.6e-3, Permittivity: 4.5}
}
