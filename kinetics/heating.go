package kinetics

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/interp"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/spectro"
	"n2pulse/kinetics/swarm"
	"n2pulse/units"
)

// gasHeating follows the temperature of the gas in the discharge volume through a shot.
//
// The discharge is one circuit and one E/N for the whole channel, so every cell receives
// the same energy per volume (a travelling excitation only delays it): one temperature
// history stands for every cell, each reading it at its own delay, as it reads the pump.
//
// The gas is held at constant density (sound crosses a 1 mm gap in about 3 µs, far longer
// than a shot), so the heat per volume q raises the temperature by q/(N·c_v) with c_v the
// heat capacity per molecule at constant volume: (5/2)·k_B for N₂ and O₂ (translation and
// rotation; vibration takes up none on the time of a shot, as vibrational–translational
// relaxation of N₂ takes far longer: common practice, no source) and (3/2)·k_B for He.
// NIST-JANAF (Chase, J. Phys. Chem. Ref. Data Monograph 9 (1998)) gives C_p(N₂, 298 K) =
// 29.12 J mol⁻¹ K⁻¹, C_v = C_p − R = 2.50·R (from memory).
//
// The heat comes from two parts of the electrons' power (package swarm's power split, at the
// E/N of each moment). The elastic recoil is heat at once. Of the energy the electrons put
// into electronic states, dissociation and ionisation, a share η (design key
// levels.fast_heating_share, "fast gas heating") ends as heat within the shot; it is
// released as the excited states are quenched, here at the rate the B³Πg/W³Δu/B′³Σu⁻
// manifold is removed by collisions, N·(x_N₂·k_N₂ + x_O₂·k_O₂) (levels.manifold_relaxation_*,
// about 3 ns at 1 atm in N₂): the heat passes through a reservoir of that decay rate. The
// energy put into vibration stays there. Rotational excitation is counted with vibration in
// the swarm tables' split (swarm.ChannelVibrational) and is left out: by the default set's
// solver it is 0.05–0.6 % of the field power at 300–100 Td, one to six times the elastic
// part. Both are small beside the fast share: taking seven times the elastic heat (a bound
// on elastic + rotational at ≥ 100 Td) lowered the pulse energy of the 11 mm Blumlein cases
// and of the example design in air by at most 0.7 % (measured when this was written).
type gasHeating struct {
	t0       float64 // temperature before the shot [K]
	capacity float64 // N·c_v, heat capacity at constant volume per volume [J m⁻³ K⁻¹]
	fast     float64 // η, share of the electronic and ionisation energy that becomes heat
	volume   float64 // discharge volume L·w·d [m³]
	held     *reservoir

	heat   float64 // heat put into the gas so far [J m⁻³]
	prompt float64 // of which elastic [J m⁻³]
}

// newGasHeating returns the heating of the design's gas of density n [m⁻³] in its discharge
// volume, stepped by dt [s].
func newGasHeating(d *design.Design, n, dt float64) *gasHeating {
	g, l := d.Gas, d.Levels
	cv := units.Boltzmann * (2.5*(g.Nitrogen+g.Oxygen) + 1.5*g.Helium) / (g.Nitrogen + g.Oxygen + g.Helium)
	ch := d.Channel
	h := &gasHeating{
		t0: g.Temperature, capacity: n * cv, fast: l.FastHeatingShare,
		volume: ch.Length * ch.Width * ch.Gap,
	}
	if q := n * (g.Nitrogen*l.ManifoldRelaxationNitrogen + g.Oxygen*l.ManifoldRelaxationOxygen); q > 0 && h.fast > 0 {
		h.held = newReservoir(q, q, dt)
	}
	return h
}

// electronicChannels are the channels of the power split whose energy feeds the fast heating.
var electronicChannels = [...]swarm.Channel{swarm.ChannelA, swarm.ChannelB, swarm.ChannelW,
	swarm.ChannelBPrime, swarm.ChannelC, swarm.ChannelOtherElectronic, swarm.ChannelIonisation}

// step adds the heat of one step of dt [s] in which the plasma took the power p [W], split
// by share, and returns the gas temperature at the end of the step [K].
func (h *gasHeating) step(p float64, share *[swarm.NumChannels]float64, dt float64) float64 {
	if !(h.volume > 0) {
		return h.temperature()
	}
	q := p / h.volume // [W m⁻³]
	el := share[swarm.ChannelElastic] * q * dt
	h.prompt += el
	h.heat += el
	if h.held != nil {
		var electronic float64
		for _, c := range electronicChannels {
			electronic += share[c]
		}
		h.heat += h.held.step(h.fast*electronic*q) * dt
	}
	return h.temperature()
}

// idle advances the heating over a step of dt [s] with no plasma power: the held heat still
// comes out.
func (h *gasHeating) idle(dt float64) float64 {
	if h.held != nil {
		h.heat += h.held.step(0) * dt
	}
	return h.temperature()
}

// temperature is the gas temperature now [K].
func (h *gasHeating) temperature() float64 { return h.t0 + h.heat/h.capacity }

// gainTable holds the effective cross section σ and degeneracy ratio g_C/g_B of the lasing
// line against the gas temperature at the design's density, computed by package spectro at
// nodes spaced evenly in ln T from the design's temperature to spectro.MaxTemperature and
// interpolated between them (monotone cubic, gonum interp): a hotter gas spreads C(0) over
// more rotational levels and broadens the line, lowering the gain per molecule. The pressure
// of each node is N·k_B·T, the gas being held at constant density. The strongest line changes
// with the temperature (a kink that the nodes resolve to gainTableTolerance).
//
// The nodes are computed as the gas gets there (each costs a spectro.Laser call, about
// 0.15 ms): a run that heats by a few kelvin pays for three. Two nodes are always kept
// beyond the temperature asked for, so that the interpolant there is the one of the whole
// table (the Fritsch–Butland slope at a node depends only on its neighbours).
type gainTable struct {
	n, lo, h     float64 // density [m⁻³], first node [K], node spacing in ln T
	ts, sig, rat []float64
	sigma, ratio interp.FritschButland
	full         bool    // every node up to spectro.MaxTemperature (or the last spectro accepts) is in
	highest      float64 // highest temperature asked for [K]
}

// gainTableNodes is the number of temperature nodes of a whole table;
// TestGainTableAgainstSpectro holds the interpolation to gainTableTolerance of a direct
// computation between them.
const gainTableNodes = 40

// gainTableTolerance is the largest relative error of the interpolated σ and g_C/g_B
// against spectro computed directly (TestGainTableAgainstSpectro).
const gainTableTolerance = 2e-3

// newGainTable starts the table of gas density n [m⁻³] at temperature t0 [K], where σ is
// sigma0 [m²] and g_C/g_B is ratio0 (spectro's values at the design's pressure and temperature).
func newGainTable(n, t0, sigma0, ratio0 float64) *gainTable {
	tb := &gainTable{n: n, lo: t0, h: math.Log(spectro.MaxTemperature/t0) / (gainTableNodes - 1),
		ts: []float64{t0}, sig: []float64{sigma0}, rat: []float64{ratio0}, highest: t0}
	tb.full = !(tb.h > 0)
	tb.extend(t0)
	return tb
}

// extend adds nodes until two lie above t (or the table is whole) and refits.
func (tb *gainTable) extend(t float64) {
	added := false
	for !tb.full && (len(tb.ts) < 3 || tb.ts[len(tb.ts)-2] <= t) {
		i := len(tb.ts)
		x := tb.lo * math.Exp(tb.h*float64(i))
		if i == gainTableNodes-1 {
			x = spectro.MaxTemperature
		}
		lp, err := spectro.Laser(tb.n*units.Boltzmann*x, x)
		if err != nil { // beyond what spectro accepts (pressure): the table ends here
			tb.full = true
			break
		}
		tb.ts, tb.sig, tb.rat = append(tb.ts, x), append(tb.sig, lp.CrossSection), append(tb.rat, lp.DegeneracyRatio)
		tb.full = i == gainTableNodes-1
		added = true
	}
	if added && len(tb.ts) >= 3 {
		// Fit cannot fail here: the nodes are at least three and rise strictly.
		_ = tb.sigma.Fit(tb.ts, tb.sig)
		_ = tb.ratio.Fit(tb.ts, tb.rat)
	}
}

// at returns σ [m²] and g_C/g_B at temperature t [K], clamped to the table's range; a
// temperature above the range is remembered (above) and reported by the run.
func (tb *gainTable) at(t float64) (sigma, ratio float64) {
	tb.highest = math.Max(tb.highest, t)
	if len(tb.ts) < 3 {
		return tb.sig[0], tb.rat[0]
	}
	if tb.ts[len(tb.ts)-2] <= t {
		tb.extend(t)
	}
	t = math.Min(math.Max(t, tb.lo), tb.ts[len(tb.ts)-1])
	return tb.sigma.Predict(t), tb.ratio.Predict(t)
}

// top is the highest temperature of the table [K].
func (tb *gainTable) top() float64 { return tb.ts[len(tb.ts)-1] }

// above reports whether the gas was asked for above the table's range.
func (tb *gainTable) above() bool { return tb.full && tb.highest > tb.top() }

// retuneTolerance is the relative change of σ or g_C/g_B at which the medium takes the new
// values: the gain of a cell is then off by at most this part of itself between retunes.
// A tenfold finer tolerance moved the pulse energy of the 11 mm Blumlein case with a
// fast-heating share of 0.3 by 3e-5 of itself (N₂ and air; measured when this was written).
const retuneTolerance = 1e-3

// tune gives the medium the σ and g_C/g_B of the gas temperature at step k. Every cell of a
// simultaneous discharge has the same temperature; with a travelling excitation each cell's
// is the history delayed to it, and the medium, which has one σ for all cells, takes the
// mid-channel cell's (a stated approximation: the run warns when the gas heats by more than
// heatingWarnRise).
func (sh *shot) tune(k int) {
	if sh.gains == nil {
		return
	}
	mid := sh.d.Numerics.Cells / 2
	t := sh.gasTemperature(k, sh.delayWhole[mid], sh.delayFrac[mid])
	s, g := sh.gains.at(t)
	m := sh.med
	if math.Abs(s-m.sigma) > retuneTolerance*m.sigma || math.Abs(g-m.g) > retuneTolerance*m.g {
		m.retune(s, g)
	}
	sh.sigmas[k], sh.ratios[k] = m.sigma, m.g
}

// gasTemperature is the gas temperature [K] of a cell whose excitation is delayed by whole
// steps and frac of one, at step k: the design's temperature before the discharge reaches it.
func (sh *shot) gasTemperature(k, whole int, frac float64) float64 {
	j := k - whole
	t0 := sh.d.Gas.Temperature
	switch {
	case j < 0 || j >= len(sh.wf.gasT): // before the discharge, or waveforms made without heating (tests)
		return t0
	case j == 0:
		return sh.wf.gasT[0]*(1-frac) + t0*frac
	}
	return sh.wf.gasT[j]*(1-frac) + sh.wf.gasT[j-1]*frac
}

// gainAt returns σ [m²] and g_C/g_B of the medium at step k.
func (sh *shot) gainAt(k int) (sigma, ratio float64) {
	if sh.sigmas == nil {
		return sh.p.CrossSection, sh.p.DegeneracyRatio
	}
	return sh.sigmas[k], sh.ratios[k]
}

// heatingWarnRise is the rise of the gas temperature [K] above which a travelling excitation
// warns that its cells share the mid-channel cell's cross section.
const heatingWarnRise = 10

// heatingSummary puts the peak gas temperature and the gain table's limit into the summary
// and returns the warnings of the heating: a gas heated above the table's range, and a
// travelling excitation whose cells share one cross section while the gas heats.
func heatingSummary(s *Summary, d *design.Design, sh *shot) []string {
	top := d.Gas.Temperature
	for _, t := range sh.wf.gasT {
		top = math.Max(top, t)
	}
	s.PeakGasTemperature = top
	s.PulseGasTemperature = d.Gas.Temperature
	if pk, k := peak(sh.powerFront); pk > 0 {
		mid := d.Numerics.Cells / 2
		s.PulseGasTemperature = sh.gasTemperature(k, sh.delayWhole[mid], sh.delayFrac[mid])
	}
	var w []string
	if sh.gains == nil {
		return nil
	}
	if sh.gains.above() {
		s.GasTemperatureAbove = true
		w = append(w, fmt.Sprintf("the gas heated to %.0f K, above the %.0f K up to which the gain cross section is tabulated: the cross section was held at its value there, so the gain is overstated",
			sh.gains.highest, sh.gains.top()))
	}
	if !sh.uniform && top-d.Gas.Temperature > heatingWarnRise {
		w = append(w, fmt.Sprintf("the gas heated by %.0f K: with a travelling excitation every cell takes the gain cross section of the mid-channel cell's gas temperature", top-d.Gas.Temperature))
	}
	return w
}
