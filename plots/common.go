package plots

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"n2pulse/internal/atomicfile"
	"path/filepath"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Display units. The default font (Liberation) lacks the superscript minus and zero, so
// densities and gains are labelled 1/cm³ and 1/cm, powers of ten 1e14.
const (
	perCm3 = "/cm³"
	perCm  = "1/cm"
)

// Print sizes of the figure text.
const (
	titleSize  = font.Length(11)
	labelSize  = font.Length(10)
	tickSize   = font.Length(9)
	legendSize = font.Length(9)
	pngDPI     = 150
)

// figureFormat returns "png" or "svg" from path's extension, or an error naming the path.
func figureFormat(path string) (string, error) {
	ext := strings.ToLower(strings.TrimPrefix(filepath.Ext(path), "."))
	if ext != "png" && ext != "svg" {
		return "", fmt.Errorf("plots: %q: want a file name ending in .png or .svg", path)
	}
	return ext, nil
}

// labelledPlot returns a new plot with its title and axis labels.
func labelledPlot(title, x, y string) *plot.Plot {
	p := plot.New()
	p.Title.Text = title
	p.X.Label.Text = x
	p.Y.Label.Text = y
	return p
}

// printStyle sets the text sizes of p for print and, on axes still using gonum's default
// ticker, the niceTicks ticker.
func printStyle(p *plot.Plot) {
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		if _, ok := a.Tick.Marker.(plot.DefaultTicks); ok {
			a.Tick.Marker = niceTicks{}
		}
	}
	p.Title.TextStyle.Font.Size = titleSize
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Label.TextStyle.Font.Size = labelSize
		a.Tick.Label.Font.Size = tickSize
	}
	p.Legend.TextStyle.Font.Size = legendSize
}

// saveCanvas renders a figure of size w×h with render and writes it atomically to path in the
// format of its extension.
func saveCanvas(path string, w, h vg.Length, render func(c draw.Canvas)) error {
	ext, err := figureFormat(path)
	if err != nil {
		return err
	}
	var wt io.WriterTo
	switch ext {
	case "png":
		c := vgimg.NewWith(vgimg.UseWH(w, h), vgimg.UseDPI(pngDPI))
		render(draw.New(c))
		wt = vgimg.PngCanvas{Canvas: c}
	case "svg":
		c := vgsvg.New(w, h)
		render(draw.New(c))
		wt = c
	}
	var b bytes.Buffer
	if _, err := wt.WriteTo(&b); err != nil {
		return fmt.Errorf("plots: rendering %s: %w", path, err)
	}
	out := b.Bytes()
	if ext == "svg" {
		// Raster parts (heat maps, colour bars) must fill the box they are given: a browser
		// otherwise keeps the bitmap's proportions and draws a one-pixel-wide colour bar as
		// a hairline.
		out = bytes.ReplaceAll(out, []byte("<image "), []byte(`<image preserveAspectRatio="none" `))
	}
	if err := atomicfile.WriteFile(path, out); err != nil {
		return fmt.Errorf("plots: %w", err)
	}
	return nil
}

// savePlot writes one plot of size w×h atomically to path.
func savePlot(path string, p *plot.Plot, w, h vg.Length) error {
	return saveCanvas(path, w, h, p.Draw)
}

// siPrefixes are the prefixes offered for display units, largest first.
var siPrefixes = []struct {
	factor float64
	name   string
}{{1e12, "T"}, {1e9, "G"}, {1e6, "M"}, {1e3, "k"}, {1, ""}, {1e-3, "m"}, {1e-6, "µ"}, {1e-9, "n"}, {1e-12, "p"}}

// siScale picks the SI prefix for values up to maxAbs in unit (e.g. 3.2e4, "V" → 1e-3, "kV")
// so that the displayed numbers lie in [1, 1000). It returns the factor to multiply values by
// and the prefixed unit.
func siScale(maxAbs float64, unit string) (float64, string) {
	if maxAbs == 0 || math.IsNaN(maxAbs) || math.IsInf(maxAbs, 0) {
		return 1, unit
	}
	for _, p := range siPrefixes {
		if maxAbs >= p.factor {
			return 1 / p.factor, p.name + unit
		}
	}
	last := siPrefixes[len(siPrefixes)-1]
	return 1 / last.factor, last.name + unit
}

// powerScale picks a power of ten for values up to maxAbs so that the displayed numbers lie
// in [1, 1000) in steps of 10³, for quantities without SI prefixes (densities): it returns the
// factor and a label such as "1e12/cm³" for unit "/cm³".
func powerScale(maxAbs float64, unit string) (float64, string) {
	if maxAbs == 0 || math.IsNaN(maxAbs) || math.IsInf(maxAbs, 0) {
		return 1, "1" + unit
	}
	e := int(math.Floor(math.Log10(maxAbs)/3)) * 3
	if e == 0 {
		return 1, "1" + unit
	}
	return math.Pow(10, float64(-e)), powerOfTen(e) + unit
}

// powerOfTen writes 10ⁿ as "10^14": the default font lacks the superscript zero, nine and minus.
func powerOfTen(n int) string { return fmt.Sprintf("10^%d", n) }

// maxAbs returns the largest finite |v| over the given series.
func maxAbs(series ...[]float64) float64 {
	var m float64
	for _, s := range series {
		for _, v := range s {
			if !math.IsNaN(v) && !math.IsInf(v, 0) {
				m = math.Max(m, math.Abs(v))
			}
		}
	}
	return m
}

// niceTicks labels a linear axis at 1, 2 or 5 × 10ⁿ with about five labelled ticks, minor
// ticks between, and no more decimals than the step needs.
type niceTicks struct{}

func (niceTicks) Ticks(min, max float64) []plot.Tick {
	if !(max > min) || math.IsInf(max-min, 0) {
		return []plot.Tick{{Value: min, Label: strconv.FormatFloat(min, 'g', 4, 64)}}
	}
	raw := (max - min) / 5
	mag := math.Pow(10, math.Floor(math.Log10(raw)))
	step, minor := 10*mag, 5
	for _, m := range []struct {
		f float64
		n int
	}{{1, 5}, {2, 4}, {5, 5}} {
		if m.f*mag >= raw {
			step, minor = m.f*mag, m.n
			break
		}
	}
	dec := max0(-int(math.Floor(math.Log10(step) + 1e-9)))
	var ts []plot.Tick
	sub := step / float64(minor)
	for k := math.Ceil(min / sub); k*sub <= max+1e-9*sub; k++ {
		v := math.Min(math.Max(k*sub, min), max) // rounding must not push an end tick outside
		if math.Abs(v) < 1e-9*step {
			v = 0
		}
		if int(math.Round(k))%minor == 0 {
			ts = append(ts, plot.Tick{Value: v, Label: strconv.FormatFloat(v, 'f', dec, 64)})
		} else {
			ts = append(ts, plot.Tick{Value: v})
		}
	}
	return ts
}

func max0(n int) int {
	if n < 0 {
		return 0
	}
	return n
}

// decadeTicks labels a log axis at powers of ten ("1e15"), every decade or every few
// decades so that at most eight are labelled, with minor ticks at 2–9 × 10ⁿ over short
// ranges.
type decadeTicks struct{}

func (decadeTicks) Ticks(min, max float64) []plot.Tick {
	if !(min > 0) || !(max > min) {
		return nil
	}
	lo, hi := int(math.Floor(math.Log10(min))), int(math.Ceil(math.Log10(max)))
	every := (hi-lo)/8 + 1
	var ts []plot.Tick
	for e := lo; e <= hi; e++ {
		v := math.Pow(10, float64(e))
		if v >= min*(1-1e-12) && v <= max*(1+1e-12) {
			t := plot.Tick{Value: v}
			if (e-lo)%every == 0 {
				t.Label = powerOfTen(e)
			}
			ts = append(ts, t)
		}
		if hi-lo <= 6 {
			for m := 2; m <= 9; m++ {
				if w := float64(m) * v; w >= min && w <= max {
					ts = append(ts, plot.Tick{Value: w})
				}
			}
		}
	}
	return ts
}
