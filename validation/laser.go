package validation

import (
	"fmt"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// Checks of whole shots of the built-in example design against the behaviour of the trade and
// against the model's own conservation laws.
func init() {
	Register("laser", laserChecks)
}

func runExample(sets map[string]string) (kinetics.Summary, error) {
	d := design.ExampleDesign()
	for k, v := range sets {
		if err := d.Set(k, v); err != nil {
			return kinetics.Summary{}, err
		}
	}
	r, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
	if err != nil {
		return kinetics.Summary{}, err
	}
	return r.Summary, nil
}

func laserChecks() ([]Check, error) {
	base, err := runExample(nil)
	if err != nil {
		return nil, err
	}
	trade := "common practice, no source: atmospheric nitrogen lasers give sub-ns to few-ns pulses at about 0.1 % of the stored energy"
	checks := []Check{
		{ID: "laser.example.fwhm", Quantity: "FWHM of the example atmospheric design", Unit: "s",
			Computed: base.FWHM, Reference: 1e-9, Low: 0.3e-9, High: 3e-9, Mode: Range, Kind: CommonPractice, Source: trade},
		{ID: "laser.example.efficiency", Quantity: "efficiency (pulse energy / stored energy) of the example", Unit: "",
			Computed: base.Efficiency, Reference: 1e-3, Low: 1e-4, High: 1e-2, Mode: Range, Kind: CommonPractice, Source: trade},
		{ID: "laser.example.energy_balance", Quantity: "circuit energy-balance residual / stored energy", Unit: "",
			Computed: base.EnergyBalanceResidual, Reference: 0, Low: 0, High: 1e-4, Mode: Range, Kind: Analytic,
			Source: "conservation of energy (the issue's tolerance 1e-4)"},
		{ID: "laser.example.photon_balance", Quantity: "photon-balance residual / photons created", Unit: "",
			Computed: base.PhotonBalanceResidual, Reference: 0, Low: 0, High: 1e-3, Mode: Range, Kind: Analytic,
			Source: "conservation of photons (the issue's tolerance 1e-3)"},
		{ID: "laser.example.self_terminates", Quantity: "the inversion of the example ends by the lower-level bottleneck or extraction (1 = yes)",
			Computed: b2f(base.TerminationCause == "lower-level bottleneck" || base.TerminationCause == "extraction by the pulse"),
			Mode:     True, Kind: CommonPractice,
			Source: "common practice, no source: the N₂ laser self-terminates because B(0) outlives C(0) (cause found: " + base.TerminationCause + ")"},
	}

	// Raising the pressure shortens the pulse (at fixed voltage).
	var widths []float64
	for _, p := range []string{"500 Torr", "760 Torr", "1000 Torr"} {
		s, err := runExample(map[string]string{"gas.pressure": p})
		if err != nil {
			return nil, err
		}
		// The trend is one of the pulse's duration: the rms-based width follows it smoothly,
		// where the half-maximum width jumps from spike to spike of an ASE train.
		widths = append(widths, s.RMSWidth)
	}
	checks = append(checks, Check{ID: "laser.trend.pressure_shortens", Unit: "",
		Quantity: fmt.Sprintf("rms-based width falls as pressure rises 500→760→1000 Torr (%.3g, %.3g, %.3g ns)", widths[0]*1e9, widths[1]*1e9, widths[2]*1e9),
		Computed: b2f(widths[0] > widths[1] && widths[1] > widths[2]), Mode: True, Kind: CommonPractice,
		Source: "common practice, no source: collisions grow with pressure — they fill B(0) from the B/W/B′ manifold and quench C(0) — and end the inversion sooner"})

	// Energy rises with channel length and then saturates. The plates of a Blumlein run along
	// the channel, so its capacitors grow with the length: scale both with it.
	var energies []float64
	for _, cm := range []float64{5, 10, 20, 40, 60} {
		c := fmt.Sprintf("%g nF", 4*cm/20)
		s, err := runExample(map[string]string{"channel.length": fmt.Sprintf("%g cm", cm),
			"circuit.switch_capacitance": c, "circuit.channel_capacitance": c})
		if err != nil {
			return nil, err
		}
		energies = append(energies, s.EnergyTotal)
	}
	rising := energies[1] > energies[0] && energies[2] > energies[1]
	gainShort := energies[2] / energies[1]
	gainLong := energies[4] / energies[3]
	checks = append(checks, Check{ID: "laser.trend.length_saturates", Unit: "",
		Quantity: fmt.Sprintf("energy rises with length (capacitors ∝ length) and the relative gain from more length falls (10→20 cm ×%.3g, 40→60 cm ×%.3g)", gainShort, gainLong),
		Computed: b2f(rising && gainLong < gainShort), Mode: True, Kind: CommonPractice,
		Source: "common practice, no source: past the length light travels during the gain, or once the larger capacitors slow the current rise (the switch inductance stays), more channel buys little"})
	return checks, nil
}

func b2f(b bool) float64 {
	if b {
		return 1
	}
	return 0
}
