package kinetics

import (
	"math"
	"testing"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/ode"
)

// testCircuit is a circuit whose plasma is a fixed conductance, for checks against circuit
// theory. The gap capacitance is made negligible and the conductance critically damps the
// channel loop's L_c·C_g ringing while drawing almost no current, so that the switch loop
// alone is a series RLC.
func testCircuit(topo design.Topology, c1, c2, ls, rs float64) *circuit {
	return &circuit{
		topo: topo, c1: c1, c2: c2, cg: 1e-18, ls: ls, lc: 1e-6,
		sw:    design.Switch{Model: design.IdealSwitch, OnResistance: rs},
		fixed: true, conductance: 1e-6,
		density: 2.4e25, gap: 1e-3, area: 1e-4,
	}
}

// integrate advances the test circuit and calls visit at each sample time.
func integrate(t *testing.T, c *circuit, y0 []float64, times []float64, visit func(tk float64, y []float64)) {
	t.Helper()
	atol := make([]float64, nState)
	for i := range atol {
		atol[i] = 1e-9
	}
	integ := ode.NewRosenbrock(nil)
	if err := integ.Init(c, 0, y0, &ode.Settings{RelTol: 1e-9, AbsTol: atol, Stops: times}); err != nil {
		t.Fatal(err)
	}
	for _, tk := range times {
		if err := integ.AdvanceTo(tk); err != nil {
			t.Fatal(err)
		}
		_, y := integ.State()
		visit(tk, y)
	}
}

// seriesRLC is the textbook underdamped series RLC: a capacitor C charged to v0 discharging
// through L and R from t = 0 (e.g. Nilsson & Riedel, Electric Circuits, ch. 8). It returns the
// loop current [A] and the capacitor voltage [V].
func seriesRLC(v0, l, c, r, t float64) (i, v float64) {
	a := r / (2 * l)
	w := math.Sqrt(1/(l*c) - a*a)
	e := math.Exp(-a * t)
	return v0 / (w * l) * e * math.Sin(w*t), v0 * e * (math.Cos(w*t) + a/w*math.Sin(w*t))
}

func TestCircuitSeriesRLC(t *testing.T) {
	t.Parallel()
	const v0, l, r = 10e3, 20e-9, 0.5
	for _, tc := range []struct {
		topo   design.Topology
		c1, c2 float64
		ceff   float64
	}{
		{design.Blumlein, 3e-9, 3e-9, 3e-9},                     // the switch shorts C₁ alone
		{design.ChargeTransfer, 4e-9, 2e-9, 4e-9 * 2e-9 / 6e-9}, // C_s and C_p in series
	} {
		c := testCircuit(tc.topo, tc.c1, tc.c2, l, r)
		y0, _ := c.initial(v0, 1)
		period := 2 * math.Pi * math.Sqrt(l*tc.ceff)
		var times []float64
		for k := 1; k <= 40; k++ {
			times = append(times, float64(k)*period/16)
		}
		iScale := v0 / math.Sqrt(l/tc.ceff)
		worst := 0.0
		integrate(t, c, y0, times, func(tk float64, y []float64) {
			i, _ := seriesRLC(v0, l, tc.ceff, r, tk)
			worst = math.Max(worst, math.Abs(y[iIs]-i)/iScale)
		})
		// Analytic series RLC; tolerance 1e-4 of the characteristic current V₀/√(L/C).
		if worst > 1e-4 {
			t.Errorf("%s: switch current deviates from the series RLC by %.2g of V0/Z", tc.topo, worst)
		}
	}
}

// TestTransferEfficiency checks the lossless capacitor-to-capacitor transfer: at the first
// current zero C_p holds 4·C_s·C_p/(C_s+C_p)² of the stored energy (textbook result, e.g.
// Mesyats, Pulsed Power, Springer 2005, ch. 1; common practice).
func TestTransferEfficiency(t *testing.T) {
	t.Parallel()
	for _, ratio := range []float64{1, 0.5, 0.25} {
		cs, cp := 4e-9, 4e-9*ratio
		c := testCircuit(design.ChargeTransfer, cs, cp, 15e-9, 0)
		y0, stored := c.initial(20e3, 1)
		half := math.Pi * math.Sqrt(15e-9*cs*cp/(cs+cp))
		integrate(t, c, y0, []float64{half}, func(_ float64, y []float64) {
			got := 0.5 * cp * y[iV2] * y[iV2] / stored
			want := 4 * cs * cp / ((cs + cp) * (cs + cp))
			if math.Abs(got-want) > 1e-4 {
				t.Errorf("Cp/Cs = %g: transfer efficiency %.6f, want %.6f", ratio, got, want)
			}
		})
	}
}

// TestCircuitEnergyBalance: with a resistive load and a lossy switch, stored energy equals
// what remains plus what was dissipated (conservation; exact for the circuit equations).
func TestCircuitEnergyBalance(t *testing.T) {
	t.Parallel()
	for _, topo := range []design.Topology{design.Blumlein, design.ChargeTransfer} {
		c := testCircuit(topo, 3e-9, 2e-9, 10e-9, 0.3)
		c.cg, c.lc, c.conductance = 20e-12, 3e-9, 1/2.0
		c.lsh = 1e-6
		y0, stored := c.initial(12e3, 1)
		integrate(t, c, y0, []float64{5e-9, 30e-9, 100e-9}, func(tk float64, y []float64) {
			res := math.Abs(stored-(c.storedEnergy(y)+y[iESwitch]+y[iEPlasma]+y[iEShunt])) / stored
			if res > 1e-6 {
				t.Errorf("%s t=%g: energy residual %.2g", topo, tk, res)
			}
		})
	}
}
