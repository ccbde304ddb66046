package build

import (
	"math"
	"testing"

	"n2pulse/units"
)

const torrCM = units.Torr * 0.01 // 1 Torr·cm in Pa m

func TestPaschenMinimumFormula(t *testing.T) {
	t.Parallel()
	g, err := Gas("nitrogen")
	if err != nil {
		t.Fatal(err)
	}
	pd, v := g.Minimum()
	// The breakdown curve has its minimum where Minimum says (analytic): neighbours are higher
	// and the value there equals V_min.
	vb, err := g.Breakdown(pd)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "V_b(pd_min)", vb, v, 1e-12)
	for _, f := range []float64{0.9, 1.1} {
		if w, _ := g.Breakdown(f * pd); w <= v {
			t.Errorf("V_b(%.1f pd_min) = %g ≤ V_min %g", f, w, v)
		}
	}
	// physics-data.md §5d (derived from the seen A = 12, B = 342, γ = 0.066): (pd)_min = 0.63
	// Torr cm, V_min = 216 V.
	near(t, "(pd)_min", pd/torrCM, 0.63, 0.02)
	near(t, "V_min", v, 216, 0.01)
}

func TestPaschenAtmosphere(t *testing.T) {
	t.Parallel()
	g, _ := Gas("nitrogen")
	// Uniform-field breakdown of a 1 cm N₂ gap at 101.3 kPa is about 30.4 kV: sparking chapter
	// of a Taylor & Francis high-voltage text, doi:10.1201/9780203025260-14 (abstract seen).
	// The Townsend fit is extrapolated here (E/p ≈ 40 V cm⁻¹ Torr⁻¹), so 15 % is allowed.
	v, err := g.Breakdown(ReducedPD(101300, 0.01, 293.15))
	if err != nil {
		t.Fatal(err)
	}
	near(t, "V_b(1 atm, 1 cm)", v, 30.4e3, 0.15)
	// Paschen's law holds in N·d: doubling T at fixed p halves N and gives the same V_b as
	// half the pressure (analytic).
	a, _ := g.Breakdown(ReducedPD(50650, 0.01, 293.15))
	b, _ := g.Breakdown(ReducedPD(101300, 0.01, 586.3))
	near(t, "V_b(T scaling)", b, a, 1e-12)
	// Left of the minimum where the logarithm turns negative there is no Townsend breakdown.
	if _, err := g.Breakdown(0.1 * torrCM); err == nil {
		t.Error("no error at pd = 0.1 Torr cm, left of the Paschen branch")
	}
	if _, err := g.Breakdown(math.NaN()); err == nil {
		t.Error("no error at pd = NaN")
	}
}

// TestHoldingPD: the p·d at which air's static breakdown equals the charge voltage, against a
// hand calculation of the same formula V_b = B·pd/ln(A·pd/ln(1+1/γ)) with A = 15 cm⁻¹ Torr⁻¹,
// B = 365 V cm⁻¹ Torr⁻¹, γ = 0.01 (data/materials.toml, townsend.air: Bazelyan & Raizer, Spark
// Discharge, p. 32, as quoted there), solved by bisection in Python 3.11 (float64, 200 halvings):
// 346.52 Torr cm at 18 kV (4.559 mm at 760 Torr), 391.74 Torr cm at 20 kV. materials.toml rounds
// A and B to 4 figures in SI, hence 1e-3.
func TestHoldingPD(t *testing.T) {
	t.Parallel()
	g, err := Gas("air")
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ v, pd float64 }{{18e3, 346.52}, {20e3, 391.74}} {
		pd, err := g.HoldingPD(c.v)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "holding pd", pd/torrCM, c.pd, 1e-3)
		// The returned p·d breaks down at v (to the bisection's width) and a 1 % shorter gap
		// does not hold (the definition).
		vb, _ := g.Breakdown(pd)
		near(t, "V_b(holding pd)", vb, c.v, 1e-9)
		if w, _ := g.Breakdown(0.99 * pd); w >= c.v {
			t.Errorf("V_b(0.99 pd) = %g ≥ %g: pd is not the smallest that holds", w, c.v)
		}
	}
	// At or below the minimum sparking voltage every gap right of the minimum holds.
	pdMin, vMin := g.Minimum()
	if pd, err := g.HoldingPD(0.5 * vMin); err != nil || pd != pdMin {
		t.Errorf("HoldingPD(V_min/2) = %g, %v; want the minimum %g", pd, err, pdMin)
	}
	for _, v := range []float64{0, -1, math.NaN(), math.Inf(1)} {
		if _, err := g.HoldingPD(v); err == nil {
			t.Errorf("HoldingPD(%g): no error", v)
		}
	}
}
