// Command n2pulse models pulsed nitrogen lasers (337 nm, N₂ C³Πu → B³Πg): discharge circuit,
// electron kinetics at the local E/N, C and B populations and amplified spontaneous emission
// along the channel. Run `n2pulse help` for the subcommands. The command line only reads
// flags and files and prints; the physics lives in package kinetics and below.
package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"sort"

	"github.com/spf13/pflag"

	"n2pulse/internal/usermsg"

	"n2pulse/internal/sysmem"
	"n2pulse/kinetics"
)

// command is one subcommand. run returns a usageError for bad flags or arguments (exit 2) and
// any other error for a failure (exit 1).
type command struct {
	name    string
	summary string
	run     func(args []string, stdout, stderr io.Writer) error
}

var commands = map[string]command{}

// register adds a subcommand; each lives in a file of its own and registers in init.
func register(c command) { commands[c.name] = c }

// usageError marks a mistake in how the command was called; err, when set, is the library's
// error it carries (a *design.KeyError, say), for errors.As.
type usageError struct {
	msg string
	err error
}

func (e usageError) Error() string { return e.msg }

func (e usageError) Unwrap() error { return e.err }

// usageOf marks err, caused by a value on the command line, as a usage error; prefix names
// where the value came from ("--set: ").
func usageOf(prefix string, err error) error { return usageError{prefix + err.Error(), err} }

func usagef(format string, a ...any) error { return usageError{msg: fmt.Sprintf(format, a...)} }

// errSilent is returned when the command has already printed why it failed.
var errSilent = errors.New("")

// newFlags returns a FlagSet for a subcommand whose --help prints the usage line and flags.
func newFlags(name, usage string, stderr io.Writer) *pflag.FlagSet {
	fs := pflag.NewFlagSet(name, pflag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.Usage = func() {
		fmt.Fprintf(stderr, "usage: n2pulse %s %s\n\n%s\n\nflags:\n", name, usage, commands[name].summary)
		fs.PrintDefaults()
	}
	return fs
}

// parseFlags parses args; --help is not an error, a bad flag is a usage error.
func parseFlags(fs *pflag.FlagSet, args []string) (help bool, err error) {
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, pflag.ErrHelp) {
			return true, nil
		}
		return false, usageOf("", err)
	}
	return false, nil
}

func main() {
	// A run's arrays may take half the machine's memory: Go's collector lets the heap grow to
	// about twice the live data (GOGC = 100), so the process stays within the machine.
	if total, ok := sysmem.Total(); ok {
		kinetics.DefaultMemoryLimit = total / 2
	}
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

func run(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 || args[0] == "help" || args[0] == "-h" || args[0] == "--help" {
		if len(args) > 1 {
			if c, ok := commands[args[1]]; ok {
				return exitCode(c.run([]string{"--help"}, stdout, stderr), stderr)
			}
		}
		printHelp(stdout)
		if len(args) == 0 {
			return 2
		}
		return 0
	}
	if args[0] == "--version" || args[0] == "-version" {
		fmt.Fprintln(stdout, versionText())
		return 0
	}
	c, ok := commands[args[0]]
	if !ok {
		fmt.Fprintf(stderr, "n2pulse: unknown command %q; run `n2pulse help`\n", args[0])
		return 2
	}
	return exitCode(c.run(args[1:], stdout, stderr), stderr)
}

// exitCode applies the one exit-code rule of every command and prints the error: 0 success;
// 2 a mistake in how the command was written (an unknown command or flag, a wrong number of
// arguments, a value given on the command line that is malformed, unknown, out of range or
// without its unit: --set, --vary, --from, --pressure, …); 1 everything else (a file that is
// missing or is not a valid design, an output directory that already holds something, a run
// that fails, a discrepancy under check --strict).
func exitCode(err error, stderr io.Writer) int {
	if err == nil {
		return 0
	}
	var u usageError
	if errors.As(err, &u) {
		fmt.Fprintf(stderr, "n2pulse: %s\n", userMessage(err))
		return 2
	}
	if err != errSilent {
		fmt.Fprintf(stderr, "n2pulse: %s\n", userMessage(err))
	}
	return 1
}

// userMessage is the error's text without the library's package prefixes (usermsg.Strip).
func userMessage(err error) string { return usermsg.Strip(err.Error()) }

func printHelp(w io.Writer) {
	fmt.Fprintln(w, "n2pulse — physical model of the pulsed nitrogen laser (337 nm)")
	fmt.Fprintln(w, "\nusage: n2pulse COMMAND [flags]  (n2pulse COMMAND --help for its flags)")
	fmt.Fprintln(w, "\ncommands:")
	names := make([]string, 0, len(commands))
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		fmt.Fprintf(w, "  %-10s %s\n", n, commands[n].summary)
	}
	fmt.Fprintln(w, "\n"+safetyNotice)
}

// safetyNotice is printed with the help and wherever a design stores or emits harmful energy.
const safetyNotice = `Caution: the charged capacitors of a nitrogen laser hold lethal energy at high voltage, and the
337 nm beam and its reflections harm eyes and skin. Nitrogen displaces oxygen in closed rooms.
Follow your local electrical codes and licensed laser-safety practice; this program does not.`
