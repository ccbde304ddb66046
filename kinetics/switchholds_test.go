package kinetics

import (
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
)

// TestSwitchHoldsCharge checks the flag, the breakdown and the verdict clause of a spark gap
// that cannot hold the charge voltage: the example's 1 mm gap holds its 14 kV (static
// breakdown ≈ 16 kV, the Paschen curve of package build), and charged to 18 kV it self-breaks,
// which the summary, --json and the verdict must say, since the shot is still computed at the
// full charge.
func TestSwitchHoldsCharge(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	b, err := Bench(d, d.Build)
	if err != nil {
		t.Fatal(err)
	}
	if b.SwitchBreakdown <= 14e3 || b.SwitchBreakdown >= 18e3 {
		t.Fatalf("example gap breakdown %g V: the test needs it between 14 and 18 kV", b.SwitchBreakdown)
	}
	res, err := Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	s := res.Summary
	if !s.SwitchHoldsCharge || strings.Contains(s.Verdict, "self-breaks") {
		t.Errorf("example at 14 kV: holds %v, verdict %q", s.SwitchHoldsCharge, s.Verdict)
	}
	d.Circuit.ChargeVoltage = 18e3
	res, err = Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	s = res.Summary
	if s.SwitchHoldsCharge {
		t.Errorf("example at 18 kV: the gap breaking down at %g V is said to hold", s.SwitchBreakdown)
	}
	if !scalar.EqualWithinAbsOrRel(s.SwitchBreakdown, b.SwitchBreakdown, 0, 1e-12) {
		t.Errorf("switch_breakdown_V %g, bench says %g", s.SwitchBreakdown, b.SwitchBreakdown)
	}
	if !strings.Contains(s.Verdict, "self-breaks at 16.1 kV, below the 18 kV charge") {
		t.Errorf("verdict %q does not name the self-break", s.Verdict)
	}
}
