package swarm

import (
	"bytes"
	"math"
	"strings"
	"sync"
	"testing"

	"n2pulse/units"
)

func sampleRows() []Coefficients {
	return []Coefficients{
		{ReducedField: 10 * units.Townsend, MeanEnergy: 1e-19, DriftVelocity: 2e4, AlphaN: 0, EtaN: 1e-23, Ionisation: 0, Attachment: 1e-18, ExciteA: 1e-20, ExciteB: 1e-19, ExciteC: 0},
		{ReducedField: 100 * units.Townsend, MeanEnergy: 4e-19, DriftVelocity: 1e5, AlphaN: 1e-24, EtaN: 1e-23, Ionisation: 1e-19, Attachment: 1e-18, ExciteA: 1e-17, ExciteB: 1e-16, ExciteC: 1e-17},
		{ReducedField: 1000 * units.Townsend, MeanEnergy: 2e-18, DriftVelocity: 5e5, AlphaN: 2e-20, EtaN: 1e-24, Ionisation: 1e-14, Attachment: 5e-19, ExciteA: 1e-15, ExciteB: 2e-15, ExciteC: 2e-15},
	}
}

func TestTableInterpolation(t *testing.T) {
	t.Parallel()
	tb, err := NewTable(sampleRows())
	if err != nil {
		t.Fatal(err)
	}
	// at the nodes the rows come back exactly (to round-off)
	for _, r := range sampleRows() {
		c := tb.At(r.ReducedField)
		if math.Abs(c.DriftVelocity-r.DriftVelocity) > 1e-9*r.DriftVelocity || math.Abs(c.ExciteB-r.ExciteB) > 1e-9*r.ExciteB {
			t.Errorf("at node %g: got %+v, want %+v", r.ReducedField, c, r)
		}
	}
	// log–log midpoint: geometric mean (sqrt(10·100) = 31.62 Td)
	c := tb.At(math.Sqrt(10*100) * units.Townsend)
	if want := math.Sqrt(2e4 * 1e5); math.Abs(c.DriftVelocity-want) > 1e-9*want {
		t.Errorf("midpoint drift %g, want %g", c.DriftVelocity, want)
	}
	// a zero at one end is interpolated linearly in E/N: k_C between 10 Td (0) and 100 Td
	c = tb.At(55 * units.Townsend)
	if want := 0.5 * 1e-17; math.Abs(c.ExciteC-want) > 1e-9*want {
		t.Errorf("k_C at 55 Td = %g, want %g", c.ExciteC, want)
	}
	if b, a := tb.OutOfRange(); b != 0 || a != 0 {
		t.Errorf("in-range lookups counted: %d below, %d above", b, a)
	}
	// negative field: |E/N|
	if c := tb.At(-100 * units.Townsend); math.Abs(c.DriftVelocity-1e5) > 1e-6 {
		t.Errorf("At(-100 Td) drift %g", c.DriftVelocity)
	}
}

func TestTableOutOfRange(t *testing.T) {
	t.Parallel()
	tb, _ := NewTable(sampleRows())
	c := tb.At(5 * units.Townsend) // constant mobility below the range
	if math.Abs(c.DriftVelocity-1e4) > 1e-9 || c.ExciteB != 1e-19 || c.ReducedField != 5*units.Townsend {
		t.Errorf("below range: %+v", c)
	}
	if c := tb.At(0); c.DriftVelocity != 0 || c.ExciteA != 1e-20 {
		t.Errorf("E/N = 0: %+v", c)
	}
	c = tb.At(5000 * units.Townsend)
	if c.DriftVelocity != 5e5 || c.Ionisation != 1e-14 {
		t.Errorf("above range: %+v", c)
	}
	if b, a := tb.OutOfRange(); b != 2 || a != 1 {
		t.Errorf("counts %d below, %d above; want 2, 1", b, a)
	}
	lo, hi := tb.Range()
	if lo != 10*units.Townsend || hi != 1000*units.Townsend {
		t.Errorf("range %g %g", lo, hi)
	}
}

func TestTableConcurrent(t *testing.T) {
	t.Parallel()
	tb, _ := NewTable(sampleRows())
	var wg sync.WaitGroup
	for g := 0; g < 4; g++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := 0; i < 1000; i++ {
				tb.At(2000 * units.Townsend)
			}
		}()
	}
	wg.Wait()
	if _, a := tb.OutOfRange(); a != 4000 {
		t.Errorf("above count %d, want 4000", a)
	}
}

// TestAtAllocationFree runs serially: testing.AllocsPerRun counts every allocation of the
// process, so parallel tests would be counted too.
func TestAtAllocationFree(t *testing.T) {
	tb, _ := NewTable(sampleRows())
	n := testing.AllocsPerRun(1000, func() { tb.At(123 * units.Townsend) })
	if n != 0 {
		t.Errorf("At allocates %g times per call", n)
	}
}

func TestNewTableErrors(t *testing.T) {
	t.Parallel()
	bad := sampleRows()
	bad[1].ReducedField = bad[0].ReducedField
	if _, err := NewTable(bad); err == nil || !strings.Contains(err.Error(), "row 2: reduced field") {
		t.Errorf("unsorted rows: %v", err)
	}
	bad = sampleRows()
	bad[2].ExciteC = math.NaN()
	if _, err := NewTable(bad); err == nil || !strings.Contains(err.Error(), "row 3: k_C") {
		t.Errorf("NaN: %v", err)
	}
	if _, err := NewTable(sampleRows()[:1]); err == nil {
		t.Error("one row accepted")
	}
}

func TestCSVRoundTrip(t *testing.T) {
	t.Parallel()
	tb, _ := NewTable(sampleRows())
	var buf bytes.Buffer
	if err := tb.WriteCSV(&buf); err != nil {
		t.Fatal(err)
	}
	back, err := ReadCSV(&buf, "x.csv")
	if err != nil {
		t.Fatal(err)
	}
	a, b := tb.Rows(), back.Rows()
	for i := range a {
		va, vb := a[i].values(), b[i].values()
		for k := range va {
			if math.Abs(va[k]-vb[k]) > 1e-7*math.Abs(va[k]) {
				t.Errorf("row %d %s: %g → %g", i, fieldNames[k], va[k], vb[k])
			}
		}
		if math.Abs(a[i].ReducedField-b[i].ReducedField) > 1e-7*a[i].ReducedField {
			t.Errorf("row %d E/N %g → %g", i, a[i].ReducedField, b[i].ReducedField)
		}
	}
}

func TestReadCSVErrors(t *testing.T) {
	t.Parallel()
	head := strings.Join(Columns, ",") + ",extra\n"
	row := "10,1,2e4,0,0,0,0,0,0,0,7\n"
	for _, c := range []struct{ in, want string }{
		{"", "t.csv:1: header: missing"},
		{"a,b\n", "t.csv:1: header: 2 columns"},
		{"# c\n" + head + row + "20,1,x,0,0,0,0,0,0,0\n", "t.csv:4: drift_velocity_m_s: \"x\" is not a finite number"},
		{head + row + "5,1,2e4,0,0,0,0,0,0,0\n", "t.csv:3: reduced_field_Td: 5 Td is not above the previous row"},
		{head + row + "20,1,2e4,0,0\n", "t.csv:3: k_ion_m3_s: missing"},
		{head + row + "20,1,2e4,-1,0,0,0,0,0,0\n", "t.csv:3: alpha_N_m2: -1 is negative"},
		{head + row, "table has 1 row"},
		{head, "no rows"},
	} {
		_, err := ReadCSV(strings.NewReader(c.in), "t.csv")
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("input %q: error %v, want it to contain %q", c.in, err, c.want)
		}
	}
}

func TestBuiltin(t *testing.T) {
	t.Parallel()
	for _, g := range []string{"n2", "air"} {
		tb, err := BuiltinSet(g, SetOriginal)
		if err != nil {
			t.Fatal(err)
		}
		if len(tb.Rows()) < 60 {
			t.Errorf("%s: %d rows", g, len(tb.Rows()))
		}
		again, _ := BuiltinSet(g, SetOriginal)
		if again != tb {
			t.Errorf("%s: Builtin parsed twice", g)
		}
	}
	if _, err := BuiltinSet("xenon", SetOriginal); err == nil {
		t.Error("unknown gas accepted")
	}
}
