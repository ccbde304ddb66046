package design

import (
	"strings"
	"testing"

	"github.com/BurntSushi/toml"
)

// TestListingParses checks that the listing of every key (n2pulse init --all) is valid TOML
// (it once wrote +Inf), that the example's listing reads back to the same design, and that
// the defaults' listing becomes a design once the apparatus keys are given.
func TestListingParses(t *testing.T) {
	t.Parallel()
	ex := ExampleDesign()
	got, err := ParseDesign([]byte(ex.Listing()), "listing.toml")
	if err != nil {
		t.Fatalf("example listing does not read back: %v\n%s", err, ex.Listing())
	}
	if got.String() != ex.String() {
		t.Errorf("example listing reads back to a different design:\n%s\nwant\n%s", got, ex)
	}
	all := Defaults().Listing()
	var raw map[string]any
	if _, err := toml.Decode(all, &raw); err != nil {
		t.Fatalf("defaults listing is not TOML: %v", err)
	}
	if !strings.Contains(all, `optics.excitation_velocity = "infinite"`) {
		t.Errorf("defaults listing lacks the infinite excitation velocity")
	}
	apparatus := `
channel.length = "20 cm"
channel.gap = "1.5 mm"
channel.width = "3 mm"
gas.pressure = "1 atm"
circuit.topology = "blumlein"
circuit.charge_voltage = "14 kV"
circuit.switch_capacitance = "4 nF"
circuit.channel_capacitance = "4 nF"
circuit.switch_inductance = "5 nH"
circuit.channel_inductance = "1.5 nH"
`
	for _, line := range strings.Split(strings.TrimSpace(apparatus), "\n") {
		key, _, _ := strings.Cut(line, " =")
		if !strings.Contains(all, "# "+key+" = ") {
			t.Errorf("apparatus key %s is not commented out in the defaults listing", key)
		}
	}
	if _, err := ParseDesign([]byte(all+apparatus), "all.toml"); err != nil {
		t.Errorf("defaults listing with the apparatus keys given: %v", err)
	}
}
