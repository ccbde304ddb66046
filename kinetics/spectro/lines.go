package spectro

import (
	"fmt"
	"sort"
)

// Branch is the rotational branch of a line: ΔJ = J′ − J″ = −1 (P), 0 (Q), +1 (R).
type Branch int

const (
	P Branch = iota - 1 // P: J′ = J″ − 1
	Q                   // Q: J′ = J″
	R                   // R: J′ = J″ + 1
)

// String returns "P", "Q" or "R".
func (b Branch) String() string {
	switch b {
	case P:
		return "P"
	case Q:
		return "Q"
	case R:
		return "R"
	}
	return fmt.Sprintf("Branch(%d)", int(b))
}

// Line is one rotational line of a C(v′) → B(v″) band in the ¹Π–¹Π approximation (see the
// package doc): J is the rotational quantum number without the spin.
type Line struct {
	Branch           Branch
	JUpper, JLower   int
	Wavenumber       float64 // [cm⁻¹]
	VacuumWavelength float64 // [m]
	AirWavelength    float64 // [m]
	HonlLondon       float64 // Hönl–London factor S(J′,J″), Σ_J″ S = 2J′+1
	A                float64 // line emission rate A_band·S/(2J′+1) [s⁻¹]
}

// HonlLondon returns the Hönl–London factor of a ΔΛ = 0 transition between levels with
// projection lambda (≥ 1) for the branch b and lower-level J″, in the form given by G. Herzberg,
// Spectra of Diatomic Molecules (1950), chapter V (from memory; checked by the sum rule in the
// tests):
// S_R = (J″+1+Λ)(J″+1−Λ)/(J″+1), S_Q = (2J″+1)Λ²/(J″(J″+1)), S_P = (J″+Λ)(J″−Λ)/J″.
// It returns 0 where the line does not exist (J′ or J″ < Λ).
func HonlLondon(b Branch, jLower, lambda int) float64 {
	j, l := float64(jLower), float64(lambda)
	ju := jLower + int(b)
	if jLower < lambda || ju < lambda {
		return 0
	}
	switch b {
	case R:
		return (j + 1 + l) * (j + 1 - l) / (j + 1)
	case Q:
		return (2*j + 1) * l * l / (j * (j + 1))
	case P:
		return (j + l) * (j - l) / j
	}
	return 0
}

// Lines returns the P, Q and R lines of the C(vu) → B(vl) band with J″ ≤ jmax, in order of
// increasing wavenumber.
func (m *Model) Lines(vu, vl, jmax int) ([]Line, error) {
	if jmax < 1 || jmax > 400 {
		return nil, fmt.Errorf("spectro: jmax = %d, want 1…400", jmax)
	}
	aBand, err := m.EinsteinA(vu, vl)
	if err != nil {
		return nil, err
	}
	return bandLines(m.Constants, aBand, vu, vl, jmax)
}

// bandLines returns the P, Q and R lines of the C(vu) → B(vl) band of constants c with J″ ≤ jmax
// and band emission rate aBand [s⁻¹], in order of increasing wavenumber.
func bandLines(c *Constants, aBand float64, vu, vl, jmax int) ([]Line, error) {
	up, lo := c.States["C"], c.States["B"]
	nu0 := BandOrigin(up, vu, lo, vl)
	var out []Line
	for _, b := range []Branch{P, Q, R} {
		for jl := 1; jl <= jmax; jl++ {
			s := HonlLondon(b, jl, up.Lambda)
			if s == 0 {
				continue
			}
			ju := jl + int(b)
			nu := nu0 + up.F(vu, ju) - lo.F(vl, jl)
			vac := wavenumberToVacuum(nu)
			air, err := VacuumToAir(vac)
			if err != nil {
				return nil, err
			}
			out = append(out, Line{Branch: b, JUpper: ju, JLower: jl, Wavenumber: nu,
				VacuumWavelength: vac, AirWavelength: air, HonlLondon: s,
				A: aBand * s / float64(2*ju+1)})
		}
	}
	sortLines(out)
	return out, nil
}

func sortLines(ls []Line) {
	sort.SliceStable(ls, func(i, j int) bool { return ls[i].Wavenumber < ls[j].Wavenumber })
}

// Head returns the band head of C(vu) → B(vl): the line of lowest wavenumber (the band is
// degraded to the violet because B′ > B″, so the P branch turns back at J″ ≈ (B′+B″)/(2(B′−B″))).
func (m *Model) Head(vu, vl int) (Line, error) {
	ls, err := m.Lines(vu, vl, 60)
	if err != nil {
		return Line{}, err
	}
	return ls[0], nil
}
