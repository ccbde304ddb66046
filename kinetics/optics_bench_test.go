package kinetics

import "testing"

// BenchmarkPropagate times the optical step of a 200-cell channel holding a strong
// inversion and reports the cost per cell update.
func BenchmarkPropagate(b *testing.B) {
	m := testMedium(200, 0.2, 1.4e-19, 0.83, 2e21, 1e21)
	m.spont = 1e-3 * m.dz
	b.ResetTimer()
	for k := 0; k < b.N; k++ {
		if k%64 == 0 {
			m.resync()
		}
		m.propagate(k)
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*200), "ns/cell-update")
}
