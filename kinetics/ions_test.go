package kinetics

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// TestIonSharesHand: the N₂⁺/N₄⁺ shares against hand integration of their rate equations.
// Pure N₂ at 1 atm and 300 K, no ionisation: N = 101325/(k_B·300) = 2.4463e25 m⁻³, so
// ν₃ = 5e-41·N² = 2.9922e10 s⁻¹ (N₂⁺ + 2N₂ → N₄⁺ + N₂ at 5e-29 cm⁶/s), and x₂ = e^(−ν₃t),
// x₄ = 1 − e^(−ν₃t): the steps reproduce both to 1e-12. Air with a constant ionisation
// frequency ν_i: x₂ = e₂ + (1 − e₂)·e^(−Γ₂t) with e₂ = ν_i/Γ₂, and
// x₄ = ν₃·[e₂/Γ₄·(1 − e^(−Γ₄t)) + (1 − e₂)·(e^(−Γ₂t) − e^(−Γ₄t))/(Γ₄ − Γ₂)]; the steps take
// x₂ at its step mean for x₄, a second-order error, within 1e-4 at Γ·Δt ≈ 0.1.
func TestIonSharesHand(t *testing.T) {
	t.Parallel()
	n := units.GasDensity(101325, 300)
	if !scalar.EqualWithinAbsOrRel(n, 2.4463e25, 0, 1e-4) {
		t.Fatalf("N = %g m⁻³", n)
	}
	const dt = 1e-12
	s := newIonShares(design.Gas{Nitrogen: 1}, n, dt)
	if !scalar.EqualWithinAbsOrRel(s.nu3, 2.9922e10, 0, 1e-4) || s.nu2O != 0 || s.nu4O != 0 {
		t.Fatalf("ν₃ = %g, ν₂O = %g, ν₄O = %g s⁻¹", s.nu3, s.nu2O, s.nu4O)
	}
	steps := 100
	for range steps {
		s.step(0)
	}
	tEnd := float64(steps) * dt
	if want := math.Exp(-s.nu3 * tEnd); !scalar.EqualWithinAbsOrRel(s.x2, want, 1e-15, 1e-12) {
		t.Errorf("N₂: x₂ = %.12g, want %.12g", s.x2, want)
	}
	if want := -math.Expm1(-s.nu3 * tEnd); !scalar.EqualWithinAbsOrRel(s.x4, want, 1e-15, 1e-12) {
		t.Errorf("N₂: x₄ = %.12g, want %.12g", s.x4, want)
	}

	a := newIonShares(design.Gas{Nitrogen: 0.79, Oxygen: 0.21}, n, dt)
	// By hand: ν₃ = 5e-41·(0.79N)·N = 2.3638e10, ν₂O = 6e-17·0.21N = 3.0823e8,
	// ν₄O = 2.5e-16·0.21N = 1.2843e9 s⁻¹.
	for _, c := range []struct{ got, want float64 }{{a.nu3, 2.3638e10}, {a.nu2O, 3.0823e8}, {a.nu4O, 1.2843e9}} {
		if !scalar.EqualWithinAbsOrRel(c.got, c.want, 0, 1e-4) {
			t.Errorf("air: rate %g s⁻¹, want %g", c.got, c.want)
		}
	}
	const nui = 5e10
	g2, g4 := nui+a.nu3+a.nu2O, nui+a.nu4O
	e2 := nui / g2
	steps = 2000
	for range steps {
		a.step(nui)
	}
	tEnd = float64(steps) * dt
	x2 := e2 + (1-e2)*math.Exp(-g2*tEnd)
	x4 := a.nu3 * (e2/g4*-math.Expm1(-g4*tEnd) + (1-e2)*(math.Exp(-g2*tEnd)-math.Exp(-g4*tEnd))/(g4-g2))
	if !scalar.EqualWithinAbsOrRel(a.x2, x2, 0, 1e-12) {
		t.Errorf("air: x₂ = %.12g, want %.12g", a.x2, x2)
	}
	if !scalar.EqualWithinAbsOrRel(a.x4, x4, 0, 1e-4) {
		t.Errorf("air: x₄ = %.12g, want %.12g", a.x4, x4)
	}
}

// TestRecombinationProducts: the recombination products enter the pumps as written. On the
// example design (pure N₂, 1 atm) the circuit is solved with the default shares (0.11 into
// C(0), 0.87 into the manifold: J. Appl. Phys. 125, 243301 (2019), Table I, R8a/R9a) and with
// none; the circuit does not depend on them, so ∫P_C dt differs by exactly 0.11 of the
// recombinations counted (1e-9). With the B share alone, the manifold's feed differs by
// exactly 0.87 of them (with the C share too, the extra C(0) passes on to the B state and
// feeds it as well). The recombinations
// with N₄⁺ are a share of all of them, ∫β·n_e² dt over the samples: at 1 atm N₂⁺ turns into
// N₄⁺ in 1/ν₃ = 33 ps while n_e peaks over nanoseconds, so above 0.9 of it, and at most all.
func TestRecombinationProducts(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	_, circ, par, steps := circuitSetup(t, d)
	with, _, err := solveCircuit(circ, d, par, steps, false)
	if err != nil {
		t.Fatal(err)
	}
	solve := func(c, b float64) *waveforms {
		e := d.Clone()
		e.Levels.RecombinationUpperShare, e.Levels.RecombinationLowerShare = c, b
		_, circ, par, _ := circuitSetup(t, e)
		w, _, err := solveCircuit(circ, e, par, steps, false)
		if err != nil {
			t.Fatal(err)
		}
		return w
	}
	without, lowerOnly := solve(0, 0), solve(0, 0.87)
	var dC, all float64
	for k := range with.pumpC {
		dC += (with.pumpC[k] - without.pumpC[k]) * par.TimeStep
		ne := with.density[k]
		all += d.Discharge.Recombination * ne * ne * par.TimeStep
	}
	if with.recombined <= 0 || without.recombined != with.recombined {
		t.Fatalf("recombinations %g and %g m⁻³", with.recombined, without.recombined)
	}
	if !scalar.EqualWithinAbsOrRel(dC, 0.11*with.recombined, 0, 1e-9) {
		t.Errorf("∫ΔP_C dt = %.9g m⁻³, want 0.11 × %.9g", dC, with.recombined)
	}
	if dFed := lowerOnly.manifold.fed - without.manifold.fed; !scalar.EqualWithinAbsOrRel(dFed, 0.87*with.recombined, 0, 1e-9) {
		t.Errorf("manifold fed %.9g m⁻³ more, want 0.87 × %.9g", dFed, with.recombined)
	}
	if share := with.recombined / all; share < 0.9 || share > 1 {
		t.Errorf("N₄⁺ share of the recombinations %.4g, want 0.9–1", share)
	}
	t.Logf("recombinations %.4g m⁻³ (N₄⁺ share %.4f), into C(0) %.4g of ∫P_C %.4g", with.recombined, with.recombined/all, dC, floats.Sum(with.pumpC)*par.TimeStep)
}
