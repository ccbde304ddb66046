package spectro

import (
	"math"
	"math/cmplx"
	"sync"

	"gonum.org/v1/gonum/dsp/fourier"

	"n2pulse/units"
)

// Line shapes: Doppler (Gaussian), collision (Lorentzian) and their convolution, the Voigt
// profile, through the Faddeeva function w(z) = e^(−z²)·erfc(−iz).

// DopplerFWHM returns the Doppler FWHM Δν_D = (ν₀/c)·√(8 k_B T ln2 / m) [Hz] of a line at
// frequency nu0 [Hz] emitted by molecules of mass m [kg] at temperature T [K].
func DopplerFWHM(nu0, T, m float64) float64 {
	return nu0 / units.SpeedOfLight * math.Sqrt(8*units.Boltzmann*T*math.Ln2/m)
}

// CollisionFWHM returns the collision-broadened (Lorentzian) FWHM [Hz] at pressure p [Pa] and
// temperature T [K]: Δν_L = c·coef·(p/1 atm)·(T_ref/T)^n, with coef [cm⁻¹ atm⁻¹], T_ref and n
// from the constants file.
func (c *Constants) CollisionFWHM(p, T float64) float64 {
	return 100 * units.SpeedOfLight * c.BroadeningFWHM * (p / units.Atmosphere) *
		math.Pow(c.BroadeningTref/T, c.BroadeningExponent)
}

// weidemanN is the number of terms of Weideman's rational expansion; with N = 32 the relative
// error of w(z) in the upper half plane is below 1e−12 for the arguments a Voigt profile
// needs (TestFaddeeva*).
const weidemanN = 32

var (
	weidemanOnce sync.Once
	weidemanA    []float64 // polynomial coefficients, highest power first
	weidemanL    float64
)

// weidemanInit computes the coefficients of J.A.C. Weideman, "Computation of the complex error
// function", SIAM J. Numer. Anal. 31, 1497 (1994): with L = √(N/√2) and Z = (L+iz)/(L−iz),
// w(z) ≈ 2·p(Z)/(L−iz)² + 1/(√π(L−iz)), p a polynomial of degree N−1 whose coefficients are
// the Fourier coefficients of f(t) = e^(−t²)(L²+t²) sampled at t = L·tan(θ/2), θ = kπ/M,
// M = 2N (the paper's eq. (3.8) and its program listing).
func weidemanInit() {
	n := weidemanN
	m := 2 * n
	m2 := 2 * m
	l := math.Sqrt(float64(n) / math.Sqrt2)
	// f on k = −M+1 … M−1, with a 0 prepended: index i ↔ k = i − M.
	f := make([]float64, m2)
	for i := 1; i < m2; i++ {
		k := float64(i - m)
		t := l * math.Tan(k*math.Pi/float64(m)/2)
		f[i] = math.Exp(-t*t) * (l*l + t*t)
	}
	// fftshift: g[i] = f[(i+M) mod 2M]
	g := make([]float64, m2)
	for i := range g {
		g[i] = f[(i+m)%m2]
	}
	coef := fourier.NewFFT(m2).Coefficients(nil, g)
	a := make([]float64, n)
	for j := 1; j <= n; j++ {
		a[n-j] = real(coef[j]) / float64(m2) // flipped: highest power first
	}
	weidemanA, weidemanL = a, l
}

// Faddeeva returns w(z) = e^(−z²)·erfc(−iz) for Im z ≥ 0 by Weideman's method; for Im z < 0
// it uses w(z) = 2e^(−z²) − w(−z).
func Faddeeva(z complex128) complex128 {
	if imag(z) < 0 {
		return 2*cmplx.Exp(-z*z) - Faddeeva(-z)
	}
	weidemanOnce.Do(weidemanInit)
	l := complex(weidemanL, 0)
	iz := complex(-imag(z), real(z))
	den := l - iz
	Z := (l + iz) / den
	var p complex128
	for _, a := range weidemanA {
		p = p*Z + complex(a, 0)
	}
	return 2*p/(den*den) + complex(1/math.Sqrt(math.Pi), 0)/den
}

// Voigt returns the area-normalised Voigt profile [Hz⁻¹] at detuning dnu [Hz] for a Gaussian of
// FWHM fwhmG [Hz] convolved with a Lorentzian of FWHM fwhmL [Hz]:
// V = Re w((Δν + iγ)/(σ√2)) / (σ√(2π)), σ = fwhmG/(2√(2 ln 2)), γ = fwhmL/2.
// With fwhmG = 0 it returns the Lorentzian.
func Voigt(dnu, fwhmG, fwhmL float64) float64 {
	if fwhmG <= 0 {
		g := fwhmL / 2
		return g / math.Pi / (dnu*dnu + g*g)
	}
	s := fwhmG / (2 * math.Sqrt(2*math.Ln2))
	z := complex(dnu, fwhmL/2) / complex(s*math.Sqrt2, 0)
	return real(Faddeeva(z)) / (s * math.Sqrt(2*math.Pi))
}

// VoigtFWHM returns the full width at half maximum [Hz] of the Voigt profile, found by
// bisection on the profile itself.
func VoigtFWHM(fwhmG, fwhmL float64) float64 {
	if fwhmG <= 0 {
		return fwhmL
	}
	half := Voigt(0, fwhmG, fwhmL) / 2
	lo, hi := 0.0, fwhmG+fwhmL // the half width lies below the sum of the half widths ×2
	for range 80 {
		mid := (lo + hi) / 2
		if Voigt(mid, fwhmG, fwhmL) > half {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo + hi
}

// secondRadiation is hc/k_B [cm K], converting term values [cm⁻¹] to temperatures.
const secondRadiation = units.Planck * units.SpeedOfLight * 100 / units.Boltzmann

// RotationalShares returns the Boltzmann fractions of the rotational levels J = 0…jmax of level
// v of state s at temperature T [K]: s_J = (2J+1)·e^(−hcF(J)/kT)/Σ, over J ≥ Λ. Both Λ-doublet
// components and all spin components of J are included; nuclear-spin weights cancel because
// every J of a Π state has one symmetric and one antisymmetric component.
func RotationalShares(s State, v int, T float64, jmax int) []float64 {
	sh := make([]float64, jmax+1)
	sum := 0.0
	f0 := s.F(v, s.Lambda)
	for j := s.Lambda; j <= jmax; j++ {
		sh[j] = float64(2*j+1) * math.Exp(-(s.F(v, j)-f0)*secondRadiation/T)
		sum += sh[j]
	}
	for j := range sh {
		sh[j] /= sum
	}
	return sh
}
