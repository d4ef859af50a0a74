package netread

import (
	"math"
	"strconv"

	"github.com/netsteer/netsteer/structural"
)

// graphBuilder assembles a network from a format that declares nodes by
// id and edges between ids (GraphML, node-link JSON): ids are the state
// names. An edge may name a node declared later; one never declared is an
// error at the edge that first names it.
type graphBuilder struct {
	file     string
	b        *structural.Builder
	declared []bool            // by state
	pending  map[int32]mention // undeclared states
	labels   []string
	groups   []string
	weights  bool
}

func newGraphBuilder(file string, opt Options) *graphBuilder {
	return &graphBuilder{file: file, b: structural.NewBuilder(), pending: map[int32]mention{}, weights: opt.Weights}
}

// mention is the first mention of a node not declared (yet).
type mention struct {
	line int
	id   string
}

// nameMsg checks a name read from a file; "" when it is fine.
func nameMsg(name []byte) string {
	switch {
	case len(name) == 0:
		return "empty node id"
	case len(name) > MaxNameBytes:
		return "node id of " + strconv.Itoa(len(name)) + " bytes; the limit is " + strconv.Itoa(MaxNameBytes)
	}
	return controlMsg(name)
}

// intern returns the state of a node id.
func (gb *graphBuilder) intern(id []byte, line int) (int32, error) {
	if msg := nameMsg(id); msg != "" {
		return -1, errorf(gb.file, line, "%s", msg)
	}
	v, err := gb.b.Intern(id)
	if err != nil {
		return -1, errorf(gb.file, line, "%s", trimStructural(err.Error()))
	}
	for int(v) >= len(gb.declared) {
		gb.declared = append(gb.declared, false)
	}
	return v, nil
}

// declare records the declaration of a node.
func (gb *graphBuilder) declare(id []byte, line int) (int32, error) {
	v, err := gb.intern(id, line)
	if err != nil {
		return -1, err
	}
	if gb.declared[v] {
		return -1, errorf(gb.file, line, "node %q declared twice", clip(id))
	}
	gb.declared[v] = true
	delete(gb.pending, v)
	return v, nil
}

// ref returns the state an edge names.
func (gb *graphBuilder) ref(id []byte, line int) (int32, error) {
	v, err := gb.intern(id, line)
	if err != nil {
		return -1, err
	}
	if !gb.declared[v] {
		if _, ok := gb.pending[v]; !ok {
			gb.pending[v] = mention{line, string(id)}
		}
	}
	return v, nil
}

// edge adds u -> v, and v -> u when undirected (once for a self-loop).
func (gb *graphBuilder) edge(u, v int32, w float64, hasW, undirected bool) {
	add := func(a, b int32) {
		if gb.weights && hasW {
			gb.b.AddWeightedEdge(a, b, w)
		} else {
			gb.b.AddEdge(a, b)
		}
	}
	add(u, v)
	if undirected && u != v {
		add(v, u)
	}
}

// checkWeight parses a weight value; "" when fine.
func checkWeight(s string) (float64, string) {
	x, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
		return 0, "weight " + strconv.Quote(clip([]byte(s))) + " is not a finite number"
	}
	if x == 0 {
		return 0, "weight 0 is no coupling; leave the edge out"
	}
	return x, ""
}

// finish checks that every node named by an edge was declared and builds
// the network.
func (gb *graphBuilder) finish(opt Options) (*parsed, error) {
	var first *mention
	for _, m := range gb.pending {
		if first == nil || m.line < first.line || m.line == first.line && m.id < first.id {
			first = &m
		}
	}
	if first != nil {
		return nil, errorf(gb.file, first.line, "edge names node %q, which is never declared", clip([]byte(first.id)))
	}
	g, err := finish(gb.b, gb.file, opt)
	if err != nil {
		return nil, err
	}
	return &parsed{g: g, labels: padded(gb.labels, g.N()), groups: padded(gb.groups, g.N())}, nil
}
