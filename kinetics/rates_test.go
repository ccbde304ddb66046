package kinetics

import (
	"math"
	"testing"

	"n2pulse/kinetics/swarm"
)

// swarmRates returns what swarm.Table.At returns, bit for bit, across and outside the
// shipped tables, and its derivatives match central differences of the interpolation.
func TestSwarmRates(t *testing.T) {
	t.Parallel()
	for _, name := range []string{"n2", "air"} {
		tb, err := swarm.Builtin(name)
		if err != nil {
			t.Fatal(err)
		}
		r := newSwarmRates(tb)
		lo, hi := tb.Range()
		rows := tb.Rows()
		ens := []float64{0, math.NaN(), 0.3 * lo, lo, hi, 1.7 * hi}
		for _, row := range rows {
			ens = append(ens, row.ReducedField, row.ReducedField*(1+1e-9))
		}
		for k := 0; k <= 2000; k++ {
			ens = append(ens, lo*math.Pow(hi/lo, float64(k)/2000))
		}
		for _, en := range ens {
			c := tb.At(en)
			want := [nRates]float64{c.DriftVelocity, c.Ionisation, c.Attachment, c.ExciteB, c.ExciteC, c.ExciteW, c.ExciteBPrime, c.MeanEnergy}
			copy(want[ratePower:], c.Power[:])
			var v, d [nRates]float64
			r.at(en, 0, nRates, &v, &d)
			if v != want {
				t.Fatalf("%s at %g V m²: %v, Table.At %v", name, en, v, want)
			}
			var v1 [nRates]float64
			r.at(en, rateExcB, rateExcC+1, &v1, nil)
			if v1[rateExcB] != want[rateExcB] || v1[rateExcC] != want[rateExcC] {
				t.Fatalf("%s at %g V m²: pump rates %v, want %v", name, en, v1, want)
			}
		}
		// Derivatives inside intervals: central differences of the interpolation itself.
		for i := 0; i+1 < len(rows); i++ {
			en := math.Sqrt(rows[i].ReducedField * rows[i+1].ReducedField)
			h := 1e-6 * en
			var v, d, vp, vm [nRates]float64
			r.at(en, 0, nRates, &v, &d)
			r.at(en+h, 0, nRates, &vp, nil)
			r.at(en-h, 0, nRates, &vm, nil)
			for k := range nRates {
				fd := (vp[k] - vm[k]) / (2 * h)
				if math.Abs(d[k]-fd) > 1e-6*math.Abs(fd)+1e-300 {
					t.Errorf("%s interval %d, coefficient %d: derivative %g, differences %g", name, i, k, d[k], fd)
				}
			}
		}
		// Below the range the drift velocity is proportional to E/N.
		var v, d [nRates]float64
		r.at(0.5*lo, 0, nRates, &v, &d)
		if d[rateDrift] != rows[0].DriftVelocity/lo || d[rateIon] != 0 {
			t.Errorf("%s below the range: derivatives %v", name, d)
		}
	}
}
