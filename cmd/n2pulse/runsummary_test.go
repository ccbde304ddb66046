package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestRunSummaryGainLabels (issue 16 case 5): the summary names both gains. Before, "peak
// gain 1.24 cm⁻¹ (gain × length 21.4)" on a 25 cm channel mixed the cell's peak with the
// channel mean's gain-length. On the example (20 cm) the mid-channel cell peaks at 2.56 cm⁻¹
// (× 20 cm = 51.2) and the channel mean at 1.07 cm⁻¹ (gL 21.3): this model's numbers, also
// in the golden file (peak_gain_per_m 256, gain_length 21.3).
func TestRunSummaryGainLabels(t *testing.T) {
	t.Parallel()
	var out, errb bytes.Buffer
	if code := run([]string{"run"}, &out, &errb); code != 0 {
		t.Fatalf("run: exit %d: %s", code, errb.String())
	}
	for _, want := range []string{
		"peak gain (mid-channel cell) 2.56 cm⁻¹ (× channel length: 51.2)",
		"channel-mean gain, peak      1.07 cm⁻¹ (gain-length gL = ∫g dz: 21.3)",
	} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("summary lacks %q:\n%s", want, out.String())
		}
	}
}
