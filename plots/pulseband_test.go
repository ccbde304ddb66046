package plots

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestPulseReportBand draws the demo shot with a band of ±20 % around its output-end power on
// 200 times: the SVG names the band in the legend with its sample count (and the report
// without a band does not); a band with low above high, or of mismatched lengths, is refused
// naming PowerBand.
func TestPulseReportBand(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	d := demoPulse()
	b := &PowerBand{Samples: 12}
	for k := range 200 {
		tt := 6e-9 + 8e-9*float64(k)/199
		p := 250e3 * math.Exp(-math.Pow((tt-9.5e-9)/0.6e-9, 2))
		b.Time, b.Low, b.High = append(b.Time, tt), append(b.Low, 0.8*p), append(b.High, 1.2*p)
	}
	d.Band = b
	with := filepath.Join(dir, "band.svg")
	if err := PulseReport(with, d); err != nil {
		t.Fatal(err)
	}
	checkFigure(t, with)
	without := filepath.Join(dir, "plain.svg")
	plain := demoPulse()
	if err := PulseReport(without, plain); err != nil {
		t.Fatal(err)
	}
	const legend = "output end, 5–95 % of 12 samples"
	for _, c := range []struct {
		path string
		want bool
	}{{with, true}, {without, false}} {
		s, err := os.ReadFile(c.path)
		if err != nil {
			t.Fatal(err)
		}
		if got := strings.Contains(string(s), legend); got != c.want {
			t.Errorf("%s: legend %q present %v, want %v", filepath.Base(c.path), legend, got, c.want)
		}
	}
	bad := *b
	bad.Low = append([]float64(nil), b.Low...)
	bad.Low[100] = 2 * bad.High[100]
	d.Band = &bad
	if err := PulseReport(filepath.Join(dir, "bad.svg"), d); err == nil || !strings.Contains(err.Error(), "PowerBand") {
		t.Errorf("low above high: %v; want an error naming PowerBand", err)
	}
	bad.Low = b.Low[:10]
	if err := PulseReport(filepath.Join(dir, "bad.svg"), d); err == nil || !strings.Contains(err.Error(), "PowerBand") {
		t.Errorf("10 low values on 200 times: %v; want an error naming PowerBand", err)
	}
}

// TestPowerWindow: the demo pulse (Gaussian of 0.6 ns 1/e half-width at 9.5 ns, both ends) is
// above 1 % of its peak for ±0.6·√ln100 ns = ±1.288 ns; widened by half that span on each side
// the window is 6.925–12.075 ns, within 1.5 time steps (0.075 ns) of the 600-sample record.
func TestPowerWindow(t *testing.T) {
	t.Parallel()
	d := demoPulse()
	lo, hi, err := PowerWindow(d.Time, d.PowerFront, d.PowerRear)
	if err != nil {
		t.Fatal(err)
	}
	half := 0.6e-9 * math.Sqrt(math.Log(100))
	for _, c := range []struct{ got, want float64 }{{lo, 9.5e-9 - 2*half}, {hi, 9.5e-9 + 2*half}} {
		if !scalar.EqualWithinAbsOrRel(c.got, c.want, 0.08e-9, 0) {
			t.Errorf("window edge %g s, want %g s within 0.08 ns", c.got, c.want)
		}
	}
	if _, _, err := PowerWindow(d.Time, d.PowerFront[:5], nil); err == nil {
		t.Error("5 power values on 600 times: no error")
	}
}
