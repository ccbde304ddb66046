package plots

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// OverlayData is what the overlay figure draws: a model curve (a line through the model's
// points) and measured points (markers) on shared axes. Each X/Y pair must have equal length;
// NaN model values (failed runs) are left out of the line.
type OverlayData struct {
	Title       string
	XLabel      string // e.g. "electrode gap [mm]"
	YLabel      string // e.g. "pulse energy at the output end [µJ]"
	ModelLabel  string // legend entry of the curve, e.g. "model"
	ModelX      []float64
	ModelY      []float64
	MeasuredLbl string // legend entry of the points, e.g. "measured"
	MeasuredX   []float64
	MeasuredY   []float64
}

// Overlay draws a model curve and measured points into path; the format follows the extension
// (.png or .svg). The file is written to a temporary file in the same folder and renamed.
func Overlay(path string, d OverlayData) error {
	if len(d.ModelX) != len(d.ModelY) || len(d.MeasuredX) != len(d.MeasuredY) {
		return fmt.Errorf("plots: overlay: %d/%d model and %d/%d measured values do not pair",
			len(d.ModelX), len(d.ModelY), len(d.MeasuredX), len(d.MeasuredY))
	}
	if _, err := figureFormat(path); err != nil {
		return err
	}
	p := labelledPlot(d.Title, d.XLabel, d.YLabel)
	p.Legend.Top = true

	var model plotter.XYs
	for i := range d.ModelX {
		if !math.IsNaN(d.ModelY[i]) && !math.IsInf(d.ModelY[i], 0) {
			model = append(model, plotter.XY{X: d.ModelX[i], Y: d.ModelY[i]})
		}
	}
	if len(model) > 0 {
		line, points, err := plotter.NewLinePoints(model)
		if err != nil {
			return fmt.Errorf("plots: overlay: %w", err)
		}
		line.Color = color.RGBA{R: 30, G: 90, B: 200, A: 255}
		line.Width = vg.Points(1.5)
		points.Shape = draw.CircleGlyph{}
		points.Radius = vg.Points(1.5)
		points.Color = line.Color
		p.Add(line, points)
		p.Legend.Add(labelOr(d.ModelLabel, "model"), line)
	}
	if len(d.MeasuredX) > 0 {
		xy := make(plotter.XYs, len(d.MeasuredX))
		for i := range xy {
			xy[i] = plotter.XY{X: d.MeasuredX[i], Y: d.MeasuredY[i]}
		}
		sc, err := plotter.NewScatter(xy)
		if err != nil {
			return fmt.Errorf("plots: overlay: %w", err)
		}
		sc.Shape = draw.BoxGlyph{}
		sc.Radius = vg.Points(4)
		sc.Color = color.RGBA{R: 200, G: 40, B: 30, A: 255}
		p.Add(sc)
		p.Legend.Add(labelOr(d.MeasuredLbl, "measured"), sc)
	}
	p.Add(plotter.NewGrid())
	p.Y.Min = math.Min(p.Y.Min, 0)

	return savePlot(path, p, 16*vg.Centimeter, 11*vg.Centimeter)
}

func labelOr(s, def string) string {
	if s == "" {
		return def
	}
	return s
}
