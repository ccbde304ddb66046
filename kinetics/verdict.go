package kinetics

import (
	"fmt"
	"math"

	"n2pulse/kinetics/build"
	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// ASEThreshold is the net gain-length ∫(g − α)dz above which amplified spontaneous emission
// dominates and a mirrorless channel lases: common practice, no source, gL ≈ 10–20; the low
// end is taken.
const ASEThreshold = 10.0

// minFieldTd is the peak E/N below which a discharge pumps C(0) poorly [Td]: common practice,
// no source (nitrogen lasers run at a few hundred Td).
const minFieldTd = 150.0

// breakdownDensity is the electron density below which the channel counts as not broken down
// [m⁻³]: common practice, no source (a glow of 10¹³ cm⁻³ and up carries the laser current).
const breakdownDensity = 1e19

// Judgement is the verdict on one shot: whether it lases and, when it does not, the limiting
// cause and what to change.
type Judgement struct {
	Lases      bool    `json:"lases"`             // net gain-length at or above ASEThreshold and output leaving the channel
	GainLength float64 `json:"net_gain_length"`   // highest ∫g dz minus the distributed loss α·L
	Cause      string  `json:"cause,omitempty"`   // the limiting cause in plain words; empty when it lases
	Advice     string  `json:"advice,omitempty"`  // what to change, naming design keys
	Summary    string  `json:"verdict,omitempty"` // one line for the run summary
}

// Verdict judges a shot r of design d: it lases when the net gain-length reaches ASEThreshold
// (and light leaves the channel). When it does not, the cause is the first that applies of:
// the channel did not break down or E/N stayed low (voltage or gap); oxygen quenching; a channel
// shorter than 10/g where the gain lasts long enough for light to cross more; pressure too high;
// current rise too slow against the effective C(0) lifetime (inductance).
func Verdict(d *design.Design, r *Result) Judgement {
	if d == nil || r == nil {
		return Judgement{Cause: "no result", Summary: "no result"}
	}
	s := r.Summary
	j := Judgement{GainLength: s.GainLength - d.Optics.Loss*d.Channel.Length}
	if j.GainLength >= ASEThreshold && s.EnergyTotal > 0 {
		j.Lases = true
		j.Summary = fmt.Sprintf("lases: net gain-length %.3g ≥ %.0f (amplified spontaneous emission saturates)", j.GainLength, ASEThreshold)
		return j
	}
	j.Cause, j.Advice = limitingCause(d, r, j.GainLength)
	j.Summary = fmt.Sprintf("does not lase: net gain-length %.3g < %.0f; %s", j.GainLength, ASEThreshold, j.Cause)
	return j
}

func limitingCause(d *design.Design, r *Result, gl float64) (cause, advice string) {
	s := r.Summary
	tauEff := EffectiveUpperLifetime(d)
	b, err := Bench(d, build.Spec{})
	rise := math.Inf(1)
	if err == nil {
		rise = b.VoltageRise
	}
	slow := func() (string, string) {
		note := ""
		if rise > s.EndTime {
			note = fmt.Sprintf(", beyond the simulated %s", units.Format(s.EndTime, "s"))
		}
		return fmt.Sprintf("current rise too slow: the channel voltage peaks %s after closure%s, %.2g × the effective C(0) lifetime %s",
				units.Format(rise, "s"), note, rise/tauEff, units.Format(tauEff, "s")),
			fmt.Sprintf("lower circuit.switch_inductance (now %s) and circuit.channel_inductance (now %s), or use smaller capacitors",
				units.Format(d.Circuit.SwitchInductance, "H"), units.Format(d.Circuit.ChannelInductance, "H"))
	}
	if s.PeakElectronDensity < breakdownDensity || s.PeakReducedField < minFieldTd {
		// A channel driven well over its static breakdown that still did not break down was
		// driven too slowly; otherwise the voltage or the gap is at fault.
		if err == nil && b.Overvoltage >= 2 && rise > tauEff {
			return slow()
		}
		return fmt.Sprintf("E/N too low: the peak was %.0f Td and the electron density reached %.2g m⁻³ (the channel hardly broke down)",
				s.PeakReducedField, s.PeakElectronDensity),
			fmt.Sprintf("raise circuit.charge_voltage (now %s) or narrow channel.gap (now %s)",
				units.Format(d.Circuit.ChargeVoltage, "V"), units.Format(d.Channel.Gap, "m"))
	}
	g := d.Gas
	n := gasDensity(g)
	tauC := radiativeUpperLifetime(d)
	oxShare := g.Oxygen * d.Levels.UpperQuenchingOxygen * n * tauEff
	if oxShare > 0.5 {
		return fmt.Sprintf("oxygen quenching: O₂ removes %.0f %% of C(0), whose lifetime falls to %s", 100*oxShare, units.Format(tauEff, "s")),
			fmt.Sprintf("flush with nitrogen: lower gas.oxygen (now %.3g)", g.Oxygen)
	}
	gain := s.PeakGain - d.Optics.Loss
	reach := units.SpeedOfLight * s.InversionDuration // the length light crosses while the gain lasts
	if gain > 0 {
		need := ASEThreshold / gain
		if need <= reach {
			return fmt.Sprintf("channel too short: a gain of %.3g cm⁻¹ over %s gives gL %.3g", gain/100, units.Format(d.Channel.Length, "m"), gl),
				fmt.Sprintf("lengthen channel.length to about %s (the gain lasts %s, long enough for light to cross %s)",
					units.Format(need, "m"), units.Format(s.InversionDuration, "s"), units.Format(reach, "m"))
		}
	}
	if g.Pressure > 1.2*units.Atmosphere {
		return fmt.Sprintf("pressure too high: at %s collisions cut the C(0) lifetime from %s to %s", units.Format(g.Pressure, "Pa"),
				units.Format(tauC, "s"), units.Format(tauEff, "s")),
			fmt.Sprintf("lower gas.pressure (now %s) toward 1 atm or below", units.Format(g.Pressure, "Pa"))
	}
	if err == nil && rise > tauEff {
		return slow()
	}
	if s.PeakReducedField < 2*minFieldTd {
		return fmt.Sprintf("E/N too low: the peak was %.0f Td", s.PeakReducedField),
			fmt.Sprintf("raise circuit.charge_voltage (now %s) or narrow channel.gap (now %s)",
				units.Format(d.Circuit.ChargeVoltage, "V"), units.Format(d.Channel.Gap, "m"))
	}
	return fmt.Sprintf("gain too low or too brief: peak %.3g cm⁻¹ for %s", gain/100, units.Format(s.InversionDuration, "s")),
		"run with --sensitivity to see which design keys move the output most"
}
