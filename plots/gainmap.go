package plots

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/palette"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// gainGrid adapts gain[i][j] at z[i], t[j] to plotter.GridXYZ with time along x (columns)
// and position along y (rows), in display units: ns, cm, cm⁻¹.
type gainGrid struct {
	z, t []float64   // [cm], [ns]
	g    [][]float64 // [m⁻¹]
}

func (g gainGrid) Dims() (c, r int)   { return len(g.t), len(g.z) }
func (g gainGrid) Z(c, r int) float64 { return 0.01 * g.g[r][c] }
func (g gainGrid) X(c int) float64    { return g.t[c] }
func (g gainGrid) Y(r int) float64    { return g.z[r] }

// GainMap draws the small-signal gain g(z, t) into path (.png or .svg) as a heat map with a
// colour bar: gain[i][j] [m⁻¹] at position z[i] [m] along the channel and time t[j] [s],
// drawn in cm⁻¹ against time [ns] and position [cm]. z and t must be strictly increasing with
// at least two values each; NaN gains are left blank. Where the gain changes sign (absorption
// after self-termination) the palette is diverging and centred on zero.
func GainMap(path string, z, t []float64, gain [][]float64) error {
	return GainMapEnds(path, z, t, gain, Ends{})
}

// Ends are the reflectivities of the channel's ends, which the gain map names: the rear end at
// z = 0 and the output end at z = L (0 for an open end).
type Ends struct{ Rear, Front float64 }

// GainMapEnds is GainMap with the ends named in the title and on the position axis.
func GainMapEnds(path string, z, t []float64, gain [][]float64, ends Ends) error {
	if _, err := figureFormat(path); err != nil {
		return err
	}
	if err := checkAxis("z", z); err != nil {
		return err
	}
	if err := checkAxis("t", t); err != nil {
		return err
	}
	if len(gain) != len(z) {
		return fmt.Errorf("plots: gain map: %d gain rows, want len(z) = %d", len(gain), len(z))
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for i, row := range gain {
		if len(row) != len(t) {
			return fmt.Errorf("plots: gain map: gain[%d] has %d values, want len(t) = %d", i, len(row), len(t))
		}
		for _, v := range row {
			if math.IsInf(v, 0) {
				return fmt.Errorf("plots: gain map: gain[%d] holds %g, want finite values or NaN", i, v)
			}
			if !math.IsNaN(v) {
				lo, hi = math.Min(lo, 0.01*v), math.Max(hi, 0.01*v)
			}
		}
	}
	if lo > hi { // all NaN
		lo, hi = 0, 0
	}
	var cmap palette.ColorMap
	if lo < 0 && hi > 0 {
		m := math.Max(-lo, hi)
		lo, hi = -m, m
		cmap = moreland.SmoothBlueRed()
	} else {
		cmap = moreland.ExtendedBlackBody()
	}
	if lo == hi {
		lo, hi = lo-1, hi+1
	}
	cmap.SetMin(lo)
	cmap.SetMax(hi)

	grid := gainGrid{z: scaled(z, 100), t: scaled(t, 1e9), g: gain}
	hm := plotter.NewHeatMap(grid, cmap.Palette(256))
	hm.Min, hm.Max = lo, hi
	hm.NaN = color.Transparent
	hm.Rasterized = true

	p := plot.New()
	printStyle(p)
	L := 100 * z[len(z)-1]
	p.Title.Text = fmt.Sprintf("small-signal gain g(z, t)\nrear end at z = 0%s, output end at z = %.3g cm%s",
		mirrorText(ends.Rear), L, mirrorText(ends.Front))
	p.X.Label.Text = "time after switch closure [ns]"
	p.Y.Label.Text = "position z [cm]"
	p.Y.Tick.Marker = endTicks{L: L}
	p.Add(hm)

	bar := plot.New()
	printStyle(bar)
	bar.HideX()
	bar.Y.Label.Text = "gain [" + perCm + "]"
	bar.Add(&plotter.ColorBar{ColorMap: cmap, Vertical: true})
	bar.Y.Min, bar.Y.Max = lo, hi

	w, h := 18*vg.Centimeter, 11*vg.Centimeter
	barW := 2.6 * vg.Centimeter
	return saveCanvas(path, w, h, func(c draw.Canvas) {
		main := draw.Crop(c, 0, -barW, 0, 0)
		p.Draw(main)
		// The colour bar spans the height of the map's data area.
		da := p.DataCanvas(main)
		bc := c
		bc.Rectangle = vg.Rectangle{
			Min: vg.Point{X: c.Max.X - barW + 10*vg.Millimeter, Y: da.Min.Y},
			Max: vg.Point{X: c.Max.X - 4*vg.Millimeter, Y: da.Max.Y},
		}
		bar.Draw(bc)
	})
}

// checkAxis requires at least two finite, strictly increasing values.
func checkAxis(name string, v []float64) error {
	if len(v) < 2 {
		return fmt.Errorf("plots: gain map: %s has %d values, want at least 2", name, len(v))
	}
	for i, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) || (i > 0 && x <= v[i-1]) {
			return fmt.Errorf("plots: gain map: %s[%d] = %g: want finite, strictly increasing values", name, i, x)
		}
	}
	return nil
}

// mirrorText is ", mirror R = 0.9" for a reflecting end, "" for an open one.
func mirrorText(r float64) string {
	if r > 0 {
		return fmt.Sprintf(" (mirror R = %.3g)", r)
	}
	return ""
}

// endTicks labels the position axis with numbers and the two ends by name (L [cm] is the
// channel length shown beside the output end).
type endTicks struct{ L float64 }

// Ticks implements plot.Ticker.
func (e endTicks) Ticks(min, max float64) []plot.Tick {
	ts := niceTicks{}.Ticks(min, max)
	for i := range ts {
		if near := 0.04 * (max - min); ts[i].Label != "" && (ts[i].Value-min < near || max-ts[i].Value < near) {
			ts[i].Label = "" // named below
		}
	}
	return append(ts, plot.Tick{Value: min, Label: "rear 0"}, plot.Tick{Value: max, Label: "output " + numberText(e.L)})
}
