package fit

import (
	"context"
	"fmt"
	"strings"
	"testing"

	"n2pulse/kinetics/fit/measured"
	"n2pulse/kinetics/study"
)

// BenchmarkFitTwoKeys: the speed case, a 2-parameter fit to 10 measured points
// (target ≤ 30 s on 2 cores). The demo design at the experiment cases' resolution (20 cells,
// 20 ns), measured (by the model, width 1.5 mm and switch inductance 15 nH, ±3 % pseudo-noise
// from a fixed pattern) in pulse energy at 10 gaps; discharge width and switch inductance free,
// three starts (the command's default). Reports fits/s and shots/s.
func BenchmarkFitTwoKeys(b *testing.B) {
	d := testDesign(b)
	for k, v := range map[string]string{"numerics.cells": "20", "numerics.end_time": "20 ns"} {
		if err := d.Set(k, v); err != nil {
			b.Fatal(err)
		}
	}
	var csv strings.Builder
	csv.WriteString("channel.gap [mm], energy_front [J], energy_front_uncertainty [%]\n")
	for i := range 10 {
		g := 1.2 + 0.15*float64(i)
		t := d.Clone()
		for k, v := range map[string]string{"channel.width": "1.5 mm", "circuit.switch_inductance": "15 nH", "channel.gap": fmt.Sprintf("%g mm", g)} {
			if err := t.Set(k, v); err != nil {
				b.Fatal(err)
			}
		}
		s, err := study.ModelRunner(t)
		if err != nil {
			b.Fatal(err)
		}
		noise := []float64{1.02, 0.97, 1.01, 1.03, 0.98, 0.99, 1.02, 0.97, 1.0, 1.01}[i]
		fmt.Fprintf(&csv, "%g, %g, 3\n", g, s.EnergyFront*noise)
	}
	data, err := measured.Parse([]byte(csv.String()), "bench.csv")
	if err != nil {
		b.Fatal(err)
	}
	free := []Free{{"channel.width", 0.5e-3, 5e-3}, {"circuit.switch_inductance", 3e-9, 50e-9}}
	var shots int64
	b.ResetTimer()
	for range b.N {
		res, err := Fit(context.Background(), d, data, free, nil)
		if err != nil {
			b.Fatal(err)
		}
		shots += res.Runs
	}
	sec := b.Elapsed().Seconds()
	b.ReportMetric(float64(b.N)/sec, "fits/s")
	b.ReportMetric(float64(shots)/sec, "shots/s")
	b.ReportMetric(float64(shots)/float64(b.N), "shots/fit")
}
