package kinetics

import (
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestCliffIssue16 (issue 16 case 9): past the best gap of a 25 cm channel at 12 kV (the
// example otherwise) the output drops by orders of magnitude within +0.25 mm (issue: ×60 from
// 2.75 to 3.0 mm on its design; here 3.25 → 3.5 mm). It is physics, not numerics: doubling the
// cells and tightening the circuit tolerance ×1000 move the 3.5 mm energy by < 1 %, while the
// peak E/N falls 228 → 212 Td, where the ionisation coefficient of N₂ rises as (E/N)^~5
// (k_ion of data/swarm-n2.csv, 198–238 Td), the avalanche reaches a fifth of the electron
// density, and the gain-length falls 15 → 2.6. The summary at such a point says it is near
// threshold. Numbers of this model when the test was written; tolerances wide enough for
// data changes that do not remove the cliff. With the itikawa2006 cross sections and the
// manifold feeding B(0) (issue 15) the drop is ×64 (0.33 mJ → 5.3 µJ), E/N 225 → 212 Td, n_e
// falls ×1.8 and the gain-length 19.5 → 12.3: the test asks for more than ×30, as in the issue's
// own case (×60), and n_e falling by at least a third.
func TestCliffIssue16(t *testing.T) {
	t.Parallel()
	base := []string{"channel.length", "25 cm", "circuit.charge_voltage", "12 kV"}
	_, before := runWith(t, "", append(base, "channel.gap", "3.25 mm")...)
	_, after := runWith(t, "", append(base, "channel.gap", "3.5 mm")...)
	_, fine := runWith(t, "", append(base, "channel.gap", "3.5 mm", "numerics.cells", "400", "numerics.tolerance", "1e-8")...)
	b, a := before.Summary, after.Summary
	t.Logf("3.25 mm: %.4g J, gL %.3g, %.0f Td, n_e %.3g; 3.5 mm: %.4g J, gL %.3g, %.0f Td, n_e %.3g", b.EnergyTotal, b.GainLength,
		b.PeakReducedField, b.PeakElectronDensity, a.EnergyTotal, a.GainLength, a.PeakReducedField, a.PeakElectronDensity)
	if a.EnergyTotal*30 > b.EnergyTotal {
		t.Errorf("no cliff: %.4g J at 3.25 mm, %.4g J at 3.5 mm", b.EnergyTotal, a.EnergyTotal)
	}
	if !scalar.EqualWithinAbsOrRel(fine.Summary.EnergyTotal, a.EnergyTotal, 0, 0.01) {
		t.Errorf("3.5 mm not converged: %.5g J, refined %.5g J", a.EnergyTotal, fine.Summary.EnergyTotal)
	}
	if a.PeakReducedField > b.PeakReducedField || a.PeakReducedField < 190 || b.PeakReducedField > 250 ||
		a.PeakElectronDensity > 2.0/3*b.PeakElectronDensity {
		t.Errorf("E/N %.0f → %.0f Td, n_e %.3g → %.3g: want E/N falling in 190–250 Td and n_e down by at least a third",
			b.PeakReducedField, a.PeakReducedField, b.PeakElectronDensity, a.PeakElectronDensity)
	}
	if !strings.Contains(a.Verdict, "near threshold") {
		t.Errorf("3.5 mm verdict %q: want the near-threshold note", a.Verdict)
	}
}
