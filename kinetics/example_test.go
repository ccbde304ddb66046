package kinetics_test

import (
	"fmt"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// One shot of the built-in example design: a 20 cm atmospheric Blumlein laser.
func ExampleRun() {
	d := design.ExampleDesign()
	r, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
	if err != nil {
		fmt.Println(err)
		return
	}
	s := r.Summary
	fmt.Printf("lases: %v, self-termination: %s\n", s.Lases, s.TerminationCause)
	fmt.Printf("pulse energy between 0.1 and 3 mJ: %v, FWHM between 0.3 and 3 ns: %v\n",
		s.EnergyTotal > 1e-4 && s.EnergyTotal < 3e-3, s.FWHM > 0.3e-9 && s.FWHM < 3e-9)
	// Output:
	// lases: true, self-termination: lower-level bottleneck
	// pulse energy between 0.1 and 3 mJ: true, FWHM between 0.3 and 3 ns: true
}

// A design key changed as on the command line, with a unit.
func ExampleDesign_Set() {
	d := design.ExampleDesign()
	if err := d.Set("gas.pressure", "300 Torr"); err != nil {
		fmt.Println(err)
	}
	fmt.Printf("%.0f Pa\n", d.Gas.Pressure)
	fmt.Println(d.Set("optics.front_reflectivity", "1.5"))
	// Output:
	// 39997 Pa
	// design: optics.front_reflectivity = 1.5: out of range: allowed 0 to 0.999
}
