package nodetable

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"sync"

	"github.com/netsteer/netsteer/io/internal/source"
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
	// Isolated says the state is meant to exist even when no edge of the
	// network names it (the isolated column).
	Isolated bool
	// Target marks a state that must be steerable (observable) in target
	// control (the target column).
	Target bool
}

// Table is a node table. Its methods that take a network look each row's
// name up once per network and keep the result: change Rows only before
// the first of them, and do not call them from several goroutines at once.
type Table struct {
	// File names the table in messages.
	File string
	// Rows are in file order.
	Rows []Row
	// Warnings are "FILE:LINE: message" lines about the file itself
	// (unknown columns).
	Warnings []string
	// SHA256 and Size describe the bytes read (the whole file on
	// success), so that a report can certify the table it used.
	SHA256 [32]byte
	Size   int64

	columns map[string]bool
	index   rowIndex

	// The state of each row in the network last asked about (-1: none),
	// so that each name is looked up once per network (bound).
	boundTo *structural.Network
	state   []int32
}

// bound returns the state of each row in g (-1 where g has none), looked
// up once per network, on all cores.
func (t *Table) bound(g *structural.Network) []int32 {
	if t.boundTo == g && len(t.state) == len(t.Rows) {
		return t.state
	}
	st := make([]int32, len(t.Rows))
	workers := min(runtime.GOMAXPROCS(0), max(len(st)/(1<<14), 1))
	var wg sync.WaitGroup
	for w := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := w * len(st) / workers; i < (w+1)*len(st)/workers; i++ {
				v, ok := g.Lookup(t.Rows[i].Node)
				if !ok {
					v = -1
				}
				st[i] = v
			}
		}()
	}
	wg.Wait()
	t.boundTo, t.state = g, st
	return st
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
	colIsolated     = "isolated"
	colTarget       = "target"
)

var knownColumns = [...]string{colNode, colActuatorCost, colCanActuate, colHasActuator,
	colSensorCost, colCanSense, colHasSensor, colGroup, colLabel, colIsolated, colTarget}

// MaxLineBytes bounds a line of a node table: a file without line breaks
// (/dev/zero, say) fails after this many bytes.
const MaxLineBytes = 1 << 16

// Options control reading.
type Options struct {
	// Stdin is what the path "-" reads; nil means os.Stdin.
	Stdin io.Reader
}

// ReadFile reads the node table in path; "-" reads opt.Stdin.
func ReadFile(path string, opt Options) (*Table, error) {
	f, name, err := netread.Open(path, opt.Stdin, "node table")
	if err != nil {
		return nil, err
	}
	defer f.Close()
	var size int64
	if file, ok := f.(*os.File); ok {
		if st, err := file.Stat(); err == nil && st.Mode().IsRegular() {
			size = st.Size()
		}
	}
	return read0(f, name, size)
}

// Read reads a node table from r; file names r in messages.
func Read(r io.Reader, file string) (*Table, error) { return read0(r, file, 0) }

// read0 is Read of a file of size bytes (0: unknown).
func read0(r io.Reader, file string, size int64) (*Table, error) {
	d := source.NewDigest(r)
	t, err := read(d, file, size)
	if err != nil {
		return nil, err
	}
	if err := d.Drain(); err != nil {
		return nil, &netread.Error{File: file, Msg: err.Error(), Err: err}
	}
	t.SHA256, t.Size = d.Sum(), d.Size()
	return t, nil
}

func read(r io.Reader, file string, size int64) (*Table, error) {
	br := bufio.NewReaderSize(source.LineLimit(r, MaxLineBytes), 1<<16)
	if bom, _ := br.Peek(3); bytes.Equal(bom, []byte{0xEF, 0xBB, 0xBF}) {
		br.Discard(3)
	}
	cr := csv.NewReader(br)
	cr.Comment = '#'
	cr.FieldsPerRecord = -1
	cr.ReuseRecord = true
	t := &Table{File: file, columns: map[string]bool{}}
	fail := func(line int, format string, args ...any) error {
		return &netread.Error{File: file, Line: line, Msg: fmt.Sprintf(format, args...)}
	}
	csvErr := func(err error) error {
		var pe *csv.ParseError
		var lt *source.LineTooLong
		var ne *netread.Error
		switch {
		case errors.As(err, &lt):
			return &netread.Error{File: file, Line: lt.Line, Msg: lt.Error(), Err: err}
		case errors.As(err, &ne):
			return ne
		case errors.As(err, &pe):
			return &netread.Error{File: file, Line: pe.Line, Msg: pe.Err.Error(), Err: err}
		}
		return &netread.Error{File: file, Msg: err.Error(), Err: err}
	}
	header, err := cr.Read()
	if err == io.EOF {
		return nil, fail(1, "empty node table: want a header row naming the columns (node, actuator_cost, ...)")
	}
	if err != nil {
		return nil, csvErr(err)
	}
	headLine, _ := cr.FieldPos(0)
	// Column positions of the known names (by their index in
	// knownColumns), -1 when absent.
	var pos [len(knownColumns)]int
	for i := range pos {
		pos[i] = -1
	}
	col := func(name string) int { return slices.Index(knownColumns[:], name) }
	width := len(header)
	for i, h := range header {
		name := strings.ToLower(strings.TrimSpace(h))
		if i == 0 {
			name = strings.TrimPrefix(name, "\ufeff")
		}
		k := col(name)
		switch {
		case name == "":
			return nil, fail(headLine, "column %d of the header has no name", i+1)
		case k < 0:
			t.Warnings = append(t.Warnings, fmt.Sprintf("%s:%d: unknown column %q ignored (known: %s)",
				file, headLine, netread.Clip(h), strings.Join(knownColumns[:], ", ")))
		case pos[k] >= 0:
			return nil, fail(headLine, "column %q appears twice", name)
		default:
			pos[k] = i
			t.columns[name] = true
		}
	}
	if pos[col(colNode)] < 0 {
		return nil, fail(headLine, "no %q column in the header", colNode)
	}
	p := func(name string) int { return pos[col(name)] }
	pNode, pGroup, pLabel := p(colNode), p(colGroup), p(colLabel)
	type costCol struct {
		name string
		pos  int
	}
	costs := []costCol{{colActuatorCost, p(colActuatorCost)}, {colSensorCost, p(colSensorCost)}}
	bools := []costCol{{colCanActuate, p(colCanActuate)}, {colHasActuator, p(colHasActuator)}, {colCanSense, p(colCanSense)},
		{colHasSensor, p(colHasSensor)}, {colIsolated, p(colIsolated)}, {colTarget, p(colTarget)}}
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
		cell := func(p int) string {
			if p >= 0 && p < len(rec) {
				return strings.TrimSpace(rec[p])
			}
			return ""
		}
		row := Row{Line: line, ActuatorCost: CostScale, SensorCost: CostScale, CanActuate: true, CanSense: true}
		row.Node = cell(pNode)
		if row.Node == "" && blank(rec) {
			continue
		}
		if msg := netread.NameProblem(row.Node); msg != "" {
			return nil, fail(line, "%s", msg)
		}
		if prev := t.index.find(t.Rows, row.Node); prev >= 0 {
			return nil, fail(line, "node %q is already listed on line %d", netread.Clip(row.Node), t.Rows[prev].Line)
		}
		costDst := [...]*int64{&row.ActuatorCost, &row.SensorCost}
		boolDst := [...]*bool{&row.CanActuate, &row.HasActuator, &row.CanSense, &row.HasSensor, &row.Isolated, &row.Target}
		for k, c := range costs {
			if s := cell(c.pos); s != "" {
				v, ok := parseCost(s)
				if !ok {
					return nil, fail(line, "%s %q: want a number from 0 to 1e9 with at most 3 decimals", c.name, netread.Clip(s))
				}
				*costDst[k] = v
			}
		}
		for k, c := range bools {
			if s := cell(c.pos); s != "" {
				v, ok := parseBool(s)
				if !ok {
					return nil, fail(line, "%s %q: want yes or no", c.name, netread.Clip(s))
				}
				*boolDst[k] = v
			}
		}
		if row.HasActuator && !row.CanActuate {
			return nil, fail(line, "node %q: has_actuator is yes but can_actuate is no", netread.Clip(row.Node))
		}
		if row.HasSensor && !row.CanSense {
			return nil, fail(line, "node %q: has_sensor is yes but can_sense is no", netread.Clip(row.Node))
		}
		row.Group = cell(pGroup)
		row.Label = cell(pLabel)
		for _, c := range []struct{ col, val string }{{colGroup, row.Group}, {colLabel, row.Label}} {
			if msg := netread.NameProblem(c.val); c.val != "" && msg != "" {
				return nil, fail(line, "%s: %s", c.col, strings.Replace(msg, "node name", "value", 1))
			}
		}
		if len(t.Rows) == cap(t.Rows) {
			// Double: append grows large slices by a quarter, copying a
			// million rows about five times over. At 1,024 rows, a file
			// of known size grows once to what the rest of it likely
			// holds at the density so far, but never beyond a row per 4
			// bytes (a row of distinct names takes more, past the first
			// few hundred).
			more := max(len(t.Rows), 256)
			if n := len(t.Rows); n == 1024 && size > 0 {
				if at := cr.InputOffset(); at > 0 {
					est := int64(float64(size)/float64(at)*float64(n)*1.05) + 256
					more = max(more, int(min(est, size/4+1))-n)
				}
			}
			t.Rows = slices.Grow(t.Rows, more)
		}
		t.Rows = append(t.Rows, row)
		t.index.add(t.Rows, len(t.Rows)-1)
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

// Names returns the states the table lists, in file order.
func (t *Table) Names() []string {
	out := make([]string, len(t.Rows))
	for i, r := range t.Rows {
		out[i] = r.Node
	}
	return out
}

// States returns the states to pass to the network reader
// (netread.Options.States): the rows marked isolated, or every row when
// all is set (the caller accepts listed states that are in no edge).
// Check the network afterwards with Check.
func (t *Table) States(all bool) []string {
	var out []string
	for _, r := range t.Rows {
		if all || r.Isolated {
			out = append(out, r.Node)
		}
	}
	return out
}

// Check returns an error for the first row whose state is not in g: most
// likely a misspelt name, since rows meant to add an isolated state say so
// in the isolated column. The message names the row and the nearest names
// of g (edit distance).
func (t *Table) Check(g *structural.Network) error {
	st := t.bound(g)
	for i, r := range t.Rows {
		if st[i] >= 0 {
			continue
		}
		msg := fmt.Sprintf("node %q is in no edge of the network", netread.Clip(r.Node))
		if near := Nearest(g, r.Node, 3); len(near) > 0 {
			q := make([]string, len(near))
			for i, s := range near {
				q[i] = strconv.Quote(netread.Clip(s))
			}
			msg += " (nearest: " + strings.Join(q, ", ") + ")"
		}
		msg += "; if the state is meant to have no edges, say isolated=yes in its row"
		return &netread.Error{File: t.File, Line: r.Line, Msg: msg}
	}
	return nil
}

// Nearest returns up to k names of g closest to name by edit distance
// (Levenshtein: insertions, deletions and substitutions of bytes), nearest
// first, ties in state order; only names within a third of name's length
// (at least 2) count. It costs O(N * len(name) * bound) at worst.
func Nearest(g *structural.Network, name string, k int) []string {
	bound := max(2, len(name)/3)
	type hit struct {
		d int
		v int32
	}
	var best []hit
	row := make([]int, len(name)+1)
	prev := make([]int, len(name)+1)
	for v := int32(0); int(v) < g.N(); v++ {
		cand := g.Name(v)
		limit := bound
		if len(best) == k {
			limit = best[k-1].d - 1
		}
		if limit < 0 || abs(len(cand)-len(name)) > limit {
			continue
		}
		d := editDistance(name, cand, limit, prev, row)
		if d > limit {
			continue
		}
		best = append(best, hit{d, v})
		for i := len(best) - 1; i > 0 && best[i].d < best[i-1].d; i-- {
			best[i], best[i-1] = best[i-1], best[i]
		}
		if len(best) > k {
			best = best[:k]
		}
	}
	out := make([]string, len(best))
	for i, h := range best {
		out[i] = g.Name(h.v)
	}
	return out
}

func abs(x int) int {
	if x < 0 {
		return -x
	}
	return x
}

// editDistance returns the Levenshtein distance of a and b, or limit+1
// once it must exceed limit (a row of the table all above it).
func editDistance(a, b string, limit int, prev, row []int) int {
	for i := range prev {
		prev[i] = i
	}
	for j := 1; j <= len(b); j++ {
		row[0] = j
		low := row[0]
		for i := 1; i <= len(a); i++ {
			c := prev[i-1]
			if a[i-1] != b[j-1] {
				c = 1 + min(prev[i-1], prev[i], row[i-1])
			}
			row[i] = c
			low = min(low, c)
		}
		if low > limit {
			return limit + 1
		}
		prev, row = row, prev
	}
	return prev[len(a)]
}

// Lookup returns the row of the named state.
func (t *Table) Lookup(name string) (*Row, bool) {
	i := t.index.find(t.Rows, name)
	if i < 0 {
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
	st := t.bound(g)
	for i, r := range t.Rows {
		v := st[i]
		if v < 0 {
			continue
		}
		linked := false
		for _, w := range g.Succ(v) {
			linked = linked || w != v
		}
		for _, w := range g.Pred(v) {
			linked = linked || w != v
		}
		if !linked && !r.Isolated {
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

// Targets returns the states of g whose rows say target=yes, in
// increasing order; rows naming no state of g are skipped.
func (t *Table) Targets(g *structural.Network) []int32 {
	st := t.bound(g)
	var out []int32
	for i := range t.Rows {
		if t.Rows[i].Target && st[i] >= 0 {
			out = append(out, st[i])
		}
	}
	slices.Sort(out)
	return out
}

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
	st := t.bound(g)
	for i := range t.Rows {
		v := st[i]
		if v < 0 {
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

// Labels returns each state's label and group: fileLabels and fileGroups
// (one per state, as a network file gave them; ignored unless there are
// g.N() of them), overridden by the table's label and group columns where
// a row gives one; nil when neither gives any. A nil table gives the
// file's.
func (t *Table) Labels(g *structural.Network, fileLabels, fileGroups []string) (labels, groups []string) {
	n := g.N()
	pick := func(file []string, col func(r *Row) string) []string {
		if len(file) != n {
			file = nil
		}
		out, copied := file, false
		if t == nil {
			return out
		}
		var st []int32
		for i := range t.Rows {
			r := &t.Rows[i]
			if col(r) == "" {
				continue
			}
			if st == nil {
				st = t.bound(g)
			}
			v := st[i]
			if v < 0 {
				continue
			}
			if !copied {
				out, copied = make([]string, n), true
				copy(out, file)
			}
			out[v] = col(r)
		}
		return out
	}
	return pick(fileLabels, func(r *Row) string { return r.Label }), pick(fileGroups, func(r *Row) string { return r.Group })
}
