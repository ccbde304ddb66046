package validation

import "testing"

// TestRegistry runs every registered check; a unit check that misses its reference fails the
// test. Experiment cases report a discrepancy without failing (see `n2pulse check --strict`).
func TestRegistry(t *testing.T) {
	t.Parallel()
	checks := RunAll()
	if len(checks) == 0 {
		t.Fatal("registry is empty")
	}
	for _, c := range checks {
		if c.Pass() {
			continue
		}
		if c.Tolerated() && c.Err == nil {
			t.Logf("discrepancy %s: computed %.4g, reference %.4g (%s) %s", c.ID, c.Computed, c.Reference, c.Source, c.Known)
			continue
		}
		t.Errorf("%s (%s): computed %.6g %s, reference %.6g, tolerance %s, err %v; source: %s",
			c.ID, c.Quantity, c.Computed, c.Unit, c.Reference, c.ToleranceText(), c.Err, c.Source)
	}
}

func TestPassModes(t *testing.T) {
	t.Parallel()
	cases := []struct {
		c    Check
		want bool
	}{
		{Check{Computed: 1.05, Reference: 1, Tolerance: 0.1, Mode: Relative}, true},
		{Check{Computed: 1.2, Reference: 1, Tolerance: 0.1, Mode: Relative}, false},
		{Check{Computed: 3, Reference: 1, Tolerance: 2, Mode: Factor}, false},
		{Check{Computed: 0.6, Reference: 1, Tolerance: 2, Mode: Factor}, true},
		{Check{Computed: 5, Low: 1, High: 4, Mode: Range}, false},
		{Check{Computed: 0.5, Reference: 0.4, Tolerance: 0.2, Mode: Absolute}, true},
		{Check{Computed: 0, Mode: True}, false},
	}
	for i, c := range cases {
		if got := c.c.Pass(); got != c.want {
			t.Errorf("case %d: Pass() = %v, want %v", i, got, c.want)
		}
	}
}
