package main

import (
	"slices"

	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/design"
	"github.com/netsteer/netsteer/io/netread"
)

// targetsFlag is --targets FILE: the states that must be steerable.
type targetsFlag struct{ file string }

func (f *targetsFlag) register(fs *pflag.FlagSet) {
	fs.StringVar(&f.file, "targets", "", "only these states must be steerable: a file of state names, one or more per line")
}

// states reads the targets for the network of in (nil without --targets).
func (f *targetsFlag) states(e *env, in *input) ([]int32, error) {
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
