package main

import (
	"encoding/hex"
	"errors"
	"fmt"
	"strconv"
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
	e             *env
	format        string
	undirected    bool
	selfDynamics  bool
	nodeTable     string
	columns       string
	separator     string
	weightKey     string
	maxInflate    string
	allowIsolated bool
}

func (f *netFlags) register(e *env, fs *pflag.FlagSet) {
	f.e = e
	fs.Var(formatFlag{&f.format}, "input-format", "network format: "+formatNames()+" (default: by content, then extension)")
	fs.BoolVar(&f.undirected, "undirected", false, "read each edge as a two-way coupling")
	fs.BoolVar(&f.selfDynamics, "self-dynamics", false, "give every state a self-loop (its own dynamics)")
	fs.StringVar(&f.nodeTable, "node-table", "", "CSV node table: device costs, allowed and existing devices, groups, labels")
	fs.StringVar(&f.columns, "columns", "", "read a table: SOURCE,TARGET[,WEIGHT] by header name, or 1-based positions (no header)")
	fs.StringVar(&f.separator, "separator", "", "table separator: comma, tab, semicolon, whitespace or auto (default auto)")
	fs.StringVar(&f.weightKey, "weight-key", "", "GraphML, GML or JSON edge attribute holding the weight (default weight)")
	fs.StringVar(&f.maxInflate, "max-inflate", "", "largest gzip expansion ratio accepted (default 100 beyond 256 MiB; none: no bound)")
	fs.BoolVar(&f.allowIsolated, "allow-isolated", false, "accept node-table rows in no edge as isolated states (each needs its own device)")
}

func formatNames() string {
	names := make([]string, len(netread.Formats))
	for i, f := range netread.Formats {
		names[i] = string(f)
	}
	return strings.Join(names, ", ")
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
		return fmt.Errorf("unknown format %q (want %s)", s, formatNames())
	}
	*v.s = s
	return nil
}

func (v formatFlag) Type() string { return "string" }

// input is a network read for a command, with its node table and the
// digests of the files read.
type input struct {
	path   string
	g      *structural.Network
	read   *netread.Input
	table  *nodetable.Table // nil without --node-table
	readT  time.Duration
	digest map[string][32]byte // SHA-256 of each file read, by path
	files  []inputFile         // every file read, in the order read
}

// inputFile records one file read: what it was for, its name, and the
// size and SHA-256 of the bytes read (before decompression).
type inputFile struct {
	Role, Name string
	Size       int64
	SHA256     string
}

func (in *input) record(role, path string, size int64, sum [32]byte) {
	in.digest[path] = sum
	in.files = append(in.files, inputFile{Role: role, Name: displayFile(path), Size: size, SHA256: hex.EncodeToString(sum[:])})
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
	if in := fileout.SameFile(out, reads...); in != "" {
		return nil, usagef("-o %s would overwrite %s, which this command reads", out, in)
	}
	opt := netread.Options{Weights: weights, Stdin: f.e.Stdin, WeightKey: f.weightKey,
		Build: structural.BuildOptions{Undirected: f.undirected, SelfDynamics: f.selfDynamics}}
	if f.format != "" {
		opt.Format, _ = netread.ParseFormat(f.format)
	}
	if f.columns != "" {
		c, err := netread.ParseColumns(f.columns)
		if err != nil {
			return nil, usagef("--columns: %s", describe(err))
		}
		opt.Columns = c
	}
	if f.separator != "" {
		sep, err := netread.ParseSeparator(f.separator)
		if err != nil {
			return nil, usagef("--separator: %s", describe(err))
		}
		opt.Separator = sep
	}
	switch f.maxInflate {
	case "":
	case "none":
		opt.MaxInflateRatio = -1
	default:
		r, err := strconv.ParseFloat(f.maxInflate, 64)
		if err != nil || !(r >= 1) {
			return nil, usagef("--max-inflate %q: want a ratio of at least 1, or none", f.maxInflate)
		}
		opt.MaxInflateRatio = r
	}
	in := &input{path: path, digest: map[string][32]byte{}}
	// The node table is read while the network is (its isolated states
	// join the network at the end); its errors come first, as the table
	// is named first.
	var table chan struct{}
	var tableErr error
	if f.nodeTable != "" {
		table = make(chan struct{})
		go func() {
			defer close(table)
			in.table, tableErr = nodetable.ReadFile(f.nodeTable, nodetable.Options{Stdin: f.e.Stdin})
		}()
		opt.StatesFrom = func() ([]string, error) {
			if <-table; tableErr != nil {
				return nil, tableErr
			}
			return in.table.States(f.allowIsolated), nil
		}
	}
	start := time.Now()
	f.e.status("reading %s", displayFile(path))
	r, err := netread.ReadFile(path, opt)
	f.e.status("")
	if table != nil {
		if <-table; tableErr != nil {
			return nil, tableErr
		}
	}
	if err != nil {
		return nil, err
	}
	in.read, in.g, in.readT = r, r.Network, time.Since(start)
	in.record("network", path, r.Size, r.SHA256)
	if in.table != nil {
		in.record("node table", f.nodeTable, in.table.Size, in.table.SHA256)
	}
	if in.table != nil {
		if err := in.table.Check(in.g); err != nil {
			return nil, err
		}
		for _, m := range append(append([]string(nil), in.table.Warnings...), in.table.Isolated(in.g)...) {
			f.e.warn("%s", m)
		}
	}
	return in, nil
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
	file, err := design.ReadFile(path, in.g, design.Options{Weights: weights, Stdin: e.Stdin})
	if err != nil {
		return nil, nil, err
	}
	in.record(map[bool]string{true: "inputs", false: "outputs"}[p == structural.Controllability], path, file.Size, file.SHA256)
	sigs := file.Signals
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
	var sd *sweep.SeedError
	var sz *sweep.SizeError
	var mx *sweep.MixedSeedsError
	switch {
	case errors.As(err, &mx):
		if mx.FileA == mx.FileB {
			return fmt.Sprintf("%s holds rows of sweeps with different --seed (%d and %d)", mx.FileA, mx.SeedA, mx.SeedB)
		}
		return fmt.Sprintf("%s and %s come from sweeps with different --seed (%d and %d): merge the shards of one sweep", mx.FileA, mx.FileB, mx.SeedA, mx.SeedB)
	case errors.As(err, &sz):
		return fmt.Sprintf("the sweep has %.3g rows, more than %d (about %.3g core-hours); sweep fewer values or replicates", sz.Rows, sz.Max, sz.Seconds/3600)
	case errors.As(err, &sd):
		return fmt.Sprintf("%s holds row %s computed with another --seed (%d, not %d); choose another output file", sd.File, sd.Row, sd.Have, sd.Want)
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

// labelsGroups returns each state's label and group (nodetable
// Table.Labels): the network file's, overridden by the node table's.
func (in *input) labelsGroups() (labels, groups []string) {
	return in.table.Labels(in.g, in.read.Labels, in.read.Groups)
}
