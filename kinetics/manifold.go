package kinetics

import (
	"math"

	"n2pulse/kinetics/design"
)

// A reservoir is a population that electrons pump and collisions empty, of which a part
// feeds a laser level, and that does not feel the laser light: the B³Πg(v>0)/W³Δu/B′³Σu⁻
// manifold feeding B(0), and C(v=1) feeding C(0).
//
// The manifold of N₂ as one reservoir R [m⁻³]. Electrons
// excite it far more than B(0) directly (X → B(v>0) takes 1 − f_B of the B excitation, and W
// and B′ come on top), and C(0) and C(v=1) feed it as they decay into the B state (see
// upperShadow); collisions relax it. A share η of its relaxation by N₂ ends in B(0)
// (vibrational relaxation down the B ladder and W ⇄ B transfer), the rest (transfer to A³Σu⁺,
// and every removal by O₂ and radiation) leaves the laser levels:
//
//	dR/dt = P_R − Γ_R·R,  Γ_R = k_N₂·N_N₂ + k_O₂·N_O₂ + 1/τ_B,  feed of B(0) = η·k_N₂·N_N₂·R.
//
// Nothing in it feels the laser light, so it is integrated on the optical time grid with
// the discharge, exactly for a feed held constant over each step, and its feed of B(0) is
// added to the pump of B(0).
type reservoir struct {
	decay, into float64 // total loss Γ and the part of it that feeds the laser level [s⁻¹]
	dt, e, w    float64 // step [s], e^(−Γ·Δt), (1 − e^(−Γ·Δt))/Γ [s]
	r           float64 // population [m⁻³]

	// Ledger [m⁻³]: fed = r + given + lost holds to rounding.
	fed, given, lost float64
}

// newReservoir returns an empty reservoir of total loss rate decay [s⁻¹] of which into
// [s⁻¹] feeds the laser level, stepped by dt [s].
func newReservoir(decay, into, dt float64) *reservoir {
	em1 := math.Expm1(-decay * dt)
	return &reservoir{decay: decay, into: into, dt: dt, e: 1 + em1, w: -em1 / decay}
}

// newManifold is the B(v>0)/W/B′ reservoir of the design's levels and gas of density n [m⁻³].
func newManifold(l design.Levels, g design.Gas, n, dt float64) *reservoir {
	decay := n*(g.Nitrogen*l.ManifoldRelaxationNitrogen+g.Oxygen*l.ManifoldRelaxationOxygen) + 1/l.LowerLifetime
	return newReservoir(decay, l.ManifoldShare*n*g.Nitrogen*l.ManifoldRelaxationNitrogen, dt)
}

// newUpperV1 is the C(v=1) reservoir: pumped by electrons with its Franck–Condon share,
// emptied by radiation (taken at the C(0) lifetime tauC [s]), vibrational relaxation into C(0)
// by N₂ (which feeds C(0)), electronic quenching by N₂, O₂ (taken at C(0)'s constant) and He.
func newUpperV1(l design.Levels, g design.Gas, n, tauC, dt float64) *reservoir {
	relax := n * g.Nitrogen * l.UpperRelaxationNitrogen
	decay := 1/tauC + relax + n*(g.Nitrogen*l.UpperV1QuenchingNitrogen+g.Oxygen*l.UpperQuenchingOxygen+g.Helium*l.UpperQuenchingHelium)
	return newReservoir(decay, relax, dt)
}

// step advances the population over one step with the feed p [m⁻³ s⁻¹] held constant and
// returns the mean rate at which it feeds the laser level over the step [m⁻³ s⁻¹].
func (m *reservoir) step(p float64) float64 {
	eq := p / m.decay
	mean := eq + (m.r-eq)*m.w/m.dt // the population averaged over the step, exactly
	m.r = m.r*m.e + p*m.w
	m.fed += p * m.dt
	m.given += m.into * mean * m.dt
	m.lost += (m.decay - m.into) * mean * m.dt
	return m.into * mean
}

// upperShadow is the population of C(0) [m⁻³] that the pump and the collisional and radiative
// losses alone would leave, without stimulated emission: what a cell of a simultaneous
// discharge holds until the light comes. Its flow into the B state feeds the manifold:
// N₂(C) + N₂ → N₂(B) + N₂ (J. Appl. Phys. 125, 243301 (2019), Table I, R26), the spontaneous
// C(0) → B(v>0) bands, and the electrons' superelastic C(0) → B(v>0) part. Taking it without
// the light overstates that flow once the pulse extracts C(0); the molecules the light takes
// go into B(0) directly and outnumber it there.
type upperShadow struct {
	dt, c float64 // step [s], population [m⁻³]
}

// step advances the population over one step with pump p [m⁻³ s⁻¹] and total loss rate
// gamma [s⁻¹] held constant, and returns its mean over the step [m⁻³].
func (u *upperShadow) step(p, gamma float64) float64 {
	em1 := math.Expm1(-gamma * u.dt)
	w := -em1 / gamma
	eq := p / gamma
	mean := eq + (u.c-eq)*w/u.dt
	u.c = u.c*(1+em1) + p*w
	return mean
}
