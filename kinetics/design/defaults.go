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
			// 2e-7 cm³/s, from memory: order of N₂⁺/N₄⁺ dissociative recombination. Consistent
			// with e + N₄⁺ (the main ion at 1 atm) at 2.4e-6·(300/T_e)^0.5 cm³/s (J. Appl. Phys.
			// 125, 243301 (2019), Table I, R7a–R9a, seen): 2.4e-7 at T_e = ⅔·4 eV, 3.3e-7 at ⅔·2 eV.
			Recombination: 2e-13,
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
