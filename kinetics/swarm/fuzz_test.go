package swarm

import (
	"bytes"
	"math"
	"testing"

	"n2pulse/data"
)

// FuzzReadCSV feeds arbitrary bytes to the swarm-table reader: it may refuse, never panic, and
// a table it accepts has finite coefficients at increasing reduced fields. Seeds are in
// testdata/fuzz/FuzzReadCSV.
func FuzzReadCSV(f *testing.F) {
	if b, err := data.SwarmTables.ReadFile("swarm-n2.csv"); err == nil {
		f.Add(b)
	}
	f.Fuzz(func(t *testing.T, b []byte) {
		tab, err := ReadCSV(bytes.NewReader(b), "fuzz.csv")
		if err != nil {
			return
		}
		prev := math.Inf(-1)
		for i, r := range tab.Rows() {
			if !(r.ReducedField > prev) || math.IsInf(r.ReducedField, 0) {
				t.Fatalf("row %d: reduced field %g after %g", i, r.ReducedField, prev)
			}
			prev = r.ReducedField
			for _, x := range []float64{r.DriftVelocity, r.MeanEnergy, r.Ionisation, r.Attachment, r.ExciteA, r.ExciteB, r.ExciteC} {
				if math.IsNaN(x) || math.IsInf(x, 0) {
					t.Fatalf("row %d: non-finite coefficient in %+v", i, r)
				}
			}
		}
	})
}
