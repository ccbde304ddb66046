package study

import (
	"math"
	"reflect"
	"slices"
	"strings"
	"testing"

	"n2pulse/kinetics/design"
)

// strataArePermutation reports whether the stratum indices ⌊x·n⌋ of xs are 0…n−1 once each.
func strataArePermutation(xs []float64) bool {
	n := len(xs)
	seen := make([]bool, n)
	for _, x := range xs {
		i := int(math.Floor(x * float64(n)))
		if i < 0 || i >= n || seen[i] {
			return false
		}
		seen[i] = true
	}
	return true
}

// TestLatinHypercube checks the defining property (every coordinate hits each of its n strata
// once), that the points stay in [0, 1), that a coordinate's mean lies within its exact bounds
// [(n−1)/(2n), (n+1)/(2n)) and that the same seed gives the same points, another seed others.
func TestLatinHypercube(t *testing.T) {
	t.Parallel()
	const n, k = 200, 5
	pts, err := LatinHypercube(n, k, 7)
	if err != nil {
		t.Fatal(err)
	}
	for j := 0; j < k; j++ {
		col := make([]float64, n)
		mean := 0.0
		for i := range pts {
			col[i] = pts[i][j]
			mean += col[i] / n
		}
		if !strataArePermutation(col) {
			t.Errorf("coordinate %d: strata not hit once each", j)
		}
		if lo, hi := float64(n-1)/(2*n), float64(n+1)/(2*n); mean < lo || mean >= hi {
			t.Errorf("coordinate %d: mean %g outside [%g, %g)", j, mean, lo, hi)
		}
	}
	again, _ := LatinHypercube(n, k, 7)
	if !reflect.DeepEqual(pts, again) {
		t.Error("same seed, different points")
	}
	other, _ := LatinHypercube(n, k, 8)
	if reflect.DeepEqual(pts, other) {
		t.Error("seeds 7 and 8 give the same points")
	}
	for _, c := range [][2]int{{0, 3}, {MaxSamples + 1, 3}, {10, 0}} {
		if _, err := LatinHypercube(c[0], c[1], 1); err == nil {
			t.Errorf("LatinHypercube(%d, %d): no error", c[0], c[1])
		}
	}
}

// TestUncertainDesigns checks that every sampled constant lies in its spread, is stratified in
// the spread's own scale (linear or logarithmic) as a Latin hypercube must be, reads back from the
// design exactly, and that the base design is left alone.
func TestUncertainDesigns(t *testing.T) {
	t.Parallel()
	base := design.ExampleDesign()
	before := base.String()
	const n = 40
	ds, keys, vals, err := UncertainDesigns(base, n, 3)
	if err != nil {
		t.Fatal(err)
	}
	if base.String() != before {
		t.Error("base design changed")
	}
	// the example is pure N₂: every spread but the O₂ constant applies
	var want []string
	for _, s := range design.Spreads() {
		if s.Key != "levels.upper_quenching_oxygen" {
			want = append(want, s.Key)
		}
	}
	if len(ds) != n || !reflect.DeepEqual(keys, want) {
		t.Fatalf("%d designs, keys %v; want %d, %v", len(ds), keys, n, want)
	}
	for j, key := range keys {
		s, _ := design.KeySpread(key)
		u := make([]float64, n)
		for i, d := range ds {
			x := vals[i][j]
			if got, err := d.Get(s.Key); err != nil || got != x {
				t.Errorf("sample %d %s: design holds %g (%v), want %g", i, s.Key, got, err, x)
			}
			if x < s.Low || x > s.High {
				t.Errorf("sample %d %s = %g outside %g…%g", i, s.Key, x, s.Low, s.High)
			}
			if s.Distribution == design.LogUniform {
				u[i] = math.Log(x/s.Low) / math.Log(s.High/s.Low)
			} else {
				u[i] = (x - s.Low) / (s.High - s.Low)
			}
		}
		if !strataArePermutation(u) {
			t.Errorf("%s: samples not one per stratum", s.Key)
		}
	}
	if _, _, _, err := UncertainDesigns(base, 0, 1); err == nil {
		t.Error("0 samples: no error")
	}
	// with oxygen in the gas the O₂ constant is sampled too
	air := base.Clone()
	if err := air.Set("gas.oxygen", "0.2"); err != nil {
		t.Fatal(err)
	}
	if err := air.Set("gas.nitrogen", "0.8"); err != nil {
		t.Fatal(err)
	}
	if _, keys, _, err := UncertainDesigns(air, 10, 1); err != nil || len(keys) != len(design.Spreads()) {
		t.Errorf("air: keys %v (%v), want all %d spreads", keys, err, len(design.Spreads()))
	}
}

// TestHeldConstants: a constant the user fixed (here with Set, as --set does) is held at that
// value in every sample, leaves the sampled keys and is reported as held; the other constants
// are sampled as before. A design that pins every constant it uses has nothing to sample: an
// error naming the held constants.
func TestHeldConstants(t *testing.T) {
	t.Parallel()
	base := design.ExampleDesign()
	if err := base.Set("levels.manifold_share", "0.1"); err != nil {
		t.Fatal(err)
	}
	if got := HeldConstants(base); !reflect.DeepEqual(got, []string{"levels.manifold_share"}) {
		t.Fatalf("held %v; want [levels.manifold_share]", got)
	}
	ds, keys, _, err := UncertainDesigns(base, 10, 3)
	if err != nil {
		t.Fatal(err)
	}
	if slices.Contains(keys, "levels.manifold_share") || len(keys) != len(usedSpreadKeys(base))-1 {
		t.Errorf("sampled keys %v; want every used constant but levels.manifold_share", keys)
	}
	for i, d := range ds {
		if x, _ := d.Get("levels.manifold_share"); x != 0.1 {
			t.Errorf("sample %d: manifold_share %g; want the held 0.1", i, x)
		}
	}
	all := design.ExampleDesign()
	for _, k := range usedSpreadKeys(all) {
		s, _ := design.KeySpread(k)
		if err := all.Set(k, siText(k, s.Low)); err != nil {
			t.Fatal(err)
		}
	}
	if _, _, _, err := UncertainDesigns(all, 10, 3); err == nil || !strings.Contains(err.Error(), "held") || !strings.Contains(err.Error(), "levels.manifold_share") {
		t.Errorf("every constant pinned: error %v; want one naming the held constants", err)
	}
}

// TestManifestHeld: a banded sweep records the constants its design pins; a --set at a
// default value pins a constant without changing the design's listing, so resume and merge
// must see the difference in the manifest.
func TestManifestHeld(t *testing.T) {
	t.Parallel()
	plain := design.ExampleDesign()
	pinned := plain.Clone()
	if err := pinned.Set("levels.manifold_share", "0.25"); err != nil { // the default value
		t.Fatal(err)
	}
	a := (&Sweep{Design: plain, Samples: 10, Seed: 1}).manifest()
	b := (&Sweep{Design: pinned, Samples: 10, Seed: 1}).manifest()
	if a.DesignHash != b.DesignHash || len(a.Held) != 0 || !reflect.DeepEqual(b.Held, []string{"levels.manifold_share"}) {
		t.Fatalf("manifests: same hash %v, held %v and %v; want the same hash, [] and [levels.manifold_share]", a.DesignHash == b.DesignHash, a.Held, b.Held)
	}
	if got, want := a.Differs(b), "constants held in the uncertainty samples [] against [levels.manifold_share]"; got != want {
		t.Errorf("Differs = %q, want %q", got, want)
	}
	if m := (&Sweep{Design: pinned}).manifest(); m.Held != nil {
		t.Errorf("a sweep without samples records held %v; want none", m.Held)
	}
}
