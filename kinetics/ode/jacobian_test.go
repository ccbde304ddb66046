package ode

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"

	"n2pulse/kinetics/ode/odetest"
)

// TestAnalyticJacobians checks each shared problem's analytic Jacobian against central
// differences (gonum/diff/fd) at points along its solution; agreement to 1e-6 of the largest
// entry (common practice, no source: central differences are accurate to about ε^(2/3)).
func TestAnalyticJacobians(t *testing.T) {
	t.Parallel()
	for _, p := range odetest.Problems() {
		js, ok := p.Sys.(odetest.JacobianSystem)
		if !ok {
			continue
		}
		in := NewRosenbrock(nil)
		if err := in.Init(p.Sys, p.T0, p.Y0, &Settings{RelTol: 1e-6, AbsTol: fill(len(p.Y0), p.AbsTol)}); err != nil {
			t.Fatal(err)
		}
		for k := 1; k <= 4; k++ {
			tt := p.T0 + (p.End-p.T0)*float64(k)/4
			if err := in.AdvanceTo(tt); err != nil {
				t.Fatal(err)
			}
			_, y := in.State()
			if e := odetest.JacobianError(js, tt, y, 1e-5); e > 1e-6 {
				t.Errorf("%s at t=%g: analytic Jacobian deviates by %.3g from central differences", p.Name, tt, e)
			}
		}
	}
}

// hidden hides a system's Jacobian so that the integrator must difference.
type hidden struct{ odetest.System }

// TestDifferenceJacobian compares the integrator's forward-difference Jacobian with the analytic
// one on Robertson and Van der Pol states spanning many orders of magnitude (common practice,
// no source: forward differences are accurate to about √ε of the column scale).
func TestDifferenceJacobian(t *testing.T) {
	t.Parallel()
	for _, p := range []odetest.Problem{odetest.Robertson(), odetest.VanDerPol(), odetest.Kepler(0.5)} {
		js := p.Sys.(odetest.JacobianSystem)
		n := len(p.Y0)
		r := NewRosenbrock(nil)
		if err := r.Init(hidden{p.Sys}, p.T0, p.Y0, &Settings{RelTol: 1e-6, AbsTol: fill(n, p.AbsTol)}); err != nil {
			t.Fatal(err)
		}
		ja := mat.NewDense(n, n, nil)
		for _, tt := range []float64{p.End / 1000, p.End / 10, p.End} {
			if err := r.AdvanceTo(tt); err != nil {
				t.Fatal(err)
			}
			if err := r.jacobian(1e-3 * p.End); err != nil {
				t.Fatal(err)
			}
			y := r.y
			js.Jacobian(tt, y, ja)
			var maxA, maxE float64
			for i := range n {
				for j := range n {
					maxA = math.Max(maxA, math.Abs(ja.At(i, j)))
					maxE = math.Max(maxE, math.Abs(ja.At(i, j)-r.jac.At(i, j)))
				}
			}
			if maxE > 1e-6*maxA {
				t.Errorf("%s at t=%g: difference Jacobian off by %.3g (largest entry %.3g)\n%v\n%v", p.Name, tt, maxE, maxA,
					mat.Formatted(ja), mat.Formatted(r.jac))
			}
		}
	}
}

func fill(n int, v float64) []float64 {
	s := make([]float64, n)
	for i := range s {
		s[i] = v
	}
	return s
}
