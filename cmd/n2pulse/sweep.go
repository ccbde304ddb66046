package main

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"syscall"
	"text/tabwriter"

	"n2pulse/internal/atomicfile"
	"n2pulse/internal/sysmem"
	"n2pulse/kinetics"
	"n2pulse/kinetics/study"
	"n2pulse/plots"
	"n2pulse/report"
)

func init() {
	register(command{
		name:    "sweep",
		summary: "run a design over a grid of any design keys; table, curves or maps, resumable and shardable",
		run:     runSweep,
	})
}

func runSweep(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("sweep", "[DESIGN] --vary KEY=FROM:TO:N[:log] [--vary …] [--metric NAME …] [--out DIR] [--resume] [--shard K/N]", stderr)
	vary := fs.StringArray("vary", nil, `a varied key and its grid, e.g. --vary gas.pressure=20Torr:760Torr:20:log (repeatable; the last varies fastest)`)
	metrics := fs.StringSlice("metric", nil, "figures of merit to draw (default "+strings.Join(plots.DefaultMapMetrics, ",")+")")
	out := fs.String("out", "sweep", "directory for results.csv, the journal, the figures and report.html")
	sets := fs.StringArray("set", nil, `override a design key before sweeping, e.g. --set channel.length="40 cm" (repeatable)`)
	workers := fs.Int("workers", runtime.NumCPU(), "points computed at once")
	memLimit := fs.String("memory-limit", "", `largest memory all points computed at once may take, e.g. "8 GB" (default: half the machine's memory); each point gets its share`)
	resume := fs.Bool("resume", false, "finish the sweep already started in --out, computing only the missing points")
	shardText := fs.String("shard", "", "compute only shard K of N (point i belongs to shard i mod N + 1); default from SLURM_ARRAY_TASK_ID when set")
	quiet := fs.Bool("quiet", false, "no progress line")
	asJSON := fs.Bool("json", false, "print the optimum of each metric as JSON on stdout instead of a table")
	samples := fs.Int("uncertainty", 0, fmt.Sprintf("also run every point over N samples of the uncertain constants (Latin hypercube, %d…%d; the varied keys keep their grid values, and so does a constant given with --set or in the design file at a value other than its default): results.csv gains <figure>_p05/_p50/_p95 columns, the drivers and a note per point", study.MinSamples, study.MaxSamples))
	seed := fs.Uint64("seed", 1, "seed of the --uncertainty samples (the same seed gives the same table on any machine and worker count)")
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	if len(*vary) == 0 {
		return usagef("sweep: give at least one --vary KEY=FROM:TO:N[:log]")
	}
	if *workers < 1 {
		return usagef("sweep: --workers %d: want at least 1", *workers)
	}
	d, err := loadDesign(fs.Args(), *sets)
	if err != nil {
		return err
	}
	if err := study.CheckSamples("--uncertainty", *samples); err != nil {
		return usageOf("sweep: ", err)
	}
	s := &study.Sweep{Design: d, Workers: *workers, Dir: *out, Resume: *resume, Samples: *samples, Seed: *seed}
	if s.Runner, err = sharedMemoryRunner("sweep", *memLimit, *workers); err != nil {
		return err
	}
	for _, v := range *vary {
		a, err := study.ParseAxis(v, d)
		if err != nil {
			return usageOf("", err)
		}
		s.Axes = append(s.Axes, a)
	}
	if err := checkMetrics(*metrics); err != nil {
		return err
	}
	if s.Shard, err = shardOf(*shardText); err != nil {
		return err
	}
	if err := s.Check(); err != nil {
		return usageOf("", err)
	}
	if !*quiet && isTerminal(stderr) {
		s.Progress = stderr
	}

	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	tab, err := s.Run(ctx)
	if errors.Is(err, context.Canceled) {
		return fmt.Errorf("sweep: interrupted; the finished points are kept in %s: run the same command with --resume to finish", filepath.Join(*out, study.JournalFile))
	}
	if err != nil {
		return err
	}
	if !*quiet {
		who := "sweep"
		if !s.Shard.Whole() {
			who = "shard " + s.Shard.String()
		}
		fmt.Fprintf(stderr, "%s: %s\n", who, tableCounts(tab))
	}
	if !s.Shard.Whole() {
		fmt.Fprintf(stdout, "shard %s: wrote %s; join the shards with `n2pulse merge`\n", s.Shard, filepath.Join(*out, study.ResultsFile))
		return nil
	}
	return reportSweep(stdout, tab, s.Axes, *metrics, *out, *asJSON, d.Name, d.String(), sweepBands{*samples, *seed, heldIf(*samples, d)})
}

// sweepReport is what `sweep --json` prints: the grid, the counts, the optimum of each metric
// (values in SI, as in results.csv) and the files written.
type sweepReport struct {
	Axes   []study.Axis `json:"axes"`
	Points int          `json:"points"`
	Failed int          `json:"failed"`
	Optima []plots.Best `json:"optima"`
	Files  []string     `json:"files"`
	// Uncertainty is present when the sweep ran with --uncertainty: sweepBandJSON.
	Uncertainty *sweepBandJSON `json:"uncertainty,omitempty"`
}

// reportSweep prints the optimum of each metric (a table, or JSON), draws the figures, writes
// the plotting-program copy of a two-key table and lists the files.
func reportSweep(stdout io.Writer, tab *study.Table, axes []study.Axis, metrics []string, dir string, asJSON bool, name, listing string, bands sweepBands) error {
	if len(metrics) == 0 {
		metrics = plots.DefaultMapMetrics
	}
	if !asJSON {
		printOptima(stdout, tab, axes, metrics)
		if bands.Samples > 0 {
			printSweepBands(stdout, tab, bands)
		}
	}
	files := []string{filepath.Join(dir, study.ResultsFile)}
	if len(axes) == 2 {
		dat := filepath.Join(dir, study.DataFile)
		if err := atomicfile.WriteFile(dat, tab.Blocks(axes[1].N)); err != nil {
			return fmt.Errorf("sweep: %w", err)
		}
		files = append(files, dat)
	}
	figs, err := plots.SweepFigures(tab, axes, metrics, dir)
	if err != nil {
		return err
	}
	files = append(files, figs...)
	if err := writeSweepReport(dir, name, listing, tab, axes, metrics, figs, bands); err != nil {
		return err
	}
	files = append(files, filepath.Join(dir, report.FileName))
	if asJSON {
		rep := sweepReport{Axes: axes, Points: len(tab.Rows), Files: files}
		for r := range tab.Rows {
			if !tab.OK(r) {
				rep.Failed++
			}
		}
		for _, m := range metrics {
			rep.Optima = append(rep.Optima, plots.Optimum(tab, axes, m))
		}
		if bands.Samples > 0 {
			rep.Uncertainty = sweepBandBlock(tab, bands, rep.Optima)
		}
		b, err := json.MarshalIndent(rep, "", "  ")
		if err != nil {
			return fmt.Errorf("sweep: %w", err)
		}
		fmt.Fprintln(stdout, string(b))
		return nil
	}
	fmt.Fprintf(stdout, "wrote %s", files[0])
	for _, f := range files[1:] {
		fmt.Fprintf(stdout, ", %s", filepath.Base(f))
	}
	fmt.Fprintln(stdout)
	return nil
}

// checkMetrics rejects --metric names that are not numeric figures of merit.
func checkMetrics(metrics []string) error {
	ok := study.NumericMetrics()
	for _, m := range metrics {
		if !slices.Contains(ok, m) {
			return usagef("--metric %q: allowed %s", m, strings.Join(ok, ", "))
		}
	}
	return nil
}

// shardOf reads --shard, or the Slurm job-array task when --shard is not given.
func shardOf(text string) (study.Shard, error) {
	if text != "" {
		s, err := study.ParseShard(text)
		if err != nil {
			return s, usageOf("", err)
		}
		return s, nil
	}
	s, _, err := study.ShardFromSlurm(os.Getenv)
	return s, err
}

// isTerminal reports whether w is a terminal (a character device).
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}

// tableCounts says how many points were computed, how many failed, how many were cut
// short (status "truncated": the pulse outlasted the longest run a point may take) and how
// many made separate pulses (column "pulses" above 1: their FWHM spans them all) or an
// ill-conditioned FWHM (column "fwhm_ill_conditioned").
func tableCounts(t *study.Table) string {
	failed, truncated := 0, 0
	c := t.Column(study.StatusColumn)
	for r := range t.Rows {
		switch {
		case c >= 0 && t.Rows[r][c] == study.StatusTruncated:
			truncated++
		case !t.OK(r):
			failed++
		}
	}
	out := fmt.Sprintf("%d points, %d failed", len(t.Rows), failed)
	if truncated > 0 {
		out += fmt.Sprintf(", %d truncated (left out of the optima)", truncated)
	}
	if n := len(multiPulseRows(t)); n > 0 {
		out += fmt.Sprintf(", %d with separate pulses (the pulses column; their FWHM spans them all)", n)
	}
	if n := len(illWidthRows(t)); n > 0 {
		out += fmt.Sprintf(", %d with an ill-conditioned FWHM (the fwhm_ill_conditioned column; a small change can move it a long way)", n)
	}
	return out
}

// illWidthRows are the rows of t whose FWHM is ill-conditioned (column fwhm_ill_conditioned).
func illWidthRows(t *study.Table) []int {
	return rowsWhere(t, "fwhm_ill_conditioned", func(v string) bool { return v == "true" })
}

// multiPulseRows are the rows of t whose output is two or more separate pulses.
func multiPulseRows(t *study.Table) []int {
	return rowsWhere(t, "pulses", func(v string) bool { n, err := strconv.Atoi(v); return err == nil && n >= 2 })
}

// rowsWhere returns the rows of t whose cell in the named column satisfies keep; nil when t
// has no such column (a table written before it existed).
func rowsWhere(t *study.Table, column string, keep func(string) bool) []int {
	c := t.Column(column)
	if c < 0 {
		return nil
	}
	var rows []int
	for r := range t.Rows {
		if keep(t.Rows[r][c]) {
			rows = append(rows, r)
		}
	}
	return rows
}

// printOptima writes, per metric, the best counted point and its varied values in display
// units (plots.LabelOf), with a note when it lies on the edge of the grid.
func printOptima(w io.Writer, t *study.Table, axes []study.Axis, metrics []string) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	banded := t.Column(study.BandNoteColumn) >= 0
	head := "figure of merit\toptimum\tvalue"
	if banded {
		head += "\t5 %\t95 %"
	}
	for _, a := range axes {
		head += "\t" + plots.LabelOf(a.Key).Text
	}
	fmt.Fprintln(tw, head+"\t")
	var edges []string
	illOptimum := false
	for _, m := range metrics {
		l := plots.LabelOf(m)
		b := plots.Optimum(t, axes, m)
		if b.Row < 0 {
			fmt.Fprintf(tw, "%s\t-\tno point with a value\t\n", l.Text)
			continue
		}
		line := fmt.Sprintf("%s\t%s\t%s", l.Text, b.Word, l.Format(b.Value))
		if banded {
			line += "\t" + bandCell(t, b.Row, m+"_p05", l) + "\t" + bandCell(t, b.Row, m+"_p95", l)
		}
		for _, a := range axes {
			al := plots.LabelOf(a.Key + " [" + a.Unit + "]").Typed(a.Display)
			line += "\t" + al.Format(t.Float(b.Row, t.Column(a.Header())))
		}
		var marks []string
		if len(b.Edge) > 0 {
			marks = append(marks, "edge")
			edges = append(edges, l.Text)
		}
		if m == "fwhm_s" && slices.Contains(illWidthRows(t), b.Row) {
			marks = append(marks, "ill-conditioned")
			illOptimum = true
		}
		if len(marks) > 0 {
			line += "\t" + strings.Join(marks, ", ")
		}
		fmt.Fprintln(tw, line+"\t")
	}
	tw.Flush()
	if len(edges) > 0 {
		fmt.Fprintf(w, "edge: the optimum of %s lies on the edge of the grid; extend the range to find the best\n", strings.Join(edges, ", "))
	}
	if illOptimum {
		fmt.Fprintln(w, "ill-conditioned: the shortest FWHM is at a point whose FWHM a small change can move a long way (a maximum or shoulder of the output near half its peak: fwhm_45_s, fwhm_55_s); rms_fwhm_s ranks widths steadily")
	}
}

// sharedMemoryRunner is the runner of a command that computes several designs at once (sweep,
// length): the --memory-limit text (empty: kinetics.DefaultMemoryLimit) shared equally among
// the workers. A malformed limit is a usage error naming the command.
func sharedMemoryRunner(command, limitText string, workers int) (study.Runner, error) {
	limit := kinetics.DefaultMemoryLimit
	if limitText != "" {
		var err error
		if limit, err = sysmem.ParseBytes(limitText); err != nil {
			return nil, usagef("%s: --memory-limit: %v", command, err)
		}
	}
	return study.MemoryRunner(limit / int64(workers)), nil
}
