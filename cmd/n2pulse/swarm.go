package main

import (
	"bytes"
	"fmt"
	"io"
	"n2pulse/internal/atomicfile"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
	"gonum.org/v1/plot/vg"

	"n2pulse/kinetics/swarm"
	"n2pulse/units"
)

func init() {
	register(command{
		name:    "swarm",
		summary: "solve the electron Boltzmann equation and write a swarm table (CSV) for N₂, air or a mixture",
		run:     runSwarm,
	})
}

func runSwarm(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("swarm", "[--gas n2|air | --nitrogen X --oxygen Y --helium Z] [--out FILE] [--plot FILE.png|.svg]", stderr)
	gas := fs.String("gas", "n2", "gas: n2 (pure N₂) or air (N₂ 0.79, O₂ 0.21)")
	out := fs.String("out", "", "write the CSV table to FILE (default: standard output)")
	plotFile := fs.String("plot", "", "draw v_d, α/N, η/N, k_B and k_C against E/N into FILE (.png or .svg)")
	nitrogen := fs.Float64("nitrogen", -1, "N₂ mole fraction 0–1 (with --oxygen/--helium, instead of --gas)")
	oxygen := fs.Float64("oxygen", -1, "O₂ mole fraction 0–1")
	helium := fs.Float64("helium", -1, "He mole fraction 0–1")
	cells := fs.Int("cells", swarm.DefaultCells, "number of energy cells (20–5000)")
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("swarm: takes no arguments, got %q", fs.Args())
	}
	var xn, xo, xh float64
	if *nitrogen >= 0 || *oxygen >= 0 || *helium >= 0 {
		if fs.Changed("gas") {
			return usagef("swarm: give either --gas or the fractions, not both")
		}
		xn, xo, xh = max(*nitrogen, 0), max(*oxygen, 0), max(*helium, 0)
		if s := xn + xo + xh; s < 0.999 || s > 1.001 {
			return usagef("swarm: fractions sum to %g, want 1 (within 1e-3)", s)
		}
	} else {
		switch *gas {
		case "n2":
			xn = 1
		case "air":
			xn, xo = swarm.AirNitrogen, swarm.AirOxygen
		default:
			return usagef("swarm: --gas %q: want n2 or air", *gas)
		}
	}
	if *cells < 20 || *cells > 5000 {
		return usagef("swarm: --cells %d: allowed 20–5000", *cells)
	}
	if *plotFile != "" {
		ext := strings.ToLower(filepath.Ext(*plotFile))
		if ext != ".png" && ext != ".svg" {
			return usagef("swarm: --plot %q: the file must end in .png or .svg", *plotFile)
		}
	}
	mix, err := swarm.Mixture(xn, xo, xh)
	if err != nil {
		return err
	}
	set := &swarm.Settings{Cells: *cells}
	table, res, err := swarm.SolveTable(mix, set, swarm.TableFields)
	if err != nil {
		return err
	}
	var buf bytes.Buffer
	if err := swarm.WriteResultsCSV(&buf, swarm.TableComments(mix, set), res); err != nil {
		return err
	}
	if *out == "" {
		if _, err := stdout.Write(buf.Bytes()); err != nil {
			return err
		}
	} else if err := atomicfile.WriteFile(*out, buf.Bytes()); err != nil {
		return fmt.Errorf("swarm: %w", err)
	}
	if *plotFile != "" {
		if err := plotSwarm(table, swarm.Composition(mix), *plotFile); err != nil {
			return fmt.Errorf("swarm: plot: %w", err)
		}
	}
	return nil
}

// plotSwarm draws the table's v_d, α/N, η/N, k_B and k_C on log–log axes, normalised per curve
// so that they share one axis; the legend gives each curve's scale.
func plotSwarm(t *swarm.Table, title, file string) error {
	rows := t.Rows()
	p := plot.New()
	p.Title.Text = "electron swarm coefficients (mole fractions " + title + ")"
	p.X.Label.Text = "E/N [Td]"
	p.Y.Label.Text = "value in the unit given in the legend"
	p.X.Scale = plot.LogScale{}
	p.Y.Scale = plot.LogScale{}
	p.X.Tick.Marker = plot.LogTicks{Prec: -1}
	p.Y.Tick.Marker = plot.LogTicks{Prec: -1}
	curves := []struct {
		name  string
		scale float64
		get   func(c swarm.Coefficients) float64
	}{
		{"v_d [1e4 m/s]", 1e-4, func(c swarm.Coefficients) float64 { return c.DriftVelocity }},
		{"α/N [1e-22 m²]", 1e22, func(c swarm.Coefficients) float64 { return c.AlphaN }},
		{"η/N [1e-22 m²]", 1e22, func(c swarm.Coefficients) float64 { return c.EtaN }},
		{"k_B [1e-16 m³/s]", 1e16, func(c swarm.Coefficients) float64 { return c.ExciteB }},
		{"k_C [1e-16 m³/s]", 1e16, func(c swarm.Coefficients) float64 { return c.ExciteC }},
	}
	var lines []any
	for _, cv := range curves {
		var xy plotter.XYs
		for _, r := range rows {
			if v := cv.get(r) * cv.scale; v > 1e-4 {
				xy = append(xy, plotter.XY{X: r.ReducedField / units.Townsend, Y: v})
			}
		}
		if len(xy) < 2 {
			continue
		}
		lines = append(lines, cv.name, xy)
	}
	if err := plotutil.AddLines(p, lines...); err != nil {
		return err
	}
	p.Legend.Top = true
	p.Legend.Left = true
	var buf bytes.Buffer
	ext := strings.TrimPrefix(strings.ToLower(filepath.Ext(file)), ".")
	wt, err := p.WriterTo(7*vg.Inch, 5*vg.Inch, ext)
	if err != nil {
		return err
	}
	if _, err := wt.WriteTo(&buf); err != nil {
		return err
	}
	return atomicfile.WriteFile(file, buf.Bytes())
}
