package spectro

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"n2pulse/units"
)

// Radial Schrödinger equation −(ħ²/2μ)ψ″ + V(r)ψ = Eψ on a uniform grid, with r in Å and
// energies in cm⁻¹.

// Potential is a rotationless potential energy curve V(r) [cm⁻¹] of the internuclear distance
// r [Å].
type Potential func(r float64) float64

// Stencil selects the discretisation of the kinetic-energy operator.
type Stencil int

const (
	// SincDVR is the infinite-order finite-difference (sinc discrete-variable) representation
	// of D.T. Colbert & W.H. Miller, J. Chem. Phys. 96, 1982 (1992), eq. (A6):
	// T_ii = (ħ²/2μh²)·π²/3, T_ij = (ħ²/2μh²)·2(−1)^(i−j)/(i−j)². It converges exponentially
	// with the grid spacing; it is the default.
	SincDVR Stencil = iota
	// ThreePoint is the second-order central difference ψ″ ≈ (ψ₋ − 2ψ + ψ₊)/h², error O(h²).
	ThreePoint
)

// Grid is a uniform grid of N points from RMin to RMax [Å] (end points included). The wave
// function is taken to vanish beyond the grid.
type Grid struct {
	RMin, RMax float64 // [Å]
	N          int
}

// Step returns the grid spacing [Å].
func (g Grid) Step() float64 { return (g.RMax - g.RMin) / float64(g.N-1) }

// R returns the grid points [Å].
func (g Grid) R() []float64 {
	r := make([]float64, g.N)
	h := g.Step()
	for i := range r {
		r[i] = g.RMin + float64(i)*h
	}
	return r
}

func (g Grid) validate() error {
	if g.N < 10 || g.N > 5000 {
		return fmt.Errorf("spectro: grid N = %d, want 10…5000", g.N)
	}
	if !(g.RMin > 0 && g.RMax > g.RMin) {
		return fmt.Errorf("spectro: grid [%g, %g] Å, want 0 < RMin < RMax", g.RMin, g.RMax)
	}
	return nil
}

// Levels are the lowest vibrational eigenstates of a potential on a grid.
type Levels struct {
	R      []float64   // grid points [Å]
	Step   float64     // spacing [Å]
	Energy []float64   // eigenvalues, ascending [cm⁻¹]
	Psi    [][]float64 // Psi[v][i] = ψ_v(r_i)·√h, so that Σ_i Psi[v][i]² = 1
}

// KineticConstant returns ħ²/(2μ) for a reduced mass mu [u], in cm⁻¹·Å².
func KineticConstant(mu float64) float64 {
	hbar := units.Planck / (2 * math.Pi)
	return hbar * hbar / (2 * mu * units.AtomicMass) / units.Wavenumber * 1e20
}

// SolveRadial returns the lowest n eigenstates of the rotationless radial equation for a
// molecule of reduced mass mu [u] in the potential V, on grid g, by a dense symmetric
// eigen-decomposition (gonum mat.EigenSym).
func SolveRadial(V Potential, mu float64, g Grid, st Stencil, n int) (*Levels, error) {
	if err := g.validate(); err != nil {
		return nil, err
	}
	if n < 1 || n > g.N {
		return nil, fmt.Errorf("spectro: %d levels asked of a %d-point grid, want 1…%d", n, g.N, g.N)
	}
	if !(mu > 0) {
		return nil, fmt.Errorf("spectro: reduced mass %g u, want > 0", mu)
	}
	h := g.Step()
	k := KineticConstant(mu) / (h * h)
	r := g.R()
	H := mat.NewSymDense(g.N, nil)
	for i := 0; i < g.N; i++ {
		v := V(r[i])
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("spectro: potential is %g at r = %g Å", v, r[i])
		}
		switch st {
		case SincDVR:
			H.SetSym(i, i, k*math.Pi*math.Pi/3+v)
			for j := i + 1; j < g.N; j++ {
				d := float64(j - i)
				t := 2 * k / (d * d)
				if (j-i)%2 == 1 {
					t = -t
				}
				H.SetSym(i, j, t)
			}
		case ThreePoint:
			H.SetSym(i, i, 2*k+v)
			if i+1 < g.N {
				H.SetSym(i, i+1, -k)
			}
		default:
			return nil, fmt.Errorf("spectro: unknown stencil %d", st)
		}
	}
	var eig mat.EigenSym
	if !eig.Factorize(H, true) {
		return nil, errors.New("spectro: eigen-decomposition of the radial Hamiltonian failed")
	}
	vals := eig.Values(nil)
	var vecs mat.Dense
	eig.VectorsTo(&vecs)
	lv := &Levels{R: r, Step: h, Energy: vals[:n:n], Psi: make([][]float64, n)}
	for v := 0; v < n; v++ {
		psi := mat.Col(nil, v, &vecs)
		fixSign(psi)
		lv.Psi[v] = psi
	}
	return lv, nil
}

// fixSign makes the first lobe (from small r) of an eigenvector positive, so that wave
// functions print reproducibly; overlaps squared do not depend on it.
func fixSign(psi []float64) {
	big := 0.0
	for _, x := range psi {
		big = math.Max(big, math.Abs(x))
	}
	for _, x := range psi {
		if math.Abs(x) > 1e-3*big {
			if x < 0 {
				for i := range psi {
					psi[i] = -psi[i]
				}
			}
			return
		}
	}
}

// Overlap returns ⟨ψ_a|ψ_b⟩ and ⟨ψ_a|r|ψ_b⟩ [Å] of two states on the same grid.
func Overlap(a, b []float64, r []float64) (s, sr float64) {
	for i := range a {
		p := a[i] * b[i]
		s += p
		sr += p * r[i]
	}
	return s, sr
}

// Morse returns the Morse potential De(1 − e^(−a(r−re)))² [cm⁻¹] of a state, with
// De = ωe²/(4ωexe) and a = √(ωexe/(ħ²/2μ)), whose exact levels are ωe(v+½) − ωexe(v+½)²
// (P.M. Morse, Phys. Rev. 34, 57, 1929).
func Morse(s State, mu float64) Potential {
	de := s.We * s.We / (4 * s.WeXe)
	a := math.Sqrt(s.WeXe / KineticConstant(mu))
	return func(r float64) float64 {
		e := 1 - math.Exp(-a*(r-s.Re))
		return de * e * e
	}
}

// Harmonic returns the harmonic potential ½K(r−re)² [cm⁻¹] whose levels are ωe(v+½) for a
// molecule of reduced mass mu [u]: K = ωe²/(2·ħ²/2μ).
func Harmonic(we, re, mu float64) Potential {
	K := we * we / (2 * KineticConstant(mu))
	return func(r float64) float64 { return 0.5 * K * (r - re) * (r - re) }
}
