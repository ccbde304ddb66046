package kinetics

import (
	"fmt"
	"math"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/spectro"
	"n2pulse/kinetics/swarm"
	"n2pulse/units"
)

// Run simulates one shot of the design and returns the waveforms and figures of merit.
// Errors name what failed: a design value out of range, a swarm table that cannot be read,
// or an integration that did not converge.
func Run(d *design.Design, s *RunSettings) (*Result, error) {
	if s == nil {
		s = &RunSettings{}
	}
	if err := d.Validate(); err != nil {
		return nil, err
	}
	table, err := swarmTable(d, s.CacheDir)
	if err != nil {
		return nil, err
	}
	// Three-body attachment is tabulated at 1 atm and 300 K: rescale it to this gas.
	if table, err = table.AtDensity(gasDensity(d.Gas)); err != nil {
		return nil, err
	}
	par, overridden, err := laserParameters(d)
	if err != nil {
		return nil, err
	}

	var warnings []string
	var warning string
	if par.OpticalArea, warning = opticalArea(d.Channel); warning != "" {
		warnings = append(warnings, warning)
	}
	n := d.Numerics.Cells
	par.CellLength = d.Channel.Length / float64(n)
	par.TimeStep = par.CellLength / units.SpeedOfLight

	circ, wf, sh, res, end, err := followPulse(d, table, &par, s)
	if err != nil {
		return nil, err
	}
	res.Summary.Overridden = overridden
	res.Summary.EndTime = float64(sh.steps) * par.TimeStep
	res.Summary.Truncated = sh.unfinished()
	sh.summarise(res)
	warnings = append(warnings, heatingSummary(&res.Summary, d, sh)...)
	res.Warnings = append(res.Warnings, warnings...)
	if err := checkFiniteLight(&res.Summary, d, par); err != nil {
		return nil, err
	}
	if err := checkPumpBound(&res.Summary); err != nil {
		return nil, err
	}
	dischargeSummary(&res.Summary, wf)
	account(d, &res.Parameters, wf, &res.Summary)
	res.Stats.TableBelow, res.Stats.TableAbove = circ.below, circ.above
	if wf.fieldAbove {
		lo, hi := table.Range()
		res.Warnings = append(res.Warnings, fmt.Sprintf(
			"E/N reached %.0f Td, above the swarm table (%.0f–%.0f Td): coefficients were clamped at the top row",
			wf.peakField/units.Townsend, lo/units.Townsend, hi/units.Townsend))
	}
	switch {
	case res.Summary.Truncated:
		res.Warnings = append(res.Warnings, fmt.Sprintf(
			"truncated: the pulse had not ended at %s, the longest this run may take (%s; numerics.end_time = %s): energy and widths are cut short",
			units.Format(res.Summary.EndTime, "s"), endCapRule, units.Format(d.Numerics.EndTime, "s")))
	case end > d.Numerics.EndTime:
		res.Warnings = append(res.Warnings, fmt.Sprintf(
			"the pulse outlasted numerics.end_time = %s: the run continued to %s",
			units.Format(d.Numerics.EndTime, "s"), units.Format(res.Summary.EndTime, "s")))
	}
	// The apparatus as `bench` rates it: a run repeats its stress warnings when the design has
	// the data (a [build] section, a spark gap).
	res.Summary.SwitchHoldsCharge = true
	if b, err := Bench(d, d.Build); err == nil {
		for _, w := range b.Stresses {
			res.Warnings = append(res.Warnings, "apparatus: "+w)
		}
		res.Summary.SwitchBreakdown = b.SwitchBreakdown
		res.Summary.SwitchHoldsCharge = b.SwitchBreakdown == 0 || b.SwitchBreakdown >= d.Circuit.ChargeVoltage
	}
	if d.Gas.Helium > 0 {
		res.Summary.Validity = HeliumNote
	}
	res.Summary.Derived = append([]string(nil), d.Derived...)
	res.Summary.Warnings = append([]string(nil), res.Warnings...)
	v := Verdict(d, res)
	res.Summary.Lases, res.Summary.Verdict, res.Summary.Advice = v.Lases, v.Summary, v.Advice
	res.Summary.Regime = regimeChecks(d, &res.Parameters, wf, &res.Summary)
	res.Summary.UniformGlow = true
	if note := regimeNote(res.Summary.Regime); note != "" {
		res.Summary.UniformGlow = false
		res.Summary.Verdict += "; " + note
	}
	if !res.Summary.SwitchHoldsCharge {
		res.Summary.Verdict += "; " + switchNote(res.Summary.SwitchBreakdown, d.Circuit.ChargeVoltage)
	}
	if note := pulsesNote(&res.Summary, sh.train.riseSpans); note != "" {
		res.Summary.Verdict += "; " + note
	}
	if note := widthNote(&res.Summary); note != "" {
		res.Summary.Verdict += "; " + note
	}
	if s.Light || s.SummaryOnly {
		res.dropSeries()
	}
	return res, nil
}

// switchNote is the verdict's clause for a spark gap that self-breaks below the charge
// voltage: the shot was computed as if the gap held until closure, which the design as
// described cannot do.
func switchNote(breakdown, charge float64) string {
	return fmt.Sprintf("the spark gap as described self-breaks at %s, below the %s charge: this result is for a triggered or pressurised gap that holds the full charge, not for the gap described",
		units.Format(breakdown, "V"), units.Format(charge, "V"))
}

// pulsesNote is the verdict's clause for an output of separate pulses (Summary.Pulses ≥ 2):
// the FWHM then spans them all, and so does the 10–90 % rise when riseSpans (the first pulse
// stays below 90 % of the highest); "" for one pulse or none.
func pulsesNote(s *Summary, riseSpans bool) string {
	if s.Pulses < 2 {
		return ""
	}
	spans := fmt.Sprintf("the FWHM of %s spans them", units.Format(s.FWHM, "s"))
	if riseSpans {
		spans = fmt.Sprintf("the FWHM of %s and the 10–90 %% rise of %s span them", units.Format(s.FWHM, "s"), units.Format(s.Rise, "s"))
	}
	return fmt.Sprintf("the output is %d separate pulses, the first two %s apart (the power falls below %.0f %% of its peak between them): %s, the strongest pulse alone is %s wide",
		s.Pulses, units.Format(s.PulseSeparation, "s"), 100*DipLevel, spans, units.Format(s.StrongestPulseFWHM, "s"))
}

// widthNote is the verdict's clause for an ill-conditioned FWHM (Summary.FWHMIllConditioned):
// an edge of the width leaps as the level moves inside the band around half the peak, or the
// width changes steeply with the level there, so the FWHM may move by that much with a small
// change of the model; "" otherwise.
func widthNote(s *Summary) string {
	if !s.FWHMIllConditioned {
		return ""
	}
	why := fmt.Sprintf("a maximum of the output tops out within %.0f %% of half the peak, so an edge of the width leaps by %s as the level moves", 100*HalfMaxBand, units.Format(s.FWHMJump, "s"))
	if !(s.FWHMJump > JumpLimit*s.FWHM) {
		why = "the output lies nearly flat near half the peak, so the width changes steeply with the level"
	}
	return fmt.Sprintf("the FWHM of %s is ill-conditioned: %s: %s at %.0f %% of the peak, %s at %.0f %%; the width from the rms duration, %s, follows such changes smoothly",
		units.Format(s.FWHM, "s"), why, units.Format(s.FWHMAt45, "s"), 100*(0.5-HalfMaxBand), units.Format(s.FWHMAt55, "s"), 100*(0.5+HalfMaxBand), units.Format(s.RMSWidth, "s"))
}

// HeliumNote is the validity note of a design with helium: the model has no helium kinetics,
// and builders report the opposite trend to the model's.
const HeliumNote = "helium is modelled only through the electron energy balance and dilution (no He metastables or Penning ionisation; C(0) quenching by He is levels.upper_quenching_helium, 0 by default for want of a published value): adding helium at fixed N₂ pressure raises this model's output, where builders report lower peak power and longer pulses; treat results with helium as unvalidated"

// opticalArea returns the optical cross-section of the channel [m²]: channel.aperture when
// given and not larger than the discharge cross-section gap × width, else that cross-section,
// with a warning when the aperture was larger. Light gains only inside the excited volume: an
// optical cross-section larger than the discharge's would multiply the photons of the same
// populations.
func opticalArea(ch design.Channel) (area float64, warning string) {
	area = ch.Gap * ch.Width // the discharge cross-section
	if a := ch.Aperture; a > area {
		warning = fmt.Sprintf(
			"channel.aperture = %s is larger than the discharge cross-section channel.gap × channel.width = %s: the optics use %s (no gain outside the excited volume)",
			squareMM(a), squareMM(area), squareMM(area))
	} else if a > 0 {
		area = a
	}
	return area, warning
}

// followPulse solves the circuit and takes the shot to numerics.end_time; a shot whose output,
// gain or discharge is not over by then runs again to twice the time, up to PulseTimeCap and
// as far as the memory limit allows (memoryBound then says so). It returns the last attempt
// and its end time [s]; a first attempt above the memory limit is a *MemoryError.
func followPulse(d *design.Design, table *swarm.Table, par *Parameters, s *RunSettings) (*circuit, *waveforms, *shot, *Result, float64, error) {
	end, endCap := d.Numerics.EndTime, PulseTimeCap(d.Numerics.EndTime)
	limit := float64(memoryLimit(s))
	cells := float64(d.Numerics.Cells)
	if runBytes(math.Ceil(end/par.TimeStep), cells, s) > limit {
		return nil, nil, nil, nil, 0, memoryError(d, end, s)
	}
	for {
		steps := int(math.Ceil(end / par.TimeStep))
		circ := newCircuit(d, table)
		par.GapCapacitance = circ.cg
		wf, res, sh, err := circuitAndShot(circ, d, par, steps, s)
		if err != nil {
			return nil, nil, nil, nil, 0, err
		}
		if !sh.unfinished() || end >= endCap {
			return circ, wf, sh, res, end, nil
		}
		next := math.Min(2*end, endCap)
		if runBytes(math.Ceil(next/par.TimeStep), cells, s) > limit {
			res.Warnings = append(res.Warnings, fmt.Sprintf(
				"the pulse was still going at %s, and following it to %s would need about %s of memory, above the limit of %s (--memory-limit)",
				units.Format(end, "s"), units.Format(next, "s"),
				formatBytes(int64(math.Min(runBytes(math.Ceil(next/par.TimeStep), cells, s), math.MaxInt64/2))), formatBytes(int64(limit))))
			return circ, wf, sh, res, end, nil
		}
		end = next
	}
}

// circuitAndShot solves the circuit and takes the shot through steps. With
// RunSettings.Overlap the two run at once (circuitFeed), else one after the other; the
// results are the same bit for bit, and so is the error of a circuit that fails.
func circuitAndShot(circ *circuit, d *design.Design, par *Parameters, steps int, s *RunSettings) (*waveforms, *Result, *shot, error) {
	series := !s.Light && !s.SummaryOnly
	if !overlapWanted(s) {
		wf, stats, err := solveCircuit(circ, d, par, steps, series)
		if err != nil {
			return nil, nil, nil, err
		}
		res := &Result{Parameters: *par, Stats: stats}
		sh := newShot(d, &res.Parameters, wf, steps, s)
		sh.run(res)
		return wf, res, sh, nil
	}
	res := &Result{Parameters: *par}
	feed := startCircuit(circ, d, par, steps, series)
	sh := newShot(d, &res.Parameters, feed.wf, steps, s)
	sh.feed = feed
	sh.run(res)
	stats, err := feed.wait()
	sh.feed = nil
	if err != nil {
		return nil, nil, nil, err
	}
	res.Stats.Circuit = stats.Circuit
	return feed.wf, res, sh, nil
}

// dischargeSummary copies the figures of the circuit and discharge into the summary: stored
// and deposited energy, the energy balance, the peaks of E/N, current and electron density,
// and the efficiency (total output over stored energy).
func dischargeSummary(s *Summary, wf *waveforms) {
	s.StoredEnergy = wf.stored
	s.DepositedEnergy = wf.deposited
	s.EnergyBalanceResidual = wf.energyResidual
	s.PeakReducedField = wf.peakField / units.Townsend
	s.PeakCurrent = wf.peakCurrent
	s.PeakElectronDensity = wf.peakDensity
	if wf.stored > 0 {
		s.Efficiency = s.EnergyTotal / wf.stored
	}
}

// dropSeries removes the waveforms and the gain map, keeping the summary (RunSettings.Light,
// RunSettings.SummaryOnly).
func (r *Result) dropSeries() {
	r.Time, r.ChannelVoltage, r.Current, r.ReducedField = nil, nil, nil, nil
	r.ElectronDensity, r.UpperLevel, r.LowerLevel = nil, nil, nil
	r.PowerFront, r.PowerRear, r.MeanGain = nil, nil, nil
	r.Z, r.GainTime, r.Gain = nil, nil, nil
}

// endCapRule says in words how far PulseTimeCap lets a run follow its pulse.
const endCapRule = "16 × numerics.end_time, at most 10 µs"

// PulseTimeCap is the longest time a run follows a pulse that outlasts its end time:
// 16 × endTime, at most 10 µs (but never below endTime) [s].
func PulseTimeCap(endTime float64) float64 {
	return math.Max(endTime, math.Min(16*endTime, 10e-6))
}

// squareMM formats an area in mm² (units.Format would put its prefix on the metre).
func squareMM(a float64) string { return fmt.Sprintf("%.3g mm²", a*1e6) }

// checkFiniteLight refuses a shot whose light is not a finite number. The single-pass gain
// factor of a cell, e^(σ·ΔN·Δz), overflows a float64 beyond 709 e-folds in one cell, which
// only an effective cross section far above the computed one (or very long cells) can reach;
// the error names those keys.
func checkFiniteLight(s *Summary, d *design.Design, p Parameters) error {
	if !math.IsNaN(s.EnergyTotal) && !math.IsInf(s.EnergyTotal, 0) && !math.IsNaN(s.PeakPower) && !math.IsInf(s.PeakPower, 0) {
		return nil
	}
	return &design.KeyError{Key: "spectroscopy.cross_section", Value: fmt.Sprintf("%.3g m²", p.CrossSection),
		Problem: fmt.Sprintf("the gain of one cell (%s long, numerics.cells = %d) overflowed: e^(σ·ΔN·Δz) beyond e^709 gives no finite pulse; lower the cross section toward the computed value (0) or give more cells",
			units.Format(p.CellLength, "m"), d.Numerics.Cells)}
}

// checkPumpBound is the invariant energy in ≥ light out: the pulse energy cannot exceed one
// laser photon for every excitation into C(0) of the discharge volume. A violation is a
// fault of the model, not of the design, and is returned as an error.
func checkPumpBound(s *Summary) error {
	if s.EnergyTotal <= s.UpperPumpedPhotonEnergy*(1+1e-9) {
		return nil
	}
	return fmt.Errorf("kinetics: the pulse energy %s exceeds the %s of one laser photon per excitation into C(0): light from nowhere, a fault of the model (please report it with the design)",
		units.Format(s.EnergyTotal, "J"), units.Format(s.UpperPumpedPhotonEnergy, "J"))
}

// laserParameters takes σ, g_C/g_B, A₀₀, τ_C, f_C, f_B and λ from package spectro for the
// design's pressure and temperature, then applies the design's overrides.
func laserParameters(d *design.Design) (Parameters, []string, error) {
	lp, err := spectro.Laser(d.Gas.Pressure, d.Gas.Temperature)
	if err != nil {
		return Parameters{}, nil, fmt.Errorf("kinetics: spectroscopy: %w", err)
	}
	p := Parameters{
		CrossSection: lp.CrossSection, DegeneracyRatio: lp.DegeneracyRatio,
		EinsteinA00: lp.EinsteinA00, UpperLifetime: lp.UpperLifetime,
		UpperShare: lp.UpperShare, LowerShare: lp.LowerShare, Wavelength: lp.VacuumWavelength,
		UpperEnergy: lp.UpperEnergy, UpperShare1: lp.UpperShare1,
	}
	var over []string
	o := d.Spectroscopy
	for _, x := range []struct {
		key string
		v   float64
		dst *float64
	}{
		{"spectroscopy.cross_section", o.CrossSection, &p.CrossSection},
		{"spectroscopy.degeneracy_ratio", o.DegeneracyRatio, &p.DegeneracyRatio},
		{"spectroscopy.einstein_a00", o.EinsteinA00, &p.EinsteinA00},
		{"spectroscopy.upper_lifetime", o.UpperLifetime, &p.UpperLifetime},
		{"spectroscopy.upper_share", o.UpperShare, &p.UpperShare},
		{"spectroscopy.lower_share", o.LowerShare, &p.LowerShare},
		{"spectroscopy.wavelength", o.Wavelength, &p.Wavelength},
	} {
		if x.v != 0 {
			*x.dst = x.v
			over = append(over, x.key)
		}
	}
	if p.EinsteinA00*p.UpperLifetime > 1 {
		return p, over, &design.KeyError{Key: "spectroscopy.einstein_a00", Value: fmt.Sprintf("%g s⁻¹", p.EinsteinA00),
			Problem: fmt.Sprintf("A₀₀ exceeds the total radiative rate 1/τ_C = %g s⁻¹", 1/p.UpperLifetime)}
	}
	p.PhotonEnergy = units.Planck * units.SpeedOfLight / p.Wavelength
	p.GasDensity = gasDensity(d.Gas)
	p.UpperDecayRate = upperDecayRate(d.Levels, p.UpperLifetime, d.Gas)
	p.LowerDecayRate = lowerDecayRate(d.Levels, d.Gas)
	return p, over, nil
}
