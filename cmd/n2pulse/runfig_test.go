package main

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// TestRunPulseDataFlags: the pulse report's data carries the summary's separate-pulse count,
// ill-conditioned flag, 45/55 % widths and detector response unchanged (made-up summary), so
// the figure's half-maximum label can say them.
func TestRunPulseDataFlags(t *testing.T) {
	t.Parallel()
	r := &kinetics.Result{
		Time:       []float64{0, 1e-9, 2e-9, 3e-9},
		PowerFront: []float64{0, 1, 0.2, 0},
		Summary: kinetics.Summary{Pulses: 2, FWHMIllConditioned: true, FWHMAt45: 0.972e-9, FWHMAt55: 0.650e-9,
			DetectorResponse: 1e-9},
	}
	pd := runPulseData(&design.Design{Name: "made-up"}, r, nil)
	if pd.Pulses != 2 || !pd.FWHMIllConditioned || pd.FWHMAt45 != 0.972e-9 || pd.FWHMAt55 != 0.650e-9 || pd.DetectorResponse != 1e-9 || pd.Band != nil {
		t.Errorf("pulse data %+v; want pulses 2, ill-conditioned, 45 %% 0.972 ns, 55 %% 0.650 ns, detector 1 ns, no band", pd)
	}
	// Half-maximum crossings of 0, 1, 0.2, 0 at 1 ns steps, linearly interpolated: 0.5 ns and
	// 1.625 ns (to 1e-12).
	if !scalar.EqualWithinAbsOrRel(pd.FWHMStart, 0.5e-9, 1e-21, 1e-12) || !scalar.EqualWithinAbsOrRel(pd.FWHMEnd, 1.625e-9, 1e-21, 1e-12) {
		t.Errorf("crossings %g, %g s; want 0.5 ns, 1.625 ns", pd.FWHMStart, pd.FWHMEnd)
	}
}
