package study

import (
	"context"
	"testing"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// BenchmarkSampledOverhead measures what the band machinery adds per run of a banded sweep: a
// sweep of 10 points × 100 samples with a runner that does no physics, so the time per run
// (reported as ns/run) is making the sample's design, reading its figures, and the bands and
// rank correlations of every figure at the end of each point. A model shot takes ~10 ms.
func BenchmarkSampledOverhead(b *testing.B) {
	d := design.ExampleDesign()
	a, err := ParseAxis("gas.pressure=50Torr:200Torr:10", d)
	if err != nil {
		b.Fatal(err)
	}
	run := func(d *design.Design) (kinetics.Summary, error) {
		return kinetics.Summary{EnergyFront: d.Levels.UpperQuenchingNitrogen * 1e13, PeakPower: 1 / d.Levels.LowerLifetime, Lases: true}, nil
	}
	for b.Loop() {
		s := &Sweep{Design: d, Axes: []Axis{a}, Runner: run, Workers: 2, Dir: b.TempDir(), Samples: 100, Seed: 1}
		if _, err := s.Run(context.Background()); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*10*101), "ns/run")
}
