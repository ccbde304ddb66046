package spectro_test

import (
	"fmt"

	"n2pulse/kinetics/spectro"
)

// The head of the (0,0) band of the second positive system, in standard air.
func ExampleModel_Head() {
	m, err := spectro.DefaultModel()
	if err != nil {
		fmt.Println(err)
		return
	}
	h, err := m.Head(0, 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("(0,0) head %.2f nm (air), %v(%d)\n", h.AirWavelength*1e9, h.Branch, h.JLower)
	// Output: (0,0) head 337.11 nm (air), P(9)
}

// Spectroscopic inputs of the laser model at 1 atm and 300 K.
func ExampleLaser() {
	lp, err := spectro.Laser(101325, 300)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("λ_air %.3f nm, σ_eff %.2g m², g_C/g_B %.2f, τ_C %.1f ns\n",
		lp.AirWavelength*1e9, lp.CrossSection, lp.DegeneracyRatio, lp.UpperLifetime*1e9)
	// Output: λ_air 337.109 nm, σ_eff 1.4e-19 m², g_C/g_B 0.83, τ_C 39.9 ns
}
