// Package spectro computes the spectroscopy of the N₂ C³Πu → B³Πg (second positive) system
// that the laser model needs: vibrational and rotational term values, band origins and heads,
// rotational line positions, vacuum ↔ air wavelengths, vibrational wave functions,
// Franck–Condon factors, Einstein coefficients and lifetimes, line shapes and the
// stimulated-emission cross section of the 337 nm lines.
//
// # Constants
//
// The molecular constants of X¹Σg⁺, A³Σu⁺, B³Πg and C³Πu are read from data/n2-constants.toml
// (Huber & Herzberg 1979; higher-order terms from Laher & Gilmore, J. Phys. Chem. Ref. Data 20,
// 685, 1991; each number's source beside it in the file). Internally term values are in cm⁻¹
// and distances in Å, as in the compilations; every exported physical result is SI unless its
// doc comment says otherwise.
//
// # Term values and lines
//
//	G(v)   = ωe(v+½) − ωexe(v+½)² + ωeye(v+½)³ + ωeze(v+½)⁴
//	B_v    = Be − αe(v+½) + γe(v+½)²,   D_v = De
//	F_v(J) = B_v J(J+1) − D_v J²(J+1)²
//	ν₀(v′,v″) = Te′ + G′(v′) − Te″ − G″(v″)
//	ν(J′,J″)  = ν₀ + F′_v′(J′) − F″_v″(J″),   J′ = J″−1 (P), J″ (Q), J″+1 (R)
//
// Approximation for the ³Π–³Π fine structure: the band is treated as a ¹Π–¹Π band with B_v
// and D_v per level (J stands for the rotational quantum number N without spin; the spin–orbit
// splitting A·Λ·Σ, with A ≈ 39 cm⁻¹ for C and 42 cm⁻¹ for B, is left out of the positions,
// and Λ-doubling is neglected). Line strengths are the ΔΛ = 0 Hönl–London factors
// (Herzberg 1950). In the gain calculation each rotational line is counted as three spin
// components (Ω = 0, 1, 2 sub-bands): their origins differ by about (A′ − A″)ΔΣ ≈ 3 cm⁻¹,
// far more than the line width below some atmospheres, so one lasing line draws on one spin
// component, a third of the rotational level's population (the ±A ≈ 0.2 kT energy offsets of
// the components are neglected in the populations). The head is the lowest-wavenumber line of
// the P branch (the band is degraded to the violet, B′ > B″); measured heads are those of the
// Ω sub-band that lies furthest to the red, so the computed heads fall about 0.02–0.05 nm to
// the blue of Pearse & Gaydon's.
//
// Air wavelengths use the refractive index of standard air (15 °C, 101 325 Pa, dry, 450 ppm
// CO₂) of P.E. Ciddor, Appl. Opt. 35, 1566 (1996), eq. (1); the Birch & Downs (1994) form of
// Edlén's formula is provided for comparison (they agree to 2e−8 in n above 300 nm).
//
// # Vibrational wave functions
//
// The rotationless radial equation −(ħ²/2μ)ψ″ + V(r)ψ = Eψ is solved on a uniform grid with
// the sinc discrete-variable representation (the infinite-order finite-difference limit) of
// Colbert & Miller, J. Chem. Phys. 96, 1982 (1992), or the three-point difference, by a dense
// symmetric eigen-decomposition (gonum mat.EigenSym). The potentials are first-order
// Rydberg–Klein–Rees curves (default) built from G(v) and B_v,
//
//	f = √k ∫ dv′/√(G(v)−G(v′)),  g = (1/√k) ∫ B(v′) dv′/√(G(v)−G(v′)),  r± = √(f/g + f²) ± f,
//
// with k = ħ²/2μ, interpolated in y = ±√V by a cubic spline and continued by the Morse shape
// beyond the fitted levels (C: v ≤ 6, B: v ≤ 12, X: v ≤ 15); or Morse curves
// V = De(1 − e^(−a(r−re)))², De = ωe²/4ωexe, a = √(2μωexe)/ħ. With RKR curves the v′ = 0
// progression reproduces the published Franck–Condon factors to 0.003; Morse curves are
// 0.017 high in q(0,0). Both become poor for v′ ≥ 2 of C, whose constants cover v ≤ 4 only.
// Franck–Condon factors and r-centroids are
//
//	q(v′,v″) = |⟨v′|v″⟩|²,   r̄(v′,v″) = ⟨v′|r|v″⟩/⟨v′|v″⟩.
//
// Einstein coefficients use a constant electronic transition moment |Re|:
//
//	A(v′,v″) = 16π³ ν̃³ |Re|² q(v′,v″) / (3ε₀h)   (ν̃ the band origin [m⁻¹])
//	τ(v′)    = 1 / Σ_v″ A(v′,v″)
//
// |Re| is calibrated on one band (A(0,0) of Gilmore, Laher & Espy 1992, see the data file), so
// the other A values and the lifetime are predictions of the Franck–Condon factors and ν̃³.
// The excitation shares of electron impact from X(v=0) are taken in the Franck–Condon
// approximation: f_C = q(X0 → C0), f_B = q(X0 → B0).
//
// Solving the three radial problems costs about 0.1 s of CPU, so the quantities the laser model
// needs from them (A(0,0), τ(C,v=0), f_C for v = 0 and 1, f_B) ship as this package's own output
// in data/n2-vibronic.csv, with a recipe naming the constants file (SHA-256) and the grid they
// came from; Laser reads that table and solves afresh only when the recipe does not match.
// TestShippedVibronic keeps the table equal bit for bit to a fresh solve.
//
// # Line shapes and cross sections
//
//	Doppler FWHM   Δν_D = (ν₀/c)·√(8 k_B T ln2 / m)
//	collision FWHM Δν_L = c·γ·(p/1 atm)·(T_ref/T)^n   (γ in cm⁻¹ atm⁻¹, from the data file)
//	Voigt          V(Δν) = Re w((Δν + iΔν_L/2)/(σ√2)) / (σ√(2π)),  σ = Δν_D/(2√(2 ln2))
//
// with the Faddeeva function w(z) by Weideman's rational expansion (J.A.C. Weideman, SIAM J.
// Numer. Anal. 31, 1497, 1994; N = 32 terms). The peak stimulated-emission cross section of a
// line is σ_line = λ²·A_line·V(0)/(8π), with A_line = A(v′,v″)·S(J′,J″)/(2J′+1).
//
// # Effective cross section for the laser model
//
// The laser model carries only the total populations N_C of C(v=0) and N_B of B(v=0). With
// rotational relaxation faster than the pulse (collision times of ~0.1 ns at 1 atm), the
// rotational levels stay in thermal shares s_C(J′), s_B(J″) (RotationalShares, divided by the
// three spin components), and the gain of one line is
//
//	g = σ_line·(s_C N_C − (g_u/g_l) s_B N_B) = σ_eff·(N_C − (g_C/g_B)_eff N_B)
//	σ_eff = σ_line·s_C,   (g_C/g_B)_eff = (2J′+1)/(2J″+1) · s_B/s_C.
//
// Laser takes the line with the largest σ_eff; at 300 K this is a P-branch line near J″ ≈ 8
// (σ_line ≈ 5.5e−18 m² at 1 atm, s_C ≈ 0.027 per spin component, σ_eff ≈ 1.5e−19 m²). Neighbouring P lines are
// within a few per cent of it and lase together. Near the head they lie 3–5 GHz apart, so at
// high pressure they overlap; Laser keeps the single-line value (a lower bound of the gain at
// one frequency), and GainPeak sums the overlapping lines: ×1.0 at 100 Pa, ×1.3 at 1 atm,
// ×2.2 at 3 atm (300 K).
// The natural and quenching widths (≲0.1 GHz) are negligible against Doppler (2.1 GHz at 300 K)
// and are not included.
//
// # References
//
//   - K.P. Huber & G. Herzberg, Constants of Diatomic Molecules (1979).
//   - R.R. Laher & F.R. Gilmore, J. Phys. Chem. Ref. Data 20, 685 (1991).
//   - F.R. Gilmore, R.R. Laher & P.J. Espy, J. Phys. Chem. Ref. Data 21, 1005 (1992).
//   - D.T. Colbert & W.H. Miller, J. Chem. Phys. 96, 1982 (1992).
//   - J.A.C. Weideman, SIAM J. Numer. Anal. 31, 1497 (1994).
//   - P.E. Ciddor, Appl. Opt. 35, 1566 (1996); K.P. Birch & M.J. Downs, Metrologia 31, 315 (1994).
//   - G. Herzberg, Spectra of Diatomic Molecules (Van Nostrand, 1950).
//   - R.W.B. Pearse & A.G. Gaydon, The Identification of Molecular Spectra (4th ed., 1976).
package spectro
