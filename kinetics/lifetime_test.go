package kinetics

import (
	"math"
	"strings"
	"testing"

	"n2pulse/kinetics/build"
	"n2pulse/kinetics/design"
	"n2pulse/units"
)

func TestBenchOfExample(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	b, err := Bench(d, build.Spec{})
	if err != nil {
		t.Fatal(err)
	}
	// The switch loop rings C₁ to the peak in π·sqrt(L_s·C₁) (analytic); set a 12 nH loop with
	// 4 nF, 21.8 ns, far slower than the ~3.7 ns effective C(0) lifetime at 1 atm.
	d.Circuit.SwitchInductance, d.Circuit.SwitchCapacitance = 12e-9, 4e-9
	b, err = Bench(d, build.Spec{})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(b.VoltageRise-math.Pi*math.Sqrt(12e-9*4e-9)) > 1e-12 {
		t.Errorf("voltage rise %g", b.VoltageRise)
	}
	found := false
	for _, w := range b.Warnings {
		found = found || strings.Contains(w, "switch slower")
	}
	if !found {
		t.Errorf("no slow-switch warning: %q", b.Warnings)
	}
}

func TestEffectiveUpperLifetime(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	d.Spectroscopy.UpperLifetime = 40e-9
	// Stern–Volmer (analytic): 1/τ_eff = 1/τ_C + k_q·N, N = p/(k_B·T).
	n := 101325 / (units.Boltzmann * 300)
	want := 1 / (1/40e-9 + d.Levels.UpperQuenchingNitrogen*n)
	if got := EffectiveUpperLifetime(d); math.Abs(got-want) > 1e-12*want {
		t.Errorf("τ_eff = %g, want %g", got, want)
	}
	// τ/(1 + p/p_q) form with p_q = k_B·T/(k_q·τ).
	pq := units.Boltzmann * 300 / (d.Levels.UpperQuenchingNitrogen * 40e-9)
	if got := EffectiveUpperLifetime(d); math.Abs(got-40e-9/(1+101325/pq)) > 1e-12*want {
		t.Errorf("τ_eff = %g, want τ/(1+p/p_q) = %g", got, 40e-9/(1+101325/pq))
	}
}
