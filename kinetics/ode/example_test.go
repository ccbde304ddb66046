package ode_test

import (
	"fmt"

	"gonum.org/v1/gonum/mat"

	"n2pulse/kinetics/ode"
)

// robertson is Robertson's stiff chemical kinetics (Hairer & Wanner, Solving ODEs II,
// Sect. IV.1), with its analytic Jacobian.
type robertson struct{}

func (robertson) Dim() int { return 3 }

func (robertson) Eval(_ float64, y, dydt []float64) error {
	dydt[0] = -0.04*y[0] + 1e4*y[1]*y[2]
	dydt[2] = 3e7 * y[1] * y[1]
	dydt[1] = -dydt[0] - dydt[2]
	return nil
}

func (robertson) Jacobian(_ float64, y []float64, dst *mat.Dense) {
	dst.Set(0, 0, -0.04)
	dst.Set(0, 1, 1e4*y[2])
	dst.Set(0, 2, 1e4*y[1])
	dst.Set(2, 0, 0)
	dst.Set(2, 1, 6e7*y[1])
	dst.Set(2, 2, 0)
	for j := range 3 {
		dst.Set(1, j, -dst.At(0, j)-dst.At(2, j))
	}
}

// ExampleRosenbrock integrates Robertson's problem, whose rate constants span nine decades,
// with RODAS4 and per-component absolute tolerances, sampling it at decades of time. The
// value at t = 40 agrees with the reference y = (0.7158271, 9.185535e-6, 0.2841637) of Hairer &
// Wanner's test problem (from memory; see odetest.Robertson), and the sum y₁+y₂+y₃ = 1 is
// conserved.
func ExampleRosenbrock() {
	in := ode.NewRosenbrock(ode.RODAS4)
	s := &ode.Settings{RelTol: 1e-8, AbsTol: []float64{1e-12, 1e-16, 1e-12}}
	if err := in.Init(robertson{}, 0, []float64{1, 0, 0}, s); err != nil {
		fmt.Println(err)
		return
	}
	for _, t := range []float64{0.4, 40, 4e3, 4e5} {
		if err := in.AdvanceTo(t); err != nil {
			fmt.Println(err)
			return
		}
		_, y := in.State()
		fmt.Printf("t=%-6g y1=%.6f y2=%.6e y3=%.6f sum=%.12f\n", t, y[0], y[1], y[2], y[0]+y[1]+y[2])
	}
	// Output:
	// t=0.4    y1=0.985172 y2=3.386395e-05 y3=0.014794 sum=1.000000000000
	// t=40     y1=0.715827 y2=9.185535e-06 y3=0.284164 sum=1.000000000000
	// t=4000   y1=0.183202 y2=8.942371e-07 y3=0.816797 sum=1.000000000000
	// t=400000 y1=0.004938 y2=1.984994e-08 y3=0.995062 sum=1.000000000000
}

// vanDerPol is the Van der Pol oscillator y₁″ − μ(1 − y₁²)y₁′ + y₁ = 0 with μ = 1000, without
// a Jacobian: the integrator differences it.
type vanDerPol struct{}

func (vanDerPol) Dim() int { return 2 }

func (vanDerPol) Eval(_ float64, y, dydt []float64) error {
	dydt[0] = y[1]
	dydt[1] = 1000*(1-y[0]*y[0])*y[1] - y[0]
	return nil
}

// ExampleRosenbrock_stops integrates the stiff Van der Pol oscillator with a difference
// Jacobian, landing exactly on a stop time. The state at t = 2000 agrees with the reference
// (1.706167732, −8.928097e-4) of problem VDPOL of the Test Set for IVP Solvers (Mazzia &
// Magherini; from memory, see odetest.VanDerPol).
func ExampleRosenbrock_stops() {
	in := ode.NewRosenbrock(nil)
	s := &ode.Settings{RelTol: 1e-9, AbsTol: []float64{1e-10, 1e-12}, Stops: []float64{1000}}
	if err := in.Init(vanDerPol{}, 0, []float64{2, 0}, s); err != nil {
		fmt.Println(err)
		return
	}
	for {
		t, err := in.Step()
		if err != nil {
			fmt.Println(err)
			return
		}
		if t == 1000 {
			break
		}
	}
	t, y := in.State()
	fmt.Printf("t=%g y1=%.5f\n", t, y[0])
	if err := in.AdvanceTo(2000); err != nil {
		fmt.Println(err)
		return
	}
	_, y = in.State()
	fmt.Printf("t=2000 y1=%.6f y2=%.6e\n", y[0], y[1])
	// Output:
	// t=1000 y1=-1.86365
	// t=2000 y1=1.706168 y2=-8.928097e-04
}
