// Package swarm gives the electron transport and rate coefficients of N₂, air and N₂–O₂–He
// mixtures as functions of the reduced field E/N: a Table interpolated in log–log, the shipped
// tables for N₂ and air, and the two-term Boltzmann solver that makes them.
//
// # Equation
//
// The solver is the steady two-term spherical-harmonic expansion of the Boltzmann equation in
// the formulation of G.J.M. Hagelaar & L.C. Pitchford, Plasma Sources Sci. Technol. 14, 722
// (2005). With ε the energy in eV, F0(ε) the isotropic distribution normalised by
// ∫ ε^½ F0 dε = 1 and γ = (2e/m_e)^½,
//
//	d/dε [ W̃ F0 − D̃ dF0/dε ] = S̃,
//	W̃ = −γ ε² σ_ε,                σ_ε = Σ_k x_k (2m/M_k) σ_el,k,
//	D̃ = (γ/3) (E/N)² ε/σ̃ + γ (k_B T_g/e) ε² σ_ε,
//	σ̃ = σ_m + (ν̄/N)/(γ ε^½),      σ_m = Σ_k x_k (σ_el,k + Σ_j σ_kj),
//
// where σ_m is the total momentum transfer (elastic momentum transfer plus every inelastic
// process, taken as isotropic) and x_k are mole fractions. S̃ holds the inelastic collisions:
// an excitation of threshold u removes electrons at ε and puts them at ε − u; an ionisation
// shares ε − u equally between the two electrons (EqualSharing: the primary and the secondary
// each get (ε − u)/2; OneTakesAll is available); an attachment removes the electron.
//
// # Growth
//
// Electron-number growth is temporal: n_e ∝ exp(ν̄ t) with ν̄/N = Σ x k_ion − Σ x k_att, which
// adds −(ν̄/N) ε^½ F0 to S̃ and (ν̄/N)/(γ ε^½) to σ̃. ν̄ is iterated to self-consistency
// (secant method) together with the grid. α/N = k_ion/w and η/N = k_att/w.
//
// # Numerics
//
// Cell-centred finite volumes on a non-uniform grid (faces ε_k = ε_max(a s + (1−a) s²),
// s = k/n, a = 0.25: the cells at the top are seven times wider than at the bottom) and the
// exponential (Scharfetter–Gummel) flux of Hagelaar & Pitchford between cells. Inelastic terms
// take F0 constant in a cell and σ piecewise linear: the loss from cell j is x γ ∫ εσ dε over
// the cell; the scattered electrons (at ε_j − u, or twice at (ε_j − u)/2 for equal sharing) are
// split between the two cells whose centres bracket that energy, so that the discrete operator
// conserves electron number and energy exactly (each collision removes exactly u). The power
// balance then closes to about 1e-6 (1e-4 at 3000 Td, where the growth term is large).
// The linear system is dense, since the inelastic terms couple distant cells; it is solved by
// LU factorisation with gonum/mat, the first equation replaced by the normalisation. ε_max is
// adapted until F0(ε_max)/F0(0) lies in [1e-14, 1e-7]. The default grid has 200 cells; from 200 to
// 800 cells the drift velocity and mean energy change by about 0.1 % and k_C by about 0.5 %
// at 100 Td (more, relatively, where k_C is tiny: 8 % at 30 Td, at 1e-24 m³/s).
//
// Outputs per E/N: the EEDF, mean energy ⟨ε⟩ = ∫ ε^{3/2} F0 dε, flux drift velocity
// w = −(γ/3)(E/N) ∫ ε/σ̃ dF0/dε dε, transverse diffusion N·D_T = (γ/3) ∫ ε/σ̃ F0 dε and the
// characteristic energy D_T/μ, the rate coefficient k = γ ∫ ε σ F0 dε of every process, the
// A, B and C excitation rates of N₂ (sums of the processes labelled A, B, C in the data file),
// α/N = k_ion/w, η/N = k_att/w and the power balance
//
//	(E/N)·w = P_elastic + Σ x u k + P_attachment + (ν̄/N)⟨ε⟩.
//
// The drift velocity and α/N are the flux (two-term, temporal-growth) values. Measured
// drift velocities are bulk values, which exceed the flux value where ionisation is strong
// (above about 1000 Td in N₂), and measured α is a steady-state Townsend value; the
// validation compares below that range. In helium-rich mixtures at the top of the range the
// mean energy reaches hundreds of eV (near runaway, beyond the end of the data, 1 keV for He, where
// cross sections are held at their last value): the two-term results there are indicative.
//
// # Cross sections
//
// Three sets ship (Sets, ResolveSet; He is common to all): "original", data/xsec-n2.txt and
// data/xsec-o2.txt, described below; "phelps1985", data/xsec-n2-phelps.txt, the set of A.V.
// Phelps & L.C. Pitchford, Phys. Rev. A 31, 2932 (1985) as distributed (with single-level
// rotation and v = 1…8); "itikawa2006", data/xsec-n2-itikawa.txt, that set with B³Πg and C³Πu
// from Y. Itikawa, J. Phys. Chem. Ref. Data 35, 31 (2006), Tables 8 and 10. DefaultSet names
// the one used when none is given. The last two are made by scripts/xsec/n2_sets.py, and both
// take O₂ from data/xsec-o2-phelps.txt: the swarm-derived O₂ set of Phelps's compilation
// (S.A. Lawton & A.V. Phelps, J. Chem. Phys. 69, 1055 (1978)) as distributed, with
// single-level rotation, v = 1…4 with the 9 eV resonance, a¹Δg, b¹Σg⁺, the 4.5, 6.0, 8.4 and
// 9.97 eV losses, ionisation and dissociative attachment; made by scripts/xsec/o2_sets.py,
// which derives the elastic momentum transfer from the distributed total momentum transfer.
//
// data/xsec-n2.txt and data/xsec-o2.txt, in n2pulse's own text format (documented at the top
// of each file), each process with its source. N₂: elastic momentum transfer, vibrational
// excitation v = 1…7, A, B, W, B′, a′, a, w, C, E, a″, c′ and lumped higher states, neutral
// dissociation, counting ionisation. O₂: momentum transfer, vibration (summed), a¹Δg, b¹Σg⁺,
// the 4.5, 8.4 and 9.97 eV states, ionisation, dissociative attachment. Rotational excitation
// is left out of these two (its energy loss matters only below a few Td). Momentum transfer
// above 10 eV is derived from the elastic values and the published phase functions in the same
// source (see the files). Their O₂ attachment is from memory and marked so.
//
// data/xsec-he.txt, common to every set, is the He set of Phelps's compilation as distributed
// (momentum transfer after Crompton et al. and Hayashi, one lumped excitation, ionisation after
// Rapp & Englander-Golden 1965), made by scripts/xsec/he_set.py; its data end at 1 keV.
//
// # Attachment
//
// Dissociative attachment to O₂ is a cross section in the O₂ file. Three-body attachment
// e + O₂ + M → O₂⁻ + M (M = O₂, N₂; He as third body is neglected) is not part of the Boltzmann equation: it is added to k_att
// after the solve as a two-body rate at the reference density N_ref (default 2.446e25 m⁻³,
// 101325 Pa and 300 K), from the expressions of I.A. Kossyi, A.Yu. Kostinsky, A.A. Matveyev &
// V.P. Silakov, Plasma Sources Sci. Technol. 1, 207 (1992), as quoted in public air-plasma
// mechanism files, with T_e = (2/3)⟨ε⟩/k_B. It scales with N: Table.AtDensity rescales the
// k_att3_m3_s column, and its part of k_att and η/N, from N_ref to the gas's density (the laser
// model does so for every design). It is negligible above about 100 Td.
//
// Superelastic collisions are not included (at 300 K the vibrational and electronic
// populations of the gas are negligible).
//
// # Units
//
// SI in the API: E/N [V m²] (1 Td = 1e-21 V m²), energies [J], w [m/s], α/N and η/N [m²],
// rate coefficients [m³/s]. Inside the solver energies are in eV. The CSV tables use Td and eV
// for E/N and the mean energy, SI otherwise. Tables are written with every number in its shortest round-trip form, and a
// solved table is always used as read back from that text, so a fresh solve and a cached file
// give the same results bit for bit. Rate columns of the single processes are named by species
// and state (k_N2_C3Pi_u_m3_s, see ColumnName).
//
// # Rates per molecule
//
// Coefficients.Ionisation and Attachment are per molecule of the whole gas
// (dn_e/dt = (k_ion − k_att) N n_e); ExciteA, ExciteB and ExciteC are per N₂ molecule.
package swarm
