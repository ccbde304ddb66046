package ode_test

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"n2pulse/kinetics/ode"
	"n2pulse/kinetics/ode/odetest"
)

// switched is y′ = 0 up to and at t = ts and y′ = 1 after it, recording the latest time seen
// before the switch.
type switched struct {
	ts       float64
	badEarly bool // an evaluation with t > ts happened before the integrator reached ts
	reached  *bool
}

func (s *switched) Dim() int { return 1 }
func (s *switched) Eval(t float64, _, dydt []float64) error {
	dydt[0] = 0
	if t > s.ts {
		dydt[0] = 1
		// The landing step itself evaluates just after the stop, at the next float.
		if !*s.reached && t > math.Nextafter(s.ts, 2*s.ts) {
			s.badEarly = true
		}
	}
	return nil
}

// TestStopsLandExactly checks that steps end exactly on Settings.Stops and that a right-hand
// side that changes just after a stop is integrated exactly: y(2) = 2 − ts (analytic).
func TestStopsLandExactly(t *testing.T) {
	t.Parallel()
	for _, ic := range integrators {
		reached := false
		sys := &switched{ts: 1.2345678, reached: &reached}
		in := ic.new()
		stops := []float64{1.7, sys.ts, 0.3}
		if err := in.Init(sys, 0, []float64{0}, &ode.Settings{Stops: stops, InitialStep: 0.01}); err != nil {
			t.Fatal(err)
		}
		hit := map[float64]bool{}
		for {
			tt, err := in.Step()
			if err != nil {
				t.Fatal(err)
			}
			hit[tt] = true
			if tt >= sys.ts {
				reached = true
			}
			if tt >= 2 {
				break
			}
		}
		for _, s := range stops {
			if !hit[s] {
				t.Errorf("%s: no step ended exactly on stop %v", ic.name, s)
			}
		}
		if sys.badEarly {
			t.Errorf("%s: the right-hand side was evaluated past the stop before the stop was reached", ic.name)
		}
		if err := in.AdvanceTo(2.5); err != nil {
			t.Fatal(err)
		}
		tt, y := in.State()
		if want := tt - sys.ts; tt != 2.5 || math.Abs(y[0]-want) > 1e-12 {
			t.Errorf("%s: y(%v) = %.15g, want %.15g", ic.name, tt, y[0], want)
		}
	}
}

// TestAdvanceToGrid samples exponential decay on a uniform grid of 1000 points: every sample
// lands on its time and matches exp(−t) (analytic) within 100·RelTol.
func TestAdvanceToGrid(t *testing.T) {
	t.Parallel()
	p := odetest.Decay()
	for _, ic := range integrators {
		in := ic.new()
		if err := in.Init(p.Sys, 0, p.Y0, &ode.Settings{RelTol: 1e-7, AbsTol: []float64{1e-10, 1e-10}}); err != nil {
			t.Fatal(err)
		}
		var worst float64
		for k := 1; k <= 1000; k++ {
			ts := 2 * float64(k) / 1000
			if err := in.AdvanceTo(ts); err != nil {
				t.Fatal(err)
			}
			tt, y := in.State()
			if tt != ts {
				t.Fatalf("%s: State time %v after AdvanceTo(%v)", ic.name, tt, ts)
			}
			worst = math.Max(worst, math.Abs(y[0]-math.Exp(-ts))/math.Exp(-ts))
		}
		if worst > 1e-5 {
			t.Errorf("%s: worst sample error %.3g > 1e-5", ic.name, worst)
		}
		if err := in.AdvanceTo(1); err == nil {
			t.Errorf("%s: AdvanceTo backwards gave no error", ic.name)
		}
	}
}

// TestInterpolate checks the Hermite interpolant inside one step of exp(−t) against the exact
// solution: the interpolation error of a cubic Hermite polynomial is at most h⁴/384·max|y⁗|
// (analytic bound, here with max|y⁗| ≤ 1).
func TestInterpolate(t *testing.T) {
	t.Parallel()
	in := ode.NewRosenbrock(nil)
	p := odetest.Decay()
	if err := in.Init(p.Sys, 0, p.Y0[:], &ode.Settings{InitialStep: 0.2, MaxStep: 0.2, RelTol: 1e-3}); err != nil {
		t.Fatal(err)
	}
	t1, err := in.Step()
	if err != nil {
		t.Fatal(err)
	}
	dst := make([]float64, 2)
	for _, th := range []float64{0.1, 0.5, 0.9} {
		tt := th * t1
		if err := in.Interpolate(tt, dst); err != nil {
			t.Fatal(err)
		}
		if e := math.Abs(dst[0] - math.Exp(-tt)); e > math.Pow(t1, 4)/384+1e-6 {
			t.Errorf("interpolant at %v off by %.3g", tt, e)
		}
	}
	if err := in.Interpolate(t1+1, dst); err == nil {
		t.Error("Interpolate outside the step gave no error")
	}
}

// domain is y′ = −y whose evaluation fails (recoverably) for y < 0.
type domain struct{ fails int }

func (d *domain) Dim() int { return 1 }
func (d *domain) Eval(_ float64, y, dydt []float64) error {
	if y[0] < 0 {
		d.fails++
		return fmt.Errorf("y = %g outside [0, ∞)", y[0])
	}
	dydt[0] = -y[0]
	return nil
}

// TestRecoverableFailure starts with a step so large that the stages leave the domain; the
// integrator must retry smaller and still reach exp(−5) (analytic).
func TestRecoverableFailure(t *testing.T) {
	t.Parallel()
	for _, ic := range integrators {
		sys := &domain{}
		in := ic.new()
		if err := in.Init(sys, 0, []float64{1}, &ode.Settings{InitialStep: 50, RelTol: 1e-8}); err != nil {
			t.Fatal(err)
		}
		if err := in.AdvanceTo(5); err != nil {
			t.Fatalf("%s: %v", ic.name, err)
		}
		_, y := in.State()
		if math.Abs(y[0]/math.Exp(-5)-1) > 1e-6 {
			t.Errorf("%s: y(5) = %v, want %v", ic.name, y[0], math.Exp(-5))
		}
		if ic.name == "DormandPrince" && (sys.fails == 0 || in.Stats().Failures == 0) {
			t.Errorf("%s: the test did not exercise a failure (fails %d, %+v)", ic.name, sys.fails, in.Stats())
		}
		if st := in.Stats(); st.Failures > st.Rejected || (sys.fails > 0 && st.Failures == 0) {
			t.Errorf("%s: %d failed evaluations but %+v", ic.name, sys.fails, st)
		}
	}
}

// fatal fails fatally after t = 1.
type fatal struct{}

func (fatal) Dim() int { return 1 }
func (fatal) Eval(t float64, y, dydt []float64) error {
	if t > 1 {
		return fmt.Errorf("%w: circuit opened", ode.ErrFatal)
	}
	dydt[0] = 1
	return nil
}

// blowUp is y′ = y², whose solution from y(0) = 1 ends at t = 1.
type blowUp struct{}

func (blowUp) Dim() int { return 1 }
func (blowUp) Eval(_ float64, y, dydt []float64) error {
	dydt[0] = y[0] * y[0]
	return nil
}

// alwaysFails fails (recoverably) for every t > 0.
type alwaysFails struct{}

func (alwaysFails) Dim() int { return 1 }
func (alwaysFails) Eval(t float64, y, dydt []float64) error {
	if t > 0 {
		return errors.New("outside the domain")
	}
	dydt[0] = 1
	return nil
}

// TestPersistentFailure checks that a right-hand side failing everywhere after t0 = 0 ends in
// a step size underflow that names the last failure, rather than looping.
func TestPersistentFailure(t *testing.T) {
	t.Parallel()
	for _, ic := range integrators {
		in := ic.new()
		if err := in.Init(alwaysFails{}, 0, []float64{0}, nil); err != nil {
			t.Fatal(err)
		}
		err := in.AdvanceTo(1)
		if !errors.Is(err, ode.ErrStepUnderflow) || !strings.Contains(err.Error(), "outside the domain") {
			t.Errorf("%s: %v", ic.name, err)
		}
		if st := in.Stats(); st.Rejected > 2000 {
			t.Errorf("%s: %d rejections before giving up", ic.name, st.Rejected)
		}
	}
}

// TestTypedErrors checks that a fatal failure aborts at once, that a singular solution ends
// in a step size underflow near t = 1 with the documented message, and that MaxSteps is obeyed.
func TestTypedErrors(t *testing.T) {
	t.Parallel()
	for _, ic := range integrators {
		in := ic.new()
		if err := in.Init(fatal{}, 0, []float64{0}, nil); err != nil {
			t.Fatal(err)
		}
		err := in.AdvanceTo(2)
		var se *ode.StepError
		if !errors.Is(err, ode.ErrFatal) || !errors.As(err, &se) || in.Stats().Rejected != 0 {
			t.Errorf("%s: fatal failure gave %v after %d rejections", ic.name, err, in.Stats().Rejected)
		}

		if err := in.Init(blowUp{}, 0, []float64{1}, nil); err != nil {
			t.Fatal(err)
		}
		err = in.AdvanceTo(2)
		if !errors.Is(err, ode.ErrStepUnderflow) && !errors.Is(err, ode.ErrMaxSteps) {
			t.Errorf("%s: blow-up gave %v", ic.name, err)
		} else if !errors.As(err, &se) || math.Abs(se.T-1) > 1e-3 || !strings.HasPrefix(err.Error(), "ode: ") {
			t.Errorf("%s: blow-up error %q at t=%v, want near t = 1", ic.name, err, se.T)
		}
		t.Logf("%s: %v", ic.name, err)

		if err := in.Init(odetest.OscillatorSystem{}, 0, []float64{1, 0}, &ode.Settings{MaxSteps: 10}); err != nil {
			t.Fatal(err)
		}
		if err := in.AdvanceTo(100); !errors.Is(err, ode.ErrMaxSteps) || in.Stats().Steps+in.Stats().Rejected != 10 {
			t.Errorf("%s: MaxSteps 10 gave %v after %+v", ic.name, err, in.Stats())
		}
	}
	var d ode.DormandPrince
	if _, err := d.Step(); !errors.Is(err, ode.ErrNotStarted) || !strings.HasPrefix(err.Error(), "ode: ") {
		t.Errorf("Step before Init: %v", err)
	}
	if err := d.Init(odetest.DecaySystem{}, 0, []float64{1, 1}, nil); err != nil {
		t.Fatal(err)
	}
	if err := d.Interpolate(0, make([]float64, 2)); err == nil {
		t.Error("Interpolate before any step gave no error")
	}
	if s := d.Stats().String(); s != "steps 0, rejected 0 (0 failed evaluations), f evaluations 2, Jacobians 0, factorisations 0" {
		t.Errorf("Stats after Init: %q (f(t0) and the initial-step estimate's evaluation expected)", s)
	}
}

// TestSettingsValidation checks that bad settings are rejected with the field's name.
func TestSettingsValidation(t *testing.T) {
	t.Parallel()
	sys := odetest.DecaySystem{}
	for _, c := range []struct {
		s     ode.Settings
		y0    []float64
		field string
	}{
		{ode.Settings{RelTol: -1}, nil, "RelTol"},
		{ode.Settings{RelTol: 2}, nil, "RelTol"},
		{ode.Settings{RelTol: math.NaN()}, nil, "RelTol"},
		{ode.Settings{AbsTol: []float64{1}}, nil, "AbsTol"},
		{ode.Settings{AbsTol: []float64{1, -1}}, nil, "AbsTol[1]"},
		{ode.Settings{MaxStep: -1}, nil, "MaxStep"},
		{ode.Settings{MinStep: 2, MaxStep: 1}, nil, "MinStep"},
		{ode.Settings{InitialStep: math.Inf(1)}, nil, "InitialStep"},
		{ode.Settings{MaxSteps: -3}, nil, "MaxSteps"},
		{ode.Settings{Stops: []float64{math.NaN()}}, nil, "Stops[0]"},
		{ode.Settings{}, []float64{1}, "len(y0)"},
		{ode.Settings{}, []float64{1, math.Inf(1)}, "y0[1]"},
	} {
		y0 := c.y0
		if y0 == nil {
			y0 = []float64{1, 1}
		}
		for _, ic := range integrators {
			err := ic.new().Init(sys, 0, y0, &c.s)
			if err == nil || !strings.Contains(err.Error(), c.field) || !strings.HasPrefix(err.Error(), "ode: ") {
				t.Errorf("%s %+v: error %v, want one naming %s", ic.name, c.s, err, c.field)
			}
		}
	}
}

// TestNoAllocationPerStep checks the hot path: after Init, AdvanceTo allocates nothing (the
// iteration matrix is factorised in place through LAPACK).
func TestNoAllocationPerStep(t *testing.T) {
	// Not parallel: testing.AllocsPerRun refuses to run in a parallel test.
	for _, ic := range integrators {
		for _, sys := range []ode.System{odetest.RobertsonSystem{}, hiddenJac{odetest.RobertsonSystem{}}} {
			if !ic.stiff {
				sys = odetest.OscillatorSystem{}
			}
			in := ic.new()
			y0 := make([]float64, sys.Dim())
			y0[0] = 1
			if err := in.Init(sys, 0, y0, &ode.Settings{RelTol: 1e-6, AbsTol: fill(len(y0), 1e-12)}); err != nil {
				t.Fatal(err)
			}
			tt := 0.0
			lu0 := in.Stats().Factorizations
			const runs = 200
			allocs := testing.AllocsPerRun(runs, func() {
				tt += 1e-3
				if err := in.AdvanceTo(tt); err != nil {
					t.Fatal(err)
				}
			})
			perLU := float64(in.Stats().Factorizations-lu0) / (runs + 1)
			if allocs > 0 {
				t.Errorf("%s %T: %v allocations per AdvanceTo, %.2f factorisations", ic.name, sys, allocs, perLU)
			}
		}
	}
}

// hiddenJac hides a system's analytic Jacobian.
type hiddenJac struct{ odetest.System }

func fill(n int, v float64) []float64 {
	s := make([]float64, n)
	for i := range s {
		s[i] = v
	}
	return s
}

// TestStiffLimit takes one step of h·λ = −1e12 on y′ = λy: an L-stable method returns
// |y₁/y₀| ≈ |R(−1e12)| ≪ 1 (analytic: R(−∞) = 0), where an A-stable but not L-stable
// method would keep |y₁/y₀| near 1.
func TestStiffLimit(t *testing.T) {
	t.Parallel()
	for _, tab := range []*ode.RosenbrockTableau{ode.RODAS4, ode.ROS34PW2} {
		in := ode.NewRosenbrock(tab)
		sys := odetest.ProtheroRobinsonSystem{Lambda: -1e12}
		if err := in.Init(zeroForcing{sys}, 0, []float64{1}, &ode.Settings{InitialStep: 1, MinStep: 1, MaxStep: 1, RelTol: 0.5, AbsTol: []float64{1}}); err != nil {
			t.Fatal(err)
		}
		if _, err := in.Step(); err != nil {
			t.Fatal(err)
		}
		_, y := in.State()
		if math.Abs(y[0]) > 1e-9 {
			t.Errorf("%s: y₁/y₀ = %.3g after one step of hλ = −1e12", tab.Name, y[0])
		}
	}
}

// zeroForcing is y′ = λy.
type zeroForcing struct{ odetest.ProtheroRobinsonSystem }

func (z zeroForcing) Eval(_ float64, y, dydt []float64) error {
	dydt[0] = z.Lambda * y[0]
	return nil
}
