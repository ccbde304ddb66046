package plots

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"n2pulse/kinetics"
	"n2pulse/kinetics/study"
	"n2pulse/units"
)

// lengthColors are the curve colours: the design as given, then the travelling wave.
var lengthColors = []color.Color{color.RGBA{B: 170, A: 255}, color.RGBA{R: 200, G: 60, A: 255}}

// lengthPanel is one quantity of the length figure, in display units.
type lengthPanel struct {
	label string
	scale float64 // SI value × scale = displayed value
	get   func(s kinetics.Summary) float64
}

var lengthPanels = []lengthPanel{
	{"output-end energy [µJ]", 1e6, func(s kinetics.Summary) float64 { return s.EnergyFront }},
	{"peak power [kW]", 1e-3, func(s kinetics.Summary) float64 { return s.PeakPower }},
	{"FWHM [ns]", 1e9, func(s kinetics.Summary) float64 { return s.FWHM }},
}

// LengthFigure draws a length scan as base.png and base.svg: output-end energy, peak power and
// FWHM against channel length in three panels, one curve per excitation velocity. On the energy
// panel a solid vertical line marks each curve's useful length and a dashed one its transit-time
// estimate c·τ_g. It returns the files written.
func LengthFigure(r *study.LengthResult, base string) ([]string, error) {
	if len(r.Curves) == 0 {
		return nil, fmt.Errorf("plots: length scan has no curve")
	}
	rows := make([][]*plot.Plot, len(lengthPanels))
	for k, pan := range lengthPanels {
		p := plot.New()
		printStyle(p)
		p.Y.Label.Text = pan.label
		if k == len(lengthPanels)-1 {
			p.X.Label.Text = "channel length [cm]"
		}
		top := 0.0
		for c, cur := range r.Curves {
			var xy plotter.XYs
			for _, pt := range cur.Points {
				if pt.Err == nil {
					v := pan.scale * pan.get(pt.Summary)
					xy = append(xy, plotter.XY{X: 100 * pt.Length, Y: v})
					top = math.Max(top, v)
				}
			}
			if len(xy) == 0 {
				continue
			}
			l, s, err := plotter.NewLinePoints(xy)
			if err != nil {
				return nil, fmt.Errorf("plots: %w", err)
			}
			l.Color, s.Color = lengthColors[c%2], lengthColors[c%2]
			p.Add(l, s)
			if k == 0 {
				p.Legend.Add(velocityName(cur.Velocity), l)
			}
		}
		if k == 0 {
			for c, cur := range r.Curves {
				for _, m := range []struct {
					x      float64
					dashed bool
					name   string
				}{{cur.Useful, false, "useful length"}, {cur.Transit, true, "c·τ_g"}} {
					if math.IsNaN(m.x) || top == 0 {
						continue
					}
					l, err := plotter.NewLine(plotter.XYs{{X: 100 * m.x, Y: 0}, {X: 100 * m.x, Y: top}})
					if err != nil {
						return nil, fmt.Errorf("plots: %w", err)
					}
					l.Color = lengthColors[c%2]
					if m.dashed {
						l.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
					}
					p.Add(l)
					p.Legend.Add(fmt.Sprintf("%s %.3g cm (%s)", m.name, 100*m.x, velocityName(cur.Velocity)), l)
				}
			}
			// Lower left: the curves rise from there, leaving it empty.
			p.Legend.Top = false
			p.Legend.Left = true
			p.Legend.XOffs = vg.Points(60)
			p.Legend.YOffs = vg.Points(6)
			p.Title.Text = "channel length scan"
		}
		rows[k] = []*plot.Plot{p}
	}
	w, h := 16*vg.Centimeter, 22*vg.Centimeter
	return studySave(base, w, h, func(c draw.Canvas) {
		tiles := draw.Tiles{Rows: len(rows), Cols: 1, PadTop: vg.Points(4), PadBottom: vg.Points(4), PadX: vg.Points(4), PadY: vg.Points(6)}
		canvases := plot.Align(rows, tiles, c)
		for i := range rows {
			rows[i][0].Draw(canvases[i][0])
		}
	})
}

// velocityName describes an excitation velocity for a legend.
func velocityName(v float64) string {
	switch {
	case math.IsInf(v, 1):
		return "simultaneous"
	case v == units.SpeedOfLight:
		return "front at c"
	}
	return fmt.Sprintf("front at %.3gc", v/units.SpeedOfLight)
}
