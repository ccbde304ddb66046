package study

import (
	"context"
	"strings"
	"testing"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// TestTruncatedPointsNeverOK (issue 16 case 2): a point whose pulse outlasted the longest run
// (Summary.Truncated) has status "truncated" in the sweep table and in the length table,
// keeps its numbers, and is not counted as ok (so optima leave it out).
func TestTruncatedPointsNeverOK(t *testing.T) {
	t.Parallel()
	s := testSweep(t, t.TempDir())
	s.Runner = func(d *design.Design) (kinetics.Summary, error) {
		sum, err := fakeRunner(d)
		sum.Truncated = d.Circuit.ChargeVoltage < 9e3 // the first voltage of the axis, 8 kV
		return sum, err
	}
	tab, err := s.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	st, e := tab.Column(StatusColumn), tab.Column("energy_total_J")
	truncated := 0
	for r, row := range tab.Rows {
		if row[st] == StatusTruncated {
			truncated++
			if tab.OK(r) || row[e] == "" {
				t.Errorf("row %d: truncated but ok %v, energy %q", r, tab.OK(r), row[e])
			}
		}
	}
	// 7 pressures at 8 kV, the last of which (760 Torr) fails in fakeRunner: 6 truncated.
	if truncated != 6 {
		t.Errorf("%d truncated rows, want 6", truncated)
	}

	l := &LengthScan{Design: design.ExampleDesign(), From: 0.1, To: 0.3, Points: 3, Workers: 1,
		Runner: func(d *design.Design) (kinetics.Summary, error) {
			sum, err := saturatingRunner(d)
			sum.Truncated = d.Channel.Length > 0.25
			return sum, err
		}}
	lr, err := l.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	lt := lr.Table()
	if got := lt.Rows[2][lt.Column(StatusColumn)]; got != StatusTruncated {
		t.Errorf("length table, 30 cm: status %q, want truncated", got)
	}
	if got := lt.Rows[0][lt.Column(StatusColumn)]; got != StatusOK {
		t.Errorf("length table, 10 cm: status %q, want ok", got)
	}
	if rule := lr.Curves[0].Rule; !strings.Contains(rule, "1 of 3 lengths truncated") {
		t.Errorf("useful-length rule %q: want it to say one length was truncated", rule)
	}
}
