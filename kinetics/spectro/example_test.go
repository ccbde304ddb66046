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

// The Voigt profile of a 337 nm line at 300 K: Doppler FWHM 2.08 GHz with a 3 GHz collision
// width; peak value and full width at half maximum.
func ExampleVoigt() {
	fD := spectro.DopplerFWHM(2.9671e6*299792458, 300, 28.0134*1.66053906660e-27)
	fL := 3e9
	fmt.Printf("Doppler %.3f GHz, peak %.3e 1/Hz, FWHM %.3f GHz\n",
		fD/1e9, spectro.Voigt(0, fD, fL), spectro.VoigtFWHM(fD, fL)/1e9)
	// Output: Doppler 2.085 GHz, peak 1.708e-10 1/Hz, FWHM 4.113 GHz
}
