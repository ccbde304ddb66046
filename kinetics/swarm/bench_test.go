package swarm

import (
	"testing"
	"time"

	"n2pulse/units"
)

// BenchmarkTableN2 solves the 64-point N₂ table (10–3000 Td, 200 cells) and reports the time
// per E/N point.
func BenchmarkTableN2(b *testing.B) {
	mix, _ := SetMixture(SetOriginal, 1, 0, 0)
	b.ReportAllocs()
	start := time.Now()
	for i := 0; i < b.N; i++ {
		if _, _, err := SolveTable(mix, nil, TableFields); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(time.Since(start).Nanoseconds())/float64(b.N*len(TableFields)), "ns/point")
}

// BenchmarkAt is the lookup in the laser model's hot loop.
func BenchmarkAt(b *testing.B) {
	t, err := BuiltinSet("n2", SetOriginal)
	if err != nil {
		b.Fatal(err)
	}
	en := 150 * units.Townsend
	var sink float64
	for i := 0; i < b.N; i++ {
		sink += t.At(en).DriftVelocity
	}
	_ = sink
	b.ReportMetric(1e9/(float64(b.Elapsed().Nanoseconds())/float64(b.N)), "lookups/s")
}
