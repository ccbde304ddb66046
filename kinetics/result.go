package kinetics

import "n2pulse/kinetics/ode"

// Summary holds the figures of merit of one shot, in SI. The JSON names are part of the
// program's interface (`run --json`, sweep tables): scripts rely on them.
type Summary struct {
	EnergyFront float64 `json:"energy_front_J"` // pulse energy leaving the output end z = L [J]
	EnergyRear  float64 `json:"energy_rear_J"`  // pulse energy leaving the rear end z = 0 [J]
	EnergyTotal float64 `json:"energy_total_J"` // both ends [J]
	PeakPower   float64 `json:"peak_power_W"`   // peak power at the output end [W]
	// FWHM is the full width at half maximum of the output-end power as a photodiode and
	// oscilloscope show it: from where the trace first rises through half its highest value to
	// where it last falls through it, so a train of spikes counts as one pulse of the width of
	// its envelope. The trace is first passed through the detector's response when
	// RunSettings.DetectorResponse is set (DetectorResponse below) [s].
	FWHM float64 `json:"fwhm_s"`
	// DetectorResponse is the time constant of the detector assumed for FWHM; 0 for an ideal
	// detector [s].
	DetectorResponse float64 `json:"detector_response_s"`
	HalfMaxWidth     float64 `json:"half_max_width_s"` // first to last half-maximum crossing of the output-end power itself, with no detector [s]
	RMSWidth         float64 `json:"rms_fwhm_s"`       // 2·sqrt(2 ln 2) × the rms duration of the output-end pulse: the FWHM of a Gaussian of the same rms width, smooth across spikes [s]
	// Pulses is the number of separate pulses in the output-end power as FWHM sees it
	// (through the detector when there is one): maxima that reach half the highest peak,
	// each two with a dip below DipLevel (a quarter) of the highest peak between them. 0 when
	// there is no output. When it is 2 or more, FWHM spans them all and the verdict says so.
	Pulses int `json:"pulses"`
	// PulseSeparation is the time between the peaks of the first two pulses; 0 for one
	// pulse [s].
	PulseSeparation float64 `json:"pulse_separation_s"`
	// StrongestPulseFWHM is the half-maximum width of the strongest pulse alone, on the same
	// trace as FWHM: equal to FWHM when there is one pulse [s].
	StrongestPulseFWHM float64 `json:"strongest_pulse_fwhm_s"`
	// HalfMaxEnergyShare is the share of the output-end energy inside the window of FWHM
	// (first to last half-maximum crossing): 0.76 for a Gaussian pulse, 0.5 for a sudden rise
	// and an exponential decay. Much less means FWHM measures a spike on a longer tail, whose
	// length RMSWidth follows.
	HalfMaxEnergyShare float64 `json:"half_max_energy_share"`
	// FWHMAt45 and FWHMAt55 are the widths of the same trace as FWHM, first rise to last
	// fall, read at 45 % and 55 % of its highest value (½ ∓ HalfMaxBand): how much the width
	// depends on the level. For a Gaussian pulse they are 1.07 and 0.93 × FWHM; for a sudden
	// rise and an exponential decay 1.15 and 0.86 × FWHM [s].
	FWHMAt45 float64 `json:"fwhm_45_s"`
	FWHMAt55 float64 `json:"fwhm_55_s"`
	// FWHMJump is the largest leap of an edge of the width (first rise or last fall) as the
	// level moves between 45 % and 55 % of the highest value: a local maximum of the trace
	// with its top inside that band, beyond the edge, flips in or out of the width. 0 for a
	// smooth pulse [s].
	FWHMJump float64 `json:"fwhm_jump_s"`
	// FWHMIllConditioned is set when FWHMJump exceeds JumpLimit (a tenth) of FWHM, or
	// FWHMAt45 − FWHMAt55 exceeds SpreadLimit (a half) of it (a flat shoulder near half the
	// peak): a small change of the level, or of the model (cells, a constant), can move FWHM
	// by that much, while RMSWidth follows such a change smoothly. The verdict then says so.
	FWHMIllConditioned bool    `json:"fwhm_ill_conditioned"`
	PulseCentre        float64 `json:"pulse_centre_s"` // power-weighted mean time of the output-end pulse [s]
	Rise               float64 `json:"rise_s"`         // 10–90 % rise time of the output-end pulse [s]
	Delay              float64 `json:"delay_s"`        // switch closure to the half-maximum of the rising edge [s]
	// EndTime is how long after closure the shot was followed: numerics.end_time, or up to
	// 16 times that (at most 10 µs) when the pulse outlasted it [s].
	EndTime float64 `json:"end_time_s"`
	// Truncated is set when the output, the gain or the discharge was still going at EndTime,
	// the longest a run may take: energies and widths are then cut short.
	Truncated       bool    `json:"truncated"`
	Efficiency      float64 `json:"efficiency"`         // total pulse energy / stored energy
	StoredEnergy    float64 `json:"stored_energy_J"`    // ½ΣCV₀² [J]
	DepositedEnergy float64 `json:"deposited_energy_J"` // energy delivered to the plasma [J]
	// UpperPumpedPhotonEnergy bounds the pulse energy: one laser photon hν for every
	// excitation into C(0) over the discharge volume (channel.gap × channel.width × length,
	// each cell's pump delayed as in the run), i.e. the energy put into C(0) × hν/E_C. Run
	// checks EnergyTotal ≤ it on every shot [J].
	UpperPumpedPhotonEnergy float64       `json:"upper_pumped_photon_energy_J"`
	PeakGain                float64       `json:"peak_gain_per_m"`             // highest small-signal gain σ·(N_C − g·N_B) of the mid-channel cell (not the channel mean) [m⁻¹]
	GainLength              float64       `json:"gain_length"`                 // highest channel-mean gain × length, ∫g dz over the channel at one moment: the gain-length of the verdict
	InversionDuration       float64       `json:"inversion_duration_s"`        // duration of the gain: equivalent width ∫g⁺dt / g_max of the channel-mean gain [s]
	TerminationTime         float64       `json:"termination_time_s"`          // when the mid-channel gain falls below 10 % of its peak after it [s]
	TerminationCause        string        `json:"termination_cause"`           // "lower-level bottleneck", "pump collapse", "quenching", "extraction by the pulse" or "no gain"
	PeakReducedField        float64       `json:"peak_reduced_field_Td"`       // highest |E/N| [Td]
	PeakCurrent             float64       `json:"peak_current_A"`              // highest |channel current| [A]
	PeakElectronDensity     float64       `json:"peak_electron_density_m3"`    // [m⁻³]
	PeakCurrentDensity      float64       `json:"peak_current_density_A_m2"`   // highest |channel current| over the discharge footprint L·w [A/m²]
	SpecificEnergy          float64       `json:"specific_energy_J_m3"`        // energy into the plasma per discharge volume L·w·d [J/m³]
	EnergyPerMolecule       float64       `json:"energy_per_molecule_eV"`      // energy into the plasma per gas molecule in the discharge volume [eV]
	Energy                  EnergyAccount `json:"energy_account"`              // where the stored energy went
	UniformGlow             bool          `json:"uniform_glow"`                // every limit of the uniform-glow regime is kept (see Regime); if not, the prediction is an upper bound
	Regime                  []RegimeCheck `json:"regime_checks"`               // the shot against each limit of a uniform glow
	SwitchHoldsCharge       bool          `json:"switch_holds_charge"`         // the spark gap as described holds the charge voltage (its static breakdown is above it, or unknown); if not, the shot is for a gap that holds, not the one described
	SwitchBreakdown         float64       `json:"switch_breakdown_V"`          // static breakdown of the spark gap as described [V]; 0 when the design does not describe the gap
	PeakGasTemperature      float64       `json:"peak_gas_temperature_K"`      // highest gas temperature of the discharge volume over the run (elastic recoil and fast gas heating at constant density) [K]
	PulseGasTemperature     float64       `json:"pulse_gas_temperature_K"`     // gas temperature of the mid-channel cell when the output-end power peaks (the design's temperature when there is no pulse) [K]
	GasTemperatureAbove     bool          `json:"gas_temperature_above_range"` // the gas heated above the range of the gain table (spectro's highest temperature): the cross section was held at the top of the range, and the gain is overstated
	EnergyBalanceResidual   float64       `json:"energy_balance_residual"`     // |stored − (left + dissipated)| / stored
	PhotonBalanceResidual   float64       `json:"photon_balance_residual"`     // |created − (emitted + lost + left)| / created
	Lases                   bool          `json:"lases"`                       // the lasing threshold of the channel's optics is reached: open channel gL ≥ 10, one mirror 2gL + ln R ≥ 10, two mirrors building up e^10 within the gain (see Verdict)
	Verdict                 string        `json:"verdict"`                     // one line: lases, or the limiting cause
	Advice                  string        `json:"advice,omitempty"`            // what to change when it does not lase, naming design keys
	StimulatedRatio         float64       `json:"stimulated_to_spontaneous"`   // photons from stimulated emission per spontaneous seed photon
	Derived                 []string      `json:"derived,omitempty"`           // circuit keys computed from the [build] section
	Overridden              []string      `json:"overridden,omitempty"`        // spectroscopic values taken from the design, not computed
	// Validity names the parts of the design the model covers only in part: today helium,
	// modelled only through the electron energy balance and dilution (see HeliumNote); empty
	// when the model covers the whole design.
	Validity string   `json:"validity,omitempty"`
	Warnings []string `json:"warnings,omitempty"` // what the run could not do as asked (Result.Warnings)
}

// EnergyAccount says where the stored energy of a shot went [J]: the switch, the shunt, the
// plasma and what is left in the circuit add up to the stored energy within the energy
// balance residual. The plasma's share is split by the swarm table's power split at the E/N
// of each moment (PlasmaSplit, all zero when the table has none); UpperLevel, the energy put
// into C(0) over the discharge volume, is part of the C channel, and Laser, the pulse
// energy at both ends, part of UpperLevel.
type EnergyAccount struct {
	Stored        float64     `json:"stored_J"`
	Switch        float64     `json:"switch_J"`
	Shunt         float64     `json:"shunt_J"`
	Plasma        float64     `json:"plasma_J"`
	LeftInCircuit float64     `json:"left_in_circuit_J"`
	PlasmaSplit   PlasmaSplit `json:"plasma_split_J"`
	UpperLevel    float64     `json:"upper_level_J"`
	Laser         float64     `json:"laser_J"`
}

// PlasmaSplit is the energy into the plasma by the channel that took it [J] (see
// swarm.Channel).
type PlasmaSplit struct {
	Elastic         float64 `json:"elastic"`
	Vibrational     float64 `json:"vibrational"`
	StateA          float64 `json:"A"`
	StateB          float64 `json:"B"`
	StateW          float64 `json:"W"`
	StateBPrime     float64 `json:"Bp"`
	StateC          float64 `json:"C"`
	OtherElectronic float64 `json:"other_electronic"`
	Ionisation      float64 `json:"ionisation"`
	Attachment      float64 `json:"attachment"`
}

// Result is the outcome of Run: the summary, the waveforms on a common time grid, the gain
// map and the numbers the model used.
type Result struct {
	Summary Summary

	// Waveforms, all of length len(Time). Populations and gain are at the middle of the channel.
	Time            []float64 // time after switch closure [s]
	ChannelVoltage  []float64 // [V]
	Current         []float64 // channel current (plasma plus gap capacitance) [A]
	ReducedField    []float64 // E/N [V m²]
	ElectronDensity []float64 // [m⁻³]
	UpperLevel      []float64 // N_C, C³Πu(v=0) [m⁻³]
	LowerLevel      []float64 // N_B, B³Πg(v=0) [m⁻³]
	PowerFront      []float64 // output power at z = L [W]
	PowerRear       []float64 // output power at z = 0 [W]
	MeanGain        []float64 // channel-mean small-signal gain [m⁻¹]

	// Gain map: Gain[i][j] is the small-signal gain [m⁻¹] at Z[i] and GainTime[j].
	Z        []float64
	GainTime []float64
	Gain     [][]float64

	Parameters Parameters // the spectroscopic and kinetic numbers used
	Warnings   []string   // e.g. E/N outside the swarm table
	Stats      Stats      // solver statistics
}

// Parameters are the derived numbers a run used.
type Parameters struct {
	CrossSection    float64 // effective σ [m²]
	DegeneracyRatio float64 // effective g_C/g_B
	EinsteinA00     float64 // [s⁻¹]
	UpperLifetime   float64 // radiative τ_C [s]
	UpperShare      float64 // f_C
	LowerShare      float64 // f_B
	Wavelength      float64 // vacuum [m]
	PhotonEnergy    float64 // [J]
	UpperEnergy     float64 // energy of C(0) above X(0) [J]
	UpperShare1     float64 // fraction of C excitation landing in v=1
	GasDensity      float64 // N [m⁻³]
	UpperDecayRate  float64 // 1/τ_C + Σk_q N [s⁻¹]
	LowerDecayRate  float64 // [s⁻¹]
	GapCapacitance  float64 // [F]
	OpticalArea     float64 // optical cross-section: channel.aperture, at most the discharge's gap × width [m²]
	CellLength      float64 // Δz [m]
	TimeStep        float64 // Δt = Δz/c [s]
}

// Stats counts the work of one run.
type Stats struct {
	Circuit             ode.Stats // the circuit integrator's own counters, every one of them
	OpticalSteps, Cells int       // optical steps propagated (dawn to dark) and cells
	TableBelow          int64     // swarm lookups clamped below the table
	TableAbove          int64     // swarm lookups clamped above the table
}

// RunSettings tune one run; nil means defaults.
type RunSettings struct {
	// CacheDir holds swarm tables solved for mixtures other than N₂ and air; "" means the
	// user cache directory.
	CacheDir string
	// GainMapColumns is the number of time columns kept in the gain map (default 300).
	GainMapColumns int
	// MemoryLimit bounds the memory [bytes] of the run's arrays; 0 means DefaultMemoryLimit.
	// A design that needs more is refused with a *MemoryError before anything large is
	// allocated; a pulse that would need more to be followed past numerics.end_time is
	// reported truncated.
	MemoryLimit int64
	// DetectorResponse is the time constant [s] of a single-pole detector (photodiode and
	// oscilloscope, impulse response e^(−t/τ)/τ, 10–90 % rise 2.2 τ) through which the output
	// power is seen for Summary.FWHM; 0 means an ideal detector.
	DetectorResponse float64
	// Light drops the waveforms and gain map from the Result and keeps only the Summary,
	// for sweeps.
	Light bool
	// SummaryOnly drops the waveforms and gain map from the Result as Light does, but takes
	// the shot as a full run does (Light stops the optics for good once the channel is
	// dark): the Summary, warnings and statistics are those of a full run bit for bit, and
	// so is the memory a run may take (MemoryLimit is checked as for a full run). For
	// callers that print only the figures of merit.
	SummaryOnly bool
	// Overlap solves the circuit on a goroutine of its own while the shot follows it step
	// by step, so that one run uses two cores; the results are the same bit for bit. For a
	// caller that runs a single shot: callers that already run shots in parallel (sweeps,
	// uncertainty samples) leave it off so as not to ask for more cores than there are.
	// Without a second processor (GOMAXPROCS 1) it is ignored.
	Overlap bool
	// overlapAlways makes Overlap work with one processor too (for tests).
	overlapAlways bool
}
