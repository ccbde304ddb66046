package spectro

import (
	"fmt"
	"math"
	"sort"
	"sync"

	"n2pulse/data"
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
	modelOnce sync.Once
	modelErr  error
	model     struct {
		m     *Model
		lines []Line // (0,0) lines to gainJmax
	}
)

// defaultModel returns the model of the embedded constants on DefaultGrid, built once. Solving
// the three radial problems is the costly part of the package (tens of milliseconds), so the
// laser path (Laser) does not call it unless the shipped vibronic table is stale.
func defaultModel() (*Model, error) {
	modelOnce.Do(func() {
		c, err := Default()
		if err != nil {
			modelErr = err
			return
		}
		m, err := NewModel(c, DefaultGrid, RKRCurve)
		if err != nil {
			modelErr = err
			return
		}
		if model.lines, modelErr = m.Lines(0, 0, gainJmax); modelErr != nil {
			return
		}
		model.m = m
	})
	return model.m, modelErr
}

// DefaultModel returns the model of the embedded constants on DefaultGrid (built once and
// shared; do not modify it).
func DefaultModel() (*Model, error) { return defaultModel() }

// laserTables is what Laser needs besides p and T.
type laserTables struct {
	c     *Constants
	vib   vibronic
	lines []Line // (0,0) lines to gainJmax
}

var (
	laserOnce sync.Once
	laserErr  error
	laser     laserTables
)

// laserData loads the laser tables once (loadLaser).
func laserData() error {
	laserOnce.Do(func() { laser, laserErr = loadLaser() })
	return laserErr
}

// loadLaser reads the embedded constants, takes the wave-function quantities of the (0,0) band
// from the shipped table data/n2-vibronic.csv (or, if that table was made from other constants
// or another grid, from a fresh model) and lists the band's lines.
func loadLaser() (laserTables, error) {
	text := data.Spectroscopy()
	c, err := ParseConstants(text)
	if err != nil {
		return laserTables{}, err
	}
	vib, err := parseVibronic(data.Vibronic())
	if err != nil {
		return laserTables{}, err
	}
	if want := vibronicRecipe(text, DefaultGrid, RKRCurve); vib.recipe != want {
		m, err := defaultModel()
		if err != nil {
			return laserTables{}, err
		}
		if vib, err = computeVibronic(m, want); err != nil {
			return laserTables{}, err
		}
	}
	lines, err := bandLines(c, vib.a00, 0, 0, gainJmax)
	if err != nil {
		return laserTables{}, err
	}
	return laserTables{c: c, vib: vib, lines: lines}, nil
}

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
	if m == model.m && m != nil && vu == 0 && vl == 0 {
		lines = model.lines
	} else {
		var err error
		if lines, err = m.Lines(vu, vl, gainJmax); err != nil {
			return nil, err
		}
	}
	return m.gainLines(lines, vu, vl, p, T), nil
}

func (m *Model) gainLines(lines []Line, vu, vl int, p, T float64) []GainLine {
	gc := newGainContext(m.Constants, vu, vl, p, T)
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

func newGainContext(c *Constants, vu, vl int, p, T float64) gainContext {
	up, lo := c.States["C"], c.States["B"]
	return gainContext{
		sC:   RotationalShares(up, vu, T, gainJmax+1),
		sB:   RotationalShares(lo, vl, T, gainJmax+1),
		spin: float64(up.Multiplicity),
		fL:   c.CollisionFWHM(p, T),
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
// depend on p and T is computed once; the wave-function quantities (band A, lifetime, excitation
// shares) come from the shipped table data/n2-vibronic.csv, which TestShippedVibronic keeps equal
// bit for bit to a fresh solve.
func Laser(pressure, temperature float64) (LaserParameters, error) {
	if err := checkConditions(pressure, temperature); err != nil {
		return LaserParameters{}, err
	}
	if err := laserData(); err != nil {
		return LaserParameters{}, err
	}
	best := strongest(laser.c, laser.lines, pressure, temperature)
	return LaserParameters{
		VacuumWavelength: best.VacuumWavelength,
		AirWavelength:    best.AirWavelength,
		PhotonEnergy:     units.Planck * units.SpeedOfLight / best.VacuumWavelength,
		CrossSection:     best.Effective,
		DegeneracyRatio:  best.EffectiveRatio,
		EinsteinA00:      laser.vib.a00,
		UpperLifetime:    laser.vib.tau,
		UpperShare:       laser.vib.fC,
		UpperShare1:      laser.vib.fC1,
		LowerShare:       laser.vib.fB,
		UpperEnergy:      (laser.c.States["C"].Term(0, 0) - laser.c.States["X"].Term(0, 0)) * units.Wavenumber,
		LineWidth:        best.FWHM,
	}, nil
}

// strongest returns the line of largest effective cross section among lines (the (0,0) band of
// constants c) without building and sorting the whole table: the effective cross section is ranked on A·s_C(J′), which orders the
// lines as σ_eff does up to the 1e−4 spread of λ² and the Doppler width across the band, and
// the leading candidates are then compared exactly.
func strongest(c *Constants, lines []Line, p, T float64) GainLine {
	gc := newGainContext(c, 0, 0, p, T)
	var best GainLine
	for _, l := range lines {
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
