package kinetics

import (
	"math"

	"n2pulse/units"
)

// Electron collisions with C(0). No measured rate coefficient for e + N₂(C³Πu, v=0) is known
// to us, so the model estimates the two channels that empty C(0) at the electron densities of
// a nitrogen-laser discharge (~1e15 cm⁻³), for a Maxwellian at T_e = (2/3)·⟨ε⟩ of the swarm:
//
//   - superelastic C → B, from the Born–Bethe (van Regemorter) cross section of the optically
//     allowed B → C transition, σ(E) = (8π/√3)·πa₀²·f·(E_H²/(ΔE·E))·P, with the absorption
//     oscillator strength f(B→C) that the C(0) lifetime implies and detailed balance;
//   - ionisation out of C(0), from the Lotz formula σ(E) = a·q·ln(E/I)/(E·I) with the
//     binding energy I of the excited electron: the C³Πu electron sits in the orbital whose
//     removal leaves N₂⁺ in B²Σu⁺ (a one-electron process), so I = E(N₂⁺ B) − E_C(0).
//
// Both are estimates: the van Regemorter form is good to about a factor of 2 for allowed
// transitions of neutrals, and the Lotz constant to tens of per cent for outer shells; the
// ionisation channel ranges up to ×8 if the ion could be left in its ground state (I =
// 4.55 eV). levels.upper_electron_scale multiplies the sum (default 1; 0 switches it off).
const (
	// bohrRadius a₀ [m] and rydbergEnergy E_H = 13.6057 eV [J]: CODATA 2018.
	bohrRadius    = 5.29177210903e-11
	rydbergEnergy = 13.605693122994 * units.ElectronVolt
	// gauntFloor is the effective Gaunt factor of neutral targets at low electron energy,
	// 0.2 (van Regemorter, Astrophys. J. 136, 906 (1962); from memory).
	gauntFloor = 0.2
	// lotzA is the Lotz constant a = 4.5e-14 cm² eV² for an outer-shell electron (Lotz,
	// Z. Phys. 216, 241 (1968); from memory), in m² J².
	lotzA = 4.5e-14 * 1e-4 * units.ElectronVolt * units.ElectronVolt
	// ionBEnergy is the energy of N₂⁺(B²Σu⁺, v=0) above N₂(X, v=0): ionisation energy
	// 15.581 eV plus T₀(B) = 25462 cm⁻¹ = 3.157 eV (Huber & Herzberg, Constants of Diatomic
	// Molecules (1979); from memory) [J].
	ionBEnergy = 18.738 * units.ElectronVolt
)

// oscillatorStrength is the absorption oscillator strength of the lower → upper transition
// whose spontaneous rate is a [s⁻¹] at vacuum wavelength lambda [m], with degeneracy ratio
// gu/gl: f = (g_u/g_l)·(ε₀·m_e·c/(2π·e²))·A·λ² (the standard relation between A and f).
func oscillatorStrength(a, lambda, guOverGl float64) float64 {
	e := units.ElementaryCharge
	return guOverGl * units.VacuumPermittivity * units.ElectronMass * units.SpeedOfLight /
		(2 * math.Pi * e * e) * a * lambda * lambda
}

// superelasticRate is the Maxwellian rate coefficient [m³/s] of the de-excitation u → l by
// electrons at temperature kT [J], from the van Regemorter cross section of the allowed
// excitation l → u of oscillator strength f and energy de [J], by detailed balance with
// degeneracy ratio glOverGu:
//
//	k_ul = (g_l/g_u)·sqrt(8/(π·m_e·kT))·(8π/√3)·πa₀²·f·(E_H²/ΔE)·P(ΔE/kT),
//
// with P(y) = max(0.2, 0.276·e^y·E₁(y)). (The σ ∝ 1/E of the cross section makes the
// Maxwellian integral of the excitation exactly e^(−y) times this.)
func superelasticRate(f, de, kT, glOverGu float64) float64 {
	y := de / kT
	p := gauntFloor
	if y < floorAbove {
		p = max(gauntFloor, 0.276*math.Exp(y)*expIntE1(y))
	}
	pa := math.Pi * bohrRadius * bohrRadius
	return glOverGu * math.Sqrt(8/(math.Pi*units.ElectronMass*kT)) *
		8 * math.Pi / math.Sqrt(3) * pa * f * rydbergEnergy * rydbergEnergy / de * p
}

// floorAbove is a y = ΔE/kT above which P(y) is the Gaunt floor: e^y·E₁(y) < ln(1 + 1/y) for
// every y > 0 (Abramowitz & Stegun, Handbook of Mathematical Functions (1964), 5.1.20; from
// memory, and checked against the computed factor by TestGauntFloorShortcut), so
// 0.276·e^y·E₁(y) < 0.276·ln(1 + 1/0.95) = 0.1985 < 0.2 there, far beyond the error of
// expIntE1. Most steps of a shot have y above it, and need neither E₁ nor e^y.
const floorAbove = 0.95

// lotzRate is the Maxwellian rate coefficient [m³/s] of ionisation of q electrons bound by
// i [J] at electron temperature kT [J] by the Lotz cross section a·q·ln(E/I)/(E·I):
// k = sqrt(8/(π·m_e·kT))·(a·q/I)·E₁(I/kT) (the integral ∫ ln(E/I)·e^(−E/kT) dE over E > I
// is kT·E₁(I/kT)).
func lotzRate(q, i, kT float64) float64 {
	return math.Sqrt(8/(math.Pi*units.ElectronMass*kT)) * lotzA * q / i * expIntE1(i/kT)
}

// upperElectronLoss returns the estimated rate coefficient [m³/s] with which electrons of
// mean energy mean [J] empty C(0): superelastic C → B plus ionisation out of C(0). tauC [s]
// is the C(0) radiative lifetime (nearly all of it C → B), photon [J] the C → B (0,0)
// photon energy and upper [J] the energy of C(0) above X(0).
func upperElectronLoss(mean, tauC, photon, upper float64) float64 {
	sup, ion := upperElectronRates(mean, tauC, photon, upper)
	return sup + ion
}

// upperElectronRates returns the two parts of upperElectronLoss [m³/s]: superelastic C → B
// and ionisation out of C(0).
func upperElectronRates(mean, tauC, photon, upper float64) (super, ion float64) {
	if !(mean > 0) {
		return 0, 0
	}
	kT := 2 * mean / 3
	lambda := units.Planck * units.SpeedOfLight / photon
	// C³Πu and B³Πg have the same degeneracy, (2 − δ₀,Λ)(2S + 1) = 6.
	f := oscillatorStrength(1/tauC, lambda, 1)
	return superelasticRate(f, photon, kT, 1), lotzRate(1, ionBEnergy-upper, kT)
}

// expIntE1 is the exponential integral E₁(x) = ∫₁^∞ e^(−xt)/t dt for x > 0: its power series
// below x = 1, a continued fraction (evaluated by the modified Lentz method) above; relative
// error below 1e-14. It is +Inf at 0 and 0 for x = +Inf.
func expIntE1(x float64) float64 {
	switch {
	case x <= 0:
		return math.Inf(1)
	case math.IsInf(x, 1):
		return 0
	case x <= 1:
		// E₁(x) = −γ − ln x − Σ_{k≥1} (−x)^k/(k·k!)
		const eulerGamma = 0.57721566490153286061
		sum, term := 0.0, 1.0
		for k := 1; k < 60; k++ {
			term *= -x / float64(k)
			d := term / float64(k)
			sum += d
			if math.Abs(d) < 1e-17*math.Abs(sum) {
				break
			}
		}
		return -eulerGamma - math.Log(x) - sum
	}
	// E₁(x) = e^(−x) / (x + 1 − 1²/(x + 3 − 2²/(x + 5 − …))), by modified Lentz.
	const tiny = 1e-300
	b := x + 1
	c := 1 / tiny
	d := 1 / b
	h := d
	for i := 1; i < 200; i++ {
		an := -float64(i * i)
		b += 2
		d = 1 / (an*d + b)
		c = b + an/c
		del := c * d
		h *= del
		if math.Abs(del-1) < 1e-16 {
			break
		}
	}
	return h * math.Exp(-x)
}
