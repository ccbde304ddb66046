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

// lengthPanels are the quantities of the length figure, by their table keys (LabelOf gives
// the words and units).
var lengthPanels = []struct {
	key string
	get func(s kinetics.Summary) float64
}{
	{"energy_front_J", func(s kinetics.Summary) float64 { return s.EnergyFront }},
	{"peak_power_W", func(s kinetics.Summary) float64 { return s.PeakPower }},
	{"fwhm_s", func(s kinetics.Summary) float64 { return s.FWHM }},
}

// LengthFigure draws a length scan as base.png and base.svg: output-end energy, peak power and
// pulse width against channel length in three panels on one length axis, one curve per
// excitation velocity. A solid vertical line on every panel marks each curve's useful length
// (one rule for all curves, study.UsefulLengthRule, named in the title) and a dashed one its
// transit-time estimate c·τ_g when that lies within the scan (the legend gives it either way).
// It returns the files written.
func LengthFigure(r *study.LengthResult, base string) ([]string, error) {
	if len(r.Curves) == 0 || len(r.Curves[0].Points) == 0 {
		return nil, fmt.Errorf("plots: length scan has no curve")
	}
	pts := r.Curves[0].Points
	xlo, xhi := 100*pts[0].Length, 100*pts[len(pts)-1].Length
	if !(xhi > xlo) {
		return nil, fmt.Errorf("plots: length scan spans no length (%g cm to %g cm)", xlo, xhi)
	}
	rows := make([][]*plot.Plot, len(lengthPanels))
	key := plot.New() // the legend, in a strip of its own above the panels
	key.HideAxes()
	key.Legend.Top, key.Legend.Left = true, true
	key.Legend.XOffs = 1.5 * vg.Centimeter
	for k, pan := range lengthPanels {
		var p *plot.Plot
		lbl := LabelOf(pan.key)
		var all []float64
		for _, cur := range r.Curves {
			for _, pt := range cur.Points {
				if pt.Err == nil {
					all = append(all, pan.get(pt.Summary))
				}
			}
		}
		scale, _ := lbl.Display(maxAbs(all))
		p = plot.New()
		p.Y.Label.Text = lbl.AxisTitle(maxAbs(all))
		p.X.Min, p.X.Max = xlo, xhi
		p.X.Tick.Marker = niceTicks{}
		if k == len(lengthPanels)-1 {
			p.X.Label.Text = "channel length [cm]"
		} else {
			p.X.Tick.Marker = unlabelled{niceTicks{}}
		}
		printStyle(p)
		top := 0.0
		if r.Samples > 0 {
			for c, cur := range r.Curves {
				x, lo, hi := make([]float64, len(cur.Points)), make([]float64, len(cur.Points)), make([]float64, len(cur.Points))
				for i, pt := range cur.Points {
					x[i], lo[i], hi[i] = 100*pt.Length, math.NaN(), math.NaN()
					if pt.Band != nil {
						if b, ok := pt.Band.Metric(pan.key); ok {
							lo[i], hi[i] = scale*b.P05, scale*b.P95
							top = math.Max(top, hi[i])
						}
					}
				}
				polys := fillBetween(x, lo, hi, faint(lengthColors[c%2]))
				for _, poly := range polys {
					p.Add(poly)
				}
				if k == 0 && len(polys) > 0 {
					key.Legend.Add(fmt.Sprintf("5–95 %% over %d samples (%s)", r.Samples, velocityName(cur.Velocity)), polys[0])
				}
			}
		}
		for c, cur := range r.Curves {
			var xy plotter.XYs
			for _, pt := range cur.Points {
				// A width means nothing where the laser does not lase: leave a gap.
				if pt.Err == nil && !(lbl.Minimise && !pt.Summary.Lases) {
					v := scale * pan.get(pt.Summary)
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
				key.Legend.Add(velocityName(cur.Velocity), l)
			}
		}
		p.Y.Min = 0
		for c, cur := range r.Curves {
			for _, m := range []struct {
				x      float64
				dashed bool
				name   string
			}{{cur.Useful, false, "useful length"}, {cur.Transit, true, "c·τ_g"}} {
				if math.IsNaN(m.x) || top == 0 {
					if k == 0 && m.name == "useful length" {
						key.Legend.Add(fmt.Sprintf("no useful length (%s)", velocityName(cur.Velocity)))
					}
					continue
				}
				inside := 100*m.x >= xlo && 100*m.x <= xhi
				var line *plotter.Line
				if inside {
					l, err := plotter.NewLine(plotter.XYs{{X: 100 * m.x, Y: 0}, {X: 100 * m.x, Y: top}})
					if err != nil {
						return nil, fmt.Errorf("plots: %w", err)
					}
					l.Color = lengthColors[c%2]
					if m.dashed {
						l.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
					}
					p.Add(l)
					line = l
				}
				if k == 0 {
					text := fmt.Sprintf("%s %.3g cm (%s)", m.name, 100*m.x, velocityName(cur.Velocity))
					if !inside {
						text += ", beyond the scan"
					}
					if line != nil {
						key.Legend.Add(text, line)
					} else {
						key.Legend.Add(text)
					}
				}
			}
		}
		if k == 0 {
			key.Title.Text = "channel length scan\nuseful length: " + study.UsefulLengthRule
		}
		rows[k] = []*plot.Plot{p}
	}
	printStyle(key)
	entries := 3 * len(r.Curves)
	if r.Samples > 0 {
		entries += len(r.Curves)
	}
	strip := vg.Length(entries)*0.36*vg.Centimeter + 1.1*vg.Centimeter
	w, h := 16*vg.Centimeter, 22*vg.Centimeter+strip
	return studySave(base, w, h, func(c draw.Canvas) {
		key.Draw(draw.Crop(c, 0, 0, h-strip, 0))
		c = draw.Crop(c, 0, 0, 0, -strip)
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
