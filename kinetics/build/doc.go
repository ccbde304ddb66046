// Package build turns a nitrogen laser as built — capacitor plates, dielectric, electrode rails,
// switch gap — into the lumped circuit values the model runs on, and rates the stresses on its
// parts. It holds pure formulas in SI and imports no model code: package kinetics calls it.
//
// Formulas (d dielectric thickness, w plate width across the current, l plate length along the
// current, ε = ε₀ε_r, μ₀ the vacuum permeability, c the speed of light):
//
//   - Parallel-plate capacitance C = ε·l·w/d, optionally with Palmer's fringe correction for
//     rectangular plates, C = ε·l·w/d·[1 + d/(πw)·(1 + ln(2πw/d))]·[1 + d/(πl)·(1 + ln(2πl/d))]
//     (H. B. Palmer, "The capacitance of a parallel-plate capacitor by the Schwartz–Christoffel
//     transformation", Trans. AIEE 56, 363 (1937); the formula as recalled, from memory).
//   - The plates as a parallel-plate transmission line (TEM, fringing neglected): L' = μ₀·d/w,
//     C' = ε·w/d, Z₀ = sqrt(L'/C') = (d/w)·sqrt(μ₀/ε), one-way transit time τ = l·sqrt(ε_r)/c.
//   - Loop inductance of a plate capacitor discharged from one edge (quasi-static: the charge
//     stays uniform, so the current falls linearly from the edge to zero at the far end, and the
//     magnetic energy ½∫L'I(x)²dx gives L = L'·l/3). The channel loop adds the rails: a sheet
//     current up one rail, across the gap and down the other, L = μ₀·g·h/L_rail for rails of
//     height h, gap g and length L_rail.
//   - Paschen's law for the static breakdown of a uniform gap, V_b = B·pd / ln(A·pd/ln(1+1/γ)),
//     with its minimum (pd)_min = e·ln(1+1/γ)/A, V_min = e·B·ln(1+1/γ)/A; pd is reduced to
//     293 K (Paschen's law holds in N·d, not p·d).
//
// Materials (dielectric presets, Townsend constants) come from data/materials.toml, each value
// with its source.
package build
