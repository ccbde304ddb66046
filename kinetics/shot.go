package kinetics

import (
	"math"

	"gonum.org/v1/gonum/floats"

	"n2pulse/kinetics/design"
)

// shot advances the populations and photon fluxes of every cell through the optical steps,
// driven by the sampled discharge, and records waveforms and the gain map.
type shot struct {
	d     *design.Design
	p     *Parameters
	wf    *waveforms
	steps int
	med   *medium
	light bool
	// series: the Result gets the waveforms and the gain map (neither Light nor SummaryOnly).
	series bool
	// detector is the time constant of the detector for the FWHM [s]; 0 for an ideal one.
	detector float64
	// train describes the separate pulses of the output as the FWHM sees it (summarise).
	train pulseTrain
	cols  int

	// Per-cell excitation delay as a whole number of steps and a fraction.
	delayWhole []int
	delayFrac  []float64

	// Exact pump-and-decay update for constant coefficients over one step:
	// C' = C·eC + P_C·(1−eC)/Γ_C; B' = B·eB + (P_B + A₀₀·(C+C')/2)·(1−eB)/Γ_B.
	eB, wB float64

	powerFront, powerRear, meanGain []float64
	midC, midB                      []float64
	peakGain, peakGainLength        float64

	uniform  bool    // a simultaneous discharge: every cell has the same pump
	pumpPeak float64 // highest C pump rate at mid-channel [m⁻³ s⁻¹]
	lit      int     // optical steps propagated (between dawn and dark)
	// ahead is the pump still to come (pumpToCome), made when shot.dark first needs it.
	ahead *pumpAhead
	// spare holds the arrays of pumpToCome (steps+1 values each), dead once run is done;
	// summarise reuses them as scratch (shot.scratch) rather than allocate more.
	spare [2][]float64
	// feed, when not nil, is the circuit still being solved on another goroutine: step k
	// waits for sample k (RunSettings.Overlap).
	feed *circuitFeed
	// decayed is how many steps of a travelling excitation's eC and wC are filled.
	decayed int

	// gains is σ and g_C/g_B against the gas temperature (gasHeating); nil when the design
	// fixes them (spectroscopy.cross_section or .degeneracy_ratio).
	gains *gainTable
	// sigmas and ratios are σ [m²] and g_C/g_B of the medium at each step (nil without gains).
	sigmas, ratios []float64
}

func newShot(d *design.Design, p *Parameters, wf *waveforms, steps int, s *RunSettings) *shot {
	n := d.Numerics.Cells
	omega := apertureSolidAngle(p.OpticalArea, d.Channel.Length)
	spontPerC := p.EinsteinA00 * omega / (4 * math.Pi)
	sh := &shot{
		d: d, p: p, wf: wf, steps: steps, light: s.Light, detector: s.DetectorResponse,
		series: !s.Light && !s.SummaryOnly,
		med: newMedium(n, p.CellLength, p.TimeStep, p.CrossSection, p.DegeneracyRatio,
			spontPerC, d.Optics.Loss, d.Optics.RearReflectivity, d.Optics.FrontReflectivity),
		delayWhole: make([]int, n), delayFrac: make([]float64, n),
		powerFront: make([]float64, steps), powerRear: make([]float64, steps),
		meanGain: make([]float64, steps), midC: make([]float64, steps), midB: make([]float64, steps),
	}
	sh.cols = gainMapColumns(s)
	v := d.Optics.ExcitationVelocity
	for i := 0; i < n; i++ {
		z := (float64(i) + 0.5) * p.CellLength
		var delay float64
		switch {
		case math.IsInf(v, 1):
		case v > 0:
			delay = z / v
		default:
			delay = (d.Channel.Length - z) / -v
		}
		s := delay / p.TimeStep
		sh.delayWhole[i] = int(math.Floor(s))
		sh.delayFrac[i] = s - math.Floor(s)
	}
	sh.uniform = true
	for i := range sh.delayWhole {
		sh.uniform = sh.uniform && sh.delayWhole[i] == 0 && sh.delayFrac[i] == 0
	}
	if d.Spectroscopy.CrossSection == 0 && d.Spectroscopy.DegeneracyRatio == 0 {
		sh.gains = newGainTable(p.GasDensity, d.Gas.Temperature, p.CrossSection, p.DegeneracyRatio)
		sh.sigmas, sh.ratios = make([]float64, steps), make([]float64, steps)
	}
	gb := p.LowerDecayRate
	sh.eB = math.Exp(-gb * p.TimeStep)
	sh.wB = -math.Expm1(-gb*p.TimeStep) / gb
	return sh
}

// sample returns the value of series x at step k − whole − frac, zero before closure.
func sample(x []float64, k, whole int, frac float64) float64 {
	j := k - whole
	if j < 0 {
		return 0
	}
	if frac == 0 || j == 0 {
		return x[j] * (1 - frac)
	}
	return x[j]*(1-frac) + x[j-1]*frac
}

// run takes the shot through its optical steps: before "dawn" only the pump and decay of the
// populations, then pump, decay and both passes of every cell, until the end or until the
// channel is dark for good; it records the waveforms and the gain map into res.
func (sh *shot) run(res *Result) {
	n, p := sh.d.Numerics.Cells, sh.p
	if sh.series {
		res.Z = make([]float64, n)
		for i := range res.Z {
			res.Z[i] = (float64(i) + 0.5) * p.CellLength
		}
	}
	colEvery := max(1, (sh.steps+sh.cols-1)/sh.cols)
	if sh.series {
		// One column every colEvery steps: each row's length is known now.
		cols := (sh.steps + colEvery - 1) / colEvery
		res.Gain = make([][]float64, n)
		for i := range res.Gain {
			res.Gain[i] = make([]float64, 0, cols)
		}
		res.GainTime = make([]float64, 0, cols)
	}
	eC, wC := sh.upperDecay()
	// Before the discharge the channel neither amplifies nor holds an upper level worth its
	// spontaneous emission; the optics start ("dawn") once any cell's inversion would amplify
	// by 1e-3 over the channel length. Spontaneous photons not emitted before then would have
	// left the channel unamplified, a part in 1e9 of a lasing pulse; the photon balance
	// counts only what is emitted, so it stays exact.
	dawn := 1e-3 / (p.CrossSection * sh.d.Channel.Length)
	lit, dark := false, false
	pump := &pumpStep{uniform: sh.uniform, eB: sh.eB, wBh: 0.5 * p.EinsteinA00 * sh.wB}
	if !sh.uniform {
		pump.es, pump.cps, pump.bps, pump.wBhs = make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
	}
	for k := 0; k < sh.steps; k++ {
		if dark && sh.light {
			for j := k; j < sh.steps; j++ {
				sh.meanGain[j], sh.midC[j], sh.midB[j] = sh.meanGain[k-1], sh.midC[k-1], sh.midB[k-1]
			}
			break
		}
		if sh.feed != nil && !sh.feed.await(k, sh.steps) {
			return // the circuit failed: followPulse returns its error
		}
		sh.fillDecay(eC, wC, k)
		sh.tune(k)
		var sum, maxInv float64
		if lit && !dark {
			sum, maxInv = sh.stepLit(pump, k, eC, wC)
		} else {
			lit, sum, maxInv = sh.stepUnlit(pump, k, eC, wC, lit, dark, dawn)
		}
		if lit && !dark {
			dark = sh.dark(k, maxInv)
		}
		sh.record(res, k, sum, lit, colEvery)
	}
	res.Stats.OpticalSteps = sh.lit
	res.Stats.Cells = n
	if sh.ahead != nil {
		sh.spare = [2][]float64{sh.ahead.inv, sh.ahead.upper}
	}
}

// upperDecay returns the decay factor e^(−Γ_C Δt) and the pump weight (1 − e^(−Γ_C Δt))/Γ_C of
// C(0) for every step, for the cells of a travelling excitation, which read them at their own
// delays (up to the current step; shot.fillDecay fills them as the run goes); a simultaneous
// discharge takes each step's from decay as it goes (nil, nil here).
func (sh *shot) upperDecay() (eC, wC []float64) {
	if sh.uniform {
		return nil, nil
	}
	return make([]float64, sh.steps), make([]float64, sh.steps)
}

// fillDecay fills eC and wC (upperDecay) up to step k, whose sample is final.
func (sh *shot) fillDecay(eC, wC []float64, k int) {
	if eC == nil {
		return
	}
	for ; sh.decayed <= k; sh.decayed++ {
		eC[sh.decayed], wC[sh.decayed] = sh.decay(sh.decayed)
	}
}

// decay is the decay factor and pump weight of C(0) at step k: they depend on time only
// through n_e (electron mixing and collisions).
func (sh *shot) decay(k int) (e, w float64) {
	g := sh.p.UpperDecayRate + sh.d.Levels.UpperElectronMixing*sh.wf.density[k]
	if sh.wf.lossC != nil {
		g += sh.wf.lossC[k] // the Born–Bethe/Lotz estimate of electron collisions
	}
	em1 := math.Expm1(-g * sh.p.TimeStep)
	return 1 + em1, -em1 / g
}

// pumpAhead is the pump still to come from each step on, which bounds how much inversion can
// reappear in a cell (see shot.dark).
type pumpAhead struct {
	inv      []float64 // ∫ max(0, P_C − g·P_B) dt from step k on [m⁻³]
	upper    []float64 // ∫ P_C dt from step k on [m⁻³]
	maxDelay int       // the longest excitation delay of a cell, in whole steps plus one
	// top is where inv was started from zero: the whole run (steps) once the circuit is
	// done; below it, inv holds lower bounds made while the circuit is still being solved
	// (shot.surelyLit), and upper nothing yet.
	top int
}

// at returns the index into the integrals for step k, early by the longest delay.
func (a *pumpAhead) at(k int) int { return max(0, k-a.maxDelay) }

// pumpToCome fills sh.ahead with the pump still to come over the whole run; every sample of
// the discharge must be final.
func (sh *shot) pumpToCome() *pumpAhead {
	dt := sh.p.TimeStep
	a := sh.aheadArrays()
	a.inv[sh.steps], a.upper[sh.steps] = 0, 0
	for k := sh.steps - 1; k >= 0; k-- {
		a.inv[k] = sh.invAhead(a.inv[k+1], k)
		a.upper[k] = a.upper[k+1] + sh.wf.pumpC[k]*dt
	}
	a.top = sh.steps
	return a
}

// aheadArrays returns sh.ahead, made (with its arrays of steps+1 values) the first time.
func (sh *shot) aheadArrays() *pumpAhead {
	if sh.ahead == nil {
		a := &pumpAhead{inv: make([]float64, sh.steps+1), upper: make([]float64, sh.steps+1)}
		for _, w := range sh.delayWhole {
			a.maxDelay = max(a.maxDelay, w+1)
		}
		sh.ahead = a
	}
	return sh.ahead
}

// invAhead is pumpAhead.inv at step k given its value next at step k+1. The whole integral
// and the partial ones of surelyLit both take it, so that they add the same terms.
func (sh *shot) invAhead(next float64, k int) float64 {
	return next + max(0, sh.wf.pumpC[k]-sh.p.DegeneracyRatio*sh.wf.pumpB[k])*sh.p.TimeStep
}

// surelyLit reports whether the channel at step k, with largest inversion maxInv, is surely
// not dark while the circuit is still being solved (shot.feed), from the samples published so
// far. The inversion still to come, summed from the last published sample down to step k
// as pumpToCome sums it from the end of the run, is at most the whole sum: every term is
// ≥ 0 (or NaN, which would make the whole sum NaN and the channel not dark either), and a
// rounded sum does not fall when an addend grows. It is taken a part in 10⁹ lower still, so
// that no rounding can make it exceed the whole. When the bound cannot decide, surelyLit
// waits for more samples; it returns false once all are in (pumpToCome then decides) or
// when the circuit failed.
func (sh *shot) surelyLit(k int, maxInv, darkInversion float64) bool {
	if !(maxInv < darkInversion) {
		return true
	}
	a := sh.aheadArrays()
	j := a.at(k)
	for {
		if j < a.top && !(maxInv+a.inv[j]*(1-1e-9) < darkInversion) {
			return true
		}
		ready := int(sh.feed.ready.Load())
		if ready >= sh.steps {
			return false
		}
		if ready > a.top {
			a.inv[ready] = 0
			for i := ready - 1; i >= j; i-- {
				a.inv[i] = sh.invAhead(a.inv[i+1], i)
			}
			a.top = ready
			continue
		}
		if !sh.feed.await(ready, sh.steps) {
			return false
		}
	}
}

// stepLit is one step while the optics run: pump, decay and both passes of every cell in one
// sweep, each cell's gain factor following its populations (recomputed every 64 steps). It
// returns the sum and the largest inversion of the cells [m⁻³].
func (sh *shot) stepLit(pump *pumpStep, k int, eC, wC []float64) (sum, maxInv float64) {
	hv := sh.p.PhotonEnergy * sh.p.OpticalArea
	sh.fillPump(pump, k, eC, wC)
	sh.lit++
	front, rear := sh.med.advance(k, pump, k%64 == 0)
	sh.powerFront[k] = hv * front
	sh.powerRear[k] = hv * rear
	return sh.med.invSum, sh.med.invMax
}

// stepUnlit is one step while the optics do not run, before dawn or after dark: pump and decay
// only, and the check for dawn (at which the step also propagates). Before dawn a simultaneous
// discharge keeps every cell alike: cell 0 stands for all of them until dawn. It returns
// whether the channel is lit and the sum and the largest inversion of the cells [m⁻³].
func (sh *shot) stepUnlit(pump *pumpStep, k int, eC, wC []float64, lit, dark bool, dawn float64) (bool, float64, float64) {
	n, m := sh.d.Numerics.Cells, sh.med
	hv := sh.p.PhotonEnergy * sh.p.OpticalArea
	one := sh.uniform && !lit
	sh.pumpOnly(pump, k, eC, wC, lit)
	if !lit {
		cells := n
		if one {
			cells = 1
		}
		for i := 0; i < cells; i++ {
			if m.c[i]-m.g*m.b[i] > dawn {
				lit = true
				break
			}
		}
		if lit && one {
			for i := 1; i < n; i++ {
				m.c[i], m.b[i] = m.c[0], m.b[0]
			}
		}
	}
	if lit && !dark {
		// The gain factors start from the populations at dawn; after dark nothing passes
		// through the cells again, and they are left as they are.
		m.resync()
		sh.lit++
		front, rear := m.propagate(k)
		sh.powerFront[k] = hv * front
		sh.powerRear[k] = hv * rear
	}
	if !lit && one {
		inv := m.c[0] - m.g*m.b[0]
		return lit, inv * float64(n), inv
	}
	sum, maxInv := 0.0, math.Inf(-1)
	for i := 0; i < n; i++ {
		inv := m.c[i] - m.g*m.b[i]
		sum += inv
		if inv > maxInv {
			maxInv = inv
		}
	}
	return lit, sum, maxInv
}

// dark reports whether the lit channel at step k, with largest inversion maxInv, is dark for
// good. With the upper level decaying at least as fast as the lower one, a cell can regain at
// most ∫ max(0, P_C − g·P_B) dt from now on. Once that cannot lift any cell's gain-length over
// the channel above 0.1, what the channel can still emit is its spontaneous emission
// (amplified by at most 10 %) and the light in flight; when those are below 1e-6 of the light
// already out, the channel is dark: the optics stop, and a sweep's run ends. Photons in flight
// stay counted as such, so the photon balance stays exact.
//
// The pump still to come needs the whole discharge: while the circuit is still being solved
// (shot.feed), dark first asks surelyLit, which decides most steps from the samples in so
// far, and waits for the rest of the circuit only when it cannot.
func (sh *shot) dark(k int, maxInv float64) bool {
	p, m, n := sh.p, sh.med, sh.d.Numerics.Cells
	darkInversion := 0.1 / (p.CrossSection * sh.d.Channel.Length)
	if !(p.UpperDecayRate >= p.LowerDecayRate) {
		return false
	}
	if sh.ahead == nil || sh.ahead.top < sh.steps {
		if sh.feed != nil {
			if sh.surelyLit(k, maxInv, darkInversion) {
				return false
			}
			if int(sh.feed.ready.Load()) < sh.steps {
				return false // the circuit failed: followPulse returns its error
			}
		}
		sh.pumpToCome()
	}
	rest := sh.ahead
	j := rest.at(k)
	if !(maxInv+rest.inv[j] < darkInversion) {
		return false
	}
	sumC := 0.0
	for _, c := range m.c {
		sumC += c
	}
	// Spontaneous photons per area still to come, both directions, amplified ≤ 10 %,
	// A channel that absorbs lets out only what is emitted within 1/|g| of its ends:
	// at most a fraction 1/(|g|·L) of it, with g the least absorbing cell's gain.
	amp := 1.1
	if gl := p.CrossSection * (maxInv + rest.inv[j]) * sh.d.Channel.Length; gl < -1 {
		amp = -1 / gl
	}
	future := amp * 2 * m.spont * (sumC + float64(n)*rest.upper[j]) / p.UpperDecayRate
	out := m.ledger.front + m.ledger.rear
	return out > 0 && m.inFlight()+future < 1e-6*out
}

// record keeps step k of the channel-mean gain, the populations of the middle cell, the peak
// gain and, every colEvery steps when the Result takes the series, a column of the gain map.
func (sh *shot) record(res *Result, k int, sum float64, lit bool, colEvery int) {
	n, m := sh.d.Numerics.Cells, sh.med
	g := m.sigma * sum / float64(n)
	sh.meanGain[k] = g
	at := n / 2 // the cell whose populations are recorded
	if sh.uniform && !lit {
		at = 0
	}
	sh.midC[k], sh.midB[k] = m.c[at], m.b[at]
	gm := m.sigma * (m.c[at] - m.g*m.b[at])
	if gm > sh.peakGain {
		sh.peakGain = gm
	}
	sh.peakGainLength = max(sh.peakGainLength, g*sh.d.Channel.Length)
	if sh.series && k%colEvery == 0 {
		res.GainTime = append(res.GainTime, (float64(k)+1)*sh.p.TimeStep)
		for i := 0; i < n; i++ {
			j := i
			if sh.uniform && !lit {
				j = 0
			}
			res.Gain[i] = append(res.Gain[i], m.sigma*(m.c[j]-m.g*m.b[j]))
		}
	}
}

// fillPump sets the pump and decay factors of every cell for step k: one value for all
// cells when the discharge is simultaneous, else each cell's delayed sample.
func (sh *shot) fillPump(ps *pumpStep, k int, eC, wC []float64) {
	if sh.uniform {
		c, b := sh.wf.pumpC[k], sh.wf.pumpB[k]
		sh.pumpPeak = max(sh.pumpPeak, c)
		e, w := sh.decay(k)
		ps.e, ps.cp, ps.bp = e, c*w, b*sh.wB
		ps.wBh = 0.5 * (sh.p.EinsteinA00 + sh.mixB(k, 0, 0)) * sh.wB
		return
	}
	n := sh.d.Numerics.Cells
	pe, pc, pb, pw := ps.es[:n], ps.cps[:n], ps.bps[:n], ps.wBhs[:n]
	for i := range pe {
		w, f := sh.delayWhole[i], sh.delayFrac[i]
		c := sample(sh.wf.pumpC, k, w, f)
		j := max(0, min(k-w, sh.steps-1))
		pe[i], pc[i], pb[i] = eC[j], c*wC[j], sample(sh.wf.pumpB, k, w, f)*sh.wB
		// At the same sample as the C(0) loss it belongs to.
		pw[i] = 0.5 * (sh.p.EinsteinA00 + sh.mixB(j, 0, 0)) * sh.wB
		if i == n/2 {
			sh.pumpPeak = max(sh.pumpPeak, c)
		}
	}
}

// mixB is the rate [s⁻¹] at which electrons move C(0) into B(0) at step k − whole − frac
// (zero when the run has no electron collisions with C(0)).
func (sh *shot) mixB(k, whole int, frac float64) float64 {
	if sh.wf.mixB == nil {
		return 0
	}
	return sample(sh.wf.mixB, k, whole, frac)
}

// pumpOnly advances the populations of every cell through the pump and decay of step k
// while the optics do not run (before dawn and after dark); before dawn a simultaneous
// discharge keeps every cell alike, so only cell 0 is stepped (shot.stepUnlit copies it at
// dawn). It is the pump and decay of the lit steps (medium.pump) without the gain factors.
func (sh *shot) pumpOnly(ps *pumpStep, k int, eC, wC []float64, lit bool) {
	cells := sh.d.Numerics.Cells
	if sh.uniform && !lit {
		cells = 1
	}
	sh.fillPump(ps, k, eC, wC)
	sh.med.pump(ps, cells, false)
}

// summarise computes the figures of merit and, when the Result takes the series, fills the
// waveforms.
func (sh *shot) summarise(res *Result) {
	dt := sh.p.TimeStep
	s := &res.Summary
	for k := 0; k < sh.steps; k++ {
		s.EnergyFront += sh.powerFront[k] * dt
		s.EnergyRear += sh.powerRear[k] * dt
	}
	s.EnergyTotal = s.EnergyFront + s.EnergyRear
	s.UpperPumpedPhotonEnergy = sh.pumpedUpper() * sh.d.Channel.Gap * sh.d.Channel.Width * sh.p.PhotonEnergy
	t := func(k float64) float64 { return (k + 1) * dt } // power leaving during step k is sampled at its end
	pk, kp := peak(sh.powerFront)
	s.PeakPower = pk
	if pk > 0 {
		a, b := crossings(sh.powerFront, kp, 0.5*pk)
		s.HalfMaxWidth = (b - a) * dt
		s.Delay = t(a)
		s.PulseCentre, s.RMSWidth = pulseWidth(sh.powerFront, dt)
		s.FWHM, s.DetectorResponse = s.HalfMaxWidth, sh.detector
		seen, sk, sp := sh.powerFront, pk, kp // the trace the FWHM reads and its peak
		if sh.detector > 0 {
			seen = detected(sh.powerFront, dt, sh.detector)
			sk, sp = peak(seen)
			a, b := crossings(seen, sp, 0.5*sk)
			s.FWHM = (b - a) * dt
		}
		// The pulses as the FWHM sees them (through the detector when there is one), spikes
		// one transit apart averaged over the round trip 2L/c = 2·cells steps.
		tr := separatePulses(seen, sh.scratch(1, sh.steps), dt, 2*sh.d.Numerics.Cells)
		sh.train = tr
		s.Pulses, s.PulseSeparation, s.StrongestPulseFWHM, s.HalfMaxEnergyShare = tr.count, tr.separation, tr.strongestWidth, tr.energyShare
		// How the FWHM depends on its level, on the same trace (not the round-trip mean: the
		// spikes of that trace are what the FWHM's edges leap between).
		hm := halfMaxConditioning(seen, sp, sk)
		s.FWHMAt45, s.FWHMAt55, s.FWHMJump = hm.low*dt, hm.high*dt, hm.jump*dt
		s.FWHMIllConditioned = hm.illConditioned(s.FWHM / dt)
		r10, _ := crossings(sh.powerFront, kp, 0.1*pk)
		r90, _ := crossings(sh.powerFront, kp, 0.9*pk)
		s.Rise = (r90 - r10) * dt
	}
	s.PeakGain = sh.peakGain
	s.GainLength = sh.peakGainLength
	// The gain duration as the equivalent width of the positive channel-mean gain, ∫g⁺dt / g_max
	// (as E/P_peak is the equivalent width of a pulse): unlike a half-maximum width it follows
	// a gain curve of one or several humps smoothly as a design value changes.
	if gp, _ := peak(sh.meanGain); gp > 0 {
		area := 0.0
		for _, g := range sh.meanGain {
			area += max(g, 0) * dt
		}
		s.InversionDuration = area / gp
	}
	sh.termination(s)
	led := sh.med.ledger
	created := led.spontaneous + led.stimulated
	accounted := led.front + led.rear + led.lost + sh.med.inFlight()
	if created > 0 {
		s.PhotonBalanceResidual = math.Abs(created-accounted) / created
	}
	if led.spontaneous > 0 {
		s.StimulatedRatio = led.stimulated / led.spontaneous
	}
	if !sh.series {
		return
	}
	res.Time = make([]float64, sh.steps)
	for k := range res.Time {
		res.Time[k] = (float64(k) + 0.5) * dt
	}
	res.ChannelVoltage = sh.wf.voltage
	res.Current = sh.wf.current
	res.ReducedField = sh.wf.field
	res.ElectronDensity = sh.wf.density
	res.UpperLevel = sh.midC
	res.LowerLevel = sh.midB
	res.PowerFront = sh.powerFront
	res.PowerRear = sh.powerRear
	res.MeanGain = sh.meanGain
}

// pumpedUpper is the number of excitations into C(0) per unit cross-section of the channel
// [m⁻²] over the run: Σ_cells Δz·Σ_k P_C(k)·Δt with each cell's pump delayed as in the run.
func (sh *shot) pumpedUpper() float64 {
	dt, n := sh.p.TimeStep, sh.d.Numerics.Cells
	cum := sh.scratch(0, sh.steps+1) // cum[k] = Σ_{j<k} P_C(j)·Δt
	cum[0] = 0
	for k, pc := range sh.wf.pumpC {
		cum[k+1] = cum[k] + pc*dt
	}
	at := func(k int) float64 { return cum[max(0, min(k, sh.steps))] }
	total := 0.0
	for i := 0; i < n; i++ {
		// Σ_k sample(P_C, k, w, f) = (1−f)·Σ_{j<steps−w} P_C(j) + f·Σ_{j<steps−w−1} P_C(j).
		w, f := sh.delayWhole[i], sh.delayFrac[i]
		total += (1-f)*at(sh.steps-w) + f*at(sh.steps-w-1)
	}
	return total * sh.p.CellLength
}

// termination finds when the mid-channel gain falls below a tenth of its peak and names the
// process that removed most of the inversion between the peak and that time.
func (sh *shot) termination(s *Summary) {
	p := sh.p
	gain := sh.scratch(1, sh.steps)
	for k := range gain {
		sig, g := sh.gainAt(k)
		gain[k] = sig * (sh.midC[k] - g*sh.midB[k])
	}
	gp, kp := peak(gain)
	if gp <= 0 {
		s.TerminationCause = "no gain"
		return
	}
	ke := sh.steps - 1
	for k := kp; k < sh.steps; k++ {
		if gain[k] < 0.1*gp {
			ke = k
			break
		}
	}
	s.TerminationTime = (float64(ke) + 1) * p.TimeStep
	mid := sh.d.Numerics.Cells / 2
	w, f := sh.delayWhole[mid], sh.delayFrac[mid]
	// Between the peak and the end, the inversion ΔN = N_C − g·N_B falls by
	// ∫Γ_C·N_C (upper-level decay) + ∫g·(P_B + (A₀₀ + X)·N_C) (lower-level growth, X the
	// electrons' C(0) → B(0) rate)
	// + (1+g)·(stimulated transitions) − ∫P_C (pump); the stimulated part is what the
	// other terms leave unexplained.
	var lower, upper, pumpC float64
	dt := p.TimeStep
	_, gp0 := sh.gainAt(kp)
	_, ge := sh.gainAt(ke)
	for k := kp + 1; k <= ke; k++ {
		_, g := sh.gainAt(k)
		c := sh.midC[k]
		lower += g * (sample(sh.wf.pumpB, k, w, f) + (p.EinsteinA00+sh.mixB(k, w, f))*c) * dt
		upper += p.UpperDecayRate * c * dt
		pumpC += sample(sh.wf.pumpC, k, w, f) * dt
	}
	drop := (sh.midC[kp] - gp0*sh.midB[kp]) - (sh.midC[ke] - ge*sh.midB[ke])
	stim := drop + pumpC - lower - upper
	pumpEnded := sample(sh.wf.pumpC, ke, w, f) < 0.1*sh.pumpPeak
	upperKept := sh.midC[ke] >= 0.5*sh.midC[kp]
	switch {
	case upperKept && stim > lower:
		s.TerminationCause = "extraction by the pulse"
	case upperKept:
		s.TerminationCause = "lower-level bottleneck"
	case pumpEnded:
		s.TerminationCause = "pump collapse"
	default:
		s.TerminationCause = "quenching"
	}
	_ = upper
}

// scratch returns n values of the i-th spare array, or new ones when run has not left one
// that long; the values are whatever was there.
func (sh *shot) scratch(i, n int) []float64 {
	if len(sh.spare[i]) >= n {
		return sh.spare[i][:n]
	}
	return make([]float64, n)
}

// peak returns the largest value of x and its index.
func peak(x []float64) (float64, int) {
	if len(x) == 0 {
		return 0, 0
	}
	i := floats.MaxIdx(x)
	return x[i], i
}

// crossings returns the fractional indices where x first rises through level and where it
// last falls through it: the outermost half-maximum points of a pulse that may have several
// spikes (the full width of the envelope). k is the index of the maximum.
func crossings(x []float64, k int, level float64) (before, after float64) {
	before, after = 0, float64(len(x)-1)
	for i := 1; i <= k; i++ {
		if x[i] >= level && x[i-1] < level {
			before = float64(i-1) + (level-x[i-1])/(x[i]-x[i-1])
			break
		}
	}
	for i := len(x) - 2; i >= k; i-- {
		if x[i] >= level && x[i+1] < level {
			after = float64(i) + (x[i]-level)/(x[i]-x[i+1])
			break
		}
	}
	return before, after
}

// detected is the power p, sampled at steps of dt, as a detector of time constant tau shows
// it: the response of a single pole, y_k = y_(k−1)·e^(−Δt/τ) + p_k·(1 − e^(−Δt/τ)), exact for
// a power constant over each step.
func detected(p []float64, dt, tau float64) []float64 {
	e := math.Exp(-dt / tau)
	y := make([]float64, len(p))
	prev := 0.0
	for k, v := range p {
		prev = prev*e + v*(1-e)
		y[k] = prev
	}
	return y
}

// pulseWidth returns the centroid of a pulse sampled at the ends of steps of length dt and its
// width as the FWHM of the Gaussian of the same rms duration, 2·sqrt(2 ln 2)·σ_t. Amplified
// spontaneous emission from a channel pumped longer than its transit time comes as a train
// of spikes one transit apart; the half-maximum points of such a train jump from spike to
// spike as a design value changes, while the rms width follows the envelope smoothly (and
// equals the FWHM for a Gaussian pulse).
func pulseWidth(p []float64, dt float64) (centre, fwhm float64) {
	var s0, s1 float64
	for k, v := range p {
		tk := float64(k+1) * dt
		s0 += v
		s1 += v * tk
	}
	if s0 <= 0 {
		return 0, 0
	}
	centre = s1 / s0
	var s2 float64
	for k, v := range p {
		d := float64(k+1)*dt - centre
		s2 += v * d * d
	}
	return centre, 2 * math.Sqrt(2*math.Ln2) * math.Sqrt(s2/s0)
}

// unfinished reports whether the shot was still going at its last step: the output-end
// power or the channel-mean gain above a tenth of its peak, or the discharge still building
// up (the channel voltage or the pump into C(0) at least half its peak, which came in the
// last tenth of the run).
func (sh *shot) unfinished() bool {
	last := sh.steps - 1
	if last < 0 {
		return false
	}
	pk, _ := peak(sh.powerFront)
	gp, _ := peak(sh.meanGain)
	return (pk > 0 && sh.powerFront[last] > 0.1*pk) || (gp > 0 && sh.meanGain[last] > 0.1*gp) ||
		rising(sh.wf.pumpC) || rising(sh.wf.voltage)
}

// rising reports whether |x| peaks in the last tenth of the series and ends at no less than
// half that peak: a quantity still building up when the run ends.
func rising(x []float64) bool {
	last := len(x) - 1
	if last < 0 {
		return false
	}
	k := floats.MaxIdx(x)
	if i := floats.MinIdx(x); -x[i] > x[k] {
		k = i
	}
	p := math.Abs(x[k])
	return p > 0 && k >= last-last/10 && math.Abs(x[last]) >= 0.5*p
}

// apertureSolidAngle is the solid angle [sr] of the channel's cross-section seen from its far
// end: a disc of the same area A at distance L, 2π·(1 − L/sqrt(L² + A/π)). It is A/L² for a
// long, thin channel and tends to 2π (a hemisphere) for a channel shorter than it is wide.
func apertureSolidAngle(area, length float64) float64 {
	r2 := area / math.Pi
	return 2 * math.Pi * (1 - length/math.Sqrt(length*length+r2))
}
