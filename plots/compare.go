package plots

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
)

// ComparePulse is one design's output-end pulse for CompareFigure.
type ComparePulse struct {
	Name  string
	Time  []float64 // time after switch closure [s], increasing
	Power []float64 // output-end power [W], len(Time) values
}

// compareColors tell the designs apart; a fifth design and beyond reuse them dashed.
var compareColors = []color.Color{
	color.RGBA{R: 20, G: 70, B: 190, A: 255}, color.RGBA{R: 200, G: 40, B: 30, A: 255},
	color.RGBA{R: 20, G: 130, B: 60, A: 255}, color.RGBA{R: 230, G: 130, B: 0, A: 255},
}

// CompareFigure draws the output-end pulses of several designs on one axis into path (.png or
// .svg), aligned at switch closure (t = 0 in every run) and zoomed on the span where any of
// them emits.
func CompareFigure(path, title string, pulses []ComparePulse) error {
	if _, err := figureFormat(path); err != nil {
		return err
	}
	if len(pulses) == 0 {
		return fmt.Errorf("plots: compare: no pulse to draw")
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	var all [][]float64
	for _, c := range pulses {
		if len(c.Time) < 2 || len(c.Time) != len(c.Power) {
			return fmt.Errorf("plots: compare: %s: %d times and %d powers, want equal and at least 2", c.Name, len(c.Time), len(c.Power))
		}
		t := scaled(c.Time, 1e9)
		a, b := pulseWindow(t, c.Power)
		lo, hi = math.Min(lo, a), math.Max(hi, b)
		all = append(all, c.Power)
	}
	f, u := siScale(maxAbs(all...), "W")
	p := plot.New()
	p.Title.Text = title
	p.X.Label.Text = "time after switch closure [ns]"
	p.Y.Label.Text = "output power, output end [" + u + "]"
	for i, c := range pulses {
		var dashes []vg.Length
		if i >= len(compareColors) {
			dashes = []vg.Length{vg.Points(4), vg.Points(2)}
		}
		if l := addCurveStyled(p, scaled(c.Time, 1e9), c.Power, f, compareColors[i%len(compareColors)], dashes, 1.4); l != nil {
			p.Legend.Add(c.Name, l)
		}
	}
	p.X.Min, p.X.Max = lo, hi // after the curves, which widen the range to their data
	p.Y.Min = 0
	p.Legend.Top = true
	p.Add(plotter.NewGrid())
	printStyle(p)
	return savePlot(path, p, 16*vg.Centimeter, 11*vg.Centimeter)
}
