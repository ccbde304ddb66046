package spectro

import (
	"testing"

	"n2pulse/data"
)

// BenchmarkLaserStartup measures what the first call of Laser costs a fresh process: reading the
// constants and the shipped vibronic table and listing the (0,0) lines. Reported with starts/s.
func BenchmarkLaserStartup(b *testing.B) {
	for b.Loop() {
		if _, err := loadLaser(); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "starts/s")
}

// BenchmarkLaserStartupSolve is the same start-up with the radial equations solved afresh (what
// every process paid before the vibronic table was shipped, and what a stale table costs).
func BenchmarkLaserStartupSolve(b *testing.B) {
	text := data.Spectroscopy()
	for b.Loop() {
		c, err := ParseConstants(text)
		if err != nil {
			b.Fatal(err)
		}
		m, err := NewModel(c, DefaultGrid, RKRCurve)
		if err != nil {
			b.Fatal(err)
		}
		vib, err := computeVibronic(m, "")
		if err != nil {
			b.Fatal(err)
		}
		if _, err := bandLines(c, vib.a00, 0, 0, gainJmax); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "starts/s")
}
