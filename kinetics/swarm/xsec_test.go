package swarm

import (
	"math"
	"strings"
	"testing"

	"n2pulse/units"
)

const goodSet = `# test set
format n2pulse-xsec 1
species X
mass_amu 28
process
kind elastic
name X elastic
threshold_eV 0
source test
data
0 1e-20
10 2e-20
end
process
kind excitation
name X*
label C
threshold_eV 5
source test
data
5 0
10 1e-21
end
`

func TestParseCrossSections(t *testing.T) {
	t.Parallel()
	sp, err := ParseCrossSections(strings.NewReader(goodSet), "good.txt")
	if err != nil {
		t.Fatal(err)
	}
	if sp.Name != "X" || len(sp.Processes) != 2 || math.Abs(sp.Mass/units.AtomicMass-28) > 1e-12 {
		t.Fatalf("parsed %+v", sp)
	}
	p := &sp.Processes[1]
	if p.Label != "C" || math.Abs(p.Threshold/units.ElectronVolt-5) > 1e-12 {
		t.Errorf("process %+v", p)
	}
	// linear interpolation, zero below an inelastic process, held beyond the last point
	for _, c := range []struct{ e, want float64 }{{7.5, 0.5e-21}, {4, 0}, {20, 1e-21}} {
		if got := p.At(c.e * units.ElectronVolt); math.Abs(got-c.want) > 1e-30 {
			t.Errorf("σ(%g eV) = %g, want %g", c.e, got, c.want)
		}
	}
}

func TestParseCrossSectionErrors(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ edit, want string }{
		{strings.Replace(goodSet, "mass_amu 28", "mass_amu heavy", 1), "bad.txt:4: mass_amu: \"heavy\" is not a mass"},
		{strings.Replace(goodSet, "kind excitation", "kind ionization", 1), "bad.txt:15: kind: \"ionization\", want elastic"},
		{strings.Replace(goodSet, "10 1e-21", "9 1e-21\n8 1e-21", 1), "bad.txt:23: energy: 8 eV is not above the previous point"},
		{strings.Replace(goodSet, "10 2e-20", "10 -2e-20", 1), "bad.txt:12: cross section: \"-2e-20\" is not a cross section"},
		{strings.Replace(goodSet, "10 2e-20", "10 2e-20 3", 1), "bad.txt:12: data: want 2 numbers"},
		{strings.Replace(goodSet, "source test\ndata\n5 0", "data\n5 0", 1), "source: missing"},
		{strings.Replace(goodSet, "threshold_eV 5", "threshold_eV 0", 1), "threshold_eV: must be positive"},
		{strings.Replace(goodSet, "format n2pulse-xsec 1\n", "", 1), "bad.txt:4: format: missing before the first process"},
		{strings.Replace(goodSet, "species X", "colour red", 1), "bad.txt:3: colour: unknown key"},
		{strings.TrimSuffix(goodSet, "end\n"), "process: not closed by 'end'"},
		{strings.Replace(goodSet, "kind elastic", "kind attachment", 1), "elastic: 0 elastic processes"},
	} {
		_, err := ParseCrossSections(strings.NewReader(c.edit), "bad.txt")
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("error %v, want it to contain %q", err, c.want)
		}
	}
}

// TestShippedCrossSections: the embedded sets parse and carry the processes the model needs,
// with thresholds from the sources (physics-data.md sections 1c and 4: A 6.17, B 7.35,
// C 11.03, ionisation 15.58 eV; seen in the cross-section files cited there).
func TestShippedCrossSections(t *testing.T) {
	t.Parallel()
	n2, err := SetSpecies(SetOriginal, "N2")
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]float64{"A": 6.17, "B": 7.35, "C": 11.03, "ion": 15.58}
	for _, p := range n2.Processes {
		if u, ok := want[p.Label]; ok {
			if math.Abs(p.Threshold/units.ElectronVolt-u) > 0.01 {
				t.Errorf("N2 %s threshold %g eV, want %g", p.Label, p.Threshold/units.ElectronVolt, u)
			}
			delete(want, p.Label)
		}
	}
	if len(want) > 0 {
		t.Errorf("N2 set lacks %v", want)
	}
	for _, name := range []string{"O2", "He"} {
		sp, err := SetSpecies(SetOriginal, name)
		if err != nil {
			t.Fatal(err)
		}
		kinds := map[Kind]bool{}
		for _, p := range sp.Processes {
			kinds[p.Kind] = true
		}
		if !kinds[Elastic] || !kinds[Excitation] || !kinds[Ionisation] {
			t.Errorf("%s kinds %v", name, kinds)
		}
		if name == "O2" && !kinds[Attachment] {
			t.Error("O2 has no attachment")
		}
	}
	if _, err := SetSpecies(SetOriginal, "Ar"); err == nil {
		t.Error("Ar accepted")
	}
}
