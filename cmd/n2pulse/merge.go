package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"

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
	fs := newFlags("merge", "DIR… [--out DIR] [--metric NAME …]", stderr)
	out := fs.String("out", "merged", "directory for the merged results.csv, sweep.json and figures")
	metrics := fs.StringSlice("metric", nil, "figures of merit to draw (default as for sweep)")
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
	tab, m, err := study.Merge(fs.Args())
	if err != nil {
		return err
	}
	if err := os.MkdirAll(*out, 0o755); err != nil {
		return fmt.Errorf("merge: %w", err)
	}
	if err := m.Write(filepath.Join(*out, study.ManifestFile)); err != nil {
		return err
	}
	if err := tab.WriteCSV(filepath.Join(*out, study.ResultsFile)); err != nil {
		return err
	}
	fmt.Fprintf(stderr, "merged %d shard directories: %s\n", fs.NArg(), tableCounts(tab))
	return reportSweep(stdout, tab, m.Axes, *metrics, *out, *asJSON)
}
