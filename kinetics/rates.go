package kinetics

import (
	"math"
	"sort"

	"n2pulse/kinetics/swarm"
)

// Coefficients of a swarm table that the circuit and the pump use, in the order swarmRates
// keeps them: the first three for the discharge (Eval and its Jacobian), the next four for
// the pump rates, then the power taken by each channel of the swarm's power split.
const (
	rateDrift = iota // drift velocity [m/s]
	rateIon          // k_ion [m³/s]
	rateAtt          // k_att [m³/s]
	rateExcB         // k for X → B³Πg [m³/s]
	rateExcC         // k for X → C³Πu [m³/s]
	rateExcW         // k for X → W³Δu [m³/s]
	rateExcBp        // k for X → B′³Σu⁻ [m³/s]
	ratePower        // first of swarm.NumChannels powers per electron and molecule [J m³/s]
	nRates    = ratePower + int(swarm.NumChannels)
)

// swarmRates interpolates the coefficients above exactly as swarm.Table.At does (linear in
// log–log between rows, linear where a value is zero at one end of an interval, the drift
// velocity proportional to E/N below the first row, every value held outside the rows
// otherwise), with the same operations, so that it returns the same numbers; but it
// computes only the coefficients asked for, and their derivatives d/d(E/N) when asked.
type swarmRates struct {
	x, logx []float64         // E/N of the rows [V m²] and its logarithm
	lin     [][nRates]float64 // the values
	logv    [][nRates]float64 // ln of the values (NaN where not positive)
	slope   [][nRates]float64 // d ln v / d ln(E/N) on each interval, or +Inf: linear there
}

func newSwarmRates(t *swarm.Table) *swarmRates {
	rows := t.Rows()
	r := &swarmRates{
		x: make([]float64, len(rows)), logx: make([]float64, len(rows)),
		lin: make([][nRates]float64, len(rows)), logv: make([][nRates]float64, len(rows)),
		slope: make([][nRates]float64, len(rows)-1),
	}
	for i, row := range rows {
		r.x[i], r.logx[i] = row.ReducedField, math.Log(row.ReducedField)
		r.lin[i] = [nRates]float64{row.DriftVelocity, row.Ionisation, row.Attachment, row.ExciteB, row.ExciteC, row.ExciteW, row.ExciteBPrime}
		copy(r.lin[i][ratePower:], row.Power[:])
		for k, v := range r.lin[i] {
			r.logv[i][k] = math.NaN()
			if v > 0 {
				r.logv[i][k] = math.Log(v)
			}
		}
	}
	for i := range r.slope {
		for k := range nRates {
			a, b := r.logv[i][k], r.logv[i+1][k]
			if math.IsNaN(a) || math.IsNaN(b) {
				r.slope[i][k] = math.Inf(1)
				continue
			}
			r.slope[i][k] = (b - a) / (r.logx[i+1] - r.logx[i])
		}
	}
	return r
}

// at sets v[k] for first ≤ k < last to the coefficients at |E/N| = en [V m²], and, when d is
// not nil, d[k] to their derivatives with respect to E/N (one-sided, from above, on a row).
func (r *swarmRates) at(en float64, first, last int, v, d *[nRates]float64) {
	n := len(r.x)
	lo, hi := r.x[0], r.x[n-1]
	switch {
	case !(en >= lo) || math.IsNaN(en): // below the range, zero or NaN
		if math.IsNaN(en) {
			en = 0
		}
		for k := first; k < last; k++ {
			v[k] = r.lin[0][k]
			if d != nil {
				d[k] = 0
			}
		}
		if first == rateDrift {
			v[rateDrift] = r.lin[0][rateDrift] * en / lo
			if d != nil {
				d[rateDrift] = r.lin[0][rateDrift] / lo
			}
		}
		return
	case en > hi:
		for k := first; k < last; k++ {
			v[k] = r.lin[n-1][k]
			if d != nil {
				d[k] = 0
			}
		}
		return
	}
	x := math.Log(en)
	// The last row i with logx[i] ≤ x, within [0, n−2].
	i := max(0, min(sort.Search(n, func(m int) bool { return r.logx[m] > x })-1, n-2))
	dx := x - r.logx[i]
	for k := first; k < last; k++ {
		sl := r.slope[i][k]
		if math.IsInf(sl, 1) {
			f := (en - r.x[i]) / (r.x[i+1] - r.x[i])
			v[k] = max(0, r.lin[i][k]+f*(r.lin[i+1][k]-r.lin[i][k])) // as Table.At, clamped at zero
			if d != nil {
				d[k] = (r.lin[i+1][k] - r.lin[i][k]) / (r.x[i+1] - r.x[i])
			}
			continue
		}
		v[k] = math.Exp(r.logv[i][k] + sl*dx)
		if d != nil {
			d[k] = v[k] * sl / en
		}
	}
}
