package swarm

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"io"
	"io/fs"
	"math"
	"n2pulse/internal/atomicfile"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"unicode"

	"n2pulse/data"
	"n2pulse/units"
)

// SolverVersion changes whenever the solver or the shipped cross sections change in a way that
// changes results; cached tables carry it in their key.
const SolverVersion = "hp2t-2"

// AirNitrogen and AirOxygen are the mole fractions of the built-in "air" table, recognised by
// ForMixture: dry air with its argon and CO₂ (about 1 %) counted as N₂ (common practice, no
// source).
const (
	AirNitrogen = 0.79
	AirOxygen   = 0.21
)

// TableFields are the reduced fields [V m²] of the shipped and cached tables: 64 points
// log-spaced from 10 to 3000 Td.
var TableFields = logSpace(10*units.Townsend, 3000*units.Townsend, 64)

func logSpace(lo, hi float64, n int) []float64 {
	out := make([]float64, n)
	for i := range out {
		out[i] = lo * math.Pow(hi/lo, float64(i)/float64(n-1))
	}
	return out
}

// Mixture returns the built-in components of DefaultSet for the given mole fractions (zero
// fractions are left out).
func Mixture(nitrogen, oxygen, helium float64) ([]Component, error) {
	return SetMixture(DefaultSet, nitrogen, oxygen, helium)
}

// SetMixture returns the built-in components of the named cross-section set for the given mole
// fractions (zero fractions are left out).
func SetMixture(set string, nitrogen, oxygen, helium float64) ([]Component, error) {
	if err := checkFractions(nitrogen, oxygen, helium); err != nil {
		return nil, err
	}
	var mix []Component
	for _, c := range []struct {
		name string
		x    float64
	}{{"N2", nitrogen}, {"O2", oxygen}, {"He", helium}} {
		if c.x == 0 {
			continue
		}
		sp, err := SetSpecies(set, c.name)
		if err != nil {
			return nil, err
		}
		mix = append(mix, Component{Species: sp, Fraction: c.x})
	}
	return mix, nil
}

// checkFractions checks mole fractions of N₂, O₂ and He: each in 0–1, their sum 1 within 1e-3.
func checkFractions(nitrogen, oxygen, helium float64) error {
	for _, f := range []struct {
		name string
		x    float64
	}{{"nitrogen", nitrogen}, {"oxygen", oxygen}, {"helium", helium}} {
		if !(f.x >= 0 && f.x <= 1) {
			return fmt.Errorf("swarm: %s fraction %g: allowed 0–1", f.name, f.x)
		}
	}
	if s := nitrogen + oxygen + helium; math.Abs(s-1) > 1e-3 {
		return fmt.Errorf("swarm: fractions nitrogen %g + oxygen %g + helium %g = %g, want 1 (within 1e-3)", nitrogen, oxygen, helium, s)
	}
	return nil
}

// Extra columns written after Columns and OptionalColumns by WriteResultsCSV.
var extraColumns = []string{"growth_m3_s", "power_balance"}

// SolveTable solves the mixture at the given reduced fields (ascending) and returns the table
// and the per-row results.
func SolveTable(mix []Component, s *Settings, fields []float64) (*Table, []*Result, error) {
	sv, err := NewSolver(mix, s)
	if err != nil {
		return nil, nil, err
	}
	res, err := sv.Sweep(fields)
	if err != nil {
		return nil, nil, err
	}
	rows := make([]Coefficients, len(res))
	for i, r := range res {
		rows[i] = r.Coefficients
	}
	t, err := NewTable(rows)
	if err != nil {
		return nil, nil, err
	}
	return t, res, nil
}

// WriteResultsCSV writes a table of results: the Columns, OptionalColumns, growth_m3_s (ν̄/N),
// power_balance, then the rate coefficient of every process per target molecule, each column
// named after its species and the state it leads to (ColumnName), e.g. k_N2_C3Pi_u_m3_s.
func WriteResultsCSV(w io.Writer, comments []string, res []*Result) error {
	if len(res) == 0 {
		return ErrEmpty
	}
	names := append([]string(nil), extraColumns...)
	seen := map[string]int{}
	for _, c := range append(append([]string(nil), Columns...), OptionalColumns...) {
		seen[c] = 1
	}
	for _, n := range names {
		seen[n] = 1
	}
	for _, q := range res[0].Rates {
		col := ColumnName(q.Species, q.Name, q.Label)
		if n := seen[col]; n > 0 {
			seen[col] = n + 1
			col = strings.TrimSuffix(col, "_m3_s") + fmt.Sprintf("_%d_m3_s", n+1)
		}
		seen[col]++
		names = append(names, col)
	}
	rows := make([]Coefficients, len(res))
	extra := make([][]float64, len(res))
	for i, r := range res {
		rows[i] = r.Coefficients
		e := []float64{r.GrowthRate, r.PowerBalance()}
		for _, q := range r.Rates {
			e = append(e, q.K)
		}
		extra[i] = e
	}
	return writeCSV(w, comments, rows, names, extra)
}

// ColumnName is the CSV column of the rate coefficient of a process: "k_<species>_<state>_m3_s",
// the state being what the process name gives after "->" inside the species' parentheses
// ("N2(X) -> N2(C3Pi_u) (all v)" gives k_N2_C3Pi_u_m3_s, "N2(X,v=0) -> N2(v=1)" gives
// k_N2_v1_m3_s); a process whose product is not one state of the species is named by its
// label (k_O2_ion_m3_s), else by its whole product. Signs and primes are spelled out
// (+ plus, − minus, ' p) so that the name is one identifier.
func ColumnName(species, name, label string) string {
	prod := name
	if _, after, ok := strings.Cut(name, "->"); ok {
		prod = strings.TrimSpace(after)
	}
	state := ""
	if rest, ok := strings.CutPrefix(prod, species+"("); ok {
		if inner, _, ok := strings.Cut(rest, ")"); ok && !strings.Contains(inner, ",") {
			state = inner
		}
	}
	if state == "" && label != "" {
		state = label
	}
	if state == "" {
		state, _, _ = strings.Cut(prod, " (")
	}
	var b strings.Builder
	for _, r := range state {
		switch {
		case r == '+':
			b.WriteString("plus")
		case r == '-':
			b.WriteString("minus")
		case r == '\'':
			b.WriteString("p")
		case r == '*':
			b.WriteString("star")
		case r == '=':
		case r == '_' || r < 128 && (unicode.IsLetter(r) || unicode.IsDigit(r)):
			b.WriteRune(r)
		default:
			b.WriteRune('_')
		}
	}
	slug := strings.Trim(b.String(), "_")
	for strings.Contains(slug, "__") {
		slug = strings.ReplaceAll(slug, "__", "_")
	}
	if slug == "" {
		slug = "process"
	}
	return "k_" + species + "_" + slug + "_m3_s"
}

// Composition describes a mixture for file headers.
func Composition(mix []Component) string {
	s := ""
	for i, c := range mix {
		if i > 0 {
			s += ", "
		}
		s += fmt.Sprintf("%s %.4g", c.Species.Name, c.Fraction)
	}
	return s
}

// TableComments are the comment lines of a generated table.
func TableComments(mix []Component, s *Settings) []string {
	set := Settings{Cells: DefaultCells, GasTemperature: 300}
	if s != nil {
		set = *s
		if set.Cells == 0 {
			set.Cells = DefaultCells
		}
		if set.GasTemperature == 0 {
			set.GasTemperature = 300
		}
	}
	return []string{
		"n2pulse swarm table: electron transport and rate coefficients against E/N, from n2pulse's own steady solution of the electron Boltzmann equation with the distribution expanded to first order in the direction of motion; electron number grows in time, an ionising collision splits the remaining energy evenly between the two electrons (method: package swarm)",
		"mixture (mole fractions): " + Composition(mix),
		fmt.Sprintf("solver %s, %d energy cells, gas temperature %g K; cross sections: %s (each process with its source)", SolverVersion, set.Cells, set.GasTemperature, crossSectionNote(mix)),
		fmt.Sprintf("k_ion, k_att per molecule of the whole gas; k_A, k_B, k_C and the k_<species>_<state> columns per target molecule; k_att includes three-body attachment to O2 at %.4g m^-3 (its part in %s)", ReferenceDensity, ThreeBodyColumn),
	}
}

// crossSectionNote names the cross-section files of the mixture's species.
func crossSectionNote(mix []Component) string {
	var f []string
	for _, c := range mix {
		name := c.Species.File
		if name == "" {
			name = c.Species.Name + " (not a shipped file)"
		}
		f = append(f, name)
	}
	return strings.Join(f, ", ")
}

var (
	builtinMu     sync.Mutex
	builtinTables = map[string]*Table{} // by file name
)

// Builtin returns the shipped table of "n2" (pure N₂) or "air" (Air) for DefaultSet, parsed
// once and shared.
func Builtin(gas string) (*Table, error) { return BuiltinSet(gas, DefaultSet) }

// BuiltinSet returns the shipped table of "n2" or "air" for the named cross-section set:
// data/swarm-<gas>.csv for SetOriginal, data/swarm-<gas>-<set>.csv for the others.
func BuiltinSet(gas, set string) (*Table, error) {
	file, err := tableFile(gas, set)
	if err != nil {
		return nil, err
	}
	builtinMu.Lock()
	defer builtinMu.Unlock()
	if t, ok := builtinTables[file]; ok {
		return t, nil
	}
	b, err := fs.ReadFile(data.SwarmTables, file)
	if err != nil {
		return nil, fmt.Errorf("swarm: %w", err)
	}
	t, err := parseCSV(b, "data/"+file)
	if err != nil {
		return nil, err
	}
	builtinTables[file] = t
	return t, nil
}

// tableFile is the shipped table file of a gas and set.
func tableFile(gas, set string) (string, error) {
	if gas != "n2" && gas != "air" {
		return "", fmt.Errorf("swarm: gas %q: want n2 or air", gas)
	}
	set, err := ResolveSet(set)
	if err != nil {
		return "", err
	}
	if set == SetOriginal {
		return "swarm-" + gas + ".csv", nil
	}
	return "swarm-" + gas + "-" + set + ".csv", nil
}

// memTables holds the tables ForMixture made in this process, keyed like the cache files: a
// sweep solves a mixture once even when the cache directory cannot be written.
var memTables sync.Map // key → *tableEntry

type tableEntry struct {
	once sync.Once
	t    *Table
	err  error
}

// ForMixture returns a table for the mole fractions of N₂, O₂ and He. Pure N₂ and Air (each
// fraction within 1e-3) return the shipped tables. Other mixtures are solved at TableFields and
// cached as CSV in cacheDir (os.UserCacheDir()/n2pulse when empty), keyed by the composition,
// SolverVersion and a hash of the cross sections; the cache file is written to a temporary
// file and renamed. The table returned is always the one read back from the CSV text (written
// at full precision), so a fresh solve, a cached file and another worker give the same
// numbers bit for bit. When the cache cannot be written the table is kept in memory only.
func ForMixture(nitrogen, oxygen, helium float64, cacheDir string) (*Table, error) {
	return ForMixtureSet(DefaultSet, nitrogen, oxygen, helium, cacheDir)
}

// ForMixtureSet is ForMixture with the named cross-section set (see ResolveSet).
func ForMixtureSet(set string, nitrogen, oxygen, helium float64, cacheDir string) (*Table, error) {
	set, err := ResolveSet(set)
	if err != nil {
		return nil, err
	}
	// The shipped tables need no cross sections: those are read only for a mixture to solve.
	if err := checkFractions(nitrogen, oxygen, helium); err != nil {
		return nil, err
	}
	near := func(a, b float64) bool { return math.Abs(a-b) <= 1e-3 }
	if near(nitrogen, 1) && near(oxygen, 0) && near(helium, 0) {
		return BuiltinSet("n2", set)
	}
	if near(nitrogen, AirNitrogen) && near(oxygen, AirOxygen) && near(helium, 0) {
		return BuiltinSet("air", set)
	}
	mix, err := SetMixture(set, nitrogen, oxygen, helium)
	if err != nil {
		return nil, err
	}
	xs, err := crossSectionHash(set)
	if err != nil {
		return nil, err
	}
	key := fmt.Sprintf("%s set=%s xsec=%s N2=%.6f O2=%.6f He=%.6f", SolverVersion, set, xs, nitrogen, oxygen, helium)
	sum := sha256.Sum256([]byte(key))
	name := "swarm-" + hex.EncodeToString(sum[:8]) + ".csv"
	if cacheDir == "" {
		if d, err := os.UserCacheDir(); err == nil {
			cacheDir = filepath.Join(d, "n2pulse")
		}
	}
	e, _ := memTables.LoadOrStore(key, &tableEntry{})
	ent := e.(*tableEntry)
	ent.once.Do(func() { ent.t, ent.err = solveOrLoad(mix, key, cacheDir, name) })
	if ent.err != nil {
		memTables.Delete(key) // a later call tries again
		return nil, ent.err
	}
	return ent.t, nil
}

// solveOrLoad reads the cache file when it holds a valid table, else solves the mixture, writes
// the file (when cacheDir is not empty and writable) and returns the table read back from the
// text written.
func solveOrLoad(mix []Component, key, cacheDir, name string) (*Table, error) {
	path := ""
	if cacheDir != "" {
		path = filepath.Join(cacheDir, name)
		if b, err := os.ReadFile(path); err == nil {
			if t, err := parseCSV(b, path); err == nil {
				return t, nil
			}
			// a damaged cache file is recomputed and replaced
		}
	}
	_, res, err := SolveTable(mix, nil, TableFields)
	if err != nil {
		return nil, err
	}
	var buf bytes.Buffer
	if err := WriteResultsCSV(&buf, append(TableComments(mix, nil), "cache key: "+key), res); err != nil {
		return nil, err
	}
	t, err := parseCSV(buf.Bytes(), "solved table")
	if err != nil {
		return nil, err
	}
	if path != "" {
		// A cache that cannot be written is not an error: the table lives in memory.
		if os.MkdirAll(cacheDir, 0o755) == nil {
			_ = atomicfile.WriteFile(path, buf.Bytes())
		}
	}
	return t, nil
}

// crossSectionHash is a short hash of the set's cross-section files (N₂ of the set, O₂, He),
// part of the cache key: a table cached before a data change is not read back after it.
func crossSectionHash(set string) (string, error) {
	h := sha256.New()
	for _, sp := range []string{"N2", "O2", "He"} {
		f, err := speciesFile(set, sp)
		if err != nil {
			return "", err
		}
		b, err := fs.ReadFile(data.CrossSections, f)
		if err != nil {
			return "", fmt.Errorf("swarm: %w", err)
		}
		fmt.Fprintf(h, "%s %d\n", f, len(b))
		h.Write(b)
	}
	return hex.EncodeToString(h.Sum(nil)[:8]), nil
}
