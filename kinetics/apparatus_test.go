package kinetics

import (
	"strings"
	"testing"
)

// TestRunApparatusWarningsIssue16 (issue 16 case 7): `run` repeats the stress warnings of
// `bench`. Before, a charge voltage above the switch's static breakdown ran without a word.
// The example's 1 mm spark gap in 4 atm air holds 14 kV; at 40 kV it self-breaks (Paschen,
// package build); the board's 1.6 mm FR-4 at 100 kV is over-stressed; the example as given
// has no apparatus warning.
func TestRunApparatusWarningsIssue16(t *testing.T) {
	t.Parallel()
	cases := []struct {
		path, key, value, want string
	}{
		{"", "circuit.charge_voltage", "40 kV", "spark gap breaks down"},
		{"../data/designs/board.toml", "circuit.charge_voltage", "100 kV", "dielectric over-stressed"},
		{"", "", "", ""},
	}
	for _, c := range cases {
		var set []string
		if c.key != "" {
			set = []string{c.key, c.value}
		}
		_, r := runWith(t, c.path, set...)
		w := strings.Join(r.Summary.Warnings, "\n")
		if c.want == "" {
			if strings.Contains(w, "apparatus:") {
				t.Errorf("example: apparatus warnings %q, want none", w)
			}
			continue
		}
		if !strings.Contains(w, "apparatus: ") || !strings.Contains(w, c.want) {
			t.Errorf("%s %s=%s: warnings %q, want %q", c.path, c.key, c.value, w, c.want)
		}
	}
}
