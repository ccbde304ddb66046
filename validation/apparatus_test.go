package validation

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"strings"
	"sync"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics"
	"n2pulse/units"
)

// TestHoldingSwitch: the spark gaps that hold a case's charge, against a hand calculation of
// the project's Paschen law for air, V_b = B·pd/ln(A·pd/ln(1+1/γ)) with A = 15 cm⁻¹ Torr⁻¹,
// B = 365 V cm⁻¹ Torr⁻¹, γ = 0.01 (data/materials.toml townsend.air: Bazelyan & Raizer, Spark
// Discharge, p. 32, as quoted there), solved by bisection in Python 3.11: pd = 346.52 Torr cm
// at 18 kV and 391.74 Torr cm at 20 kV, i.e. 4.5595 mm and 5.1545 mm at 760 Torr, and 4.5595
// and 5.1545 atm for a 1 mm gap. materials.toml rounds A and B to 4 figures in SI: 1e-3.
func TestHoldingSwitch(t *testing.T) {
	t.Parallel()
	atm := 101325.0
	for _, c := range []struct{ v, mm float64 }{{18e3, 4.5595}, {20e3, 5.1545}} {
		gap, p, err := HoldingSwitch(c.v, atm, 1e-3)
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbsOrRel(gap, c.mm*1e-3, 0, 1e-3) || !scalar.EqualWithinAbsOrRel(p, c.mm*atm, 0, 1e-3) {
			t.Errorf("%g V: gap %g m, pressure %g Pa; hand calculation %g mm at 1 atm, 1 mm at %g atm", c.v, gap, p, c.mm, c.mm)
		}
	}
	if _, _, err := HoldingSwitch(18e3, 0, 1e-3); err == nil {
		t.Error("pressure 0: no error")
	}
	// The alternatives of the 8.8 cm case (18 kV, common block: 1 mm at 1 atm, 10 nH and 2 nH,
	// width not given by the source) follow from the case, not from fixed numbers.
	cases, err := loadExperiments(experimentFiles)
	if err != nil {
		t.Fatal(err)
	}
	var alts []Alternative
	for _, c := range cases {
		if c.Name == "tea-transfer-88mm-v1" {
			if alts, err = Alternatives(c.Design, false); err != nil {
				t.Fatal(err)
			}
		}
	}
	want := map[string]map[string]float64{
		"switch-holding-gap":      {"switch.gap": 4.5595e-3},
		"switch-holding-pressure": {"switch.pressure": 4.5595 * atm},
		"switch-loop-half":        {"circuit.switch_inductance": 5e-9},
		"switch-loop-triple":      {"circuit.switch_inductance": 30e-9},
		"channel-loop-half":       {"circuit.channel_inductance": 1e-9},
		"channel-loop-triple":     {"circuit.channel_inductance": 6e-9},
		"width-one-gap":           {"channel.width": 1.55e-3},
		"width-two-gaps":          {"channel.width": 3.1e-3},
		// d·√p: 4.56 mm·√1 atm against 1 mm·√4.56 atm: the long gap is the slower switch.
		"corner-slow": {"switch.gap": 4.5595e-3, "circuit.switch_inductance": 30e-9, "circuit.channel_inductance": 6e-9},
		"corner-fast": {"switch.pressure": 4.5595 * atm, "circuit.switch_inductance": 5e-9, "circuit.channel_inductance": 1e-9},
	}
	if len(alts) != len(want) {
		t.Fatalf("%d alternatives, want %d", len(alts), len(want))
	}
	for _, a := range alts {
		w, ok := want[a.Name]
		if !ok || len(a.Sets) != len(w) {
			t.Errorf("%s: sets %v, want %v", a.Name, a.Sets, w)
			continue
		}
		for k, v := range w {
			if !scalar.EqualWithinAbsOrRel(a.Sets[k], v, 0, 1e-3) {
				t.Errorf("%s: %s = %g, want %g", a.Name, k, a.Sets[k], v)
			}
		}
	}
}

// TestApparatusEnvelope: one row per case with a measured energy, FWHM or lasing, carrying
// the scoreboard's measured and nominal values and the case's measured lasing; the width is varied only where the source gives
// none (the 8.8 cm cases); the range is that of the runs; a run agrees with the case rerun
// with the alternative set by hand; and the nominal energy of every case lies inside the
// range (where it is compared), since each loop inductance is taken both ×0.5 and ×3 of the
// nominal.
func TestApparatusEnvelope(t *testing.T) {
	rows, err := envelopeRows()
	if err != nil {
		t.Fatal(err)
	}
	score, err := Scoreboard()
	if err != nil {
		t.Fatal(err)
	}
	cases, _ := loadExperiments(experimentFiles)
	var want []ScoreRow
	var lases []*bool
	for i, s := range score {
		if !math.IsNaN(s.Measured) || !math.IsNaN(s.MeasuredW) || cases[i].Measured.Lases != nil {
			want = append(want, s)
			lases = append(lases, cases[i].Measured.Lases)
		}
	}
	if len(rows) != len(want) || len(rows) < 5 {
		t.Fatalf("%d rows, want %d (cases with a measured energy, FWHM or lasing)", len(rows), len(want))
	}
	for i, r := range rows {
		s := want[i]
		if (r.MeasuredLases == nil) != (lases[i] == nil) || (r.MeasuredLases != nil && *r.MeasuredLases != *lases[i]) || r.NominalLases != s.Lases {
			t.Errorf("%s: measured lases %s, nominal lases %v; the case says %s, the scoreboard %v", r.Case, boolText(r.MeasuredLases), r.NominalLases, boolText(lases[i]), s.Lases)
		}
		if r.Err != nil {
			t.Errorf("%s: %v", r.Case, r.Err)
			continue
		}
		if r.Case != s.Case || !same(r.Measured, s.Measured) || !same(r.MeasuredW, s.MeasuredW) || !same(r.Nominal, s.Energy) || !same(r.NominalW, s.FWHM) {
			t.Errorf("row %d %s: measured %g J %g s, nominal %g J %g s; scoreboard %s %g %g %g %g", i, r.Case,
				r.Measured, r.MeasuredW, r.Nominal, r.NominalW, s.Case, s.Measured, s.MeasuredW, s.Energy, s.FWHM)
		}
		n := 8
		if strings.HasPrefix(r.Case, "tea-transfer-88mm") {
			n = 10 // the source gives no width: two width alternatives
		}
		if len(r.Runs) != n {
			t.Errorf("%s: %d alternatives, want %d", r.Case, len(r.Runs), n)
		}
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, a := range r.Runs {
			if a.Err != nil {
				t.Errorf("%s/%s: %v", r.Case, a.Name, a.Err)
				continue
			}
			lo, hi = math.Min(lo, a.Energy), math.Max(hi, a.Energy)
		}
		if r.EnergyLow != lo || r.EnergyHigh != hi || !(lo > 0) {
			t.Errorf("%s: range %g…%g J, runs span %g…%g J", r.Case, r.EnergyLow, r.EnergyHigh, lo, hi)
		}
		if !math.IsNaN(r.Nominal) && r.NominalPosition() != "inside" {
			t.Errorf("%s: nominal %g J %s the range %g…%g J", r.Case, r.Nominal, r.NominalPosition(), lo, hi)
		}
		if got := position(r.Measured, lo, hi); r.MeasuredPosition() != got {
			t.Errorf("%s: measured position %q, want %q", r.Case, r.MeasuredPosition(), got)
		}
	}
	// The 30 nH switch loop of the first case rerun by hand: the same run, to 1e-6 ("30 nH" and
	// 3 × 10 nH differ in the last bit, which the circuit's adaptive steps turn into ~1e-7).
	for _, c := range cases {
		if c.Name != rows[0].Case {
			continue
		}
		d := c.Design.Clone()
		if err := d.Set("circuit.switch_inductance", "30 nH"); err != nil {
			t.Fatal(err)
		}
		res, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
		if err != nil {
			t.Fatal(err)
		}
		for _, a := range rows[0].Runs {
			if a.Name == "switch-loop-triple" && !scalar.EqualWithinAbsOrRel(a.Energy, res.Summary.EnergyFront, 0, 1e-6) {
				t.Errorf("%s/%s: %g J, rerun by hand %g J", c.Name, a.Name, a.Energy, res.Summary.EnergyFront)
			}
		}
	}
}

// envelopeRows runs ApparatusEnvelope once for the tests that read it (a few seconds of runs).
var envelopeRows = sync.OnceValues(func() ([]EnvelopeRow, error) { return ApparatusEnvelope(0) })

// boolText prints a *bool: "true", "false" or "not given".
func boolText(b *bool) string {
	if b == nil {
		return "not given"
	}
	return fmt.Sprint(*b)
}

// same is a == b, NaN equal to NaN.
func same(a, b float64) bool { return a == b || (math.IsNaN(a) && math.IsNaN(b)) }

// TestApparatusReport: the report's apparatus section, with its label, one summary row per
// case and one row per alternative; none without rows.
func TestApparatusReport(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	rows := []EnvelopeRow{{Case: "made-up", End: "front", Measured: 34e-6, MeasuredW: nan, Nominal: 178e-6, NominalW: 0.7e-9,
		EnergyLow: 15e-6, EnergyHigh: 229e-6, FWHMLow: 0.3e-9, FWHMHigh: 1e-9,
		Runs: []AlternativeRun{{Alternative: Alternative{Name: "switch-loop-triple", Sets: map[string]float64{"circuit.switch_inductance": 30e-9}}, Energy: 133e-6, FWHM: 0.7e-9, FWHMIllConditioned: true}},
		Derived: []DerivedRow{{Nominal: Check{ID: "exp.made-up.oxygen.ratio", Mode: Range, Low: 0.2, High: 0.25, Computed: 0.008}, Low: 0.001, High: 0.12,
			Runs: []DerivedRun{{Alternative: "switch-loop-triple", Check: Check{Mode: Range, Kind: Experiment, Low: 0.2, High: 0.25, Computed: 0.0123}}}}}}}
	var b bytes.Buffer
	writeApparatus(&b, rows)
	md := b.String()
	for _, s := range []string{"## Apparatus alternatives (not model uncertainty)", "| made-up | front | 34 µJ | 178 µJ | 15 µJ – 229 µJ | inside | inside | – |",
		"| 0.3 ns – 1 ns (1 ill-conditioned) |",
		"| made-up | switch-loop-triple | circuit.switch_inductance = " + units.Format(30e-9, "H") + " | 133 µJ | 0.7 ns (ill-conditioned) |",
		"| exp.made-up.oxygen.ratio | [0.2, 0.25] | 0.008 | 0.001 – 0.12 | above | 0 of 1 |",
		"| exp.made-up.oxygen.ratio | switch-loop-triple | 0.0123 | DISCREPANCY |"} {
		if !strings.Contains(md, s) {
			t.Errorf("report lacks %q:\n%s", s, md)
		}
	}
	b.Reset()
	writeApparatus(&b, nil)
	if b.Len() != 0 {
		t.Errorf("no rows: %q", b.String())
	}
}

// TestApparatusDerived: the checks the cases derive from their measured variations, over the
// alternatives. Every variation check of the default run (optimum, direction, ratio, optimum
// shift) has a row in its case with one value per alternative, and the row's nominal is the
// default check itself. The 8.8 cm v1 air/N₂ ratio under channel-loop-half equals the pair of
// runs set up by hand (channel loop 1 nH; N₂, then O₂ 0.2095 with N₂ the rest; energy at the
// output end): to 1e-6, as for the energies above (the alternative's 0.5 × 2 nH and "1 nH" may
// differ in the last bit, which the circuit's adaptive steps amplify).
func TestApparatusDerived(t *testing.T) {
	rows, err := envelopeRows()
	if err != nil {
		t.Fatal(err)
	}
	var want []Check
	for _, c := range experimentResults().checks {
		if strings.HasSuffix(c.ID, ".optimum") || strings.HasSuffix(c.ID, ".direction") || strings.HasSuffix(c.ID, ".ratio") || strings.HasSuffix(c.ID, ".optimum-shift") {
			want = append(want, c)
		}
	}
	got := map[string]DerivedRow{}
	for _, r := range rows {
		for _, d := range r.Derived {
			if !strings.HasPrefix(d.Nominal.ID, "exp."+r.Case+".") {
				t.Errorf("%s: row %s belongs to another case", r.Case, d.Nominal.ID)
			}
			if len(d.Runs) != len(r.Runs) {
				t.Errorf("%s: %d alternatives, the case has %d", d.Nominal.ID, len(d.Runs), len(r.Runs))
			}
			for i, a := range d.Runs {
				if i < len(r.Runs) && a.Alternative != r.Runs[i].Name || a.Check.Err != nil {
					t.Errorf("%s: run %d is %s (%v), the case's alternative is %s", d.Nominal.ID, i, a.Alternative, a.Check.Err, r.Runs[i].Name)
				}
			}
			got[d.Nominal.ID] = d
		}
	}
	if len(want) < 6 || len(got) != len(want) {
		t.Errorf("%d derived rows, the default checks have %d variation checks", len(got), len(want))
	}
	for _, c := range want {
		d, ok := got[c.ID]
		if !ok {
			t.Errorf("no derived row for %s", c.ID)
			continue
		}
		if !same(d.Nominal.Computed, c.Computed) || d.Nominal.Reference != c.Reference {
			t.Errorf("%s: nominal %g (reference %g), default check %g (%g)", c.ID, d.Nominal.Computed, d.Nominal.Reference, c.Computed, c.Reference)
		}
	}
	ratio, ok := got["exp.tea-transfer-88mm-v1.oxygen.ratio"]
	if !ok {
		t.Fatal("no row for the 8.8 cm v1 air/N₂ ratio")
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	alt := math.NaN()
	for _, a := range ratio.Runs {
		lo, hi = math.Min(lo, a.Check.Computed), math.Max(hi, a.Check.Computed)
		if a.Alternative == "channel-loop-half" {
			alt = a.Check.Computed
		}
	}
	if ratio.Low != lo || ratio.High != hi {
		t.Errorf("ratio range %g…%g, runs span %g…%g", ratio.Low, ratio.High, lo, hi)
	}
	if p := position(ratio.Nominal.Low, lo, hi); p == "above" && ratio.MeasuredPosition() != "above" || p == "inside" && ratio.MeasuredPosition() != "overlaps" {
		t.Errorf("measured [%g, %g] against %g…%g: %q", ratio.Nominal.Low, ratio.Nominal.High, lo, hi, ratio.MeasuredPosition())
	}
	cases, _ := loadExperiments(experimentFiles)
	var e [2]float64
	for _, c := range cases {
		if c.Name != "tea-transfer-88mm-v1" {
			continue
		}
		for i, o2 := range []string{"0", "0.2095"} {
			d := c.Design.Clone()
			if err := errors.Join(d.Set("circuit.channel_inductance", "1 nH"), d.Set("gas.oxygen", o2),
				d.Set("gas.nitrogen", []string{"1", "0.7905"}[i])); err != nil {
				t.Fatal(err)
			}
			res, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
			if err != nil {
				t.Fatal(err)
			}
			e[i] = res.Summary.EnergyFront
		}
	}
	if !scalar.EqualWithinAbsOrRel(alt, e[1]/e[0], 0, 1e-6) {
		t.Errorf("v1 air/N₂ ratio under channel-loop-half %g, hand pair of runs %g J / %g J = %g", alt, e[1], e[0], e[1]/e[0])
	}
}

// TestDerivedPosition: where a measured range or value lies against the alternatives' range.
func TestDerivedPosition(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	for _, c := range []struct {
		mode           Mode
		ref, low, high float64 // the measurement
		lo, hi         float64 // the alternatives
		want           string
	}{
		{Range, 0.225, 0.2, 0.25, 2e-5, 0.12, "above"},
		{Range, 0.225, 0.2, 0.25, 0.21, 0.3, "overlaps"},
		{Range, 0.225, 0.2, 0.25, 0.1, 0.2, "overlaps"},
		{Range, 0.225, 0.2, 0.25, 0.26, 0.3, "below"},
		{Range, 0.225, 0.2, 0.25, nan, nan, ""},
		{Relative, 1.55, 0, 0, 1.4, 2.4, "inside"},
		{Relative, 1.55, 0, 0, 1.6, 2.4, "below"},
		{True, 1, 0, 0, nan, nan, ""},
	} {
		d := DerivedRow{Nominal: Check{Mode: c.mode, Reference: c.ref, Low: c.low, High: c.high}, Low: c.lo, High: c.hi}
		if got := d.MeasuredPosition(); got != c.want {
			t.Errorf("%v [%g, %g] / %g against %g…%g: %q, want %q", c.mode, c.low, c.high, c.ref, c.lo, c.hi, got, c.want)
		}
	}
}
