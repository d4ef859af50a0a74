package failure

import (
	"cmp"
	"encoding/json"
	"errors"
	"fmt"
	"slices"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure/internal/bip"
	"github.com/netsteer/netsteer/structural/placement"
)

// Class says what losing one device of a design does (after Commault,
// Dion & Trinh, "Observability preservation under sensor failure", IEEE
// TAC 53(6):1554-1559, 2008, for sensors, and its dual for actuators; see
// the package documentation on the sources). Call a sub-design any subset
// of the design's signals; a sub-design works when it keeps the network
// structurally controllable (observable).
type Class uint8

const (
	// Useless: the device belongs to no minimal working sub-design; adding
	// it to a sub-design that fails never makes it work, so it can be lost
	// together with any others without consequence.
	Useless Class = iota
	// Useful: not essential, but in some minimal working sub-design: its
	// loss matters once certain other devices are lost too (see
	// DeviceLoss.With).
	Useful
	// Essential: in every working sub-design; its loss alone breaks the
	// design.
	Essential
	// Unresolved: not essential; whether useful or useless was not settled
	// within the work budget (Request.Budget).
	Unresolved
)

func (c Class) String() string {
	switch c {
	case Useless:
		return "useless"
	case Useful:
		return "useful"
	case Essential:
		return "essential"
	}
	return "unresolved"
}

// MarshalText writes the class's name.
func (c Class) MarshalText() ([]byte, error) { return []byte(c.String()), nil }

// Request asks what single failures do to a design.
type Request struct {
	// Property is Controllability (Design holds inputs) or Observability
	// (Design holds outputs; the questions are asked of the transposed
	// network).
	Property structural.Property
	// Design is the design judged.
	Design structural.Design
	// Devices says where replacement devices may go and what they cost
	// (costs and forbidden states; Existing marks are ignored, since the
	// design lists the devices in place). The zero value allows every
	// state at unit cost.
	Devices structural.Devices
	// States asks for the loss of each state as well (a variable held
	// constant by a fault: its row and column removed). See StateLoss for
	// the cost.
	States bool
	// Detail is how many entries of each list get the costlier details: a
	// dilation witness, the unreached states of a link or state, the
	// cheapest replacement or fix. 0 means 10; a negative value means all.
	Detail int
	// Partners is how many useful devices (in design order) get the list
	// of devices whose joint loss with them breaks the design; each list
	// costs about one augmentation pass over the network. 0 means 3; a
	// negative value means all.
	Partners int
	// Budget bounds, in adjacency entries scanned, the search that splits
	// the non-essential devices into useful and useless; devices left
	// unsettled are Unresolved. 0 means 16 (N + E + signal entries) +
	// 2^16; a negative value means no bound.
	Budget int64
}

// Assessment says what each single failure does to a design that works.
// Every claim is one of Lin's two conditions after the loss: the states no
// signal reaches any more, or a dilation (a set of states with fewer
// distinct in-neighbours, signals included, than members).
type Assessment struct {
	Property structural.Property `json:"-"`
	// Intact is the verdict on the design as given. When it does not
	// hold, the failure lists are empty and Completion gives the cheapest
	// dedicated devices that make it work.
	Intact     *structural.Verdict  `json:"intact"`
	Completion *placement.Placement `json:"completion,omitempty"`

	// Devices has one entry per signal of the design, in design order.
	Devices []DeviceLoss `json:"devices"`
	// EssentialDevices, ... count Devices by class.
	EssentialDevices  int `json:"essential_count"`
	UsefulDevices     int `json:"useful_count"`
	UselessDevices    int `json:"useless_count"`
	UnresolvedDevices int `json:"unresolved_count"`

	// Links lists every edge whose loss breaks the design, worst first
	// (most states left unreached, then those that also open a dilation,
	// then in edge order). LinksJudged is the number of edges judged.
	Links           []LinkLoss `json:"breaking_links"`
	LinksJudged     int        `json:"links_judged"`
	UnreachingLinks int        `json:"unreaching_links_count"`
	DilatingLinks   int        `json:"dilating_links_count"`
	BothLinks       int        `json:"both_causes_links_count"`

	// States lists, when asked for, every state whose loss breaks the
	// design for the states left, worst first.
	States       []StateLoss `json:"breaking_states,omitempty"`
	StatesJudged bool        `json:"states_judged"`
}

// DeviceLoss is what losing one signal of the design does.
type DeviceLoss struct {
	// Signal is the signal's 0-based index in the design; Number names it
	// for a reader (design-file line or 1-based position).
	Signal  int               `json:"-"`
	Number  int               `json:"signal"`
	Touches structural.States `json:"states"`
	Class   Class             `json:"class"`
	// Reach and Matching classify the device for each of Lin's conditions
	// alone, as Commault, Dion & Trinh do before combining them: for reaching
	// every state from the signals, and for the absence of dilations (the
	// term rank of [A B]); Class combines both exactly.
	Reach    Class `json:"reach_class"`
	Matching Class `json:"matching_class"`
	// Unreached lists the states no other signal reaches: those the device
	// alone reaches (empty unless Reach is Essential).
	Unreached structural.States `json:"unreached"`
	// Dilation reports that the loss opens a dilation (Matching is
	// Essential); Witness is one. Witness and Replacement are given for the
	// Request.Detail essential devices that leave the most states
	// unreached (ties in design order).
	Dilation bool                 `json:"opens_dilation"`
	Witness  *structural.Dilation `json:"dilation,omitempty"`
	// With, for a useful device (first Request.Partners of them), lists the
	// signal numbers of other devices whose loss, together with this one,
	// breaks the design, although their loss alone does not.
	With        []int `json:"useful_with,omitempty"`
	WithSignals []int `json:"-"`
	// Replacement is the cheapest set of dedicated devices, on states
	// other than those of the lost device, that makes the remaining design
	// work again.
	Replacement *Fix `json:"replacement,omitempty"`
}

// LinkLoss is what losing one edge does.
type LinkLoss struct {
	// From -> To is the edge, in the network's own orientation (for
	// observability too).
	From, To int32 `json:"-"`
	// UnreachedCount is the number of states no signal reaches without
	// the edge (those whose every path from the signals uses it);
	// Unreached lists them for the first Request.Detail links.
	UnreachedCount int                `json:"unreached_count"`
	Unreached      *structural.States `json:"unreached,omitempty"`
	// Dilation reports that the edge is in every maximum matching of
	// [A B], so its loss opens a dilation; Witness is one (first
	// Request.Detail links).
	Dilation bool                 `json:"opens_dilation"`
	Witness  *structural.Dilation `json:"dilation,omitempty"`
	// Fix is the cheapest set of dedicated devices that makes the design
	// work without the edge (first Request.Detail links).
	Fix *Fix `json:"cheapest_fix,omitempty"`

	names structural.States
}

// MarshalJSON adds the edge's endpoints by name, "from" and "to".
func (l LinkLoss) MarshalJSON() ([]byte, error) {
	type plain LinkLoss
	return json.Marshal(struct {
		From string `json:"from"`
		To   string `json:"to"`
		plain
	}{l.names.NameOf(l.From), l.names.NameOf(l.To), plain(l)})
}

// StateLoss is what losing one state (held constant: its row and column
// removed, and with it the signals' action on it) does to the others.
// UnreachedCount states are no longer reached (those the state dominates,
// listed in Unreached for the first Request.Detail entries); Dilation
// reports that the remaining states cannot all be matched, Witness being
// one dilation of the reduced system.
//
// Whether a dilation opens is decided per state: the loss keeps the term
// rank exactly when the column of the state can be left free by a maximum
// matching of the graph without its row, which holds at once when the
// column is free or can be freed already, or the state is matched to
// itself, and otherwise when the row matched to the column reaches the
// state's own row in the alternating row digraph; that last question is one
// search per state (pruned by the condensation's depth, and settled at
// once for paths through its largest component), O(N E) in the worst case.
type StateLoss struct {
	State          int32                `json:"-"`
	UnreachedCount int                  `json:"unreached_count"`
	Unreached      *structural.States   `json:"unreached,omitempty"`
	Dilation       bool                 `json:"opens_dilation"`
	Witness        *structural.Dilation `json:"dilation,omitempty"`

	names structural.States
}

// MarshalJSON adds the state's name under "state".
func (s StateLoss) MarshalJSON() ([]byte, error) {
	type plain StateLoss
	return json.Marshal(struct {
		State string `json:"state"`
		plain
	}{s.names.NameOf(s.State), plain(s)})
}

// Assess judges every single failure of req.Design on g: the loss of each
// device (signal), of each edge and, when asked, of each state.
//
// One maximum matching of [A B] and one dominator tree answer all of them
// (never a recomputation per failure):
//   - the states a lost signal leaves unreached are those its node
//     dominates in the reachability graph root -> signals -> states (a
//     virtual root acting on every signal); an edge u -> v cuts off the
//     states v dominates exactly when it is the only edge into v from
//     outside v's dominator subtree; a lost state cuts off the others it
//     dominates (Lengauer & Tarjan 1979, see internal/dom);
//   - a lost signal opens a dilation exactly when its column is in every
//     maximum matching of [A B], a lost edge when the edge is
//     (Dulmage–Mendelsohn: the column cannot be freed by an even
//     alternating path from a free column, and the edge lies on no
//     alternating cycle); a lost state when the column of the state
//     cannot be freed once its row is gone, a reachability question in the
//     alternating row digraph answered by one search per state.
//
// Time: one structural.Check of the intact design, one matching of [A B]
// and O((N + E) log N) for every device and link loss; the useful/useless
// split adds augmenting-path searches bounded by req.Budget (one shared
// pass for most devices, a search for each of the rest) and one
// augmentation pass per listed partner set; the loss of states adds one
// pruned search per state not settled at once (through its own component
// or the largest one), O(N E) in the worst case and near-linear on the
// benchmark networks; each witness, replacement and fix costs one
// alternating search. Memory O(N + E).
func Assess(g *structural.Network, req Request) (*Assessment, error) {
	d := req.Design
	if !d.Of(g) {
		return nil, structural.ErrForeignDesign
	}
	dev := req.Devices
	dev.Existing = nil
	if err := dev.Check(g); err != nil {
		return nil, fmt.Errorf("failure: %w", err)
	}
	p := req.Property
	intact, err := structural.Check(g, p, d)
	if err != nil {
		return nil, fmt.Errorf("failure: %w", err)
	}
	as := &Assessment{Property: p, Intact: intact, Devices: []DeviceLoss{}, Links: []LinkLoss{}}
	if !intact.Holds {
		as.Completion, err = placement.Complete(g, p, d, dev)
		if err != nil {
			return nil, fmt.Errorf("failure: %w", err)
		}
		return as, nil
	}
	h := g
	if p == structural.Observability {
		h = g.Transpose()
	}
	c := newCore(h, d.Signals())
	if !c.holds() {
		return nil, errors.New("failure: internal error: Lin's test and the failure analysis disagree")
	}
	detail := req.Detail
	if detail == 0 {
		detail = 10
	}
	if detail < 0 {
		detail = int(^uint(0) >> 1)
	}
	budget := req.Budget
	if budget == 0 {
		entries := 0
		for _, s := range d.Signals() {
			entries += len(s)
		}
		budget = 16*int64(g.N()+g.Edges()+entries) + 1<<16
	}
	partners := req.Partners
	if partners == 0 {
		partners = 3
	}
	if partners < 0 {
		partners = int(^uint(0) >> 1)
	}
	as.devices(g, p, c, d, dev, detail, partners, budget)
	as.links(g, p, c, d, dev, detail)
	if req.States {
		as.states(g, c, d, detail)
		as.StatesJudged = true
	}
	return as, nil
}

func (as *Assessment) devices(g *structural.Network, p structural.Property, c *core, d structural.Design, dev structural.Devices, detail, partners int, budget int64) {
	k := c.k
	as.Devices = make([]DeviceLoss, k)
	for i := 0; i < k; i++ {
		dl := &as.Devices[i]
		dl.Signal, dl.Number = i, d.Number(i)
		dl.Touches = g.States(slices.Sorted(slices.Values(uniq(d.Signal(i)))))
		lost := c.lostBySignal(i)
		slices.Sort(lost)
		dl.Unreached = g.States(lost)
		dl.Dilation = c.coloop(i)
		if len(lost) > 0 {
			dl.Reach = Essential
		}
		if dl.Dilation {
			dl.Matching = Essential
		}
		if len(lost) > 0 || dl.Dilation {
			dl.Class = Essential
		}
	}
	classify(c, as.Devices, budget, partners, d)
	// Details for the essential devices that cut off the most states.
	var ess []int
	for i := range as.Devices {
		switch as.Devices[i].Class {
		case Essential:
			as.EssentialDevices++
			ess = append(ess, i)
		case Useful:
			as.UsefulDevices++
		case Useless:
			as.UselessDevices++
		default:
			as.UnresolvedDevices++
		}
	}
	slices.SortStableFunc(ess, func(a, b int) int {
		return cmp.Compare(as.Devices[b].Unreached.Len(), as.Devices[a].Unreached.Len())
	})
	if len(ess) > detail {
		ess = ess[:detail]
	}
	a := bip.NewAug(c.bg, c.m)
	for _, i := range ess {
		dl := &as.Devices[i]
		if dl.Dilation {
			mark := a.Mark()
			r := a.Disable(int32(c.n + i))
			dl.Witness = witness(g, c, a, a.AltReach([]int32{r}), -1, -1, d)
			a.Undo(mark)
		}
		dl.Replacement = c.deviceFix(g, a, i, dev)
	}
}

// uniq returns the distinct states of s (a copy).
func uniq(s []int32) []int32 {
	out := slices.Clone(s)
	slices.Sort(out)
	return slices.Compact(out)
}

// witness turns the rows reached by an alternating search into a
// dilation: the rows, and every column on adjacent to them (the adjacency
// skipRow-skipCol excepted), all matched into the rows.
func witness(g *structural.Network, c *core, a *bip.Aug, rows []int32, skipRow, skipCol int32, d structural.Design) *structural.Dilation {
	states := slices.Clone(rows)
	slices.Sort(states)
	seen := make(map[int32]bool, 2*len(rows))
	var nb []int32
	var sig []int
	for _, r := range rows {
		for _, col := range c.bg.Rows.Row(r) {
			if a.Off[col] || r == skipRow && col == skipCol || seen[col] {
				continue
			}
			seen[col] = true
			if int(col) < c.n {
				nb = append(nb, col)
			} else {
				sig = append(sig, int(col)-c.n)
			}
		}
	}
	slices.Sort(nb)
	slices.Sort(sig)
	num := make([]int, len(sig))
	for i, x := range sig {
		num[i] = d.Number(x)
	}
	return &structural.Dilation{States: g.States(states), Neighbours: g.States(nb), Signals: sig, SignalNumbers: num}
}

func (as *Assessment) links(g *structural.Network, p structural.Property, c *core, d structural.Design, dev structural.Devices, detail int) {
	as.LinksJudged = g.Edges()
	all := g.States(nil)
	for v := int32(0); int(v) < c.n; v++ {
		b, m := c.bridge(v), c.criticalIn(v)
		add := func(u int32, unreached bool) {
			l := LinkLoss{From: u, To: v, Dilation: u == m, names: all}
			if unreached {
				l.UnreachedCount = int(c.tree.Size[c.node(v)])
			}
			if p == structural.Observability {
				l.From, l.To = v, u
			}
			as.Links = append(as.Links, l)
		}
		if b >= 0 {
			add(b, true)
		}
		if m >= 0 && m != b {
			add(m, false)
		}
	}
	slices.SortFunc(as.Links, func(x, y LinkLoss) int {
		if r := cmp.Compare(y.UnreachedCount, x.UnreachedCount); r != 0 {
			return r
		}
		if x.Dilation != y.Dilation {
			if x.Dilation {
				return -1
			}
			return 1
		}
		if r := cmp.Compare(x.From, y.From); r != 0 {
			return r
		}
		return cmp.Compare(x.To, y.To)
	})
	for _, l := range as.Links {
		if l.UnreachedCount > 0 {
			as.UnreachingLinks++
		}
		if l.Dilation {
			as.DilatingLinks++
		}
		if l.UnreachedCount > 0 && l.Dilation {
			as.BothLinks++
		}
	}
	a := bip.NewAug(c.bg, c.m)
	for i := range as.Links {
		if i >= detail {
			break
		}
		l := &as.Links[i]
		u, v := l.From, l.To // on h: u -> v
		if p == structural.Observability {
			u, v = v, u
		}
		if l.UnreachedCount > 0 {
			s := c.subtreeStates(v)
			slices.Sort(s)
			st := g.States(s)
			l.Unreached = &st
		}
		if l.Dilation {
			mark := a.Mark()
			a.Unmatch(v)
			l.Witness = witness(g, c, a, a.AltReachSkip([]int32{v}, v, u), v, u, d)
			a.Undo(mark)
		}
		l.Fix = c.linkFix(g, a, u, v, l.UnreachedCount > 0, l.Dilation, dev)
	}
}

func (as *Assessment) states(g *structural.Network, c *core, d structural.Design, detail int) {
	all := g.States(nil)
	seen := make([]int32, c.n)
	stamp := int32(0)
	var queue []int32
	// Depth of each component of the row digraph in its condensation (the
	// longest path from a source component): an arc between components
	// always deepens, so only shallower rows can reach a row.
	comp := c.rscc.Of
	depth := make([]int32, c.rscc.Count)
	byComp := make([]int32, c.n)
	for v := range byComp {
		byComp[v] = int32(v)
	}
	// Arcs go from higher component numbers to lower ones.
	slices.SortFunc(byComp, func(a, b int32) int { return cmp.Compare(comp[b], comp[a]) })
	for _, y := range byComp {
		for _, z := range c.rd.Row(y) {
			if comp[z] != comp[y] {
				depth[comp[z]] = max(depth[comp[z]], depth[comp[y]]+1)
			}
		}
	}
	// The largest component settles every path through it at once: the
	// rows that reach it and the rows it reaches, one search each way.
	size := make([]int32, c.rscc.Count)
	for _, y := range comp {
		size[y]++
	}
	big := int32(0)
	for y := range size {
		if size[y] > size[big] {
			big = int32(y)
		}
	}
	flood := func(adj *matching.CSR) []bool {
		mark := make([]bool, c.n)
		q := make([]int32, 0, size[big])
		for v := range comp {
			if comp[v] == big {
				mark[v] = true
				q = append(q, int32(v))
			}
		}
		for h := 0; h < len(q); h++ {
			for _, z := range adj.Row(q[h]) {
				if !mark[z] {
					mark[z] = true
					q = append(q, z)
				}
			}
		}
		return mark
	}
	fromBig, toBig := flood(c.rd), flood(matching.Transpose(c.rd))
	// reaches reports whether row r reaches row x in the alternating row
	// digraph: at once through the largest component, else by a search
	// that avoids it and keeps to rows shallower than x or in its
	// component.
	reaches := func(r, x int32) bool {
		cx, dx := comp[x], depth[comp[x]]
		if comp[r] == cx || toBig[r] && fromBig[x] {
			return true
		}
		ok := func(y int32) bool { return comp[y] == cx || comp[y] != big && depth[comp[y]] < dx }
		if !ok(r) {
			return false
		}
		stamp++
		seen[r] = stamp
		queue = append(queue[:0], r)
		for h := 0; h < len(queue); h++ {
			y := queue[h]
			if comp[y] == cx {
				return true // same component as x: x is reached
			}
			for _, z := range c.rd.Row(y) {
				if seen[z] != stamp && ok(z) {
					seen[z] = stamp
					queue = append(queue, z)
				}
			}
		}
		return false
	}
	for x := int32(0); int(x) < c.n; x++ {
		sl := StateLoss{State: x, names: all}
		sl.UnreachedCount = int(c.tree.Size[c.node(x)]) - 1
		rx := c.m.ColMate[x]
		sl.Dilation = rx >= 0 && !c.freeable[x] && c.m.RowMate[x] != x && !reaches(rx, x)
		if sl.UnreachedCount > 0 || sl.Dilation {
			as.States = append(as.States, sl)
		}
	}
	slices.SortFunc(as.States, func(x, y StateLoss) int {
		if r := cmp.Compare(y.UnreachedCount, x.UnreachedCount); r != 0 {
			return r
		}
		if x.Dilation != y.Dilation {
			if x.Dilation {
				return -1
			}
			return 1
		}
		return cmp.Compare(x.State, y.State)
	})
	a := bip.NewAug(c.bg, c.m)
	for i := range as.States {
		if i >= detail {
			break
		}
		sl := &as.States[i]
		x := sl.State
		if sl.UnreachedCount > 0 {
			s := c.subtreeStates(x)[1:]
			slices.Sort(s)
			st := g.States(s)
			sl.Unreached = &st
		}
		if sl.Dilation {
			mark := a.Mark()
			a.Unmatch(x)
			r := a.Disable(x)
			sl.Witness = witness(g, c, a, a.AltReach([]int32{r}), -1, -1, d)
			a.Undo(mark)
		}
	}
}
