package main

import (
	"errors"
	"fmt"
	"io"
	"sort"
	"strings"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/structural"
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
	// Width is the width text reports wrap to: the terminal's, or 100.
	Width int
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

// warn prints a warning line on standard error.
func (e *env) warn(format string, args ...any) {
	fmt.Fprintf(e.Stderr, "netsteer: warning: "+format+"\n", args...)
}

// command is one subcommand. Each lives in its own file and registers itself
// from an init function.
type command struct {
	name    string
	summary string // one line for the command list
	usage   string // full help: synopsis, description, example
	// flags registers the command's options on fs and returns the function
	// that runs it with the remaining arguments. A run returns nil when the
	// answer is yes, errNo when the answer (already written) is no, and any
	// other error to be reported.
	flags func(e *env, fs *pflag.FlagSet) func(args []string) error
}

var commands = map[string]*command{}

func register(c *command) {
	if _, dup := commands[c.name]; dup {
		panic("netsteer: command registered twice: " + c.name)
	}
	commands[c.name] = c
}

// errNo reports that the command wrote its answer and the answer is no.
var errNo = errors.New("the answer is no")

// usageErr is a problem with the command line; it is printed with a pointer
// to the command's help.
type usageErr struct{ msg string }

func (u *usageErr) Error() string { return u.msg }

func usagef(format string, args ...any) error {
	return &usageErr{fmt.Sprintf(format, args...)}
}

const topUsage = `netsteer: structural controllability of large networks.

Usage: netsteer COMMAND [options] ...

An edge "u v" in a network file means u acts on v (A[v][u] != 0).

Commands:
%s
Run "netsteer help COMMAND" or "netsteer COMMAND --help" for details, and
"netsteer help formats" for the network file formats.

Structural results hold for almost all parameter values. They are a
screening step: they do not replace dynamic studies, safety analysis,
local codes or licensed engineering review.
`

func listCommands() string {
	names := make([]string, 0, len(commands))
	for n := range commands {
		if !strings.Contains(n, " ") {
			names = append(names, n)
		}
	}
	sort.Strings(names)
	var b strings.Builder
	for _, n := range names {
		fmt.Fprintf(&b, "  %-10s %s\n", n, commands[n].summary)
	}
	return b.String()
}

// run dispatches args and returns the exit status: the one place where
// errors and answers become statuses.
func run(e *env, args []string) int {
	if e.Width <= 0 {
		e.Width = 100
	}
	if len(args) == 0 {
		fmt.Fprintf(e.Stderr, topUsage, listCommands())
		return exitError
	}
	name := args[0]
	switch name {
	case "help", "-h", "--help":
		if len(args) > 1 && topics[args[1]] != "" {
			fmt.Fprint(e.Stdout, topics[args[1]])
			return exitOK
		}
		if len(args) > 1 {
			if _, ok := commands[args[1]]; !ok {
				fmt.Fprintf(e.Stderr, "netsteer: unknown command %q\n", args[1])
				return exitError
			}
			return run(e, []string{args[1], "--help"})
		}
		fmt.Fprintf(e.Stdout, topUsage, listCommands())
		return exitOK
	case "version", "--version":
		fmt.Fprintln(e.Stdout, "netsteer", version())
		return exitOK
	}
	if len(args) > 1 {
		if sub, ok := commands[name+" "+args[1]]; ok {
			name, args = sub.name, args[1:]
		}
	}
	c, ok := commands[name]
	if !ok {
		fmt.Fprintf(e.Stderr, "netsteer: unknown command %q; run \"netsteer help\"\n", name)
		return exitError
	}
	fs := pflag.NewFlagSet(name, pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.SortFlags = false
	help := fs.BoolP("help", "h", false, "show this help")
	runFn := c.flags(e, fs)
	err := parseOnce(fs, args[1:])
	if *help || errors.Is(err, pflag.ErrHelp) {
		fmt.Fprint(e.Stdout, c.usage)
		fmt.Fprintf(e.Stdout, "\nOptions:\n%s", fs.FlagUsages())
		return exitOK
	}
	if err == nil {
		err = runFn(fs.Args())
	} else {
		err = &usageErr{err.Error()}
	}
	e.status("")
	var u *usageErr
	switch {
	case err == nil:
		return exitOK
	case errors.Is(err, errNo):
		return exitNo
	case errors.As(err, &u):
		fmt.Fprintf(e.Stderr, "netsteer %s: %s (see netsteer %s --help)\n", c.name, oneLine(u.msg), c.name)
	default:
		fmt.Fprintln(e.Stderr, "netsteer: "+oneLine(describe(err)))
	}
	return exitError
}

// parseOnce parses args into fs, refusing an option that takes one value
// given twice: pflag would keep the last silently. Repeatable options
// (lists such as --transform) are left alone.
func parseOnce(fs *pflag.FlagSet, args []string) error {
	var rep error
	orig := map[*pflag.Flag]pflag.Value{}
	fs.VisitAll(func(f *pflag.Flag) {
		if _, many := f.Value.(pflag.SliceValue); many || f.Value.Type() == "count" {
			return
		}
		orig[f] = f.Value
		f.Value = &onceValue{Value: f.Value, flag: f, rep: &rep}
	})
	err := fs.Parse(args)
	for f, v := range orig {
		f.Value = v // the help shows the options as registered
	}
	if rep != nil {
		return rep
	}
	return err
}

// onceValue wraps the value of a single-value option and records a
// second setting.
type onceValue struct {
	pflag.Value
	flag  *pflag.Flag
	first string
	set   bool
	rep   *error
}

func (o *onceValue) Set(s string) error {
	if o.set {
		name := "--" + o.flag.Name
		if o.flag.Shorthand != "" {
			name = "-" + o.flag.Shorthand + "/" + name
		}
		if o.IsBoolFlag() {
			*o.rep = usagef("%s given twice", name)
		} else {
			*o.rep = usagef("%s given twice (%q, then %q): it takes one value", name, o.first, s)
		}
		return *o.rep
	}
	o.set, o.first = true, s
	return o.Value.Set(s)
}

// IsBoolFlag keeps a boolean option boolean.
func (o *onceValue) IsBoolFlag() bool {
	b, ok := o.Value.(interface{ IsBoolFlag() bool })
	return ok && b.IsBoolFlag()
}

// oneLine keeps a message on one line.
func oneLine(msg string) string {
	return strings.NewReplacer("\r\n", " ", "\n", " ", "\r", " ").Replace(msg)
}

// oneArg checks that exactly one network file is given.
func oneArg(args []string) (string, error) {
	if len(args) != 1 {
		return "", usagef("want one network file, got %d arguments", len(args))
	}
	return args[0], nil
}

// stateList looks up the comma-separated state names a flag gives; a list
// naming no state is a usage error.
func stateList(g *structural.Network, flag, list, path string) ([]int32, error) {
	var vs []int32
	for _, name := range strings.Split(list, ",") {
		if name = strings.TrimSpace(name); name == "" {
			continue
		}
		v, ok := g.Lookup(name)
		if !ok {
			return nil, usagef("%s: no state named %q in %s", flag, name, displayFile(path))
		}
		vs = append(vs, v)
	}
	if len(vs) == 0 {
		return nil, usagef("%s %q names no state: give comma-separated state names", flag, list)
	}
	return vs, nil
}

func sprintf(format string, args ...any) string { return fmt.Sprintf(format, args...) }

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

func capital(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// topics are help texts that are not commands.
var topics = map[string]string{"formats": formatsHelp}
