package main

import (
	"fmt"
	"io"
	"runtime"
	"runtime/debug"
)

func init() {
	register(command{
		name:    "version",
		summary: "print the program's version: module version, source commit and Go release (also n2pulse --version)",
		run:     runVersion,
	})
}

func runVersion(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("version", "", stderr)
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("version: takes no arguments, got %q", fs.Args())
	}
	fmt.Fprintln(stdout, versionText())
	return nil
}

// versionText says which build this is, from the build information the Go toolchain records:
// the module version ("(devel)" for a build from a checkout), the source commit and its time
// when built inside a git checkout (with "+ local changes" when the tree was modified), and
// the Go release.
func versionText() string {
	v, commit, when, dirty := "(unknown)", "", "", false
	if bi, ok := debug.ReadBuildInfo(); ok {
		v = bi.Main.Version
		for _, s := range bi.Settings {
			switch s.Key {
			case "vcs.revision":
				commit = s.Value
			case "vcs.time":
				when = s.Value
			case "vcs.modified":
				dirty = s.Value == "true"
			}
		}
	}
	out := "n2pulse " + v
	if commit != "" {
		if len(commit) > 12 {
			commit = commit[:12]
		}
		out += ", commit " + commit
		if when != "" {
			out += " of " + when
		}
		if dirty {
			out += " + local changes"
		}
	}
	return out + ", " + runtime.Version()
}
