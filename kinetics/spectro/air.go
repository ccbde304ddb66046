package spectro

import "fmt"

// Refractive index of standard air (15 °C, 101 325 Pa, dry, 450 ppm CO₂) and vacuum ↔ air
// wavelengths. σ below is the vacuum wavenumber in µm⁻¹.

// AirIndexCiddor returns the refractive index of standard air at the vacuum wavelength
// lambdaVac [m] from P.E. Ciddor, Appl. Opt. 35, 1566 (1996), eq. (1):
// 10⁸(n−1) = k₁/(k₀−σ²) + k₃/(k₂−σ²), k₀ = 238.0185, k₁ = 5 792 105, k₂ = 57.362, k₃ = 167 917 µm⁻².
// The formula holds from 230 nm to 1690 nm.
func AirIndexCiddor(lambdaVac float64) float64 {
	s2 := sq(1e-6 / lambdaVac)
	return 1 + (5792105/(238.0185-s2)+167917/(57.362-s2))*1e-8
}

// AirIndexBirchDowns returns the refractive index of standard air at the vacuum wavelength
// lambdaVac [m] from the Edlén formula as revised by K.P. Birch & M.J. Downs, Metrologia 31, 315
// (1994) (the IAU standard, Morton 2000, ApJS 130, 403):
// n − 1 = 8.34254e−5 + 2.406147e−2/(130 − σ²) + 1.5998e−4/(38.9 − σ²).
func AirIndexBirchDowns(lambdaVac float64) float64 {
	s2 := sq(1e-6 / lambdaVac)
	return 1 + 8.34254e-5 + 2.406147e-2/(130-s2) + 1.5998e-4/(38.9-s2)
}

// minAirWavelength and maxAirWavelength bound the range of the dispersion formulas [m].
const (
	minAirWavelength = 230e-9
	maxAirWavelength = 1690e-9
)

// VacuumToAir returns the wavelength in standard air [m] of light with vacuum wavelength
// lambdaVac [m], λ_air = λ_vac/n(λ_vac), with n from Ciddor (1996).
func VacuumToAir(lambdaVac float64) (float64, error) {
	if !(lambdaVac >= minAirWavelength && lambdaVac <= maxAirWavelength) {
		return 0, fmt.Errorf("spectro: vacuum wavelength %g m outside the dispersion formula's range %g…%g m",
			lambdaVac, minAirWavelength, maxAirWavelength)
	}
	return lambdaVac / AirIndexCiddor(lambdaVac), nil
}

// AirToVacuum inverts VacuumToAir by fixed-point iteration (n varies by 1e−7 over the shift, so
// three passes converge to below 1e−15 relative).
func AirToVacuum(lambdaAir float64) (float64, error) {
	if !(lambdaAir >= minAirWavelength && lambdaAir <= maxAirWavelength) {
		return 0, fmt.Errorf("spectro: air wavelength %g m outside the dispersion formula's range %g…%g m",
			lambdaAir, minAirWavelength, maxAirWavelength)
	}
	v := lambdaAir
	for range 4 {
		v = lambdaAir * AirIndexCiddor(v)
	}
	return v, nil
}

// wavenumberToVacuum converts a wavenumber [cm⁻¹] to a vacuum wavelength [m].
func wavenumberToVacuum(nu float64) float64 { return 1e-2 / nu }

func sq(x float64) float64 { return x * x }
