package spectro

// Vibrational and rotational term values of one state, in cm⁻¹ (Dunham-type expansions in
// v+½ with the constants of the compilation).

// G returns the vibrational term G(v) = ωe(v+½) − ωexe(v+½)² + ωeye(v+½)³ + ωeze(v+½)⁴ [cm⁻¹],
// measured from the potential minimum.
func (s State) G(v int) float64 {
	x := float64(v) + 0.5
	return x * (s.We + x*(-s.WeXe+x*(s.WeYe+x*s.WeZe)))
}

// B returns the rotational constant of level v, B_v = Be − αe(v+½) + γe(v+½)² [cm⁻¹].
func (s State) B(v int) float64 {
	x := float64(v) + 0.5
	return s.Be - s.AlphaE*x + s.GammaE*x*x
}

// D returns the centrifugal distortion constant of level v [cm⁻¹]; taken equal to De (the
// βe correction is not in the compilations used).
func (s State) D(v int) float64 { return s.De }

// F returns the rotational term F_v(J) = B_v·J(J+1) − D_v·J²(J+1)² [cm⁻¹]. For a Π state the
// constant −B_vΛ² is left in the band origin, as is customary.
func (s State) F(v, j int) float64 {
	x := float64(j) * float64(j+1)
	return s.B(v)*x - s.D(v)*x*x
}

// Term returns the total term value Te + G(v) + F_v(J) [cm⁻¹] above the minimum of X.
func (s State) Term(v, j int) float64 { return s.Te + s.G(v) + s.F(v, j) }

// BandOrigin returns ν₀(v′,v″) = Te′ + G′(v′) − Te″ − G″(v″) [cm⁻¹] of the band upper → lower.
func BandOrigin(upper State, vu int, lower State, vl int) float64 {
	return upper.Te + upper.G(vu) - lower.Te - lower.G(vl)
}
