package kinetics

import (
	"math"
	"testing"

	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// phaseSetup prepares the circuit and parameters of the example design as Run does, so that
// the circuit and the optics of one shot can be timed apart.
func phaseSetup(b *testing.B) (*design.Design, *circuit, *Parameters, int) {
	b.Helper()
	return circuitSetup(b, design.ExampleDesign())
}

// circuitSetup prepares the circuit, the parameters and the number of optical steps of design
// d as Run does.
func circuitSetup(b testing.TB, d *design.Design) (*design.Design, *circuit, *Parameters, int) {
	b.Helper()
	table, err := swarmTable(d, "")
	if err != nil {
		b.Fatal(err)
	}
	par, _, err := laserParameters(d)
	if err != nil {
		b.Fatal(err)
	}
	circ := newCircuit(d, table)
	par.GapCapacitance = circ.cg
	par.OpticalArea = d.Channel.Aperture
	if par.OpticalArea == 0 {
		par.OpticalArea = d.Channel.Gap * d.Channel.Width
	}
	par.CellLength = d.Channel.Length / float64(d.Numerics.Cells)
	par.TimeStep = par.CellLength / units.SpeedOfLight
	steps := int(math.Ceil(d.Numerics.EndTime / par.TimeStep))
	return d, circ, &par, steps
}

// BenchmarkCircuit times the circuit and discharge integration of one shot of the example
// design and reports the accepted steps per second.
func BenchmarkCircuit(b *testing.B) {
	d, circ, par, steps := phaseSetup(b)
	b.ResetTimer()
	accepted := 0
	for i := 0; i < b.N; i++ {
		_, st, err := solveCircuit(circ, d, par, steps, true)
		if err != nil {
			b.Fatal(err)
		}
		accepted += st.Circuit.Steps
	}
	b.ReportMetric(float64(accepted)/b.Elapsed().Seconds(), "steps/s")
}

// BenchmarkOptics times the populations and photons of one shot of the example design (200
// cells), on waveforms solved once, and reports the optical cell updates per second.
func BenchmarkOptics(b *testing.B) {
	d, circ, par, steps := phaseSetup(b)
	wf, _, err := solveCircuit(circ, d, par, steps, true)
	if err != nil {
		b.Fatal(err)
	}
	set := &RunSettings{Light: true}
	b.ResetTimer()
	updates := 0
	for i := 0; i < b.N; i++ {
		res := &Result{Parameters: *par}
		sh := newShot(d, &res.Parameters, wf, steps, set)
		sh.run(res)
		sh.summarise(res)
		updates += res.Stats.OpticalSteps * res.Stats.Cells
	}
	b.ReportMetric(float64(updates)/b.Elapsed().Seconds(), "cell-updates/s")
	b.ReportMetric(b.Elapsed().Seconds()*1e9/float64(updates), "ns/cell-update")
}
