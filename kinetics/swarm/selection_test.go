package swarm

import (
	"math"
	"testing"
)

// A Selection of some columns, in any order, returns what Table.At returns, bit for bit,
// across and outside the shipped tables; its derivatives match central differences of the
// interpolation itself; below the range the drift velocity is proportional to E/N.
func TestSelection(t *testing.T) {
	t.Parallel()
	if ColPower != nbase+3 {
		t.Fatalf("ColPower = %d, want %d: the columns must follow Coefficients.values", ColPower, nbase+3)
	}
	cols := []Column{ColExciteC, ColDrift, ColAttachment, ColPower + Column(ChannelIonisation), ColMeanEnergy}
	for _, name := range []string{"n2", "air"} {
		tb, err := BuiltinSet(name, SetOriginal)
		if err != nil {
			t.Fatal(err)
		}
		s := tb.Select(cols...)
		lo, hi := tb.Range()
		rows := tb.Rows()
		ens := []float64{0, math.NaN(), 0.3 * lo, lo, hi, 1.7 * hi}
		for _, row := range rows {
			ens = append(ens, row.ReducedField, row.ReducedField*(1+1e-9))
		}
		for k := 0; k <= 500; k++ {
			ens = append(ens, lo*math.Pow(hi/lo, float64(k)/500))
		}
		v, d := make([]float64, len(cols)), make([]float64, len(cols))
		for _, en := range ens {
			c := tb.At(en)
			all := c.values()
			s.At(en, 0, len(cols), v, d)
			for j, col := range cols {
				if v[j] != all[col] && !(math.IsNaN(v[j]) && math.IsNaN(all[col])) {
					t.Fatalf("%s at %g V m², column %d: %g, Table.At %g", name, en, col, v[j], all[col])
				}
			}
		}
		for i := 0; i+1 < len(rows); i++ {
			en := math.Sqrt(rows[i].ReducedField * rows[i+1].ReducedField)
			h := 1e-6 * en
			vp, vm := make([]float64, len(cols)), make([]float64, len(cols))
			s.At(en, 0, len(cols), v, d)
			s.At(en+h, 0, len(cols), vp, nil)
			s.At(en-h, 0, len(cols), vm, nil)
			for j := range cols {
				fd := (vp[j] - vm[j]) / (2 * h)
				// Tolerance 1e-6 relative: central differences of a smooth function with h = 1e-6·E/N.
				if math.Abs(d[j]-fd) > 1e-6*math.Abs(fd)+1e-300 {
					t.Errorf("%s interval %d, column %d: derivative %g, differences %g", name, i, cols[j], d[j], fd)
				}
			}
		}
		s.At(0.5*lo, 0, len(cols), v, d)
		if d[1] != rows[0].DriftVelocity/lo || v[1] != rows[0].DriftVelocity*0.5*lo/lo || d[0] != 0 {
			t.Errorf("%s below the range: values %v, derivatives %v", name, v, d)
		}
	}
}
