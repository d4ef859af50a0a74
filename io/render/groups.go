package render

import (
	"fmt"
	"math"
	"sort"

	"github.com/netsteer/netsteer/structural/analysis"
)

// maxGroupRows bounds the groups drawn one by one (largest first).
const maxGroupRows = 30

// groupsScene draws the summary by node-table group: a table of counts
// and, beside it, a bar per group split into driven, unreached and other
// states.
func groupsScene(in *Input, v *View) (*scene, map[string]bool) {
	rows := analysis.ByGroup(in.Net, in.Group, in.In, in.Out)
	has := map[string]bool{}
	s := &scene{W: sceneWidth}
	top := header(s, in, v.Desc, sceneWidth)
	// Largest groups first; the rest summed.
	sort.SliceStable(rows, func(a, b int) bool {
		if (rows[a].Group == "") != (rows[b].Group == "") {
			return rows[b].Group == ""
		}
		return rows[a].States > rows[b].States
	})
	var rest *analysis.GroupRow
	if len(rows) > maxGroupRows {
		r := analysis.GroupRow{Group: fmt.Sprintf("%s more groups", num(len(rows)-maxGroupRows+1))}
		for _, x := range rows[maxGroupRows-1:] {
			r.States += x.States
			r.Inputs += x.Inputs
			r.Outputs += x.Outputs
			r.Driven += x.Driven
			r.Sensed += x.Sensed
			r.New += x.New
			r.Unreached += x.Unreached
			r.Unobserved += x.Unobserved
			r.Dilation += x.Dilation
		}
		rows = append(rows[:maxGroupRows-1], r)
		rest = &rows[len(rows)-1]
	}
	ik := pluralKind(2, in.inputKind())
	ok := pluralKind(2, in.outputKind())
	cols := []string{"group", "states", ik, ok, "new devices", "unreached", "unobserved", "dilation"}
	widths := []float64{230, 70, 95, 80, 95, 85, 95, 75}
	x0 := leftPad
	y := top + 10
	cx := x0
	for i, c := range cols {
		anchor, tx := byte('e'), cx+widths[i]-6
		if i == 0 {
			anchor, tx = 's', cx+4
		}
		s.text(tx, y+14, fit(c, smallSize, true, widths[i]-8), smallSize, true, anchor, colInk)
		cx += widths[i]
	}
	tableW := cx - x0
	y += 22
	s.line(colInk, 1.5, x0, y, x0+tableW, y)
	chartX := x0 + tableW + 30
	chartW := sceneWidth - chartX - leftPad
	maxStates := 1
	for _, r := range rows {
		maxStates = max(maxStates, r.States)
	}
	const rh = 24.0
	for i, r := range rows {
		if i%2 == 1 {
			s.rect(x0, y, tableW, rh, "#F6F6F6", "", 0)
		}
		label := r.Group
		if label == "" {
			label = "(no group)"
		} else if rest == nil || &rows[i] != rest {
			label = name(label)
		}
		vals := []int{r.States, r.Inputs, r.Outputs, r.New, r.Unreached, r.Unobserved, r.Dilation}
		cx := x0
		s.text(cx+4, y+16, fit(label, textSize, false, widths[0]-8), textSize, false, 's', colInk)
		cx += widths[0]
		for j, val := range vals {
			col := colInk
			if (j >= 4) && val > 0 {
				col = colVermilion
			}
			s.text(cx+widths[j+1]-6, y+16, num(val), textSize, false, 'e', col)
			cx += widths[j+1]
		}
		// The bar: driven, unreached, then the other states.
		scale := chartW / float64(maxStates)
		bx := chartX
		seg := func(k int, fill, stroke, dash, key, what string) {
			if k <= 0 {
				return
			}
			w := float64(k) * scale
			s.tip(fmt.Sprintf("%s: %s %s", label, num(k), what))
			it := s.rect(bx, y+4, math.Max(w, 1.5), rh-8, fill, stroke, 1)
			it.dash = dash
			s.end()
			bx += w
			has[key] = true
		}
		seg(r.Driven, colSky, colInk, "", "driven", "driven")
		seg(r.Unreached, colYellow, colInk, "dash", "unreached", "unreached")
		seg(r.States-r.Driven-r.Unreached, "#E4E4E4", "#9A9A9A", "", "other-states", "other states")
		y += rh
	}
	s.line(colInk, 1, x0, y, x0+tableW, y)
	// The chart's axis.
	s.line(colInk, 1, chartX, y+4, chartX+chartW, y+4)
	for _, f := range []float64{0, 0.5, 1} {
		xx := chartX + f*chartW
		s.line(colInk, 1, xx, y+4, xx, y+9)
		s.text(xx, y+22, num(int(math.Round(f*float64(maxStates)))), smallSize, false, 'm', colMuted)
	}
	s.text(chartX+chartW/2, y+38, "states per group", smallSize, false, 'm', colMuted)
	y += 50
	lh := drawLegendAt(s, legendEntries(in, has, false), y, sceneWidth)
	s.H = y + lh + 10
	return s, has
}
