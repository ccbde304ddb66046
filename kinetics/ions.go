package kinetics

import (
	"math"

	"n2pulse/kinetics/design"
)

// Rate constants of the positive-ion chemistry that decides which ion the electrons recombine
// with (SI; the sources give cm³/s and cm⁶/s at 300 K).
const (
	// N₂⁺ + N₂ + M → N₄⁺ + M, M = N₂ or O₂: 5e-29 cm⁶/s (Aleksandrov & Bazelyan, Plasma
	// Sources Sci. Technol. 8, 285 (1999), as quoted in public air-plasma mechanism files,
	// seen, secondary; the same value in Kossyi et al. 1992, from memory). Helium is not
	// counted as a third body (no value found), which understates N₄⁺ in helium mixtures.
	ionConversionN2 = 5e-29 * 1e-12
	// N₂⁺ + O₂ → O₂⁺ + N₂: 6e-11 cm³/s (Kossyi, Kostinsky, Matveyev & Silakov, Plasma Sources
	// Sci. Technol. 1, 207 (1992), as quoted in public air-plasma mechanism files, seen,
	// secondary).
	ionTransferN2pO2 = 6e-11 * 1e-6
	// N₄⁺ + O₂ → O₂⁺ + 2N₂: 2.5e-10 cm³/s (Kossyi et al. 1992 and Aleksandrov & Bazelyan
	// 1999, as quoted in the same files, seen, secondary).
	ionTransferN4pO2 = 2.5e-10 * 1e-6
)

// ionShares follows the shares of the positive ions that are N₂⁺ and N₄⁺ through the shot;
// the rest are O₂⁺ (and O₄⁺), whose recombination leaves no excited N₂. Assumptions, stated:
//   - quasi-neutral, the positive ions number n_e (true in N₂; in air the negative ions that
//     attachment makes are not counted, which understates the ions);
//   - every ion is born N₂⁺ at the ionisation frequency ν_i = k_ion·N (direct ionisation of O₂
//     in air is counted as N₂⁺, which passes to O₂⁺ within a nanosecond at 1 atm anyway);
//   - every ion recombines at the same coefficient β (the circuit's one coefficient), so
//     recombination does not change the shares: with n_j = x_j·n_e, dn_e/dt = ν_i·n_e − β·n_e²
//     and dn_j/dt = (births_j − losses_j)·n_e − β·n_e·n_j give
//     dx₂/dt = ν_i·(1 − x₂) − (ν₃ + ν₂O)·x₂,  dx₄/dt = ν₃·x₂ − (ν_i + ν₄O)·x₄,
//     with ν₃ = k₃·N_N₂·(N_N₂ + N_O₂), ν₂O = k(N₂⁺ + O₂)·N_O₂, ν₄O = k(N₄⁺ + O₂)·N_O₂;
//   - the break-up N₄⁺ + N₂ → N₂⁺ + 2N₂ is left out: 2.1e-16·exp(T/121 K) cm³/s in Kossyi et
//     al. 1992 (from memory), with T the ions' temperature; at the 150–200 Td of a lasing
//     discharge Wannier's formula puts that near 1100 K and the break-up below 1e-2 of ν₃ at
//     1 atm, while at the breakdown's peak field (300+ Td, few electrons yet) it is not small:
//     there the N₄⁺ share, and so the products, are overstated.
//
// At the start every ion is N₂⁺ (x₂ = 1, x₄ = 0).
type ionShares struct {
	dt              float64 // step [s]
	nu3, nu2O, nu4O float64 // ν₃, ν₂O, ν₄O [s⁻¹]
	x2, x4          float64 // shares of N₂⁺ and N₄⁺
}

// newIonShares returns the shares at closure for gas g of density n [m⁻³], stepped by dt [s].
func newIonShares(g design.Gas, n, dt float64) *ionShares {
	nN2, nO2 := g.Nitrogen*n, g.Oxygen*n
	return &ionShares{dt: dt, x2: 1,
		nu3: ionConversionN2 * nN2 * (nN2 + nO2), nu2O: ionTransferN2pO2 * nO2, nu4O: ionTransferN4pO2 * nO2}
}

// step advances the shares over one step at ionisation frequency nui [s⁻¹] held constant and
// returns the mean N₄⁺ share over the step. x₂ is advanced exactly; x₄ exactly for x₂ held at
// its mean over the step.
func (s *ionShares) step(nui float64) float64 {
	dt := s.dt
	g2 := nui + s.nu3 + s.nu2O
	eq2 := nui / g2
	em2 := math.Expm1(-g2 * dt)
	mean2 := eq2 + (s.x2-eq2)*(-em2/(g2*dt))
	s.x2 = eq2 + (s.x2-eq2)*(1+em2)
	g4 := nui + s.nu4O
	src := s.nu3 * mean2
	var mean4 float64
	if g4 > 0 {
		eq4 := src / g4
		em4 := math.Expm1(-g4 * dt)
		mean4 = eq4 + (s.x4-eq4)*(-em4/(g4*dt))
		s.x4 = eq4 + (s.x4-eq4)*(1+em4)
	} else {
		mean4 = s.x4 + 0.5*src*dt
		s.x4 += src * dt
	}
	return mean4
}
