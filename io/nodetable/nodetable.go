package nodetable

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

	"github.com/netsteer/netsteer/io/netread"
	"github.com/netsteer/netsteer/structural"
)

// CostScale is the number of cost units per 1 in a node table: costs are
// held in thousandths.
const CostScale = 1000

// maxCost is the largest cost accepted, in table units.
const maxCost = 1_000_000_000

// Row is one state of a node table.
type Row struct {
	Node string
	// Line is the 1-based line of the file the row starts on.
	Line int
	// ActuatorCost and SensorCost are in CostScale units.
	ActuatorCost, SensorCost int64
	CanActuate, HasActuator  bool
	CanSense, HasSensor      bool
	Group, Label             string
}

// Table is a node table.
type Table struct {
	// File names the table in messages.
	File string
	// Rows are in file order.
	Rows []Row
	// Warnings are "FILE:LINE: message" lines about the file itself
	// (unknown columns).
	Warnings []string

	columns map[string]bool
	index   map[string]int
}

// The columns a table may have.
const (
	colNode         = "node"
	colActuatorCost = "actuator_cost"
	colCanActuate   = "can_actuate"
	colHasActuator  = "has_actuator"
	colSensorCost   = "sensor_cost"
	colCanSense     = "can_sense"
	colHasSensor    = "has_sensor"
	colGroup        = "group"
	colLabel        = "label"
)

var knownColumns = []string{colNode, colActuatorCost, colCanActuate, colHasActuator,
	colSensorCost, colCanSense, colHasSensor, colGroup, colLabel}

// ReadFile reads the node table in path; "-" reads standard input.
func ReadFile(path string) (*Table, error) {
	if path == "-" {
		return Read(os.Stdin, "stdin")
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, &netread.Error{File: path, Msg: strings.TrimPrefix(err.Error(), "open "+path+": ")}
	}
	defer f.Close()
	return Read(f, path)
}

// Read reads a node table from r; file names r in messages.
func Read(r io.Reader, file string) (*Table, error) {
	br := bufio.NewReaderSize(r, 1<<16)
	if bom, _ := br.Peek(3); bytes.Equal(bom, []byte{0xEF, 0xBB, 0xBF}) {
		br.Discard(3)
	}
	cr := csv.NewReader(br)
	cr.Comment = '#'
	cr.FieldsPerRecord = -1
	cr.ReuseRecord = true
	t := &Table{File: file, columns: map[string]bool{}, index: map[string]int{}}
	fail := func(line int, format string, args ...any) error {
		return &netread.Error{File: file, Line: line, Msg: fmt.Sprintf(format, args...)}
	}
	csvErr := func(err error) error {
		var pe *csv.ParseError
		if errors.As(err, &pe) {
			return fail(pe.Line, "%v", pe.Err)
		}
		return fail(0, "%v", err)
	}
	header, err := cr.Read()
	if err == io.EOF {
		return nil, fail(1, "empty node table: want a header row naming the columns (node, actuator_cost, ...)")
	}
	if err != nil {
		return nil, csvErr(err)
	}
	headLine, _ := cr.FieldPos(0)
	// Column positions of the known names, -1 when absent.
	pos := map[string]int{}
	for _, c := range knownColumns {
		pos[c] = -1
	}
	width := len(header)
	for i, h := range header {
		name := strings.ToLower(strings.TrimSpace(h))
		if i == 0 {
			name = strings.TrimPrefix(name, "\ufeff")
		}
		p, known := pos[name]
		switch {
		case name == "":
			return nil, fail(headLine, "column %d of the header has no name", i+1)
		case !known:
			t.Warnings = append(t.Warnings, fmt.Sprintf("%s:%d: unknown column %q ignored (known: %s)",
				file, headLine, h, strings.Join(knownColumns, ", ")))
		case p >= 0:
			return nil, fail(headLine, "column %q appears twice", name)
		default:
			pos[name] = i
			t.columns[name] = true
		}
	}
	if pos[colNode] < 0 {
		return nil, fail(headLine, "no %q column in the header", colNode)
	}
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, csvErr(err)
		}
		line, _ := cr.FieldPos(0)
		if len(rec) > width {
			return nil, fail(line, "%d fields, but the header names %d columns", len(rec), width)
		}
		cell := func(col string) string {
			if p := pos[col]; p >= 0 && p < len(rec) {
				return strings.TrimSpace(rec[p])
			}
			return ""
		}
		row := Row{Line: line, ActuatorCost: CostScale, SensorCost: CostScale, CanActuate: true, CanSense: true}
		row.Node = cell(colNode)
		if row.Node == "" {
			if blank(rec) {
				continue
			}
			return nil, fail(line, "empty node name")
		}
		if len(row.Node) > netread.MaxNameBytes {
			return nil, fail(line, "node name of %d bytes; the limit is %d", len(row.Node), netread.MaxNameBytes)
		}
		if prev, dup := t.index[row.Node]; dup {
			return nil, fail(line, "node %q is already listed on line %d", row.Node, t.Rows[prev].Line)
		}
		for _, c := range []struct {
			col string
			dst *int64
		}{{colActuatorCost, &row.ActuatorCost}, {colSensorCost, &row.SensorCost}} {
			if s := cell(c.col); s != "" {
				v, ok := parseCost(s)
				if !ok {
					return nil, fail(line, "%s %q: want a number from 0 to 1e9 with at most 3 decimals", c.col, s)
				}
				*c.dst = v
			}
		}
		for _, c := range []struct {
			col string
			dst *bool
		}{{colCanActuate, &row.CanActuate}, {colHasActuator, &row.HasActuator}, {colCanSense, &row.CanSense}, {colHasSensor, &row.HasSensor}} {
			if s := cell(c.col); s != "" {
				v, ok := parseBool(s)
				if !ok {
					return nil, fail(line, "%s %q: want yes or no", c.col, s)
				}
				*c.dst = v
			}
		}
		if row.HasActuator && !row.CanActuate {
			return nil, fail(line, "node %q: has_actuator is yes but can_actuate is no", row.Node)
		}
		if row.HasSensor && !row.CanSense {
			return nil, fail(line, "node %q: has_sensor is yes but can_sense is no", row.Node)
		}
		row.Group = cell(colGroup)
		row.Label = cell(colLabel)
		t.index[row.Node] = len(t.Rows)
		t.Rows = append(t.Rows, row)
	}
	return t, nil
}

func blank(rec []string) bool {
	for _, f := range rec {
		if strings.TrimSpace(f) != "" {
			return false
		}
	}
	return true
}

// parseCost reads a plain decimal with at most three decimals into
// thousandths.
func parseCost(s string) (int64, bool) {
	whole, frac, dot := strings.Cut(s, ".")
	if whole == "" && (!dot || frac == "") || len(frac) > 3 || len(whole) > 10 {
		return 0, false
	}
	for _, part := range []string{whole, frac} {
		for i := 0; i < len(part); i++ {
			if part[i] < '0' || part[i] > '9' {
				return 0, false
			}
		}
	}
	var w int64
	if whole != "" {
		w, _ = strconv.ParseInt(whole, 10, 64)
	}
	if w > maxCost {
		return 0, false
	}
	f := int64(0)
	for i := 0; i < 3; i++ {
		f *= 10
		if i < len(frac) {
			f += int64(frac[i] - '0')
		}
	}
	v := w*CostScale + f
	if v > maxCost*CostScale {
		return 0, false
	}
	return v, true
}

func parseBool(s string) (bool, bool) {
	switch strings.ToLower(s) {
	case "yes", "y", "true", "1":
		return true, true
	case "no", "n", "false", "0":
		return false, true
	}
	return false, false
}

// FormatCost writes a cost held in CostScale units as a decimal, with no
// trailing zeros: 2500 is "2.5".
func FormatCost(units int64) string {
	s := strconv.FormatInt(units/CostScale, 10)
	f := units % CostScale
	if f == 0 {
		return s
	}
	frac := strings.TrimRight(fmt.Sprintf("%03d", f), "0")
	return s + "." + frac
}

// Has reports whether the file had the named column.
func (t *Table) Has(column string) bool { return t.columns[column] }

// Names returns the states the table lists, in file order: pass them to
// the network reader (netread.Options.States) so that every listed state
// exists.
func (t *Table) Names() []string {
	out := make([]string, len(t.Rows))
	for i, r := range t.Rows {
		out[i] = r.Node
	}
	return out
}

// Lookup returns the row of the named state.
func (t *Table) Lookup(name string) (*Row, bool) {
	i, ok := t.index[name]
	if !ok {
		return nil, false
	}
	return &t.Rows[i], true
}

// Isolated returns a "FILE:LINE: message" warning for each listed state
// that is in no edge of g (self-loops aside): an isolated state, which may
// be a misspelt name.
func (t *Table) Isolated(g *structural.Network) []string {
	var out []string
	isolated := 0
	for _, r := range t.Rows {
		v, ok := g.Lookup(r.Node)
		if !ok {
			continue
		}
		linked := false
		for _, w := range g.Succ(v) {
			linked = linked || w != v
		}
		for _, w := range g.Pred(v) {
			linked = linked || w != v
		}
		if !linked {
			isolated++
			if isolated <= maxIsolatedNamed {
				out = append(out, fmt.Sprintf("%s:%d: node %q is in no edge of the network: it is an isolated state and needs its own device (a misspelt name?)",
					t.File, r.Line, r.Node))
			}
		}
	}
	if isolated > maxIsolatedNamed {
		out = append(out, fmt.Sprintf("%s: %d more nodes of the table are in no edge of the network (isolated states, %d in all)",
			t.File, isolated-maxIsolatedNamed, isolated))
	}
	return out
}

// maxIsolatedNamed bounds the isolated states Isolated names one by one; a
// generated network's table can list thousands.
const maxIsolatedNamed = 10

// Actuators returns the actuator facts of the table for the states of g,
// in CostScale units; states the table does not list cost 1 (CostScale)
// and allow a device. Rows naming no state of g are skipped.
func (t *Table) Actuators(g *structural.Network) structural.Devices {
	return t.devices(g, func(r *Row) (int64, bool, bool) { return r.ActuatorCost, r.CanActuate, r.HasActuator })
}

// Sensors is Actuators for sensors.
func (t *Table) Sensors(g *structural.Network) structural.Devices {
	return t.devices(g, func(r *Row) (int64, bool, bool) { return r.SensorCost, r.CanSense, r.HasSensor })
}

func (t *Table) devices(g *structural.Network, get func(*Row) (int64, bool, bool)) structural.Devices {
	n := g.N()
	d := structural.Devices{Cost: make([]structural.Cost, n)}
	for v := range d.Cost {
		d.Cost[v] = CostScale
	}
	for i := range t.Rows {
		v, ok := g.Lookup(t.Rows[i].Node)
		if !ok {
			continue
		}
		c, can, has := get(&t.Rows[i])
		d.Cost[v] = structural.Cost(c)
		if !can {
			if d.Forbidden == nil {
				d.Forbidden = make([]bool, n)
			}
			d.Forbidden[v] = true
		}
		if has {
			if d.Existing == nil {
				d.Existing = make([]bool, n)
			}
			d.Existing[v] = true
		}
	}
	return d
}
