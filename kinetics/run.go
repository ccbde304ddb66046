package kinetics

import (
	"errors"
	"fmt"
	"math"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/ode"
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
	par.OpticalArea = d.Channel.Gap * d.Channel.Width // the discharge cross-section
	if a := d.Channel.Aperture; a > par.OpticalArea {
		// Light gains only inside the excited volume: an optical cross-section larger than
		// the discharge's would multiply the photons of the same populations.
		warnings = append(warnings, fmt.Sprintf(
			"channel.aperture = %s is larger than the discharge cross-section channel.gap × channel.width = %s: the optics use %s (no gain outside the excited volume)",
			squareMM(a), squareMM(par.OpticalArea), squareMM(par.OpticalArea)))
	} else if a > 0 {
		par.OpticalArea = a
	}
	n := d.Numerics.Cells
	par.CellLength = d.Channel.Length / float64(n)
	par.TimeStep = par.CellLength / units.SpeedOfLight

	// The end time follows the pulse: a shot whose output, gain or discharge is not over at
	// numerics.end_time runs again to twice the time, up to the cap.
	end, endCap := d.Numerics.EndTime, PulseTimeCap(d.Numerics.EndTime)
	var (
		circ *circuit
		wf   *waveforms
		sh   *shot
		res  *Result
	)
	for {
		steps := int(math.Ceil(end / par.TimeStep))
		circ = newCircuit(d, table)
		par.GapCapacitance = circ.cg
		var stats Stats
		wf, stats, err = solveCircuit(circ, d, &par, steps)
		if err != nil {
			return nil, err
		}
		res = &Result{Parameters: par, Stats: stats}
		sh = newShot(d, &res.Parameters, wf, steps, s)
		sh.run(res)
		if !sh.unfinished() || end >= endCap {
			break
		}
		end = math.Min(2*end, endCap)
	}
	res.Summary.Overridden = overridden
	res.Summary.EndTime = float64(sh.steps) * par.TimeStep
	res.Summary.Truncated = sh.unfinished()
	sh.summarise(res)
	res.Warnings = append(res.Warnings, warnings...)
	if err := checkPumpBound(&res.Summary); err != nil {
		return nil, err
	}
	res.Summary.StoredEnergy = wf.stored
	res.Summary.DepositedEnergy = wf.deposited
	res.Summary.EnergyBalanceResidual = wf.energyResidual
	res.Summary.PeakReducedField = wf.peakField / units.Townsend
	res.Summary.PeakCurrent = wf.peakCurrent
	res.Summary.PeakElectronDensity = wf.peakDensity
	if wf.stored > 0 {
		res.Summary.Efficiency = res.Summary.EnergyTotal / wf.stored
	}
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
	if s.Light {
		res.Time, res.ChannelVoltage, res.Current, res.ReducedField = nil, nil, nil, nil
		res.ElectronDensity, res.UpperLevel, res.LowerLevel = nil, nil, nil
		res.PowerFront, res.PowerRear, res.MeanGain = nil, nil, nil
		res.Z, res.GainTime, res.Gain = nil, nil, nil
	}
	return res, nil
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

// waveforms are the circuit and discharge quantities sampled at the middle of every optical
// step, (k+½)·Δt.
type waveforms struct {
	voltage, current, field, density []float64                  // V_ch [V], channel current [A], E/N [V m²], n_e [m⁻³]
	pumpC, pumpB                     []float64                  // excitation rates into C(0) and B(0) [m⁻³ s⁻¹]
	lossC                            []float64                  // loss rate of C(0) by electron collisions (Born–Bethe and Lotz estimate) [s⁻¹]
	stored, deposited                float64                    // [J]
	switchLoss, shuntLoss, left      float64                    // dissipated in the switch and the shunt, left in the circuit [J]
	plasmaSplit                      [swarm.NumChannels]float64 // Σ plasma power × channel share × Δt over the samples [J]
	plasmaSampled                    float64                    // Σ plasma power × Δt over the samples [J]
	plasmaPower                      []float64                  // plasma power at each sample [W]
	manifold, upperV1                *reservoir                 // the B(v>0)/W/B′ and C(v=1) reservoirs over the run
	split                            bool                       // the swarm table has a power split
	energyResidual                   float64
	peakField, peakCurrent           float64
	peakDensity                      float64
	fieldAbove                       bool
}

// solveCircuit integrates the circuit and discharge from closure to steps·dt and samples them.
func solveCircuit(c *circuit, d *design.Design, par *Parameters, steps int) (*waveforms, Stats, error) {
	dt := par.TimeStep
	y0, stored := c.initial(d.Circuit.ChargeVoltage, d.Discharge.SeedDensity)
	v0 := d.Circuit.ChargeVoltage
	iScale := v0 / math.Sqrt(math.Max(d.Circuit.SwitchInductance, d.Circuit.ChannelInductance)/
		math.Min(d.Circuit.SwitchCapacitance, d.Circuit.ChannelCapacitance))
	atol := make([]float64, nState)
	for _, i := range []int{iV1, iV2, iVg} {
		atol[i] = 1e-7 * v0
	}
	for _, i := range []int{iIs, iIc, iIsh} {
		atol[i] = 1e-7 * iScale
	}
	atol[iLnNe] = 1e-7
	atol[iQ] = 1e-7 * iScale * iScale * 1e-9
	for _, i := range []int{iESwitch, iEPlasma, iEShunt} {
		atol[i] = 1e-9 * stored
	}
	integ := ode.NewRosenbrock(nil)
	end := float64(steps) * dt
	set := &ode.Settings{RelTol: d.Numerics.Tolerance, AbsTol: atol, MaxStep: end / 50, MaxSteps: 200000, Stops: []float64{end}}
	if err := integ.Init(c, 0, y0, set); err != nil {
		return nil, Stats{}, fmt.Errorf("kinetics: circuit: %w", err)
	}
	w := &waveforms{
		voltage: make([]float64, steps), current: make([]float64, steps),
		field: make([]float64, steps), density: make([]float64, steps),
		pumpC: make([]float64, steps), pumpB: make([]float64, steps),
		plasmaPower: make([]float64, steps), lossC: make([]float64, steps),
		stored: stored,
	}
	_, hi := c.table.Range()
	nX := c.density * d.Gas.Nitrogen
	shareC, shareB := par.UpperShare*nX, par.LowerShare*nX
	man := newManifold(d.Levels, d.Gas, c.density, dt)
	v1 := newUpperV1(d.Levels, d.Gas, c.density, par.UpperLifetime, dt)
	shareC1 := par.UpperShare1 * nX
	eScale := d.Levels.UpperElectronScale
	y := make([]float64, nState)
	k := 0
	for k < steps {
		t, err := integ.Step()
		if err != nil {
			var se *ode.StepError
			if errors.As(err, &se) {
				return nil, Stats{}, fmt.Errorf("kinetics: circuit did not converge (tighten or loosen numerics.tolerance, check the circuit values): %w", err)
			}
			return nil, Stats{}, fmt.Errorf("kinetics: circuit: %w", err)
		}
		for ; k < steps && (float64(k)+0.5)*dt <= t; k++ {
			tk := (float64(k) + 0.5) * dt
			if err := integ.Interpolate(tk, y); err != nil {
				return nil, Stats{}, fmt.Errorf("kinetics: circuit: %w", err)
			}
			ne := math.Exp(y[iLnNe])
			kB, kC, kW, kBp, mean := c.pumpRates(y[iVg])
			w.voltage[k] = y[iVg]
			w.current[k] = y[iIc]
			w.field[k] = c.reducedField(y[iVg])
			w.density[k] = ne
			if eScale > 0 {
				w.lossC[k] = eScale * upperElectronLoss(mean, par.UpperLifetime, par.PhotonEnergy, par.UpperEnergy) * ne
			}
			w.pumpC[k] = kC*ne*shareC + v1.step(kC*ne*shareC1)
			w.pumpB[k] = kB*ne*shareB + man.step(((1-par.LowerShare)*kB+kW+kBp)*ne*nX)
			if share, ok := c.powerSplit(y[iVg]); ok {
				pw := y[iVg] * c.plasmaCurrentQuiet(y[iVg], ne) * dt
				w.plasmaPower[k] = pw / dt
				w.split = true
				w.plasmaSampled += pw
				for j, f := range share {
					w.plasmaSplit[j] += f * pw
				}
			}
			w.peakField = math.Max(w.peakField, w.field[k])
			w.peakCurrent = math.Max(w.peakCurrent, math.Abs(y[iIc]))
			w.peakDensity = math.Max(w.peakDensity, ne)
			if w.field[k] > hi {
				w.fieldAbove = true
			}
		}
	}
	w.manifold, w.upperV1 = man, v1
	_, yEnd := integ.State()
	w.deposited = yEnd[iEPlasma]
	left := c.storedEnergy(yEnd)
	w.switchLoss, w.shuntLoss, w.left = yEnd[iESwitch], yEnd[iEShunt], left
	w.energyResidual = math.Abs(stored-(left+yEnd[iESwitch]+yEnd[iEPlasma]+yEnd[iEShunt])) / stored
	return w, Stats{Circuit: integ.Stats()}, nil
}
