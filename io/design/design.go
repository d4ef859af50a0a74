package design

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"

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

// ReadFile reads a design file for network g; "-" reads standard input.
func ReadFile(path string, g *structural.Network, weights bool) ([]Signal, error) {
	if path == "-" {
		return Read(os.Stdin, "stdin", g, weights)
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, &netread.Error{File: path, Msg: strings.TrimPrefix(err.Error(), "open "+path+": ")}
	}
	defer f.Close()
	if st, err := f.Stat(); err == nil && st.IsDir() {
		return nil, &netread.Error{File: path, Msg: "is a directory, not a design file"}
	}
	return Read(f, path, g, weights)
}

// Read reads a design for g from r; file names r in error messages.
func Read(r io.Reader, file string, g *structural.Network, weights bool) ([]Signal, error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 64<<10), 1<<24)
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
							return nil, &netread.Error{File: file, Line: line, Msg: fmt.Sprintf("weight in %q is not a finite nonzero number", f)}
						}
						name, w = f[:k], v
					}
				}
			}
			id, ok := g.Lookup(name)
			if !ok {
				msg := fmt.Sprintf("no state named %q in the network", name)
				if k := strings.LastIndexByte(name, ':'); !weights && k > 0 {
					if _, ok := g.Lookup(name[:k]); ok {
						msg += fmt.Sprintf(" (%q is a state: values written name:value are read only with weights, verify --weights)", name[:k])
					}
				}
				return nil, &netread.Error{File: file, Line: line, Msg: msg}
			}
			if k, dup := seen[id]; dup && k == len(out) {
				return nil, &netread.Error{File: file, Line: line, Msg: fmt.Sprintf("state %q named twice on one line", name)}
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
		return nil, &netread.Error{File: file, Line: line + 1, Msg: msg}
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
