package design

import (
	"strings"
	"testing"
)

// TestPinned: the rule by which an uncertainty study holds a constant. Set pins a key at any
// value, its default included; a design file pins a key only when it gives a value other than
// the default, so the listing `init` writes (every key at its value) pins no constant; a clone
// keeps the pins.
func TestPinned(t *testing.T) {
	t.Parallel()
	file := func(extra string) *Design {
		t.Helper()
		d, err := ParseDesign([]byte(strings.Replace(minimalDesign, "[gas]", extra+"\n[gas]", 1)), "pinned.toml")
		if err != nil {
			t.Fatal(err)
		}
		return d
	}
	d := file("[levels]\nmanifold_share = 0.25\nlower_lifetime = \"9 us\"")
	if d.Pinned("levels.manifold_share") {
		t.Error("manifold_share written at its default 0.25 in the file: pinned; want sampled")
	}
	if !d.Pinned("levels.lower_lifetime") {
		t.Error("lower_lifetime written as 9 µs (default 7.5 µs) in the file: not pinned")
	}
	if d.Pinned("levels.upper_quenching_nitrogen") {
		t.Error("upper_quenching_nitrogen not given: pinned")
	}
	if err := d.Set("levels.upper_quenching_nitrogen", "1e-17 m³/s"); err != nil {
		t.Fatal(err)
	}
	if !d.Pinned("levels.upper_quenching_nitrogen") {
		t.Error("upper_quenching_nitrogen given by Set at its default: not pinned")
	}
	if c := d.Clone(); !c.Pinned("levels.upper_quenching_nitrogen") || !c.Pinned("levels.lower_lifetime") || c.Pinned("levels.manifold_share") {
		t.Error("the clone pins other keys than the design")
	}

	// a listing of every key, as init writes it, read back: no level constant is pinned
	listed, err := ParseDesign([]byte(ExampleDesign().Listing()), "listing.toml")
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range Spreads() {
		if listed.Pinned(s.Key) {
			t.Errorf("%s pinned by a listing of the defaults", s.Key)
		}
	}
}
