package plots

import (
	"fmt"
	"image/color"

	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
)

// SpectrumData is what the spectrum figure draws: sticks (one vertical line per entry) and a
// continuous profile, on a shared horizontal axis. Lengths of each pair must match.
type SpectrumData struct {
	Title    string
	XLabel   string // e.g. "wavelength in air [nm]"
	YLabel   string // e.g. "relative intensity"
	StickX   []float64
	StickY   []float64
	ProfileX []float64
	ProfileY []float64
}

// Spectrum draws sticks and a profile into path; the format follows the extension (.png or
// .svg). The file is written to a temporary file in the same folder and renamed.
func Spectrum(path string, d SpectrumData) error {
	if len(d.StickX) != len(d.StickY) || len(d.ProfileX) != len(d.ProfileY) {
		return fmt.Errorf("plots: spectrum: %d/%d stick and %d/%d profile points do not pair",
			len(d.StickX), len(d.StickY), len(d.ProfileX), len(d.ProfileY))
	}
	if _, err := figureFormat(path); err != nil {
		return err
	}
	p := labelledPlot(d.Title, d.XLabel, d.YLabel)
	p.Y.Min = 0
	if len(d.StickX) > 0 {
		// one polyline that rises and falls at each stick draws all sticks from the base line
		pts := make(plotter.XYs, 0, 3*len(d.StickX))
		for i, x := range d.StickX {
			pts = append(pts, plotter.XY{X: x, Y: 0}, plotter.XY{X: x, Y: d.StickY[i]}, plotter.XY{X: x, Y: 0})
		}
		sticks, err := plotter.NewLine(pts)
		if err != nil {
			return fmt.Errorf("plots: spectrum sticks: %w", err)
		}
		sticks.Color = color.RGBA{R: 120, G: 120, B: 200, A: 255}
		sticks.Width = vg.Points(0.6)
		p.Add(sticks)
		p.Legend.Add("lines", sticks)
	}
	if len(d.ProfileX) > 0 {
		pts := make(plotter.XYs, len(d.ProfileX))
		for i := range pts {
			pts[i] = plotter.XY{X: d.ProfileX[i], Y: d.ProfileY[i]}
		}
		prof, err := plotter.NewLine(pts)
		if err != nil {
			return fmt.Errorf("plots: spectrum profile: %w", err)
		}
		prof.Color = color.RGBA{R: 200, G: 30, B: 30, A: 255}
		prof.Width = vg.Points(1.2)
		p.Add(prof)
		p.Legend.Add("broadened", prof)
	}
	p.Legend.Top = true
	p.Legend.Left = true
	p.Add(plotter.NewGrid())
	printStyle(p)
	return savePlot(path, p, 16*vg.Centimeter, 11*vg.Centimeter)
}
