package plots

import (
	"fmt"
	"image/color"
	"math"
	"path/filepath"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/palette"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"n2pulse/kinetics/study"
)

// DefaultMapMetrics are the figures of merit drawn when a sweep names none.
var DefaultMapMetrics = []string{"energy_total_J", "peak_power_W", "fwhm_s", "efficiency"}

// SweepFigures draws a finished sweep table into dir: for one varied key a curve per metric
// (curve-<metric>.png and .svg), for two a heat map with contours per metric
// (map-<metric>.png and .svg); the optimum of each metric (its largest value, or smallest for
// widths, times and residuals) is marked. Sweeps of more keys have no figure. The table must
// hold every point of the grid (a merged or unsharded sweep). It returns the files written.
func SweepFigures(t *study.Table, axes []study.Axis, metrics []string, dir string) ([]string, error) {
	if len(metrics) == 0 {
		metrics = DefaultMapMetrics
	}
	n := 1
	for _, a := range axes {
		n *= a.N
	}
	if len(t.Rows) != n {
		return nil, fmt.Errorf("plots: the sweep table has %d rows for a grid of %d points", len(t.Rows), n)
	}
	var files []string
	for _, m := range metrics {
		if t.Column(m) < 0 {
			return files, fmt.Errorf("plots: metric %q is not a column of the sweep table", m)
		}
		var f []string
		var err error
		switch len(axes) {
		case 1:
			f, err = sweepCurve(t, axes[0], m, filepath.Join(dir, "curve-"+m))
		case 2:
			f, err = sweepMap(t, axes, m, filepath.Join(dir, "map-"+m))
		default:
			return nil, nil
		}
		files = append(files, f...)
		if err != nil {
			return files, err
		}
	}
	return files, nil
}

// markOptimum adds a ring at (x, y), and a label unless text is empty.
func markOptimum(p *plot.Plot, x, y float64, text string) error {
	s, err := plotter.NewScatter(plotter.XYs{{X: x, Y: y}})
	if err != nil {
		return fmt.Errorf("plots: %w", err)
	}
	// A black ring with a white halo and a white cross reads on any colour.
	s.GlyphStyle = draw.GlyphStyle{Shape: haloRing{}, Radius: vg.Points(7), Color: color.Black}
	inner, _ := plotter.NewScatter(plotter.XYs{{X: x, Y: y}})
	inner.GlyphStyle = draw.GlyphStyle{Shape: draw.CrossGlyph{}, Radius: vg.Points(4), Color: color.White}
	p.Add(inner, s)
	if text == "" {
		return nil
	}
	l, err := plotter.NewLabels(plotter.XYLabels{XYs: []plotter.XY{{X: x, Y: y}}, Labels: []string{"  " + text}})
	if err != nil {
		return fmt.Errorf("plots: %w", err)
	}
	l.Offset = vg.Point{X: vg.Points(6), Y: vg.Points(4)}
	p.Add(l)
	return nil
}

// sweepGrid is a two-key sweep as a plotter.GridXYZ: column c is the first key's value, row r
// the second's; logarithmic axes are laid out in log₁₀ so cells stay even.
type sweepGrid struct {
	x, y []float64
	z    [][]float64 // z[c][r]
}

func (g sweepGrid) Dims() (c, r int)   { return len(g.x), len(g.y) }
func (g sweepGrid) Z(c, r int) float64 { return g.z[c][r] }
func (g sweepGrid) X(c int) float64    { return g.x[c] }
func (g sweepGrid) Y(r int) float64    { return g.y[r] }
func (g sweepGrid) finite() (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, col := range g.z {
		for _, v := range col {
			if !math.IsNaN(v) && !math.IsInf(v, 0) {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
	}
	return lo, hi
}

// finiteCore trims edge columns and rows holding failed points, so contours are drawn only
// over computed cells; ok is false when failures remain inside or less than 2×2 cells remain.
func (g sweepGrid) finiteCore() (sweepGrid, bool) {
	bad := func(c, r int) bool { v := g.z[c][r]; return math.IsNaN(v) || math.IsInf(v, 0) }
	colBad := func(c, r0, r1 int) bool {
		for r := r0; r < r1; r++ {
			if bad(c, r) {
				return true
			}
		}
		return false
	}
	rowBad := func(r, c0, c1 int) bool {
		for c := c0; c < c1; c++ {
			if bad(c, r) {
				return true
			}
		}
		return false
	}
	c0, c1, r0, r1 := 0, len(g.x), 0, len(g.y)
	// Trim whichever edge has failures, columns first, until none is left or nothing remains.
	for changed := true; changed && c1-c0 >= 2 && r1-r0 >= 2; {
		changed = false
		if colBad(c0, r0, r1) {
			c0, changed = c0+1, true
		} else if colBad(c1-1, r0, r1) {
			c1, changed = c1-1, true
		} else if rowBad(r0, c0, c1) {
			r0, changed = r0+1, true
		} else if rowBad(r1-1, c0, c1) {
			r1, changed = r1-1, true
		}
	}
	if c1-c0 < 2 || r1-r0 < 2 {
		return g, false
	}
	for c := c0; c < c1; c++ {
		if colBad(c, r0, r1) {
			return g, false
		}
	}
	core := sweepGrid{x: g.x[c0:c1], y: g.y[r0:r1], z: make([][]float64, c1-c0)}
	for c := range core.z {
		core.z[c] = g.z[c0+c][r0:r1]
	}
	return core, true
}

// studyGrey is a one-colour palette for contour lines.
type studyGrey struct{}

func (studyGrey) Colors() []color.Color { return []color.Color{color.White} }

var _ palette.Palette = studyGrey{}

// studySave renders a figure as base.png and base.svg (saveCanvas: atomic writes) and returns
// the two paths.
func studySave(base string, w, h vg.Length, render func(c draw.Canvas)) ([]string, error) {
	files := []string{base + ".png", base + ".svg"}
	for _, f := range files {
		if err := saveCanvas(f, w, h, render); err != nil {
			return nil, err
		}
	}
	return files, nil
}

// haloRing is a ring drawn twice: wide in white, then thin in the glyph's colour.
type haloRing struct{}

// DrawGlyph implements draw.GlyphDrawer.
func (haloRing) DrawGlyph(c *draw.Canvas, sty draw.GlyphStyle, pt vg.Point) {
	ring := vg.Path{}
	ring.Move(vg.Point{X: pt.X + sty.Radius, Y: pt.Y})
	ring.Arc(pt, sty.Radius, 0, 2*math.Pi)
	ring.Close()
	c.SetLineStyle(draw.LineStyle{Color: color.White, Width: vg.Points(3.5)})
	c.Stroke(ring)
	c.SetLineStyle(draw.LineStyle{Color: sty.Color, Width: vg.Points(1.3)})
	c.Stroke(ring)
}
