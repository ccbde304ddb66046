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

// highFieldTd is the peak E/N above which the gas is too thin for the discharge to pump C(0)
// well [Td]: common practice, no source (nitrogen lasers run at a few hundred Td; above a
// thousand the electrons mostly ionise and run away).
const highFieldTd = 1000.0

// buildUp is the growth, as a power of e, that light in a resonator must make within the gain
// duration to rise from spontaneous emission to a pulse: e^10, the same ASEThreshold as the
// mirrorless rule (common practice, no source).
const buildUp = ASEThreshold

// nearThreshold bounds the rule's figure (net gain-length or its mirror equivalent) within
// which a shot is near the lasing threshold: from a quarter of ASEThreshold to 1.5 × it, below
// where amplified spontaneous emission saturates (gL ≈ 15–20; common practice, no source).
// There the output grows as e^(gL), so a small change of a design value moves it by orders of
// magnitude.
var nearThreshold = [2]float64{ASEThreshold / 4, 1.5 * ASEThreshold}

// Judgement is the verdict on one shot: whether it lases and, when it does not, the limiting
// cause and what to change.
type Judgement struct {
	Lases      bool    `json:"lases"`             // the threshold of the channel's optics is reached and light leaves the channel
	GainLength float64 `json:"net_gain_length"`   // highest channel-mean ∫g dz minus the distributed loss α·L
	Rule       string  `json:"rule"`              // the threshold applied: "open channel", "rear mirror" or "resonator"
	Figure     float64 `json:"figure"`            // the rule's figure, compared with ASEThreshold (gL; 2gL + ln R; round trips × round-trip gain)
	Cause      string  `json:"cause,omitempty"`   // the limiting cause in plain words; empty when it lases
	Advice     string  `json:"advice,omitempty"`  // what to change, naming design keys
	Summary    string  `json:"verdict,omitempty"` // one line for the run summary
}

// threshold applies the lasing rule of the channel's optics to the net gain-length gl:
//   - open channel (no mirror): gL ≥ ASEThreshold, amplified spontaneous emission saturates;
//   - one mirror of reflectivity R: the double pass 2gL + ln R ≥ ASEThreshold;
//   - two mirrors: R_rear·R_front·e^(2gL) > 1 and the light builds up by e^buildUp within the
//     gain duration τ_g, i.e. (c·τ_g/2L)·(2gL + ln R_rear·R_front) ≥ buildUp, or the double
//     pass off the better mirror alone reaches ASEThreshold.
//
// It returns the rule's name, its figure (compared with ASEThreshold) and a phrase for the
// summary.
func threshold(d *design.Design, s Summary, gl float64) (rule string, figure float64, text string) {
	r1, r2 := d.Optics.RearReflectivity, d.Optics.FrontReflectivity
	switch {
	case r1 <= 0 && r2 <= 0:
		return "open channel", gl, fmt.Sprintf("net gain-length %.3g", gl)
	case r1 <= 0 || r2 <= 0:
		r := math.Max(r1, r2)
		f := 2*gl + math.Log(r)
		return "rear mirror", f, fmt.Sprintf("double pass off the mirror 2gL + ln R = %.3g (gL %.3g, R %.3g)", f, gl, r)
	}
	round := 2*gl + math.Log(r1*r2)
	trips := units.SpeedOfLight * s.InversionDuration / (2 * d.Channel.Length)
	f := trips * round
	if dp := 2*gl + math.Log(math.Max(r1, r2)); dp > f {
		f = dp
	}
	return "resonator", f, fmt.Sprintf("round-trip gain R_rear·R_front·e^(2gL) = e^%.3g over %.3g round trips in the gain's %s (gL %.3g): build-up exponent %.3g",
		round, trips, units.Format(s.InversionDuration, "s"), gl, f)
}

// Verdict judges a shot r of design d by the lasing rule of its optics (see threshold): an
// open channel by the net gain-length of amplified spontaneous emission, one mirror by the
// double pass, a resonator by its round-trip gain and the build-up within the gain duration.
// When it does not lase, the cause is the first that applies of: an excitation front slower
// than the C(0) lifetime allows; E/N far too high (gas too thin); no breakdown (switch
// resistance or closing time, slow rise, or too little voltage for the gap); oxygen
// quenching; a channel too short for the rule where the gain lasts long enough for light to
// use more; pressure too high; the switch or the current rise too slow; E/N low; else gain
// too low or too brief. Each advice names a design key and the way to move it.
func Verdict(d *design.Design, r *Result) Judgement {
	if d == nil || r == nil {
		return Judgement{Cause: "no result", Summary: "no result"}
	}
	s := r.Summary
	j := Judgement{GainLength: s.GainLength - d.Optics.Loss*d.Channel.Length}
	rule, fig, text := threshold(d, s, j.GainLength)
	j.Rule, j.Figure = rule, fig
	if fig >= ASEThreshold && s.EnergyTotal > 0 {
		j.Lases = true
		if rule == "open channel" {
			j.Summary = fmt.Sprintf("lases: net gain-length %.3g ≥ %.0f (amplified spontaneous emission saturates)", j.GainLength, ASEThreshold)
		} else {
			j.Summary = fmt.Sprintf("lases (%s): %s ≥ %.0f", rule, text, ASEThreshold)
		}
		j.Summary += thresholdNote(s, fig)
		return j
	}
	j.Cause, j.Advice = limitingCause(d, r, j)
	j.Summary = fmt.Sprintf("does not lase (%s): %s < %.0f; %s", rule, text, ASEThreshold, j.Cause)
	if rule == "open channel" {
		j.Summary = fmt.Sprintf("does not lase: net gain-length %.3g < %.0f; %s", j.GainLength, ASEThreshold, j.Cause)
	}
	j.Summary += thresholdNote(s, fig)
	return j
}

// thresholdNote is the note of a shot near the lasing threshold (see nearThreshold), or "".
// Such a shot sits on a cliff: past the best gap of a design, for one, the peak E/N falls
// toward the breakdown region, where the ionisation rate that drives the avalanche rises
// steeply with E/N (about as (E/N)⁵ near 220 Td in N₂, the project's swarm table), so the
// electron density, the gain and, through e^(gL), the output all collapse within a small step.
func thresholdNote(s Summary, figure float64) string {
	if figure < nearThreshold[0] || figure >= nearThreshold[1] || s.PeakElectronDensity <= 0 {
		return ""
	}
	return fmt.Sprintf("; near threshold: the output grows as e^(gL) here and the avalanche steeply with E/N (peak %.0f Td), so a small change of circuit.charge_voltage, channel.gap or gas.pressure moves the output by orders of magnitude",
		s.PeakReducedField)
}

// fieldAdvice is the advice for too little E/N.
func fieldAdvice(d *design.Design) string {
	return fmt.Sprintf("raise circuit.charge_voltage (now %s) or narrow channel.gap (now %s)",
		units.Format(d.Circuit.ChargeVoltage, "V"), units.Format(d.Channel.Gap, "m"))
}

// switchCause names a switch that limits the discharge, or returns "": an on-resistance above
// the switch loop's characteristic impedance sqrt(L_s/C₁) (the loop is overdamped), or an
// exponential switch that closes slower than the effective C(0) lifetime and than the
// circuit's own voltage rise.
func switchCause(d *design.Design, tauEff, rise float64) (cause, advice string) {
	sw, c := d.Switch, d.Circuit
	z := math.Sqrt(c.SwitchInductance / c.SwitchCapacitance)
	if sw.OnResistance > z {
		return fmt.Sprintf("switch resistance too high: switch.on_resistance %s is above the switch loop's impedance sqrt(L_s/C₁) = %s, so the loop is overdamped and the channel voltage creeps up",
				units.Format(sw.OnResistance, "Ω"), units.Format(z, "Ω")),
			fmt.Sprintf("lower switch.on_resistance (now %s) well below %s", units.Format(sw.OnResistance, "Ω"), units.Format(z, "Ω"))
	}
	if sw.Model == design.ExponentialSwitch && sw.RiseTime > tauEff && sw.RiseTime > rise {
		return fmt.Sprintf("switch too slow: it closes with a time constant of %s, longer than the effective C(0) lifetime %s and the circuit's own rise %s",
				units.Format(sw.RiseTime, "s"), units.Format(tauEff, "s"), units.Format(rise, "s")),
			fmt.Sprintf("lower switch.rise_time (now %s): use a faster switch", units.Format(sw.RiseTime, "s"))
	}
	return "", ""
}

func limitingCause(d *design.Design, r *Result, j Judgement) (cause, advice string) {
	s := r.Summary
	gl := j.GainLength
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
	length := d.Channel.Length
	if v := d.Optics.ExcitationVelocity; !math.IsInf(v, 0) && v != 0 && length/math.Abs(v) > tauEff {
		return fmt.Sprintf("excitation front too slow: at %s it takes %s to cross the channel, %.3g × the effective C(0) lifetime %s",
				units.Format(math.Abs(v), "m/s"), units.Format(length/math.Abs(v), "s"), length/math.Abs(v)/tauEff, units.Format(tauEff, "s")),
			fmt.Sprintf("raise optics.excitation_velocity (now %s) toward \"c\" or \"infinite\" (feed the channel along its whole length at once)",
				units.Format(v, "m/s"))
	}
	if s.PeakReducedField > highFieldTd {
		return fmt.Sprintf("gas too thin: E/N reached %.3g Td, far above the few hundred Td at which a discharge pumps C(0) (gas at %s)",
				s.PeakReducedField, units.Format(d.Gas.Pressure, "Pa")),
			fmt.Sprintf("raise gas.pressure (now %s)", units.Format(d.Gas.Pressure, "Pa"))
	}
	if s.PeakElectronDensity < breakdownDensity || s.PeakReducedField < minFieldTd {
		if c, a := switchCause(d, tauEff, rise); c != "" {
			return c, a
		}
		// A channel driven well over its static breakdown that still did not break down was
		// driven too slowly; otherwise the voltage or the gap is at fault.
		if err == nil && b.Overvoltage >= 2 && rise > tauEff {
			return slow()
		}
		return fmt.Sprintf("E/N too low: the peak was %.0f Td and the electron density reached %.2g m⁻³ (the channel hardly broke down)",
			s.PeakReducedField, s.PeakElectronDensity), fieldAdvice(d)
	}
	g := d.Gas
	n := gasDensity(g)
	tauC := radiativeUpperLifetime(d)
	oxShare := g.Oxygen * d.Levels.UpperQuenchingOxygen * n * tauEff
	if oxShare > 0.5 {
		return fmt.Sprintf("oxygen quenching: O₂ removes %.0f %% of C(0), whose lifetime falls to %s", 100*oxShare, units.Format(tauEff, "s")),
			fmt.Sprintf("flush with nitrogen: lower gas.oxygen (now %.3g)", g.Oxygen)
	}
	if c, a := shortCause(d, s, j); c != "" {
		return c, a
	}
	if g.Pressure > 1.2*units.Atmosphere {
		return fmt.Sprintf("pressure too high: at %s collisions cut the C(0) lifetime from %s to %s", units.Format(g.Pressure, "Pa"),
				units.Format(tauC, "s"), units.Format(tauEff, "s")),
			fmt.Sprintf("lower gas.pressure (now %s) toward 1 atm or below", units.Format(g.Pressure, "Pa"))
	}
	if c, a := switchCause(d, tauEff, rise); c != "" {
		return c, a
	}
	if err == nil && rise > tauEff {
		return slow()
	}
	if s.PeakReducedField < 2*minFieldTd {
		return fmt.Sprintf("E/N too low: the peak was %.0f Td", s.PeakReducedField), fieldAdvice(d)
	}
	mean := gl / length
	return fmt.Sprintf("gain too low or too brief: channel-mean gain %.3g cm⁻¹ for %s", mean/100, units.Format(s.InversionDuration, "s")),
		"run with --sensitivity to see which design keys move the output most"
}

// shortCause names a channel too short for the optics' rule, when lengthening it (at the same
// channel-mean gain) reaches the threshold and the gain lasts long enough for light to cross
// the longer channel; otherwise it returns "".
func shortCause(d *design.Design, s Summary, j Judgement) (cause, advice string) {
	length := d.Channel.Length
	mean := j.GainLength / length // net channel-mean gain [m⁻¹]
	reach := units.SpeedOfLight * s.InversionDuration
	if mean <= 0 || reach <= 0 {
		return "", ""
	}
	r1, r2 := d.Optics.RearReflectivity, d.Optics.FrontReflectivity
	var need float64
	var mirror string
	switch j.Rule {
	case "open channel":
		need = ASEThreshold / mean
		mirror = "; or fit a rear mirror: raise optics.rear_reflectivity (now 0) toward 1"
	case "rear mirror":
		r := math.Max(r1, r2)
		need = (ASEThreshold - math.Log(r)) / (2 * mean)
		if r < 0.9 {
			key := "optics.rear_reflectivity"
			if r2 > r1 {
				key = "optics.front_reflectivity"
			}
			mirror = fmt.Sprintf("; or raise %s (now %.3g) toward 1", key, r)
		}
	default:
		// Build-up (c·τ_g/2L')·(2ḡL' + ln R₁R₂) = buildUp at length L': c·τ_g·ḡ + c·τ_g·ln(R₁R₂)/(2L').
		ct := reach
		if ct*mean <= buildUp {
			return "", ""
		}
		need = ct * math.Log(r1*r2) / (2 * (buildUp - ct*mean))
		if r2 < 0.9 {
			mirror = fmt.Sprintf("; or raise optics.front_reflectivity (now %.3g)", r2)
		}
	}
	if need <= length || need > reach {
		return "", ""
	}
	return fmt.Sprintf("channel too short: a channel-mean gain of %.3g cm⁻¹ over %s gives gL %.3g", mean/100, units.Format(length, "m"), j.GainLength),
		fmt.Sprintf("lengthen channel.length to about %s (the gain lasts %s, long enough for light to cross %s)%s",
			units.Format(need, "m"), units.Format(s.InversionDuration, "s"), units.Format(reach, "m"), mirror)
}
