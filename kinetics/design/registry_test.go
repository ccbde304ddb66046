package design

import (
	"strings"
	"testing"
)

// TestOneRegistryRules checks that design keys and [build] keys follow one rule for choices
// (any case, kept as listed) and one "did you mean".
func TestOneRegistryRules(t *testing.T) {
	t.Parallel()
	d := ExampleDesign()
	if err := d.Set("circuit.topology", "Blumlein"); err != nil || d.Circuit.Topology != Blumlein {
		t.Errorf("circuit.topology = Blumlein: topology %q, error %v; want %q, nil", d.Circuit.Topology, err, Blumlein)
	}
	if err := d.Set("build.dielectric", "FR4"); err != nil || d.Build.Dielectric != "fr4" {
		t.Errorf("build.dielectric = FR4: dielectric %q, error %v; want fr4, nil", d.Build.Dielectric, err)
	}
	for key, want := range map[string]string{"build.dielectrc": "build.dielectric", "circuit.topolgy": "circuit.topology"} {
		err := d.Set(key, "x")
		if err == nil || !strings.Contains(err.Error(), "did you mean "+want+"?") {
			t.Errorf("Set(%q): error %v, want a suggestion of %s", key, err, want)
		}
	}
}
