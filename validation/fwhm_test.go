package validation

import (
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics"
)

// TestExperimentIllConditionedWidth: the 8.8 cm v2 case's output has a round-trip spike whose
// top sits at half the peak (0.499 at 20 cells, 0.502 at 40), so its FWHM flips between
// 0.67 ns (20 cells) and 0.91 ns (40 cells) while the widths at 45 % and 55 % of the peak stay
// put (0.97 and 0.65 ns at both): the run flags the FWHM as ill-conditioned at both
// resolutions, with an edge leaping by ≈ 0.23 ns, and its verdict says so. A regression check
// of the model's own behaviour (the values were read off this model, not a measurement);
// tolerances 3 % on the widths and the leap, 1 % between the resolutions.
func TestExperimentIllConditionedWidth(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the case twice")
	}
	t.Parallel()
	cases, err := loadExperiments(experimentFiles)
	if err != nil {
		t.Fatal(err)
	}
	var s [2]kinetics.Summary
	found := false
	for _, c := range cases {
		if c.Name != "tea-transfer-88mm-v2" {
			continue
		}
		found = true
		for i, n := range []int{20, 40} {
			d := c.Design.Clone()
			d.Numerics.Cells = n
			r, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
			if err != nil {
				t.Fatalf("%d cells: %v", n, err)
			}
			s[i] = r.Summary
		}
	}
	if !found {
		t.Fatal("experiment case tea-transfer-88mm-v2 not found")
	}
	for i, want := range []float64{0.666e-9, 0.913e-9} {
		got := s[i]
		if !got.FWHMIllConditioned || !strings.Contains(got.Verdict, "is ill-conditioned") ||
			!scalar.EqualWithinAbsOrRel(got.FWHM, want, 0, 0.03) || !scalar.EqualWithinAbsOrRel(got.FWHMJump, 0.232e-9, 0, 0.03) ||
			!scalar.EqualWithinAbsOrRel(got.FWHMAt45, 0.972e-9, 0, 0.03) || !scalar.EqualWithinAbsOrRel(got.FWHMAt55, 0.650e-9, 0, 0.03) {
			t.Errorf("%d cells: ill-conditioned %v, FWHM %.4g s (want %.4g), leap %.4g s (0.232 ns), at 45 %% %.4g s (0.972 ns), at 55 %% %.4g s (0.650 ns); verdict %q",
				[]int{20, 40}[i], got.FWHMIllConditioned, got.FWHM, want, got.FWHMJump, got.FWHMAt45, got.FWHMAt55, got.Verdict)
		}
	}
	if !scalar.EqualWithinAbsOrRel(s[0].FWHMAt45, s[1].FWHMAt45, 0, 0.01) || !scalar.EqualWithinAbsOrRel(s[0].FWHMAt55, s[1].FWHMAt55, 0, 0.01) {
		t.Errorf("widths at 45 %% / 55 %%: %.4g / %.4g s (20 cells) vs %.4g / %.4g s (40 cells), want within 1 %%",
			s[0].FWHMAt45, s[0].FWHMAt55, s[1].FWHMAt45, s[1].FWHMAt55)
	}
}

// TestPointCheckIllConditionedWidth: a measured FWHM compared with an ill-conditioned model
// FWHM says so in the check's row (its quantity, with the widths at 45 % and 55 %); a
// well-conditioned one does not. Made-up summaries (no shipped case with a measured FWHM is
// ill-conditioned today).
func TestPointCheckIllConditionedWidth(t *testing.T) {
	t.Parallel()
	c := &expCase{Name: "made-up", Measured: measured{Source: "none (test)",
		FWHM: &measuredValue{Value: "1 ns", How: "text", Where: "nowhere"}}}
	for _, ill := range []bool{true, false} {
		j := &job{sum: kinetics.Summary{FWHM: 0.9e-9, FWHMAt45: 1.2e-9, FWHMAt55: 0.7e-9, FWHMIllConditioned: ill}}
		checks := pointChecks(c, j)
		if len(checks) != 1 || !scalar.EqualWithinAbsOrRel(checks[0].Computed, 0.9, 1e-12, 0) {
			t.Fatalf("ill-conditioned %v: checks %+v, want one FWHM check computing 0.9 ns", ill, checks)
		}
		says := strings.Contains(checks[0].Quantity, "the model's FWHM is ill-conditioned (1.2 ns at 45 % of the peak, 0.7 ns at 55 %)")
		if says != ill {
			t.Errorf("ill-conditioned %v: quantity %q", ill, checks[0].Quantity)
		}
	}
}
