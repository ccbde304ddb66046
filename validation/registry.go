package validation

import (
	"fmt"
	"math"
	"sort"
	"sync"

	"n2pulse/internal/pool"
)

// Kind says what a reference value rests on.
type Kind int

const (
	// Published: a paper, handbook table, standard or reference library, named in Source.
	Published Kind = iota
	// Analytic: an exact or textbook result that the numerics must reproduce.
	Analytic
	// CommonPractice: a fact of the trade with no source.
	CommonPractice
	// FromMemory: a value recalled, not read in a source; to be confirmed.
	FromMemory
	// Experiment: a measured laser from a publication; a miss is reported as a discrepancy
	// and fails only `check --strict`.
	Experiment
)

// String returns the kind as printed in the check table.
func (k Kind) String() string {
	switch k {
	case Published:
		return "published"
	case Analytic:
		return "analytic"
	case CommonPractice:
		return "common practice, no source"
	case FromMemory:
		return "from memory"
	case Experiment:
		return "experiment"
	}
	return fmt.Sprintf("Kind(%d)", int(k))
}

// Mode says how a computed value is compared with its reference.
type Mode int

const (
	// Relative passes when |computed − reference| ≤ Tolerance·|reference|.
	Relative Mode = iota
	// Absolute passes when |computed − reference| ≤ Tolerance.
	Absolute
	// Factor passes when computed/reference lies within [1/Tolerance, Tolerance].
	Factor
	// Range passes when Low ≤ computed ≤ High (Reference is then informational).
	Range
	// True passes when Computed is non-zero: a trend or property that holds or does not.
	True
)

// Check is one comparison of the model with an outside value.
type Check struct {
	ID        string  // short stable identifier, "swarm.drift.n2.100Td"
	Quantity  string  // what is compared, in words
	Unit      string  // unit of Computed and Reference as printed
	Computed  float64 // the model's value
	Reference float64 // the outside value
	Tolerance float64 // meaning depends on Mode
	Low, High float64 // bounds for Mode Range
	Mode      Mode
	Kind      Kind
	Source    string // citation, "common practice, no source" or "from memory"
	Err       error  // set when the model failed to compute the value
	// Known, when not empty, states a known limitation of the model that makes it miss this
	// reference; a miss is then reported as a discrepancy (as for an experiment) and fails
	// only `check --strict`. The tolerance stays the one the reference deserves.
	Known string
}

// Tolerated reports whether a miss of this check is a discrepancy rather than a failure: an
// experiment case, or a check with a stated known limitation.
func (c Check) Tolerated() bool { return c.Kind == Experiment || c.Known != "" }

// Deviation is the relative deviation (computed − reference)/|reference| for Relative, Factor
// and Range checks, and the absolute deviation for Absolute checks.
func (c Check) Deviation() float64 {
	if c.Mode == Absolute {
		return c.Computed - c.Reference
	}
	if c.Reference == 0 {
		return math.NaN()
	}
	return (c.Computed - c.Reference) / math.Abs(c.Reference)
}

// Pass reports whether the computed value agrees with the reference within the tolerance.
func (c Check) Pass() bool {
	if c.Err != nil || math.IsNaN(c.Computed) {
		return false
	}
	switch c.Mode {
	case Relative:
		return math.Abs(c.Computed-c.Reference) <= c.Tolerance*math.Abs(c.Reference)
	case Absolute:
		return math.Abs(c.Computed-c.Reference) <= c.Tolerance
	case Factor:
		if c.Reference == 0 || c.Computed/c.Reference <= 0 {
			return false
		}
		r := c.Computed / c.Reference
		return r <= c.Tolerance && r >= 1/c.Tolerance
	case Range:
		return c.Computed >= c.Low && c.Computed <= c.High
	case True:
		return c.Computed != 0
	}
	return false
}

// ToleranceText describes the tolerance in words for the check table.
func (c Check) ToleranceText() string {
	switch c.Mode {
	case Relative:
		return fmt.Sprintf("±%.3g%%", 100*c.Tolerance)
	case Absolute:
		return fmt.Sprintf("±%.3g %s", c.Tolerance, c.Unit)
	case Factor:
		return fmt.Sprintf("×/÷ %.3g", c.Tolerance)
	case Range:
		return fmt.Sprintf("[%.3g, %.3g]", c.Low, c.High)
	case True:
		return "holds"
	}
	return "?"
}

// A Group computes the checks of one topic. It returns an error only when the whole group
// could not run; a single failed value goes into that Check's Err.
type Group struct {
	Name string
	Run  func() ([]Check, error)
}

var (
	mu     sync.Mutex
	groups []Group
)

// Register adds a group of checks to the registry. It is called from init functions.
func Register(name string, run func() ([]Check, error)) {
	mu.Lock()
	defer mu.Unlock()
	groups = append(groups, Group{Name: name, Run: run})
}

// Groups returns the registered groups sorted by name.
func Groups() []Group {
	mu.Lock()
	defer mu.Unlock()
	g := append([]Group(nil), groups...)
	sort.Slice(g, func(i, j int) bool { return g[i].Name < g[j].Name })
	return g
}

// RunAll runs every registered group, in parallel, and returns their checks in group order.
// A group that fails as a whole contributes one failed check carrying its error.
func RunAll() []Check {
	gs := Groups()
	out := make([][]Check, len(gs))
	pool.Each(len(gs), len(gs), func(i int) {
		g := gs[i]
		cs, err := g.Run()
		if err != nil {
			cs = append(cs, Check{ID: g.Name, Quantity: "group " + g.Name, Err: err, Kind: Analytic})
		}
		out[i] = cs
	})
	var all []Check
	for _, cs := range out {
		all = append(all, cs...)
	}
	return all
}
