package swarm

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"

	"n2pulse/units"
)

// Kind is the kind of an electron–molecule collision process.
type Kind int

const (
	// Elastic is elastic momentum transfer (energy loss 2m/M per collision on average).
	Elastic Kind = iota
	// Excitation loses the threshold energy; the electron is kept.
	Excitation
	// Ionisation loses the threshold energy and adds one electron.
	Ionisation
	// Attachment removes the electron.
	Attachment
)

var kindNames = map[string]Kind{"elastic": Elastic, "excitation": Excitation, "ionisation": Ionisation, "attachment": Attachment}

// String returns the kind as written in cross-section files.
func (k Kind) String() string {
	for n, v := range kindNames {
		if v == k {
			return n
		}
	}
	return fmt.Sprintf("Kind(%d)", int(k))
}

// Process is one electron-impact process of a species with its cross section, tabulated at
// ascending energies and interpolated linearly; zero below the first point of an inelastic
// process and the last value beyond the last point.
type Process struct {
	Kind      Kind
	Name      string    // free text
	Label     string    // short key for outputs ("A", "B", "C", "ion", "att", ...), may be empty
	Threshold float64   // energy loss [J] (0 for elastic)
	Source    string    // where the numbers come from
	Energy    []float64 // [J], strictly ascending
	Sigma     []float64 // cross section [m²]
}

// Species is a target gas with its cross-section set.
type Species struct {
	Name      string
	File      string  // the shipped file it was read from ("data/xsec-n2.txt"), or empty
	Mass      float64 // molecular mass [kg]
	Processes []Process
}

// ParseCrossSections reads a cross-section set in n2pulse's own text format (see
// data/xsec-n2.txt for the documented layout). Errors read "name:line: field: problem".
func ParseCrossSections(r io.Reader, name string) (*Species, error) {
	sc := bufio.NewScanner(r)
	p := &xsecParser{name: name, sp: &Species{}}
	for sc.Scan() {
		p.line++
		text := sc.Text()
		if i := strings.IndexByte(text, '#'); i >= 0 {
			text = text[:i]
		}
		text = strings.TrimSpace(text)
		if text == "" {
			continue
		}
		if err := p.parseLine(text); err != nil {
			return nil, err
		}
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("swarm: %s: %w", name, err)
	}
	if p.cur != nil {
		return nil, fmt.Errorf("swarm: %s:%d: process: not closed by 'end'", name, p.line)
	}
	if err := checkSpecies(p.sp, name); err != nil {
		return nil, err
	}
	return p.sp, nil
}

// xsecParser holds the state of ParseCrossSections between lines: the species read so far,
// the open process (nil between processes) and whether its data block is open.
type xsecParser struct {
	name       string
	line       int
	sp         *Species
	cur        *Process
	inData     bool
	haveFormat bool
}

// fail returns an error "swarm: name:line: field: problem" at the current line.
func (p *xsecParser) fail(field, format string, a ...any) error {
	return fmt.Errorf("swarm: %s:%d: %s: %s", p.name, p.line, field, fmt.Sprintf(format, a...))
}

// parseLine handles one non-empty line with its comment removed, by where it stands: in a data
// block, between processes, or in a process header.
func (p *xsecParser) parseLine(text string) error {
	key, val, _ := strings.Cut(text, " ")
	val = strings.TrimSpace(val)
	switch {
	case p.inData && key == "end":
		if err := finishProcess(p.cur, p.name, p.line); err != nil {
			return err
		}
		p.sp.Processes = append(p.sp.Processes, *p.cur)
		p.cur, p.inData = nil, false
		return nil
	case p.inData:
		return p.dataPoint(text)
	case p.cur == nil:
		return p.speciesKey(key, val)
	default:
		return p.processKey(key, val)
	}
}

// dataPoint reads one "energy_eV cross_section_m2" line of a data block into the open process.
func (p *xsecParser) dataPoint(text string) error {
	f := strings.Fields(text)
	if len(f) != 2 {
		return p.fail("data", "want 2 numbers 'energy_eV cross_section_m2', got %d fields", len(f))
	}
	e, err1 := strconv.ParseFloat(f[0], 64)
	s, err2 := strconv.ParseFloat(f[1], 64)
	if err1 != nil || math.IsNaN(e) || math.IsInf(e, 0) || e < 0 {
		return p.fail("energy", "%q is not an energy ≥ 0 eV", f[0])
	}
	if err2 != nil || math.IsNaN(s) || math.IsInf(s, 0) || s < 0 || s > 1e-17 {
		return p.fail("cross section", "%q is not a cross section in [0, 1e-17] m²", f[1])
	}
	cur := p.cur
	if n := len(cur.Energy); n > 0 && e*units.ElectronVolt <= cur.Energy[n-1] {
		return p.fail("energy", "%g eV is not above the previous point", e)
	}
	cur.Energy = append(cur.Energy, e*units.ElectronVolt)
	cur.Sigma = append(cur.Sigma, s)
	return nil
}

// speciesKey reads a key of the file header (between processes); "process" opens a process.
func (p *xsecParser) speciesKey(key, val string) error {
	switch key {
	case "format":
		if val != "n2pulse-xsec 1" {
			return p.fail("format", "%q, want \"n2pulse-xsec 1\"", val)
		}
		p.haveFormat = true
	case "species":
		if val == "" {
			return p.fail("species", "empty")
		}
		p.sp.Name = val
	case "mass_amu":
		m, err := strconv.ParseFloat(val, 64)
		if err != nil || !(m >= 1 && m <= 1000) {
			return p.fail("mass_amu", "%q is not a mass in [1, 1000] u", val)
		}
		p.sp.Mass = m * units.AtomicMass
	case "process":
		if !p.haveFormat {
			return p.fail("format", "missing before the first process")
		}
		p.cur = &Process{Threshold: -1}
	default:
		return p.fail(key, "unknown key (want format, species, mass_amu or process)")
	}
	return nil
}

// processKey reads a key of an open process's header; "data" opens its data block.
func (p *xsecParser) processKey(key, val string) error {
	cur := p.cur
	switch key {
	case "kind":
		k, ok := kindNames[val]
		if !ok {
			return p.fail("kind", "%q, want elastic, excitation, ionisation or attachment", val)
		}
		cur.Kind = k
	case "name":
		cur.Name = val
	case "label":
		cur.Label = val
	case "source":
		cur.Source = val
	case "threshold_eV":
		u, err := strconv.ParseFloat(val, 64)
		if err != nil || !(u >= 0 && u <= 1000) {
			return p.fail("threshold_eV", "%q is not an energy in [0, 1000] eV", val)
		}
		cur.Threshold = u * units.ElectronVolt
	case "data":
		p.inData = true
	default:
		return p.fail(key, "unknown key in a process (want kind, name, label, threshold_eV, source, data)")
	}
	return nil
}

// checkSpecies checks a whole parsed set: a name, a mass and exactly one elastic process.
func checkSpecies(sp *Species, name string) error {
	if sp.Name == "" {
		return fmt.Errorf("swarm: %s: species: missing", name)
	}
	if sp.Mass == 0 {
		return fmt.Errorf("swarm: %s: mass_amu: missing", name)
	}
	nel := 0
	for _, p := range sp.Processes {
		if p.Kind == Elastic {
			nel++
		}
	}
	if nel != 1 {
		return fmt.Errorf("swarm: %s: elastic: %d elastic processes, need exactly 1", name, nel)
	}
	return nil
}

// finishProcess checks a process closed by "end": name, source and threshold present and
// consistent with its kind, at least two data points.
func finishProcess(p *Process, name string, line int) error {
	fail := func(field, problem string) error {
		return fmt.Errorf("swarm: %s:%d: %s: %s (process %q)", name, line, field, problem, p.Name)
	}
	switch {
	case p.Name == "":
		return fail("name", "missing")
	case p.Source == "":
		return fail("source", "missing")
	case p.Threshold < 0:
		return fail("threshold_eV", "missing")
	case len(p.Energy) < 2:
		return fail("data", "need at least 2 points")
	case p.Kind == Elastic && p.Threshold != 0:
		return fail("threshold_eV", "must be 0 for an elastic process")
	case p.Kind != Elastic && p.Kind != Attachment && p.Threshold == 0:
		return fail("threshold_eV", "must be positive for an excitation or ionisation")
	}
	return nil
}

// At returns the cross section at energy e [J] [m²].
func (p *Process) At(e float64) float64 {
	return interpSigma(p.Energy, p.Sigma, e, p.Kind != Elastic)
}

// interpSigma interpolates linearly in (E, σ); below the first point it is zero when zeroBelow,
// else the first value; beyond the last point it holds the last value.
func interpSigma(E, S []float64, e float64, zeroBelow bool) float64 {
	n := len(E)
	if e < E[0] {
		if zeroBelow {
			return 0
		}
		return S[0]
	}
	if e >= E[n-1] {
		return S[n-1]
	}
	i := sort.SearchFloat64s(E, e)
	if E[i] == e {
		return S[i]
	}
	i--
	t := (e - E[i]) / (E[i+1] - E[i])
	return S[i] + t*(S[i+1]-S[i])
}
