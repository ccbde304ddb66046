package main

import (
	"fmt"
	"io"
	"n2pulse/internal/atomicfile"
	"os"
	"strings"

	"n2pulse/data"
	"n2pulse/kinetics/design"
)

func init() {
	register(command{
		name:    "init",
		summary: "write a commented example design file: --example blumlein (default), board, tube or tea-transfer",
		run:     runInit,
	})
}

func runInit(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("init", "[FILE] [--example NAME] [--all] [--force]", stderr)
	all := fs.Bool("all", false, "print every design key with its default value (SI), instead of the example; a file of these values holds nothing in --uncertainty (only a value changed from its default is held)")
	var names []string
	for _, e := range data.Examples() {
		names = append(names, "  "+e.Name+": "+e.Summary)
	}
	example := fs.String("example", "blumlein", "which example design to write (invented scenarios):\n"+strings.Join(names, "\n"))
	built := fs.Bool("built", false, "the same as --example board")
	force := fs.Bool("force", false, "overwrite FILE if it exists")
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	if fs.NArg() > 1 {
		return usagef("init: takes at most one file name")
	}
	if *built {
		*example = "board"
	}
	text, err := data.ExampleText(*example)
	if err != nil {
		return usagef("init: --example: %v", err)
	}
	if *all {
		text = []byte("# n2pulse design: every key with its default, in SI units with the unit written out.\n" +
			"# Lines starting with '# key =' are keys with no default (the apparatus: give them) or\n" +
			"# optional [build] keys; the comment after each key says what it means and its range.\n" +
			"# CAUTION: a charged laser holds lethal energy and its 337 nm beam harms eyes and skin.\n" +
			design.Defaults().Listing())
	}
	if fs.NArg() == 0 {
		_, err := stdout.Write(text)
		return err
	}
	path := fs.Arg(0)
	if _, err := os.Stat(path); err == nil && !*force {
		return fmt.Errorf("init: %s exists; use --force to overwrite", path)
	}
	if err := atomicfile.WriteFile(path, text); err != nil {
		return fmt.Errorf("init: %w", err)
	}
	fmt.Fprintf(stderr, "wrote %s\n", path)
	return nil
}
