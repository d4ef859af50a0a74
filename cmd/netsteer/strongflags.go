package main

import (
	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/design"
	"github.com/netsteer/netsteer/structural/strong"
)

// strongFlags ask for strong structural controllability (for every
// parameter value) and state the class of systems.
type strongFlags struct {
	on        bool
	diagonal  string
	mayBeZero string
}

func (s *strongFlags) register(fs *pflag.FlagSet, what string) {
	fs.BoolVar(&s.on, "strong", false, what)
	fs.StringVar(&s.diagonal, "diagonal", "free", "with --strong, an unlisted self-dynamics is free (may be zero or not), zero or nonzero")
	fs.StringVar(&s.mayBeZero, "may-be-zero", "", `with --strong, a file of edges "u v" whose coupling may be zero`)
}

// check validates the flags before anything is read.
func (s *strongFlags) check() error {
	if !s.on && (s.mayBeZero != "" || s.diagonal != "free") {
		return usagef("--diagonal and --may-be-zero go with --strong")
	}
	if _, err := strong.ParseDiagonal(s.diagonal); err != nil {
		return usagef("--diagonal %q: want free, zero or nonzero", s.diagonal)
	}
	return nil
}

// class returns the class of systems for the network of in, nil without
// --strong.
func (s *strongFlags) class(in *input) (*strong.Class, error) {
	if !s.on {
		return nil, nil
	}
	d, _ := strong.ParseDiagonal(s.diagonal)
	c := &strong.Class{Diagonal: d}
	if s.mayBeZero != "" {
		edges, err := design.ReadEdgesFile(s.mayBeZero, in.g)
		if err != nil {
			return nil, err
		}
		if c.MayBeZero, err = strong.Marks(in.g, edges); err != nil {
			return nil, err
		}
	}
	return c, nil
}
