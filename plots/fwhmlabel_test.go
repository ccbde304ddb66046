package plots

import "testing"

// TestFWHMLabel: the half-maximum mark's text says the width (ps below 1 ns), that it spans
// separate pulses from two on, and — on a second line — that it is ill-conditioned, with the
// widths at 55 % and 45 % of the peak and the detector it was read through. The numbers are
// the 8.8 cm v2 case's (notes: FWHM 666 ps, 650 ps at 55 %, 972 ps at 45 %) and made-up ones.
func TestFWHMLabel(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		name string
		d    PulseData
		want string
	}{
		{"one pulse, well-conditioned", PulseData{FWHMStart: 9e-9, FWHMEnd: 10.36e-9, Pulses: 1, FWHMAt45: 1.39e-9, FWHMAt55: 1.34e-9},
			"half maximum, output end: 1.36 ns"},
		{"two pulses", PulseData{FWHMStart: 10e-9, FWHMEnd: 38.3e-9, Pulses: 2},
			"half maximum, output end: 28.3 ns, spans 2 separate pulses"},
		{"ill-conditioned, ps", PulseData{FWHMStart: 5e-9, FWHMEnd: 5.666e-9, Pulses: 1, FWHMIllConditioned: true, FWHMAt45: 0.972e-9, FWHMAt55: 0.650e-9},
			"half maximum, output end: 666 ps\nill-conditioned: 650–972 ps at 55–45 % of the peak"},
		{"ill-conditioned, range across 1 ns", PulseData{FWHMStart: 5e-9, FWHMEnd: 5.913e-9, FWHMIllConditioned: true, FWHMAt45: 1.04e-9, FWHMAt55: 0.650e-9},
			"half maximum, output end: 913 ps\nill-conditioned: 0.65–1.04 ns at 55–45 % of the peak"},
		{"two pulses, ill-conditioned, detector", PulseData{FWHMStart: 10e-9, FWHMEnd: 38.3e-9, Pulses: 2, FWHMIllConditioned: true, FWHMAt45: 30.1e-9, FWHMAt55: 25e-9, DetectorResponse: 1e-9},
			"half maximum, output end: 28.3 ns, spans 2 separate pulses\nill-conditioned: 25–30.1 ns at 55–45 % of the peak through the 1 ns detector"},
		{"flag off: 45/55 widths not shown", PulseData{FWHMStart: 0, FWHMEnd: 2.91e-9, FWHMAt45: 4.41e-9, FWHMAt55: 2.55e-9, DetectorResponse: 1e-9},
			"half maximum, output end: 2.91 ns"},
	} {
		if got := c.d.fwhmLabel(); got != c.want {
			t.Errorf("%s: label %q, want %q", c.name, got, c.want)
		}
	}
}
