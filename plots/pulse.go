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
	"n2pulse/units"
)

// PulseData is one shot's waveforms for PulseReport, all sampled at Time. A series may be
// empty (its curve is left out); otherwise it must have len(Time) values. NaN values break a
// curve.
type PulseData struct {
	Title string
	// Time is the sample time [s], non-decreasing, at least two samples.
	Time []float64
	// ChannelVoltage [V], Current [A], ReducedField E/N [V m²], ElectronDensity [m⁻³],
	// UpperLevel and LowerLevel populations [m⁻³], PowerFront and PowerRear output power at
	// each end [W].
	ChannelVoltage, Current, ReducedField, ElectronDensity, UpperLevel, LowerLevel, PowerFront, PowerRear []float64
	// FWHMStart and FWHMEnd are the first and last half-maximum crossings of the output-end
	// pulse [s] (HalfMaxCrossings); 0, 0 if there are none.
	FWHMStart, FWHMEnd float64
	// Pulses is the number of separate pulses of the output-end power (kinetics.Summary.Pulses);
	// from 2 on, the half-maximum mark says that it spans them all.
	Pulses int
	// FWHMIllConditioned is kinetics.Summary.FWHMIllConditioned: the half-maximum width
	// depends strongly on its level. The half-maximum mark then says so, with FWHMAt45 and
	// FWHMAt55, the widths [s] at 45 % and 55 % of the peak (Summary.FWHMAt45, FWHMAt55).
	FWHMIllConditioned bool
	FWHMAt45, FWHMAt55 float64
	// DetectorResponse [s] is the detector response time the FWHM and its conditioning were
	// read through (Summary.DetectorResponse); 0 for none. The curves and the mark are the
	// power leaving the channel, so the ill-conditioned note then names the detector.
	DetectorResponse float64
	// RearReflectivity and FrontReflectivity name the ends in the legend ("rear end, mirror
	// R = 0.9"); 0 for an open end.
	RearReflectivity, FrontReflectivity float64
	// Band, when not nil, is the 5–95 % band of the output-end power over the samples of an
	// uncertainty study, shaded under the output-end curve.
	Band *PowerBand
}

// PowerBand is the spread of the output-end power over the samples of an uncertainty study,
// aligned at switch closure: at each Time [s] the Low (5 %) and High (95 %) values [W] over
// Samples samples.
type PowerBand struct {
	Time      []float64
	Low, High []float64
	Samples   int
}

// check validates a band: at least two strictly increasing finite times, as many finite values
// in Low and High, and Low ≤ High.
func (b *PowerBand) check() error {
	n := len(b.Time)
	if n < 2 || len(b.Low) != n || len(b.High) != n {
		return fmt.Errorf("plots: pulse report: PowerBand has %d times, %d low and %d high values; want at least 2 times and as many of each", n, len(b.Low), len(b.High))
	}
	for i := range b.Time {
		if math.IsNaN(b.Time[i]) || math.IsInf(b.Time[i], 0) || (i > 0 && !(b.Time[i] > b.Time[i-1])) {
			return fmt.Errorf("plots: pulse report: PowerBand.Time[%d] = %g s: want finite, strictly increasing times", i, b.Time[i])
		}
		if lo, hi := b.Low[i], b.High[i]; math.IsNaN(lo) || math.IsInf(lo, 0) || math.IsNaN(hi) || math.IsInf(hi, 0) || lo > hi {
			return fmt.Errorf("plots: pulse report: PowerBand at %g s: low %g W, high %g W; want finite with low ≤ high", b.Time[i], lo, hi)
		}
	}
	return nil
}

// PowerWindow returns the span [s] that the pulse report's power panel shows for a shot with
// output power front and rear [W] at times t [s]: where their sum exceeds 1 % of its peak,
// widened by half its length on each side (at least 1 ns in all), within the run.
func PowerWindow(t, front, rear []float64) (lo, hi float64, err error) {
	r := PulseData{Time: t, PowerFront: front, PowerRear: rear}
	if err := r.check(); err != nil {
		return 0, 0, err
	}
	lo, hi = pulseWindow(scaled(t, 1e9), r.totalPower())
	return 1e-9 * lo, 1e-9 * hi, nil
}

// HalfMaxCrossings returns the first and last times at which p reaches half its maximum,
// interpolated linearly between samples; 0, 0 when p has no positive maximum.
func HalfMaxCrossings(t, p []float64) (start, end float64) {
	if len(t) != len(p) || len(p) < 2 {
		return 0, 0
	}
	top := maxAbs(p)
	if !(top > 0) {
		return 0, 0
	}
	half := top / 2
	first, last := -1, -1
	for i, v := range p {
		if v >= half {
			if first < 0 {
				first = i
			}
			last = i
		}
	}
	start, end = t[first], t[last]
	if first > 0 {
		f := (half - p[first-1]) / (p[first] - p[first-1])
		start = t[first-1] + f*(t[first]-t[first-1])
	}
	if last < len(p)-1 {
		f := (p[last] - half) / (p[last] - p[last+1])
		end = t[last] + f*(t[last+1]-t[last])
	}
	return start, end
}

// pulseWindow returns the time span [ns] the power panel shows: where the total output exceeds
// 1 % of its peak, widened by half its length on each side (and at least 1 ns in all), within
// the run. Without output it is the whole run.
func pulseWindow(t, total []float64) (lo, hi float64) {
	lo, hi = t[0], t[len(t)-1]
	top := maxAbs(total)
	if !(top > 0) {
		return lo, hi
	}
	a, b := -1, -1
	for i, v := range total {
		if v > 0.01*top {
			if a < 0 {
				a = i
			}
			b = i
		}
	}
	w := math.Max(t[b]-t[a], 1)
	return math.Max(t[0], t[a]-w/2), math.Min(t[len(t)-1], t[b]+w/2)
}

// Colours of the pulse report's curves.
var (
	colVoltage    = color.RGBA{R: 20, G: 70, B: 190, A: 255}
	colCurrent    = color.RGBA{R: 200, G: 40, B: 30, A: 255}
	colField      = color.RGBA{R: 20, G: 130, B: 60, A: 255}
	colDensity    = color.RGBA{R: 120, G: 40, B: 160, A: 255}
	colUpper      = color.RGBA{R: 20, G: 70, B: 190, A: 255}
	colLower      = color.RGBA{R: 230, G: 130, B: 0, A: 255}
	colFront      = color.RGBA{R: 200, G: 40, B: 30, A: 255}
	colFrontLight = color.RGBA{R: 240, G: 140, B: 120, A: 255}
	colRear       = color.RGBA{R: 20, G: 70, B: 190, A: 255}
	colTotal      = color.RGBA{R: 110, G: 110, B: 110, A: 255}
	colMark       = color.RGBA{A: 255}
)

// PulseReport draws the pulse report of one shot into path (.png or .svg): five panels
// stacked on one time axis [ns]: channel voltage [kV] and current [kA]; reduced field [Td];
// electron density [cm⁻³, log axis]; upper and lower laser-level populations [cm⁻³]; output
// power at each end (and their sum) with the full width at half maximum marked.
func PulseReport(path string, r PulseData) error {
	if _, err := figureFormat(path); err != nil {
		return err
	}
	if err := r.check(); err != nil {
		return err
	}
	if r.Band != nil {
		if err := r.Band.check(); err != nil {
			return err
		}
	}
	t := scaled(r.Time, 1e9)
	lo, hi := pulseWindow(t, r.totalPower())
	panels := []*plot.Plot{
		r.circuitPanel(t), r.fieldPanel(t), r.densityPanel(t), r.populationPanel(t), r.powerPanel(t),
	}
	last := len(panels) - 1
	for i, p := range panels {
		printStyle(p)
		p.X.Min, p.X.Max = t[0], t[len(t)-1]
		if i == last {
			p.X.Min, p.X.Max = lo, hi
		}
		grid := plotter.NewGrid()
		grid.Vertical.Color = nil // the upper panels have no labelled time ticks to align with
		p.Add(grid)
		p.Legend.Top = true
		p.Legend.TextStyle.Font.Size = legendSize
		switch {
		case i == last:
			p.X.Label.Text = "time after switch closure [ns], zoomed on the pulse"
		case i == last-1:
			p.X.Label.Text = "time after switch closure [ns]"
		default:
			p.X.Tick.Marker = unlabelled{niceTicks{}}
		}
		if i < last && (lo > t[0] || hi < t[len(t)-1]) {
			// The span the power panel shows, shaded on the panels above.
			p.Add(shade(lo, hi))
		}
	}
	panels[0].Title.Text = r.Title
	rows := make([][]*plot.Plot, len(panels))
	for i, p := range panels {
		rows[i] = []*plot.Plot{p}
	}
	tiles := draw.Tiles{Rows: len(panels), Cols: 1, PadTop: vg.Millimeter, PadBottom: vg.Millimeter,
		PadLeft: vg.Millimeter, PadRight: 3 * vg.Millimeter, PadY: 4 * vg.Millimeter}
	w, h := 16*vg.Centimeter, 24*vg.Centimeter
	return saveCanvas(path, w, h, func(c draw.Canvas) {
		canvases := plot.Align(rows, tiles, c)
		for i, p := range panels {
			p.Draw(canvases[i][0])
		}
	})
}

// check validates the lengths and values of the series.
func (r *PulseData) check() error {
	n := len(r.Time)
	if n < 2 {
		return fmt.Errorf("plots: pulse report: PulseData.Time has %d samples, want at least 2", n)
	}
	for i, v := range r.Time {
		if math.IsNaN(v) || math.IsInf(v, 0) || (i > 0 && v < r.Time[i-1]) {
			return fmt.Errorf("plots: pulse report: PulseData.Time[%d] = %g s: want finite, non-decreasing times", i, v)
		}
	}
	if !(r.Time[n-1] > r.Time[0]) {
		return fmt.Errorf("plots: pulse report: PulseData.Time spans no time (%g s to %g s)", r.Time[0], r.Time[n-1])
	}
	for _, s := range []struct {
		name string
		v    []float64
	}{{"ChannelVoltage", r.ChannelVoltage}, {"Current", r.Current}, {"ReducedField", r.ReducedField},
		{"ElectronDensity", r.ElectronDensity}, {"UpperLevel", r.UpperLevel}, {"LowerLevel", r.LowerLevel},
		{"PowerFront", r.PowerFront}, {"PowerRear", r.PowerRear}} {
		if len(s.v) != 0 && len(s.v) != n {
			return fmt.Errorf("plots: pulse report: PulseData.%s has %d values, want 0 or len(Time) = %d", s.name, len(s.v), n)
		}
	}
	if math.IsNaN(r.FWHMStart) || math.IsNaN(r.FWHMEnd) || r.FWHMEnd < r.FWHMStart {
		return fmt.Errorf("plots: pulse report: FWHMStart = %g s, FWHMEnd = %g s: want FWHMStart ≤ FWHMEnd", r.FWHMStart, r.FWHMEnd)
	}
	return nil
}

func (r *PulseData) circuitPanel(t []float64) *plot.Plot {
	p := plot.New()
	fv, uv := siScale(maxAbs(r.ChannelVoltage), "V")
	fi, ui := siScale(maxAbs(r.Current), "A")
	addCurve(p, t, r.ChannelVoltage, fv, "channel voltage ["+uv+"]", colVoltage, false, false)
	addCurve(p, t, r.Current, fi, "current ["+ui+"]", colCurrent, true, false)
	p.Y.Label.Text = uv + ", " + ui
	return p
}

func (r *PulseData) fieldPanel(t []float64) *plot.Plot {
	p := plot.New()
	addCurve(p, t, r.ReducedField, 1/units.Townsend, "", colField, false, false)
	p.Y.Label.Text = "E/N [Td]"
	return p
}

func (r *PulseData) densityPanel(t []float64) *plot.Plot {
	p := plot.New()
	if addCurve(p, t, r.ElectronDensity, 1e-6, "", colDensity, false, true) {
		p.Y.Scale = plot.LogScale{}
		p.Y.Tick.Marker = decadeTicks{}
	}
	p.Y.Label.Text = "nₑ [1" + perCm3 + "]"
	return p
}

func (r *PulseData) populationPanel(t []float64) *plot.Plot {
	p := plot.New()
	f, u := powerScale(1e-6*maxAbs(r.UpperLevel, r.LowerLevel), perCm3)
	addCurve(p, t, r.UpperLevel, 1e-6*f, "upper level C", colUpper, false, false)
	addCurve(p, t, r.LowerLevel, 1e-6*f, "lower level B", colLower, true, false)
	p.Y.Label.Text = "population [" + u + "]"
	return p
}

// totalPower is the output of both ends (or the one given).
func (r *PulseData) totalPower() []float64 {
	switch {
	case len(r.PowerFront) > 0 && len(r.PowerRear) > 0:
		total := make([]float64, len(r.PowerFront))
		for i := range total {
			total[i] = r.PowerFront[i] + r.PowerRear[i]
		}
		return total
	case len(r.PowerFront) > 0:
		return r.PowerFront
	}
	return r.PowerRear
}

// endName names an end for the legend: "output end (z = L)", "rear end, mirror R = 0.9 (z = 0)".
func endName(end string, z string, refl float64) string {
	if refl > 0 {
		return fmt.Sprintf("%s end, mirror R = %.3g (z = %s)", end, refl, z)
	}
	return fmt.Sprintf("%s end (z = %s)", end, z)
}

func (r *PulseData) powerPanel(t []float64) *plot.Plot {
	p := plot.New()
	total := r.totalPower()
	f, u := siScale(maxAbs(total), "W")
	if b := r.Band; b != nil {
		if poly := bandPolygon(scaled(b.Time, 1e9), b.Low, b.High, f); poly != nil {
			p.Add(poly)
			p.Legend.Add(fmt.Sprintf("output end, 5–95 %% of %d samples", b.Samples), poly)
		}
	}
	// The output end wide and light, the rear end thin and dashed on top: both stay visible
	// when they coincide (a channel without mirrors).
	if l := addCurveStyled(p, t, r.PowerFront, f, colFrontLight, nil, 2.8); l != nil {
		p.Legend.Add(endName("output", "L", r.FrontReflectivity), l)
	}
	if l := addCurveStyled(p, t, r.PowerRear, f, colRear, []vg.Length{vg.Points(4), vg.Points(2)}, 1); l != nil {
		p.Legend.Add(endName("rear", "0", r.RearReflectivity), l)
	}
	if len(r.PowerFront) > 0 && len(r.PowerRear) > 0 {
		addCurve(p, t, total, f, "both ends", colTotal, false, false)
	}
	p.Y.Label.Text = "output power [" + u + "]"
	p.Y.Min = 0
	if r.FWHMEnd > r.FWHMStart && maxAbs(r.PowerFront) > 0 {
		markFWHM(p, 1e9*r.FWHMStart, 1e9*r.FWHMEnd, 0.5*f*maxAbs(r.PowerFront), r.fwhmLabel())
	}
	return p
}

// shade is a translucent grey band from x = lo to hi over the full height of a panel.
func shade(lo, hi float64) plot.Plotter { return band{lo, hi} }

// band is the plotter of shade.
type band struct{ lo, hi float64 }

// Plot implements plot.Plotter.
func (b band) Plot(c draw.Canvas, p *plot.Plot) {
	trX, _ := p.Transforms(&c)
	x0, x1 := trX(b.lo), trX(b.hi)
	c.FillPolygon(color.NRGBA{R: 120, G: 120, B: 120, A: 40}, []vg.Point{
		{X: x0, Y: c.Min.Y}, {X: x1, Y: c.Min.Y}, {X: x1, Y: c.Max.Y}, {X: x0, Y: c.Max.Y}})
}

// markFWHM draws dashed verticals at the half-maximum crossings a and b [ns], a bar between
// them at the half-maximum level half, and the label text (PulseData.fwhmLabel).
func markFWHM(p *plot.Plot, a, b, half float64, text string) {
	dash := []vg.Length{vg.Points(3), vg.Points(2)}
	for _, x := range []float64{a, b} {
		l, err := plotter.NewLine(plotter.XYs{{X: x, Y: 0}, {X: x, Y: 2 * half}})
		if err != nil {
			continue
		}
		l.Color, l.Dashes, l.Width = colMark, dash, vg.Points(0.7)
		p.Add(l)
	}
	bar, err := plotter.NewLine(plotter.XYs{{X: a, Y: half}, {X: b, Y: half}})
	if err == nil {
		bar.Color, bar.Width = colMark, vg.Points(1.2)
		p.Add(bar)
	}
	lab, err := plotter.NewLabels(plotter.XYLabels{XYs: plotter.XYs{{X: b, Y: half}}, Labels: []string{text}})
	if err == nil {
		for i := range lab.TextStyle {
			lab.TextStyle[i].Font.Size = legendSize
			lab.TextStyle[i].YAlign = -0.5
		}
		lab.Offset = vg.Point{X: vg.Points(3)}
		p.Add(lab)
	}
}

// fwhmLabel is the text of the half-maximum mark: "half maximum, output end: 1.36 ns" (in ps
// below 1 ns), ", spans 2 separate pulses" from two pulses on, and when the width is
// ill-conditioned a second line "ill-conditioned: 0.65–0.972 ns at 55–45 % of the peak" (with
// "through the 1 ns detector" when the width was read through one).
func (r *PulseData) fwhmLabel() string {
	text := "half maximum, output end: " + nsOrPs(1e9*(r.FWHMEnd-r.FWHMStart))
	if r.Pulses >= 2 {
		text += fmt.Sprintf(", spans %d separate pulses", r.Pulses)
	}
	if r.FWHMIllConditioned {
		lo, hi := 1e9*r.FWHMAt55, 1e9*r.FWHMAt45
		rng := fmt.Sprintf("%.3g–%.3g ns", lo, hi)
		if hi < 1 {
			rng = fmt.Sprintf("%.3g–%.3g ps", 1e3*lo, 1e3*hi)
		}
		text += fmt.Sprintf("\nill-conditioned: %s at %.0f–%.0f %% of the peak", rng, 100*(0.5+kinetics.HalfMaxBand), 100*(0.5-kinetics.HalfMaxBand))
		if r.DetectorResponse > 0 {
			text += " through the " + nsOrPs(1e9*r.DetectorResponse) + " detector"
		}
	}
	return text
}

// nsOrPs formats a duration w [ns] with three significant digits, in ps below 1 ns.
func nsOrPs(w float64) string {
	if w < 1 {
		return fmt.Sprintf("%.3g ps", 1e3*w)
	}
	return fmt.Sprintf("%.3g ns", w)
}

// addCurve adds v·factor against t as a line, broken at NaN values (and at non-positive ones
// for a log axis), with a legend entry if name is not empty. It reports whether any point was
// drawn.
func addCurve(p *plot.Plot, t, v []float64, factor float64, name string, col color.Color, dashed, logY bool) bool {
	if len(v) == 0 {
		return false
	}
	var segments []plotter.XYs
	var cur plotter.XYs
	for i, x := range v {
		y := x * factor
		if math.IsNaN(y) || math.IsInf(y, 0) || (logY && y <= 0) {
			if len(cur) > 0 {
				segments, cur = append(segments, cur), nil
			}
			continue
		}
		cur = append(cur, plotter.XY{X: t[i], Y: y})
	}
	if len(cur) > 0 {
		segments = append(segments, cur)
	}
	var first *plotter.Line
	for _, s := range segments {
		l, err := plotter.NewLine(s)
		if err != nil {
			continue
		}
		l.Color, l.Width = col, vg.Points(1.2)
		if dashed {
			l.Dashes = []vg.Length{vg.Points(4), vg.Points(2)}
		}
		p.Add(l)
		if first == nil {
			first = l
		}
	}
	if first != nil && name != "" {
		p.Legend.Add(name, first)
	}
	return first != nil
}

// scaled returns v·f as a new slice.
func scaled(v []float64, f float64) []float64 {
	out := make([]float64, len(v))
	for i, x := range v {
		out[i] = x * f
	}
	return out
}

// unlabelled keeps a ticker's marks but drops their labels (for panels above the shared axis).
type unlabelled struct{ plot.Ticker }

func (u unlabelled) Ticks(min, max float64) []plot.Tick {
	ts := u.Ticker.Ticks(min, max)
	for i := range ts {
		ts[i].Label = ""
	}
	return ts
}

// addCurveStyled adds v·factor against t as one or more lines (broken at NaN) of the given
// colour, dashes and width [pt]; it returns the first line, or nil when nothing was drawn.
func addCurveStyled(p *plot.Plot, t, v []float64, factor float64, col color.Color, dashes []vg.Length, width float64) *plotter.Line {
	var first *plotter.Line
	var cur plotter.XYs
	flush := func() {
		if len(cur) == 0 {
			return
		}
		if l, err := plotter.NewLine(cur); err == nil {
			l.Color, l.Width, l.Dashes = col, vg.Points(width), dashes
			p.Add(l)
			if first == nil {
				first = l
			}
		}
		cur = nil
	}
	for i, x := range v {
		if y := x * factor; math.IsNaN(y) || math.IsInf(y, 0) {
			flush()
		} else {
			cur = append(cur, plotter.XY{X: t[i], Y: y})
		}
	}
	flush()
	return first
}

// colBand fills the uncertainty band of the output-end power: the output end's colour, faint.
var colBand = color.NRGBA{R: 200, G: 40, B: 30, A: 60}

// bandPolygon is the filled region between low and high (scaled by factor) over t [ns]; nil
// when it cannot be made.
func bandPolygon(t, low, high []float64, factor float64) *plotter.Polygon {
	pts := make(plotter.XYs, 0, 2*len(t))
	for i := range t {
		pts = append(pts, plotter.XY{X: t[i], Y: factor * high[i]})
	}
	for i := len(t) - 1; i >= 0; i-- {
		pts = append(pts, plotter.XY{X: t[i], Y: factor * low[i]})
	}
	poly, err := plotter.NewPolygon(pts)
	if err != nil {
		return nil
	}
	poly.Color = colBand
	poly.LineStyle.Width = 0
	return poly
}
