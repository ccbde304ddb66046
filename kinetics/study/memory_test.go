package study

import (
	"context"
	"strings"
	"testing"

	"n2pulse/kinetics/design"
)

// TestSweepMemoryPointFails (issue 11 item 1): a sweep whose point needs more memory than the
// limit (a 1 cm channel run to 10 µs: 6e7 optical steps, about 11 GB, above the library's
// 2 GiB default) records that point as failed, naming the keys, and finishes the others.
// Before, such a point killed the process on every --resume.
func TestSweepMemoryPointFails(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	if err := d.Set("channel.length", "1 cm"); err != nil {
		t.Fatal(err)
	}
	a, err := ParseAxis("numerics.end_time=30ns:10us:2", d)
	if err != nil {
		t.Fatal(err)
	}
	s := &Sweep{Design: d, Axes: []Axis{a}, Workers: 1, Dir: t.TempDir()}
	tab, err := s.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	st := tab.Column(StatusColumn)
	if len(tab.Rows) != 2 || !tab.OK(0) {
		t.Fatalf("rows %v: want 2, the first ok", tab.Rows)
	}
	if got := tab.Rows[1][st]; !strings.HasPrefix(got, "failed: ") || !strings.Contains(got, "memory") ||
		!strings.Contains(got, "numerics.end_time") {
		t.Errorf("10 µs point: status %q, want failed naming the memory and numerics.end_time", got)
	}
}
