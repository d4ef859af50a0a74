package design

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/io/internal/source"
	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/structural"
)

// Signal is one independent input or output.
type Signal struct {
	// States are the states the signal drives (or senses), in file order,
	// without repeats.
	States []int32
	// Weights, when the file was read with weights, holds the value of each
	// state's entry (1 where none was given); nil otherwise.
	Weights []float64
	// Line is the 1-based line of the file the signal came from.
	Line int
}

// Options control reading.
type Options struct {
	// Weights reads values written name:value (the entries of B or C).
	Weights bool
	// Stdin is what the path "-" reads; nil means os.Stdin.
	Stdin io.Reader
}

// File is a design file as read.
type File struct {
	Signals []Signal
	// SHA256 and Size describe the bytes read (the whole file on
	// success), so that a report can certify the design it judged.
	SHA256 [32]byte
	Size   int64
}

// MaxLineBytes bounds a line of a design file (one signal may drive many
// states).
const MaxLineBytes = 1 << 24

// ReadFile reads a design file for network g; "-" reads opt.Stdin.
func ReadFile(path string, g *structural.Network, opt Options) (*File, error) {
	f, name, err := netread.Open(path, opt.Stdin, "design file")
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return Read(f, name, g, opt)
}

// Read reads a design for g from r; file names r in error messages.
func Read(r io.Reader, file string, g *structural.Network, opt Options) (*File, error) {
	d := source.NewDigest(r)
	sigs, err := read(d, file, g, opt.Weights)
	if err != nil {
		return nil, err
	}
	if err := d.Drain(); err != nil {
		return nil, &netread.Error{File: file, Msg: err.Error(), Err: err}
	}
	return &File{Signals: sigs, SHA256: d.Sum(), Size: d.Size()}, nil
}

func read(r io.Reader, file string, g *structural.Network, weights bool) ([]Signal, error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 64<<10), MaxLineBytes)
	var out []Signal
	line := 0
	seen := map[int32]int{} // state -> index of the last signal naming it
	for sc.Scan() {
		line++
		text := sc.Bytes()
		if line == 1 {
			// A byte-order mark, as some editors write, is not part of
			// the first name.
			text = bytes.TrimPrefix(text, []byte("\xef\xbb\xbf"))
		}
		fields, msg := netread.SplitFields(text)
		if msg != "" {
			return nil, &netread.Error{File: file, Line: line, Msg: msg}
		}
		if len(fields) == 0 {
			continue
		}
		s := Signal{Line: line}
		if weights {
			s.Weights = []float64{}
		}
		for _, f := range fields {
			name, w := f, 1.0
			if weights {
				if k := strings.LastIndexByte(f, ':'); k > 0 {
					if _, ok := g.Lookup(f); !ok {
						v, err := strconv.ParseFloat(f[k+1:], 64)
						if err != nil || math.IsNaN(v) || math.IsInf(v, 0) || v == 0 {
							return nil, &netread.Error{File: file, Line: line, Msg: fmt.Sprintf("weight in %q is not a finite nonzero number", netread.Clip(f))}
						}
						name, w = f[:k], v
					}
				}
			}
			id, ok := g.Lookup(name)
			if !ok {
				msg := fmt.Sprintf("no state named %q in the network", netread.Clip(name))
				if k := strings.LastIndexByte(name, ':'); !weights && k > 0 {
					if _, ok := g.Lookup(name[:k]); ok {
						msg += fmt.Sprintf(" (%q is a state: values written name:value are read only when weights are read)", netread.Clip(name[:k]))
					}
				}
				return nil, &netread.Error{File: file, Line: line, Msg: msg}
			}
			if k, dup := seen[id]; dup && k == len(out) {
				return nil, &netread.Error{File: file, Line: line, Msg: fmt.Sprintf("state %q named twice on one line", netread.Clip(name))}
			}
			seen[id] = len(out)
			s.States = append(s.States, id)
			if weights {
				s.Weights = append(s.Weights, w)
			}
		}
		out = append(out, s)
	}
	if err := sc.Err(); err != nil {
		msg := err.Error()
		if errors.Is(err, bufio.ErrTooLong) {
			msg = "line longer than 16 MiB"
		}
		return nil, &netread.Error{File: file, Line: line + 1, Msg: msg, Err: err}
	}
	return out, nil
}

// States returns the state lists of signals, the form the structural
// package takes.
func States(signals []Signal) [][]int32 {
	out := make([][]int32, len(signals))
	for i, s := range signals {
		out[i] = s.States
	}
	return out
}
