package design

// Defaults returns a design with the published constants of the level kinetics, the switch
// and discharge parameters of the trade and the default numerics, but no apparatus: a design
// file must give the channel, the gas pressure and the circuit.
//
// Sources of the level constants are given beside each value.
func Defaults() *Design {
	return &Design{
		Gas: Gas{Temperature: 300, Nitrogen: 1},
		Circuit: Circuit{
			Topology: Blumlein,
		},
		Switch: Switch{
			Model:         IdealSwitch,
			OnResistance:  0.1,  // common practice, no source: a spark channel of a fraction of an ohm
			OffResistance: 1e4,  // common practice, no source
			RiseTime:      2e-9, // common practice, no source
			Gap:           1e-3, // common practice, no source
			Pressure:      101325,
			SparkConstant: 101325 * 1e-4, // a = 1 atm cm² V⁻² s⁻¹ for air, from memory (see Levels doc)
		},
		Discharge: Discharge{
			SeedDensity: 1e14, // 1e8 cm⁻³ preionisation, common practice, no source
			// 0: each ion (N₂⁺, N₄⁺, O₂⁺) recombines at its published coefficient at
			// T_e = ⅔·⟨ε⟩/k_B, weighted by the ion shares the circuit follows (kinetics,
			// ionChemistry). A value > 0 is one coefficient for every ion (the project's earlier
			// default was 2e-7 cm³/s, from memory).
			Recombination: 0,
			// Estimate, range ×0.5–2 (uncertain.go): the fits are measured up to a few
			// thousand kelvin and used at T_e of 1–4 eV, with T_e from ⟨ε⟩ of a non-Maxwellian
			// distribution; the published N₄⁺ values differ by 20 % (2e-6 and 2.4e-6 cm³/s).
			RecombinationScale: 1,
		},
		Levels: defaultLevels(),
		Optics: Optics{
			ExcitationVelocity: infinite,
		},
		Numerics: Numerics{
			Cells:     200,
			EndTime:   40e-9,
			Tolerance: 1e-5,

			CrossSections: "default",
		},
	}
}
