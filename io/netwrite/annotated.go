package netwrite

import (
	"bufio"
	"encoding/json"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"strconv"

	"github.com/netsteer/netsteer/structural"
)

// Type is the type of an attribute column.
type Type uint8

// The attribute types, named as GraphML names them.
const (
	Bool Type = iota
	Int
	Double
	String
)

func (t Type) graphml() string {
	return [...]string{"boolean", "long", "double", "string"}[t]
}

// Column is one attribute of every node (or every edge, in the order of
// the network's Out().Adj). Only the slice of its Type is used. A value
// equal to the zero value of its type is still written, except for
// strings, where "" means the attribute is absent from that node (edge).
type Column struct {
	Name    string
	Type    Type
	Bools   []bool
	Ints    []int64
	Doubles []float64
	Strings []string
}

// value returns the column's entry i as text, and whether it is present.
func (c *Column) value(i int) (string, bool) {
	switch c.Type {
	case Bool:
		return strconv.FormatBool(c.Bools[i]), true
	case Int:
		return strconv.FormatInt(c.Ints[i], 10), true
	case Double:
		x := c.Doubles[i]
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return "", false
		}
		return strconv.FormatFloat(x, 'g', -1, 64), true
	}
	return c.Strings[i], c.Strings[i] != ""
}

// Attr is one attribute of the whole graph. Value is its text in the
// form of its Type: "true" or "false", a decimal integer, a decimal
// number (as strconv or structural.Cost write them), or any string.
type Attr struct {
	Name  string
	Type  Type
	Value string
}

// StringAttr, BoolAttr and IntAttr return graph attributes of their type.
func StringAttr(name, v string) Attr { return Attr{name, String, v} }

// BoolAttr returns a boolean graph attribute.
func BoolAttr(name string, v bool) Attr { return Attr{name, Bool, strconv.FormatBool(v)} }

// IntAttr returns an integer graph attribute.
func IntAttr(name string, v int) Attr { return Attr{name, Int, strconv.Itoa(v)} }

// Annotated is a network with the answer to a question as node and edge
// attributes, for general-purpose graph tools.
type Annotated struct {
	Net *structural.Network
	// Graph holds attributes of the whole graph (the question, the
	// answer's verdicts and counts), each written with its type.
	Graph []Attr
	Nodes []Column
	Edges []Column
}

// check verifies that every column has one entry per node (edge).
func (a *Annotated) check() error {
	for _, cs := range []struct {
		cols []Column
		n    int
		what string
	}{{a.Nodes, a.Net.N(), "node"}, {a.Edges, a.Net.Edges(), "edge"}} {
		for i := range cs.cols {
			c := &cs.cols[i]
			l := [...]int{len(c.Bools), len(c.Ints), len(c.Doubles), len(c.Strings)}[c.Type]
			if l != cs.n {
				return fmt.Errorf("netwrite: %s attribute %q has %d values for %d %ss", cs.what, c.Name, l, cs.n, cs.what)
			}
		}
	}
	return nil
}

// WriteGraphML writes a as a directed GraphML graph: node ids are the
// states' names, every attribute has its <key> with attr.name and
// attr.type, so that networkx's read_graphml and other readers give back
// the typed values. Edges keep the convention u -> v: u acts on v.
func WriteGraphML(w io.Writer, a *Annotated) error {
	if err := a.check(); err != nil {
		return err
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	bw.WriteString(xml.Header)
	bw.WriteString(`<graphml xmlns="http://graphml.graphdrawing.org/xmlns" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xsi:schemaLocation="http://graphml.graphdrawing.org/xmlns http://graphml.graphdrawing.org/xmlns/1.0/graphml.xsd">` + "\n")
	for i, g := range a.Graph {
		fmt.Fprintf(bw, `  <key id="g%d" for="graph" attr.name="%s" attr.type="%s"/>`+"\n", i, escape(g.Name), g.Type.graphml())
	}
	for i, c := range a.Nodes {
		fmt.Fprintf(bw, `  <key id="n%d" for="node" attr.name="%s" attr.type="%s"/>`+"\n", i, escape(c.Name), c.Type.graphml())
	}
	for i, c := range a.Edges {
		fmt.Fprintf(bw, `  <key id="e%d" for="edge" attr.name="%s" attr.type="%s"/>`+"\n", i, escape(c.Name), c.Type.graphml())
	}
	bw.WriteString(`  <graph id="G" edgedefault="directed">` + "\n")
	for i, g := range a.Graph {
		fmt.Fprintf(bw, `    <data key="g%d">%s</data>`+"\n", i, escape(g.Value))
	}
	g := a.Net
	var name []byte
	for v := int32(0); int(v) < g.N(); v++ {
		name = g.AppendName(name[:0], v)
		fmt.Fprintf(bw, `    <node id="%s">`, escape(string(name)))
		for i := range a.Nodes {
			if s, ok := a.Nodes[i].value(int(v)); ok {
				fmt.Fprintf(bw, `<data key="n%d">%s</data>`, i, escape(s))
			}
		}
		bw.WriteString("</node>\n")
	}
	out := g.Out()
	var to []byte
	for u := int32(0); int(u) < g.N(); u++ {
		name = g.AppendName(name[:0], u)
		for k := out.Ptr[u]; k < out.Ptr[u+1]; k++ {
			to = g.AppendName(to[:0], out.Adj[k])
			fmt.Fprintf(bw, `    <edge source="%s" target="%s">`, escape(string(name)), escape(string(to)))
			for i := range a.Edges {
				if s, ok := a.Edges[i].value(int(k)); ok {
					fmt.Fprintf(bw, `<data key="e%d">%s</data>`, i, escape(s))
				}
			}
			bw.WriteString("</edge>\n")
		}
	}
	bw.WriteString("  </graph>\n</graphml>\n")
	return bw.Flush()
}

// escape writes s for XML text and attributes. Characters XML 1.0 cannot
// hold at all (control characters other than tab, newline and carriage
// return; names never hold them, as the readers refuse them) become U+FFFD.
func escape(s string) string {
	var b []byte
	for _, r := range s {
		switch {
		case r == '&':
			b = append(b, "&amp;"...)
		case r == '<':
			b = append(b, "&lt;"...)
		case r == '>':
			b = append(b, "&gt;"...)
		case r == '"':
			b = append(b, "&quot;"...)
		case r == '\'':
			b = append(b, "&apos;"...)
		case r == '\t' || r == '\n' || r == '\r':
			b = append(b, fmt.Sprintf("&#%d;", r)...)
		case r < 0x20 || r == 0xfffe || r == 0xffff:
			b = append(b, "\uFFFD"...)
		default:
			b = append(b, string(r)...)
		}
	}
	return string(b)
}

// jsonLiteral reports whether v can be written as a JSON value as it is:
// true, false, or a finite number in JSON's syntax (a value that is not,
// such as NaN, is written as a string instead).
func jsonLiteral(v string) bool {
	if v == "true" || v == "false" {
		return true
	}
	f, err := strconv.ParseFloat(v, 64)
	return err == nil && !math.IsInf(f, 0) && json.Valid([]byte(v))
}

// WriteNodeLink writes a as node-link JSON, the form networkx's
// node_link_data writes and node_link_graph reads: {"directed": true,
// "multigraph": false, "graph": {...}, "nodes": [{"id": NAME, attributes},
// ...], "links": [{"source": NAME, "target": NAME, attributes}, ...],
// "edges": [the same]}. The edges are listed under both keys because
// networkx reads "links" by default up to version 3.3 and "edges" from
// 3.6, so that node_link_graph loads the file with its defaults.
func WriteNodeLink(w io.Writer, a *Annotated) error {
	if err := a.check(); err != nil {
		return err
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	bw.WriteString(`{"directed": true, "multigraph": false, "graph": {`)
	for i, g := range a.Graph {
		if i > 0 {
			bw.WriteString(", ")
		}
		bw.Write(structural.AppendJSONString(nil, g.Name))
		bw.WriteString(": ")
		if g.Type == String || !jsonLiteral(g.Value) {
			bw.Write(structural.AppendJSONString(nil, g.Value))
		} else {
			bw.WriteString(g.Value) // true, false or a number
		}
	}
	bw.WriteString("},\n\"nodes\": [")
	g := a.Net
	var buf, name []byte
	for v := int32(0); int(v) < g.N(); v++ {
		if v > 0 {
			bw.WriteByte(',')
		}
		name = g.AppendName(name[:0], v)
		buf = append(buf[:0], "\n{\"id\": "...)
		buf = structural.AppendJSONString(buf, name)
		buf = appendJSONAttrs(buf, a.Nodes, int(v))
		buf = append(buf, '}')
		bw.Write(buf)
	}
	for _, key := range []string{"links", "edges"} {
		bw.WriteString("],\n\"" + key + "\": [")
		writeLinks(bw, a)
	}
	bw.WriteString("]}\n")
	return bw.Flush()
}

func writeLinks(bw *bufio.Writer, a *Annotated) {
	g := a.Net
	var buf, name []byte
	out := g.Out()
	first := true
	for u := int32(0); int(u) < g.N(); u++ {
		name = g.AppendName(name[:0], u)
		for k := out.Ptr[u]; k < out.Ptr[u+1]; k++ {
			if !first {
				bw.WriteByte(',')
			}
			first = false
			buf = append(buf[:0], "\n{\"source\": "...)
			buf = structural.AppendJSONString(buf, name)
			buf = append(buf, ", \"target\": "...)
			buf = structural.AppendJSONString(buf, g.AppendName(nil, out.Adj[k]))
			buf = appendJSONAttrs(buf, a.Edges, int(k))
			buf = append(buf, '}')
			bw.Write(buf)
		}
	}
}

func appendJSONAttrs(b []byte, cols []Column, i int) []byte {
	for c := range cols {
		col := &cols[c]
		s, ok := col.value(i)
		if !ok {
			continue
		}
		b = append(b, ", "...)
		b = structural.AppendJSONString(b, col.Name)
		b = append(b, ": "...)
		if col.Type == String {
			b = structural.AppendJSONString(b, s)
		} else {
			b = append(b, s...)
		}
	}
	return b
}
