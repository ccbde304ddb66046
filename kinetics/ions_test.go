package kinetics

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/ode"
	"n2pulse/units"
)

// shareSystem is the share equations of ionChemistry alone, at a constant ionisation
// frequency nui [s⁻¹], electron density ne [m⁻³] and recombination coefficients a [m³/s].
type shareSystem struct {
	ions ionChemistry
	nui  float64
	ne   float64
	a    [3]float64
}

func (s shareSystem) Dim() int { return 2 }

func (s shareSystem) Eval(_ float64, y, dy []float64) error {
	dy[0], dy[1] = s.ions.shareRates(y[0], y[1], s.nui, s.ne, s.a)
	return nil
}

// integrateShares integrates s from x₂ = 1, x₄ = 0 to tEnd [s] at relative tolerance 1e-10.
func integrateShares(t *testing.T, s shareSystem, tEnd float64) (x2, x4 float64) {
	t.Helper()
	in := ode.NewRosenbrock(nil)
	if err := in.Init(s, 0, []float64{1, 0}, &ode.Settings{RelTol: 1e-10, AbsTol: []float64{1e-14, 1e-14}, Stops: []float64{tEnd}}); err != nil {
		t.Fatal(err)
	}
	if err := in.AdvanceTo(tEnd); err != nil {
		t.Fatal(err)
	}
	_, y := in.State()
	return y[0], y[1]
}

// TestIonSharesHand: the N₂⁺/N₄⁺ share equations the circuit carries against their closed
// forms. Pure N₂ at 1 atm and 300 K, no ionisation: N = 101325/(k_B·300) = 2.4463e25 m⁻³, so
// ν₃ = 5e-41·N² = 2.9922e10 s⁻¹ (N₂⁺ + 2N₂ → N₄⁺ + N₂ at 5e-29 cm⁶/s), and x₂ = e^(−ν₃t),
// x₄ = 1 − e^(−ν₃t). Air with a constant ionisation frequency ν_i and no recombination:
// x₂ = e₂ + (1 − e₂)·e^(−Γ₂t) with e₂ = ν_i/Γ₂, Γ₂ = ν_i + ν₃ + ν₂O, and
// x₄ = ν₃·[e₂/Γ₄·(1 − e^(−Γ₄t)) + (1 − e₂)·(e^(−Γ₂t) − e^(−Γ₄t))/(Γ₄ − Γ₂)], Γ₄ = ν_i + ν₄O.
// Both to 1e-7 (the integration's tolerance is 1e-10). With one coefficient for every ion,
// recombination leaves the shares alone (the rates equal those without electrons, exactly).
func TestIonSharesHand(t *testing.T) {
	t.Parallel()
	n := units.GasDensity(101325, 300)
	if !scalar.EqualWithinAbsOrRel(n, 2.4463e25, 0, 1e-4) {
		t.Fatalf("N = %g m⁻³", n)
	}
	s := newIonChemistry(design.Gas{Nitrogen: 1}, n)
	if !scalar.EqualWithinAbsOrRel(s.nu3, 2.9922e10, 0, 1e-4) || s.nu2O != 0 || s.nu4O != 0 {
		t.Fatalf("ν₃ = %g, ν₂O = %g, ν₄O = %g s⁻¹", s.nu3, s.nu2O, s.nu4O)
	}
	tEnd := 1e-10
	x2, x4 := integrateShares(t, shareSystem{ions: s}, tEnd)
	if want := math.Exp(-s.nu3 * tEnd); !scalar.EqualWithinAbsOrRel(x2, want, 1e-12, 1e-7) {
		t.Errorf("N₂: x₂ = %.12g, want %.12g", x2, want)
	}
	if want := -math.Expm1(-s.nu3 * tEnd); !scalar.EqualWithinAbsOrRel(x4, want, 1e-12, 1e-7) {
		t.Errorf("N₂: x₄ = %.12g, want %.12g", x4, want)
	}

	a := newIonChemistry(design.Gas{Nitrogen: 0.79, Oxygen: 0.21}, n)
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
	tEnd = 2e-9
	x2, x4 = integrateShares(t, shareSystem{ions: a, nui: nui}, tEnd)
	w2 := e2 + (1-e2)*math.Exp(-g2*tEnd)
	w4 := a.nu3 * (e2/g4*-math.Expm1(-g4*tEnd) + (1-e2)*(math.Exp(-g2*tEnd)-math.Exp(-g4*tEnd))/(g4-g2))
	if !scalar.EqualWithinAbsOrRel(x2, w2, 1e-12, 1e-7) {
		t.Errorf("air: x₂ = %.12g, want %.12g", x2, w2)
	}
	if !scalar.EqualWithinAbsOrRel(x4, w4, 1e-12, 1e-7) {
		t.Errorf("air: x₄ = %.12g, want %.12g", x4, w4)
	}
	same := [3]float64{2e-13, 2e-13, 2e-13}
	d2, d4 := a.shareRates(0.3, 0.5, nui, 1e21, same)
	f2, f4 := a.shareRates(0.3, 0.5, nui, 0, same)
	if d2 != f2 || d4 != f4 {
		t.Errorf("one coefficient for every ion moves the shares: %g, %g against %g, %g s⁻¹", d2, d4, f2, f4)
	}
}

// TestRecombinationCoefficientHand: the mean recombination coefficient ᾱ = Σ α_j·x_j against
// a hand calculation (python3, math only) at mean electron energies of 1.5 and 3 eV
// (T_e = ⅔·⟨ε⟩/k_B = 11604.5 K and 23209.0 K), with the published coefficients
// e + N₂⁺ 1.8e-7·(300/T_e)^0.39 cm³/s (Mehr & Biondi 1969), e + N₄⁺ 2e-6·(300/T_e)^0.5 (Kossyi
// et al. 1992), e + O₂⁺ 2.4e-7·(300/T_e)^0.7 (Peverall et al. 2001), and the steady shares at
// ν_i = 1e9 s⁻¹ without recombination: in N₂ at 1 atm x₂ = ν_i/(ν_i + ν₃) = 0.032339,
// x₄ = 0.96766; in air x₂ = ν_i/(ν_i + ν₃ + ν₂O) = 0.040085, x₄ = ν₃·x₂/(ν_i + ν₄O) = 0.41481.
// By hand: N₂ 3.1257e-13 and 2.2110e-13 m³/s, air 1.4525e-13 and 1.0188e-13 m³/s (to 1e-4).
// Below the gas temperature T_e is held at it.
func TestRecombinationCoefficientHand(t *testing.T) {
	t.Parallel()
	n := units.GasDensity(101325, 300)
	const nui = 1e9
	for _, c := range []struct {
		name   string
		gas    design.Gas
		ev     float64
		te, ab float64
	}{
		{"N₂, 1.5 eV", design.Gas{Nitrogen: 1}, 1.5, 11604.518, 3.1257e-13},
		{"N₂, 3 eV", design.Gas{Nitrogen: 1}, 3, 23209.036, 2.2110e-13},
		{"air, 1.5 eV", design.Gas{Nitrogen: 0.79, Oxygen: 0.21}, 1.5, 11604.518, 1.4525e-13},
		{"air, 3 eV", design.Gas{Nitrogen: 0.79, Oxygen: 0.21}, 3, 23209.036, 1.0188e-13},
	} {
		s := newIonChemistry(c.gas, n)
		x2 := nui / (nui + s.nu3 + s.nu2O)
		x4 := s.nu3 * x2 / (nui + s.nu4O)
		te, _ := electronTemperature(c.ev*units.ElementaryCharge, 300)
		if !scalar.EqualWithinAbsOrRel(te, c.te, 0, 1e-6) {
			t.Errorf("%s: T_e = %.8g K, want %.8g", c.name, te, c.te)
		}
		a, _ := recombination(te)
		if got := meanRecombination(x2, x4, a); !scalar.EqualWithinAbsOrRel(got, c.ab, 0, 1e-4) {
			t.Errorf("%s: ᾱ = %.5g m³/s, want %.5g", c.name, got, c.ab)
		}
	}
	if te, dte := electronTemperature(0.01*units.ElementaryCharge, 300); te != 300 || dte != 0 {
		t.Errorf("T_e at 0.01 eV = %g K (slope %g), want the gas's 300 K", te, dte)
	}
	// discharge.recombination_scale multiplies the computed coefficients and their slopes, and
	// leaves a coefficient the design sets alone.
	mean := 3 * units.ElementaryCharge
	one, two := &circuit{tgas: 300, recScale: 1}, &circuit{tgas: 300, recScale: 2}
	a1, d1 := one.recombinationAt(mean)
	a2, d2 := two.recombinationAt(mean)
	for j := range a1 {
		if a2[j] != 2*a1[j] || d2[j] != 2*d1[j] {
			t.Errorf("scale 2, ion %d: α %g and %g, slope %g and %g", j, a1[j], a2[j], d1[j], d2[j])
		}
	}
	if a, _ := (&circuit{tgas: 300, recScale: 2, beta: 2e-13}).recombinationAt(mean); a != [3]float64{2e-13, 2e-13, 2e-13} {
		t.Errorf("a set β with scale 2: %v, want 2e-13 for every ion", a)
	}
}

// TestElectronBalance: along the example circuit's discharge (N₂ and air) the change of
// ln n_e equals ∫[(k_ion − k_att)·N − ᾱ·n_e] dt, with ᾱ recomputed here from the carried
// shares and the published coefficients at T_e = ⅔·⟨ε⟩/k_B (trapezoid over 4000 interpolated
// points, to 1e-3 of the gross ionisation), and the shares stay shares: x₂, x₄ ≥ 0 and
// x₂ + x₄ ≤ 1 (the positive ions are conserved between the three kinds).
func TestElectronBalance(t *testing.T) {
	t.Parallel()
	for _, air := range []bool{false, true} {
		d := design.ExampleDesign()
		if air {
			d.Gas.Nitrogen, d.Gas.Oxygen = 0.79, 0.21
		}
		table, err := swarmTable(d, t.TempDir())
		if err != nil {
			t.Fatal(err)
		}
		c := newCircuit(d, table)
		y0, _ := c.initial(d.Circuit.ChargeVoltage, d.Discharge.SeedDensity)
		const tEnd, m = 20e-9, 4000
		atol := make([]float64, nState)
		for i := range atol {
			atol[i] = 1e-9
		}
		in := ode.NewRosenbrock(nil)
		if err := in.Init(c, 0, y0, &ode.Settings{RelTol: 1e-7, AbsTol: atol, Stops: []float64{tEnd}}); err != nil {
			t.Fatal(err)
		}
		y := make([]float64, nState)
		var gain, loss, prevG, prevL float64
		k := 0
		for k <= m {
			tk, err := in.Step()
			if err != nil {
				t.Fatal(err)
			}
			for ; k <= m && float64(k)*tEnd/m <= tk; k++ {
				if err := in.Interpolate(float64(k)*tEnd/m, y); err != nil {
					t.Fatal(err)
				}
				x2, x4 := y[iX2], y[iX4]
				if x2 < -1e-9 || x4 < -1e-9 || x2+x4 > 1+1e-9 {
					t.Fatalf("air %v, t = %g s: shares x₂ = %g, x₄ = %g", air, float64(k)*tEnd/m, x2, x4)
				}
				var r [nRates]float64
				c.rates.at(c.reducedField(y[iVg]), rateDrift, rateMean+1, &r, nil)
				te := math.Max(2*r[rateMean]/(3*units.Boltzmann), d.Gas.Temperature)
				q := 300 / te
				ab := 1.8e-13*math.Pow(q, 0.39)*x2 + 2e-12*math.Pow(q, 0.5)*x4 + 2.4e-13*math.Pow(q, 0.7)*(1-x2-x4)
				g, l := (r[rateIon]-r[rateAtt])*c.density, ab*math.Exp(y[iLnNe])
				if k > 0 {
					gain += 0.5 * (g + prevG) * tEnd / m
					loss += 0.5 * (l + prevL) * tEnd / m
				}
				prevG, prevL = g, l
			}
		}
		dln := y[iLnNe] - y0[iLnNe]
		if math.Abs(dln-(gain-loss)) > 1e-3*math.Abs(gain) {
			t.Errorf("air %v: Δln n_e = %.6g, ∫ionisation − ∫recombination = %.6g − %.6g", air, dln, gain, loss)
		}
		if !(loss > 0) {
			t.Errorf("air %v: no recombination (%g)", air, loss)
		}
		t.Logf("air %v: Δln n_e %.5g = %.5g − %.5g; end shares N₂⁺ %.3g N₄⁺ %.3g", air, dln, gain, loss, y[iX2], y[iX4])
	}
}

// TestRecombinationProducts: the recombination products enter the pumps as written. On the
// example design (pure N₂, 1 atm) the circuit is solved with the default shares (0.11 into
// C(0), 0.87 into the manifold: J. Appl. Phys. 125, 243301 (2019), Table I, R8a/R9a) and with
// none; the circuit does not depend on them, so ∫P_C dt differs by exactly 0.11 of the
// recombinations counted (1e-9). With the B share alone, the manifold's feed differs by
// exactly 0.87 of them (with the C share too, the extra C(0) passes on to the B state and
// feeds it as well). The recombinations
// with N₄⁺ are a share of all of them, ∫ᾱ·n_e² dt over the samples (waveforms.recombinedAll): at 1 atm N₂⁺ turns into
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
	var dC float64
	for k := range with.pumpC {
		dC += (with.pumpC[k] - without.pumpC[k]) * par.TimeStep
	}
	all := with.recombinedAll
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

// TestRecombinationConvergence: in air, where the per-ion recombination moves the result most
// (O₂⁺ recombines ×20 slower than N₄⁺ at discharge T_e), the example design's pulse energy and
// plasma energy change by less than 1 % when the circuit tolerance is cut ten-fold and when
// the optical grid is refined from N to 2N cells (the criterion).
func TestRecombinationConvergence(t *testing.T) {
	t.Parallel()
	run := func(tol float64, cells int) *Result {
		d := design.ExampleDesign()
		d.Gas.Nitrogen, d.Gas.Oxygen = 0.79, 0.21
		d.Numerics.Tolerance *= tol
		d.Numerics.Cells *= cells
		r, err := Run(d, &RunSettings{Light: true})
		if err != nil {
			t.Fatal(err)
		}
		return r
	}
	base := run(1, 1)
	for name, r := range map[string]*Result{"tolerance / 10": run(0.1, 1), "2N cells": run(1, 2)} {
		if !scalar.EqualWithinAbsOrRel(r.Summary.EnergyTotal, base.Summary.EnergyTotal, 0, 0.01) {
			t.Errorf("%s: pulse energy %.6g J, %.6g J before", name, r.Summary.EnergyTotal, base.Summary.EnergyTotal)
		}
		if !scalar.EqualWithinAbsOrRel(r.Summary.Energy.Plasma, base.Summary.Energy.Plasma, 0, 0.01) {
			t.Errorf("%s: plasma energy %.6g J, %.6g J before", name, r.Summary.Energy.Plasma, base.Summary.Energy.Plasma)
		}
	}
}
