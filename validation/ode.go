package validation

import (
	"math"

	"n2pulse/kinetics/ode"
	"n2pulse/kinetics/ode/odetest"
)

func init() {
	Register("ode", odeChecks)
}

// odeChecks runs the stiff integrator the circuit uses (RODAS4) on the standard stiff test
// problems at the tolerance class of a laser run and compares with their reference solutions.
func odeChecks() ([]Check, error) {
	var cs []Check
	run := func(p odetest.Problem, rtol float64) ([]float64, error) {
		atol := make([]float64, len(p.Y0))
		for i := range atol {
			atol[i] = p.AbsTol
		}
		in := ode.NewRosenbrock(ode.RODAS4)
		if err := in.Init(p.Sys, p.T0, p.Y0, &ode.Settings{RelTol: rtol, AbsTol: atol}); err != nil {
			return nil, err
		}
		if err := in.AdvanceTo(p.End); err != nil {
			return nil, err
		}
		_, y := in.State()
		return append([]float64(nil), y...), nil
	}
	rob := odetest.Robertson()
	y, err := run(rob, 1e-8)
	for i, name := range []string{"y1", "y2", "y3"} {
		c := Check{ID: "ode.robertson.t40." + name, Quantity: "Robertson kinetics at t = 40, " + name + " (RODAS4, RelTol 1e-8)",
			Reference: rob.Ref[i], Tolerance: 1e-6, Mode: Relative, Kind: FromMemory, Source: rob.Source, Err: err}
		if err == nil {
			c.Computed = y[i]
		}
		cs = append(cs, c)
	}
	vdp := odetest.VanDerPol()
	y, err = run(vdp, 1e-8)
	for i, name := range []string{"y1", "y2"} {
		c := Check{ID: "ode.vanderpol.t2." + name, Quantity: "Van der Pol ε = 1e-6 at t = 2, " + name + " (RODAS4, RelTol 1e-8)",
			Reference: vdp.Ref[i], Tolerance: 1e-6, Mode: Relative, Kind: FromMemory, Source: vdp.Source, Err: err}
		if err == nil {
			c.Computed = y[i]
		}
		cs = append(cs, c)
	}
	pr := odetest.ProtheroRobinson(-1e9)
	y, err = run(pr, 1e-6)
	c := Check{ID: "ode.prothero-robinson.1e9", Quantity: "Prothero–Robinson λ = −1e9, y(2) = sin 2 (RODAS4, RelTol 1e-6)",
		Reference: math.Sin(2), Tolerance: 1e-5, Mode: Relative, Kind: Analytic, Source: "exact solution sin t (Prothero & Robinson, Math. Comp. 28, 145, 1974)", Err: err}
	if err == nil {
		c.Computed = y[0]
	}
	cs = append(cs, c)
	return cs, nil
}
