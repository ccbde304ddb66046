package kinetics

import (
	"testing"

	"n2pulse/kinetics/design"
)

// TestHeliumValidityIssue16 (issue 16 case 10): a design with helium carries the validity
// note in its summary (and so in --json and the sweep rows, which print the summary's
// fields); one without helium carries none.
func TestHeliumValidityIssue16(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	if err := d.Set("gas.helium", "0.5"); err != nil {
		t.Fatal(err)
	}
	if err := d.BalanceMixture([]string{"gas.helium"}); err != nil {
		t.Fatal(err)
	}
	r, err := Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	if r.Summary.Validity != HeliumNote {
		t.Errorf("50 %% He: validity %q, want the helium note", r.Summary.Validity)
	}
	r, err = Run(design.ExampleDesign(), &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	if r.Summary.Validity != "" {
		t.Errorf("pure N₂: validity %q, want none", r.Summary.Validity)
	}
}
