package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"regexp"
	"sort"
	"strings"

	"github.com/spf13/pflag"
)

// Exit statuses, grep's convention.
const (
	exitOK    = 0 // the answer is yes (controllable, feasible, ...)
	exitNo    = 1 // the answer is no
	exitError = 2 // bad input or usage
)

// env is what a command may touch; tests inject their own.
type env struct {
	Stdin       io.Reader
	Stdout      io.Writer
	Stderr      io.Writer
	StderrIsTTY bool
}

// status shows what a long step is doing on the last line of a terminal's
// standard error, and nothing elsewhere; status("") clears the line.
func (e *env) status(format string, args ...any) {
	if e == nil || !e.StderrIsTTY {
		return
	}
	fmt.Fprint(e.Stderr, "\r\033[K")
	if format != "" {
		fmt.Fprintf(e.Stderr, "netsteer: "+format+"...", args...)
	}
}

// command is one subcommand. Each lives in its own file and registers itself
// from an init function.
type command struct {
	name    string
	summary string // one line for the command list
	usage   string // full help: synopsis, description, example
	// run parses its own flags from fs (already holding the help flag) and
	// returns the exit status.
	run func(e *env, c *command, fs *pflag.FlagSet, args []string) int
}

var commands = map[string]*command{}

func register(c *command) {
	if _, dup := commands[c.name]; dup {
		panic("netsteer: command registered twice: " + c.name)
	}
	commands[c.name] = c
}

const topUsage = `netsteer: structural controllability of large networks.

Usage: netsteer COMMAND [options] ...

An edge "u v" in a network file means u acts on v (A[v][u] != 0).

Commands:
%s
Run "netsteer help COMMAND" or "netsteer COMMAND --help" for details.

Structural results hold for almost all parameter values. They are a
screening step: they do not replace dynamic studies, safety analysis,
local codes or licensed engineering review.
`

func listCommands() string {
	names := make([]string, 0, len(commands))
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	var b strings.Builder
	for _, n := range names {
		fmt.Fprintf(&b, "  %-10s %s\n", n, commands[n].summary)
	}
	return b.String()
}

// run dispatches args and returns the exit status.
func run(e *env, args []string) int {
	if len(args) == 0 {
		fmt.Fprintf(e.Stderr, topUsage, listCommands())
		return exitError
	}
	name := args[0]
	switch name {
	case "help", "-h", "--help":
		if len(args) > 1 {
			if c, ok := commands[args[1]]; ok {
				// The same text as "netsteer COMMAND --help", options included.
				fs := pflag.NewFlagSet(c.name, pflag.ContinueOnError)
				fs.SetOutput(io.Discard)
				fs.SortFlags = false
				return c.run(e, c, fs, []string{"--help"})
			}
			fmt.Fprintf(e.Stderr, "netsteer: unknown command %q\n", args[1])
			return exitError
		}
		fmt.Fprintf(e.Stdout, topUsage, listCommands())
		return exitOK
	case "version", "--version":
		fmt.Fprintln(e.Stdout, "netsteer", version())
		return exitOK
	}
	c, ok := commands[name]
	if !ok {
		fmt.Fprintf(e.Stderr, "netsteer: unknown command %q; run \"netsteer help\"\n", name)
		return exitError
	}
	fs := pflag.NewFlagSet(name, pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.SortFlags = false
	return c.run(e, c, fs, args[1:])
}

// parse parses flags; it prints help or a usage error and reports whether
// the command should go on (and if not, with which status).
func parse(e *env, c *command, fs *pflag.FlagSet, args []string) (bool, int) {
	help := fs.BoolP("help", "h", false, "show this help")
	err := fs.Parse(args)
	if *help || errors.Is(err, pflag.ErrHelp) {
		fmt.Fprint(e.Stdout, c.usage)
		fmt.Fprintf(e.Stdout, "\nOptions:\n%s", fs.FlagUsages())
		return false, exitOK
	}
	if err != nil {
		fmt.Fprintf(e.Stderr, "netsteer %s: %v (see netsteer %s --help)\n", c.name, err, c.name)
		return false, exitError
	}
	return true, exitOK
}

// fail prints a one-line error and returns the error status.
func fail(e *env, err error) int {
	fmt.Fprintln(e.Stderr, "netsteer: "+userMessage(err.Error()))
	return exitError
}

// usageError prints a usage problem for command c.
func usageError(e *env, c *command, format string, args ...any) int {
	fmt.Fprintf(e.Stderr, "netsteer %s: %s (see netsteer %s --help)\n", c.name, userMessage(fmt.Sprintf(format, args...)), c.name)
	return exitError
}

// overwritesInput reports an error when the output file out is one of the
// files the command reads ("-" and "" are never files).
func overwritesInput(out string, inputs ...string) error {
	if out == "" || out == "-" {
		return nil
	}
	ost, err := os.Stat(out)
	if err != nil {
		return nil
	}
	for _, in := range inputs {
		if in == "" || in == "-" {
			continue
		}
		if ist, err := os.Stat(in); err == nil && os.SameFile(ost, ist) {
			return fmt.Errorf("-o %s would overwrite the input file %s", out, in)
		}
	}
	return nil
}

// pkgPrefix matches the package names that library errors start with
// ("structural: ..."), at the start of a message or after a colon.
var pkgPrefix = regexp.MustCompile(`(^|: )(structural|gen|matching|numeric|netread|netwrite|nodetable|design|sweepcsv|plot|render|htmlreport|fileout): `)

// userMessage turns a library error into the line a user reads: one
// line, without the package names, which mean nothing to a user.
func userMessage(msg string) string {
	msg = strings.NewReplacer("\r\n", " ", "\n", " ", "\r", " ").Replace(msg)
	return pkgPrefix.ReplaceAllString(msg, "$1")
}
