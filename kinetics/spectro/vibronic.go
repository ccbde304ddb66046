package spectro

import (
	"fmt"
	"math"

	"n2pulse/units"
)

// BohrRadius is a₀ [m] (CODATA 2018, from memory).
const BohrRadius = 5.29177210903e-11

// DefaultGrid is the radial grid of the Franck–Condon calculation: 0.75–2.6 Å holds the
// classically allowed regions of the first 30 levels of X, B and C with margin, and 240 points
// put the sinc-DVR levels within 1e−4 cm⁻¹ of their converged values (TestGridConvergence).
var DefaultGrid = Grid{RMin: 0.75, RMax: 2.6, N: 240}

// levelsPerState is how many vibrational levels of each state are kept.
const levelsPerState = 30

// rkrVmax is the highest level of each state's RKR curve. The C constants were fitted to
// v ≤ 4 (Laher & Gilmore 1991); the curve is carried two levels further (G still rises to
// v ≈ 9) so that v = 4 lies inside it; beyond, the Morse curve takes over.
var rkrVmax = map[string]int{"X": 15, "B": 12, "C": 6}

// Curve selects the potential energy curves of the Franck–Condon calculation.
type Curve int

const (
	// RKRCurve is the first-order RKR curve from G(v) and B_v (default).
	RKRCurve Curve = iota
	// MorseCurve is the Morse curve from ωe, ωexe and re.
	MorseCurve
)

// Model holds the vibrational wave functions of X, B and C on one grid and the quantities
// derived from them: Franck–Condon factors, r-centroids, Einstein coefficients, lifetimes.
type Model struct {
	Constants *Constants
	Grid      Grid
	Curve     Curve
	levels    map[string]*Levels
}

// NewModel solves the radial equation for the potential curves (RKR or Morse) of the states
// X, B and C of c on grid g.
func NewModel(c *Constants, g Grid, curve Curve) (*Model, error) {
	m := &Model{Constants: c, Grid: g, Curve: curve, levels: map[string]*Levels{}}
	mu := c.ReducedMass()
	for _, name := range []string{"X", "B", "C"} {
		V := Morse(c.States[name], mu)
		if curve == RKRCurve {
			var err error
			if V, err = RKR(c.States[name], mu, rkrVmax[name]); err != nil {
				return nil, err
			}
		}
		lv, err := SolveRadial(V, mu, g, SincDVR, levelsPerState)
		if err != nil {
			return nil, fmt.Errorf("spectro: state %s: %w", name, err)
		}
		m.levels[name] = lv
	}
	return m, nil
}

// Levels returns the grid levels of state name ("X", "B" or "C"), or nil.
func (m *Model) Levels(name string) *Levels { return m.levels[name] }

func (m *Model) pair(upper string, vu int, lower string, vl int) ([]float64, []float64, error) {
	a, b := m.levels[upper], m.levels[lower]
	if a == nil || b == nil {
		return nil, nil, fmt.Errorf("spectro: unknown state in %s–%s, want X, B or C", upper, lower)
	}
	if vu < 0 || vu >= len(a.Psi) || vl < 0 || vl >= len(b.Psi) {
		return nil, nil, fmt.Errorf("spectro: levels v′=%d, v″=%d outside 0…%d", vu, vl, levelsPerState-1)
	}
	return a.Psi[vu], b.Psi[vl], nil
}

// FranckCondon returns the Franck–Condon factor q = |⟨v′|v″⟩|² and the r-centroid
// r̄ = ⟨v′|r|v″⟩/⟨v′|v″⟩ [Å] of the vibrational levels vu of state upper and vl of state lower.
func (m *Model) FranckCondon(upper string, vu int, lower string, vl int) (q, rCentroid float64, err error) {
	a, b, err := m.pair(upper, vu, lower, vl)
	if err != nil {
		return 0, 0, err
	}
	s, sr := Overlap(a, b, m.levels[upper].R)
	return s * s, sr / s, nil
}

// EinsteinA returns the spontaneous emission rate of the C(v′) → B(v″) band [s⁻¹],
// A = 16π³ν̃³|Re|²q/(3ε₀h), with ν̃ the band origin [m⁻¹], q the Franck–Condon factor and |Re|
// the constant electronic transition moment (for Π–Π the degeneracy factor
// (2−δ₀,Λ′+Λ″)/(2−δ₀,Λ′) is 1).
func (m *Model) EinsteinA(vu, vl int) (float64, error) {
	q, _, err := m.FranckCondon("C", vu, "B", vl)
	if err != nil {
		return 0, err
	}
	nu := 100 * BandOrigin(m.Constants.States["C"], vu, m.Constants.States["B"], vl)
	if nu <= 0 {
		return 0, nil
	}
	mom := m.Constants.MomentCB * units.ElementaryCharge * BohrRadius
	return 16 * math.Pi * math.Pi * math.Pi * nu * nu * nu * mom * mom * q /
		(3 * units.VacuumPermittivity * units.Planck), nil
}

// TotalA returns Σ_v″ A(v′,v″) over the B levels kept [s⁻¹].
func (m *Model) TotalA(vu int) (float64, error) {
	sum := 0.0
	for vl := 0; vl < levelsPerState; vl++ {
		a, err := m.EinsteinA(vu, vl)
		if err != nil {
			return 0, err
		}
		sum += a
	}
	return sum, nil
}

// Lifetime returns the radiative lifetime 1/Σ_v″A(v′,v″) of C(v′) [s].
func (m *Model) Lifetime(vu int) (float64, error) {
	a, err := m.TotalA(vu)
	if err != nil {
		return 0, err
	}
	return 1 / a, nil
}

// ExcitationShare returns the Franck–Condon share q(X v=0 → state v) of electron-impact
// excitation from the ground level that lands in level v of state ("B" or "C").
func (m *Model) ExcitationShare(state string, v int) (float64, error) {
	q, _, err := m.FranckCondon(state, v, "X", 0)
	return q, err
}
