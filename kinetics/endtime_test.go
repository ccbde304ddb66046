package kinetics

import (
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
)

// tubeDesign is an invented reduced-pressure tube (testdata/tube.toml: 50 cm, 50 Torr, a
// charge-transfer circuit and a slow exponential switch, rise_time 10 ns) whose pulse comes
// about 90 ns after closure, long after its numerics.end_time of 40 ns.
func tubeDesign(t *testing.T) *design.Design {
	t.Helper()
	d, err := design.LoadDesign("testdata/tube.toml")
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// TestEndTimeFollowsPulseIssue16 (issue 16 case 2): before, the tube gave 0 J at its 40 ns end
// time and was told to lower the inductances. Now the run follows the pulse (to 160 ns) and
// gives the energy of a run set to 320 ns within 1 %, not truncated, with a warning that
// says how far it went. Reference: the same model run to 320 ns (self-consistency).
func TestEndTimeFollowsPulseIssue16(t *testing.T) {
	t.Parallel()
	r, err := Run(tubeDesign(t), &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	long := tubeDesign(t)
	long.Numerics.EndTime = 320e-9
	ref, err := Run(long, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	s := r.Summary
	t.Logf("end %.4g ns, energy %.4g J (320 ns: %.4g J), delay %.4g ns, %s", 1e9*s.EndTime, s.EnergyTotal,
		ref.Summary.EnergyTotal, 1e9*s.Delay, s.Verdict)
	if s.Truncated || !scalar.EqualWithinAbsOrRel(s.EndTime, 160e-9, 0, 1e-3) {
		t.Errorf("end time %.4g s, truncated %v: want 160 ns, not truncated", s.EndTime, s.Truncated)
	}
	if !scalar.EqualWithinAbsOrRel(s.EnergyTotal, ref.Summary.EnergyTotal, 0, 0.01) || s.EnergyTotal <= 0 {
		t.Errorf("energy %.4g J, want the 320 ns run's %.4g J within 1 %%", s.EnergyTotal, ref.Summary.EnergyTotal)
	}
	if s.Delay < 60e-9 || !s.Lases {
		t.Errorf("delay %.3g s, lases %v: want a lasing pulse well after the 40 ns end time", s.Delay, s.Lases)
	}
	if w := strings.Join(r.Warnings, "\n"); !strings.Contains(w, "outlasted numerics.end_time") {
		t.Errorf("warnings %q: want one saying the run continued", w)
	}
}

// TestTruncatedAtCap: with numerics.end_time = 5 ns the cap is 16 × 5 = 80 ns, before the
// tube's pulse ends: the shot is truncated, says so in a warning, and reports 80 ns.
func TestTruncatedAtCap(t *testing.T) {
	t.Parallel()
	d := tubeDesign(t)
	d.Numerics.EndTime = 5e-9
	r, err := Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	s := r.Summary
	if !s.Truncated || !scalar.EqualWithinAbsOrRel(s.EndTime, 80e-9, 0, 1e-3) {
		t.Errorf("end %.4g s, truncated %v: want truncated at 80 ns", s.EndTime, s.Truncated)
	}
	if w := strings.Join(r.Warnings, "\n"); !strings.Contains(w, "truncated") {
		t.Errorf("warnings %q: want one saying truncated", w)
	}
}

// TestPulseTimeCap: 16 × the end time, at most 10 µs, never below the end time.
func TestPulseTimeCap(t *testing.T) {
	t.Parallel()
	for _, c := range [][2]float64{{40e-9, 640e-9}, {1e-6, 10e-6}, {10e-6, 10e-6}, {5e-9, 80e-9}} {
		if got := PulseTimeCap(c[0]); !scalar.EqualWithinAbsOrRel(got, c[1], 0, 1e-12) {
			t.Errorf("PulseTimeCap(%g) = %g, want %g", c[0], got, c[1])
		}
	}
}

// TestExampleEndTimeUnchanged: the example design's pulse is over by its 30 ns end time, so
// the run does not extend it (its results stay those of before the change).
func TestExampleEndTimeUnchanged(t *testing.T) {
	t.Parallel()
	r, err := Run(design.ExampleDesign(), &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	if s := r.Summary; s.Truncated || !scalar.EqualWithinAbsOrRel(s.EndTime, 30e-9, 0, 1e-3) {
		t.Errorf("example: end %.4g s, truncated %v", s.EndTime, s.Truncated)
	}
}
