package main

import (
	"slices"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/design"
	"github.com/netsteer/netsteer/io/netread"
)

// targetsFlag is --targets FILE, or --table-targets: the states that
// must be steerable.
type targetsFlag struct {
	file  string
	table bool
}

func (f *targetsFlag) register(fs *pflag.FlagSet) {
	fs.StringVar(&f.file, "targets", "", "only these states must be steerable: a file of state names, one or more per line")
	fs.BoolVar(&f.table, "table-targets", false, "only the states the node table marks target=yes must be steerable")
}

// states reads the targets for the network of in (nil without --targets
// or --table-targets).
func (f *targetsFlag) states(e *env, in *input) ([]int32, error) {
	if f.table {
		switch {
		case f.file != "":
			return nil, usagef("give --targets FILE or --table-targets, not both")
		case in.table == nil || !in.table.Has("target"):
			return nil, usagef("--table-targets needs --node-table with a target column")
		}
		out := in.table.Targets(in.g)
		if len(out) == 0 {
			return nil, &netread.Error{File: displayFile(in.table.File), Msg: "no row of the node table says target=yes"}
		}
		return out, nil
	}
	if f.file == "" {
		return nil, nil
	}
	file, err := design.ReadFile(f.file, in.g, design.Options{Stdin: e.Stdin})
	if err != nil {
		return nil, err
	}
	in.record("targets", f.file, file.Size, file.SHA256)
	var out []int32
	for _, s := range file.Signals {
		out = append(out, s.States...)
	}
	slices.Sort(out)
	out = slices.Compact(out)
	if len(out) == 0 {
		return nil, &netread.Error{File: displayFile(f.file), Msg: "no targets in the file"}
	}
	return out, nil
}
