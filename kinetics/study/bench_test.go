package study

import (
	"context"
	"fmt"
	"testing"

	"n2pulse/kinetics"
)

// BenchmarkSweep20x12 times the 20 × 12 pressure × voltage sweep of the example design with
// the full model, on 1 and 2 workers; points/s is the domain rate. bench/sweep.sh runs it and
// prints the speed-up.
func BenchmarkSweep20x12(b *testing.B) {
	d := kinetics.ExampleDesign()
	p, err := ParseAxis("gas.pressure=50Torr:760Torr:20:log", d)
	if err != nil {
		b.Fatal(err)
	}
	v, err := ParseAxis("circuit.charge_voltage=8kV:16kV:12", d)
	if err != nil {
		b.Fatal(err)
	}
	for _, w := range []int{1, 2} {
		b.Run(fmt.Sprintf("workers=%d", w), func(b *testing.B) {
			for b.Loop() {
				s := &Sweep{Design: d, Axes: []Axis{p, v}, Workers: w, Dir: b.TempDir()}
				t, err := s.Run(context.Background())
				if err != nil {
					b.Fatal(err)
				}
				if len(t.Rows) != 240 {
					b.Fatalf("%d rows", len(t.Rows))
				}
			}
			b.ReportMetric(240*float64(b.N)/b.Elapsed().Seconds(), "points/s")
		})
	}
}
