package main

import (
	"bytes"
	"fmt"
	"io"
	"n2pulse/internal/atomicfile"
	"path/filepath"
	"strings"

	"n2pulse/kinetics/swarm"
	"n2pulse/plots"
)

func init() {
	register(command{
		name:    "swarm",
		summary: "solve the electron Boltzmann equation and write a swarm table (CSV) for N₂, air or a mixture",
		run:     runSwarm,
	})
}

func runSwarm(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("swarm", "[--gas n2|air | --nitrogen X --oxygen Y --helium Z] [--cross-sections SET] [--out FILE] [--plot FILE.png|.svg]", stderr)
	gas := fs.String("gas", "n2", "gas: n2 (pure N₂) or air (N₂ 0.79, O₂ 0.21)")
	out := fs.String("out", "", "write the CSV table to FILE (default: standard output)")
	plotFile := fs.String("plot", "", "draw v_d, α/N, η/N, k_B and k_C against E/N into FILE (.png or .svg)")
	nitrogen := fs.Float64("nitrogen", -1, "N₂ mole fraction 0–1 (with --oxygen/--helium, instead of --gas)")
	oxygen := fs.Float64("oxygen", -1, "O₂ mole fraction 0–1")
	helium := fs.Float64("helium", -1, "He mole fraction 0–1")
	cells := fs.Int("cells", swarm.DefaultCells, "number of energy cells (20–5000)")
	xsec := fs.String("cross-sections", "default", "N₂ cross-section set: default ("+swarm.DefaultSet+"), "+strings.Join(swarm.Sets(), ", "))
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
	xset, err := swarm.ResolveSet(*xsec)
	if err != nil {
		return usagef("swarm: --cross-sections %q: want default, %s", *xsec, strings.Join(swarm.Sets(), ", "))
	}
	mix, err := swarm.SetMixture(xset, xn, xo, xh)
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

// plotSwarm draws the table's drift velocity, α/N, η/N, k_B and k_C against E/N
// (plots.SwarmFigure).
func plotSwarm(t *swarm.Table, title, file string) error {
	d := plots.SwarmData{Title: "electron swarm coefficients, mole fractions " + title}
	for _, r := range t.Rows() {
		d.ReducedField = append(d.ReducedField, r.ReducedField)
		d.Drift = append(d.Drift, r.DriftVelocity)
		d.AlphaN = append(d.AlphaN, r.AlphaN)
		d.EtaN = append(d.EtaN, r.EtaN)
		d.ExciteB = append(d.ExciteB, r.ExciteB)
		d.ExciteC = append(d.ExciteC, r.ExciteC)
	}
	return plots.SwarmFigure(file, d)
}
