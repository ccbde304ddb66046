package kinetics

import (
	"math"

	"n2pulse/kinetics/design"
)

// manifold is the B³Πg(v>0)/W³Δu/B′³Σu⁻ manifold of N₂ as one reservoir R [m⁻³]. Electrons
// excite it far more than B(0) directly (X → B(v>0) takes 1 − f_B of the B excitation, and W
// and B′ come on top); collisions relax it. A share η of its relaxation by N₂ ends in B(0)
// (vibrational relaxation down the B ladder and W ⇄ B transfer), the rest (transfer to A³Σu⁺,
// and every removal by O₂ and radiation) leaves the laser levels:
//
//	dR/dt = P_R − Γ_R·R,  Γ_R = k_N₂·N_N₂ + k_O₂·N_O₂ + 1/τ_B,  feed of B(0) = η·k_N₂·N_N₂·R.
//
// Nothing in it feels the laser light, so it is integrated on the optical time grid with
// the discharge, exactly for a feed held constant over each step, and its feed of B(0) is
// added to the pump of B(0).
type manifold struct {
	decay, toB float64 // Γ_R and η·k_N₂·N_N₂ [s⁻¹]
	dt, e, w   float64 // step [s], e^(−Γ_R·Δt), (1 − e^(−Γ_R·Δt))/Γ_R [s]
	r          float64 // R [m⁻³]

	// Ledger [m⁻³]: fed = r + intoB + lost holds to rounding.
	fed, intoB, lost float64
}

func newManifold(l design.Levels, g design.Gas, n, dt float64) *manifold {
	decay := n*(g.Nitrogen*l.ManifoldRelaxationNitrogen+g.Oxygen*l.ManifoldRelaxationOxygen) + 1/l.LowerLifetime
	em1 := math.Expm1(-decay * dt)
	return &manifold{
		decay: decay, toB: l.ManifoldShare * n * g.Nitrogen * l.ManifoldRelaxationNitrogen,
		dt: dt, e: 1 + em1, w: -em1 / decay,
	}
}

// step advances R over one step with the feed p [m⁻³ s⁻¹] held constant and returns the
// mean rate at which R feeds B(0) over the step [m⁻³ s⁻¹].
func (m *manifold) step(p float64) float64 {
	eq := p / m.decay
	mean := eq + (m.r-eq)*m.w/m.dt // R averaged over the step, exactly
	m.r = m.r*m.e + p*m.w
	m.fed += p * m.dt
	m.intoB += m.toB * mean * m.dt
	m.lost += (m.decay - m.toB) * mean * m.dt
	return m.toB * mean
}
