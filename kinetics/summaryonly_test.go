package kinetics

import (
	"reflect"
	"testing"

	"n2pulse/kinetics/design"
)

// TestSummaryOnly: a run with RunSettings.SummaryOnly has the summary, warnings and statistics
// of the full run bit for bit, and no series; checked on the example, on a travelling
// excitation (the per-cell path) and on a pulse that outlasts numerics.end_time (followed
// further).
func TestSummaryOnly(t *testing.T) {
	t.Parallel()
	slow := design.ExampleDesign()
	slow.Optics.ExcitationVelocity = 1e8
	long := design.ExampleDesign()
	long.Numerics.EndTime = 12e-9
	for name, d := range map[string]*design.Design{"example": design.ExampleDesign(), "travelling": slow, "followed": long} {
		full, err := Run(d, nil)
		if err != nil {
			t.Fatal(err)
		}
		only, err := Run(d, &RunSettings{SummaryOnly: true})
		if err != nil {
			t.Fatal(err)
		}
		if !reflect.DeepEqual(full.Summary, only.Summary) {
			t.Errorf("%s: summary differs:\nfull %+v\nonly %+v", name, full.Summary, only.Summary)
		}
		if !reflect.DeepEqual(full.Warnings, only.Warnings) || full.Stats != only.Stats {
			t.Errorf("%s: warnings or statistics differ: %q %+v / %q %+v", name, full.Warnings, full.Stats, only.Warnings, only.Stats)
		}
		if only.Time != nil || only.Gain != nil || only.PowerFront != nil || only.Z != nil {
			t.Errorf("%s: SummaryOnly kept series", name)
		}
		if len(full.Time) == 0 || len(full.Gain) != d.Numerics.Cells {
			t.Errorf("%s: the full run has %d times and %d gain-map rows", name, len(full.Time), len(full.Gain))
		}
		if name == "followed" && !(full.Summary.EndTime > 1.5*d.Numerics.EndTime) {
			t.Errorf("followed: the run ended at %g s, not past numerics.end_time %g s", full.Summary.EndTime, d.Numerics.EndTime)
		}
	}
}
