package plots

import (
	"fmt"
	"math"

	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// FitSeries is one group of measured points and the fitted model's curve through them, in
// display units.
type FitSeries struct {
	Label          string    // legend words of the group, e.g. "switch capacitance 800 pF"
	ModelX, ModelY []float64 // the curve; NaN values (failed runs) are left out
	PointX, PointY []float64 // the measured points
	PointErr       []float64 // one standard uncertainty of each point; nil for none
}

// FitFigure is the overlay of a fit: measured points against the fitted model, one colour per
// group of points.
type FitFigure struct {
	Title, XLabel, YLabel string
	Series                []FitSeries
}

// FitOverlay draws f into path (.png or .svg), written atomically.
func FitOverlay(path string, f FitFigure) error {
	if _, err := figureFormat(path); err != nil {
		return err
	}
	p := labelledPlot(f.Title, f.XLabel, f.YLabel)
	p.Legend.Top = true
	for i, s := range f.Series {
		if len(s.ModelX) != len(s.ModelY) || len(s.PointX) != len(s.PointY) || (s.PointErr != nil && len(s.PointErr) != len(s.PointX)) {
			return fmt.Errorf("plots: fit overlay: series %d: lengths do not pair", i+1)
		}
		col := compareColors[i%len(compareColors)]
		var model plotter.XYs
		for k := range s.ModelX {
			if y := s.ModelY[k]; !math.IsNaN(y) && !math.IsInf(y, 0) {
				model = append(model, plotter.XY{X: s.ModelX[k], Y: y})
			}
		}
		name := s.Label
		if name != "" {
			name = ", " + name
		}
		if len(model) > 1 {
			line, err := plotter.NewLine(model)
			if err != nil {
				return fmt.Errorf("plots: fit overlay: %w", err)
			}
			line.Color, line.Width = col, vg.Points(1.5)
			p.Add(line)
			p.Legend.Add("fitted model"+name, line)
		}
		if len(s.PointX) == 0 {
			continue
		}
		pts := make(plotter.XYs, len(s.PointX))
		for k := range pts {
			pts[k] = plotter.XY{X: s.PointX[k], Y: s.PointY[k]}
		}
		sc, err := plotter.NewScatter(pts)
		if err != nil {
			return fmt.Errorf("plots: fit overlay: %w", err)
		}
		sc.Shape, sc.Radius, sc.Color = draw.BoxGlyph{}, vg.Points(4), col
		p.Add(sc)
		p.Legend.Add("measured"+name, sc)
		if s.PointErr != nil {
			e := errPoints{pts, s.PointErr}
			bars, err := plotter.NewYErrorBars(e)
			if err != nil {
				return fmt.Errorf("plots: fit overlay: %w", err)
			}
			bars.Color = col
			p.Add(bars)
		}
	}
	p.Add(plotter.NewGrid())
	p.Y.Min = math.Min(p.Y.Min, 0)
	// Room above the data for the legend, which would otherwise cover the highest points.
	p.Y.Max += 0.12 * float64(2*len(f.Series)) * (p.Y.Max - p.Y.Min) / 2
	return savePlot(path, p, 16*vg.Centimeter, 11*vg.Centimeter)
}

// errPoints pairs points with symmetric y errors for plotter.NewYErrorBars.
type errPoints struct {
	plotter.XYs
	err []float64
}

func (e errPoints) YError(i int) (float64, float64) { return e.err[i], e.err[i] }
