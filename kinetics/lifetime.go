package kinetics

import (
	"fmt"

	"n2pulse/kinetics/build"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/spectro"
	"n2pulse/units"
)

// upperDecayRate returns the total loss rate of C(0) [s⁻¹] without electrons and stimulated
// emission: the Stern–Volmer form 1/τ_C + Σ k_q,i·N_i, with radiative lifetime tauC [s] and the
// gas g.
func upperDecayRate(l design.Levels, tauC float64, g design.Gas) float64 {
	n := gasDensity(g)
	return 1/tauC + n*(g.Nitrogen*l.UpperQuenchingNitrogen+g.Oxygen*l.UpperQuenchingOxygen+g.Helium*l.UpperQuenchingHelium)
}

// lowerDecayRate returns the total loss rate of B(0) [s⁻¹]: radiative plus collisional removal.
func lowerDecayRate(l design.Levels, g design.Gas) float64 {
	n := gasDensity(g)
	return 1/l.LowerLifetime + n*(g.Nitrogen*l.LowerRemovalNitrogen+g.Oxygen*l.LowerRemovalOxygen)
}

// gasDensity is the total number density of the gas [m⁻³].
func gasDensity(g design.Gas) float64 { return units.GasDensity(g.Pressure, g.Temperature) }

// fallbackUpperLifetime is the radiative lifetime of C(0) used when package spectro cannot
// give one: 40.8 ns, Capitelli et al., Plasma Kinetics in Atmospheric Gases (Springer 2000),
// p. 157, via air-plasma mechanism files (seen, secondary).
const fallbackUpperLifetime = 40.8e-9

// EffectiveUpperLifetime returns the lifetime of C(0) in the design's gas without electrons
// or stimulated emission, 1/(1/τ_C + Σk_q·N) = τ_C/(1 + p/p_q) [s] (Stern–Volmer), with τ_C
// from spectroscopy.upper_lifetime, else package spectro, else 40.8 ns.
func EffectiveUpperLifetime(d *design.Design) float64 {
	return 1 / upperDecayRate(d.Levels, radiativeUpperLifetime(d), d.Gas)
}

// EffectiveUpperV1Lifetime returns the lifetime of C(v=1) in the design's gas without electrons
// [s]: radiation (at τ_C of C(0)), relaxation into C(0) and electronic quenching by N₂, and
// quenching by O₂ and He at C(0)'s constants, as the C(v=1) reservoir of a run takes them.
func EffectiveUpperV1Lifetime(d *design.Design) float64 {
	return 1 / newUpperV1(d.Levels, d.Gas, gasDensity(d.Gas), radiativeUpperLifetime(d), 1e-12).decay
}

// radiativeUpperLifetime is τ_C, the radiative lifetime of C(0) [s]: spectroscopy.upper_lifetime,
// else package spectro at the design's p and T, else 40.8 ns.
func radiativeUpperLifetime(d *design.Design) float64 {
	if tau := d.Spectroscopy.UpperLifetime; tau != 0 {
		return tau
	}
	if lp, err := spectro.Laser(d.Gas.Pressure, d.Gas.Temperature); err == nil && lp.UpperLifetime > 0 {
		return lp.UpperLifetime
	}
	return fallbackUpperLifetime
}

// Bench rates the stresses of the design with package build: channel breakdown, shunt,
// dielectric, switch against the upper-level lifetime. s is the build evaluated with the
// design's circuit values: d.Build for the report of the laser as built, the zero Spec to rate
// the circuit values alone (as the verdict does).
func Bench(d *design.Design, s build.Spec) (*build.Bench, error) {
	cond := d.BenchConditions()
	cond.GapCapacitance = gapCapacitance(d.Channel)
	cond.UpperLifetime = EffectiveUpperLifetime(d)
	b, err := build.Evaluate(s, cond)
	if err != nil {
		if s != (build.Spec{}) {
			return nil, fmt.Errorf("design: [build]: %w", err)
		}
		return nil, fmt.Errorf("design: %w", err)
	}
	return b, nil
}
