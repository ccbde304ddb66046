package kinetics

import (
	"math"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/swarm"
	"n2pulse/units"
)

// Indices of the circuit–discharge state vector.
const (
	iV1      = iota // switch-side capacitor voltage [V]
	iV2             // channel-side capacitor voltage [V]
	iIs             // switch-loop current [A]
	iIc             // channel-loop current [A]
	iVg             // channel (gap) voltage [V]
	iIsh            // shunt-inductor current [A]
	iLnNe           // ln(n_e / m⁻³)
	iQ              // ∫ I_s² dt of the spark [A² s]
	iESwitch        // energy dissipated in the switch [J]
	iEPlasma        // energy delivered to the plasma [J]
	iEShunt         // energy dissipated in the shunt resistor [J]
	iX2             // share of the positive ions that are N₂⁺ (ionChemistry)
	iX4             // share of the positive ions that are N₄⁺
	nState
)

// circuit is the stiff 0-D system of the circuit and the discharge: the ode.System that the
// Rosenbrock integrator advances.
type circuit struct {
	topo               design.Topology
	c1, c2, cg         float64 // [F]
	ls, lc, lsh, rsh   float64 // [H], [Ω]
	sw                 design.Switch
	q0                 float64 // spark integral at closure that gives R = R_off [A² s]
	density, gap, area float64 // N [m⁻³], d [m], L·w [m²]
	beta               float64 // one recombination coefficient for every ion [m³/s]; 0: per ion, from T_e (ionChemistry)
	ions               ionChemistry
	tgas               float64 // gas temperature [K], the floor of T_e
	recScale           float64 // factor on the computed per-ion coefficients
	table              *swarm.Table
	rates              *swarmRates // the table's interpolation of the coefficients used here

	// For tests of the circuit alone: when fixed, the plasma is replaced by a constant
	// conductance [S] and the electron density is frozen.
	fixed       bool
	conductance float64

	// Swarm lookups of this run outside the table (the table's own counters are shared by
	// every run in the process).
	lo, hi       float64 // table range [V m²]
	below, above int64
}

// gapCapacitance is the capacitance across the electrodes in parallel with the plasma,
// C_g = ε₀·L·w_e/d plus the stray capacitance [F]; the electrode face width w_e defaults to the
// discharge width.
func gapCapacitance(ch design.Channel) float64 {
	we := ch.ElectrodeWidth
	if we == 0 {
		we = ch.Width
	}
	return units.VacuumPermittivity*ch.Length*we/ch.Gap + ch.StrayCapacitance
}

func newCircuit(d *design.Design, table *swarm.Table) *circuit {
	ch := d.Channel
	c := &circuit{
		topo: d.Circuit.Topology,
		c1:   d.Circuit.SwitchCapacitance, c2: d.Circuit.ChannelCapacitance,
		cg: gapCapacitance(ch),
		ls: d.Circuit.SwitchInductance, lc: d.Circuit.ChannelInductance,
		lsh: d.Circuit.ShuntInductance, rsh: d.Circuit.ShuntResistance,
		sw:      d.Switch,
		density: gasDensity(d.Gas), gap: ch.Gap, area: ch.Length * ch.Width,
		beta: d.Discharge.Recombination, table: table,
		ions: newIonChemistry(d.Gas, gasDensity(d.Gas)), tgas: d.Gas.Temperature, recScale: d.Discharge.RecombinationScale,
	}
	c.lo, c.hi = table.Range()
	c.rates = newSwarmRates(table)
	if c.sw.Model == design.RompeWeizelSwitch {
		// R(0) = d_g / sqrt((2a/p_g)·q0) = R_off.
		r := c.sw.Gap / c.sw.OffResistance
		c.q0 = r * r * c.sw.Pressure / (2 * c.sw.SparkConstant)
	}
	return c
}

// Dim implements ode.System.
func (c *circuit) Dim() int { return nState }

// initial returns the state at switch closure and the stored energy [J].
func (c *circuit) initial(v0, seed float64) ([]float64, float64) {
	y := make([]float64, nState)
	y[iV1] = v0
	if c.topo == design.Blumlein {
		y[iV2] = v0
	}
	y[iLnNe] = math.Log(seed)
	y[iX2] = 1 // every ion is born N₂⁺
	return y, c.storedEnergy(y)
}

// storedEnergy is the energy in the capacitors and inductors of state y [J].
func (c *circuit) storedEnergy(y []float64) float64 {
	return 0.5 * (c.c1*y[iV1]*y[iV1] + c.c2*y[iV2]*y[iV2] + c.cg*y[iVg]*y[iVg] +
		c.ls*y[iIs]*y[iIs] + c.lc*y[iIc]*y[iIc] + c.lsh*y[iIsh]*y[iIsh])
}

// switchResistance is R_s at time t with spark integral q [Ω].
func (c *circuit) switchResistance(t, q float64) float64 {
	s := c.sw
	switch s.Model {
	case design.ExponentialSwitch:
		return s.OnResistance + (s.OffResistance-s.OnResistance)*math.Exp(-t/s.RiseTime)
	case design.RompeWeizelSwitch:
		return s.OnResistance + s.Gap/math.Sqrt(2*s.SparkConstant/s.Pressure*(c.q0+math.Max(q, 0)))
	}
	return s.OnResistance
}

// reducedField is |E|/N for a channel voltage vg [V m²].
func (c *circuit) reducedField(vg float64) float64 { return math.Abs(vg) / (c.gap * c.density) }

// count counts a lookup of the swarm table at E/N = en outside its rows.
func (c *circuit) count(en float64) {
	switch {
	case en > c.hi:
		c.above++
	case en < c.lo:
		c.below++
	}
}

// plasmaCurrent is e·n_e·v_d(E/N)·A with the sign of vg [A]; the net ionisation rate
// coefficient k_ion − k_att [m³/s], the ionisation rate coefficient k_ion [m³/s] and the mean
// electron energy [J].
func (c *circuit) plasmaCurrent(vg, ne float64) (current, net, kion, mean float64) {
	en := c.reducedField(vg)
	c.count(en)
	var k [nRates]float64
	c.rates.at(en, rateDrift, rateMean+1, &k, nil)
	return math.Copysign(units.ElementaryCharge*ne*k[rateDrift]*c.area, vg), k[rateIon] - k[rateAtt], k[rateIon], k[rateMean]
}

// recombinationAt returns the recombination coefficients of electrons of mean energy mean [J]
// with N₂⁺, N₄⁺ and O₂⁺ [m³/s] and their derivatives with respect to mean [m³/(s J)]: the
// design's one coefficient for every ion when it sets one, else the published ones at
// T_e = ⅔·⟨ε⟩/k_B (electronTemperature, recombination) times discharge.recombination_scale.
func (c *circuit) recombinationAt(mean float64) (a, da [3]float64) {
	if c.beta > 0 {
		return [3]float64{c.beta, c.beta, c.beta}, da
	}
	te, dte := electronTemperature(mean, c.tgas)
	a, dat := recombination(te)
	for j := range da {
		a[j] *= c.recScale
		da[j] = c.recScale * dat[j] * dte
	}
	return a, da
}

// dischargeSample is what the waveforms take of the discharge at one sample of channel voltage vg [V]
// and electron density ne [m⁻³], from one lookup of the swarm table (counted once; circuit.sample): the rate
// coefficients for X → B³Πg, X → C³Πu, X → W³Δu and X → B′³Σu⁻ [m³/s] (W and B′ zero for a
// table without them) and for ionisation, the mean electron energy [J], the plasma current e·n_e·v_d·A with the
// sign of vg [A], and the share of the plasma power taken by each channel of the swarm's power
// split (split false when the table has none).
type dischargeSample struct {
	kB, kC, kW, kBp, mean float64
	kIon                  float64 // ionisation rate coefficient [m³/s]
	current               float64
	share                 [swarm.NumChannels]float64
	split                 bool
}

func (c *circuit) sample(vg, ne float64) dischargeSample {
	en := c.reducedField(vg)
	c.count(en)
	var k [nRates]float64
	c.rates.at(en, rateDrift, nRates, &k, nil)
	s := dischargeSample{kB: k[rateExcB], kC: k[rateExcC], kW: k[rateExcW], kBp: k[rateExcBp], mean: k[rateMean], kIon: k[rateIon],
		current: math.Copysign(units.ElementaryCharge*ne*k[rateDrift]*c.area, vg)}
	sum := 0.0
	for _, p := range k[ratePower:] {
		sum += p
	}
	if !(sum > 0) {
		return s
	}
	s.split = true
	for i, p := range k[ratePower:] {
		s.share[i] = p / sum
	}
	return s
}

// Eval implements ode.System.
func (c *circuit) Eval(t float64, y, dy []float64) error {
	var ip, net, kion, mean float64
	ne := math.Exp(y[iLnNe])
	if c.fixed {
		ip = c.conductance * y[iVg]
	} else {
		ip, net, kion, mean = c.plasmaCurrent(y[iVg], ne)
	}
	rs := c.switchResistance(t, y[iQ])
	v1, v2, is, ic, vg := y[iV1], y[iV2], y[iIs], y[iIc], y[iVg]

	var shunt, vsh float64 // current through the shunt [A] and the voltage across it [V]
	switch c.topo {
	case design.Blumlein:
		vsh = v2 - v1
	default:
		vsh = v2
	}
	if c.lsh > 0 {
		shunt += y[iIsh]
		dy[iIsh] = vsh / c.lsh
	} else {
		dy[iIsh] = 0
	}
	dy[iEShunt] = 0
	if c.rsh > 0 {
		shunt += vsh / c.rsh
		dy[iEShunt] = vsh * vsh / c.rsh
	}

	switch c.topo {
	case design.Blumlein:
		// The switch shorts C₁ through L_s; the channel loop runs from the C₂ plate through
		// L_c and the gap back to the C₁ plate.
		dy[iV1] = (ic + shunt - is) / c.c1
		dy[iV2] = -(ic + shunt) / c.c2
		dy[iIs] = (v1 - rs*is) / c.ls
		dy[iIc] = (v2 - v1 - vg) / c.lc
	default:
		// The switch connects C_s to C_p through L_s; C_p feeds the gap through L_c.
		dy[iV1] = -is / c.c1
		dy[iV2] = (is - ic - shunt) / c.c2
		dy[iIs] = (v1 - v2 - rs*is) / c.ls
		dy[iIc] = (v2 - vg) / c.lc
	}
	dy[iVg] = (ic - ip) / c.cg
	dy[iLnNe], dy[iX2], dy[iX4] = 0, 0, 0
	if !c.fixed {
		a, _ := c.recombinationAt(mean)
		x2, x4 := y[iX2], y[iX4]
		dy[iLnNe] = net*c.density - meanRecombination(x2, x4, a)*ne
		dy[iX2], dy[iX4] = c.ions.shareRates(x2, x4, kion*c.density, ne, a)
	}
	dy[iQ] = is * is
	dy[iESwitch] = rs * is * is
	dy[iEPlasma] = vg * ip
	return nil
}
