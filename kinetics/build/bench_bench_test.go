package build

import "testing"

func BenchmarkEvaluate(b *testing.B) {
	s, c := board()
	for b.Loop() {
		if _, err := Evaluate(s, c); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "designs/s")
}
