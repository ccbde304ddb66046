package spectro

import (
	"fmt"
	"math"
	"sort"
	"sync"

	"n2pulse/units"
)

// LaserParameters are the spectroscopic inputs of the rate equations for the (0,0) band at
// one pressure and temperature.
type LaserParameters struct {
	VacuumWavelength float64 // strongest lasing line [m]
	AirWavelength    float64 // same, in standard air [m]
	PhotonEnergy     float64 // [J]
	CrossSection     float64 // effective σ for the total v=0 populations: line cross section × rotational share of the upper level [m²] (DESIGN.md §2.4)
	DegeneracyRatio  float64 // effective g_C/g_B for the total v=0 populations (per-line degeneracy and rotational shares folded in)
	EinsteinA00      float64 // A(0,0) [s⁻¹]
	UpperLifetime    float64 // radiative lifetime of C(v=0) [s]
	UpperShare       float64 // f_C: fraction of C excitation landing in v=0
	LowerShare       float64 // f_B: fraction of B excitation landing in v=0
	UpperShare1      float64 // fraction of C excitation landing in v=1
	UpperEnergy      float64 // energy of C(v=0, J=0) above X(v=0, J=0) [J]
	LineWidth        float64 // FWHM of the line profile at p, T [Hz]
}

// GainLine is one rotational line of a band with its gain properties at a pressure and
// temperature.
type GainLine struct {
	Line
	DopplerFWHM   float64 // [Hz]
	CollisionFWHM float64 // [Hz]
	FWHM          float64 // Voigt FWHM [Hz]
	PeakSigma     float64 // peak stimulated-emission cross section of the line, λ²A·V(0)/(8π) [m²]
	UpperShare    float64 // share of the v′ population in the line's upper level (one spin component)
	LowerShare    float64 // share of the v″ population in the line's lower level (one spin component)
	// Effective is PeakSigma × UpperShare: the cross section that multiplies the total v′
	// population [m²].
	Effective float64
	// LineRatio is the per-line degeneracy ratio g_u/g_l = (2J′+1)/(2J″+1).
	LineRatio float64
	// EffectiveRatio is LineRatio × LowerShare/UpperShare: gain = Effective·(N_v′ − EffectiveRatio·N_v″).
	EffectiveRatio float64
}

// Limits of the pressure [Pa] and temperature [K] that Laser and GainLines accept.
const (
	MinPressure    = 1e-3
	MaxPressure    = 1e7
	MinTemperature = 20.0
	MaxTemperature = 3000.0
)

// gainJmax is the highest J″ kept in the gain tables: at 3000 K the rotational share of
// J = 150 in C(0) is below 1e−8.
const gainJmax = 150

var (
	cacheOnce sync.Once
	cacheErr  error
	cache     struct {
		model    *Model
		lines    []Line // (0,0) lines
		a00, tau float64
		fC, fB   float64
		fC1      float64
	}
)

// defaultModel returns the model of the embedded constants on DefaultGrid, built once.
func defaultModel() (*Model, error) {
	cacheOnce.Do(func() {
		c, err := Default()
		if err != nil {
			cacheErr = err
			return
		}
		m, err := NewModel(c, DefaultGrid, RKRCurve)
		if err != nil {
			cacheErr = err
			return
		}
		cache.model = m
		if cache.lines, cacheErr = m.Lines(0, 0, gainJmax); cacheErr != nil {
			return
		}
		if cache.a00, cacheErr = m.EinsteinA(0, 0); cacheErr != nil {
			return
		}
		if cache.tau, cacheErr = m.Lifetime(0); cacheErr != nil {
			return
		}
		if cache.fC, cacheErr = m.ExcitationShare("C", 0); cacheErr != nil {
			return
		}
		if cache.fC1, cacheErr = m.ExcitationShare("C", 1); cacheErr != nil {
			return
		}
		cache.fB, cacheErr = m.ExcitationShare("B", 0)
	})
	return cache.model, cacheErr
}

// DefaultModel returns the model of the embedded constants on DefaultGrid (built once and
// shared; do not modify it).
func DefaultModel() (*Model, error) { return defaultModel() }

func checkConditions(p, T float64) error {
	if !(p >= MinPressure && p <= MaxPressure) {
		return fmt.Errorf("spectro: pressure %g Pa outside %g…%g Pa", p, MinPressure, MaxPressure)
	}
	if !(T >= MinTemperature && T <= MaxTemperature) {
		return fmt.Errorf("spectro: temperature %g K outside %g…%g K", T, MinTemperature, MaxTemperature)
	}
	return nil
}

// GainLines returns the lines of C(vu) → B(vl) with their cross sections and shares at pressure
// p [Pa] and temperature T [K], strongest effective cross section first.
func (m *Model) GainLines(vu, vl int, p, T float64) ([]GainLine, error) {
	if err := checkConditions(p, T); err != nil {
		return nil, err
	}
	var lines []Line
	if m == cache.model && vu == 0 && vl == 0 {
		lines = cache.lines
	} else {
		var err error
		if lines, err = m.Lines(vu, vl, gainJmax); err != nil {
			return nil, err
		}
	}
	return m.gainLines(lines, vu, vl, p, T), nil
}

func (m *Model) gainLines(lines []Line, vu, vl int, p, T float64) []GainLine {
	gc := m.newGainContext(vu, vl, p, T)
	out := make([]GainLine, len(lines))
	for i, l := range lines {
		out[i] = gc.line(l)
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].Effective > out[j].Effective })
	return out
}

// gainContext holds what the lines of one band share at one p and T.
type gainContext struct {
	sC, sB []float64
	spin   float64
	fL, T  float64
}

func (m *Model) newGainContext(vu, vl int, p, T float64) gainContext {
	up, lo := m.Constants.States["C"], m.Constants.States["B"]
	return gainContext{
		sC:   RotationalShares(up, vu, T, gainJmax+1),
		sB:   RotationalShares(lo, vl, T, gainJmax+1),
		spin: float64(up.Multiplicity),
		fL:   m.Constants.CollisionFWHM(p, T),
		T:    T,
	}
}

func (gc gainContext) lineNoWidth(l Line) GainLine {
	nu := units.SpeedOfLight / l.VacuumWavelength
	fD := DopplerFWHM(nu, gc.T, units.NitrogenMass)
	lam := l.VacuumWavelength
	sig := lam * lam / (8 * math.Pi) * l.A * Voigt(0, fD, gc.fL)
	g := GainLine{Line: l, DopplerFWHM: fD, CollisionFWHM: gc.fL, PeakSigma: sig,
		UpperShare: gc.sC[l.JUpper] / gc.spin, LowerShare: gc.sB[l.JLower] / gc.spin,
		LineRatio: float64(2*l.JUpper+1) / float64(2*l.JLower+1)}
	g.Effective = sig * g.UpperShare
	g.EffectiveRatio = g.LineRatio * g.LowerShare / g.UpperShare
	return g
}

func (gc gainContext) line(l Line) GainLine {
	g := gc.lineNoWidth(l)
	g.FWHM = VoigtFWHM(g.DopplerFWHM, g.CollisionFWHM)
	return g
}

// Laser returns the spectroscopic parameters of the (0,0) band at pressure p [Pa] and
// temperature T [K] for the laser model: the line with the largest effective cross section
// (small-signal gain per C(0) molecule) is taken as the lasing line. Everything that does not
// depend on p and T is computed once.
func Laser(pressure, temperature float64) (LaserParameters, error) {
	if err := checkConditions(pressure, temperature); err != nil {
		return LaserParameters{}, err
	}
	m, err := defaultModel()
	if err != nil {
		return LaserParameters{}, err
	}
	best := m.strongest(pressure, temperature)
	return LaserParameters{
		VacuumWavelength: best.VacuumWavelength,
		AirWavelength:    best.AirWavelength,
		PhotonEnergy:     units.Planck * units.SpeedOfLight / best.VacuumWavelength,
		CrossSection:     best.Effective,
		DegeneracyRatio:  best.EffectiveRatio,
		EinsteinA00:      cache.a00,
		UpperLifetime:    cache.tau,
		UpperShare:       cache.fC,
		UpperShare1:      cache.fC1,
		LowerShare:       cache.fB,
		UpperEnergy:      (m.Constants.States["C"].Term(0, 0) - m.Constants.States["X"].Term(0, 0)) * units.Wavenumber,
		LineWidth:        best.FWHM,
	}, nil
}

// strongest returns the (0,0) line of largest effective cross section without building and
// sorting the whole table: the effective cross section is ranked on A·s_C(J′), which orders the
// lines as σ_eff does up to the 1e−4 spread of λ² and the Doppler width across the band, and
// the leading candidates are then compared exactly.
func (m *Model) strongest(p, T float64) GainLine {
	gc := m.newGainContext(0, 0, p, T)
	var best GainLine
	for _, l := range cache.lines {
		if l.Branch == Q { // Q lines carry S ∝ 1/J and never lead
			continue
		}
		// cheap upper bound first: σ_eff ∝ λ²·A·s_C
		if best.Effective > 0 {
			bound := l.VacuumWavelength * l.VacuumWavelength * l.A * gc.sC[l.JUpper]
			ref := best.VacuumWavelength * best.VacuumWavelength * best.A * gc.sC[best.JUpper]
			if bound < 0.99*ref {
				continue
			}
		}
		if g := gc.lineNoWidth(l); g.Effective > best.Effective {
			best = g
		}
	}
	best.FWHM = VoigtFWHM(best.DopplerFWHM, best.CollisionFWHM)
	return best
}
