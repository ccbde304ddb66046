// Package kinetics is the laser model of n2pulse: a design.Design (channel, gas, circuit, switch,
// discharge, level kinetics, optics) becomes a Result (waveforms and figures of merit) through
// four coupled blocks, in SI units throughout.
//
//   - Circuit: a Blumlein (C₁, C₂ sharing a plate) or a charge-transfer circuit (C_s into C_p),
//     switch loop L_s with R_s(t) (ideal, exponential or Rompe–Weizel spark law), channel loop
//     L_c, optional shunt, and the gap capacitance C_g = ε₀·L·w_e/d in parallel with the plasma.
//   - Discharge: the plasma current I_p = e·n_e·v_d(E/N)·L·w with E = V_ch/d, and
//     d ln n_e/dt = (k_ion − k_att)·N − ᾱ·n_e, coefficients from a swarm table; ᾱ is the
//     recombination coefficient of the N₂⁺/N₄⁺/O₂⁺ mixture at T_e = ⅔⟨ε⟩/k_B, the shares
//     carried as two more states (ions.go), or one β for every ion when the design sets it. Circuit and
//     discharge form one stiff 0-D system integrated with an L-stable Rosenbrock method.
//   - Populations of C³Πu(v=0) and B³Πg(v=0) per cell, pumped by f_C·k_C·n_e·N_X and
//     f_B·k_B·n_e·N_X, lost by radiation and Stern–Volmer quenching, coupled by stimulated
//     emission. Over one optical step pump and decay are integrated exactly for constant
//     coefficients; stimulated transitions are taken from the photon flux by the Frantz–Nodvik
//     relation for the cell, so populations stay non-negative at any flux and every photon
//     gained by the beam is a transition taken from the medium.
//   - Photons: forward and backward fluxes on characteristics (Δz = c·Δt), seeded by
//     spontaneous emission A₀₀·N_C·Ω/4π into the solid angle of the channel, reflected at the
//     ends; each cell sees the discharge delayed by z/v for a travelling excitation front.
//   - Gas heating: the gas of the discharge volume heats at constant density by the elastic
//     part of the electron power and a share of its electronic part (levels.fast_heating_share,
//     released as the excited states are quenched); the effective cross section and g_C/g_B of
//     the optics follow its temperature (σ(T) tabulated from package spectro).
//
// The circuit and discharge do not feel the laser pulse (the energy it carries is a part in
// 10³ of the stored energy), so they are solved first and sampled on the optical grid.
//
// # Package map
//
// Each package imports only those to its right (internal/pool, internal/atomicfile and internal/usermsg serve all):
//
//	cmd/n2pulse  → validation, plots, kinetics/study   commands, flags, printing, report figures
//	validation   → kinetics/study, kinetics            checks against published values and measured lasers
//	plots → study → kinetics                           figures | many runs: sweep, length scan, sensitivity
//	kinetics     → design, swarm, spectro, ode         one shot: circuit, discharge, populations, ASE, bench stresses, verdict
//	design → build; swarm, spectro, ode → units, data  design keys, defaults, file, [build] | plates | E/N rates | band constants, σ | integrator
package kinetics
