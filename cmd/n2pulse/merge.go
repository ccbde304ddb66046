package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"

	"n2pulse/internal/atomicfile"
	"n2pulse/kinetics/study"
)

func init() {
	register(command{
		name:    "merge",
		summary: "join the shard directories of a sweep into one results.csv and draw its figures",
		run:     runMerge,
	})
}

func runMerge(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("merge", "DIR… [--out DIR] [--force] [--metric NAME …]", stderr)
	out := fs.String("out", "merged", "directory for the merged results.csv, sweep.json and figures")
	metrics := fs.StringSlice("metric", nil, "figures of merit to draw (default as for sweep)")
	force := fs.Bool("force", false, "write into an --out directory that is not empty (it is never allowed to be one of the shards)")
	asJSON := fs.Bool("json", false, "print the optimum of each metric as JSON on stdout instead of a table")
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	if fs.NArg() == 0 {
		return usagef("merge: name the shard directories, e.g. n2pulse merge shards/*")
	}
	if err := checkMetrics(*metrics); err != nil {
		return err
	}
	if err := checkMergeOut(*out, fs.Args(), *force); err != nil {
		return err
	}
	tab, m, err := study.Merge(fs.Args())
	if err != nil {
		return err
	}
	if err := os.MkdirAll(*out, 0o755); err != nil {
		return fmt.Errorf("merge: %w", err)
	}
	if _, err := atomicfile.RemoveLeftovers(*out); err != nil {
		return fmt.Errorf("merge: %w", err)
	}
	if err := m.Write(filepath.Join(*out, study.ManifestFile)); err != nil {
		return err
	}
	if err := tab.WriteCSV(filepath.Join(*out, study.ResultsFile)); err != nil {
		return err
	}
	fmt.Fprintf(stderr, "merged %d shard directories: %s\n", fs.NArg(), tableCounts(tab))
	return reportSweep(stdout, tab, m.Axes, *metrics, *out, *asJSON, m.DesignName, m.Design, sweepBands{m.Samples, m.Seed, m.Held})
}

// checkMergeOut refuses an output directory that is one of the shard directories (the shard
// would become the whole sweep, and a requeued shard would then refuse to resume) and,
// without force, one that already holds files (an earlier merge or another sweep).
func checkMergeOut(out string, shards []string, force bool) error {
	st, err := os.Stat(out)
	if errors.Is(err, os.ErrNotExist) {
		return nil
	}
	if err != nil {
		return fmt.Errorf("merge: --out %s: %w", out, err)
	}
	if !st.IsDir() {
		return fmt.Errorf("merge: --out %s is a file, not a directory", out)
	}
	for _, d := range shards {
		if ds, err := os.Stat(d); err == nil && os.SameFile(st, ds) {
			return fmt.Errorf("merge: --out %s is the shard directory %s; merge into a directory of its own", out, d)
		}
	}
	entries, err := os.ReadDir(out)
	if err != nil {
		return fmt.Errorf("merge: --out %s: %w", out, err)
	}
	if len(entries) > 0 && !force {
		return fmt.Errorf("merge: --out %s is not empty (%d entries, e.g. %s); choose another directory or pass --force to write over it", out, len(entries), entries[0].Name())
	}
	return nil
}
