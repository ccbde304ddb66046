package plots

import (
	"fmt"
	"image/color"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"n2pulse/units"
)

// SwarmData is an electron swarm table for SwarmFigure: every series sampled at
// ReducedField, in SI. A series may be empty (left out).
type SwarmData struct {
	Title        string
	ReducedField []float64 // E/N [V m²], increasing
	Drift        []float64 // drift velocity [m/s]
	AlphaN       []float64 // ionisation coefficient α/N [m²]
	EtaN         []float64 // attachment coefficient η/N [m²]
	ExciteB      []float64 // excitation rate coefficient of B³Πg [m³/s]
	ExciteC      []float64 // excitation rate coefficient of C³Πu [m³/s]
}

// SwarmFigure draws a swarm table into path (.png or .svg): three panels on one logarithmic
// E/N axis [Td]: the drift velocity [10^n cm/s], the ionisation and attachment coefficients
// α/N and η/N [cm²], and the excitation rate coefficients of B and C [cm³/s], each on a
// logarithmic axis in its own unit.
func SwarmFigure(path string, d SwarmData) error {
	if _, err := figureFormat(path); err != nil {
		return err
	}
	n := len(d.ReducedField)
	if n < 2 {
		return fmt.Errorf("plots: swarm figure: %d E/N values, want at least 2", n)
	}
	for _, s := range [][]float64{d.Drift, d.AlphaN, d.EtaN, d.ExciteB, d.ExciteC} {
		if len(s) != 0 && len(s) != n {
			return fmt.Errorf("plots: swarm figure: a series has %d values for %d E/N values", len(s), n)
		}
	}
	x := scaled(d.ReducedField, 1/units.Townsend)
	type curve struct {
		name   string
		v      []float64
		col    color.Color
		dashed bool
	}
	panels := []struct {
		ylabel string
		factor float64
		curves []curve
	}{
		{"drift velocity [cm/s]", 100, []curve{{"", d.Drift, colVoltage, false}}},
		{"α/N, η/N [cm²]", 1e4, []curve{{"ionisation α/N", d.AlphaN, colCurrent, false}, {"attachment η/N", d.EtaN, colField, true}}},
		{"rate coefficient [cm³/s]", 1e6, []curve{{"excitation of B", d.ExciteB, colLower, true}, {"excitation of C", d.ExciteC, colUpper, false}}},
	}
	rows := make([][]*plot.Plot, len(panels))
	for i, pan := range panels {
		p := plot.New()
		p.X.Scale = plot.LogScale{}
		p.X.Tick.Marker = logValueTicks{}
		if i < len(panels)-1 {
			p.X.Tick.Marker = unlabelled{p.X.Tick.Marker}
		} else {
			p.X.Label.Text = "E/N [Td]"
		}
		p.X.Min, p.X.Max = x[0], x[n-1]
		p.Y.Label.Text = pan.ylabel
		drawn := false
		for _, c := range pan.curves {
			if addCurve(p, x, c.v, pan.factor, c.name, c.col, c.dashed, true) {
				drawn = true
			}
		}
		if drawn {
			p.Y.Scale = plot.LogScale{}
			p.Y.Tick.Marker = decadeTicks{}
		}
		printStyle(p)
		p.Legend.Top, p.Legend.Left = false, false // lower right: the curves rise from the lower left
		rows[i] = []*plot.Plot{p}
	}
	rows[0][0].Title.Text = d.Title
	w, h := 16*vg.Centimeter, 20*vg.Centimeter
	return saveCanvas(path, w, h, func(c draw.Canvas) {
		tiles := draw.Tiles{Rows: len(rows), Cols: 1, PadTop: vg.Millimeter, PadBottom: vg.Millimeter,
			PadLeft: vg.Millimeter, PadRight: 3 * vg.Millimeter, PadY: 3 * vg.Millimeter}
		canvases := plot.Align(rows, tiles, c)
		for i := range rows {
			rows[i][0].Draw(canvases[i][0])
		}
	})
}
