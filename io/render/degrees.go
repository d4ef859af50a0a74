package render

import (
	"fmt"
	"math"

	"github.com/netsteer/netsteer/structural/analysis"
)

// bin is one bar of a drawn histogram: values lo..hi.
type bin struct {
	lo, hi int
	a, b   int // counts of the two series
}

// binsOf merges two histograms into bars: one per value up to 20
// distinct values, else powers of two (0, 1, 2-3, 4-7, ...).
func binsOf(a, b []analysis.Bin) []bin {
	top := 0
	for _, x := range a {
		top = max(top, x.K)
	}
	for _, x := range b {
		top = max(top, x.K)
	}
	var out []bin
	if top <= 20 {
		for k := 0; k <= top; k++ {
			out = append(out, bin{lo: k, hi: k})
		}
	} else {
		out = append(out, bin{lo: 0, hi: 0})
		for lo := 1; lo <= top; lo *= 2 {
			out = append(out, bin{lo: lo, hi: 2*lo - 1})
		}
	}
	find := func(k int) int {
		for i := range out {
			if k >= out[i].lo && k <= out[i].hi {
				return i
			}
		}
		return len(out) - 1
	}
	for _, x := range a {
		out[find(x.K)].a += x.Count
	}
	for _, x := range b {
		out[find(x.K)].b += x.Count
	}
	return out
}

func total(bs []analysis.Bin) int {
	t := 0
	for _, x := range bs {
		t += x.Count
	}
	return t
}

// histogram draws bars of the fractions of two series (b may be empty)
// in the box (x, y, w, h), with its title and axis labels.
func histogram(s *scene, x, y, w, h float64, title, xlabel string, a, b []analysis.Bin, colA, colB string, nameA, nameB string) {
	s.text(x, y+titleSize-4, fit(title, textSize+1, true, w), textSize+1, true, 's', colInk)
	top := y + 30
	plotH := h - 30 - 44
	bins := binsOf(a, b)
	ta, tb := total(a), total(b)
	maxF := 0.0
	for _, bn := range bins {
		if ta > 0 {
			maxF = math.Max(maxF, float64(bn.a)/float64(ta))
		}
		if tb > 0 {
			maxF = math.Max(maxF, float64(bn.b)/float64(tb))
		}
	}
	if maxF == 0 {
		maxF = 1
	}
	// Y axis with three ticks.
	ax := x + 44
	aw := w - 50
	s.line(colInk, 1, ax, top, ax, top+plotH)
	s.line(colInk, 1, ax, top+plotH, ax+aw, top+plotH)
	for _, f := range []float64{0, 0.5, 1} {
		yy := top + plotH - f*plotH
		s.line(colInk, 1, ax-4, yy, ax, yy)
		s.text(ax-6, yy+4, fmt.Sprintf("%.2g", f*maxF), smallSize, false, 'e', colMuted)
	}
	slot := aw / float64(len(bins))
	barW := slot * 0.8
	if len(b) > 0 {
		barW = slot * 0.4
	}
	every := int(math.Ceil(float64(len(bins)) / 10))
	for i, bn := range bins {
		bx := ax + float64(i)*slot + slot*0.1
		label := fmt.Sprint(bn.lo)
		if bn.hi > bn.lo {
			label = fmt.Sprintf("%d-%d", bn.lo, bn.hi)
		}
		if ta > 0 && bn.a > 0 {
			f := float64(bn.a) / float64(ta)
			s.tip(fmt.Sprintf("%s, %s %s: %s (%.3g)", nameA, xlabel, label, num(bn.a), f))
			s.rect(bx, top+plotH-f/maxF*plotH, barW, f/maxF*plotH, colA, "", 0)
			s.end()
		}
		if tb > 0 && bn.b > 0 {
			f := float64(bn.b) / float64(tb)
			s.tip(fmt.Sprintf("%s, %s %s: %s (%.3g)", nameB, xlabel, label, num(bn.b), f))
			s.rect(bx+barW, top+plotH-f/maxF*plotH, barW, f/maxF*plotH, colB, colInk, 1)
			s.end()
		}
		if i%every == 0 {
			s.text(ax+float64(i)*slot+slot/2, top+plotH+16, label, smallSize, false, 'm', colMuted)
		}
	}
	s.text(ax+aw/2, top+plotH+34, xlabel, smallSize, false, 'm', colInk)
}

// degreesScene draws the in- and out-degree distributions of all states
// against the states the signals act on, and the stem lengths.
func degreesScene(in *Input, v *View) (*scene, map[string]bool) {
	d := analysis.Distribute(in.Net, in.In)
	has := map[string]bool{"all-states": true}
	s := &scene{W: sceneWidth}
	top := header(s, in, v.Desc, sceneWidth)
	kind := in.inputKind()
	if d.Signals != "" {
		has["signal-states"] = true
	}
	w := (sceneWidth - 2*leftPad - 40) / 3
	h := 330.0
	sig := "states " + article(kind) + " acts on"
	histogram(s, leftPad, top+6, w, h, "In-degree (fraction of states)", "in-degree", d.InAll, d.InSignal, "#BDBDBD", colOrange, "all states", sig)
	histogram(s, leftPad+w+20, top+6, w, h, "Out-degree (fraction of states)", "out-degree", d.OutAll, d.OutSignal, "#BDBDBD", colOrange, "all states", sig)
	if len(d.StemLengths) > 0 {
		histogram(s, leftPad+2*w+40, top+6, w, h, "Stem lengths (fraction of stems)", "states on the stem", d.StemLengths, nil, colBlue, "", "stems", "")
		has["stem-lengths"] = true
	}
	y := top + 6 + h + 10
	lh := drawLegendAt(s, legendEntries(in, has, false), y, sceneWidth)
	s.H = y + lh + 10
	return s, has
}
