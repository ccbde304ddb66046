package kinetics

import (
	"math"

	"n2pulse/kinetics/design"
	"n2pulse/units"
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

// Dissociative recombination coefficients of the positive ions, α = a·(300 K/T_e)^p (the
// sources give cm³/s; SI here). The fits were measured at T_e of a few hundred to a few thousand
// kelvin and are used here at the 1–4 eV of a discharge: an extrapolation, stated, common in
// discharge models (Kossyi et al. 1992 use them so).
const (
	// e + N₂⁺ → N + N: 1.8e-7·(300/T_e)^0.39 cm³/s (Mehr & Biondi, Phys. Rev. 181, 264
	// (1969), as quoted with its citation in a public air-plasma mechanism file, seen,
	// secondary).
	recombN2p, recombN2pPower = 1.8e-7 * 1e-6, 0.39
	// e + N₄⁺ → N₂ + N₂: 2e-6·(300/T_e)^0.5 cm³/s (Kossyi, Kostinsky, Matveyev & Silakov,
	// Plasma Sources Sci. Technol. 1, 207 (1992), as quoted in the same file, seen, secondary);
	// J. Appl. Phys. 125, 243301 (2019), Table I, R7a–R9a gives 2.4e-6 at 300 K (seen; its
	// exponent did not survive the copy read): a range of +20 %.
	recombN4p, recombN4pPower = 2e-6 * 1e-6, 0.5
	// e + O₂⁺ → O + O: 2.4e-7·(300/T_e)^0.7 cm³/s (Peverall et al., J. Chem. Phys. 114, 6679
	// (2001), as quoted in the same file, seen, secondary). O₄⁺ (1.4e-6·(300/T_e)^0.5 cm³/s,
	// Kossyi et al. 1992, seen, secondary) is not followed: O₂⁺ + O₂ + M → O₄⁺ + M
	// (2.4e-30 cm⁶/s, Aleksandrov & Bazelyan 1999, seen, secondary) takes 3 ns in air at
	// 1 atm, and in the field of a lasing discharge the heated ions break O₄⁺ up again
	// (O₄⁺ + M → O₂⁺ + O₂ + M, Kossyi et al. 1992, from memory); counting every oxygen ion as
	// O₂⁺ is the lower end of the air coefficient.
	recombO2p, recombO2pPower = 2.4e-7 * 1e-6, 0.7
)

// electronTemperature is T_e = ⅔·⟨ε⟩/k_B for a mean electron energy mean [J] (the temperature
// of a Maxwellian of that mean energy: an approximation for the non-Maxwellian distribution
// of the swarm table), not below the gas temperature tgas [K]; and dT_e/d⟨ε⟩ [K/J] (0 on the
// floor).
func electronTemperature(mean, tgas float64) (te, dte float64) {
	te = 2 * mean / (3 * units.Boltzmann)
	if !(te > tgas) {
		return tgas, 0
	}
	return te, 2 / (3 * units.Boltzmann)
}

// recombination returns the recombination coefficients [m³/s] of electrons of temperature te
// [K] with N₂⁺, N₄⁺ and O₂⁺ (in that order) and their derivatives with respect to te [m³/(s K)].
func recombination(te float64) (a, da [3]float64) {
	r := 300 / te
	for j, c := range [3]struct{ a, p float64 }{{recombN2p, recombN2pPower}, {recombN4p, recombN4pPower}, {recombO2p, recombO2pPower}} {
		a[j] = c.a * math.Pow(r, c.p)
		da[j] = -c.p * a[j] / te
	}
	return a, da
}

// ionChemistry holds the frequencies of the ion conversions that decide which ion the
// electrons recombine with; the shares x₂ (N₂⁺) and x₄ (N₄⁺) of the positive ions are states of
// the circuit (the rest, 1 − x₂ − x₄, are O₂⁺). They are carried, not taken at steady state:
// at 1 atm N₂⁺ turns into N₄⁺ in 1/ν₃ = 33 ps, far faster than n_e changes, but at 50 Torr
// it takes 7.7 ns, as long as the pulse. Assumptions, stated:
//   - quasi-neutral, the positive ions number n_e (true in N₂; in air the negative ions that
//     attachment makes are not counted, which understates the ions);
//   - every ion is born N₂⁺ at the ionisation frequency ν_i = k_ion·N (direct ionisation of O₂
//     in air is counted as N₂⁺, which passes to O₂⁺ within a nanosecond at 1 atm anyway);
//   - ion j recombines at α_j (recombination above), all of them at ᾱ = Σ_j α_j·x_j on
//     average; with n_j = x_j·n_e, dn_e/dt = ν_i·n_e − ᾱ·n_e² and
//     dn_j/dt = (births_j − losses_j)·n_e − α_j·n_e·n_j give
//     dx₂/dt = ν_i·(1 − x₂) − (ν₃ + ν₂O)·x₂ + (ᾱ − α₂)·n_e·x₂,
//     dx₄/dt = ν₃·x₂ − (ν_i + ν₄O)·x₄ + (ᾱ − α₄)·n_e·x₄,
//     with ν₃ = k₃·N_N₂·(N_N₂ + N_O₂), ν₂O = k(N₂⁺ + O₂)·N_O₂, ν₄O = k(N₄⁺ + O₂)·N_O₂; with one
//     coefficient for every ion (discharge.recombination set) the last terms vanish;
//   - the break-up N₄⁺ + N₂ → N₂⁺ + 2N₂ is left out: 2.1e-16·exp(T/121 K) cm³/s in Kossyi et
//     al. 1992 (from memory), with T the ions' temperature; at the 150–200 Td of a lasing
//     discharge Wannier's formula puts that near 1100 K and the break-up below 1e-2 of ν₃ at
//     1 atm, while at the breakdown's peak field (300+ Td, few electrons yet) it is not small:
//     there the N₄⁺ share, and so the products and the recombination, are overstated.
//
// At the start every ion is N₂⁺ (x₂ = 1, x₄ = 0).
type ionChemistry struct {
	nu3, nu2O, nu4O float64 // ν₃, ν₂O, ν₄O [s⁻¹]
}

// newIonChemistry returns the conversion frequencies for gas g of density n [m⁻³].
func newIonChemistry(g design.Gas, n float64) ionChemistry {
	nN2, nO2 := g.Nitrogen*n, g.Oxygen*n
	return ionChemistry{nu3: ionConversionN2 * nN2 * (nN2 + nO2), nu2O: ionTransferN2pO2 * nO2, nu4O: ionTransferN4pO2 * nO2}
}

// meanRecombination is ᾱ = α₂·x₂ + α₄·x₄ + α_O·(1 − x₂ − x₄) [m³/s].
func meanRecombination(x2, x4 float64, a [3]float64) float64 {
	return a[0]*x2 + a[1]*x4 + a[2]*(1-x2-x4)
}

// shareRates returns dx₂/dt and dx₄/dt [s⁻¹] (see ionChemistry) at ionisation frequency nui
// [s⁻¹], electron density ne [m⁻³] and recombination coefficients a of N₂⁺, N₄⁺, O₂⁺ [m³/s].
func (s ionChemistry) shareRates(x2, x4, nui, ne float64, a [3]float64) (d2, d4 float64) {
	mean := meanRecombination(x2, x4, a)
	d2 = nui*(1-x2) - (s.nu3+s.nu2O)*x2 + (mean-a[0])*ne*x2
	d4 = s.nu3*x2 - (nui+s.nu4O)*x4 + (mean-a[1])*ne*x4
	return d2, d4
}
