package build_test

import (
	"fmt"

	"n2pulse/kinetics/build"
)

// A capacitor of 15 cm × 25 cm plates on 1.6 mm of FR-4, as a plate line.
func ExamplePlates() {
	p := build.Plates{Length: 0.15, Width: 0.25, Thickness: 1.6e-3, Permittivity: 4.5}
	fmt.Printf("C = %.0f pF (%.0f pF with Palmer's edges)\n", p.Capacitance(build.NoFringe)*1e12, p.Capacitance(build.Palmer)*1e12)
	fmt.Printf("Z0 = %.3f ohm, transit %.3f ns, loop %.0f pH\n", p.Impedance(), p.TransitTime()*1e9, p.LoopInductance()*1e12)
	// Output:
	// C = 934 pF (973 pF with Palmer's edges)
	// Z0 = 1.137 ohm, transit 1.061 ns, loop 402 pH
}

// Static breakdown of a 2 mm nitrogen gap at one atmosphere, and the Paschen minimum.
func ExampleTownsend_Breakdown() {
	n2, _ := build.Gas("nitrogen")
	v, _ := n2.Breakdown(build.ReducedPD(101325, 2e-3, 300))
	pd, vmin := n2.Minimum()
	fmt.Printf("V_b = %.2f kV; minimum %.0f V at %.2f Torr cm\n", v/1e3, vmin, pd/(101325.0/760*0.01))
	// Output:
	// V_b = 7.86 kV; minimum 216 V at 0.63 Torr cm
}

// Derive a Blumlein from its plates and rate it.
func ExampleEvaluate() {
	s := build.Spec{
		SwitchPlateLength: 0.15, SwitchPlateWidth: 0.25, ChannelPlateLength: 0.15, ChannelPlateWidth: 0.25,
		Dielectric: "fr4", DielectricThickness: 1.6e-3, RailHeight: 5e-3,
	}
	c := build.Conditions{ChargeVoltage: 12e3, ChannelLength: 0.25, ChannelGap: 2e-3, Pressure: 101325,
		Temperature: 300, Nitrogen: 1, Shunt: true, UpperLifetime: 3.7e-9}
	b, err := build.Evaluate(s, c)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("C1 = %.0f pF, L_s = %.0f pH, L_c = %.0f pH\n", b.SwitchCapacitance*1e12, b.SwitchInductance*1e12, b.ChannelInductance*1e12)
	fmt.Printf("dielectric margin %.2f, channel overvoltage %.2f\n", b.DielectricMargin, b.Overvoltage)
	// Output:
	// C1 = 934 pF, L_s = 402 pH, L_c = 452 pH
	// dielectric margin 2.67, channel overvoltage 3.05
}
