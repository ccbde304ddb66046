package swarm

import (
	"bytes"
	"flag"
	"math"
	"n2pulse/internal/atomicfile"
	"os"
	"testing"

	"n2pulse/units"
)

var update = flag.Bool("update", false, "rewrite the shipped tables data/swarm-*.csv (every gas and cross-section set) from a fresh solve")

// TestShippedTables solves N₂ and air afresh for every cross-section set and compares with the
// shipped tables: they are this
// solver's own output, so they must agree within 1e-4 relative (the CSV keeps full precision; the
// adaptive grid moves results by about 1e-3 only if its path changes). With -update the files
// are rewritten.
func TestShippedTables(t *testing.T) {
	t.Parallel()
	var cases []struct {
		gas, set string
		xn, xo   float64
	}
	for _, set := range Sets() {
		cases = append(cases, struct {
			gas, set string
			xn, xo   float64
		}{"n2", set, 1, 0}, struct {
			gas, set string
			xn, xo   float64
		}{"air", set, AirNitrogen, AirOxygen})
	}
	for _, c := range cases {
		mix, err := SetMixture(c.set, c.xn, c.xo, 0)
		if err != nil {
			t.Fatal(err)
		}
		fresh, res, err := SolveTable(mix, nil, TableFields)
		if err != nil {
			t.Fatal(err)
		}
		name, err := tableFile(c.gas, c.set)
		if err != nil {
			t.Fatal(err)
		}
		file := "../../data/" + name
		if *update {
			var buf bytes.Buffer
			if err := WriteResultsCSV(&buf, TableComments(mix, nil), res); err != nil {
				t.Fatal(err)
			}
			if err := atomicfile.WriteFile(file, buf.Bytes()); err != nil {
				t.Fatal(err)
			}
			continue
		}
		shipped, err := BuiltinSet(c.gas, c.set)
		if err != nil {
			t.Fatal(err)
		}
		a, b := shipped.Rows(), fresh.Rows()
		if len(a) != len(b) || len(a) < 60 {
			t.Fatalf("%s: shipped %d rows, fresh %d (want equal and ≥ 60)", c.gas, len(a), len(b))
		}
		lo, hi := shipped.Range()
		if math.Abs(lo/units.Townsend-10) > 1e-6 || math.Abs(hi/units.Townsend-3000) > 1e-3 {
			t.Errorf("%s: range %g–%g Td, want 10–3000", c.gas, lo/units.Townsend, hi/units.Townsend)
		}
		for i := range a {
			va, vb := a[i].values(), b[i].values()
			for k := range va {
				if d := math.Abs(va[k] - vb[k]); d > 1e-4*math.Abs(vb[k])+1e-300 {
					t.Errorf("%s row %d (%.4g Td) %s: shipped %g, fresh %g", c.gas, i+1, a[i].ReducedField/units.Townsend, fieldNames[k], va[k], vb[k])
				}
			}
		}
	}
}

func TestMain(m *testing.M) {
	flag.Parse()
	os.Exit(m.Run())
}

// TestTableResolution: between the shipped rows, log–log interpolation reproduces a direct
// solve at the geometric midpoints: drift velocity and mean energy within 0.5 %, α/N and the
// excitation rates within 3 % where they exceed 1e-20 m³/s resp. 1e-25 m².
func TestTableResolution(t *testing.T) {
	t.Parallel()
	tb, err := BuiltinSet("n2", SetOriginal)
	if err != nil {
		t.Fatal(err)
	}
	s := n2Solver(t, 0)
	rows := tb.Rows()
	for i := 0; i+1 < len(rows); i += 7 {
		en := math.Sqrt(rows[i].ReducedField * rows[i+1].ReducedField)
		r, err := s.Solve(en)
		if err != nil {
			t.Fatal(err)
		}
		c := tb.At(en)
		for _, q := range []struct {
			name      string
			got, want float64
			tol, min  float64
		}{
			{"drift", c.DriftVelocity, r.DriftVelocity, 0.005, 0},
			{"mean energy", c.MeanEnergy, r.MeanEnergy, 0.005, 0},
			{"alpha/N", c.AlphaN, r.AlphaN, 0.03, 1e-25},
			{"k_B", c.ExciteB, r.ExciteB, 0.03, 1e-20},
			{"k_C", c.ExciteC, r.ExciteC, 0.03, 1e-20},
		} {
			if q.want < q.min {
				continue
			}
			if d := math.Abs(q.got/q.want - 1); d > q.tol {
				t.Errorf("%.4g Td %s: table %.5g, direct %.5g (%.2g%%)", en/units.Townsend, q.name, q.got, q.want, 100*d)
			}
		}
	}
}
