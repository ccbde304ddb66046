package design

import (
	"math"

	"n2pulse/kinetics/build"
)

// Design is one nitrogen laser described in SI units: its channel, gas, circuit, switch,
// discharge, level kinetics, optics, optional spectroscopic overrides and numerics. Read one
// with ParseDesign or LoadDesign, or start from ExampleDesign; change one key with Set.
type Design struct {
	Name        string // short name of the design
	Description string // free text

	Channel      Channel
	Gas          Gas
	Circuit      Circuit
	Switch       Switch
	Discharge    Discharge
	Levels       Levels
	Optics       Optics
	Spectroscopy Spectroscopy
	Numerics     Numerics

	// Build is the laser as built: the [build] section of the file (plates, dielectric,
	// rails, switch gap), in SI; the zero Spec when the design has none. Set keeps the
	// derived circuit values in step with it.
	Build build.Spec

	// Derived lists the keys (circuit capacitances and loop inductances, switch.gap) whose
	// values are computed from Build rather than given (see ParseBuiltDesign); the other
	// circuit values are explicit and win over the build.
	Derived []string

	// given holds the keys given in the file or by Set; nil for a design made in code.
	given map[string]bool
	// assigned holds the keys assigned by Set (the command line's --set, a sweep's grid
	// value): always pinned (see Pinned).
	assigned map[string]bool
}

// Channel is the laser channel between the two electrode rails.
type Channel struct {
	Length           float64 // electrode length along the optical axis L [m]
	Gap              float64 // electrode separation d [m]
	Width            float64 // width w of the discharge across the rails; footprint L·w [m]
	ElectrodeWidth   float64 // electrode face width for the gap capacitance ε₀·L·w_e/d; 0 means Width [m]
	StrayCapacitance float64 // capacitance in parallel with the gap [F]
	Aperture         float64 // optical cross-section A_opt; 0 means Gap·Width [m²]
}

// Gas is the laser gas: pressure, temperature and mole fractions (summing to 1).
type Gas struct {
	Pressure    float64 // [Pa]
	Temperature float64 // [K]
	Nitrogen    float64 // N₂ mole fraction
	Oxygen      float64 // O₂ mole fraction
	Helium      float64 // He mole fraction
}

// Topology names a discharge circuit.
type Topology string

const (
	// Blumlein: two capacitors sharing one plate, both charged; the switch discharges the first
	// and the channel sits between the two separated plates.
	Blumlein Topology = "blumlein"
	// ChargeTransfer: a storage capacitor switched into a peaking capacitor across the channel.
	ChargeTransfer Topology = "transfer"
)

// Circuit holds the lumped elements. In both topologies the first capacitor is on the switch
// side (Blumlein C₁, transfer storage C_s) and the second on the channel side (Blumlein C₂,
// transfer peaking C_p).
type Circuit struct {
	Topology           Topology
	ChargeVoltage      float64 // V₀ [V]
	SwitchCapacitance  float64 // C₁ or C_s [F]
	ChannelCapacitance float64 // C₂ or C_p [F]
	SwitchInductance   float64 // loop inductance of the switch circuit L_s [H]
	ChannelInductance  float64 // loop inductance of the channel circuit L_c [H]
	ShuntInductance    float64 // inductor across the channel loop; 0 means none [H]
	ShuntResistance    float64 // resistor across the channel loop; 0 means none [Ω]
}

// SwitchModel names how the switch resistance evolves after closure at t = 0.
type SwitchModel string

const (
	// IdealSwitch has the on-resistance from t = 0.
	IdealSwitch SwitchModel = "ideal"
	// ExponentialSwitch falls as R_on + (R_off − R_on)·exp(−t/τ).
	ExponentialSwitch SwitchModel = "exponential"
	// RompeWeizelSwitch follows the Rompe–Weizel spark law R = d_g/sqrt((2a/p_g)·∫I²dt),
	// in series with the on-resistance; the integral starts where R equals the off-resistance.
	RompeWeizelSwitch SwitchModel = "rompe-weizel"
)

// Switch is the closing switch (spark gap or thyratron) of the circuit.
type Switch struct {
	Model         SwitchModel
	OnResistance  float64 // R_on [Ω]
	OffResistance float64 // R_off, the resistance at closure for the exponential and spark models [Ω]
	RiseTime      float64 // τ of the exponential model [s]
	Gap           float64 // spark length d_g of the Rompe–Weizel model [m]
	Pressure      float64 // gas pressure p_g in the spark gap [Pa]
	SparkConstant float64 // Rompe–Weizel constant a [Pa m² V⁻² s⁻¹]
}

// Discharge holds the parameters of the electron balance.
type Discharge struct {
	SeedDensity   float64 // preionisation electron density at closure n_e0 [m⁻³]
	Recombination float64 // one electron–ion recombination coefficient β for every ion [m³/s]; 0: per ion, from the ion mixture and T_e
	// RecombinationScale multiplies the computed per-ion coefficients (not a β the design
	// sets): the uncertainty of the published fits used far above the temperatures they were
	// measured at.
	RecombinationScale float64
}

// Levels holds the collisional and radiative constants of the C³Πu(v=0) upper and
// B³Πg(v=0) lower laser levels (Stern–Volmer quenching, two-body rate constants).
type Levels struct {
	UpperQuenchingNitrogen   float64 // k_qC for C(0) + N₂ [m³/s]
	UpperQuenchingOxygen     float64 // k_qC for C(0) + O₂ [m³/s]
	UpperQuenchingHelium     float64 // k_qC for C(0) + He [m³/s]
	UpperElectronMixing      float64 // k_eC, electron-induced loss of C(0) [m³/s]
	UpperElectronScale       float64 // factor on the estimated electron collisions with C(0) (superelastic C → B, ionisation); 0 switches them off
	UpperRelaxationNitrogen  float64 // vibrational relaxation C(v=1) → C(0) by N₂ [m³/s]; 0 leaves C(v=1) out
	UpperV1QuenchingNitrogen float64 // electronic quenching of C(v=1) by N₂ [m³/s]
	LowerLifetime            float64 // radiative lifetime of B(0) [s]
	LowerRemovalNitrogen     float64 // removal of B(0) by N₂ [m³/s]
	LowerRemovalOxygen       float64 // removal of B(0) by O₂ [m³/s]

	// The B³Πg(v>0)/W³Δu/B′³Σu⁻ manifold as one reservoir: fed by electrons, emptied by
	// collisions; a share of its collisional relaxation by N₂ ends in B(0).
	ManifoldShare              float64 // share of the manifold's relaxation by N₂ that ends in B(0)
	ManifoldRelaxationNitrogen float64 // total collisional relaxation of the manifold by N₂ [m³/s]
	ManifoldRelaxationOxygen   float64 // total collisional removal of the manifold by O₂ (none into B(0)) [m³/s]

	// UpperExcitationScale is a factor on the swarm table's electron-impact rate X → C³Πu where
	// the level kinetics use it (the pump of C(0) and C(v=1)); 1 uses the table as it is. It
	// stands for the uncertainty of the C³Πu cross section. Only the pump is scaled: the
	// electron energy distribution, the discharge current and the swarm's power split (the
	// energy account's plasma split) stay those of the unscaled set; the feedback of this one
	// channel on the distribution is left out (at 200–300 Td, σ_C × 1.3 in the solver raises k_C
	// by ×1.22–1.24 and lowers k_ion by 9–12 %: kinetics.TestExcitationScaleFeedback).
	UpperExcitationScale float64
	// LowerExcitationScale is the same factor on the electron-impact rate X → B³Πg (both its
	// share into B(0) and its share into the B(v>0) manifold), with the same limitation.
	LowerExcitationScale float64

	// Products of electron–ion recombination: the shares of the dissociative recombination
	// of N₄⁺ that leave one N₂ molecule in C³Πu (taken into C(0)) and in B³Πg (taken into the
	// B(v>0)/W/B′ manifold). Recombination of N₂⁺ and O₂⁺/O₄⁺ gives neither.
	RecombinationUpperShare float64 // share of e + N₄⁺ into N₂(C) + N₂
	RecombinationLowerShare float64 // share of e + N₄⁺ into N₂(B) + N₂
	// FastHeatingShare is the share of the energy the electrons put into electronic states,
	// dissociation and ionisation that heats the gas within the shot ("fast gas heating");
	// the gas temperature it raises lowers the gain cross section.
	FastHeatingShare float64
}

// Optics holds the ends of the channel, the distributed loss and the excitation front.
type Optics struct {
	RearReflectivity   float64 // power reflectivity at z = 0
	FrontReflectivity  float64 // power reflectivity at z = L (the output end)
	Loss               float64 // distributed loss α [m⁻¹]
	ExcitationVelocity float64 // speed of the excitation front along z; +Inf for simultaneous, negative for a front from the output end [m/s]
}

// Spectroscopy holds optional overrides of the values package spectro computes for the
// design's pressure and temperature; a zero field means "computed".
type Spectroscopy struct {
	CrossSection    float64 // effective stimulated-emission cross section [m²]
	DegeneracyRatio float64 // effective g_C/g_B
	EinsteinA00     float64 // A(0,0) [s⁻¹]
	UpperLifetime   float64 // radiative lifetime of C(0) [s]
	UpperShare      float64 // f_C
	LowerShare      float64 // f_B
	Wavelength      float64 // vacuum wavelength of the laser line [m]
}

// Numerics holds the resolution and extent of the simulation.
type Numerics struct {
	Cells      int     // cells along the channel; the optical time step is L/(cells·c)
	EndTime    float64 // end of the simulation after switch closure [s]
	Tolerance  float64 // relative tolerance of the circuit integrator
	SwarmTable string  // path of a user swarm table (CSV); empty means built in or solved
	// CrossSections names the N₂ cross-section set of the built-in or solved swarm table:
	// "default" (or empty) or a name of swarm.Sets; ignored when SwarmTable is set.
	CrossSections string
}

// infinite is the excitation velocity of a simultaneous discharge.
var infinite = math.Inf(1)
