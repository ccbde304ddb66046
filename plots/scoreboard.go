package plots

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// ScorePoint is one experiment case on the scoreboard figure.
type ScorePoint struct {
	Loading     float64 // energy into the plasma per molecule [eV]
	EnergyRatio float64 // model/measured pulse energy; NaN when not measured
	FWHMRatio   float64 // model/measured pulse width; NaN when not measured
}

// Scoreboard draws model/measured pulse energy (circles) and FWHM (triangles) of the
// experiment cases against their specific loading, both axes logarithmic, with the line of
// agreement at 1, into path (.png or .svg, written atomically).
func Scoreboard(path string, pts []ScorePoint) error {
	if _, err := figureFormat(path); err != nil {
		return err
	}
	p := labelledPlot("model / measured against the specific loading", "energy into the plasma per molecule [eV]", "model / measured")
	p.X.Scale, p.Y.Scale = plot.LogScale{}, plot.LogScale{}
	p.X.Tick.Marker, p.Y.Tick.Marker = decadeTicks{}, decadeTicks{}
	p.Legend.Top, p.Legend.Left = true, true
	xmin, xmax := math.Inf(1), math.Inf(-1)
	ymin, ymax := 1.0, 1.0
	add := func(name string, ratio func(ScorePoint) float64, shape draw.GlyphDrawer, c color.Color) error {
		var xy plotter.XYs
		for _, q := range pts {
			if r := ratio(q); r > 0 && !math.IsInf(r, 0) && q.Loading > 0 {
				xy = append(xy, plotter.XY{X: q.Loading, Y: r})
				xmin, xmax = math.Min(xmin, q.Loading), math.Max(xmax, q.Loading)
				ymin, ymax = math.Min(ymin, r), math.Max(ymax, r)
			}
		}
		if len(xy) == 0 {
			return nil
		}
		sc, err := plotter.NewScatter(xy)
		if err != nil {
			return fmt.Errorf("plots: scoreboard: %w", err)
		}
		sc.Shape, sc.Radius, sc.Color = shape, vg.Points(4), c
		p.Add(sc)
		p.Legend.Add(name, sc)
		return nil
	}
	if err := add("pulse energy", func(q ScorePoint) float64 { return q.EnergyRatio }, draw.CircleGlyph{}, color.RGBA{R: 30, G: 90, B: 200, A: 255}); err != nil {
		return err
	}
	if err := add("FWHM", func(q ScorePoint) float64 { return q.FWHMRatio }, draw.TriangleGlyph{}, color.RGBA{R: 200, G: 40, B: 30, A: 255}); err != nil {
		return err
	}
	if xmin > xmax {
		xmin, xmax = 0.01, 10
	}
	one, err := plotter.NewLine(plotter.XYs{{X: xmin / 2, Y: 1}, {X: xmax * 2, Y: 1}})
	if err != nil {
		return fmt.Errorf("plots: scoreboard: %w", err)
	}
	one.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
	p.Add(one)
	p.Legend.Add("agreement", one)
	p.Add(plotter.NewGrid())
	// A decade of room above the highest ratio keeps the legend (top left) off the points,
	// and at least one decade mark below and above 1 is labelled.
	p.X.Min, p.X.Max = xmin/2, xmax*2
	p.Y.Min, p.Y.Max = math.Min(ymin/2, 0.3), math.Max(ymax*10, 30)
	return savePlot(path, p, 16*vg.Centimeter, 11*vg.Centimeter)
}
