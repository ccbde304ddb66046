package design

// Rate constants are given in cm³/s in the comments (the unit of the sources) and stored in
// SI (m³/s, ×1e-6).
func defaultLevels() Levels {
	return Levels{
		// N2(C,v=0) + N2: 1.0e-11 cm³/s. Kossyi, Kostinsky, Matveyev & Silakov, Plasma Sources
		// Sci. Technol. 1, 207 (1992), as quoted in public air-plasma mechanism files (seen,
		// secondary). Published spread 1.0–1.5e-11 (Pancheshnyi et al., Chem. Phys. Lett. 294,
		// 523 (1998): about 1.3e-11, from memory).
		UpperQuenchingNitrogen: 1.0e-17,
		// N2(C,v=0) + O2: 2.7e-10 cm³/s, the low end of the published spread 2.7–3.3e-10
		// (3.0e-10 in Kossyi et al. 1992, seen, secondary). Chosen inside that spread so that the
		// Stern–Volmer constants with τ_C from package spectro (39.9 ns) and the N2 rate above
		// reproduce the measured quenching pressure of the 337 nm band in dry air at 293 K,
		// p′ = 15.89 hPa (AIRFLY: M. Ave et al., Astropart. Phys. 28, 41 (2007); read in a
		// transcription with that citation, seen): 2.7e-10 gives 15.71 hPa (−1.1 %), 3.0e-10
		// gives 14.32 hPa (−9.9 %). Checked in the validation registry (fluorescence.*).
		UpperQuenchingOxygen: 2.7e-16,
		// N2(C) + He: no value found; taken as zero (from memory: helium is a weak quencher).
		UpperQuenchingHelium: 0,
		// Electron-induced loss of C(0): no published rate coefficient found; a free parameter,
		// zero by default.
		UpperElectronMixing: 0,
		// Electron collisions with C(0) as estimated by package kinetics (Born–Bethe
		// superelastic C → B and Lotz ionisation, about 2–3e-8 cm³/s at 300 Td): factor 1;
		// the estimate's range is ×0.5–2 (van Regemorter's form for allowed transitions of
		// neutrals) and up to ×3 if ionisation could leave the ion in its ground state.
		UpperElectronScale: 1,
		// Factors on the electron-impact excitation rates of C³Πu and B³Πg taken from the swarm
		// table: 1, the cross-section set as it is. Their sampled ranges are the uncertainties
		// Y. Itikawa, J. Phys. Chem. Ref. Data 35, 31 (2006) states for his recommended cross
		// sections: ±30 % for C³Πu (Table 10) and ±35 % for B³Πg (Table 8) (seen, in the
		// metadata of that paper's tables transcribed in the public nepc project of the U.S.
		// Naval Research Laboratory: "the estimated uncertainty indicates the degree of the
		// concurrence of the individual experimental results"). See design.Spreads.
		UpperExcitationScale: 1,
		LowerExcitationScale: 1,
		// C(v=1) → C(0) by N₂ and the quenching of C(v=1) by N₂: about 1.5e-11 cm³/s each,
		// from memory, range 1–2e-11 each. The measurement is Dilecce, Ambrico & De Benedictis,
		// Chem. Phys. Lett. 431, 241 (2006): its first page was seen (title, abstract and
		// introduction: electronic quenching and vibrational relaxation rate coefficients of
		// C³Πu v = 0–4 by N₂, by optical–optical double-resonance laser-induced fluorescence
		// from N₂(A) in a pulsed barrier discharge), its table was not: both numbers remain
		// from memory until someone reads it. C(v=1) takes 0.31 of the C excitation
		// (Franck–Condon, package spectro); relaxing into C(0) it raises the 1-atm pulse energies
		// by 27–56 % (issue-15 note), so it is in by default.
		UpperRelaxationNitrogen:  1.5e-17,
		UpperV1QuenchingNitrogen: 1.5e-17,
		// B(v) radiative rate 1.34e5 s⁻¹ (τ = 7.5 µs), band average of Capitelli et al., Plasma
		// Kinetics in Atmospheric Gases (Springer 2000), as quoted in mechanism files (seen,
		// secondary); τ(B, v=0) is 8–13 µs (Eyler & Pipkin 1983, from memory).
		LowerLifetime: 7.5e-6,
		// Removal of B(v=0) by N2: 2e-12 cm³/s, the N2(B) + N2 → N2 + N2 channel of Kossyi et
		// al. 1992 (seen, secondary). The 3e-11 cm³/s B → A channel of the same set describes
		// cascades inside the B/W/A manifold that feed back into B and is not used as the loss
		// of B(v=0): used so, it drains the lower level faster than C is quenched and removes
		// the self-termination that every practical nitrogen laser shows.
		LowerRemovalNitrogen: 2e-18,
		// Removal of B(v=0) by O2: no value for the level itself was found. The 3e-10 cm³/s
		// of Kossyi et al. 1992 (N2(B) + O2 → N2 + O + O, seen, secondary) describes the B
		// manifold; used for B(v=0) it drains the lower level so fast that adding air raises
		// the output, the opposite of what builders see (found against the experiment cases
		// in validation/testdata/experiments). Zero until a measured value is found.
		LowerRemovalOxygen: 0,
		// The share of the B/W/B′ manifold's relaxation that ends in B(0): no measured value
		// was found, so it is derived. A molecule in B(v) relaxes to B(v−1) by N₂ at k_VR ≈
		// 2e-11 cm³/s (from memory of laser-induced-fluorescence work; range 1–3e-11) or leaves
		// for A³Σu⁺ at k_BA = 1.2e-11 (J. Appl. Phys. 125, 243301 (2019), Table I, R25, seen;
		// 3e-11 in Kossyi et al. 1992): each step down keeps it with p = k_VR/(k_VR + k_BA) =
		// 0.625, and the electrons put it in B(v) with the Franck–Condon factors of X(0) → B(v)
		// (package spectro: 0.148, 0.197, 0.192, 0.153, 0.106, 0.066, … for v = 1…6), so the
		// ladder's yield is Σq_v·p^v / Σq_v = 0.27 (TestManifoldShareDerived). W³Δu lies among
		// the same B levels and mixes with them in collisions (Bachmann et al., J. Chem. Phys.
		// 96, 5151 (1992), abstract seen): taken alike. B′³Σu⁻ starts near B(v=4–5) (about a
		// tenth of the manifold's excitation at 200–1000 Td) and keeps p⁵ ≈ 0.1: the whole
		// manifold 0.25. Range 0.05–0.37 from the ranges of k_VR and k_BA. What C(0) and C(v=1)
		// pass to the B state joins the manifold (kinetics.upperShadow) with the same share.
		ManifoldShare: 0.25,
		// N2(B) + N2 → N2(A) + N2(v): 1.2e-11 cm³/s, J. Appl. Phys. 125, 243301 (2019), Table I,
		// R25 (seen); 3e-11 cm³/s in Kossyi et al. 1992 (seen, secondary): range 1.2–3e-11.
		ManifoldRelaxationNitrogen: 1.2e-17,
		// N2(B) + O2 → N2 + O + O: 3e-10 cm³/s, Kossyi et al. 1992 (seen, secondary); none of it
		// ends in B(0).
		ManifoldRelaxationOxygen: 3e-16,
		// Dissociative recombination e + N₄⁺ → N₂(B) + N₂ 87 %, → N₂(C) + N₂ 11 % (and
		// → N₂(A) + N₂ 2.5 %) of 2.4e-6·(300/T_e)^0.5 cm³/s: J. Appl. Phys. 125, 243301 (2019),
		// Table I, R7a–R9a (seen, in the author manuscript's table; the exponent of the
		// temperature factor did not survive the transcription, 0.5 as in Kossyi et al. 1992's
		// 2e-6·(300/T_e)^0.5 for N₄⁺ + e → 2N₂, seen, secondary). The vibrational levels of the
		// products are not given: C is taken into C(0) (an upper bound for the laser level; what
		// lands in C(v≥1) would partly relax into it), B into the manifold (the ion's
		// recombination energy, 15.6 eV less its bond of about 1 eV (from memory), leaves about
		// 7 eV above B(0), so B is born high in its ladder). The total rate is e + N₄⁺'s
		// coefficient at the discharge's T_e (or discharge.recombination when set) times the
		// N₄⁺ share of the ions, a state of the circuit (kinetics.ionChemistry).
		RecombinationUpperShare: 0.11,
		RecombinationLowerShare: 0.87,
		// Fast gas heating: the share of the energy the electrons put into electronic states,
		// dissociation and ionisation that becomes heat within nanoseconds (quenching of the
		// excited states, fast fragments of dissociation, recombination). No readable value
		// was found; estimate 0.1, range 0.03–0.3. From memory, the fast-heating literature
		// (Popov, Plasma Phys. Rep. 27, 886 (2001); Aleksandrov, Kindysheva, Nudnova &
		// Starikovskiy, J. Phys. D 43, 255201 (2010); Popov, J. Phys. D 44, 285201 (2011))
		// gives 20–30 % in air at 100–1000 Td and less in pure N₂, where much of the energy
		// stays in N₂(A³Σu⁺) and in vibration; one value serves every mixture.
		FastHeatingShare: 0.1,
	}
}
