package kinetics

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// TestExpIntE1 against mpmath 1.3.0, mpmath.e1(x) at 30 digits (kinetics/testdata/e1-mpmath.txt),
// to 1e-13 relative, on both sides of the switch between series and continued fraction.
func TestExpIntE1(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ x, want float64 }{
		{0.1, 1.8229239584193906}, {0.5, 0.55977359477616081}, {1, 0.21938393439552027},
		{1.5, 0.10001958240663265}, {2, 0.04890051070806112}, {5, 0.0011482955912753258},
		{20, 9.8355252906498817e-11},
	} {
		if got := expIntE1(c.x); !scalar.EqualWithinAbsOrRel(got, c.want, 0, 1e-13) {
			t.Errorf("E1(%g) = %.17g, want %.17g", c.x, got, c.want)
		}
	}
}

// TestUpperElectronHand checks the Born–Bethe and Lotz estimates against a hand calculation.
//
// Oscillator strength: f = (ε₀·m_e·c/(2π·e²))·A·λ² with ε₀m_ec/(2πe²) = 14991.94 s/m²,
// A = 1/τ_C = 1/(40 ns) = 2.5e7 s⁻¹, λ = 337.1 nm: f = 14991.94 × 2.5e7 × (337.1e-9)² = 0.042591.
//
// Superelastic C → B at kT = 2 eV: ΔE = hc/λ = 3.67796 eV, y = ΔE/kT = 1.83898,
// E₁(y) = 0.061239, 0.276·e^y·E₁(y) = 0.106 < 0.2, so P = 0.2;
// k = sqrt(8/(π·m_e·kT))·(8π/√3)·πa₀²·f·E_H²/ΔE·P = 2.5899e-14 m³/s (2.59e-8 cm³/s).
//
// Lotz ionisation of the C electron into N₂⁺(B) at kT = 2 eV with E_C(0) = 11.032 eV:
// I = 18.738 − 11.032 = 7.706 eV, E₁(I/kT) = E₁(3.853) = 0.0045184;
// k = sqrt(8/(π·m_e·kT))·a·q/I·E₁ = 1.2486e-15 m³/s (1.25e-9 cm³/s), a = 4.5e-14 cm² eV², q = 1.
//
// (Computed with mpmath 1.3.0 at 30 digits from the same formulas, CODATA 2018 constants.)
func TestUpperElectronHand(t *testing.T) {
	t.Parallel()
	ev := units.ElectronVolt
	lambda := 337.1e-9
	f := oscillatorStrength(1/40e-9, lambda, 1)
	if !scalar.EqualWithinAbsOrRel(f, 0.04259075, 0, 1e-6) {
		t.Errorf("f(B→C) = %.7g, want 0.04259075", f)
	}
	de := units.Planck * units.SpeedOfLight / lambda
	if got := superelasticRate(f, de, 2*ev, 1); !scalar.EqualWithinAbsOrRel(got, 2.58986e-14, 0, 1e-5) {
		t.Errorf("superelastic C→B at 2 eV: %.6g m³/s, want 2.58986e-14", got)
	}
	if got := lotzRate(1, (18.738-11.032)*ev, 2*ev); !scalar.EqualWithinAbsOrRel(got, 1.248641e-15, 0, 1e-5) {
		t.Errorf("Lotz ionisation out of C at 2 eV: %.6g m³/s, want 1.248641e-15", got)
	}
	// The sum, at ⟨ε⟩ = 3 eV (kT = 2 eV) and E_C(0) = 11.032 eV.
	if got := upperElectronLoss(3*ev, 40e-9, de, 11.032*ev); !scalar.EqualWithinAbsOrRel(got, 2.58986e-14+1.248641e-15, 0, 1e-5) {
		t.Errorf("total electron loss of C(0): %.6g m³/s", got)
	}
	if got := upperElectronLoss(0, 40e-9, de, 11.032*ev); got != 0 {
		t.Errorf("no electron energy: loss %g, want 0", got)
	}
}

// TestGauntFloorShortcut checks the shortcut of superelasticRate: from y = floorAbove on, the
// full Born–Bethe factor 0.276·e^y·E₁(y) as computed is below the floor, so P(y) = 0.2 exactly
// as without the shortcut. Sampled densely from floorAbove to y = 700 (a Maxwellian some 200
// times colder than the photon energy; beyond y = 709 e^y overflows, where the shortcut gives
// the floor the physics wants). At y = 0.5 the factor lies above the floor: the shortcut
// must not reach down there.
func TestGauntFloorShortcut(t *testing.T) {
	t.Parallel()
	for y := floorAbove; y <= 700; y *= 1.0001 {
		if full := 0.276 * math.Exp(y) * expIntE1(y); !(full < gauntFloor) {
			t.Fatalf("y = %g: 0.276·e^y·E₁(y) = %.17g, not below the floor %g", y, full, gauntFloor)
		}
	}
	// Against mpmath 1.3.0 (30 digits): e·E₁(1) = 0.59634736232319407, so the factor at y = 1
	// is 0.1646, below the floor; the crossing lies near y = 0.74, below floorAbove.
	if got := 0.276 * math.Exp(1) * expIntE1(1); !scalar.EqualWithinAbsOrRel(got, 0.276*0.59634736232319407, 0, 1e-13) {
		t.Errorf("0.276·e·E₁(1) = %.17g", got)
	}
	if full := 0.276 * math.Exp(0.5) * expIntE1(0.5); !(full > gauntFloor) {
		t.Errorf("y = 0.5: 0.276·e^y·E₁(y) = %g, want above the floor", full)
	}
}

// TestSuperelasticIntoLower: electrons that de-excite C(0) superelastically put the (0,0)
// band's share A₀₀·τ_C of it into B(0). With no pump and no photons, C(0) = C₀·e^(−Γt), Γ =
// Γ_C + L (L the electrons' total loss rate), and B(0), fed at (A₀₀ + X)·C and emptied at Γ_B,
// is B(T) = (A₀₀ + X)·C₀·(e^(−ΓT) − e^(−Γ_B·T))/(Γ_B − Γ) (hand integration of the two
// rate equations): the steps reproduce it to 1e-6 for a simultaneous discharge and for a
// front moving along the channel (the per-cell path), whichever cell is read.
func TestSuperelasticIntoLower(t *testing.T) {
	t.Parallel()
	for _, v := range []float64{math.Inf(1), 2e8} {
		d := design.ExampleDesign()
		d.Optics.ExcitationVelocity = v
		par := faintParameters(t, d)
		n := d.Numerics.Cells
		steps := 3000
		const loss, mix = 4e7, 1.5e7 // electrons' loss of C(0) and the part into B(0) [s⁻¹]
		wf := &waveforms{pumpC: make([]float64, steps), pumpB: make([]float64, steps), density: make([]float64, steps),
			lossC: make([]float64, steps), mixB: make([]float64, steps)}
		for k := range wf.lossC {
			wf.lossC[k], wf.mixB[k] = loss, mix
		}
		sh := newShot(d, &par, wf, steps, &RunSettings{})
		for i := range sh.med.c {
			sh.med.c[i], sh.med.b[i] = 1e18, 0
		}
		sh.run(&Result{})
		tEnd := float64(steps) * par.TimeStep
		g, gb := par.UpperDecayRate+loss, par.LowerDecayRate
		want := (par.EinsteinA00 + mix) * 1e18 * (math.Exp(-g*tEnd) - math.Exp(-gb*tEnd)) / (gb - g)
		// With a moving front each cell takes its delayed sample; the rates are constant,
		// so every cell must agree.
		for _, i := range []int{0, n / 2, n - 1} {
			if got := sh.med.b[i]; !scalar.EqualWithinAbsOrRel(got, want, 0, 1e-6) {
				t.Errorf("front %g m/s, cell %d: B(0) = %.8g m⁻³, want %.8g", v, i, got, want)
			}
		}
	}
}

// TestUpperElectronRatesSplit: the two parts add up to the total loss, and the superelastic
// part is the Born–Bethe rate of TestUpperElectronHand.
func TestUpperElectronRatesSplit(t *testing.T) {
	t.Parallel()
	ev := units.ElectronVolt
	de := units.Planck * units.SpeedOfLight / 337.1e-9
	sup, ion := upperElectronRates(3*ev, 40e-9, de, 11.032*ev)
	if !scalar.EqualWithinAbsOrRel(sup, 2.58986e-14, 0, 1e-5) || !scalar.EqualWithinAbsOrRel(ion, 1.248641e-15, 0, 1e-5) {
		t.Errorf("superelastic %.6g, ionisation %.6g m³/s; want 2.58986e-14 and 1.248641e-15 (hand calculation above)", sup, ion)
	}
	if tot := upperElectronLoss(3*ev, 40e-9, de, 11.032*ev); tot != sup+ion {
		t.Errorf("total %.8g ≠ %.8g + %.8g", tot, sup, ion)
	}
}
