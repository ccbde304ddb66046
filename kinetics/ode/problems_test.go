package ode_test

import (
	"math"
	"testing"

	"n2pulse/kinetics/ode"
	"n2pulse/kinetics/ode/odetest"
)

type integratorCase struct {
	name string
	new  func() ode.Integrator
	// stiff says whether the method may be run on stiff problems.
	stiff bool
}

var integrators = []integratorCase{
	{"RODAS4", func() ode.Integrator { return ode.NewRosenbrock(ode.RODAS4) }, true},
	{"ROS34PW2", func() ode.Integrator { return ode.NewRosenbrock(ode.ROS34PW2) }, true},
	{"DormandPrince", func() ode.Integrator { return ode.NewDormandPrince() }, false},
}

// solve integrates p to its end with relative tolerance rtol.
func solve(t *testing.T, in ode.Integrator, p odetest.Problem, rtol float64) []float64 {
	t.Helper()
	abs := make([]float64, len(p.Y0))
	for i := range abs {
		abs[i] = p.AbsTol
	}
	if err := in.Init(p.Sys, p.T0, p.Y0, &ode.Settings{RelTol: rtol, AbsTol: abs}); err != nil {
		t.Fatalf("%s: Init: %v", p.Name, err)
	}
	if err := in.AdvanceTo(p.End); err != nil {
		t.Fatalf("%s: AdvanceTo: %v", p.Name, err)
	}
	tt, y := in.State()
	if tt != p.End {
		t.Fatalf("%s: State time %v, want %v", p.Name, tt, p.End)
	}
	return append([]float64(nil), y...)
}

// TestProblems runs every shared problem with every integrator at two tolerances and asks for
// an error of the order of the tolerance (global error ≤ Growth·RelTol, Growth = 100 unless the
// problem says otherwise: the tolerance bounds the local error per step; common practice, no
// source) against the exact or reference solution
// named by the problem (odetest documents each source).
func TestProblems(t *testing.T) {
	t.Parallel()
	for _, ic := range integrators {
		for _, p := range odetest.Problems() {
			if p.Stiff && !ic.stiff {
				continue
			}
			for _, rtol := range []float64{1e-5, 1e-8} {
				in := ic.new()
				y := solve(t, in, p, rtol)
				e := p.MaxRelError(y)
				st := in.Stats()
				t.Logf("%-9s %-17s rtol=%.0e err=%.2e steps=%d rej=%d f=%d jac=%d lu=%d",
					ic.name, p.Name, rtol, e, st.Steps, st.Rejected, st.FuncEvals, st.JacEvals, st.Factorizations)
				growth := p.Growth
				if growth == 0 {
					growth = 100
				}
				if e > growth*rtol {
					t.Errorf("%s %s rtol=%g: max relative error %.3g > %.3g (source: %s)", ic.name, p.Name, rtol, e, growth*rtol, p.Source)
				}
			}
		}
	}
}

// TestReferenceConfirmation checks the remembered reference values of the stiff problems
// (marked "from memory" in odetest, sources named there) against tight-tolerance runs of both
// Rosenbrock tables: agreement to 1e-8 between two methods and the recalled digits.
func TestReferenceConfirmation(t *testing.T) {
	t.Parallel()
	for _, p := range []odetest.Problem{odetest.Robertson(), odetest.VanDerPol()} {
		for _, c := range []struct {
			tab  *ode.RosenbrockTableau
			rtol float64
		}{{ode.RODAS4, 1e-12}, {ode.ROS34PW2, 1e-9}} {
			y := solve(t, ode.NewRosenbrock(c.tab), p, c.rtol)
			e := p.MaxRelError(y)
			t.Logf("%s %s: max relative deviation from reference %.2e", c.tab.Name, p.Name, e)
			if e > 1e-8 {
				t.Errorf("%s %s: deviation %.3g from the reference (%s) > 1e-8", c.tab.Name, p.Name, e, p.Source)
			}
		}
	}
}

// TestOscillatorEnergy checks conservation of the oscillator's energy over ten periods
// (analytic invariant): the drift must be of the order of the tolerance.
func TestOscillatorEnergy(t *testing.T) {
	t.Parallel()
	p := odetest.Oscillator()
	e0 := odetest.Energy(p.Y0)
	for _, ic := range integrators {
		in := ic.new()
		if err := in.Init(p.Sys, 0, p.Y0, &ode.Settings{RelTol: 1e-8, AbsTol: []float64{1e-10, 1e-10}}); err != nil {
			t.Fatal(err)
		}
		var worst float64
		for k := 1; k <= 1000; k++ {
			if err := in.AdvanceTo(float64(k) * 0.01); err != nil {
				t.Fatal(err)
			}
			_, y := in.State()
			worst = math.Max(worst, math.Abs(odetest.Energy(y)/e0-1))
		}
		t.Logf("%s: worst relative energy drift %.2e", ic.name, worst)
		if worst > 1e-5 {
			t.Errorf("%s: energy drift %.3g > 1e-5 over 10 periods", ic.name, worst)
		}
	}
}
