package kinetics

import (
	"errors"
	"fmt"
	"math"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/ode"
	"n2pulse/kinetics/swarm"
)

// waveforms are the circuit and discharge quantities sampled at the middle of every optical
// step, (k+½)·Δt.
type waveforms struct {
	voltage, current, field, density []float64                  // V_ch [V], channel current [A], E/N [V m²], n_e [m⁻³]; current and field nil unless the run keeps its series
	pumpC, pumpB                     []float64                  // excitation rates into C(0) and B(0) [m⁻³ s⁻¹]
	lossC                            []float64                  // loss rate of C(0) by electron collisions (Born–Bethe and Lotz estimate) [s⁻¹]
	mixB                             []float64                  // the part of lossC that lands in B(0): superelastic C(0) → B(0) [s⁻¹]
	stored, deposited                float64                    // [J]
	switchLoss, shuntLoss, left      float64                    // dissipated in the switch and the shunt, left in the circuit [J]
	plasmaSplit                      [swarm.NumChannels]float64 // Σ plasma power × channel share × Δt over the samples [J]
	plasmaSampled                    float64                    // Σ plasma power × Δt over the samples [J]
	plasmaPower                      []float64                  // plasma power at each sample [W]
	manifold, upperV1                *reservoir                 // the B(v>0)/W/B′ and C(v=1) reservoirs over the run
	recombined                       float64                    // ∫ α₄·n_e²·x(N₄⁺) dt over the samples: electron–N₄⁺ recombinations [m⁻³]
	recombinedAll                    float64                    // ∫ ᾱ·n_e² dt over the samples: all electron–ion recombinations [m⁻³]
	gasT                             []float64                  // gas temperature of the discharge volume at the end of each step [K]
	heating                          *gasHeating                // the heat put into the gas over the run
	split                            bool                       // the swarm table has a power split
	energyResidual                   float64
	peakField, peakCurrent           float64
	peakDensity                      float64
	fieldAbove                       bool
}

// solveCircuit integrates the circuit and discharge from closure to steps·dt and samples them.
// The channel current and E/N are kept as series only when series (for the Result's
// waveforms); their peaks are taken either way.
func solveCircuit(c *circuit, d *design.Design, par *Parameters, steps int, series bool) (*waveforms, Stats, error) {
	w := newWaveforms(steps, series)
	stats, err := fillCircuit(w, c, d, par, steps, series, nil)
	if err != nil {
		return nil, Stats{}, err
	}
	return w, stats, nil
}

// newWaveforms allocates the per-step arrays of a run of steps samples; the channel current
// and E/N only when series.
func newWaveforms(steps int, series bool) *waveforms {
	w := &waveforms{
		voltage: make([]float64, steps), density: make([]float64, steps),
		pumpC: make([]float64, steps), pumpB: make([]float64, steps),
		plasmaPower: make([]float64, steps), lossC: make([]float64, steps), mixB: make([]float64, steps),
		gasT: make([]float64, steps),
	}
	if series {
		w.current, w.field = make([]float64, steps), make([]float64, steps)
	}
	return w
}

// fillCircuit integrates the circuit into w (see solveCircuit). When feed is not nil it
// publishes the samples to it as the integrator takes them: after each integrator step,
// every sample up to that step's time is final.
func fillCircuit(w *waveforms, c *circuit, d *design.Design, par *Parameters, steps int, series bool, feed *circuitFeed) (Stats, error) {
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
	atol[iX2], atol[iX4] = 1e-7, 1e-7
	atol[iQ] = 1e-7 * iScale * iScale * 1e-9
	for _, i := range []int{iESwitch, iEPlasma, iEShunt} {
		atol[i] = 1e-9 * stored
	}
	integ := ode.NewRosenbrock(nil)
	end := float64(steps) * dt
	set := &ode.Settings{RelTol: d.Numerics.Tolerance, AbsTol: atol, MaxStep: end / 50, MaxSteps: 200000, Stops: []float64{end}}
	if err := integ.Init(c, 0, y0, set); err != nil {
		return Stats{}, fmt.Errorf("kinetics: circuit: %w", err)
	}
	w.stored = stored
	_, hi := c.table.Range()
	nX := c.density * d.Gas.Nitrogen
	shareC, shareB := par.UpperShare*nX, par.LowerShare*nX
	man := newManifold(d.Levels, d.Gas, c.density, dt)
	v1 := newUpperV1(d.Levels, d.Gas, c.density, par.UpperLifetime, dt)
	shareC1 := par.UpperShare1 * nX
	shadow := &upperShadow{dt: dt}
	heat := newGasHeating(d, c.density, dt)
	// C(0) → B: quenching by N₂ and spontaneous emission into B(v>0); C(v=1) → B: quenching
	// by N₂ and all of its spontaneous emission [s⁻¹].
	toB := nX*d.Levels.UpperQuenchingNitrogen + (1/par.UpperLifetime - par.EinsteinA00)
	toBv1 := nX*d.Levels.UpperV1QuenchingNitrogen + 1/par.UpperLifetime
	eScale := d.Levels.UpperElectronScale
	// Electron–N₄⁺ recombination leaves N₂(C) and N₂(B) (design.Levels.RecombinationUpperShare,
	// RecombinationLowerShare); the N₄⁺ share of the ions is a state of the circuit.
	recC, recB := d.Levels.RecombinationUpperShare, d.Levels.RecombinationLowerShare
	y := make([]float64, nState)
	k := 0
	for k < steps {
		t, err := integ.Step()
		if err != nil {
			var se *ode.StepError
			if errors.As(err, &se) {
				return Stats{}, fmt.Errorf("kinetics: circuit did not converge (tighten or loosen numerics.tolerance, check the circuit values): %w", err)
			}
			return Stats{}, fmt.Errorf("kinetics: circuit: %w", err)
		}
		for ; k < steps && (float64(k)+0.5)*dt <= t; k++ {
			tk := (float64(k) + 0.5) * dt
			if err := integ.Interpolate(tk, y); err != nil {
				return Stats{}, fmt.Errorf("kinetics: circuit: %w", err)
			}
			ne := math.Exp(y[iLnNe])
			smp := c.sample(y[iVg], ne)
			// The excitation scales stand for the cross sections' uncertainty; they scale the
			// pump only (design.Levels.UpperExcitationScale).
			kB, kC, kW, kBp, mean := smp.kB*d.Levels.LowerExcitationScale, smp.kC*d.Levels.UpperExcitationScale, smp.kW, smp.kBp, smp.mean
			field := c.reducedField(y[iVg])
			w.voltage[k] = y[iVg]
			if series {
				w.current[k], w.field[k] = y[iIc], field
			}
			w.density[k] = ne
			var sup float64 // the electrons' superelastic C(0) → B rate [s⁻¹]
			if eScale > 0 {
				s, ion := upperElectronRates(mean, par.UpperLifetime, par.PhotonEnergy, par.UpperEnergy)
				sup = eScale * s * ne
				w.lossC[k] = eScale * (s + ion) * ne
				// Superelastic C(0) → B(v) ends in B(0) with the (0,0) band's share of the C → B
				// transition strength, A₀₀·τ_C; the rest lands in B(v>0), the manifold.
				w.mixB[k] = sup * par.EinsteinA00 * par.UpperLifetime
			}
			var rec float64 // recombinations of electrons with N₄⁺ [m⁻³ s⁻¹]
			if !c.fixed {
				a, _ := c.recombinationAt(smp.mean)
				rec = a[1] * ne * ne * y[iX4]
				w.recombinedAll += meanRecombination(y[iX2], y[iX4], a) * ne * ne * dt
			}
			w.recombined += rec * dt
			w.pumpC[k] = kC*ne*shareC + v1.step(kC*ne*shareC1) + recC*rec
			// What leaves C(0) and C(v=1) for the B state feeds the manifold (see upperShadow).
			cMean := shadow.step(w.pumpC[k], par.UpperDecayRate+d.Levels.UpperElectronMixing*ne+w.lossC[k])
			fromC := cMean*(toB+sup*(1-par.EinsteinA00*par.UpperLifetime)) + v1.r*toBv1
			w.pumpB[k] = kB*ne*shareB + man.step(((1-par.LowerShare)*kB+kW+kBp)*ne*nX+fromC+recB*rec)
			if share, ok := smp.share, smp.split; ok {
				pw := y[iVg] * smp.current * dt
				w.plasmaPower[k] = pw / dt
				w.split = true
				w.plasmaSampled += pw
				for j, f := range share {
					w.plasmaSplit[j] += f * pw
				}
				w.gasT[k] = heat.step(w.plasmaPower[k], &share, dt)
			} else {
				w.gasT[k] = heat.idle(dt)
			}
			w.peakField = math.Max(w.peakField, field)
			w.peakCurrent = math.Max(w.peakCurrent, math.Abs(y[iIc]))
			w.peakDensity = math.Max(w.peakDensity, ne)
			if field > hi {
				w.fieldAbove = true
			}
		}
		if feed != nil {
			feed.publish(k)
		}
	}
	w.manifold, w.upperV1, w.heating = man, v1, heat
	_, yEnd := integ.State()
	w.deposited = yEnd[iEPlasma]
	left := c.storedEnergy(yEnd)
	w.switchLoss, w.shuntLoss, w.left = yEnd[iESwitch], yEnd[iEShunt], left
	w.energyResidual = math.Abs(stored-(left+yEnd[iESwitch]+yEnd[iEPlasma]+yEnd[iEShunt])) / stored
	return Stats{Circuit: integ.Stats()}, nil
}
