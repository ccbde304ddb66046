package kinetics

import "n2pulse/kinetics/swarm"

// Coefficients of a swarm table that the circuit and the pump use, in the order swarmRates
// keeps them: the first three for the discharge (Eval and its Jacobian), the next five for
// the pump rates and the electrons' mean energy, then the power taken by each channel of the swarm's power split.
const (
	rateDrift = iota // drift velocity [m/s]
	rateIon          // k_ion [m³/s]
	rateAtt          // k_att [m³/s]
	rateExcB         // k for X → B³Πg [m³/s]
	rateExcC         // k for X → C³Πu [m³/s]
	rateExcW         // k for X → W³Δu [m³/s]
	rateExcBp        // k for X → B′³Σu⁻ [m³/s]
	rateMean         // mean electron energy [J]
	ratePower        // first of swarm.NumChannels powers per electron and molecule [J m³/s]
	nRates    = ratePower + int(swarm.NumChannels)
)

// rateColumns are the columns of the swarm table in the order above.
var rateColumns = func() []swarm.Column {
	c := []swarm.Column{swarm.ColDrift, swarm.ColIonisation, swarm.ColAttachment, swarm.ColExciteB,
		swarm.ColExciteC, swarm.ColExciteW, swarm.ColExciteBPrime, swarm.ColMeanEnergy}
	for ch := range swarm.NumChannels {
		c = append(c, swarm.ColPower+swarm.Column(ch))
	}
	return c
}()

// swarmRates is the swarm table's interpolation of the coefficients above (a swarm.Selection:
// the same numbers as swarm.Table.At, bit for bit), on fixed-size arrays.
type swarmRates struct{ sel *swarm.Selection }

func newSwarmRates(t *swarm.Table) *swarmRates { return &swarmRates{t.Select(rateColumns...)} }

// at sets v[k] for first ≤ k < last to the coefficients at |E/N| = en [V m²], and, when d is
// not nil, d[k] to their derivatives with respect to E/N (see swarm.Selection.At).
func (r *swarmRates) at(en float64, first, last int, v, d *[nRates]float64) {
	if d == nil {
		r.sel.At(en, first, last, v[:], nil)
		return
	}
	r.sel.At(en, first, last, v[:], d[:])
}
