package kinetics

import (
	"math"
	"testing"

	"n2pulse/kinetics/swarm"
)

// swarmRates reads the coefficients the circuit and the pump use from the right columns of the
// swarm table: bit for bit what swarm.Table.At returns for those fields, inside and outside
// the shipped tables (the interpolation itself is tested in package swarm).
func TestSwarmRates(t *testing.T) {
	t.Parallel()
	for _, name := range []string{"n2", "air"} {
		tb, err := swarm.Builtin(name)
		if err != nil {
			t.Fatal(err)
		}
		r := newSwarmRates(tb)
		lo, hi := tb.Range()
		for _, en := range []float64{0, 0.3 * lo, lo, math.Sqrt(lo * hi), 0.5 * hi, hi, 1.7 * hi} {
			c := tb.At(en)
			want := [nRates]float64{c.DriftVelocity, c.Ionisation, c.Attachment, c.ExciteB, c.ExciteC, c.ExciteW, c.ExciteBPrime, c.MeanEnergy}
			copy(want[ratePower:], c.Power[:])
			var v, d [nRates]float64
			r.at(en, 0, nRates, &v, &d)
			if v != want {
				t.Errorf("%s at %g V m²: %v, Table.At %v", name, en, v, want)
			}
		}
	}
}

// swarmRates clamps a linearly interpolated value at zero as swarm.Table.At does: just below a
// row where k_C is zero, ln(E/N) rounds onto the row and the weight is −2.6e-16, which gave
// k_C = −3.8e-16 before (issue 11 item 7; the rows are those of the swarm package's test).
func TestSwarmRatesClampedAtZero(t *testing.T) {
	t.Parallel()
	tb, err := swarm.NewTable([]swarm.Coefficients{
		{ReducedField: 1e-22, DriftVelocity: 1e4},
		{ReducedField: 2.0951001982022628e-22, DriftVelocity: 2e4},
		{ReducedField: 3.0121552785336477e-22, DriftVelocity: 3e4, ExciteC: 1.5},
	})
	if err != nil {
		t.Fatal(err)
	}
	var v, d [nRates]float64
	newSwarmRates(tb).at(2.0951001982022625e-22, 0, nRates, &v, &d)
	if v[rateExcC] != 0 || tb.At(2.0951001982022625e-22).ExciteC != 0 {
		t.Errorf("k_C just below a zero row: swarmRates %g, Table.At %g, want exactly 0", v[rateExcC], tb.At(2.0951001982022625e-22).ExciteC)
	}
}
