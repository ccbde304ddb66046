package design

import (
	"errors"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestMixtureRuleDesignFile checks the mixture rule on the design-file path: oxygen given
// without nitrogen makes nitrogen fill the rest; an explicit sum other than one is an error
// naming the keys. (Air as 0.79/0.21: common practice, no source.)
func TestMixtureRuleDesignFile(t *testing.T) {
	t.Parallel()
	base := minimalDesign
	d, err := ParseDesign([]byte(base+"oxygen = 0.21\n"), "air.toml")
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(d.Gas.Nitrogen, 0.79, 1e-12, 1e-12) {
		t.Errorf("nitrogen %g with oxygen 0.21 and no nitrogen given, want 0.79", d.Gas.Nitrogen)
	}
	_, err = ParseDesign([]byte(base+"oxygen = 0.21\nnitrogen = 1.0\n"), "bad.toml")
	var ke *KeyError
	if !errors.As(err, &ke) || !strings.Contains(ke.Key, "gas.nitrogen") || !strings.Contains(ke.Key, "gas.oxygen") {
		t.Errorf("nitrogen 1 + oxygen 0.21 given: error %v, want a KeyError naming gas.nitrogen and gas.oxygen", err)
	}
}

// TestMixtureRuleBalance checks BalanceMixture directly: untouched mixtures stay as they are,
// oxygen and helium that leave no room for nitrogen are an error.
func TestMixtureRuleBalance(t *testing.T) {
	t.Parallel()
	d := ExampleDesign()
	if err := d.BalanceMixture([]string{"gas.pressure"}); err != nil || d.Gas.Nitrogen != 1 {
		t.Errorf("mixture untouched: nitrogen %g, error %v; want 1, nil", d.Gas.Nitrogen, err)
	}
	for _, kv := range [][2]string{{"gas.oxygen", "0.6"}, {"gas.helium", "0.5"}} {
		if err := d.Set(kv[0], kv[1]); err != nil {
			t.Fatal(err)
		}
	}
	var ke *KeyError
	if err := d.BalanceMixture([]string{"gas.oxygen", "gas.helium"}); !errors.As(err, &ke) || !strings.Contains(ke.Key, "gas.helium") {
		t.Errorf("oxygen 0.6 + helium 0.5: error %v, want a KeyError naming gas.oxygen and gas.helium", err)
	}
}

// TestRecombinationSharesValidated: the two shares of electron–N₄⁺ recombination that leave
// excited N₂ may not sum above 1 (the defaults, 0.11 + 0.87, do not); the error names the key.
func TestRecombinationSharesValidated(t *testing.T) {
	t.Parallel()
	d := ExampleDesign()
	if err := d.Validate(); err != nil {
		t.Fatalf("defaults: %v", err)
	}
	if s := d.Levels.RecombinationUpperShare + d.Levels.RecombinationLowerShare; !(s <= 1) {
		t.Errorf("default shares sum to %g", s)
	}
	d.Levels.RecombinationUpperShare = 0.2
	err := d.Validate()
	if err == nil || !strings.Contains(err.Error(), "levels.recombination_lower_share") {
		t.Errorf("shares 0.2 + 0.87: error %v, want one naming levels.recombination_lower_share", err)
	}
}
