package swarm_test

import (
	"fmt"

	"n2pulse/kinetics/swarm"
	"n2pulse/units"
)

// One swarm point: electrons in pure N₂ at 100 Td.
func Example() {
	mix, err := swarm.SetMixture(swarm.SetOriginal, 1, 0, 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	s, err := swarm.NewSolver(mix, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := s.Solve(100 * units.Townsend)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("mean energy %.2f eV\n", r.MeanEnergy/units.ElectronVolt)
	fmt.Printf("drift velocity %.3g m/s\n", r.DriftVelocity)
	fmt.Printf("k_C %.2g m³/s\n", r.ExciteC)
	fmt.Printf("power balance within 1e-3: %v\n", r.PowerBalance() < 1e-3 && r.PowerBalance() > -1e-3)
	// Output:
	// mean energy 2.17 eV
	// drift velocity 1.01e+05 m/s
	// k_C 1.4e-17 m³/s
	// power balance within 1e-3: true
}

// The shipped table for air, looked up at 120 Td.
func ExampleBuiltin() {
	t, err := swarm.BuiltinSet("air", swarm.SetOriginal)
	if err != nil {
		fmt.Println(err)
		return
	}
	c := t.At(120 * units.Townsend)
	fmt.Printf("v_d %.3g m/s, α/N %.2g m², η/N %.2g m²\n", c.DriftVelocity, c.AlphaN, c.EtaN)
	// Output:
	// v_d 1.3e+05 m/s, α/N 3.6e-23 m², η/N 3.8e-23 m²
}
