package main

import (
	"errors"
	"fmt"
	"io"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/io/nodetable"
	"github.com/netsteer/netsteer/structural"
)

// netFlags are the options of every command that reads a network.
type netFlags struct {
	format       string
	undirected   bool
	selfDynamics bool
	nodeTable    string

	// table is the node table read by load (nil without --node-table);
	// its states are added to the network. load prints its warnings
	// (unknown columns, listed states in no edge) and, on a terminal, its
	// progress to e.Stderr.
	table *nodetable.Table
	e     *env
}

// register adds the flags to fs; load reports to e.Stderr.
func (f *netFlags) register(fs *pflag.FlagSet, e *env) {
	f.e = e
	fs.Var(formatFlag{&f.format}, "input-format", "network format: edges, mtx or dot (default: from the file extension)")
	fs.BoolVar(&f.undirected, "undirected", false, "read each edge as a two-way coupling")
	fs.BoolVar(&f.selfDynamics, "self-dynamics", false, "give every state a self-loop (its own dynamics)")
	fs.StringVar(&f.nodeTable, "node-table", "", "CSV node table: device costs, allowed and existing devices, groups, labels")
}

// formatFlag is the --input-format value. The name is checked when the flag
// is parsed, so that a wrong one is a usage error (exit status 2, with the
// pointer to --help) even before any file is read.
type formatFlag struct{ s *string }

func (v formatFlag) String() string {
	if v.s == nil {
		return ""
	}
	return *v.s
}

func (v formatFlag) Set(s string) error {
	if s != "" {
		if _, err := netread.ParseFormat(s); err != nil {
			return errors.New(strings.TrimPrefix(err.Error(), "netread: "))
		}
	}
	*v.s = s
	return nil
}

func (v formatFlag) Type() string { return "string" }

// options turns the flags into reader options.
func (f *netFlags) options() (netread.Options, error) {
	var opt netread.Options
	if f.format != "" {
		ff, err := netread.ParseFormat(f.format)
		if err != nil {
			return opt, fmt.Errorf("--input-format: %v", err)
		}
		opt.Format = ff
	}
	opt.Build = structural.BuildOptions{Undirected: f.undirected, SelfDynamics: f.selfDynamics}
	return opt, nil
}

// load reads the network at path and reports how long it took.
func (f *netFlags) load(path string, extra func(*netread.Options) error) (*structural.Network, time.Duration, error) {
	opt, err := f.options()
	if err != nil {
		return nil, 0, err
	}
	if extra != nil {
		if err := extra(&opt); err != nil {
			return nil, 0, err
		}
	}
	if f.nodeTable != "" {
		t, err := nodetable.ReadFile(f.nodeTable, nodetable.Options{Stdin: f.e.Stdin})
		if err != nil {
			return nil, 0, err
		}
		f.table = t
		opt.States = append(opt.States, t.States(false)...)
	}
	opt.Stdin = f.e.Stdin
	start := time.Now()
	f.e.status("reading %s", path)
	in, err := netread.ReadFile(path, opt)
	f.e.status("")
	if err != nil {
		return nil, time.Since(start), err
	}
	g := in.Network
	if f.table != nil {
		if err := f.table.Check(g); err != nil {
			return nil, time.Since(start), err
		}
		for _, m := range append(append([]string(nil), f.table.Warnings...), f.table.Isolated(g)...) {
			fmt.Fprintln(f.e.Stderr, "netsteer: warning: "+m)
		}
	}
	return g, time.Since(start), err
}

// outFlags select the output format and file.
type outFlags struct {
	format string
	output string
}

func (f *outFlags) register(fs *pflag.FlagSet) {
	fs.StringVar(&f.format, "format", "text", "output format: text, json or csv")
	fs.StringVarP(&f.output, "output", "o", "-", "write the result to this file (- for standard output)")
}

func (f *outFlags) check() error {
	switch f.format {
	case "text", "json", "csv":
		return nil
	}
	return fmt.Errorf("--format %q: want text, json or csv", f.format)
}

// formatted is a command result that can print itself in each format.
type formatted interface {
	writeText(w io.Writer) error
	writeJSON(w io.Writer) error
	writeCSV(w io.Writer) error
}

// write prints r in the chosen format to the chosen output, through
// fileout (temporary file and rename).
func (f *outFlags) write(e *env, r formatted) error {
	return fileout.Write(f.output, e.Stdout, func(w io.Writer) error {
		switch f.format {
		case "json":
			return r.writeJSON(w)
		case "csv":
			return r.writeCSV(w)
		}
		return r.writeText(w)
	})
}
