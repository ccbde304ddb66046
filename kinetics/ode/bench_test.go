package ode_test

import (
	"testing"

	"n2pulse/kinetics/ode"
	"n2pulse/kinetics/ode/odetest"
)

// benchProblem integrates p once per iteration and reports steps per second.
func benchProblem(b *testing.B, in ode.Integrator, p odetest.Problem, rtol float64) {
	s := &ode.Settings{RelTol: rtol, AbsTol: fill(len(p.Y0), p.AbsTol)}
	var steps int
	for b.Loop() {
		if err := in.Init(p.Sys, p.T0, p.Y0, s); err != nil {
			b.Fatal(err)
		}
		if err := in.AdvanceTo(p.End); err != nil {
			b.Fatal(err)
		}
		steps += in.Stats().Steps
	}
	b.ReportMetric(float64(steps)/b.Elapsed().Seconds(), "steps/s")
	b.ReportMetric(float64(steps)/float64(b.N), "steps/op")
}

// BenchmarkRobertson: RODAS4 on Robertson's problem to t = 40 at RelTol 1e-6.
func BenchmarkRobertson(b *testing.B) {
	b.Run("RODAS4/analytic", func(b *testing.B) {
		benchProblem(b, ode.NewRosenbrock(ode.RODAS4), odetest.Robertson(), 1e-6)
	})
	b.Run("RODAS4/differences", func(b *testing.B) {
		p := odetest.Robertson()
		p.Sys = hiddenJac{p.Sys}
		benchProblem(b, ode.NewRosenbrock(ode.RODAS4), p, 1e-6)
	})
	b.Run("ROS34PW2/analytic", func(b *testing.B) {
		benchProblem(b, ode.NewRosenbrock(ode.ROS34PW2), odetest.Robertson(), 1e-6)
	})
}

// BenchmarkVanDerPol: the stiff Van der Pol problem (ε = 1e-6) to t = 2 at RelTol 1e-6.
func BenchmarkVanDerPol(b *testing.B) {
	benchProblem(b, ode.NewRosenbrock(ode.RODAS4), odetest.VanDerPol(), 1e-6)
}

// BenchmarkKeplerDormandPrince: one Kepler orbit (e = 0.5) at RelTol 1e-8.
func BenchmarkKeplerDormandPrince(b *testing.B) {
	benchProblem(b, ode.NewDormandPrince(), odetest.Kepler(0.5), 1e-8)
}

// BenchmarkSampling: AdvanceTo on a uniform grid of 10000 points of Robertson's problem.
func BenchmarkSampling(b *testing.B) {
	p := odetest.Robertson()
	in := ode.NewRosenbrock(nil)
	s := &ode.Settings{RelTol: 1e-6, AbsTol: fill(3, p.AbsTol)}
	const n = 10000
	for b.Loop() {
		if err := in.Init(p.Sys, 0, p.Y0, s); err != nil {
			b.Fatal(err)
		}
		for k := 1; k <= n; k++ {
			if err := in.AdvanceTo(p.End * float64(k) / n); err != nil {
				b.Fatal(err)
			}
		}
	}
	b.ReportMetric(float64(n*b.N)/b.Elapsed().Seconds(), "samples/s")
}
