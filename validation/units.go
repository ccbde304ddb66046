package validation

import "n2pulse/units"

func init() {
	Register("units", func() ([]Check, error) {
		torr, err := units.Parse("1 Torr", units.Pressure)
		if err != nil {
			return nil, err
		}
		return []Check{
			{
				ID: "units.loschmidt", Quantity: "Loschmidt constant p/(k_B T) at 273.15 K, 101.325 kPa",
				Unit: "m⁻³", Computed: units.GasDensity(units.Atmosphere, 273.15),
				Reference: 2.686780111e25, Tolerance: 1e-9, Mode: Relative, Kind: Published,
				Source: "CODATA 2018 recommended value n0 (Tiesinga et al., Rev. Mod. Phys. 93, 025010, 2021)",
			},
			{
				ID: "units.torr", Quantity: "1 Torr in pascal", Unit: "Pa", Computed: torr,
				Reference: 133.322368, Tolerance: 1e-8, Mode: Relative, Kind: Published,
				Source: "definition 1 Torr = 101325/760 Pa (NIST SP 811, appendix B)",
			},
		}, nil
	})
}
