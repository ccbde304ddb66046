package study

import (
	"context"
	"strings"
	"testing"

	"n2pulse/kinetics/design"
)

// TestAxisEndsExact covers the points an axis used to lose: a log axis starting at a key's
// minimum (0.1 pF gave 9.999999999999998e-14, below the range), a log axis over a whole-number
// key (19.999999999999996 cells) and interior values with rounding noise in their last digit.
func TestAxisEndsExact(t *testing.T) {
	t.Parallel()
	base := design.ExampleDesign()
	cases := []struct {
		axis string
		want []string // the grid values as written to results.csv
	}{
		{"circuit.switch_capacitance=0.1pF:1nF:3:log", []string{"1e-13", "1e-11", "1e-09"}},
		{"numerics.cells=20:200:4:log", []string{"20", "43", "93", "200"}},
		{"numerics.cells=4:20000:5", []string{"4", "5003", "10002", "15001", "20000"}},
		{"channel.gap=1.5mm:3mm:3", []string{"0.0015", "0.00225", "0.003"}},
		{"channel.length=1mm:10m:5:log", []string{"0.001", "0.01", "0.1", "1", "10"}},
		{"gas.pressure=10Pa:1MPa:2:log", []string{"10", "1e+06"}},
		{"circuit.charge_voltage=16kV:8kV:5", []string{"16000", "14000", "12000", "10000", "8000"}},
	}
	for _, c := range cases {
		a, err := ParseAxis(c.axis, base)
		if err != nil {
			t.Fatalf("%s: %v", c.axis, err)
		}
		s := &Sweep{Design: base, Axes: []Axis{a}}
		v := a.Values()
		if len(v) != len(c.want) {
			t.Fatalf("%s: %d values, want %d", c.axis, len(v), len(c.want))
		}
		for i := range v {
			if got := formatNumber(v[i]); got != c.want[i] {
				t.Errorf("%s: value %d is %s, want %s", c.axis, i, got, c.want[i])
			}
			if _, err := s.PointDesign(i); err != nil {
				t.Errorf("%s: point %d refused: %v", c.axis, i, err)
			}
		}
	}
}

// TestResumeMessageInUserUnits: a resume refused for a different grid names the axes in the
// units typed, not in 16-digit pascals.
func TestResumeMessageInUserUnits(t *testing.T) {
	t.Parallel()
	base := design.ExampleDesign()
	a, err := ParseAxis("gas.pressure=20Torr:760Torr:20:log", base)
	if err != nil {
		t.Fatal(err)
	}
	b, err := ParseAxis("gas.pressure=20Torr:700Torr:20:log", base)
	if err != nil {
		t.Fatal(err)
	}
	m1 := &Manifest{Axes: []Axis{a}}
	m2 := &Manifest{Axes: []Axis{b}}
	want := "axis 1: gas.pressure=20 Torr:760 Torr:20:log against gas.pressure=20 Torr:700 Torr:20:log"
	if got := m1.Differs(m2); got != want {
		t.Errorf("Differs = %q, want %q", got, want)
	}
	v, err := ParseAxis("circuit.charge_voltage=8000V:16kV:5", base)
	if err != nil {
		t.Fatal(err)
	}
	v.Display = ""
	if got, want := v.String(), "circuit.charge_voltage=8kV:16kV:5"; got != want {
		t.Errorf("String = %q, want %q", got, want)
	}
}

// TestAxisEveryKeyAtItsEnds: a log axis and a linear axis from each numeric key's minimum to
// its maximum keep every point (the first point of a log axis at the minimum once fell just
// below it, in 14 keys).
func TestAxisEveryKeyAtItsEnds(t *testing.T) {
	t.Parallel()
	base := design.ExampleDesign()
	n := 0
	for _, key := range design.Keys() {
		lo, hi, _, ok := design.KeyRange(key)
		if !ok || !(lo > 0) || hi > 1e300 || key == "numerics.cells" {
			continue
		}
		for _, spacing := range []string{"log", "lin"} {
			text := key + "=" + siText(key, lo) + ":" + siText(key, hi) + ":5:" + spacing
			a, err := ParseAxis(text, base)
			if err != nil {
				t.Errorf("%s: %v", text, err)
				continue
			}
			s := &Sweep{Design: base, Axes: []Axis{a}}
			for i := range a.N {
				// A build key alone leaves the example's [build] incomplete: Validate says so.
				if _, err := s.PointDesign(i); err != nil && !strings.Contains(err.Error(), "[build]") {
					t.Errorf("%s: point %d refused: %v", text, i, err)
				}
			}
			n++
		}
	}
	if n < 60 {
		t.Errorf("only %d axes tried, want every numeric key with a positive minimum (≥ 60)", n)
	}
}

// TestFailedStatusWithoutPrefixes: the status of a point refused by the design rules reads as a
// message for the user, without the library's package prefixes ("study: ", "design: ").
func TestFailedStatusWithoutPrefixes(t *testing.T) {
	t.Parallel()
	base := design.ExampleDesign()
	a, err := ParseAxis("gas.oxygen=0:1:2", base)
	if err != nil {
		t.Fatal(err)
	}
	s := &Sweep{Design: base, Axes: []Axis{a}, Runner: fakeRunner, Workers: 1, Dir: t.TempDir()}
	tab, err := s.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	st := tab.Rows[1][len(tab.Columns)-1]
	if want := "failed: point 1: gas.oxygen + gas.helium"; !strings.HasPrefix(st, want) {
		t.Errorf("status %q, want it to start with %q", st, want)
	}
}
