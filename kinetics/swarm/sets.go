package swarm

import (
	"bytes"
	"fmt"
	"io/fs"
	"strings"
	"sync"

	"n2pulse/data"
)

// Names of the shipped cross-section sets. A set names the N₂ and O₂ files (setFiles,
// setO2Files); He is the same in every set.
const (
	// SetOriginal is data/xsec-n2.txt, the set the project shipped first (its processes from an
	// auroral electron-transport code's files, each with its source there).
	SetOriginal = "original"
	// SetPhelps1985 is data/xsec-n2-phelps.txt: the swarm-derived set of A.V. Phelps &
	// L.C. Pitchford, Phys. Rev. A 31, 2932 (1985), as distributed; O₂ from
	// data/xsec-o2-phelps.txt, the swarm-derived set of S.A. Lawton & A.V. Phelps, J. Chem.
	// Phys. 69, 1055 (1978), as distributed.
	SetPhelps1985 = "phelps1985"
	// SetItikawa2006 is data/xsec-n2-itikawa.txt: SetPhelps1985 with B³Πg and C³Πu from
	// Y. Itikawa, J. Phys. Chem. Ref. Data 35, 31 (2006), Tables 8 and 10; O₂ as in
	// SetPhelps1985.
	SetItikawa2006 = "itikawa2006"
)

// DefaultSet is the set taken when none is named ("" or "default"). Every set's tables are
// shipped, so switching the default is this one line (then regenerate the golden files).
const DefaultSet = SetItikawa2006

// setFiles gives each set's N₂ file under data/.
var setFiles = map[string]string{
	SetOriginal:    "xsec-n2.txt",
	SetPhelps1985:  "xsec-n2-phelps.txt",
	SetItikawa2006: "xsec-n2-itikawa.txt",
}

// setO2Files gives each set's O₂ file under data/: the original set keeps the O₂ data it
// shipped with (data/xsec-o2.txt), the swarm-checked N₂ sets take the swarm-checked O₂ set of
// the same compilation (data/xsec-o2-phelps.txt, made by scripts/xsec/o2_sets.py).
var setO2Files = map[string]string{
	SetOriginal:    "xsec-o2.txt",
	SetPhelps1985:  "xsec-o2-phelps.txt",
	SetItikawa2006: "xsec-o2-phelps.txt",
}

// Sets returns the names of the shipped cross-section sets, the default first.
func Sets() []string {
	out := []string{DefaultSet}
	for _, s := range []string{SetOriginal, SetPhelps1985, SetItikawa2006} {
		if s != DefaultSet {
			out = append(out, s)
		}
	}
	return out
}

// ResolveSet returns the set a name stands for: "" and "default" give DefaultSet, a set's own
// name gives itself (any case); anything else is an error that lists the names.
func ResolveSet(name string) (string, error) {
	n := strings.ToLower(strings.TrimSpace(name))
	if n == "" || n == "default" {
		return DefaultSet, nil
	}
	if _, ok := setFiles[n]; ok {
		return n, nil
	}
	return "", fmt.Errorf("swarm: cross-section set %q: want default, %s", name, strings.Join(Sets(), ", "))
}

// speciesFiles caches parsed cross-section files by file name.
var speciesFiles sync.Map // file → *speciesEntry

type speciesEntry struct {
	once sync.Once
	sp   *Species
	err  error
}

// loadSpecies parses a shipped cross-section file once and shares it.
func loadSpecies(file string) (*Species, error) {
	e, _ := speciesFiles.LoadOrStore(file, &speciesEntry{})
	ent := e.(*speciesEntry)
	ent.once.Do(func() {
		b, err := fs.ReadFile(data.CrossSections, file)
		if err != nil {
			ent.err = fmt.Errorf("swarm: %w", err)
			return
		}
		ent.sp, ent.err = ParseCrossSections(bytes.NewReader(b), "data/"+file)
		if ent.sp != nil {
			ent.sp.File = "data/" + file
		}
	})
	return ent.sp, ent.err
}

// speciesFile is the data file of a species in a set.
func speciesFile(set, name string) (string, error) {
	set, err := ResolveSet(set)
	if err != nil {
		return "", err
	}
	switch name {
	case "N2":
		return setFiles[set], nil
	case "O2":
		return setO2Files[set], nil
	case "He":
		return "xsec-he.txt", nil
	}
	return "", fmt.Errorf("swarm: species %q: no built-in cross sections (have N2, O2, He)", name)
}

// SetSpecies returns the shipped cross sections of "N2", "O2" or "He" in the named set (parsed
// once; the caller must not modify it).
func SetSpecies(set, name string) (*Species, error) {
	f, err := speciesFile(set, name)
	if err != nil {
		return nil, err
	}
	sp, err := loadSpecies(f)
	if err != nil {
		return nil, err
	}
	if sp.Name != name {
		return nil, fmt.Errorf("swarm: data/%s: species %q, want %q", f, sp.Name, name)
	}
	return sp, nil
}

// BuiltinSpecies returns the shipped cross sections of "N2", "O2" or "He" in DefaultSet.
func BuiltinSpecies(name string) (*Species, error) { return SetSpecies(DefaultSet, name) }
