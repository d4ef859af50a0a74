package render

import (
	"fmt"
	"github.com/netsteer/netsteer/io/internal/words"
	"math"
	"strings"

	"github.com/netsteer/netsteer/structural/analysis"
)

// The control view draws the answer rather than the network: one row per
// signal, its stem in order (the states each acts on the next through a
// matched edge), the cycles hung from it marked where they hang, the
// longest stems first. A stem too long for its row keeps its first and
// last states around a count of the others; stems past Options.MaxStems
// are counted. Time O(N) whatever the size.

const (
	boxW    = 128.0
	boxH    = 26.0
	gapW    = 30.0
	rowH    = 44.0
	leftPad = 12.0
)

func controlDesc(in *Input, opt Options) string {
	s := in.In
	k := len(s.Stems)
	shown := min(k, opt.maxStems())
	d := fmt.Sprintf("control structure: %s %s, longest first", num(k), plural(k, "stem", "stems"))
	if shown < k {
		d += fmt.Sprintf("; the first %s drawn one by one", num(shown))
	}
	return d
}

// stateMarks tells the control view what each state is.
type stateMarks struct {
	driven, sensed, unobserved, dilation []bool
}

func (in *Input) marks() *stateMarks {
	n := in.Net.N()
	m := &stateMarks{driven: markAll(n, in.inputs), sensed: markAll(n, in.outputs),
		unobserved: markAll(n, [][]int32{in.unobserved}), dilation: markAll(n, [][]int32{in.dilation, in.obsDila})}
	return m
}

// drawState draws state v as a node of width w at (x, y) and records the
// features for the legend.
func drawState(s *scene, in *Input, m *stateMarks, has map[string]bool, v int32, x, y, w float64) {
	fill, stroke, sw, dash := "#FFFFFF", colInk, 1.0, ""
	switch {
	case m.unobserved[v]:
		fill, dash, sw = colGrey, "dot", 1.8
		has["unobserved"] = true
	case m.dilation[v]:
		fill, stroke, sw = colTint, colVermilion, 2.2
		has["dilation"] = true
	case m.driven[v]:
		fill = colSky
		has["driven"] = true
	}
	shape := "ellipse"
	if in.Role != nil {
		switch r := in.Role(v); r {
		case "critical", "intermittent", "redundant":
			shape = shapeOf(r)
			has["role-"+r] = true
		}
	}
	tip := name(in.Net.Name(v))
	if l := in.shownName(v); l != tip {
		tip = l + " (" + tip + ")"
	}
	if in.Role != nil {
		tip += "; role: " + in.Role(v)
	}
	if in.Group != nil {
		if g := in.Group(v); g != "" {
			tip += "; group: " + name(g)
		}
	}
	s.tip(tip)
	if m.sensed[v] {
		it := s.rect(x-3, y-3, w+6, boxH+6, "", colGreen, 1.4)
		it.rx = 8
		has["sensed"] = true
	}
	var it *item
	switch shape {
	case "box":
		it = s.rect(x, y, w, boxH, fill, stroke, sw)
	case "octagon":
		c := 7.0
		it = s.poly(fill, stroke, sw, x+c, y, x+w-c, y, x+w, y+c, x+w, y+boxH-c, x+w-c, y+boxH, x+c, y+boxH, x, y+boxH-c, x, y+c)
	default:
		it = s.rect(x, y, w, boxH, fill, stroke, sw)
		it.rx = boxH / 2
	}
	it.dash = dash
	s.text(x+w/2, y+boxH/2+4.5, fit(in.shownName(v), smallSize, false, w-12), smallSize, false, 'm', colInk)
	s.end()
}

// drawSignal draws input signal i at (x, y) (the node's centre-left).
func drawSignal(s *scene, in *Input, has map[string]bool, st *analysis.Stem, x, y float64) {
	fill, stroke, dash := colOrange, colInk, ""
	key := "input"
	what := in.In.Kind
	if st.New {
		fill, stroke, dash, key, what = "#FFFFFF", colOrange, "dash", "input-new", "new "+what
	}
	label := in.signalName(false, st.Signal)
	tip := label + ": " + what
	if st.Cost != nil {
		tip += ", cost " + words.Thousands(st.Cost.String())
	}
	s.tip(tip)
	w := signalWidth(label)
	it := s.rect(x, y-13, w, 26, fill, stroke, 1.6)
	it.rx, it.dash = 13, dash
	s.text(x+w/2, y+4.5, label, smallSize, true, 'm', colInk)
	if st.Cost != nil {
		s.text(x+w+5, y+4.5, words.Thousands(st.Cost.String()), smallSize, false, 's', colMuted)
	}
	s.end()
	has[key] = true
}

// signalWidth is the width of a signal's pill.
func signalWidth(label string) float64 { return math.Max(26, textWidth(label, smallSize, true)+14) }

// arrow draws a control edge from x0 to x1 at height y.
func arrow(s *scene, col string, sw, x0, x1, y float64, dash string) {
	it := s.line(col, sw, x0, y, x1-1, y)
	it.arrow, it.dash = true, dash
}

// cycleMark draws the ring that says k cycles (of c states) hang at x.
func cycleMark(s *scene, x, y float64, k, states int, tip string) {
	s.tip(tip)
	s.ellipse(x-8, y, 16, 12, "", colVermilion, 2.4)
	s.text(x+11, y+10, fmt.Sprintf("%s (%s)", num(k), num(states)), smallSize, false, 's', colVermilion)
	s.end()
}

// controlScene draws the control view.
func controlScene(in *Input, v *View) (*scene, map[string]bool) {
	st := in.In
	has := map[string]bool{}
	m := in.marks()
	s := &scene{W: sceneWidth}
	top := header(s, in, v.Desc, sceneWidth)
	opt := v.opt
	// Cycles hung per stem and per anchor state.
	anchored := map[int32][2]int{}   // anchor -> cycles, states
	atSignal := make(map[int][2]int) // stem index -> cycles hung at the signal
	var loose [2]int                 // cycles hung from nothing
	for _, c := range st.Cycles {
		switch {
		case !c.Hung():
			loose[0]++
			loose[1] += c.States.Len()
		case c.Anchor.Len() == 0:
			a := atSignal[c.Stem]
			atSignal[c.Stem] = [2]int{a[0] + 1, a[1] + c.States.Len()}
		default:
			a := anchored[c.Anchor.At(0)]
			anchored[c.Anchor.At(0)] = [2]int{a[0] + 1, a[1] + c.States.Len()}
		}
	}
	// Cycles hung from cycles count towards the stem; the marks show the
	// ones hung from a stem state or its signal.
	sigW := 60.0
	for k := 0; k < min(len(st.Stems), opt.maxStems()); k++ {
		w := signalWidth(in.signalName(false, st.Stems[k].Signal)) + 30
		if c := st.Stems[k].Cost; c != nil {
			w += textWidth(words.Thousands(c.String()), smallSize, false) + 6
		}
		sigW = math.Max(sigW, w)
	}
	slots := int(math.Floor((sceneWidth - leftPad - sigW - 150) / (boxW + gapW)))
	y := top + 6
	shown := min(len(st.Stems), opt.maxStems())
	for k := 0; k < shown; k++ {
		stem := &st.Stems[k]
		cy := y + rowH/2
		drawSignal(s, in, has, stem, leftPad, cy)
		x := leftPad + sigW
		if a := atSignal[k]; a[0] > 0 {
			cycleMark(s, leftPad+14, cy+15, a[0], a[1], fmt.Sprintf("%s %s (%s states) hung at %s itself", num(a[0]), plural(a[0], "cycle", "cycles"), num(a[1]), in.signalName(false, stem.Signal)))
			has["cycle-ring"] = true
		}
		ids := stem.States.IDs()
		if len(ids) == 0 {
			s.text(x, cy+4.5, "no stem of its own (drives a cycle or a state another signal feeds)", smallSize, false, 's', colMuted)
		}
		var draw []int32 // -1 marks the shortened middle
		if len(ids) <= slots {
			draw = ids
		} else {
			head := slots - 2
			draw = append(append(append([]int32{}, ids[:head]...), -1), ids[len(ids)-1])
		}
		prevEnd := leftPad + signalWidth(in.signalName(false, stem.Signal))
		if stem.Cost != nil {
			prevEnd += textWidth(words.Thousands(stem.Cost.String()), smallSize, false) + 9
		}
		for i, id := range draw {
			col, dash := colBlue, ""
			if i == 0 {
				col, dash = colOrange, "dash"
				has["signal-edge"] = true
			} else {
				has["stem"] = true
			}
			if id < 0 {
				hidden := len(ids) - len(draw) + 1
				w := boxW
				arrow(s, colBlue, 3, prevEnd, x, cy, "")
				s.tip(fmt.Sprintf("%s more states of this stem, not drawn", num(hidden)))
				it := s.rect(x, cy-boxH/2, w, boxH, "#F2F2F2", colBlue, 1.2)
				it.rx, it.dash = 4, "dash"
				s.text(x+w/2, cy+4.5, "… "+num(hidden)+" more …", smallSize, false, 'm', colInk)
				s.end()
				prevEnd = x + w
				x += w + gapW
				continue
			}
			arrow(s, col, map[bool]float64{true: 1.6, false: 3}[i == 0], prevEnd, x, cy, dash)
			drawState(s, in, m, has, id, x, cy-boxH/2, boxW)
			if a, ok := anchored[id]; ok {
				cycleMark(s, x+boxW/2-20, cy+boxH/2+2, a[0], a[1], fmt.Sprintf("%s %s (%s states) hung from %s", num(a[0]), plural(a[0], "cycle", "cycles"), num(a[1]), name(in.Net.Name(id))))
				has["cycle-ring"] = true
			}
			prevEnd = x + boxW
			x += boxW + gapW
		}
		// What the row holds in all.
		var facts []string
		facts = append(facts, num(len(ids))+" "+plural(len(ids), "state", "states"))
		if stem.Cycles > 0 {
			facts = append(facts, fmt.Sprintf("%s %s of %s hung", num(stem.Cycles), plural(stem.Cycles, "cycle", "cycles"), num(stem.CycleStates)))
		}
		s.text(sceneWidth-leftPad, cy+4.5, strings.Join(facts, ", "), smallSize, false, 'e', colMuted)
		y += rowH
	}
	// What is not drawn one by one, and what hangs from nothing.
	var foot []string
	if rest := len(st.Stems) - shown; rest > 0 {
		states, lo, hi := 0, math.MaxInt, 0
		for _, x := range st.Stems[shown:] {
			l := x.States.Len()
			states += l
			lo, hi = min(lo, l), max(hi, l)
		}
		foot = append(foot, fmt.Sprintf("%s more %s, not drawn: %s states in all, %s to %s each.", num(rest), plural(rest, "stem", "stems"), num(states), num(lo), num(hi)))
	}
	if loose[0] > 0 {
		foot = append(foot, fmt.Sprintf("%s %s (%s states) hang from no stem: no signal reaches them through the control structure.", num(loose[0]), plural(loose[0], "cycle", "cycles"), num(loose[1])))
	}
	if st.Loose > 0 {
		foot = append(foot, fmt.Sprintf("%s %s on no stem or cycle: a dilation leaves them without a feed.", num(st.Loose), plural(st.Loose, "state lies", "states lie")))
	}
	if k := len(in.unreached); k > 0 {
		foot = append(foot, fmt.Sprintf("%s %s unreached by every signal.", num(k), plural(k, "state", "states")))
	}
	if pl := in.CompleteIn; pl != nil && pl.Feasible && pl.Added.Len() > 0 {
		var names []string
		for i, v := range pl.Added.IDs() {
			if i == 12 {
				names = append(names, fmt.Sprintf("and %s more", num(pl.Added.Len()-12)))
				break
			}
			names = append(names, in.shownName(v)+" ("+words.Thousands(pl.CostOf(v).String())+")")
		}
		foot = append(foot, fmt.Sprintf("The cheapest completion adds %s %s, total cost %s: on %s.",
			num(pl.Added.Len()), pluralKind(pl.Added.Len(), "new actuator"), words.Thousands(pl.Cost.String()), strings.Join(names, ", ")))
	}
	y += 8
	for _, f := range foot {
		for _, l := range wrap(f, textSize, false, sceneWidth-2*leftPad) {
			y += textSize + 6
			s.text(leftPad, y, l, textSize, false, 's', colInk)
		}
	}
	y += 12
	lh := drawLegendAt(s, legendEntries(in, has, false), y, sceneWidth)
	s.H = y + lh + 10
	return s, has
}
