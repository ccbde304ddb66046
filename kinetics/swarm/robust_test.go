package swarm

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/units"
)

// clampRows is a table whose k_C is zero up to the second row and positive at the third; at
// E/N just below the second row, ln(E/N) rounds to the row's own logarithm, so the search picks
// the interval above it and the linear weight is −2.6e-16: unclamped, k_C came out −3.8e-16
// (found by a search over random rows; issue 11 item 7).
var clampRows = []Coefficients{
	{ReducedField: 1e-22, DriftVelocity: 1e4},
	{ReducedField: 2.0951001982022628e-22, DriftVelocity: 2e4},
	{ReducedField: 3.0121552785336477e-22, DriftVelocity: 3e4, ExciteC: 1.5},
}

// clampField is the E/N [V m²] just below the second row of clampRows.
const clampField = 2.0951001982022625e-22

func TestAtClampedAtZero(t *testing.T) {
	t.Parallel()
	tb, err := NewTable(clampRows)
	if err != nil {
		t.Fatal(err)
	}
	if c := tb.At(clampField); c.ExciteC != 0 {
		t.Errorf("k_C just below a zero row = %g, want exactly 0", c.ExciteC)
	}
}

// TestAtDensity: three-body attachment scales with the gas density (a two-body rate k3·N/N_ref),
// the rest of the table does not; at the reference density the table is returned as it is.
func TestAtDensity(t *testing.T) {
	t.Parallel()
	air, err := BuiltinSet("air", SetOriginal)
	if err != nil {
		t.Fatal(err)
	}
	if same, err := air.AtDensity(ReferenceDensity); err != nil || same != air {
		t.Errorf("at the reference density: %v, same table %v", err, same == air)
	}
	n := ReferenceDensity * 40 / 760 // 40 Torr at 300 K
	low, err := air.AtDensity(n)
	if err != nil {
		t.Fatal(err)
	}
	rows := air.Rows()
	for _, i := range []int{0, 12, 24} { // 10, 30, 90 Td: on rows, where no interpolation enters
		en := rows[i].ReducedField
		td := en / units.Townsend
		a, b := air.At(en), low.At(en)
		if a.ThreeBodyAttachment <= 0 {
			t.Fatalf("%g Td: no three-body attachment in the air table", td)
		}
		wantK3 := a.ThreeBodyAttachment * 40 / 760
		wantAtt := a.Attachment - a.ThreeBodyAttachment + wantK3
		if !scalar.EqualWithinAbsOrRel(b.ThreeBodyAttachment, wantK3, 0, 1e-12) ||
			!scalar.EqualWithinAbsOrRel(b.Attachment, wantAtt, 0, 1e-12) ||
			!scalar.EqualWithinAbsOrRel(b.EtaN, a.EtaN+(wantAtt-a.Attachment)/a.DriftVelocity, 0, 1e-12) {
			t.Errorf("%g Td at 40 Torr: k3 %g (want %g), k_att %g (want %g), η/N %g (want %g)",
				td, b.ThreeBodyAttachment, wantK3, b.Attachment, wantAtt, b.EtaN, a.EtaN+(wantAtt-a.Attachment)/a.DriftVelocity)
		}
		if b.DriftVelocity != a.DriftVelocity || b.ExciteC != a.ExciteC || b.Ionisation != a.Ionisation {
			t.Errorf("%g Td: a value other than attachment moved", td)
		}
	}
	// At 10 Td in 1-atm air three-body attachment is most of k_att (Kossyi et al. 1992 rates;
	// it is negligible above about 100 Td), so at 40 Torr k_att falls several-fold.
	if a, b := air.At(10*units.Townsend), low.At(10*units.Townsend); !(b.Attachment < a.Attachment/3) {
		t.Errorf("10 Td: k_att %g at 40 Torr against %g at 1 atm, want below a third", b.Attachment, a.Attachment)
	}
	if _, err := air.AtDensity(0); err == nil {
		t.Error("density 0 accepted")
	}
	// pure N2 has no three-body attachment: the same table back
	n2, _ := BuiltinSet("n2", SetOriginal)
	if same, _ := n2.AtDensity(n); same != n2 {
		t.Error("N2 table was rebuilt although it has no three-body attachment")
	}
}

// TestReadCSVBounded: a file beyond MaxCSVBytes or MaxCSVRows is refused without reading it
// all (issue 11: numerics.swarm_table = /dev/zero grew memory without bound).
func TestReadCSVBounded(t *testing.T) {
	t.Parallel()
	zero := io.LimitReader(zeroReader{}, 1<<40) // a terabyte of zero bytes, never held
	if _, err := ReadCSV(zero, "/dev/zero"); err == nil || !strings.Contains(err.Error(), "larger than 16 MiB") {
		t.Errorf("endless input: %v", err)
	}
	var b strings.Builder
	b.WriteString(strings.Join(Columns, ",") + "\n")
	for i := 0; i <= MaxCSVRows; i++ {
		fmt.Fprintf(&b, "%d,1,1e4,0,0,0,0,0,0,0\n", i+1)
	}
	if _, err := ReadCSV(strings.NewReader(b.String()), "big.csv"); err == nil || !strings.Contains(err.Error(), "more than 100000 rows") {
		t.Errorf("%d rows: %v", MaxCSVRows+1, err)
	}
}

type zeroReader struct{}

func (zeroReader) Read(p []byte) (int, error) {
	clear(p)
	return len(p), nil
}

// TestCSVRoundTripExact: WriteCSV then ReadCSV gives the same float64 values (shortest round-trip
// form), including the three-body column.
func TestCSVRoundTripExact(t *testing.T) {
	t.Parallel()
	air, _ := BuiltinSet("air", SetOriginal)
	var buf bytes.Buffer
	if err := air.WriteCSV(&buf); err != nil {
		t.Fatal(err)
	}
	back, err := ReadCSV(&buf, "round trip")
	if err != nil {
		t.Fatal(err)
	}
	a, b := air.Rows(), back.Rows()
	for i := range a {
		if a[i].values() != b[i].values() {
			t.Fatalf("row %d differs after a round trip: %v vs %v", i+1, a[i], b[i])
		}
	}
}

// TestForMixtureBitIdentical: a 50 % He mixture gives the same table bit for bit from a cold
// cache, a warm cache, a second directory solved concurrently by two goroutines, and a cache
// directory that cannot be written (issue 11 item 2: the fresh solve was used at full
// precision, the cached file at 8 digits).
//
// It runs serially: it clears the process-wide table cache.
func TestForMixtureBitIdentical(t *testing.T) {
	cold := t.TempDir()
	a, err := ForMixtureSet(SetOriginal, 0.5, 0, 0.5, cold)
	if err != nil {
		t.Fatal(err)
	}
	memTables.Clear() // as a new process: read the file back
	b, err := ForMixtureSet(SetOriginal, 0.5, 0, 0.5, cold)
	if err != nil {
		t.Fatal(err)
	}
	if a == b {
		t.Fatal("the warm call did not read the cache file")
	}
	memTables.Clear()
	par := t.TempDir()
	var wg sync.WaitGroup
	got := make([]*Table, 2)
	for i := range got {
		wg.Add(1)
		go func() {
			defer wg.Done()
			got[i], _ = ForMixtureSet(SetOriginal, 0.5, 0, 0.5, par)
		}()
	}
	wg.Wait()
	memTables.Clear()
	ro := filepath.Join(t.TempDir(), "file-not-dir")
	if err := os.WriteFile(ro, nil, 0o444); err != nil {
		t.Fatal(err)
	}
	c, err := ForMixtureSet(SetOriginal, 0.5, 0, 0.5, ro) // a path under it cannot be created
	if err != nil {
		t.Fatalf("unwritable cache: %v (want the table kept in memory)", err)
	}
	for name, tb := range map[string]*Table{"warm": b, "worker 1": got[0], "worker 2": got[1], "unwritable cache": c} {
		if tb == nil {
			t.Fatalf("%s: no table", name)
		}
		ra, rb := a.Rows(), tb.Rows()
		for i := range ra {
			if ra[i] != rb[i] {
				t.Fatalf("%s: row %d differs from the cold solve: %v vs %v", name, i+1, rb[i], ra[i])
			}
		}
	}
}

// TestColumnName: rate columns are named by species and state, not numbered.
func TestColumnName(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ species, name, label, want string }{
		{"N2", "N2(X) -> N2(C3Pi_u) (all v)", "C", "k_N2_C3Pi_u_m3_s"},
		{"N2", "N2(X,v=0) -> N2(v=1)", "vib1", "k_N2_v1_m3_s"},
		{"N2", "N2(X) -> N2(B'3Sigma_u-)", "", "k_N2_Bp3Sigma_uminus_m3_s"},
		{"O2", "O2 -> O2+ (+ dissociative channels; counting ionisation)", "ion", "k_O2_ion_m3_s"},
		{"O2", "O2(X) -> 9.97 eV states", "", "k_O2_9_97_eV_states_m3_s"},
	} {
		if got := ColumnName(c.species, c.name, c.label); got != c.want {
			t.Errorf("ColumnName(%q, %q, %q) = %q, want %q", c.species, c.name, c.label, got, c.want)
		}
	}
}
