package main

import (
	"errors"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
)

// TestMixtureRuleRunSet checks the mixture rule on the --set path of run (and of sweep, which
// loads its design the same way): --set gas.oxygen=0.21 on a nitrogen design makes air
// (nitrogen 0.79); an explicit nitrogen that breaks the sum is an error naming the keys.
// (Air as 0.79/0.21: common practice, no source.)
func TestMixtureRuleRunSet(t *testing.T) {
	t.Parallel()
	d, err := loadDesign(nil, []string{"gas.oxygen=0.21"})
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(d.Gas.Nitrogen, 0.79, 1e-12, 1e-12) {
		t.Errorf("--set gas.oxygen=0.21: nitrogen %g, want 0.79", d.Gas.Nitrogen)
	}
	_, err = loadDesign(nil, []string{"gas.oxygen=0.21", "gas.nitrogen=1"})
	var ke *design.KeyError
	if !errors.As(err, &ke) || !strings.Contains(ke.Key, "gas.nitrogen") || !strings.Contains(ke.Key, "gas.oxygen") {
		t.Errorf("--set gas.oxygen=0.21 --set gas.nitrogen=1: error %v, want a KeyError naming both", err)
	}
}
