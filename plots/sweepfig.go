package plots

import (
	"fmt"
	"image/color"
	"math"
	"sort"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"n2pulse/kinetics/study"
)

// maskGrey is the colour of points without a value: failed, truncated or not lasing.
var maskGrey = color.Gray{Y: 190}

// axisView is a varied key as drawn: its label in the display unit (the unit the user typed, or
// the trade's), the displayed values and where they are laid out (log₁₀ of the value on a log
// axis, so cells stay even).
type axisView struct {
	label Label
	scale float64 // stored (SI) × scale = displayed
	unit  string
	log   bool
	vals  []float64 // displayed values
	pos   []float64 // layout positions
}

func viewOf(a study.Axis) axisView {
	v := axisView{label: LabelOf(a.Key + " [" + a.Unit + "]").Typed(a.Display), log: a.Log}
	si := a.Values()
	v.scale, v.unit = v.label.Display(maxAbs(si))
	v.vals, v.pos = scaled(si, v.scale), scaled(si, v.scale)
	if a.Log {
		for i := range v.pos {
			v.pos[i] = math.Log10(v.pos[i])
		}
	}
	return v
}

// title is the axis title: "pressure [Torr], log scale".
func (v axisView) title() string {
	s := v.label.Text
	if v.unit != "" {
		s += " [" + v.unit + "]"
	}
	if v.log {
		s += ", log scale"
	}
	return s
}

// format writes one displayed value with its unit: "760 Torr".
func (v axisView) format(x float64) string {
	s := numberText(x)
	if v.unit == "" {
		return s
	}
	return s + " " + v.unit
}

// numberText writes x with three significant digits: plainly from 0.001 to a million
// ("1000", "0.0025"), as 3.2×10^14 beyond.
func numberText(x float64) string {
	s := strconv.FormatFloat(x, 'g', 3, 64)
	if !strings.Contains(s, "e") {
		return s
	}
	if a := math.Abs(x); a >= 1e-3 && a < 1e6 {
		r, _ := strconv.ParseFloat(s, 64)
		return strconv.FormatFloat(r, 'f', -1, 64)
	}
	return sciText(x)
}

// at writes the values of the grid point idx on the given axes: "760 Torr, 20 kV".
func pointText(views []axisView, idx []int) string {
	parts := make([]string, len(views))
	for k, v := range views {
		parts[k] = v.format(v.vals[idx[k]])
	}
	return strings.Join(parts, ", ")
}

// gridIndex splits a point number into grid indices, the last axis fastest.
func gridIndex(axes []study.Axis, point int) []int {
	idx := make([]int, len(axes))
	for k := len(axes) - 1; k >= 0; k-- {
		idx[k] = point % axes[k].N
		point /= axes[k].N
	}
	return idx
}

// optimumLines is the title text under the metric's name: the optimum and where it lies, a
// warning when it lies on the edge of the grid, and what the grey marks mean.
func optimumLines(t *study.Table, axes []study.Axis, views []axisView, metric string) (Best, []string) {
	b := Optimum(t, axes, metric)
	if b.Row < 0 {
		return b, []string{"no point with a value"}
	}
	lines := []string{fmt.Sprintf("%s %s at %s", b.Word, LabelOf(metric).Format(b.Value), pointText(views, gridIndex(axes, b.Row)))}
	if len(b.Edge) > 0 {
		words := make([]string, len(b.Edge))
		for i, k := range b.Edge {
			words[i] = LabelOf(k).Text
		}
		lines = append(lines, "on the edge of the grid: extend the range of "+strings.Join(words, " and "))
	}
	if b.Masked > 0 {
		note := maskNote(t, metric)
		if len(axes) == 1 {
			note = strings.Replace(note, "grey:", "grey crosses:", 1)
		}
		lines = append(lines, note)
	}
	return b, lines
}

// maskNote counts the left-out points by reason: "grey: 6 no laser pulse, 1 failed".
func maskNote(t *study.Table, metric string) string {
	count := map[string]int{}
	for r := range t.Rows {
		if m := Masked(t, r, metric); m != "" {
			count[m]++
		}
	}
	var parts []string
	for m, n := range count {
		parts = append(parts, fmt.Sprintf("%d %s", n, m))
	}
	sort.Strings(parts)
	return "grey: " + strings.Join(parts, ", ")
}

func sweepCurve(t *study.Table, a study.Axis, metric string, base string) ([]string, error) {
	view := viewOf(a)
	lbl := LabelOf(metric)
	y := values(t, metric)
	f, _ := lbl.Display(maxAbs(y))
	y = scaled(y, f)
	x := view.vals
	b, lines := optimumLines(t, []study.Axis{a}, []axisView{view}, metric)

	p := plot.New()
	p.Title.Text = lbl.Text + "\n" + strings.Join(lines, "\n")
	p.X.Label.Text = view.title()
	p.Y.Label.Text = lbl.AxisTitle(maxAbs(values(t, metric)))
	if a.Log {
		p.X.Scale = plot.LogScale{}
		p.X.Tick.Marker = logValueTicks{}
	}
	printStyle(p)
	line := color.RGBA{B: 160, A: 255}
	if lo, hi := t.Column(metric+study.BandSuffixes[0]), t.Column(metric+study.BandSuffixes[2]); lo >= 0 && hi >= 0 {
		// A sweep with uncertainty samples: the 5–95 % band under the curve.
		bl, bh := make([]float64, len(t.Rows)), make([]float64, len(t.Rows))
		for r := range t.Rows {
			bl[r], bh[r] = f*t.Float(r, lo), f*t.Float(r, hi)
		}
		for _, poly := range fillBetween(x, bl, bh, faint(line)) {
			p.Add(poly)
		}
		p.Title.Text += "\nshaded: 5–95 % over the uncertainty samples of each point"
	}
	var seg plotter.XYs
	var masked plotter.XYs
	flush := func() error {
		if len(seg) == 0 {
			return nil
		}
		l, s, err := plotter.NewLinePoints(seg)
		if err != nil {
			return fmt.Errorf("plots: %w", err)
		}
		l.Color, s.Color = line, line
		p.Add(l, s)
		seg = nil
		return nil
	}
	for i := range x {
		if math.IsNaN(y[i]) { // points without a value leave gaps
			if err := flush(); err != nil {
				return nil, err
			}
			masked = append(masked, plotter.XY{X: x[i]})
			continue
		}
		seg = append(seg, plotter.XY{X: x[i], Y: y[i]})
	}
	if err := flush(); err != nil {
		return nil, err
	}
	if len(masked) > 0 {
		// Grey crosses on the zero line (or the lowest value drawn) where a point has no value.
		base := 0.0
		if lo, _ := finiteRange(y); lo < 0 {
			base = lo
		}
		for i := range masked {
			masked[i].Y = base
		}
		s, err := plotter.NewScatter(masked)
		if err != nil {
			return nil, fmt.Errorf("plots: %w", err)
		}
		s.GlyphStyle = draw.GlyphStyle{Shape: draw.CrossGlyph{}, Radius: vg.Points(3), Color: color.Gray{Y: 140}}
		p.Add(s)
	}
	if b.Row >= 0 {
		if err := markOptimum(p, x[b.Row], y[b.Row], ""); err != nil {
			return nil, err
		}
	}
	return studySave(base, 16*vg.Centimeter, 11*vg.Centimeter, func(c draw.Canvas) { p.Draw(c) })
}

// finiteRange is the smallest and largest finite value of v (+Inf, −Inf when none).
func finiteRange(v []float64) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, x := range v {
		if !math.IsNaN(x) && !math.IsInf(x, 0) {
			lo, hi = math.Min(lo, x), math.Max(hi, x)
		}
	}
	return lo, hi
}

// logLabels ticks an axis laid out in log₁₀ at 1, 2 and 5 per decade, labelled with the value.
func logLabels(min, max float64) []plot.Tick {
	var ticks []plot.Tick
	for e := math.Floor(min); e <= math.Ceil(max); e++ {
		for _, m := range []float64{1, 2, 5} {
			t := e + math.Log10(m)
			if t >= min-1e-9 && t <= max+1e-9 {
				ticks = append(ticks, plot.Tick{Value: t, Label: numberText(m * math.Pow(10, e))})
			}
		}
	}
	if len(ticks) < 2 { // a narrow range: plain ticks, labelled with values
		ticks = ticks[:0]
		for _, t := range (niceTicks{}).Ticks(math.Pow(10, min), math.Pow(10, max)) {
			if t.Label != "" {
				ticks = append(ticks, plot.Tick{Value: math.Log10(t.Value), Label: t.Label})
			}
		}
	}
	return ticks
}

// logValueTicks ticks an axis drawn with plot.LogScale (values, not their logarithms) at 1, 2
// and 5 per decade, as logLabels does for an axis laid out in log₁₀.
type logValueTicks struct{}

// Ticks implements plot.Ticker.
func (logValueTicks) Ticks(min, max float64) []plot.Tick {
	ticks := logLabels(math.Log10(min), math.Log10(max))
	for i := range ticks {
		ticks[i].Value = math.Pow(10, ticks[i].Value)
	}
	return ticks
}

// mapScale is how a metric's displayed values become colours: linearly, or by their
// logarithm when they span more than two decades.
type mapScale struct {
	log    bool
	lo, hi float64 // colour range, in z (displayed value or its log₁₀)
}

func (m mapScale) z(v float64) float64 {
	if m.log {
		if v <= 0 {
			return math.NaN()
		}
		return math.Log10(v)
	}
	return v
}

// ticks labels the colour bar (in z) with displayed values.
func (m mapScale) ticks() []plot.Tick {
	if m.log {
		return logLabels(m.lo, m.hi)
	}
	return niceTicks{}.Ticks(m.lo, m.hi)
}

// levels are the contour values (in z): the labelled ticks strictly inside the range, at
// most seven.
func (m mapScale) levels() []plot.Tick {
	var out []plot.Tick
	for _, t := range m.ticks() {
		if t.Label != "" && t.Value > m.lo && t.Value < m.hi {
			out = append(out, t)
		}
	}
	for len(out) > 7 {
		var thin []plot.Tick
		for i := 0; i < len(out); i += 2 {
			thin = append(thin, out[i])
		}
		out = thin
	}
	return out
}

func sweepMap(t *study.Table, axes []study.Axis, metric string, base string) ([]string, error) {
	lbl := LabelOf(metric)
	si := values(t, metric)
	f, unit := lbl.Display(maxAbs(si))
	disp := scaled(si, f)
	lo, hi := finiteRange(disp)
	if lo > hi {
		return nil, fmt.Errorf("plots: map of %s: no point with a value (%s)", metric, maskNote(t, metric))
	}
	ms := mapScale{log: lo > 0 && hi > 100*lo}
	ms.lo, ms.hi = ms.z(lo), ms.z(hi)
	if ms.lo == ms.hi {
		d := 0.5 * math.Max(math.Abs(ms.lo), 1e-300)
		ms.lo, ms.hi = ms.lo-d, ms.hi+d
	}
	views := []axisView{viewOf(axes[0]), viewOf(axes[1])}
	g := sweepGrid{x: views[0].pos, y: views[1].pos, z: make([][]float64, axes[0].N)}
	for c := range g.z {
		g.z[c] = make([]float64, axes[1].N)
		for r := range g.z[c] {
			g.z[c][r] = ms.z(disp[c*axes[1].N+r])
		}
	}
	cmap := moreland.Kindlmann()
	cmap.SetMin(ms.lo)
	// The palette ends in white, the page colour: stop the data short of it so the best cell
	// still reads as a colour.
	cmap.SetMax(ms.hi + 0.12*(ms.hi-ms.lo))

	b, lines := optimumLines(t, axes, views, metric)
	p := plot.New()
	p.Title.Text = lbl.Text + "\n" + strings.Join(lines, "\n")
	for k, ax := range []*plot.Axis{&p.X, &p.Y} {
		ax.Label.Text = views[k].title()
		if views[k].log {
			ax.Tick.Marker = plot.TickerFunc(logLabels)
		} else {
			ax.Tick.Marker = niceTicks{}
		}
	}
	printStyle(p)
	h := plotter.NewHeatMap(g, cmap.Palette(255))
	h.Min, h.Max = cmap.Min(), cmap.Max()
	h.NaN = maskGrey
	p.Add(h)
	if err := drawContours(p, g, ms.levels(), cmap); err != nil {
		return nil, err
	}
	if marks, err := mayNotLaseMarks(t, axes[1].N, g); err != nil {
		return nil, err
	} else if marks != nil {
		p.Add(marks...)
		p.Title.Text += "\ntriangles: may not lase (the uncertainty band straddles the threshold)"
	}
	if b.Row >= 0 {
		c, r := b.Row/axes[1].N, b.Row%axes[1].N
		if err := markOptimum(p, g.x[c], g.y[r], ""); err != nil {
			return nil, err
		}
	}

	bar := plot.New()
	bar.Add(&plotter.ColorBar{ColorMap: cmap, Vertical: true})
	bar.HideX()
	bar.X.Padding = 0
	bar.Y.Tick.Marker = plot.TickerFunc(func(_, _ float64) []plot.Tick { return ms.ticks() })
	bar.Title.Text = " "
	if unit != "" {
		bar.Title.Text = "[" + unit + "]"
	}
	if ms.log {
		bar.Title.Text += "\nlog scale"
	}
	printStyle(bar)
	bar.Y.Tick.Marker = plot.TickerFunc(func(_, _ float64) []plot.Tick { return ms.ticks() })
	w, ht := 18*vg.Centimeter, 14*vg.Centimeter
	return studySave(base, w, ht, func(c draw.Canvas) {
		p.Draw(draw.Crop(c, 0, -3*vg.Centimeter, 0, 0))
		bar.Draw(draw.Crop(c, w-2.8*vg.Centimeter, -0.3*vg.Centimeter, 0.9*vg.Centimeter, -1.6*vg.Centimeter))
	})
}

// drawContours draws the contour lines of g at the given levels (z) over the cells whose four
// corners have a value (masked cells break the lines), and writes each level's value beside
// its middle segment, in black or white, whichever reads on the colour under it.
func drawContours(p *plot.Plot, g sweepGrid, levels []plot.Tick, cmap interface {
	At(float64) (color.Color, error)
}) error {
	for _, lv := range levels {
		segs := contourSegments(g, lv.Value)
		if len(segs) == 0 {
			continue
		}
		for _, sg := range segs {
			l, err := plotter.NewLine(plotter.XYs{sg[0], sg[1]})
			if err != nil {
				return fmt.Errorf("plots: %w", err)
			}
			l.Color, l.Width = color.White, vg.Points(0.9)
			p.Add(l)
		}
		sort.Slice(segs, func(i, j int) bool { return segs[i][0].X+segs[i][1].X < segs[j][0].X+segs[j][1].X })
		mid := segs[len(segs)/2]
		at := plotter.XY{X: (mid[0].X + mid[1].X) / 2, Y: (mid[0].Y + mid[1].Y) / 2}
		l, err := plotter.NewLabels(plotter.XYLabels{XYs: plotter.XYs{at}, Labels: []string{lv.Label}})
		if err != nil {
			return fmt.Errorf("plots: %w", err)
		}
		col := color.Color(color.White)
		if c, err := cmap.At(lv.Value); err == nil && luminance(c) > 0.45 {
			col = color.Black
		}
		for i := range l.TextStyle {
			l.TextStyle[i].Color = col
			l.TextStyle[i].Font.Size = tickSize
			l.TextStyle[i].XAlign = draw.XCenter
			l.TextStyle[i].YAlign = draw.YCenter
		}
		p.Add(l)
	}
	return nil
}

// contourSegments returns the pieces of the level-z contour of g by marching squares: in each
// cell with four finite corners, the edge crossings joined in pairs (a saddle is split by the
// cell's mean value).
func contourSegments(g sweepGrid, z float64) [][2]plotter.XY {
	var out [][2]plotter.XY
	for c := 0; c+1 < len(g.x); c++ {
		for r := 0; r+1 < len(g.y); r++ {
			// Corners counter-clockwise from the lower left.
			xs := [4]float64{g.x[c], g.x[c+1], g.x[c+1], g.x[c]}
			ys := [4]float64{g.y[r], g.y[r], g.y[r+1], g.y[r+1]}
			zs := [4]float64{g.z[c][r], g.z[c+1][r], g.z[c+1][r+1], g.z[c][r+1]}
			ok := true
			for _, v := range zs {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					ok = false
				}
			}
			if !ok {
				continue
			}
			var pts []plotter.XY
			for e := range 4 {
				a, b := e, (e+1)%4
				if (zs[a] < z) != (zs[b] < z) {
					f := (z - zs[a]) / (zs[b] - zs[a])
					pts = append(pts, plotter.XY{X: xs[a] + f*(xs[b]-xs[a]), Y: ys[a] + f*(ys[b]-ys[a])})
				}
			}
			switch len(pts) {
			case 2:
				out = append(out, [2]plotter.XY{pts[0], pts[1]})
			case 4:
				// A saddle: when the centre lies on corner 0's side, corners 1 and 3 are cut
				// off (edges 0–1 and 2–3 pair), else corners 0 and 2.
				mean := (zs[0] + zs[1] + zs[2] + zs[3]) / 4
				if (mean < z) == (zs[0] < z) {
					out = append(out, [2]plotter.XY{pts[0], pts[1]}, [2]plotter.XY{pts[2], pts[3]})
				} else {
					out = append(out, [2]plotter.XY{pts[3], pts[0]}, [2]plotter.XY{pts[1], pts[2]})
				}
			}
		}
	}
	return out
}

// luminance is the relative brightness of c, 0 to 1.
func luminance(c color.Color) float64 {
	r, g, b, _ := c.RGBA()
	return (0.2126*float64(r) + 0.7152*float64(g) + 0.0722*float64(b)) / 65535
}

// mayNotLaseMarks is a triangle on every cell of a banded sweep whose samples straddle the
// lasing threshold (column study.MayNotLaseColumn "true"), black over a white halo so that it
// reads on any colour; nil when there is none. n is the number of values of the fastest key.
func mayNotLaseMarks(t *study.Table, n int, g sweepGrid) ([]plot.Plotter, error) {
	c := t.Column(study.MayNotLaseColumn)
	if c < 0 {
		return nil, nil
	}
	var pts plotter.XYs
	for r, row := range t.Rows {
		if row[c] == "true" {
			pts = append(pts, plotter.XY{X: g.x[r/n], Y: g.y[r%n]})
		}
	}
	if len(pts) == 0 {
		return nil, nil
	}
	var out []plot.Plotter
	for _, st := range []struct {
		col   color.Color
		width vg.Length
	}{{color.White, 3}, {color.Black, 1}} {
		s, err := plotter.NewScatter(pts)
		if err != nil {
			return nil, fmt.Errorf("plots: %w", err)
		}
		s.GlyphStyle = draw.GlyphStyle{Shape: lineTriangle{width: st.width}, Radius: vg.Points(3.5), Color: st.col}
		out = append(out, s)
	}
	return out, nil
}

// lineTriangle is an open triangle drawn with a line of the given width.
type lineTriangle struct{ width vg.Length }

// DrawGlyph implements draw.GlyphDrawer.
func (g lineTriangle) DrawGlyph(c *draw.Canvas, sty draw.GlyphStyle, pt vg.Point) {
	r := sty.Radius
	var p vg.Path
	p.Move(vg.Point{X: pt.X, Y: pt.Y + r})
	p.Line(vg.Point{X: pt.X - 0.866*r, Y: pt.Y - 0.5*r})
	p.Line(vg.Point{X: pt.X + 0.866*r, Y: pt.Y - 0.5*r})
	p.Close()
	c.SetLineStyle(draw.LineStyle{Color: sty.Color, Width: g.width})
	c.Stroke(p)
}
