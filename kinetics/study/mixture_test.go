package study

import (
	"errors"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
)

// TestMixtureRuleSweep checks the mixture rule on the sweep path: varying oxygen alone makes
// nitrogen fill the rest at every point; varying nitrogen and oxygen to a sum other than one
// is an error naming the keys. (Air as 0.79/0.21: common practice, no source.)
func TestMixtureRuleSweep(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	o, err := ParseAxis("gas.oxygen=0:0.21:2", d)
	if err != nil {
		t.Fatal(err)
	}
	s := &Sweep{Design: d, Axes: []Axis{o}}
	for i, want := range []float64{1, 0.79} {
		p, err := s.PointDesign(i)
		if err != nil {
			t.Fatalf("point %d: %v", i, err)
		}
		if !scalar.EqualWithinAbsOrRel(p.Gas.Nitrogen, want, 1e-12, 1e-12) {
			t.Errorf("point %d: nitrogen %g, want %g", i, p.Gas.Nitrogen, want)
		}
	}
	n, err := ParseAxis("gas.nitrogen=1:1:1", d)
	if err != nil {
		t.Fatal(err)
	}
	s = &Sweep{Design: d, Axes: []Axis{n, o}}
	_, err = s.PointDesign(1)
	var ke *design.KeyError
	if !errors.As(err, &ke) || !strings.Contains(ke.Key, "gas.nitrogen") || !strings.Contains(ke.Key, "gas.oxygen") {
		t.Errorf("nitrogen 1 and oxygen 0.21 varied: error %v, want a KeyError naming both", err)
	}
}
