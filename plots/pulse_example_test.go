package plots_test

import (
	"fmt"
	"math"
	"os"
	"path/filepath"

	"n2pulse/plots"
)

// ExamplePulseReport draws an invented Gaussian output pulse of 1.18 ns FWHM with a simple
// circuit waveform, as PNG and SVG.
func ExamplePulseReport() {
	dir, err := os.MkdirTemp("", "pulse-report")
	if err != nil {
		fmt.Println(err)
		return
	}
	defer os.RemoveAll(dir)
	const n = 400
	d := plots.PulseData{Title: "invented demo pulse", Time: make([]float64, n),
		ChannelVoltage: make([]float64, n), Current: make([]float64, n), PowerFront: make([]float64, n)}
	sigma := 0.5e-9 // FWHM = 2·sqrt(2 ln 2)·σ ≈ 1.18 ns
	for i := range d.Time {
		t := 20e-9 * float64(i) / (n - 1)
		d.Time[i] = t
		d.ChannelVoltage[i] = 12e3 * math.Exp(-t/5e-9)
		d.Current[i] = 2e3 * (1 - math.Exp(-t/5e-9))
		d.PowerFront[i] = 150e3 * math.Exp(-0.5*math.Pow((t-8e-9)/sigma, 2))
	}
	half := math.Sqrt(2*math.Ln2) * sigma
	d.FWHMStart, d.FWHMEnd = 8e-9-half, 8e-9+half
	for _, name := range []string{"pulse.png", "pulse.svg"} {
		if err := plots.PulseReport(filepath.Join(dir, name), d); err != nil {
			fmt.Println(err)
			return
		}
		st, err := os.Stat(filepath.Join(dir, name))
		fmt.Println(name, err == nil && st.Size() > 0)
	}
	fmt.Println(plots.PulseReport("pulse.pdf", d))
	// Output:
	// pulse.png true
	// pulse.svg true
	// plots: "pulse.pdf": want a file name ending in .png or .svg
}
