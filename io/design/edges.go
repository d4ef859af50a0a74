package design

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"

	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/structural"
)

// ReadEdgesFile reads a list of edges of g, "u v" per line (as an edge
// list: white space or commas, quoted names, # and % comments); "-" is
// not accepted (the network or a design may be reading standard input).
func ReadEdgesFile(path string, g *structural.Network) ([]structural.Edge, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, &netread.Error{File: path, Msg: err.Error()}
	}
	defer f.Close()
	return ReadEdges(f, path, g)
}

// ReadEdges reads a list of edges of g from r; every line names an edge of
// g, or the error says which line does not.
func ReadEdges(r io.Reader, file string, g *structural.Network) ([]structural.Edge, error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 64<<10), 1<<20)
	var out []structural.Edge
	line := 0
	for sc.Scan() {
		line++
		text := sc.Bytes()
		if line == 1 {
			text = bytes.TrimPrefix(text, []byte("\xef\xbb\xbf"))
		}
		fields, msg := netread.SplitFields(text)
		if msg != "" {
			return nil, &netread.Error{File: file, Line: line, Msg: msg}
		}
		if len(fields) == 0 {
			continue
		}
		if len(fields) != 2 {
			return nil, &netread.Error{File: file, Line: line, Msg: fmt.Sprintf("want an edge \"u v\", got %d names", len(fields))}
		}
		var ids [2]int32
		for i, name := range fields {
			v, ok := g.Lookup(name)
			if !ok {
				return nil, &netread.Error{File: file, Line: line, Msg: fmt.Sprintf("no state named %q in the network", clip(name))}
			}
			ids[i] = v
		}
		if !g.HasEdge(ids[0], ids[1]) {
			return nil, &netread.Error{File: file, Line: line, Msg: fmt.Sprintf("%s -> %s is not an edge of the network", clip(fields[0]), clip(fields[1]))}
		}
		out = append(out, structural.Edge{From: ids[0], To: ids[1]})
	}
	if err := sc.Err(); err != nil {
		msg := err.Error()
		if errors.Is(err, bufio.ErrTooLong) {
			msg = "line longer than 1 MiB"
		}
		return nil, &netread.Error{File: file, Line: line + 1, Msg: msg}
	}
	return out, nil
}

// clip shortens a name echoed in a message.
func clip(s string) string {
	if len(s) > 80 {
		return s[:77] + "..."
	}
	return s
}
