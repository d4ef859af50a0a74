package netread

import (
	"bufio"
	"bytes"
	"io"
	"slices"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/structural"
)

// pajekMaxLine bounds a Pajek line (an *Arcslist line may be long).
const pajekMaxLine = 1 << 20

// readPajek reads a Pajek .net file: "*Vertices N" (then lines "k label
// [x y z ...]"), and sections "*Arcs" ("u v [weight] ..."), "*Edges"
// (two-way), "*Arcslist" ("u v1 v2 ...") and "*Edgeslist". Vertices are
// numbered 1..N. A state is named by its vertex's label (networkx's
// convention; a vertex without a line is named by its number) when these
// names are distinct; otherwise by the numbers, and the labels are
// returned as labels. N is checked against what the file holds before any
// state is made for it.
func readPajek(r *bufio.Reader, file string, opt Options) (*parsed, error) {
	lr := &lineReader{r: r, file: file, max: pajekMaxLine}
	type vlabel struct {
		k     int32
		label string
		line  int
	}
	var (
		n, vline  int64 = -1, 0
		labels    []vlabel
		section   string // "vertices", "arcs", "edges", "arcslist", "edgeslist"
		src, dst  []int32
		ws        []float64
		hasW      []bool
		undirList []bool
		f         [][]byte
	)
	vertex := func(b []byte) (int32, bool) {
		v, err := strconv.ParseInt(string(b), 10, 64)
		if err != nil || v < 1 || v > n {
			return 0, false
		}
		return int32(v), true
	}
	for {
		line, err := lr.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		t := bytes.TrimSpace(line)
		if len(t) == 0 || t[0] == '%' {
			continue
		}
		if t[0] == '*' {
			word := t
			if i := bytes.IndexAny(t, " \t"); i >= 0 {
				word = t[:i]
			}
			switch strings.ToLower(string(word)) {
			case "*network":
				continue
			case "*vertices":
				if n >= 0 {
					return nil, errorf(file, lr.line, "a second *Vertices line; a Pajek file here must hold one network")
				}
				fs := bytes.Fields(t)
				if len(fs) < 2 || len(fs) > 3 {
					return nil, errorf(file, lr.line, "want \"*Vertices N\"")
				}
				v, err := strconv.ParseInt(string(fs[1]), 10, 64)
				if err != nil || v < 0 {
					return nil, errorf(file, lr.line, "*Vertices %q: want a number of vertices", clip(fs[1]))
				}
				if v > structural.MaxStates {
					return nil, errorf(file, lr.line, "%d vertices: more than the %d a network can hold", v, structural.MaxStates)
				}
				n, vline, section = v, int64(lr.line), "vertices"
				continue
			case "*arcs", "*edges", "*arcslist", "*edgeslist":
				if n < 0 {
					return nil, errorf(file, lr.line, "%s before *Vertices", clip(word))
				}
				section = strings.ToLower(string(word[1:]))
				continue
			case "*matrix":
				return nil, errorf(file, lr.line, "*Matrix sections are not supported; write the network as *Arcs")
			case "*partition", "*vector", "*permutation", "*cluster", "*hierarchy":
				return nil, errorf(file, lr.line, "%s: a Pajek %s file, not a network", clip(word), strings.ToLower(string(word[1:])))
			}
			return nil, errorf(file, lr.line, "unknown section %q", clip(word))
		}
		if msg := controlMsg(t); msg != "" && !strings.Contains(msg, "0x09") {
			return nil, errorf(file, lr.line, "%s", strings.Replace(msg, "in a node name", "on the line", 1))
		}
		switch section {
		case "":
			return nil, errorf(file, lr.line, "want *Vertices N first (is this a Pajek file?)")
		case "vertices":
			fs, msg := pajekFields(t, f[:0])
			f = fs
			if msg != "" {
				return nil, errorf(file, lr.line, "%s", msg)
			}
			k, ok := vertex(f[0])
			if !ok {
				return nil, errorf(file, lr.line, "vertex %q is not a number in 1..%d", clip(f[0]), n)
			}
			if len(f) > 1 {
				if len(f[1]) > MaxNameBytes {
					return nil, errorf(file, lr.line, "label of %d bytes; the limit is %d", len(f[1]), MaxNameBytes)
				}
				labels = append(labels, vlabel{k, string(f[1]), lr.line})
			}
		default:
			fs := splitBlank(t, f[:0])
			f = fs
			if len(fs) < 2 {
				return nil, errorf(file, lr.line, "want two vertex numbers, found %q", clip(t))
			}
			u, ok := vertex(fs[0])
			if !ok {
				return nil, errorf(file, lr.line, "vertex %q is not a number in 1..%d", clip(fs[0]), n)
			}
			list := section == "arcslist" || section == "edgeslist"
			undir := section == "edges" || section == "edgeslist"
			targets := fs[1:2]
			if list {
				targets = fs[1:]
			}
			for _, x := range targets {
				v, ok := vertex(x)
				if !ok {
					return nil, errorf(file, lr.line, "vertex %q is not a number in 1..%d", clip(x), n)
				}
				w, has := 0.0, false
				if !list && len(fs) > 2 {
					// A third number is the weight; words after it are
					// drawing attributes.
					if _, err := strconv.ParseFloat(string(fs[2]), 64); err == nil || bytes.ContainsAny(fs[2][:1], "+-.0123456789") {
						var msg string
						if w, msg = checkWeight(string(fs[2])); msg != "" {
							return nil, errorf(file, lr.line, "%s", msg)
						}
						has = true
					}
				}
				src, dst = append(src, u-1), append(dst, v-1)
				undirList = append(undirList, undir)
				if opt.Weights {
					ws, hasW = append(ws, w), append(hasW, has)
				}
			}
		}
	}
	if n < 0 {
		return nil, &Error{File: file, Line: lr.line, Msg: "not a Pajek network: no *Vertices line"}
	}
	if n > maxStatesFor(int64(len(src)+len(labels))) {
		return nil, errorf(file, int(vline), "%d vertices for %d arcs and labels: more than %d, which the file can justify", n, len(src)+len(labels), maxStatesFor(int64(len(src)+len(labels))))
	}
	// Names: the labels (numbers where none) when distinct.
	slices.SortStableFunc(labels, func(a, b vlabel) int { return int(a.k - b.k) })
	for i := 1; i < len(labels); i++ {
		if labels[i].k == labels[i-1].k {
			return nil, errorf(file, labels[i].line, "vertex %d listed twice (first on line %d)", labels[i].k, labels[i-1].line)
		}
	}
	nameOf := func(k int32, j *int) []byte {
		if *j < len(labels) && labels[*j].k == k {
			*j++
			return []byte(labels[*j-1].label)
		}
		return strconv.AppendInt(nil, int64(k), 10)
	}
	byLabel := len(labels) > 0
	if byLabel {
		seen := structural.NewBuilder()
		j := 0
		for k := int32(1); int64(k) <= n; k++ {
			name := nameOf(k, &j)
			if nameMsg(name) != "" {
				byLabel = false
				break
			}
			if v, err := seen.Intern(name); err != nil || int64(v) != int64(k)-1 {
				byLabel = false
				break
			}
		}
	}
	var b *structural.Builder
	var lab []string
	if byLabel {
		b = structural.NewBuilder()
		j := 0
		for k := int32(1); int64(k) <= n; k++ {
			if _, err := b.Intern(nameOf(k, &j)); err != nil {
				return nil, errorf(file, int(vline), "%s", trimStructural(err.Error()))
			}
		}
	} else {
		b = structural.NewBuilder()
		for k := int64(1); k <= n; k++ {
			if _, err := b.InternInt(uint32(k)); err != nil {
				return nil, errorf(file, int(vline), "%s", trimStructural(err.Error()))
			}
		}
		for _, l := range labels {
			if msg := controlMsg(l.label); msg != "" {
				return nil, errorf(file, l.line, "label: %s", strings.Replace(msg, "a node name", "the value", 1))
			}
			setAt(&lab, l.k-1, l.label)
		}
	}
	for i := range src {
		add := func(a, c int32) {
			if opt.Weights && hasW[i] {
				b.AddWeightedEdge(a, c, ws[i])
			} else {
				b.AddEdge(a, c)
			}
		}
		add(src[i], dst[i])
		if undirList[i] && src[i] != dst[i] {
			add(dst[i], src[i])
		}
	}
	g, err := finish(b, file, opt)
	if err != nil {
		return nil, err
	}
	return &parsed{g: g, labels: padded(lab, g.N())}, nil
}

// pajekFields splits a vertex line: the number, then a label that may be
// double-quoted (Pajek has no escapes: the label runs to the next quote),
// then the rest.
func pajekFields(t []byte, f [][]byte) ([][]byte, string) {
	i := 0
	for i < len(t) && !isBlankByte(t[i]) {
		i++
	}
	f = append(f, t[:i])
	for i < len(t) && isBlankByte(t[i]) {
		i++
	}
	if i == len(t) {
		return f, ""
	}
	if t[i] == '"' {
		j := bytes.IndexByte(t[i+1:], '"')
		if j < 0 {
			return nil, "unterminated quoted label"
		}
		return append(f, t[i+1:i+1+j]), ""
	}
	j := i
	for j < len(t) && !isBlankByte(t[j]) {
		j++
	}
	return append(f, t[i:j]), ""
}

// splitBlank splits t at runs of blanks into dst, without allocating once
// dst has grown.
func splitBlank(t []byte, dst [][]byte) [][]byte {
	i := 0
	for {
		for i < len(t) && isBlankByte(t[i]) {
			i++
		}
		if i == len(t) {
			return dst
		}
		j := i
		for j < len(t) && !isBlankByte(t[j]) {
			j++
		}
		dst = append(dst, t[i:j])
		i = j
	}
}
