package validation

import (
	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/spectro"
	"n2pulse/kinetics/swarm"
)

func init() {
	Register("fluorescence", fluorescenceChecks)
}

// srcAirfly is the source of the measured air-fluorescence parameters.
const srcAirfly = "AIRFLY: M. Ave et al., Astropart. Phys. 28, 41 (2007) (quenching pressures) and later AIRFLY papers (band intensities relative to 337 nm in dry air at 800 hPa, 293 K), as transcribed with that citation in a public air-shower code's fluorescence_model.toml (seen)"

// Measured values (AIRFLY, dry air, 293 K): quenching pressures p′ [hPa] of the bands from
// C(v=0) and their intensities relative to the 337 nm band at the reference pressure.
const (
	airflyTemperature = 293.0 // K
	airflyPressure    = 800e2 // Pa, the reference pressure of the relative intensities
	airflyP337        = 15.89 // hPa
	airflyP316        = 11.9  // hPa, the (1,0) band at 316 nm, from C(v=1)
	airflyI358        = 0.6741
	airflyI381        = 0.2720
)

// knownMoment explains the shortfall of the computed band ratios.
const knownMoment = "known limitation: package spectro takes the C→B electronic transition moment constant; the r-centroid falls from 1.184 Å (0,0) to 1.147 (0,1) and 1.114 (0,2), and a moment that grows toward small r (as the measured ratios imply) would raise these ratios"

// fluorescenceChecks compare the Stern–Volmer constants and the Einstein coefficients of the
// C(0) → B(v″) bands with the measured fluorescence of dry air.
func fluorescenceChecks() ([]Check, error) {
	// Quenching pressure: p′ = p/(τ_C/τ_eff − 1) with τ_eff the design's Stern–Volmer lifetime
	// in dry air at p, T and τ_C the radiative lifetime of package spectro (as the design
	// takes it when spectroscopy.upper_lifetime is not set).
	d := design.ExampleDesign()
	d.Gas.Pressure, d.Gas.Temperature = airflyPressure, airflyTemperature
	d.Gas.Nitrogen, d.Gas.Oxygen, d.Gas.Helium = swarm.AirNitrogen, swarm.AirOxygen, 0
	lp, err := spectro.Laser(d.Gas.Pressure, d.Gas.Temperature)
	c := Check{ID: "fluorescence.quenching_pressure.337nm", Quantity: "quenching pressure p′ of the 337 nm band (C(0)) in dry air at 293 K",
		Unit: "hPa", Reference: airflyP337, Tolerance: 0.10, Mode: Relative, Kind: Published, Source: srcAirfly, Err: err}
	if err == nil {
		tauEff := kinetics.EffectiveUpperLifetime(d)
		c.Computed = d.Gas.Pressure / (lp.UpperLifetime/tauEff - 1) / 100
	}
	cs := []Check{c}

	// The (1,0) band at 316 nm comes from C(v=1): its quenching pressure tests the sum of
	// the C(v=1) constants (relaxation into C(0) plus quenching by N₂, and O₂ taken at C(0)'s
	// constant), not how the N₂ part splits between the two.
	c1 := Check{ID: "fluorescence.quenching_pressure.316nm", Quantity: "quenching pressure p′ of the 316 nm band (C(v=1)) in dry air at 293 K",
		Unit: "hPa", Reference: airflyP316, Tolerance: 0.10, Mode: Relative, Kind: Published, Source: srcAirfly, Err: err}
	if err == nil {
		tauEff := kinetics.EffectiveUpperV1Lifetime(d)
		c1.Computed = d.Gas.Pressure / (lp.UpperLifetime/tauEff - 1) / 100
	}
	cs = append(cs, c1)

	// Band ratios: photons of C(0) → B(v″) relative to C(0) → B(0) are A(0,v″)/A(0,0), the same
	// at every pressure for bands of one upper level. The measured ratios are at 800 hPa, where
	// AIRFLY's slightly different p′ per band (358: 15.39 hPa, 381: 16.51 hPa against 15.89)
	// move them by −3 % and +4 % from the zero-pressure ratio; the tolerance (10 %) covers that.
	m, err := spectro.DefaultModel()
	if err != nil {
		return nil, err
	}
	a00, err := m.EinsteinA(0, 0)
	if err != nil {
		return nil, err
	}
	for _, b := range []struct {
		vl  int
		nm  string
		ref float64
	}{{1, "358", airflyI358}, {2, "381", airflyI381}} {
		a, err := m.EinsteinA(0, b.vl)
		cs = append(cs, Check{Known: knownMoment, ID: "fluorescence.band_ratio." + b.nm + "_337", Quantity: b.nm + " nm / 337 nm photon ratio, C(0)→B(" + itoa(b.vl) + ") over C(0)→B(0)",
			Unit: "", Computed: a / a00, Reference: b.ref, Tolerance: 0.10, Mode: Relative, Kind: Published,
			Source: srcAirfly + "; computed with a constant electronic transition moment (package spectro)", Err: err})
	}
	return cs, nil
}
