package swarm

import (
	"os"
	"path/filepath"
	"testing"

	"n2pulse/units"
)

// TestForMixture runs serially: ForMixtureSet keeps a process-wide table cache (memTables)
// that TestForMixtureBitIdentical clears and whose contents decide which cache files appear.
func TestForMixture(t *testing.T) {
	dir := t.TempDir()
	n2, err := ForMixtureSet(SetOriginal, 1, 0, 0, dir)
	if err != nil {
		t.Fatal(err)
	}
	if b, _ := BuiltinSet("n2", SetOriginal); b != n2 {
		t.Error("pure N2 did not return the built-in table")
	}
	air, err := ForMixtureSet(SetOriginal, 0.7905, 0.2095, 0, dir)
	if err != nil {
		t.Fatal(err)
	}
	if b, _ := BuiltinSet("air", SetOriginal); b != air {
		t.Error("air within 1e-3 did not return the built-in table")
	}
	// a mixture with helium is solved and cached
	m, err := ForMixtureSet(SetOriginal, 0.5, 0, 0.5, dir)
	if err != nil {
		t.Fatal(err)
	}
	files, _ := filepath.Glob(filepath.Join(dir, "swarm-*.csv"))
	if len(files) != 1 {
		t.Fatalf("cache files %v", files)
	}
	again, err := ForMixtureSet(SetOriginal, 0.5, 0, 0.5, dir)
	if err != nil {
		t.Fatal(err)
	}
	a, b := m.At(200*units.Townsend), again.At(200*units.Townsend)
	if d := a.DriftVelocity/b.DriftVelocity - 1; d > 1e-6 || d < -1e-6 {
		t.Errorf("cached table differs: %g vs %g", a.DriftVelocity, b.DriftVelocity)
	}
	// the He mixture has a higher mean energy than pure N2 at 50 Td (He has no vibrational
	// loss and a 7000 times smaller recoil loss per collision; common practice, no source)
	if m.At(50*units.Townsend).MeanEnergy <= n2.At(50*units.Townsend).MeanEnergy {
		t.Error("He admixture did not raise the mean energy at 50 Td")
	}
	// a damaged cache file is recomputed
	if err := os.WriteFile(files[0], []byte("garbage"), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := ForMixtureSet(SetOriginal, 0.5, 0, 0.5, dir); err != nil {
		t.Fatal(err)
	}
	if _, err := ForMixtureSet(SetOriginal, 0.5, 0.2, 0.5, dir); err == nil {
		t.Error("fractions summing to 1.2 accepted")
	}
}
