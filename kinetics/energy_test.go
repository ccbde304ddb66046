package kinetics

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// TestEnergyAccount: the parts of the energy account add up to the stored energy within the
// circuit's energy balance residual, the plasma split adds up to the plasma's share to
// rounding, C(0) receives its Franck–Condon share of the C channel, and the laser pulse is
// bounded by the C(0) energy × hν/E_C(0) (conservation). Example design in N₂ and in air
// (where attachment takes a share).
func TestEnergyAccount(t *testing.T) {
	t.Parallel()
	for _, air := range []bool{false, true} {
		d := design.ExampleDesign()
		if air {
			d.Gas.Nitrogen, d.Gas.Oxygen = 0.79, 0.21
		}
		r, err := Run(d, &RunSettings{Light: true})
		if err != nil {
			t.Fatal(err)
		}
		s, a, p := r.Summary, r.Summary.Energy, r.Parameters
		parts := a.Switch + a.Shunt + a.Plasma + a.LeftInCircuit
		if !scalar.EqualWithinAbsOrRel(parts, a.Stored, 1e-12, s.EnergyBalanceResidual+1e-12) {
			t.Errorf("air %v: parts %.9g J, stored %.9g J (residual %.2g)", air, parts, a.Stored, s.EnergyBalanceResidual)
		}
		if a.Stored != s.StoredEnergy || a.Plasma != s.DepositedEnergy || a.Laser != s.EnergyTotal {
			t.Errorf("air %v: account %+v disagrees with the summary", air, a)
		}
		if sum := a.PlasmaSplit.sum(); !scalar.EqualWithinAbsOrRel(sum, a.Plasma, 0, 1e-12) {
			t.Errorf("air %v: plasma split sums to %.9g J, plasma %.9g J", air, sum, a.Plasma)
		}
		// C(0) gets f_C of the C excitations directly and part of the f_C1 that land in
		// C(v=1), each worth E_C(0) instead of the C threshold of the cross-section set
		// (11.03 eV, within 1 % of E_C(0)): between f_C and f_C + f_C1, within 2 % (electron–N₄⁺
		// recombination into C(0) adds under 1 % on the example: TestRecombinationProducts).
		if ratio := a.UpperLevel / a.PlasmaSplit.StateC; ratio < 0.98*p.UpperShare || ratio > 1.02*(p.UpperShare+p.UpperShare1) {
			t.Errorf("air %v: C(0) energy / C channel = %.4g, want between f_C = %.4g and f_C + f_C1 = %.4g", air, ratio, p.UpperShare, p.UpperShare+p.UpperShare1)
		}
		if bound := a.UpperLevel * p.PhotonEnergy / p.UpperEnergy; !(a.Laser <= bound) {
			t.Errorf("air %v: laser %.4g J above the C(0) bound %.4g J", air, a.Laser, bound)
		}
		if air != (a.PlasmaSplit.Attachment > 0) {
			t.Errorf("air %v: attachment takes %.3g J", air, a.PlasmaSplit.Attachment)
		}
		// Loading by hand: 343 mJ into L·w·d at 1 atm and 300 K is what the summary says.
		v := d.Channel.Length * d.Channel.Width * d.Channel.Gap
		if !scalar.EqualWithinAbsOrRel(s.SpecificEnergy*v, a.Plasma, 0, 1e-12) {
			t.Errorf("air %v: specific energy %.4g J/m³ × volume ≠ plasma energy", air, s.SpecificEnergy)
		}
		perMolecule := a.Plasma / (v * units.GasDensity(d.Gas.Pressure, d.Gas.Temperature)) / units.ElectronVolt
		if !scalar.EqualWithinAbsOrRel(s.EnergyPerMolecule, perMolecule, 0, 1e-12) {
			t.Errorf("air %v: %.4g eV per molecule, by hand %.4g", air, s.EnergyPerMolecule, perMolecule)
		}
		if jd := s.PeakCurrent / (d.Channel.Length * d.Channel.Width); !scalar.EqualWithinAbsOrRel(s.PeakCurrentDensity, jd, 0, 1e-12) {
			t.Errorf("air %v: peak current density %.4g A/m², by hand %.4g", air, s.PeakCurrentDensity, jd)
		}
	}
}

// TestUpperEnergy: E(C, v=0) − E(X, v=0) from the spectroscopic constants is the band
// origin of the C–X (0,0) transition, 88977.8 cm⁻¹ (Huber & Herzberg, Constants of
// Diatomic Molecules (1979): T₀ of C³Πu; from memory), within 0.2 %.
func TestUpperEnergy(t *testing.T) {
	t.Parallel()
	r, _, err := laserParameters(design.ExampleDesign())
	if err != nil {
		t.Fatal(err)
	}
	got := r.UpperEnergy / units.Wavenumber
	t.Logf("E_C(0) = %.2f cm⁻¹", got)
	if !scalar.EqualWithinAbsOrRel(got, 88977.8, 0, 2e-3) {
		t.Errorf("E_C(0) = %.1f cm⁻¹, want 88977.8 within 0.2 %%", got)
	}
}

// TestCircuitToleranceConvergence: tightening the circuit integrator's tolerance ten-fold
// changes the example design's pulse energy, plasma energy and C(0) excitation by less than
// 1 % (the criterion; a convergence test of the discharge that the reservoirs and the
// energy account are sampled from).
func TestCircuitToleranceConvergence(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	a, err := Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	d.Numerics.Tolerance /= 10
	b, err := Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	for _, q := range []struct {
		name string
		x, y float64
	}{
		{"pulse energy", a.Summary.EnergyTotal, b.Summary.EnergyTotal},
		{"plasma energy", a.Summary.Energy.Plasma, b.Summary.Energy.Plasma},
		{"C(0) excitation", a.Summary.Energy.UpperLevel, b.Summary.Energy.UpperLevel},
	} {
		if !scalar.EqualWithinAbsOrRel(q.x, q.y, 0, 0.01) {
			t.Errorf("%s: %.6g J at the default tolerance, %.6g J at a tenth of it", q.name, q.x, q.y)
		}
	}
}
