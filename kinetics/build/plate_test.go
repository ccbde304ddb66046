package build

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/units"
)

func near(t *testing.T, what string, got, want, rel float64) {
	t.Helper()
	if !scalar.EqualWithinAbsOrRel(got, want, 0, rel) {
		t.Errorf("%s = %.6g, want %.6g (±%.2g %%)", what, got, want, 100*rel)
	}
}

func TestParallelPlateWorkedExamples(t *testing.T) {
	t.Parallel()
	// A = 2.00e-4 m², d = 1.00 mm, air: C = 1.77 pF. Serway & Jewett, Physics for Scientists
	// and Engineers, worked example "Parallel-plate capacitor" in the capacitance chapter
	// (from memory).
	p := Plates{Length: 0.02, Width: 0.01, Thickness: 1e-3, Permittivity: 1}
	near(t, "C(2 cm², 1 mm)", p.Capacitance(NoFringe), 1.77e-12, 0.005)
	// A = 2.0 cm², d = 2.0 mm: C = 8.854e-13 F (worked answer seen:
	// https://socratic.org/questions/a-parallel-plate-capacitor-has-an-area-of-2-0-cm-2-and-the-plates-are-separated-).
	p = Plates{Length: 0.02, Width: 0.01, Thickness: 2e-3, Permittivity: 1}
	near(t, "C(2 cm², 2 mm)", p.Capacitance(NoFringe), 8.854e-13, 0.001)
}

func TestPalmerFringe(t *testing.T) {
	t.Parallel()
	// Analytic limits of Palmer's factors: they exceed 1, grow with d/w and vanish as d → 0.
	thin := Plates{Length: 0.3, Width: 0.2, Thickness: 1e-5, Permittivity: 3}
	r := thin.Capacitance(Palmer) / thin.Capacitance(NoFringe)
	if r <= 1 || r > 1.001 {
		t.Errorf("Palmer factor for d/w = 5e-5 is %.6g, want just above 1", r)
	}
	thick := Plates{Length: 0.3, Width: 0.2, Thickness: 5e-3, Permittivity: 3}
	rt := thick.Capacitance(Palmer) / thick.Capacitance(NoFringe)
	// Hand evaluation of the formula: [1 + 0.005/(0.2π)(1+ln(0.4π/0.005))]·[1 + 0.005/(0.3π)(1+ln(0.6π/0.005))].
	want := (1 + 0.005/(0.2*math.Pi)*(1+math.Log(0.4*math.Pi/0.005))) * (1 + 0.005/(0.3*math.Pi)*(1+math.Log(0.6*math.Pi/0.005)))
	near(t, "Palmer factor, d = 5 mm", rt, want, 1e-12)
	if rt <= r {
		t.Errorf("Palmer factor does not grow with thickness: %g ≤ %g", rt, r)
	}
}

func TestParallelPlateLine(t *testing.T) {
	t.Parallel()
	// Parallel-plate line formulas L' = μd/W, C' = εW/d, Z₀ = sqrt(μ/ε)·d/W, from the
	// transmission-line parameter sheet https://davidwoolsey.com/physics/reference/transmissonline.html
	// (seen). Worked case: strip w = 10 mm over d = 0.1 mm of air (the geometry of a microstrip
	// problem in Ida, Engineering Electromagnetics, Fig. 14.34, seen as a problem statement):
	// Z₀ = 376.73 Ω × 0.01 = 3.767 Ω, wave speed c.
	p := Plates{Length: 1, Width: 0.01, Thickness: 1e-4, Permittivity: 1}
	near(t, "Z₀", p.Impedance(), 3.767, 0.001)
	near(t, "L'", p.InductancePerLength(), units.VacuumPermeability*0.01, 1e-12)
	near(t, "C'", p.CapacitancePerLength(), units.VacuumPermittivity*100, 1e-12)
	// Consistency (analytic): Z₀ = sqrt(L'/C'), transit = l·sqrt(L'C') for any ε_r.
	for _, er := range []float64{1, 2.03, 4.5} {
		q := Plates{Length: 0.25, Width: 0.12, Thickness: 1.6e-3, Permittivity: er}
		near(t, "Z₀ vs sqrt(L'/C')", q.Impedance(), math.Sqrt(q.InductancePerLength()/q.CapacitancePerLength()), 1e-6)
		near(t, "transit vs l·sqrt(L'C')", q.TransitTime(), q.Length*math.Sqrt(q.InductancePerLength()*q.CapacitancePerLength()), 1e-6)
		// The ideal capacitance is the line's C'·l.
		near(t, "C vs C'·l", q.Capacitance(NoFringe), q.CapacitancePerLength()*q.Length, 1e-12)
	}
}

func TestLoopInductanceEnergy(t *testing.T) {
	t.Parallel()
	// The edge-fed loop inductance L'·l/3 is the magnetic energy of a current falling linearly
	// to zero: check it against a numerical integral of ½L'I(x)² (analytic).
	p := Plates{Length: 0.3, Width: 0.25, Thickness: 0.5e-3, Permittivity: 3.3}
	n := 100000
	sum := 0.0
	for i := 0; i < n; i++ {
		x := (float64(i) + 0.5) / float64(n) * p.Length
		I := 1 - x/p.Length
		sum += p.InductancePerLength() * I * I * p.Length / float64(n)
	}
	near(t, "L_loop", p.LoopInductance(), sum, 1e-6)
	r := Rails{Length: 0.2, Height: 5e-3, Gap: 1.5e-3}
	near(t, "rails", r.Inductance(), units.VacuumPermeability*1.5e-3*5e-3/0.2, 1e-12)
}
