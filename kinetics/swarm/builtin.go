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
	"sync"

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

var (
	speciesOnce sync.Once
	speciesSet  map[string]*Species
	speciesErr  error
)

// BuiltinSpecies returns the shipped cross-section set of "N2", "O2" or "He" (parsed once;
// the caller must not modify it).
func BuiltinSpecies(name string) (*Species, error) {
	speciesOnce.Do(func() {
		speciesSet = map[string]*Species{}
		for _, f := range []string{"xsec-n2.txt", "xsec-o2.txt", "xsec-he.txt"} {
			b, err := fs.ReadFile(data.CrossSections, f)
			if err != nil {
				speciesErr = fmt.Errorf("swarm: %w", err)
				return
			}
			sp, err := ParseCrossSections(bytes.NewReader(b), "data/"+f)
			if err != nil {
				speciesErr = err
				return
			}
			speciesSet[sp.Name] = sp
		}
	})
	if speciesErr != nil {
		return nil, speciesErr
	}
	sp, ok := speciesSet[name]
	if !ok {
		return nil, fmt.Errorf("swarm: species %q: no built-in cross sections (have N2, O2, He)", name)
	}
	return sp, nil
}

// Mixture returns the built-in components for the given mole fractions (zero fractions are
// left out).
func Mixture(nitrogen, oxygen, helium float64) ([]Component, error) {
	for _, f := range []struct {
		name string
		x    float64
	}{{"nitrogen", nitrogen}, {"oxygen", oxygen}, {"helium", helium}} {
		if !(f.x >= 0 && f.x <= 1) {
			return nil, fmt.Errorf("swarm: %s fraction %g: allowed 0–1", f.name, f.x)
		}
	}
	if s := nitrogen + oxygen + helium; math.Abs(s-1) > 1e-3 {
		return nil, fmt.Errorf("swarm: fractions nitrogen %g + oxygen %g + helium %g = %g, want 1 (within 1e-3)", nitrogen, oxygen, helium, s)
	}
	var mix []Component
	for _, c := range []struct {
		name string
		x    float64
	}{{"N2", nitrogen}, {"O2", oxygen}, {"He", helium}} {
		if c.x == 0 {
			continue
		}
		sp, err := BuiltinSpecies(c.name)
		if err != nil {
			return nil, err
		}
		mix = append(mix, Component{Species: sp, Fraction: c.x})
	}
	return mix, nil
}

// Extra columns written after Columns by SolveTable's CSV.
var extraColumns = []string{"k_att3_m3_s", "growth_m3_s", "power_balance"}

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

// WriteResultsCSV writes a table of results with the Columns, the extra columns k_att3_m3_s
// (three-body part of k_att), growth_m3_s (ν̄/N) and power_balance, and then the rate
// coefficient of every process (per target molecule), headed "k_<species>_<n>_m3_s" with the
// process names in the comment lines.
func WriteResultsCSV(w io.Writer, comments []string, res []*Result) error {
	if len(res) == 0 {
		return ErrEmpty
	}
	names := append([]string(nil), extraColumns...)
	for i, q := range res[0].Rates {
		col := fmt.Sprintf("k_%s_%d_m3_s", q.Species, i+1)
		names = append(names, col)
		comments = append(comments, fmt.Sprintf("%s: %s (%s, threshold %.4g eV)", col, q.Name, q.Kind, q.Threshold/units.ElectronVolt))
	}
	rows := make([]Coefficients, len(res))
	extra := make([][]float64, len(res))
	for i, r := range res {
		rows[i] = r.Coefficients
		e := []float64{r.ThreeBodyAttachment, r.GrowthRate, r.PowerBalance()}
		for _, q := range r.Rates {
			e = append(e, q.K)
		}
		extra[i] = e
	}
	return writeCSV(w, comments, rows, names, extra)
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
		"n2pulse swarm table, two-term Boltzmann solution (Hagelaar & Pitchford 2005 formulation, temporal growth, equal energy sharing)",
		"mixture: " + Composition(mix),
		fmt.Sprintf("solver %s, %d energy cells, gas temperature %g K; cross sections from data/xsec-*.txt (sources there)", SolverVersion, set.Cells, set.GasTemperature),
		"k_ion and k_att per molecule of the whole gas; k_A, k_B, k_C per N2 molecule; k_att includes three-body attachment to O2 at 2.446e25 m^-3 (column k_att3_m3_s)",
	}
}

var (
	builtinMu     sync.Mutex
	builtinTables = map[string]*Table{}
)

// Builtin returns the shipped table of "n2" (pure N₂) or "air" (Air), parsed once and shared.
func Builtin(gas string) (*Table, error) {
	var file string
	switch gas {
	case "n2":
		file = "swarm-n2.csv"
	case "air":
		file = "swarm-air.csv"
	default:
		return nil, fmt.Errorf("swarm: gas %q: want n2 or air", gas)
	}
	builtinMu.Lock()
	defer builtinMu.Unlock()
	if t, ok := builtinTables[gas]; ok {
		return t, nil
	}
	b, err := fs.ReadFile(data.SwarmTables, file)
	if err != nil {
		return nil, fmt.Errorf("swarm: %w", err)
	}
	t, err := ReadCSV(bytes.NewReader(b), "data/"+file)
	if err != nil {
		return nil, err
	}
	builtinTables[gas] = t
	return t, nil
}

// ForMixture returns a table for the mole fractions of N₂, O₂ and He. Pure N₂ and Air (each
// fraction within 1e-3) return the shipped tables. Other mixtures are solved at TableFields and
// cached as CSV in cacheDir (os.UserCacheDir()/n2pulse when empty), keyed by the composition and
// SolverVersion; the cache file is written to a temporary file and renamed.
func ForMixture(nitrogen, oxygen, helium float64, cacheDir string) (*Table, error) {
	mix, err := Mixture(nitrogen, oxygen, helium)
	if err != nil {
		return nil, err
	}
	near := func(a, b float64) bool { return math.Abs(a-b) <= 1e-3 }
	if near(nitrogen, 1) && near(oxygen, 0) && near(helium, 0) {
		return Builtin("n2")
	}
	if near(nitrogen, AirNitrogen) && near(oxygen, AirOxygen) && near(helium, 0) {
		return Builtin("air")
	}
	if cacheDir == "" {
		d, err := os.UserCacheDir()
		if err != nil {
			return nil, fmt.Errorf("swarm: no cache directory: %w", err)
		}
		cacheDir = filepath.Join(d, "n2pulse")
	}
	key := fmt.Sprintf("%s N2=%.6f O2=%.6f He=%.6f", SolverVersion, nitrogen, oxygen, helium)
	sum := sha256.Sum256([]byte(key))
	path := filepath.Join(cacheDir, "swarm-"+hex.EncodeToString(sum[:8])+".csv")
	if b, err := os.ReadFile(path); err == nil {
		if t, err := ReadCSV(bytes.NewReader(b), path); err == nil {
			return t, nil
		}
		// a damaged cache file is recomputed and replaced
	}
	t, res, err := SolveTable(mix, nil, TableFields)
	if err != nil {
		return nil, err
	}
	var buf bytes.Buffer
	if err := WriteResultsCSV(&buf, append(TableComments(mix, nil), "cache key: "+key), res); err != nil {
		return nil, err
	}
	if err := os.MkdirAll(cacheDir, 0o755); err != nil {
		return nil, fmt.Errorf("swarm: cache: %w", err)
	}
	if err := atomicfile.WriteFile(path, buf.Bytes()); err != nil {
		return nil, fmt.Errorf("swarm: cache: %w", err)
	}
	return t, nil
}
