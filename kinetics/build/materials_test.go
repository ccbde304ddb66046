package build

import "testing"

func TestDielectricPresets(t *testing.T) {
	t.Parallel()
	keys := DielectricKeys()
	if len(keys) < 6 {
		t.Fatalf("only %d dielectric presets: %v", len(keys), keys)
	}
	// Values as printed in the cited tables (see data/materials.toml for the sources).
	cases := []struct {
		key      string
		eps, str float64
		src      string
	}{
		{"ptfe", 2.03, 19.7e6, "joysignal glossary (ε), electronicsreference table (strength, low end)"},
		{"polyethylene", 2.21, 40e6, "radiopolyus table of dielectric materials (ε 2.21, 40 kV/mm)"},
		{"glass", 7.0, 30e6, "electronicsreference table (30 MV/m); ε from memory"},
		{"fr4", 4.5, 20e6, "joysignal glossary (ε 4.5); strength from memory"},
	}
	for _, c := range cases {
		d, err := DielectricPreset(c.key)
		if err != nil {
			t.Fatal(err)
		}
		if d.Permittivity != c.eps || d.Strength != c.str {
			t.Errorf("%s: ε = %g, strength = %g; the table (%s) gives %g, %g", c.key, d.Permittivity, d.Strength, c.src, c.eps, c.str)
		}
	}
	if _, err := DielectricPreset("unobtainium"); err == nil {
		t.Error("no error for an unknown preset")
	}
	if _, err := Gas("xenon"); err == nil {
		t.Error("no error for a gas without Townsend constants")
	}
}
