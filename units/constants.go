package units

// Exact SI 2019 constants and CODATA 2018 recommended values (CODATA 2018, Tiesinga et al.,
// Rev. Mod. Phys. 93, 025010 (2021)).
const (
	// ElementaryCharge is e [C] (exact).
	ElementaryCharge = 1.602176634e-19
	// Planck is h [J s] (exact).
	Planck = 6.62607015e-34
	// SpeedOfLight is c in vacuum [m/s] (exact).
	SpeedOfLight = 299792458.0
	// Boltzmann is k_B [J/K] (exact).
	Boltzmann = 1.380649e-23
	// Avogadro is N_A [mol⁻¹] (exact).
	Avogadro = 6.02214076e23
	// ElectronMass is m_e [kg] (CODATA 2018).
	ElectronMass = 9.1093837015e-31
	// AtomicMass is the atomic mass constant u [kg] (CODATA 2018).
	AtomicMass = 1.66053906660e-27
	// VacuumPermittivity is ε₀ [F/m] (CODATA 2018).
	VacuumPermittivity = 8.8541878128e-12
	// VacuumPermeability is μ₀ [H/m] (CODATA 2018).
	VacuumPermeability = 1.25663706212e-6
)

// Conversions from units of the trade to SI.
const (
	// Townsend is 1 Td in SI [V m²].
	Townsend = 1e-21
	// Torr is 1 Torr in pascal (101325/760 Pa, exact by definition).
	Torr = 101325.0 / 760.0
	// Atmosphere is 1 standard atmosphere [Pa] (exact by definition).
	Atmosphere = 101325.0
	// ElectronVolt is 1 eV in joule.
	ElectronVolt = ElementaryCharge
	// Wavenumber is the energy of 1 cm⁻¹ in joule (h·c·100).
	Wavenumber = Planck * SpeedOfLight * 100
	// NitrogenMass is the mass of one N₂ molecule [kg] (28.0134 g/mol, CIAAW standard atomic
	// weight of N 14.0067).
	NitrogenMass = 28.0134 * AtomicMass
)

// GasDensity returns the number density p/(k_B·T) [m⁻³] of an ideal gas at pressure p [Pa] and
// temperature T [K].
func GasDensity(p, T float64) float64 { return p / (Boltzmann * T) }
