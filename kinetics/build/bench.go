package build

import (
	"fmt"
	"math"

	"n2pulse/units"
)

// Spec is the laser as built: the [build] section of a design file, in SI. A zero number
// means "not given".
type Spec struct {
	SwitchPlateLength   float64 // switch-side capacitor (Blumlein C₁, transfer storage): along the current [m]
	SwitchPlateWidth    float64 // across the current, along the switch edge [m]
	ChannelPlateLength  float64 // channel-side capacitor (Blumlein C₂, transfer peaking): along the current [m]
	ChannelPlateWidth   float64 // across the current, along the rails [m]
	Dielectric          string  // preset name; "" when permittivity and strength are given
	DielectricThickness float64 // [m]
	Permittivity        float64 // relative permittivity; overrides the preset
	DielectricStrength  float64 // [V/m]; overrides the preset
	Fringe              Fringe  // "none" (default) or "palmer"
	RailLength          float64 // 0: the channel length [m]
	RailHeight          float64 // from the plate to the discharge [m]
	RailGap             float64 // 0: the channel gap [m]
	SwitchGap           float64 // spark-gap length [m]
	SwitchOwnInductance float64 // inductance of the spark channel and its leads, added to the switch loop [H]
	SwitchGas           string  // gas in the spark gap: "air" (default) or "nitrogen"
	SecondaryEmission   float64 // γ of the channel cathode; 0: the preset of the gas
}

// HasSwitchPlates reports whether the switch-side capacitor is described.
func (s *Spec) HasSwitchPlates() bool { return s.SwitchPlateLength > 0 && s.SwitchPlateWidth > 0 }

// HasChannelPlates reports whether the channel-side capacitor is described.
func (s *Spec) HasChannelPlates() bool { return s.ChannelPlateLength > 0 && s.ChannelPlateWidth > 0 }

// Conditions are the design values the bench needs besides the build: gas, channel, charge
// and the circuit values given explicitly (zero: derive them from the build).
type Conditions struct {
	Transfer           bool    // charge-transfer circuit; false: Blumlein
	ChargeVoltage      float64 // V₀ [V]
	ChannelLength      float64 // [m]
	ChannelGap         float64 // [m]
	GapCapacitance     float64 // capacitance of the channel gap [F]
	Pressure           float64 // [Pa]
	Temperature        float64 // [K]
	Nitrogen           float64 // N₂ mole fraction
	Shunt              bool    // an inductor or resistor across the channel
	SwitchPressure     float64 // gas pressure in the spark gap [Pa]
	SwitchGap          float64 // spark length of the design, used when the build gives none [m]
	SwitchRiseTime     float64 // own closing time of the switch model (0: ideal) [s]
	UpperLifetime      float64 // effective lifetime of C(0) at the design's gas, 1/(1/τ_C + Σk_q·N) [s]
	SwitchCapacitance  float64 // [F]
	ChannelCapacitance float64 // [F]
	SwitchInductance   float64 // [H]
	ChannelInductance  float64 // [H]
}

// Line describes one capacitor of the build as a parallel-plate line.
type Line struct {
	Plates              `json:"plates"`
	Capacitance         float64 `json:"capacitance_F"`             // with the chosen fringe correction [F]
	InductancePerLength float64 `json:"inductance_per_length_H_m"` // L' [H/m]
	LoopInductance      float64 `json:"loop_inductance_H"`         // L'·l/3 [H]
	Impedance           float64 `json:"impedance_ohm"`             // Z₀ [Ω]
	TransitTime         float64 `json:"transit_time_s"`            // one way [s]
}

func newLine(p Plates, f Fringe) *Line {
	return &Line{Plates: p, Capacitance: p.Capacitance(f), InductancePerLength: p.InductancePerLength(),
		LoopInductance: p.LoopInductance(), Impedance: p.Impedance(), TransitTime: p.TransitTime()}
}

// Bench is the outcome of Evaluate: the derived circuit values, the values used (explicit
// ones win), the stresses on the parts and the warnings.
type Bench struct {
	Dielectric     *Dielectric `json:"dielectric,omitempty"`   // nil when the build gives no dielectric
	Fringe         Fringe      `json:"fringe"`                 // fringe correction of the plate capacitances
	SwitchLine     *Line       `json:"switch_line,omitempty"`  // nil when the switch-side plates are not described
	ChannelLine    *Line       `json:"channel_line,omitempty"` // nil when the channel-side plates are not described
	RailInductance float64     `json:"rail_inductance_H"`      // [H]

	// Derived values (zero when the build cannot give them) and the values used.
	DerivedSwitchCapacitance  float64 `json:"derived_switch_capacitance_F"`  // [F]
	DerivedChannelCapacitance float64 `json:"derived_channel_capacitance_F"` // [F]
	DerivedSwitchInductance   float64 `json:"derived_switch_inductance_H"`   // [H]
	DerivedChannelInductance  float64 `json:"derived_channel_inductance_H"`  // [H]
	SwitchCapacitance         float64 `json:"switch_capacitance_F"`          // [F]
	ChannelCapacitance        float64 `json:"channel_capacitance_F"`         // [F]
	SwitchInductance          float64 `json:"switch_inductance_H"`           // [H]
	ChannelInductance         float64 `json:"channel_inductance_H"`          // [H]

	DielectricVoltage float64 `json:"dielectric_voltage_V"` // highest voltage across the dielectric [V]
	DielectricField   float64 `json:"dielectric_field_V_m"` // [V/m]; 0 without a dielectric thickness
	DielectricMargin  float64 `json:"dielectric_margin"`    // strength / field

	Townsend         Townsend `json:"townsend"`            // of the channel gas
	ChannelPD        float64  `json:"channel_pd_Pa_m"`     // reduced p·d of the channel [Pa m]
	ChannelBreakdown float64  `json:"channel_breakdown_V"` // static Paschen breakdown of the channel gap [V]
	ChannelCharging  float64  `json:"channel_charging_V"`  // voltage across the channel while the capacitors charge [V]
	ChannelPeak      float64  `json:"channel_peak_V"`      // highest voltage across the channel after switch closure, before breakdown [V]
	Overvoltage      float64  `json:"overvoltage"`         // ChannelPeak / ChannelBreakdown
	ShuntNeeded      bool     `json:"shunt_needed"`        // the circuit needs a shunt across the channel and has none

	SwitchGap       float64 `json:"switch_gap_m"`       // [m]; 0 when unknown
	SwitchBreakdown float64 `json:"switch_breakdown_V"` // static Paschen breakdown of the spark gap [V]; 0 when unknown

	VoltageRise   float64 `json:"voltage_rise_s"`   // switch closure to the peak channel voltage, π·sqrt(L_s·C) plus the switch's own closing time [s]
	CurrentRise   float64 `json:"current_rise_s"`   // quarter period of the channel loop, (π/2)·sqrt(L_c·C_ch) [s]
	UpperLifetime float64 `json:"upper_lifetime_s"` // effective C(0) lifetime [s]
	StoredEnergy  float64 `json:"stored_energy_J"`  // ½(C₁+C₂)V₀² (Blumlein) or ½C_sV₀² (transfer) [J]

	Warnings []string `json:"warnings"`
	// Stresses are the warnings that a run of the design repeats: the apparatus itself at risk
	// or misbehaving (a dielectric over-stressed or with little margin, a channel or spark gap
	// that self-fires, plates that act as a transmission line). They are also in Warnings.
	Stresses []string `json:"stresses,omitempty"`
}

// Evaluate derives the circuit from the build and rates the stresses; an error means the build
// or the conditions are inconsistent (a dielectric thickness without permittivity, say).
func Evaluate(s Spec, c Conditions) (*Bench, error) {
	b := &Bench{Fringe: s.Fringe}
	if b.Fringe == "" {
		b.Fringe = NoFringe
	}
	if b.Fringe != NoFringe && b.Fringe != Palmer {
		return nil, fmt.Errorf("build: fringe correction %q: allowed none, palmer", s.Fringe)
	}
	if err := b.dielectric(s); err != nil {
		return nil, err
	}
	if (s.HasSwitchPlates() || s.HasChannelPlates()) && b.Dielectric == nil {
		return nil, fmt.Errorf("build: plates need a dielectric: give build.dielectric (a preset) or build.dielectric_thickness with build.permittivity")
	}
	if b.Dielectric != nil {
		if s.HasSwitchPlates() {
			b.SwitchLine = newLine(Plates{s.SwitchPlateLength, s.SwitchPlateWidth, s.DielectricThickness, b.Dielectric.Permittivity}, b.Fringe)
			b.DerivedSwitchCapacitance = b.SwitchLine.Capacitance
			b.DerivedSwitchInductance = b.SwitchLine.LoopInductance + s.SwitchOwnInductance
		}
		if s.HasChannelPlates() {
			b.ChannelLine = newLine(Plates{s.ChannelPlateLength, s.ChannelPlateWidth, s.DielectricThickness, b.Dielectric.Permittivity}, b.Fringe)
			b.DerivedChannelCapacitance = b.ChannelLine.Capacitance
			rails := Rails{Length: s.RailLength, Height: s.RailHeight, Gap: s.RailGap}
			if rails.Length == 0 {
				rails.Length = c.ChannelLength
			}
			if rails.Gap == 0 {
				rails.Gap = c.ChannelGap
			}
			b.RailInductance = rails.Inductance()
			b.DerivedChannelInductance = b.ChannelLine.LoopInductance + b.RailInductance
		}
	}
	b.SwitchCapacitance = pick(c.SwitchCapacitance, b.DerivedSwitchCapacitance)
	b.ChannelCapacitance = pick(c.ChannelCapacitance, b.DerivedChannelCapacitance)
	b.SwitchInductance = pick(c.SwitchInductance, b.DerivedSwitchInductance)
	b.ChannelInductance = pick(c.ChannelInductance, b.DerivedChannelInductance)
	if err := b.stresses(s, c); err != nil {
		return nil, err
	}
	return b, nil
}

func pick(given, derived float64) float64 {
	if given != 0 {
		return given
	}
	return derived
}

func (b *Bench) dielectric(s Spec) error {
	var d Dielectric
	switch {
	case s.Dielectric != "":
		p, err := DielectricPreset(s.Dielectric)
		if err != nil {
			return err
		}
		d = p
	case s.Permittivity != 0 || s.DielectricStrength != 0 || s.DielectricThickness != 0:
		d = Dielectric{Key: "custom", Name: "as given", PermittivitySource: "design file", StrengthSource: "design file"}
	default:
		return nil
	}
	if s.Permittivity != 0 {
		d.Permittivity, d.PermittivitySource = s.Permittivity, "design file"
	}
	if s.DielectricStrength != 0 {
		d.Strength, d.StrengthSource = s.DielectricStrength, "design file"
	}
	if d.Permittivity < 1 {
		return fmt.Errorf("build: dielectric %q needs build.permittivity (a relative permittivity ≥ 1)", d.Name)
	}
	if s.DielectricThickness <= 0 {
		return fmt.Errorf("build: the dielectric needs build.dielectric_thickness (> 0)")
	}
	b.Dielectric = &d
	return nil
}

// Blumlein and transfer stresses. In a Blumlein both capacitors charge to V₀ through the shunt,
// which holds the channel near 0 V; after switch closure C₁ rings to −V₀ in π·sqrt(L_s·C₁) and
// the channel sees up to 2V₀. In a transfer circuit the peaking capacitor charges through the
// switch, to at most 2V₀·C_s/(C_s + C_p) (lossless ringing) after π·sqrt(L_s·C_s·C_p/(C_s+C_p)).
func (b *Bench) stresses(s Spec, c Conditions) error {
	v0 := c.ChargeVoltage
	c1, c2 := b.SwitchCapacitance, b.ChannelCapacitance
	if c1 <= 0 || c2 <= 0 || b.SwitchInductance <= 0 || b.ChannelInductance <= 0 {
		return fmt.Errorf("build: the circuit is incomplete: capacitances and inductances must come from the design or from the build's plates")
	}
	ser := c1
	if c.Transfer {
		ser = c1 * c2 / (c1 + c2)
		b.ChannelPeak = 2 * v0 * c1 / (c1 + c2)
		b.StoredEnergy = 0.5 * c1 * v0 * v0
		b.DielectricVoltage = math.Max(v0, b.ChannelPeak)
	} else {
		b.ChannelPeak = 2 * v0
		b.StoredEnergy = 0.5 * (c1 + c2) * v0 * v0
		b.DielectricVoltage = v0
	}
	b.VoltageRise = math.Pi*math.Sqrt(b.SwitchInductance*ser) + c.SwitchRiseTime
	b.CurrentRise = math.Pi / 2 * math.Sqrt(b.ChannelInductance*c2)
	b.UpperLifetime = c.UpperLifetime

	b.rateDielectric(s)
	if err := b.rateChannel(s, c); err != nil {
		return err
	}
	if err := b.rateSwitchGap(s, c); err != nil {
		return err
	}
	b.rateTiming()
	return nil
}

// rateDielectric rates the field in the dielectric against its strength.
func (b *Bench) rateDielectric(s Spec) {
	if b.Dielectric != nil {
		b.DielectricField = b.DielectricVoltage / s.DielectricThickness
		b.DielectricMargin = b.Dielectric.Strength / b.DielectricField
		switch {
		case b.DielectricMargin < 1:
			b.stressf("dielectric over-stressed: %s across %s of %s is %s, above its strength %s; it will puncture",
				units.Format(b.DielectricVoltage, "V"), units.Format(s.DielectricThickness, "m"), b.Dielectric.Name,
				units.Format(b.DielectricField, "V/m"), units.Format(b.Dielectric.Strength, "V/m"))
		case b.DielectricMargin < 2:
			b.stressf("dielectric margin only %.2g: %s against a short-time strength of %s; pulsed duty wants a factor 2 or more (common practice)",
				b.DielectricMargin, units.Format(b.DielectricField, "V/m"), units.Format(b.Dielectric.Strength, "V/m"))
		}
	}

}

// rateChannel rates the channel gap: its Paschen breakdown against the peak voltage, the
// voltage it sees while the capacitors charge, and the shunt it needs.
func (b *Bench) rateChannel(s Spec, c Conditions) error {
	v0, c2 := c.ChargeVoltage, b.ChannelCapacitance
	gas, err := Gas("nitrogen")
	if err != nil {
		return err
	}
	if s.SecondaryEmission != 0 {
		gas.Gamma, gas.GammaSource = s.SecondaryEmission, "design file"
	}
	b.Townsend = gas
	b.ChannelPD = ReducedPD(c.Pressure, c.ChannelGap, c.Temperature)
	if vb, err := gas.Breakdown(b.ChannelPD); err == nil {
		b.ChannelBreakdown = vb
		b.Overvoltage = b.ChannelPeak / vb
	} else {
		b.warnf("channel gap left of the Paschen minimum (pd = %.3g Pa m): it breaks down only along longer paths", b.ChannelPD)
	}
	if c.Nitrogen < 0.9 {
		b.warnf("the Paschen constants are for pure N₂; this gas is %.0f %% N₂", 100*c.Nitrogen)
	}
	if c.Shunt || c.Transfer {
		b.ChannelCharging = 0
	} else {
		b.ChannelCharging = v0 * c2 / (c2 + c.GapCapacitance)
	}
	if !c.Shunt {
		b.ShuntNeeded = true
		if c.Transfer {
			b.warnf("no shunt across the peaking capacitor: the storage capacitor has no charging path except through the channel")
		} else if b.ChannelBreakdown > 0 && b.ChannelCharging >= b.ChannelBreakdown {
			b.stressf("channel self-fires before the switch: without a shunt it sees %s while charging, above its static breakdown %s; add a shunt inductor or resistor across it",
				units.Format(b.ChannelCharging, "V"), units.Format(b.ChannelBreakdown, "V"))
		} else {
			b.warnf("no shunt across the channel: C₂ charges only through the channel gap (it sees %s while charging); add a shunt inductor or resistor",
				units.Format(b.ChannelCharging, "V"))
		}
	}
	if b.ChannelBreakdown > 0 {
		switch {
		case b.Overvoltage < 1:
			b.warnf("the channel may not break down: the peak voltage %s is below its static breakdown %s",
				units.Format(b.ChannelPeak, "V"), units.Format(b.ChannelBreakdown, "V"))
		case b.Overvoltage < 1.5:
			b.warnf("little overvoltage on the channel (%.2g × static breakdown): breakdown will come late and slowly (common practice: fast discharges want 2× or more)", b.Overvoltage)
		}
	}

	return nil
}

// rateSwitchGap rates the spark gap: its static breakdown against the charge voltage.
func (b *Bench) rateSwitchGap(s Spec, c Conditions) error {
	v0 := c.ChargeVoltage
	b.SwitchGap = s.SwitchGap
	if b.SwitchGap == 0 {
		b.SwitchGap = c.SwitchGap
	}
	if b.SwitchGap > 0 && c.SwitchPressure > 0 {
		key := s.SwitchGas
		if key == "" {
			key = "air"
		}
		sg, err := Gas(key)
		if err != nil {
			return err
		}
		if vb, err := sg.Breakdown(ReducedPD(c.SwitchPressure, b.SwitchGap, 293.15)); err == nil {
			b.SwitchBreakdown = vb
			if vb < v0 {
				b.stressf("the %s spark gap breaks down at %s (static, %s gas), below the charge voltage %s: as described it self-breaks and the laser fires at about %s; the model still closes it at the full charge voltage, as a triggered or pressurised gap that holds would, so a run's results are for a switch this design does not describe",
					units.Format(b.SwitchGap, "m"), units.Format(vb, "V"), sg.Name, units.Format(v0, "V"), units.Format(vb, "V"))
			}
		}
	}

	return nil
}

// rateTiming rates the rise of the channel voltage and current against the effective
// lifetime of C(0), and the switch loop against the transit time of its plates.
func (b *Bench) rateTiming() {
	if b.UpperLifetime > 0 && b.VoltageRise > b.UpperLifetime {
		b.warnf("switch slower than the upper level: the channel voltage peaks %s after closure, %.2g × the effective C(0) lifetime %s",
			units.Format(b.VoltageRise, "s"), b.VoltageRise/b.UpperLifetime, units.Format(b.UpperLifetime, "s"))
	}
	if b.UpperLifetime > 0 && b.CurrentRise > b.UpperLifetime {
		b.warnf("channel loop slow: its current rises in %s, longer than the effective C(0) lifetime %s (lower the channel inductance)",
			units.Format(b.CurrentRise, "s"), units.Format(b.UpperLifetime, "s"))
	}
	if b.SwitchLine != nil && b.VoltageRise < 4*b.SwitchLine.TransitTime {
		b.stressf("the switch loop rings in %s, under 4 transit times of its plates (%s each way): they act as a transmission line and the lumped values are rough",
			units.Format(b.VoltageRise, "s"), units.Format(b.SwitchLine.TransitTime, "s"))
	}
}

func (b *Bench) warnf(format string, a ...any) {
	b.Warnings = append(b.Warnings, fmt.Sprintf(format, a...))
}

// stressf records a warning that is also a stress of the apparatus (see Stresses).
func (b *Bench) stressf(format string, a ...any) {
	b.warnf(format, a...)
	b.Stresses = append(b.Stresses, b.Warnings[len(b.Warnings)-1])
}
