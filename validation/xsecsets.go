package validation

import (
	"fmt"
	"math"

	"n2pulse/kinetics/swarm"
	"n2pulse/units"
)

func init() {
	Register("swarm-sets", crossSectionSetChecks)
}

// crossSectionSetChecks run the N₂ swarm checks of the default set (swarmChecks) on the other
// shipped cross-section sets: α/N against the Townsend form A·exp(−B·p/E) and the measured
// characteristic energy. No table of measured N₂ drift velocities could be read (looked for
// again: Dutton 1975 and compilations reproducing it); the drift velocity is compared across
// sets in the note of issue 14 only.
func crossSectionSetChecks() ([]Check, error) {
	var cs []Check
	kT0 := units.Boltzmann * 273.15 // s.t.p. [J], as in swarmChecks
	for _, set := range swarm.Sets() {
		if set == swarm.DefaultSet {
			continue // checked in swarmChecks
		}
		mix, err := swarm.SetMixture(set, 1, 0, 0)
		if err != nil {
			return nil, err
		}
		s, err := swarm.NewSolver(mix, nil)
		if err != nil {
			return nil, err
		}
		for _, x := range []float64{300, 500, 1000} {
			r, err := s.Solve(x * units.Townsend)
			ep := x / 3.036                                      // E/p [V cm⁻¹ Torr⁻¹] at 293.15 K
			ref := 12.0 * math.Exp(-342.6/ep) * 100 / 3.29402e22 // α/N [m²], as in swarmChecks
			c := Check{ID: fmt.Sprintf("swarm.%s.alpha.n2.%gTd", set, x), Quantity: fmt.Sprintf("α/N in N₂ at %g Td, cross-section set %s", x, set),
				Unit: "m²", Reference: ref, Tolerance: 0.30, Mode: Relative, Kind: Published, Source: srcNasser, Err: err}
			if err == nil {
				c.Computed = r.AlphaN
			}
			cs = append(cs, c)
		}
		for _, m := range []struct{ ep, eta float64 }{{2, 34}, {10, 52}, {20, 68}, {40, 114}} {
			en := m.ep * kT0
			r, err := s.Solve(en)
			c := Check{ID: fmt.Sprintf("swarm.%s.charenergy.n2.Ep%g", set, m.ep),
				Quantity: fmt.Sprintf("characteristic energy D_T/μ in N₂ at E/p = %g V m⁻¹ Pa⁻¹ (%.3g Td), cross-section set %s", m.ep, en/units.Townsend, set),
				Unit:     "eV", Reference: m.eta * kT0 / units.ElementaryCharge, Tolerance: 0.20, Mode: Relative, Kind: Published, Source: srcKayeLabyEta, Err: err}
			if err == nil {
				c.Computed = r.Characteristic / units.ElectronVolt
			}
			if set == swarm.SetPhelps1985 && m.ep == 40 {
				c.Known = "known: with the Phelps 1985 set as distributed, this solver's D_T/μ is 20 % above Kaye & Laby's highest point (151 Td); the original set gives +13 %, the Itikawa B/C set +18 %; not tuned"
			}
			cs = append(cs, c)
		}
	}
	return cs, nil
}
