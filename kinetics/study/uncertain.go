package study

import (
	"fmt"
	"math/rand/v2"
	"strings"

	"n2pulse/kinetics/design"
)

// MaxSamples is the largest number of samples LatinHypercube and UncertainDesigns accept.
const MaxSamples = 100000

// LatinHypercube returns n points of the unit cube [0, 1)^k in Latin-hypercube order: along
// every coordinate the n strata [i/n, (i+1)/n) hold exactly one point each, placed uniformly
// inside its stratum, and the strata are paired across coordinates by independent random
// permutations (McKay, Beckman & Conover, Technometrics 21, 239 (1979), from memory). The points
// depend only on n, k and seed (a PCG stream), never on how many workers later use them.
func LatinHypercube(n, k int, seed uint64) ([][]float64, error) {
	if n < 1 || n > MaxSamples {
		return nil, fmt.Errorf("study: %d samples, want 1…%d", n, MaxSamples)
	}
	if k < 1 || k > 1000 {
		return nil, fmt.Errorf("study: %d dimensions, want 1…1000", k)
	}
	rng := rand.New(rand.NewPCG(seed, 0x6c6873)) // second word fixed: one stream per seed
	pts := make([][]float64, n)
	flat := make([]float64, n*k)
	for i := range pts {
		pts[i] = flat[i*k : (i+1)*k]
	}
	for j := 0; j < k; j++ {
		perm := rng.Perm(n)
		for i := range pts {
			pts[i][j] = (float64(perm[i]) + rng.Float64()) / float64(n)
		}
	}
	return pts, nil
}

// UncertainDesigns returns n copies of base in which every constant of design.Spreads that
// base uses and does not pin (HeldConstants) is drawn from its range and distribution by a
// Latin hypercube of the given seed,
// set through design.Design.Set as a user would set it. A constant base does not use (an O₂
// constant in a gas without O₂, a process switched off by a zero) is left alone: sampling it
// would switch a process on or add noise to the ranking. keys are the sampled keys (in
// design.Spreads order) and values[i][j] is the value of keys[j] in designs[i] [SI]. base is
// not changed.
func UncertainDesigns(base *design.Design, n int, seed uint64) (designs []*design.Design, keys []string, values [][]float64, err error) {
	p, err := newSamplePlan(base, nil, n, seed)
	if err != nil {
		return nil, nil, nil, err
	}
	designs = make([]*design.Design, n)
	values = make([][]float64, n)
	for i := range designs {
		if designs[i], values[i], err = p.design(i); err != nil {
			return nil, nil, nil, err
		}
	}
	return designs, p.keys, values, nil
}

// samplePlan is the sampling of one design: the uncertain constants it uses and the Latin
// hypercube that places them; sample i is made on demand, so a plan of many samples holds
// n × (constants) numbers, not n designs.
type samplePlan struct {
	base    *design.Design
	spreads []design.Spread
	keys    []string
	held    []string // HeldConstants(base)
	u       [][]float64
}

// HeldConstants returns the constants of design.Spreads that base uses but that an
// uncertainty study of base holds at base's values instead of sampling: the ones base pins
// (design.Design.Pinned: given with --set, or written in the design file at a value other
// than the default), in design.Spreads order. A sweep also holds its varied keys.
func HeldConstants(base *design.Design) []string {
	var held []string
	for _, k := range usedSpreadKeys(base) {
		if base.Pinned(k) {
			held = append(held, k)
		}
	}
	return held
}

// usedSpreadKeys returns the keys of design.Spreads that base uses (SensitivityKeys), in
// design.Spreads order.
func usedSpreadKeys(base *design.Design) []string {
	used := map[string]bool{}
	for _, k := range SensitivityKeys(base) {
		used[k] = true
	}
	var keys []string
	for _, s := range design.Spreads() {
		if used[s.Key] {
			keys = append(keys, s.Key)
		}
	}
	return keys
}

// newSamplePlan plans n samples of the constants of design.Spreads that base uses, leaving out
// the keys in hold (a sweep's varied keys, which keep their grid values) and the constants
// base pins (HeldConstants).
func newSamplePlan(base *design.Design, hold []string, n int, seed uint64) (*samplePlan, error) {
	used := map[string]bool{}
	for _, k := range usedSpreadKeys(base) {
		used[k] = true
	}
	held := HeldConstants(base)
	for _, k := range append(held, hold...) {
		used[k] = false
	}
	// The plan keeps its own copy, so that a caller may change the base (a sweep point's
	// design, say) while other workers make samples from the plan.
	p := &samplePlan{base: base.Clone(), held: held}
	for _, s := range design.Spreads() {
		if used[s.Key] {
			p.spreads = append(p.spreads, s)
			p.keys = append(p.keys, s.Key)
		}
	}
	if len(p.spreads) == 0 {
		if len(held) > 0 {
			return nil, fmt.Errorf("study: every uncertain constant the design uses is held at the value it was given (%s): nothing left to sample", strings.Join(held, ", "))
		}
		return nil, fmt.Errorf("study: the design uses none of the uncertain constants")
	}
	var err error
	if p.u, err = LatinHypercube(n, len(p.spreads), seed); err != nil {
		return nil, err
	}
	return p, nil
}

// design returns sample i: a copy of the base with every planned constant at its sampled
// value, and those values [SI] in key order.
func (p *samplePlan) design(i int) (*design.Design, []float64, error) {
	d := p.base.Clone()
	values := make([]float64, len(p.spreads))
	for j, s := range p.spreads {
		x, err := s.Quantile(p.u[i][j])
		if err != nil {
			return nil, nil, err
		}
		if err := d.Set(s.Key, siText(s.Key, x)); err != nil {
			return nil, nil, fmt.Errorf("study: sample %d: %w", i+1, err)
		}
		values[j] = x
	}
	return d, values, nil
}
