package design

import (
	"bufio"
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
		fields, msg := netread.SplitFields(sc.Bytes())
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
				return nil, &netread.Error{File: file, Line: line, Msg: fmt.Sprintf("no state named %q in the network", name)}
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
		return nil, &netread.Error{File: file, Line: line + 1, Msg: err.Error()}
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
