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
