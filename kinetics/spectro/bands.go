package spectro

import (
	"fmt"
	"math"

	"n2pulse/units"
)

// Band summarises one vibrational band C(v′) → B(v″).
type Band struct {
	VUpper, VLower int
	Origin         float64 // band origin ν₀ [cm⁻¹]
	OriginVacuum   float64 // [m]
	OriginAir      float64 // [m]
	Head           Line    // the head line (lowest wavenumber)
	FranckCondon   float64 // q(v′,v″)
	RCentroid      float64 // r̄(v′,v″) [Å]
	EinsteinA      float64 // A(v′,v″) [s⁻¹]
}

// Band returns the summary of the band C(vu) → B(vl).
func (m *Model) Band(vu, vl int) (Band, error) {
	q, rc, err := m.FranckCondon("C", vu, "B", vl)
	if err != nil {
		return Band{}, err
	}
	a, err := m.EinsteinA(vu, vl)
	if err != nil {
		return Band{}, err
	}
	h, err := m.Head(vu, vl)
	if err != nil {
		return Band{}, err
	}
	nu := BandOrigin(m.Constants.States["C"], vu, m.Constants.States["B"], vl)
	vac := wavenumberToVacuum(nu)
	air, err := VacuumToAir(vac)
	if err != nil {
		return Band{}, err
	}
	return Band{VUpper: vu, VLower: vl, Origin: nu, OriginVacuum: vac, OriginAir: air, Head: h,
		FranckCondon: q, RCentroid: rc, EinsteinA: a}, nil
}

// Bands returns the bands with v′, v″ ≤ vmax, ordered by v′ then v″.
func (m *Model) Bands(vmax int) ([]Band, error) {
	if vmax < 0 || vmax >= levelsPerState {
		return nil, fmt.Errorf("spectro: vmax = %d, want 0…%d", vmax, levelsPerState-1)
	}
	var out []Band
	for vu := 0; vu <= vmax; vu++ {
		for vl := 0; vl <= vmax; vl++ {
			b, err := m.Band(vu, vl)
			if err != nil {
				return nil, err
			}
			out = append(out, b)
		}
	}
	return out, nil
}

// Spectrum is an emission spectrum of one band: sticks at the line positions and the profile
// broadened by the Voigt line shape, both in relative photon emission rate (the profile's
// maximum is 1; sticks are scaled so that the strongest is 1).
type Spectrum struct {
	StickWavelength   []float64 // air wavelength of each line [m]
	StickIntensity    []float64 // relative N(J′)·A_line
	ProfileWavelength []float64 // air wavelength grid [m]
	ProfileIntensity  []float64 // relative broadened emission
}

// EmissionSpectrum returns the spontaneous-emission spectrum of C(vu) → B(vl) with the upper
// level in rotational equilibrium at T [K], broadened at pressure p [Pa], on n points over the
// air-wavelength range [lo, hi] [m].
func (m *Model) EmissionSpectrum(vu, vl int, p, T, lo, hi float64, n int) (Spectrum, error) {
	if err := checkConditions(p, T); err != nil {
		return Spectrum{}, err
	}
	if !(hi > lo && lo > 0) || n < 2 || n > 1_000_000 {
		return Spectrum{}, fmt.Errorf("spectro: spectrum range [%g, %g] m with %d points, want 0 < lo < hi and 2…1e6 points", lo, hi, n)
	}
	gl, err := m.GainLines(vu, vl, p, T)
	if err != nil {
		return Spectrum{}, err
	}
	var s Spectrum
	big := 0.0
	for _, g := range gl {
		w := g.UpperShare * g.A
		if g.AirWavelength < lo || g.AirWavelength > hi || w < 1e-6*big {
			continue
		}
		s.StickWavelength = append(s.StickWavelength, g.AirWavelength)
		s.StickIntensity = append(s.StickIntensity, w)
		big = math.Max(big, w)
	}
	s.ProfileWavelength = make([]float64, n)
	s.ProfileIntensity = make([]float64, n)
	c := units.SpeedOfLight
	fG, fL := 0.0, 0.0
	if len(gl) > 0 {
		fG, fL = gl[0].DopplerFWHM, gl[0].CollisionFWHM
	}
	peak := 0.0
	for i := range n {
		l := lo + (hi-lo)*float64(i)/float64(n-1)
		s.ProfileWavelength[i] = l
		nu := c / l
		sum := 0.0
		for k, lw := range s.StickWavelength {
			sum += s.StickIntensity[k] * Voigt(nu-c/lw, fG, fL)
		}
		s.ProfileIntensity[i] = sum
		peak = math.Max(peak, sum)
	}
	for i := range s.ProfileIntensity {
		if peak > 0 {
			s.ProfileIntensity[i] /= peak
		}
	}
	for i := range s.StickIntensity {
		s.StickIntensity[i] /= big
	}
	return s, nil
}
