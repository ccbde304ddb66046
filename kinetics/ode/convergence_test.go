package ode

import (
	"math"
	"testing"

	"n2pulse/kinetics/ode/odetest"
)

// fixedStepper gives the tests access to one method's step without error control.
type fixedStepper interface {
	Init(sys System, t0 float64, y0 []float64, s *Settings) error
	try(h float64) (float64, error)
	accepted()
	base() *core
}

func (c *core) base() *core { return c }

// fixedRun integrates p over [T0, End] with n equal steps and returns the final state and the
// largest error estimate (unweighted, as the estimates are compared across step sizes).
func fixedRun(t *testing.T, m fixedStepper, p odetest.Problem, n int) ([]float64, float64) {
	if err := m.Init(p.Sys, p.T0, p.Y0, &Settings{RelTol: 1e-300, AbsTol: ones(len(p.Y0))}); err != nil {
		t.Fatal(err)
	}
	c := m.base()
	h := (p.End - p.T0) / float64(n)
	var est float64
	for k := range n {
		e, err := m.try(h)
		if err != nil {
			t.Fatal(err)
		}
		est = math.Max(est, e)
		if e > 1 { // try skips f(t+h) for "rejected" steps; compute it here
			if err := c.eval(c.t+h, c.yNew, c.fNew); err != nil {
				t.Fatal(err)
			}
		}
		c.accept(h, p.T0+float64(k+1)*h, true, false)
		m.accepted()
	}
	return append([]float64(nil), c.y...), est
}

func ones(n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = 1
	}
	return v
}

// TestObservedOrder measures the order of each method with fixed steps on non-stiff problems
// with exact solutions (y′ = −2t·y², nonlinear and non-autonomous; Prothero–Robinson with
// λ = −1): the least-squares slope of log(error) against log(h) over n, 2n and 4n steps must be
// the method's order p within 0.45, and that of the embedded error estimate, a local error,
// q+1 (analytic: the global error of an order-p method is O(h^p)).
func TestObservedOrder(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name string
		m    func() fixedStepper
		p, q int
		n    int
	}{
		{"RODAS4", func() fixedStepper { return NewRosenbrock(RODAS4) }, 4, 3, 64},
		{"ROS34PW2", func() fixedStepper { return NewRosenbrock(ROS34PW2) }, 3, 2, 64},
		{"DormandPrince", func() fixedStepper { return NewDormandPrince() }, 5, 4, 64},
	}
	for _, c := range cases {
		for _, p := range []odetest.Problem{odetest.Rational(), odetest.ProtheroRobinson(-1)} {
			var errs, ests, hs []float64
			for _, n := range []int{c.n, 2 * c.n, 4 * c.n} {
				y, est := fixedRun(t, c.m(), p, n)
				errs, ests = append(errs, p.MaxRelError(y)), append(ests, est)
				hs = append(hs, (p.End-p.T0)/float64(n))
			}
			order, estOrder := logSlope(hs, errs), logSlope(hs, ests)
			t.Logf("%s %s: errors %.3e, observed order %.2f; estimate order %.2f", c.name, p.Name, errs, order, estOrder)
			if math.Abs(order-float64(c.p)) > 0.45 {
				t.Errorf("%s %s: observed order %.2f, want %d", c.name, p.Name, order, c.p)
			}
			if math.Abs(estOrder-float64(c.q+1)) > 0.45 {
				t.Errorf("%s %s: error estimate shrinks with order %.2f, want %d", c.name, p.Name, estOrder, c.q+1)
			}
		}
	}
}

// logSlope is the least-squares slope of log y against log x.
func logSlope(x, y []float64) float64 {
	var sx, sy, sxx, sxy float64
	n := float64(len(x))
	for i := range x {
		lx, ly := math.Log(x[i]), math.Log(y[i])
		sx, sy, sxx, sxy = sx+lx, sy+ly, sxx+lx*lx, sxy+lx*ly
	}
	return (n*sxy - sx*sy) / (n*sxx - sx*sx)
}

// TestToleranceProportionality checks that the adaptive global error falls in proportion to
// the tolerance (common practice, no source): over four decades of RelTol on the Kepler orbit
// the least-squares slope of log(error) against log(RelTol) must lie in [0.7, 1.3] and every
// error below 1000·RelTol (a global error over a whole orbit, not a local one).
func TestToleranceProportionality(t *testing.T) {
	t.Parallel()
	p := odetest.Kepler(0.3)
	for _, in := range []Integrator{NewRosenbrock(RODAS4), NewRosenbrock(ROS34PW2), NewDormandPrince()} {
		var tols, errs []float64
		for _, rtol := range []float64{1e-4, 1e-5, 1e-6, 1e-7, 1e-8} {
			atol := []float64{rtol, rtol, rtol, rtol}
			if err := in.Init(p.Sys, 0, p.Y0, &Settings{RelTol: rtol, AbsTol: atol}); err != nil {
				t.Fatal(err)
			}
			if err := in.AdvanceTo(p.End); err != nil {
				t.Fatal(err)
			}
			_, y := in.State()
			e := p.MaxRelError(y)
			t.Logf("%T rtol=%.0e error %.3e steps %d", in, rtol, e, in.Stats().Steps)
			if e > 1000*rtol {
				t.Errorf("%T rtol=%g: error %.3g > 1000·RelTol", in, rtol, e)
			}
			tols, errs = append(tols, rtol), append(errs, e)
		}
		slope := logSlope(tols, errs)
		t.Logf("%T: slope of log error against log RelTol %.2f", in, slope)
		if slope < 0.7 || slope > 1.3 {
			t.Errorf("%T: error ∝ RelTol^%.2f, want ≈ 1", in, slope)
		}
	}
}

// TestKeplerInvariants checks conservation of energy and angular momentum along the orbit
// (analytic invariants) at RelTol 1e-9: drift below 1e-7 over one period, sampled at 200 times.
func TestKeplerInvariants(t *testing.T) {
	t.Parallel()
	p := odetest.Kepler(0.5)
	e0, l0 := odetest.KeplerInvariants(p.Y0)
	for _, in := range []Integrator{NewRosenbrock(nil), NewDormandPrince()} {
		if err := in.Init(p.Sys, 0, p.Y0, &Settings{RelTol: 1e-9, AbsTol: []float64{1e-12, 1e-12, 1e-12, 1e-12}}); err != nil {
			t.Fatal(err)
		}
		var worst float64
		for k := 1; k <= 200; k++ {
			if err := in.AdvanceTo(p.End * float64(k) / 200); err != nil {
				t.Fatal(err)
			}
			_, y := in.State()
			e, l := odetest.KeplerInvariants(y)
			worst = math.Max(worst, math.Max(math.Abs(e/e0-1), math.Abs(l/l0-1)))
		}
		t.Logf("%T: worst invariant drift %.2e", in, worst)
		if worst > 1e-7 {
			t.Errorf("%T: invariant drift %.3g > 1e-7", in, worst)
		}
	}
}
