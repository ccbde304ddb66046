package plots

import (
	"fmt"
	"image/color"
	"math"
	"path/filepath"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/palette"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"n2pulse/kinetics/study"
	"n2pulse/units"
)

// DefaultMapMetrics are the figures of merit drawn when a sweep names none.
var DefaultMapMetrics = []string{"energy_total_J", "peak_power_W", "fwhm_s", "efficiency"}

// minimised lists the metrics whose optimum is the smallest value (a short pulse, a small
// residual); every other metric is best at its largest.
var minimised = map[string]bool{
	"fwhm_s": true, "rise_s": true, "delay_s": true,
	"energy_balance_residual": true, "photon_balance_residual": true,
}

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
		col := t.Column(m)
		if col < 0 {
			return files, fmt.Errorf("plots: metric %q is not a column of the sweep table", m)
		}
		var f []string
		var err error
		switch len(axes) {
		case 1:
			f, err = sweepCurve(t, axes[0], m, col, filepath.Join(dir, "curve-"+m))
		case 2:
			f, err = sweepMap(t, axes, m, col, filepath.Join(dir, "map-"+m))
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

// sweepValue is metric col of row r, NaN for a failed point.
func sweepValue(t *study.Table, r, col int) float64 {
	if !t.OK(r) {
		return math.NaN()
	}
	return t.Float(r, col)
}

// Optimum returns the row of a sweep table with the best computed value of metric (the largest,
// or the smallest for widths, times and residuals) and the word for it ("maximum" or
// "minimum"); the row is −1 when no point was computed or the metric is not a column.
func Optimum(t *study.Table, metric string) (row int, word string) {
	col := t.Column(metric)
	if col < 0 {
		return -1, optimumWord(metric)
	}
	v := make([]float64, len(t.Rows))
	for r := range v {
		v[r] = sweepValue(t, r, col)
	}
	return optimum(v, metric), optimumWord(metric)
}

// optimum returns the index of the best finite value, or −1.
func optimum(v []float64, metric string) int {
	best := -1
	for i, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			continue
		}
		if best < 0 || (minimised[metric] && x < v[best]) || (!minimised[metric] && x > v[best]) {
			best = i
		}
	}
	return best
}

func optimumWord(metric string) string {
	if minimised[metric] {
		return "minimum"
	}
	return "maximum"
}

func sweepCurve(t *study.Table, a study.Axis, metric string, col int, base string) ([]string, error) {
	x := a.Values()
	y := make([]float64, len(x))
	for r := range t.Rows {
		y[r] = sweepValue(t, r, col)
	}
	p := plot.New()
	p.Title.Text = metric + " against " + a.Key
	p.X.Label.Text = a.Header()
	p.Y.Label.Text = metric
	if a.Log {
		p.X.Scale = plot.LogScale{}
		p.X.Tick.Marker = plot.TickerFunc(func(min, max float64) []plot.Tick {
			ticks := logLabels(math.Log10(min), math.Log10(max)) // 1, 2, 5 per decade
			for i := range ticks {
				ticks[i].Value = math.Pow(10, ticks[i].Value)
			}
			return ticks
		})
	}
	printStyle(p)
	var seg plotter.XYs
	flush := func() error {
		if len(seg) == 0 {
			return nil
		}
		l, s, err := plotter.NewLinePoints(seg)
		if err != nil {
			return fmt.Errorf("plots: %w", err)
		}
		l.Color, s.Color = color.RGBA{B: 160, A: 255}, color.RGBA{B: 160, A: 255}
		p.Add(l, s)
		seg = nil
		return nil
	}
	for i := range x {
		if math.IsNaN(y[i]) {
			if err := flush(); err != nil { // failed points leave gaps
				return nil, err
			}
			continue
		}
		seg = append(seg, plotter.XY{X: x[i], Y: y[i]})
	}
	if err := flush(); err != nil {
		return nil, err
	}
	if b := optimum(y, metric); b >= 0 {
		if err := markOptimum(p, x[b], y[b], optimumWord(metric)+" "+strconv.FormatFloat(y[b], 'g', 4, 64)+" at "+strconv.FormatFloat(x[b], 'g', 4, 64)); err != nil {
			return nil, err
		}
	}
	return studySave(base, 16*vg.Centimeter, 11*vg.Centimeter, func(c draw.Canvas) { p.Draw(c) })
}

// markOptimum adds a ring at (x, y), and a label unless text is empty.
func markOptimum(p *plot.Plot, x, y float64, text string) error {
	s, err := plotter.NewScatter(plotter.XYs{{X: x, Y: y}})
	if err != nil {
		return fmt.Errorf("plots: %w", err)
	}
	s.GlyphStyle = draw.GlyphStyle{Shape: draw.RingGlyph{}, Radius: vg.Points(6), Color: color.Black}
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

// layout returns an axis's values as drawn (log₁₀ for a log axis).
func layout(a study.Axis) []float64 {
	v := a.Values()
	if a.Log {
		for i := range v {
			v[i] = math.Log10(v[i])
		}
	}
	return v
}

// logLabels ticks an axis laid out in log₁₀ at 1, 2 and 5 per decade, labelled with the value.
func logLabels(min, max float64) []plot.Tick {
	var ticks []plot.Tick
	for e := math.Floor(min); e <= math.Ceil(max); e++ {
		for _, m := range []float64{1, 2, 5} {
			t := e + math.Log10(m)
			if t >= min-1e-9 && t <= max+1e-9 {
				ticks = append(ticks, plot.Tick{Value: t, Label: strconv.FormatFloat(m*math.Pow(10, e), 'g', 3, 64)})
			}
		}
	}
	if len(ticks) < 2 { // a narrow range: plain ticks, labelled with values
		for _, t := range (plot.DefaultTicks{}).Ticks(min, max) {
			if t.Label != "" {
				t.Label = strconv.FormatFloat(math.Pow(10, t.Value), 'g', 3, 64)
			}
			ticks = append(ticks, t)
		}
	}
	return ticks
}

func sweepMap(t *study.Table, axes []study.Axis, metric string, col int, base string) ([]string, error) {
	g := sweepGrid{x: layout(axes[0]), y: layout(axes[1])}
	g.z = make([][]float64, axes[0].N)
	for c := range g.z {
		g.z[c] = make([]float64, axes[1].N)
		for r := range g.z[c] {
			g.z[c][r] = sweepValue(t, c*axes[1].N+r, col)
		}
	}
	lo, hi := g.finite()
	if lo > hi {
		return nil, fmt.Errorf("plots: map of %s: no computed point", metric)
	}
	if lo == hi {
		lo, hi = lo-0.5*math.Max(math.Abs(lo), 1e-300), hi+0.5*math.Max(math.Abs(hi), 1e-300)
	}
	cmap := moreland.Kindlmann()
	cmap.SetMin(lo)
	// The palette ends in white, the page colour: stop the data short of it so the best cell
	// still reads as a colour.
	cmap.SetMax(hi + 0.12*(hi-lo))

	p := plot.New()
	p.Title.Text = metric
	for k, ax := range []*plot.Axis{&p.X, &p.Y} {
		ax.Label.Text = axes[k].Header()
		if axes[k].Log {
			ax.Label.Text += ", log scale"
			ax.Tick.Marker = plot.TickerFunc(logLabels)
		}
	}
	printStyle(p)
	h := plotter.NewHeatMap(g, cmap.Palette(255))
	h.Min, h.Max = cmap.Min(), cmap.Max()
	h.NaN = color.Gray{Y: 200}
	p.Add(h)
	if cg, ok := g.finiteCore(); ok {
		levels := make([]float64, 6)
		for i := range levels {
			levels[i] = lo + (hi-lo)*float64(i+1)/float64(len(levels)+1)
		}
		cont := plotter.NewContour(cg, levels, studyGrey{})
		cont.LineStyles = []draw.LineStyle{{Color: color.White, Width: vg.Points(0.8)}}
		p.Add(cont)
	}
	if b, word := Optimum(t, metric); b >= 0 {
		c, r := b/axes[1].N, b%axes[1].N
		if err := markOptimum(p, g.x[c], g.y[r], ""); err != nil {
			return nil, err
		}
		v, _ := strconv.ParseFloat(t.Rows[b][col], 64)
		p.Title.Text = fmt.Sprintf("%s (%s %s at %s, %s)", metric, word, quantity(v, metricUnit(metric)),
			quantity(axes[0].Values()[c], axes[0].Unit), quantity(axes[1].Values()[r], axes[1].Unit))
	}

	bar := plot.New()
	bar.Add(&plotter.ColorBar{ColorMap: cmap, Vertical: true})
	bar.HideX()
	bar.X.Padding = 0
	bar.Title.Text = " "
	if u := metricUnit(metric); u != "" {
		bar.Title.Text = "[" + u + "]"
	}
	printStyle(bar)
	w, ht := 18*vg.Centimeter, 13*vg.Centimeter
	return studySave(base, w, ht, func(c draw.Canvas) {
		p.Draw(draw.Crop(c, 0, -3*vg.Centimeter, 0, 0))
		bar.Draw(draw.Crop(c, w-3*vg.Centimeter, -0.2*vg.Centimeter, 0.9*vg.Centimeter, 0))
	})
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

// metricUnit is the SI unit a summary metric's name ends with ("energy_total_J" → "J"), or ""
// for a dimensionless one.
func metricUnit(metric string) string {
	for _, u := range []struct{ suffix, unit string }{
		{"_J", "J"}, {"_W", "W"}, {"_s", "s"}, {"_per_m", "m⁻¹"}, {"_Td", "Td"}, {"_A", "A"}, {"_m3", "m⁻³"},
	} {
		if strings.HasSuffix(metric, u.suffix) {
			return u.unit
		}
	}
	return ""
}

// quantity writes v with an SI prefix for the units that take one ("671 µJ", "101 kPa").
func quantity(v float64, unit string) string {
	switch unit {
	case "J", "W", "s", "Pa", "V", "A", "F", "H", "m", "Ω":
		return units.Format(v, unit)
	case "":
		return strconv.FormatFloat(v, 'g', 3, 64)
	}
	return strconv.FormatFloat(v, 'g', 3, 64) + " " + unit
}
