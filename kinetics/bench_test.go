package kinetics

import (
	"testing"

	"n2pulse/kinetics/design"
)

// BenchmarkRun times one shot of the built-in example design (200 cells) and reports the
// optical cell updates per second.
func BenchmarkRun(b *testing.B) {
	d := design.ExampleDesign()
	if _, err := Run(d, &RunSettings{Light: true}); err != nil { // warm the tables
		b.Fatal(err)
	}
	b.ResetTimer()
	var updates int
	for i := 0; i < b.N; i++ {
		r, err := Run(d, &RunSettings{Light: true})
		if err != nil {
			b.Fatal(err)
		}
		updates += r.Stats.OpticalSteps * r.Stats.Cells
	}
	b.ReportMetric(float64(updates)/b.Elapsed().Seconds(), "cell-updates/s")
	b.ReportMetric(b.Elapsed().Seconds()*1e9/float64(updates), "ns/cell-update")
}

// BenchmarkRunFull times one shot of the built-in example design as `n2pulse run` takes it:
// with its waveforms and gain map (not light). Reported with shots/s and allocations.
func BenchmarkRunFull(b *testing.B) { benchmarkShots(b, nil) }

// BenchmarkRunSummaryOnly times one shot of the example design as `n2pulse run` without
// --out takes it (RunSettings.SummaryOnly: the full shot, no series kept). Reported with
// shots/s and allocations.
func BenchmarkRunSummaryOnly(b *testing.B) { benchmarkShots(b, &RunSettings{SummaryOnly: true}) }

// BenchmarkRunOverlap times the shot of BenchmarkRunSummaryOnly with its circuit solved on a
// goroutine of its own while the shot follows it (RunSettings.Overlap, as `n2pulse run`
// takes it): on two idle cores it takes about the longer of the two instead of their sum.
func BenchmarkRunOverlap(b *testing.B) {
	benchmarkShots(b, &RunSettings{SummaryOnly: true, Overlap: true})
}

// benchmarkShots times shots of the example design with the given settings (after one shot
// that warms the tables) and reports shots/s and allocations.
func benchmarkShots(b *testing.B, set *RunSettings) {
	d := design.ExampleDesign()
	if _, err := Run(d, set); err != nil { // warm the tables
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Run(d, set); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "shots/s")
}
