package kinetics

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/ode"
	"n2pulse/kinetics/ode/odetest"
)

// jacobianCases are circuits of every topology, switch model and shunt, on the example
// channel and the shipped N₂ swarm table.
func jacobianCases(t *testing.T) map[string]*design.Design {
	t.Helper()
	cases := map[string]*design.Design{}
	for name, set := range map[string][]string{
		"example (Blumlein, Rompe–Weizel, shunt inductor)": nil,
		"Blumlein, exponential switch, shunt resistor": {"switch.model", "exponential",
			"circuit.shunt_inductance", "0 H", "circuit.shunt_resistance", "20 ohm"},
		"charge transfer, Rompe–Weizel, shunt inductor and resistor": {"circuit.topology", "transfer",
			"circuit.shunt_resistance", "50 ohm"},
		"charge transfer, ideal switch, no shunt": {"circuit.topology", "transfer",
			"switch.model", "ideal", "circuit.shunt_inductance", "0 H"},
	} {
		d := design.ExampleDesign()
		for i := 0; i < len(set); i += 2 {
			if err := d.Set(set[i], set[i+1]); err != nil {
				t.Fatalf("%s: %v", name, err)
			}
		}
		cases[name] = d
	}
	return cases
}

// trajectory integrates the circuit of d and returns its state at a few times through the
// discharge, where every term of the Jacobian is alive.
func trajectory(t *testing.T, d *design.Design) (*circuit, [][]float64, []float64) {
	t.Helper()
	table, err := swarmTable(d, t.TempDir())
	if err != nil {
		t.Fatal(err)
	}
	c := newCircuit(d, table)
	y0, _ := c.initial(d.Circuit.ChargeVoltage, d.Discharge.SeedDensity)
	times := []float64{0.7e-9, 3.1e-9, 6.3e-9, 11.9e-9, 23.3e-9}
	atol := make([]float64, nState)
	for i := range atol {
		atol[i] = 1e-9
	}
	in := ode.NewRosenbrock(nil)
	if err := in.Init(c, 0, y0, &ode.Settings{RelTol: 1e-6, AbsTol: atol, Stops: times}); err != nil {
		t.Fatal(err)
	}
	var ys [][]float64
	for _, tk := range times {
		if err := in.AdvanceTo(tk); err != nil {
			t.Fatal(err)
		}
		_, y := in.State()
		ys = append(ys, append([]float64(nil), y...))
	}
	return c, ys, times
}

// TestCircuitJacobian compares the analytic Jacobian with central differences of Eval: the
// whole matrix with the shared helper of package ode, and entry by entry, each row on the
// scale of its largest term.
func TestCircuitJacobian(t *testing.T) {
	t.Parallel()
	for name, d := range jacobianCases(t) {
		c, ys, times := trajectory(t, d)
		// Each state and its mirror image, every voltage and current reversed (the channel
		// voltage of a ringing discharge swings negative).
		for k := range len(ys) {
			m := append([]float64(nil), ys[k]...)
			for _, i := range []int{iV1, iV2, iIs, iIc, iVg, iIsh} {
				m[i] = -m[i]
			}
			ys, times = append(ys, m), append(times, times[k])
		}
		for k, y := range ys {
			tk := times[k]
			// A share far below 1 (x₂ falls to 1e-40 once the field is off) would get a relative
			// difference step lost in the rounding of its row: lifted to 1e-3, a state as good
			// as any for comparing derivatives.
			y[iX2], y[iX4] = math.Max(y[iX2], 1e-3), math.Max(y[iX4], 1e-3)
			// Central differences, step 1e-5 of each component (common practice, no source).
			if e := odetest.JacobianError(c, tk, y, 1e-5); e > 1e-6 {
				t.Errorf("%s, t = %g s: Jacobian deviates from central differences by %.2g", name, tk, e)
			}
			ja := mat.NewDense(nState, nState, nil)
			c.Jacobian(tk, y, ja)
			f0, fp, fm := make([]float64, nState), make([]float64, nState), make([]float64, nState)
			_ = c.Eval(tk, y, f0)
			col := make([][]float64, nState) // D_ij·δ_j
			step := make([]float64, nState)
			for j := range nState {
				step[j] = 1e-6 * math.Max(math.Abs(y[j]), 1e-6)
				yp := append([]float64(nil), y...)
				ym := append([]float64(nil), y...)
				yp[j] += step[j]
				ym[j] -= step[j]
				_ = c.Eval(tk, yp, fp)
				_ = c.Eval(tk, ym, fm)
				col[j] = make([]float64, nState)
				for i := range nState {
					col[j][i] = (fp[i] - fm[i]) / 2
				}
			}
			for i := range nState {
				scale := 0.0
				for j := range nState {
					scale = math.Max(scale, math.Abs(col[j][i]))
				}
				for j := range nState {
					got := ja.At(i, j) * step[j]
					if math.Abs(got-col[j][i]) > 1e-6*scale {
						t.Errorf("%s, t = %g s: ∂f[%d]/∂y[%d] = %.8g, differences %.8g", name, tk, i, j,
							ja.At(i, j), col[j][i]/step[j])
					}
				}
			}
			// ∂f/∂t against a central difference in t.
			ft := make([]float64, nState)
			c.TimeDerivative(tk, y, ft)
			h := 1e-6 * tk
			_ = c.Eval(tk+h, y, fp)
			_ = c.Eval(tk-h, y, fm)
			for i := range nState {
				fd := (fp[i] - fm[i]) / (2 * h)
				if math.Abs(ft[i]-fd) > 1e-6*math.Abs(fd)+1e-12*math.Abs(f0[i]) {
					t.Errorf("%s, t = %g s: ∂f[%d]/∂t = %.8g, differences %.8g", name, tk, i, ft[i], fd)
				}
			}
		}
	}
}

// The circuit test systems (a fixed conductance for the plasma) have the same Jacobian as
// their differences.
func TestFixedCircuitJacobian(t *testing.T) {
	t.Parallel()
	for _, topo := range []design.Topology{design.Blumlein, design.ChargeTransfer} {
		c := testCircuit(topo, 3e-9, 2e-9, 10e-9, 0.3)
		c.cg, c.lc, c.conductance, c.lsh, c.rsh = 20e-12, 3e-9, 0.5, 1e-6, 40
		y := []float64{9e3, -2e3, 150, 80, 4e3, 3, math.Log(1e18), 1e-5, 1e-3, 2e-3, 1e-4, 0.2, 0.7}
		if e := odetest.JacobianError(c, 1e-9, y, 1e-5); e > 1e-7 {
			t.Errorf("%s: Jacobian deviates from central differences by %.2g", topo, e)
		}
	}
}
