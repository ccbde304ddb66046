package design

import (
	"errors"
	"sync"
	"testing"
)

// TestValidateIsPure: Validate only reads the design. Many goroutines validate one design at
// once (run with -race, as .ci/run does, any write is a data race), and the design is
// unchanged afterwards, key for key. A text key spelled otherwise than listed, possible only
// in a design filled in code, is reported with the listed spelling, not rewritten.
func TestValidateIsPure(t *testing.T) {
	t.Parallel()
	d := ExampleDesign()
	before := d.String()
	var wg sync.WaitGroup
	errs := make([]error, 8)
	for i := range errs {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for range 50 {
				if err := d.Validate(); err != nil {
					errs[i] = err
					return
				}
				_ = d.Circuit.Topology // a reader beside the validators
			}
		}()
	}
	wg.Wait()
	for i, err := range errs {
		if err != nil {
			t.Fatalf("goroutine %d: %v", i, err)
		}
	}
	if after := d.String(); after != before {
		t.Errorf("Validate changed the design:\nbefore\n%s\nafter\n%s", before, after)
	}

	odd := ExampleDesign()
	odd.Circuit.Topology = "BLUMLEIN"
	err := odd.Validate()
	var ke *KeyError
	if !errors.As(err, &ke) || ke.Key != "circuit.topology" || ke.Problem != `write it as "blumlein"` {
		t.Errorf("topology BLUMLEIN: error %v; want a KeyError on circuit.topology saying how to write it", err)
	}
	if odd.Circuit.Topology != "BLUMLEIN" {
		t.Errorf("Validate rewrote the topology to %q", odd.Circuit.Topology)
	}
	odd.Circuit.Topology, odd.Switch.Model = Blumlein, "Spark"
	if err := odd.Validate(); !errors.As(err, &ke) || ke.Key != "switch.model" {
		t.Errorf("switch model Spark: error %v; want a KeyError on switch.model", err)
	}
}
