// Package odetest holds the shared test problems of package ode, so that every integrator runs
// the same set: exponential decay, the harmonic oscillator, Robertson's chemical kinetics,
// the Van der Pol oscillator in its stiff scaling, and the Prothero–Robinson problem. Each
// problem carries its exact solution or a reference solution with its source.
//
// The package does not import ode (so that ode's internal tests can use it); its systems
// satisfy ode.System and ode.Jacobian structurally.
package odetest

import (
	"math"

	"gonum.org/v1/gonum/diff/fd"
	"gonum.org/v1/gonum/mat"
)

// System is the right-hand side interface of package ode.
type System interface {
	Dim() int
	Eval(t float64, y, dydt []float64) error
}

// Problem is an initial value problem with a known answer.
type Problem struct {
	Name    string
	Sys     System
	T0, End float64   // interval [s]
	Y0      []float64 // initial state
	// Exact is the exact solution, nil when only a reference at End is known.
	Exact func(t float64, dst []float64)
	// Ref is the solution at End (from Exact when known); RefTol its relative accuracy.
	Ref    []float64
	RefTol float64
	// Source names where Ref comes from.
	Source string
	// Stiff marks problems an explicit method should not be asked to solve.
	Stiff bool
	// AbsTol is a suitable absolute tolerance for the problem's scale.
	AbsTol float64
	// Growth bounds the global error in units of RelTol (default 100): the tolerance bounds
	// local errors, which accumulate over the interval, most along orbits (Kepler: 1000).
	Growth float64
	// Scale is the typical magnitude of each component (nil: the reference value itself);
	// errors are measured relative to max(|Ref_i|, Scale_i).
	Scale []float64
}

// Problems returns fresh instances of all shared problems.
func Problems() []Problem {
	return []Problem{Decay(), Oscillator(), Rational(), Kepler(0.5), Robertson(), VanDerPol(), ProtheroRobinson(-1e6)}
}

// RationalSystem is the nonlinear, non-autonomous y′ = −2t·y², solved by y = 1/(1 + t²) from
// y(0) = 1.
type RationalSystem struct{}

func (RationalSystem) Dim() int { return 1 }
func (RationalSystem) Eval(t float64, y, dydt []float64) error {
	dydt[0] = -2 * t * y[0] * y[0]
	return nil
}
func (RationalSystem) Jacobian(t float64, y []float64, dst *mat.Dense) { dst.Set(0, 0, -4*t*y[0]) }

// Rational is y′ = −2t·y² on [0, 3] with exact solution 1/(1 + t²).
func Rational() Problem {
	p := Problem{Name: "rational", Sys: RationalSystem{}, End: 3, Y0: []float64{1},
		Exact:  func(t float64, d []float64) { d[0] = 1 / (1 + t*t) },
		Source: "analytic", AbsTol: 1e-12, Scale: []float64{1}}
	return p.withExact()
}

// KeplerSystem is the two-body problem q″ = −q/|q|³ in the plane, state (q₁, q₂, p₁, p₂).
type KeplerSystem struct{}

func (KeplerSystem) Dim() int { return 4 }
func (KeplerSystem) Eval(_ float64, y, dydt []float64) error {
	r := math.Hypot(y[0], y[1])
	r3 := r * r * r
	dydt[0], dydt[1] = y[2], y[3]
	dydt[2], dydt[3] = -y[0]/r3, -y[1]/r3
	return nil
}

func (KeplerSystem) Jacobian(_ float64, y []float64, dst *mat.Dense) {
	dst.Zero()
	r := math.Hypot(y[0], y[1])
	r3, r5 := r*r*r, r*r*r*r*r
	dst.Set(0, 2, 1)
	dst.Set(1, 3, 1)
	for i := range 2 {
		for j := range 2 {
			v := 3 * y[i] * y[j] / r5
			if i == j {
				v -= 1 / r3
			}
			dst.Set(2+i, j, v)
		}
	}
}

// KeplerInvariants returns the energy ½|p|² − 1/|q| and the angular momentum q₁p₂ − q₂p₁.
func KeplerInvariants(y []float64) (energy, angular float64) {
	return 0.5*(y[2]*y[2]+y[3]*y[3]) - 1/math.Hypot(y[0], y[1]), y[0]*y[3] - y[1]*y[2]
}

// Kepler is an orbit of eccentricity e with semi-major axis 1 from pericentre, over one period
// 2π, after which it returns exactly to its initial state (Kepler's third law; analytic).
func Kepler(e float64) Problem {
	y0 := []float64{1 - e, 0, 0, math.Sqrt((1 + e) / (1 - e))}
	return Problem{Name: "kepler", Sys: KeplerSystem{}, End: 2 * math.Pi, Y0: y0,
		Ref: append([]float64(nil), y0...), RefTol: 1e-15, Source: "analytic (period 2π for a = 1)",
		AbsTol: 1e-12, Scale: []float64{1, 1, 1, 1}, Growth: 1000}
}

// DecaySystem is y₁′ = −y₁, y₂′ = −10·y₂.
type DecaySystem struct{}

func (DecaySystem) Dim() int { return 2 }
func (DecaySystem) Eval(_ float64, y, dydt []float64) error {
	dydt[0], dydt[1] = -y[0], -10*y[1]
	return nil
}
func (DecaySystem) Jacobian(_ float64, _ []float64, dst *mat.Dense) {
	dst.Set(0, 0, -1)
	dst.Set(0, 1, 0)
	dst.Set(1, 0, 0)
	dst.Set(1, 1, -10)
}

// Decay is exponential decay with two rates on [0, 2]; exact solution exp(−t), exp(−10t).
func Decay() Problem {
	p := Problem{Name: "decay", Sys: DecaySystem{}, End: 2, Y0: []float64{1, 1},
		Exact:  func(t float64, d []float64) { d[0], d[1] = math.Exp(-t), math.Exp(-10*t) },
		Source: "analytic", AbsTol: 1e-12, Scale: []float64{1, 1}}
	return p.withExact()
}

// OscillatorSystem is x′ = v, v′ = −ω²·x with ω = 2π (period 1).
type OscillatorSystem struct{}

// Omega is the angular frequency of OscillatorSystem [rad/s].
const Omega = 2 * math.Pi

func (OscillatorSystem) Dim() int { return 2 }
func (OscillatorSystem) Eval(_ float64, y, dydt []float64) error {
	dydt[0], dydt[1] = y[1], -Omega*Omega*y[0]
	return nil
}
func (OscillatorSystem) Jacobian(_ float64, _ []float64, dst *mat.Dense) {
	dst.Set(0, 0, 0)
	dst.Set(0, 1, 1)
	dst.Set(1, 0, -Omega*Omega)
	dst.Set(1, 1, 0)
}

// Energy is the oscillator's conserved energy ½v² + ½ω²x² per unit mass.
func Energy(y []float64) float64 { return 0.5*y[1]*y[1] + 0.5*Omega*Omega*y[0]*y[0] }

// Oscillator is the harmonic oscillator over ten periods from x=1, v=0; exact cos and sin.
func Oscillator() Problem {
	p := Problem{Name: "oscillator", Sys: OscillatorSystem{}, End: 10, Y0: []float64{1, 0},
		Exact: func(t float64, d []float64) {
			d[0], d[1] = math.Cos(Omega*t), -Omega*math.Sin(Omega*t)
		},
		Source: "analytic", AbsTol: 1e-10, Scale: []float64{1, Omega}}
	return p.withExact()
}

// RobertsonSystem is Robertson's chemical kinetics (Robertson 1966; Hairer & Wanner, Solving
// ODEs II, Sect. IV.1):
//
//	y₁′ = −0.04·y₁ + 1e4·y₂·y₃
//	y₂′ =  0.04·y₁ − 1e4·y₂·y₃ − 3e7·y₂²
//	y₃′ =  3e7·y₂²
type RobertsonSystem struct{}

func (RobertsonSystem) Dim() int { return 3 }
func (RobertsonSystem) Eval(_ float64, y, dydt []float64) error {
	a, b, c := 0.04*y[0], 1e4*y[1]*y[2], 3e7*y[1]*y[1]
	dydt[0] = -a + b
	dydt[1] = a - b - c
	dydt[2] = c
	return nil
}
func (RobertsonSystem) Jacobian(_ float64, y []float64, dst *mat.Dense) {
	dst.Set(0, 0, -0.04)
	dst.Set(0, 1, 1e4*y[2])
	dst.Set(0, 2, 1e4*y[1])
	dst.Set(1, 0, 0.04)
	dst.Set(1, 1, -1e4*y[2]-6e7*y[1])
	dst.Set(1, 2, -1e4*y[1])
	dst.Set(2, 0, 0)
	dst.Set(2, 1, 6e7*y[1])
	dst.Set(2, 2, 0)
}

// Robertson is Robertson's problem on [0, 40] from y = (1, 0, 0). The reference at t = 40,
// y = (0.7158270687193941, 9.185534764557338e-6, 0.2841637457458413), is from memory of the
// reference solution commonly quoted with the problem (Hairer & Wanner's stiff test problems);
// RODAS4 at RelTol 1e-12 and ROS34PW2 at RelTol 1e-9 reproduce it to 1e-9
// (TestReferenceConfirmation).
func Robertson() Problem {
	return Problem{Name: "robertson", Sys: RobertsonSystem{}, End: 40, Y0: []float64{1, 0, 0},
		Ref:    []float64{0.7158270687193941, 9.185534764557338e-6, 0.2841637457458413},
		RefTol: 1e-9, Stiff: true, AbsTol: 1e-14,
		Source: "from memory: reference solution at t=40 quoted with Hairer & Wanner's stiff test problems"}
}

// VanDerPolSystem is the Van der Pol oscillator in the stiff scaling of Hairer & Wanner
// (Solving ODEs II, Sect. IV.1): y₁′ = y₂, y₂′ = ((1 − y₁²)·y₂ − y₁)/ε, ε = 1e-6.
type VanDerPolSystem struct{ Eps float64 }

func (VanDerPolSystem) Dim() int { return 2 }
func (v VanDerPolSystem) Eval(_ float64, y, dydt []float64) error {
	dydt[0] = y[1]
	dydt[1] = ((1-y[0]*y[0])*y[1] - y[0]) / v.Eps
	return nil
}
func (v VanDerPolSystem) Jacobian(_ float64, y []float64, dst *mat.Dense) {
	dst.Set(0, 0, 0)
	dst.Set(0, 1, 1)
	dst.Set(1, 0, (-2*y[0]*y[1]-1)/v.Eps)
	dst.Set(1, 1, (1-y[0]*y[0])/v.Eps)
}

// VanDerPol is the stiff Van der Pol problem (ε = 1e-6) on [0, 2] from y = (2, 0): problem
// VDPOL of the Test Set for IVP Solvers (Mazzia & Magherini, University of Bari), posed there
// as μ = 1000 on [0, 2000], which is this problem after t → t/μ, y₂ → y₂/μ. The reference at
// t = 2, y = (1.706167732170483, −0.8928097010247975), is from memory of that test set's
// published solution; RODAS4 at RelTol 1e-12 reproduces it to 1e-11 (TestReferenceConfirmation).
func VanDerPol() Problem {
	return Problem{Name: "vanderpol", Sys: VanDerPolSystem{Eps: 1e-6}, End: 2, Y0: []float64{2, 0},
		Ref:    []float64{1.706167732170483, -0.8928097010247975},
		RefTol: 1e-9, Stiff: true, AbsTol: 1e-10,
		Source: "from memory: Test Set for IVP Solvers (Mazzia & Magherini), problem VDPOL, reference at t=2"}
}

// ProtheroRobinsonSystem is y′ = λ·(y − sin t) + cos t (Prothero & Robinson, Math. Comp. 28,
// 145–162, 1974), whose solution from y(0) = 0 is sin t for every λ; with λ ≪ 0 it exposes
// order reduction of implicit methods. It is non-autonomous.
type ProtheroRobinsonSystem struct{ Lambda float64 }

func (ProtheroRobinsonSystem) Dim() int { return 1 }
func (p ProtheroRobinsonSystem) Eval(t float64, y, dydt []float64) error {
	dydt[0] = p.Lambda*(y[0]-math.Sin(t)) + math.Cos(t)
	return nil
}
func (p ProtheroRobinsonSystem) Jacobian(_ float64, _ []float64, dst *mat.Dense) {
	dst.Set(0, 0, p.Lambda)
}

// ProtheroRobinson is the Prothero–Robinson problem with stiffness λ [1/s] on [0, 2].
func ProtheroRobinson(lambda float64) Problem {
	p := Problem{Name: "prothero-robinson", Sys: ProtheroRobinsonSystem{Lambda: lambda}, End: 2,
		Y0: []float64{0}, Exact: func(t float64, d []float64) { d[0] = math.Sin(t) },
		Source: "analytic", Stiff: lambda < -100, AbsTol: 1e-12, Scale: []float64{1}}
	return p.withExact()
}

func (p Problem) withExact() Problem {
	p.Ref = make([]float64, len(p.Y0))
	p.Exact(p.End, p.Ref)
	p.RefTol = 1e-15
	return p
}

// MaxRelError returns max_i |y_i − Ref_i| / max(|Ref_i|, Scale_i).
func (p Problem) MaxRelError(y []float64) float64 {
	var m float64
	for i, r := range p.Ref {
		d := math.Abs(r)
		if p.Scale != nil {
			d = math.Max(d, p.Scale[i])
		}
		m = math.Max(m, math.Abs(y[i]-r)/d)
	}
	return m
}

// JacobianSystem is a System with an analytic Jacobian.
type JacobianSystem interface {
	System
	Jacobian(t float64, y []float64, dst *mat.Dense)
}

// JacobianError compares sys's analytic Jacobian at (t, y) with central differences of step
// h·max(|y_j|, 1) (gonum/diff/fd) and returns max_ij |J_ij − D_ij| / (max_ij |D_ij|).
func JacobianError(sys JacobianSystem, t float64, y []float64, h float64) float64 {
	n := sys.Dim()
	ja := mat.NewDense(n, n, nil)
	sys.Jacobian(t, y, ja)
	jd := mat.NewDense(n, n, nil)
	// Scale the variables so that one absolute step suits every column.
	scale := make([]float64, n)
	x := make([]float64, n)
	for j := range scale {
		scale[j] = math.Max(math.Abs(y[j]), 1e-300)
		if y[j] == 0 {
			scale[j] = 1
		}
		x[j] = y[j] / scale[j]
	}
	ys := make([]float64, n)
	fd.Jacobian(jd, func(dst, x []float64) {
		for j := range x {
			ys[j] = x[j] * scale[j]
		}
		_ = sys.Eval(t, ys, dst)
	}, x, &fd.JacobianSettings{Formula: fd.Central, Step: h})
	var maxD, maxE float64
	for i := range n {
		for j := range n {
			d := jd.At(i, j) / scale[j]
			maxD = math.Max(maxD, math.Abs(d))
			maxE = math.Max(maxE, math.Abs(ja.At(i, j)-d))
		}
	}
	if maxD == 0 {
		return maxE
	}
	return maxE / maxD
}
