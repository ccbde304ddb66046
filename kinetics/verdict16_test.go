package kinetics

import (
	"fmt"
	"strings"
	"testing"

	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// runWith runs the example design (or the design file path) with the given key = value pairs.
func runWith(t *testing.T, path string, set ...string) (*design.Design, *Result) {
	t.Helper()
	d := design.ExampleDesign()
	if path != "" {
		var err error
		if d, err = design.LoadDesign(path); err != nil {
			t.Fatal(err)
		}
	}
	for i := 0; i+1 < len(set); i += 2 {
		if err := d.Set(set[i], set[i+1]); err != nil {
			t.Fatal(err)
		}
	}
	r, err := Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	return d, r
}

// TestVerdictIssue16 (issue 16 cases 3 and 5): one real run per limiting cause, with the
// numbers the issue reported before, and after each a run that follows the advice and must
// do better (the advice moves the named key the right way). The numbers are this model's
// (self-consistency); the experiment case is the issue's 11 mm resonator.
func TestVerdictIssue16(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name         string
		path         string
		set          []string
		lases        bool
		cause        string
		advice       string
		followed     []string // the advice applied
		wantFollowed func(before, after Summary) bool
	}{
		// Before: "lengthen channel.length to about 1.04 mm" on a 5 mm channel (the cell's peak
		// gain used for a channel-mean rule). Now the channel-mean gain: 10/gL × 5 mm (5.14 mm
		// at gL 9.73 when this test was written; the test takes gL from the run).
		{"5 mm channel", "", []string{"channel.length", "5 mm"}, false, "channel too short",
			"lengthen channel.length to about %s", []string{"channel.length", "5.5 mm"},
			func(b, a Summary) bool { return a.GainLength > b.GainLength }},
		// Before: "E/N too low: the peak was 6048993 Td". Now the gas is too thin.
		{"10 Pa", "", []string{"gas.pressure", "10 Pa"}, false, "gas too thin: E/N reached 6.05e+06 Td",
			"raise gas.pressure", []string{"gas.pressure", "1 kPa"},
			func(b, a Summary) bool { return a.PeakReducedField < b.PeakReducedField && a.GainLength > b.GainLength }},
		// Before: blamed on a slow current rise ("lower the inductances").
		{"1 m/s front", "", []string{"optics.excitation_velocity", "1 m/s"}, false, "excitation front too slow",
			"raise optics.excitation_velocity", []string{"optics.excitation_velocity", "c"},
			func(b, a Summary) bool { return a.Lases && !b.Lases }},
		// Before: blamed on a slow current rise too.
		{"1 kΩ switch", "", []string{"switch.on_resistance", "1 kohm"}, false, "switch resistance too high",
			"lower switch.on_resistance", []string{"switch.on_resistance", "0.05 ohm"},
			func(b, a Summary) bool { return a.Lases && !b.Lases }},
		// Before: 205 µJ out of a 98 %/50 % resonator and "does not lase … lengthen to 21.4 mm"
		// (the mirrorless rule applied to a resonator). Now the resonator's rule: it lases.
		{"11 mm resonator", "../validation/testdata/experiments/tea-blumlein-11mm-n2.toml", nil, true, "", "", nil, nil},
	}
	for _, c := range cases {
		d, r := runWith(t, c.path, c.set...)
		v := Verdict(d, r)
		if strings.Contains(c.advice, "%s") {
			c.advice = fmt.Sprintf(c.advice, units.Format(ASEThreshold/v.GainLength*d.Channel.Length, "m"))
		}
		t.Logf("%s: %.4g J; %s; advice %q", c.name, r.Summary.EnergyTotal, v.Summary, v.Advice)
		if v.Lases != c.lases || !strings.Contains(v.Cause, c.cause) || !strings.Contains(v.Advice, c.advice) {
			t.Errorf("%s: %+v; want lases %v, cause %q, advice %q", c.name, v, c.lases, c.cause, c.advice)
		}
		if c.followed == nil {
			continue
		}
		_, after := runWith(t, c.path, append(append([]string(nil), c.set...), c.followed...)...)
		if !c.wantFollowed(r.Summary, after.Summary) {
			t.Errorf("%s: following the advice (%v) did not help: before %+v, after %+v", c.name, c.followed, r.Summary, after.Summary)
		}
	}
}

// TestVerdictRules: the threshold of each optics on a synthetic shot of gL 5.14 lasting
// 212 ps on an 11 mm channel (the issue's resonator): open channel 5.14 < 10; rear mirror
// 98 %: 2·5.14 + ln 0.98 = 10.26 ≥ 10; resonator 98 %/50 %: round trip 2·5.14 + ln 0.49 =
// 9.57 over c·212 ps/22 mm = 2.89 round trips, build-up 27.7 (hand arithmetic).
func TestVerdictRules(t *testing.T) {
	t.Parallel()
	r := shotSummary(467, 212e-12, 5.14)
	for _, c := range []struct {
		rear, front float64
		rule        string
		figure      float64
		lases       bool
	}{
		{0, 0, "open channel", 5.14, false},
		{0.98, 0, "rear mirror", 10.2598, true},
		{0.98, 0.5, "resonator", 27.66, true},
		// A leaky resonator: 2·5.14 + ln(0.3·0.3) = 7.87 per round trip, still e^22.7.
		{0.3, 0.3, "resonator", 22.76, true},
	} {
		d := design.ExampleDesign()
		d.Channel.Length = 11e-3
		d.Optics.RearReflectivity, d.Optics.FrontReflectivity = c.rear, c.front
		v := Verdict(d, r)
		if v.Rule != c.rule || v.Lases != c.lases || v.Figure < c.figure*0.995 || v.Figure > c.figure*1.005 {
			t.Errorf("R %g/%g: %+v; want rule %q, figure %.4g (0.5 %%), lases %v", c.rear, c.front, v, c.rule, c.figure, c.lases)
		}
	}
}
