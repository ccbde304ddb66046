package kinetics

import (
	"fmt"
	"strings"

	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// The model assumes a uniform glow filling the discharge volume. A pulsed discharge at high
// pressure stays uniform only within limits: enough preionisation for the first avalanches to
// overlap, an ionisation degree below the onset of stepwise (and electron–electron)
// ionisation instability, an energy per molecule below what constricts the glow, and a
// deposition shorter than the time the glow takes to contract. Outside them the discharge
// contracts into filaments or an arc: less of the gas is pumped and the model's output is an
// upper bound. Only the preionisation limit has a source we could read that states it; for
// the others the abstracts we could read (named below) bracket the range but give no limit
// for a nitrogen glow, so the central values stay estimates, each with the range within which
// a published value would be unsurprising; the central value is the flag.
const (
	// minSeedDensity is the preionisation needed for a uniform start [m⁻³]: ~1e4 cm⁻³ for a
	// typical CO₂ TEA discharge, A. J. Palmer, Appl. Phys. Lett. 25, 138 (1974) (abstract
	// seen); a TEA CO₂ laser "will tend to arc" below ~1e6 cm⁻³ (CLEO 1984, paper TuB7,
	// Optical Society of America abstract, seen); higher for fast-rising or strongly attaching
	// mixtures (up to ~1e8 cm⁻³, from memory of later work on rare-gas halide discharges).
	minSeedDensity = 1e10
	// maxIonisationDegree is the n_e/N above which the glow is taken as unstable to stepwise
	// ionisation: estimate 3e-4, range 1e-4–1e-3 (from memory: electron–electron collisions
	// begin to shape the energy distribution near n_e/N ~ 1e-4, and ionisation out of excited
	// states makes the growth explosive towards 1e-3). No readable source states the limit.
	// Readable bounds: a self-sustained volume discharge in N₂ at 9.3 atm ran stably with
	// n_e = 4e12 cm⁻³ (n_e/N ≈ 2e-8 at 300 K) and negligible stepwise ionisation
	// (Apollonov et al., Atmos. Oceanic Opt. 1(11), 15 (1988), abstract seen); a nanosecond
	// spark channel in atmospheric air reached n_e ≈ 7.5e15 cm⁻³ (n_e/N ≈ 3e-4 at room
	// density) after it had contracted (Wang, Patel, Bane & Shashurin, arXiv:2106.09061
	// (2021), abstract seen); the limit lies between the two.
	maxIonisationDegree = 3e-4
	// maxEnergyPerMolecule is the energy per molecule above which the glow is taken as
	// constricting within the pulse [J]: estimate 0.5 eV, range 0.2–1 eV. Readable values:
	// nanosecond volume discharges in atmospheric air reach ~1 J/cm³ ≈ 0.25 eV per molecule
	// before a brighter central channel appears with longer pulses (a summary of that group's
	// work, seen; primary papers not readable); a coaxial N₂ laser pumped by a fast ionisation
	// wave at 5–120 Torr took up to 2.1 J/cm³ in ~10 ns and lased (Quantum Electron.
	// abstract, mathnet.ru qe558, seen), ≥ 3 eV per molecule at any of those pressures: not
	// a uniform glow, but a warning that a nanosecond pulse can carry more than this limit
	// before it contracts.
	maxEnergyPerMolecule = 0.5 * units.ElectronVolt
	// constrictionTime1atm is the time a pulsed glow in N₂ at one atmosphere takes to
	// contract [s], scaled as 1/N to other densities: estimate 100 ns, range 30–300 ns. No
	// readable source gives it for a preionised N₂ glow. Readable bounds: without
	// preionisation, between pins in atmospheric air, a cathode spot and arc followed
	// breakdown by 30–70 ns (Wang, Patel, Bane & Shashurin, arXiv:2106.09061 (2021),
	// abstract seen: the short end); an electron-beam-sustained KrF laser discharge became
	// unstable after 0.1–1 µs, sooner at higher E/N (Scilit abstract "Instability onset in
	// electron-beam-sustained KrF* laser discharges", seen: the long end).
	constrictionTime1atm = 100e-9
)

// RegimeCheck is one limit of the uniform-glow regime and where a shot sits against it.
type RegimeCheck struct {
	Name    string  `json:"name"`    // what is compared
	Value   float64 `json:"value"`   // the shot's value (SI)
	Limit   float64 `json:"limit"`   // the limit (SI)
	Low     float64 `json:"low"`     // the limit's plausible range (SI)
	High    float64 `json:"high"`    //
	Unit    string  `json:"unit"`    // SI unit of Value and Limit
	Source  string  `json:"source"`  // where the limit comes from
	Outside bool    `json:"outside"` // the shot is past the limit
}

// regimeChecks compares the shot with the limits of a uniform glow.
func regimeChecks(d *design.Design, p *Parameters, wf *waveforms, s *Summary) []RegimeCheck {
	atm := units.GasDensity(101325, 300)
	tc := constrictionTime1atm * atm / p.GasDensity
	checks := []RegimeCheck{
		{Name: "preionisation", Value: d.Discharge.SeedDensity, Limit: minSeedDensity, Low: 1e10, High: 1e14, Unit: "m⁻³",
			Source: "Palmer, Appl. Phys. Lett. 25, 138 (1974)", Outside: d.Discharge.SeedDensity < minSeedDensity},
		{Name: "ionisation degree n_e/N", Value: s.PeakElectronDensity / p.GasDensity, Limit: maxIonisationDegree, Low: 1e-4, High: 1e-3,
			Source: "estimate, no readable source"},
		{Name: "energy per molecule", Value: s.EnergyPerMolecule * units.ElectronVolt, Limit: maxEnergyPerMolecule,
			Low: 0.2 * units.ElectronVolt, High: 1 * units.ElectronVolt, Unit: "J", Source: "estimate, no readable source"},
		{Name: "energy deposition time (10–90 %)", Value: depositionTime(wf, p.TimeStep), Limit: tc, Low: 0.3 * tc, High: 3 * tc, Unit: "s",
			Source: "estimate, no readable source"},
	}
	for i := range checks[1:] {
		c := &checks[i+1]
		c.Outside = c.Value > c.Limit
	}
	return checks
}

// depositionTime is the time over which the plasma energy goes from 10 % to 90 % of its
// total [s], from the sampled plasma power; zero when nothing was deposited.
func depositionTime(wf *waveforms, dt float64) float64 {
	if !(wf.plasmaSampled > 0) {
		return 0
	}
	var sum, t10, t90 float64
	lo, hi := 0.1*wf.plasmaSampled, 0.9*wf.plasmaSampled
	for k, pw := range wf.plasmaPower {
		prev := sum
		sum += pw * dt
		if prev < lo && sum >= lo {
			t10 = (float64(k) + (lo-prev)/(sum-prev)) * dt
		}
		if prev < hi && sum >= hi {
			t90 = (float64(k) + (hi-prev)/(sum-prev)) * dt
			break
		}
	}
	return t90 - t10
}

// regimeNote returns "" when every check is within its limit, else the clause that the
// verdict appends, naming the limits passed.
func regimeNote(checks []RegimeCheck) string {
	var out []string
	for _, c := range checks {
		switch {
		case c.Outside && c.Value < c.Limit:
			out = append(out, fmt.Sprintf("%s %.3g× below the limit", c.Name, c.Limit/c.Value))
		case c.Outside:
			out = append(out, fmt.Sprintf("%s %.3g× the limit", c.Name, c.Value/c.Limit))
		}
	}
	if len(out) == 0 {
		return ""
	}
	return "outside the uniform-glow regime (" + strings.Join(out, ", ") + "): the prediction is an upper bound"
}
