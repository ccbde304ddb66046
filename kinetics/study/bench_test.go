package study

import (
	"context"
	"fmt"
	"syscall"
	"testing"

	"n2pulse/kinetics/design"
)

// BenchmarkSweep20x12 times the 20 × 12 pressure × voltage sweep of the example design with
// the full model, on 1 and 2 workers; points/s is the domain rate. bench/sweep.sh runs it and
// prints the speed-up.
func BenchmarkSweep20x12(b *testing.B) {
	d := design.ExampleDesign()
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
			cpu0 := cpuSeconds()
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
			// CPU time per point: equal for 1 and 2 workers when the points share nothing; a
			// rise with 2 workers means contention, a speed-up short of 2 at equal CPU time
			// means the second core was busy with something else.
			b.ReportMetric((cpuSeconds()-cpu0)/(240*float64(b.N)), "cpu-s/point")
		})
	}
}

// cpuSeconds is the user plus system CPU time of this process so far [s].
func cpuSeconds() float64 {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	tv := func(t syscall.Timeval) float64 { return float64(t.Sec) + 1e-6*float64(t.Usec) }
	return tv(ru.Utime) + tv(ru.Stime)
}
