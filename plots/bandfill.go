package plots

import (
	"image/color"
	"math"

	"gonum.org/v1/plot/plotter"
)

// fillBetween returns the filled regions between lo and hi over x, one polygon per run of at
// least two consecutive points where both are finite (a point without a band breaks the fill).
func fillBetween(x, lo, hi []float64, col color.Color) []*plotter.Polygon {
	var out []*plotter.Polygon
	start := -1
	flush := func(end int) { // points start … end−1
		if start >= 0 && end-start >= 2 {
			pts := make(plotter.XYs, 0, 2*(end-start))
			for i := start; i < end; i++ {
				pts = append(pts, plotter.XY{X: x[i], Y: hi[i]})
			}
			for i := end - 1; i >= start; i-- {
				pts = append(pts, plotter.XY{X: x[i], Y: lo[i]})
			}
			if poly, err := plotter.NewPolygon(pts); err == nil {
				poly.Color = col
				poly.LineStyle.Width = 0
				out = append(out, poly)
			}
		}
		start = -1
	}
	for i := range x {
		ok := !math.IsNaN(lo[i]) && !math.IsNaN(hi[i]) && !math.IsInf(lo[i], 0) && !math.IsInf(hi[i], 0) && !math.IsNaN(x[i])
		switch {
		case ok && start < 0:
			start = i
		case !ok:
			flush(i)
		}
	}
	flush(len(x))
	return out
}

// faint returns c with the opacity of a band drawn under its curve.
func faint(c color.Color) color.Color {
	r, g, b, _ := c.RGBA()
	return color.NRGBA{R: uint8(r >> 8), G: uint8(g >> 8), B: uint8(b >> 8), A: 55}
}
