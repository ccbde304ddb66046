package design_test

import (
	"fmt"

	"n2pulse/kinetics/design"
)

// A design given as built: the [build] section supplies the circuit values.
func ExampleParseBuiltDesign() {
	text := `
name = "board Blumlein (invented)"
[channel]
length = "25 cm"
gap = "2 mm"
width = "3 mm"
[gas]
pressure = "760 Torr"
[circuit]
topology = "blumlein"
charge_voltage = "12 kV"
shunt_inductance = "1 uH"
[build]
switch_plate_length = "15 cm"
switch_plate_width = "25 cm"
channel_plate_length = "15 cm"
channel_plate_width = "25 cm"
dielectric = "fr4"
dielectric_thickness = "1.6 mm"
rail_height = "5 mm"
`
	b, err := design.ParseBuiltDesign([]byte(text), "board.toml")
	if err != nil {
		fmt.Println(err)
		return
	}
	c := b.Design.Circuit
	fmt.Printf("C1 = C2 = %.0f pF, L_s = %.0f pH, L_c = %.0f pH\n", c.SwitchCapacitance*1e12, c.SwitchInductance*1e12, c.ChannelInductance*1e12)
	fmt.Println("derived:", b.Derived)
	// Output:
	// C1 = C2 = 934 pF, L_s = 402 pH, L_c = 452 pH
	// derived: [circuit.switch_capacitance circuit.channel_capacitance circuit.switch_inductance circuit.channel_inductance]
}
