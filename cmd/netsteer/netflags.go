package main

import (
	"errors"
	"fmt"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/design"
	"github.com/netsteer/netsteer/io/fileout"
	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/io/nodetable"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/numeric"
	"github.com/netsteer/netsteer/structural/sweep"
)

// netFlags are the options of every command that reads a network.
type netFlags struct {
	e            *env
	format       string
	undirected   bool
	selfDynamics bool
	nodeTable    string
}

func (f *netFlags) register(e *env, fs *pflag.FlagSet) {
	f.e = e
	fs.Var(formatFlag{&f.format}, "input-format", "network format: edges, mtx or dot (default: by content, then extension)")
	fs.BoolVar(&f.undirected, "undirected", false, "read each edge as a two-way coupling")
	fs.BoolVar(&f.selfDynamics, "self-dynamics", false, "give every state a self-loop (its own dynamics)")
	fs.StringVar(&f.nodeTable, "node-table", "", "CSV node table: device costs, allowed and existing devices, groups, labels")
}

// formatFlag is --input-format, checked when parsed so that a wrong name is
// a usage error before any file is read.
type formatFlag struct{ s *string }

func (v formatFlag) String() string {
	if v.s == nil {
		return ""
	}
	return *v.s
}

func (v formatFlag) Set(s string) error {
	if _, err := netread.ParseFormat(s); err != nil {
		names := make([]string, len(netread.Formats))
		for i, f := range netread.Formats {
			names[i] = string(f)
		}
		return fmt.Errorf("unknown format %q (want %s)", s, strings.Join(names, ", "))
	}
	*v.s = s
	return nil
}

func (v formatFlag) Type() string { return "string" }

// input is a network read for a command, with its node table.
type input struct {
	path  string
	g     *structural.Network
	table *nodetable.Table // nil without --node-table
	readT time.Duration
}

// load reads the network at path (and the node table), refusing an output
// that would overwrite any file the command reads. extra lists the other
// files the command reads (designs); out is the -o path.
func (f *netFlags) load(path, out string, weights bool, extra ...string) (*input, error) {
	reads := append([]string{path, f.nodeTable}, extra...)
	stdin := 0
	for _, p := range reads {
		if p == "-" {
			stdin++
		}
	}
	if stdin > 1 {
		return nil, usagef("only one of the files read can be standard input (-)")
	}
	if err := fileout.NotAnInput(out, reads...); err != nil {
		return nil, usagef("%v", describe(err))
	}
	opt := netread.Options{Weights: weights, Build: structural.BuildOptions{Undirected: f.undirected, SelfDynamics: f.selfDynamics}}
	if f.format != "" {
		opt.Format, _ = netread.ParseFormat(f.format)
	}
	in := &input{path: path}
	if f.nodeTable != "" {
		t, err := f.readTable()
		if err != nil {
			return nil, err
		}
		in.table = t
		opt.States = t.Names()
	}
	start := time.Now()
	f.e.status("reading %s", displayFile(path))
	var err error
	if path == "-" {
		in.g, err = netread.Read(f.e.Stdin, "stdin", opt)
	} else {
		in.g, err = netread.ReadFile(path, opt)
	}
	f.e.status("")
	if err != nil {
		return nil, err
	}
	in.readT = time.Since(start)
	if in.table != nil {
		for _, m := range append(append([]string(nil), in.table.Warnings...), in.table.Isolated(in.g)...) {
			f.e.warn("%s", m)
		}
	}
	return in, nil
}

func (f *netFlags) readTable() (*nodetable.Table, error) {
	if f.nodeTable == "-" {
		return nodetable.Read(f.e.Stdin, "stdin")
	}
	return nodetable.ReadFile(f.nodeTable)
}

// devices returns the device facts of the node table for property p (zero
// Devices without a table: unit costs, every state allowed).
func (in *input) devices(p structural.Property) structural.Devices {
	if in.table == nil {
		return structural.Devices{}
	}
	if p == structural.Observability {
		return in.table.Sensors(in.g)
	}
	return in.table.Actuators(in.g)
}

// design reads a design file for the network; an empty one is an error,
// as it is most likely the wrong file.
func (in *input) design(e *env, path string, p structural.Property) (*structural.Design, []design.Signal, error) {
	return in.readDesign(e, path, p, false)
}

func (in *input) readDesign(e *env, path string, p structural.Property, weights bool) (*structural.Design, []design.Signal, error) {
	var sigs []design.Signal
	var err error
	if path == "-" {
		sigs, err = design.Read(e.Stdin, "stdin", in.g, weights)
	} else {
		sigs, err = design.ReadFile(path, in.g, weights)
	}
	if err != nil {
		return nil, nil, err
	}
	if len(sigs) == 0 {
		what := "inputs"
		if p == structural.Observability {
			what = "outputs"
		}
		return nil, nil, &netread.Error{File: displayFile(path), Msg: "no " + what + " in the file"}
	}
	d, err := design.Design(in.g, sigs)
	if err != nil {
		return nil, nil, err
	}
	return &d, sigs, nil
}

// displayFile names an input file in a text report ("-" is standard input).
func displayFile(path string) string {
	if path == "-" {
		return "standard input"
	}
	return path
}

// messager is a library error that gives its text without the package
// name.
type messager interface{ Message() string }

// describe words an error for a user: reader errors are already
// "FILE:LINE: message"; typed library errors are put in plain words.
func describe(err error) string {
	var ne *netread.Error
	var te *structural.TooLargeError
	var se *structural.StateError
	var ie *fileout.InputError
	var sd *sweep.SeedError
	var sz *sweep.SizeError
	switch {
	case errors.As(err, &sz):
		return fmt.Sprintf("the sweep has %.3g rows, more than %d (about %.3g core-hours); sweep fewer values or replicates", sz.Rows, sz.Max, sz.Seconds/3600)
	case errors.As(err, &sd):
		return fmt.Sprintf("%s holds row %s computed with another --seed (%d, not %d); choose another output file", sd.File, sd.Row, sd.Have, sd.Want)
	case errors.As(err, &ie):
		return fmt.Sprintf("-o %s would overwrite %s, which this command reads", ie.Output, ie.Input)
	case errors.As(err, &ne):
		return ne.Error()
	case errors.As(err, &te):
		return fmt.Sprintf("%s supports at most %d states; the network has %d", te.What, te.Limit, te.States)
	case errors.As(err, &se):
		return fmt.Sprintf("state %q: %s", se.State, se.Msg)
	case errors.Is(err, numeric.ErrPartWithoutSignals):
		return "no input or output acts on the chosen part of the network"
	case errors.Is(err, structural.ErrForeignDesign):
		return "the design was read for another network"
	}
	var m messager
	if errors.As(err, &m) {
		return m.Message()
	}
	return strings.TrimSpace(err.Error())
}
