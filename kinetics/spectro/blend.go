package spectro

import (
	"math"

	"n2pulse/units"
)

// GainPeak is the maximum of the small-signal gain spectrum of a band per molecule of the upper
// vibrational level, with overlapping rotational lines summed. Near the head of the (0,0) band
// the P lines J″ ≈ 6…11 lie 3–5 GHz apart, comparable with their widths, so at that frequency
// several lines add: this is the multi-line counterpart of the single-line values of Laser.
type GainPeak struct {
	VacuumWavelength float64 // frequency of the peak, as a vacuum wavelength [m]
	AirWavelength    float64 // same, in standard air [m]
	// CrossSection is Σ_l σ_l(ν)·s_C,l at the peak [m²]: the gain is
	// CrossSection·(N_v′ − DegeneracyRatio·N_v″).
	CrossSection float64
	// DegeneracyRatio is Σ_l σ_l(ν)(g_u/g_l)_l s_B,l / Σ_l σ_l(ν) s_C,l.
	DegeneracyRatio float64
	// Lines counts the lines that give at least 10 % of the peak.
	Lines int
	// Enhancement is CrossSection over the strongest single line's effective cross section.
	Enhancement float64
}

// GainPeak returns the peak of the small-signal gain spectrum of C(vu) → B(vl) at pressure p
// [Pa] and temperature T [K]. The peak is sought around the centres of the 15 strongest lines,
// on a scan of ±1 line width refined by a parabola through the best three points.
func (m *Model) GainPeak(vu, vl int, p, T float64) (GainPeak, error) {
	gl, err := m.GainLines(vu, vl, p, T)
	if err != nil {
		return GainPeak{}, err
	}
	nu := make([]float64, len(gl))
	for i, g := range gl {
		nu[i] = units.SpeedOfLight / g.VacuumWavelength
	}
	width := gl[0].FWHM
	// contributions at frequency f: Σ σ_l(f) s_C and Σ σ_l(f) r_l s_B
	eval := func(f float64) (up, lo float64) {
		for i, g := range gl {
			d := f - nu[i]
			if math.Abs(d) > 40*width {
				continue
			}
			lam := g.VacuumWavelength
			s := lam * lam / (8 * math.Pi) * g.A * Voigt(d, g.DopplerFWHM, g.CollisionFWHM)
			up += s * g.UpperShare
			lo += s * g.LineRatio * g.LowerShare
		}
		return up, lo
	}
	bestF, bestUp := nu[0], 0.0
	const scan = 40
	for c := 0; c < min(15, len(gl)); c++ {
		h := 2 * width / scan
		var vals [scan + 1]float64
		top := 0
		for k := 0; k <= scan; k++ {
			f := nu[c] - width + float64(k)*h
			vals[k], _ = eval(f)
			if vals[k] > vals[top] {
				top = k
			}
		}
		f := nu[c] - width + float64(top)*h
		if top > 0 && top < scan { // parabolic refinement
			a, b, cc := vals[top-1], vals[top], vals[top+1]
			if den := a - 2*b + cc; den < 0 {
				f += 0.5 * h * (a - cc) / den
			}
		}
		if up, _ := eval(f); up > bestUp {
			bestF, bestUp = f, up
		}
	}
	up, lo := eval(bestF)
	n := 0
	for i, g := range gl {
		lam := g.VacuumWavelength
		s := lam * lam / (8 * math.Pi) * g.A * Voigt(bestF-nu[i], g.DopplerFWHM, g.CollisionFWHM) * g.UpperShare
		if s >= 0.1*up {
			n++
		}
	}
	vac := units.SpeedOfLight / bestF
	air, err := VacuumToAir(vac)
	if err != nil {
		return GainPeak{}, err
	}
	return GainPeak{VacuumWavelength: vac, AirWavelength: air, CrossSection: up,
		DegeneracyRatio: lo / up, Lines: n, Enhancement: up / gl[0].Effective}, nil
}
