package kinetics

import (
	"errors"
	"reflect"
	"testing"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/ode"
)

// overlapDesigns are the designs on which the overlapped run is checked: the example (a
// simultaneous discharge), excitation fronts travelling either way (the per-cell path, which
// reads the discharge at each cell's delay), a pulse followed past numerics.end_time (a second
// attempt) and the tube design's exponential switch.
func overlapDesigns(t *testing.T) map[string]*design.Design {
	t.Helper()
	forward := design.ExampleDesign()
	forward.Optics.ExcitationVelocity = 1e8
	backward := design.ExampleDesign()
	backward.Optics.ExcitationVelocity = -2e8
	long := design.ExampleDesign()
	long.Numerics.EndTime = 12e-9
	tube, err := design.LoadDesign("../data/designs/tube.toml")
	if err != nil {
		t.Fatal(err)
	}
	return map[string]*design.Design{"example": design.ExampleDesign(), "forward": forward,
		"backward": backward, "followed": long, "tube": tube}
}

// TestOverlapExact: a run whose circuit is solved on its own goroutine while the shot follows
// it (RunSettings.Overlap) gives the Result of a run that solves the circuit first, bit for
// bit: summary, warnings, statistics and every series, for a full, a summary-only and a light
// run.
func TestOverlapExact(t *testing.T) {
	t.Parallel()
	for name, d := range overlapDesigns(t) {
		for _, mode := range []struct {
			name        string
			light, only bool
		}{{"full", false, false}, {"summary-only", false, true}, {"light", true, false}} {
			plain, err := Run(d, &RunSettings{Light: mode.light, SummaryOnly: mode.only})
			if err != nil {
				t.Fatalf("%s %s: %v", name, mode.name, err)
			}
			over, err := Run(d, &RunSettings{Light: mode.light, SummaryOnly: mode.only, Overlap: true, overlapAlways: true})
			if err != nil {
				t.Fatalf("%s %s overlapped: %v", name, mode.name, err)
			}
			if !reflect.DeepEqual(plain, over) {
				t.Errorf("%s %s: the overlapped run differs:\nplain %+v\nover  %+v", name, mode.name, plain.Summary, over.Summary)
			}
			if plain.Summary.EnergyTotal <= 0 || plain.Stats.OpticalSteps == 0 {
				t.Errorf("%s %s: no light (%g J, %d optical steps): nothing was compared", name, mode.name,
					plain.Summary.EnergyTotal, plain.Stats.OpticalSteps)
			}
			if !mode.light && !mode.only && len(over.PowerFront) == 0 {
				t.Errorf("%s: the full overlapped run kept no series", name)
			}
		}
	}
}

// TestOverlapCircuitError: a circuit that fails part-way through stops the overlapped shot
// with the error a run that solves the circuit first returns.
func TestOverlapCircuitError(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	if err := d.Validate(); err != nil {
		t.Fatal(err)
	}
	table, err := swarmTable(d, "")
	if err != nil {
		t.Fatal(err)
	}
	if table, err = table.AtDensity(gasDensity(d.Gas)); err != nil {
		t.Fatal(err)
	}
	par, _, err := laserParameters(d)
	if err != nil {
		t.Fatal(err)
	}
	par.OpticalArea, _ = opticalArea(d.Channel)
	par.CellLength = d.Channel.Length / float64(d.Numerics.Cells)
	par.TimeStep = par.CellLength / 299792458
	steps := int(d.Numerics.EndTime / par.TimeStep)
	// A switch whose resistance grows as e^(t/20 ps): it overflows after about 14 ns, after
	// the discharge has begun, and the circuit integrator gives up.
	broken := func() *circuit {
		c := newCircuit(d, table)
		par.GapCapacitance = c.cg
		c.sw.Model, c.sw.OnResistance, c.sw.OffResistance, c.sw.RiseTime = design.ExponentialSwitch, 0.1, 0.2, -20e-12
		return c
	}
	var errs [2]error
	var published int64
	for i, overlap := range []bool{false, true} {
		s := &RunSettings{Overlap: overlap, overlapAlways: true}
		c := broken()
		if overlap {
			// The same start as circuitAndShot, to see how far the circuit got.
			res := &Result{Parameters: par}
			feed := startCircuit(c, d, &par, steps, true)
			sh := newShot(d, &res.Parameters, feed.wf, steps, s)
			sh.feed = feed
			sh.run(res)
			_, errs[i] = feed.wait()
			published = feed.ready.Load()
			continue
		}
		_, _, _, errs[i] = circuitAndShot(c, d, &par, steps, s)
	}
	if errs[0] == nil || errs[1] == nil {
		t.Fatalf("the broken circuit did not fail: %v / %v", errs[0], errs[1])
	}
	t.Logf("%v; %d of %d", errs[1], published, steps)
	if errs[0].Error() != errs[1].Error() {
		t.Errorf("errors differ:\nplain   %v\noverlap %v", errs[0], errs[1])
	}
	var se *ode.StepError
	if !errors.As(errs[1], &se) {
		t.Errorf("the overlapped error is not an *ode.StepError: %v", errs[1])
	}
	if !(published > 0 && published < int64(steps)) {
		t.Errorf("the circuit published %d of %d samples: not a failure part-way through", published, steps)
	}
	_, _, _, err = circuitAndShot(broken(), d, &par, steps, &RunSettings{Overlap: true, overlapAlways: true})
	if err == nil || err.Error() != errs[0].Error() {
		t.Errorf("circuitAndShot overlapped: %v, want %v", err, errs[0])
	}
}
