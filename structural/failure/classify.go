package failure

import (
	"github.com/netsteer/netsteer/structural"
	"github.com/netsteer/netsteer/structural/failure/internal/bip"
)

// classify completes the classes of the devices whose essential flags are
// set: the per-condition classes Reach and Matching, and the overall
// useful/useless split of the non-essential ones.
//
// Let F be the working sub-designs, F_r those reaching every state (every
// source strongly connected component touched by a signal) and F_m those
// without dilation. F_m is the family of spanning sets of a matroid M' on
// the signals (the transversal matroid of [A B]'s columns, contracted by
// the state columns), so for the dilation condition alone the essential
// devices are the coloops of M' and the useless ones its loops. A device s
// is useful overall exactly when some T in F containing s has T - s
// outside F, which happens in one of two ways:
//
//	(A) T - s reaches no longer: for some source component C that s
//	    touches, T = (D minus the signals touching C) + s is in F;
//	(B) T - s has a dilation: some hyperplane H of M' avoids s while H + s
//	    touches every source component; equivalently, choosing for each
//	    component not touched by s one signal touching it (the forced
//	    choices Z0 of components touched once, then the others) such that
//	    s stays outside the closure of the choice.
//
// (A) costs one local re-augmentation per source component touched more
// than once; (B) a search over the choices for the components not settled
// by the closure of Z0, each step an augmenting-path search from one
// column. Both are bounded by budget (adjacency entries scanned); devices
// not settled within it are Unresolved.
func classify(c *core, devs []DeviceLoss, budget int64, maxPartners int, d structural.Design) {
	n, k := c.n, c.k
	src := c.sources()
	comps := src.comps
	sccsOf, touchers, touch := src.sccsOf, src.touchers, src.touch
	stamp := make([]int32, comps.Count)

	// Reach class. For a source component C touched twice or more, lost
	// lists the components left untouched when every signal touching C is
	// lost; s qualifies through C when it touches all of them.
	viaA := map[int32][]int32{} // component -> devices qualifying for (A) through it
	cnt := make([]int32, comps.Count)
	mark := make([]int32, comps.Count)
	st, st2 := int32(0), int32(0)
	var lost []int32
	for x := int32(0); int(x) < comps.Count; x++ {
		ts := touchers(x)
		if len(ts) < 2 {
			continue
		}
		st++
		lost = lost[:0]
		for _, t := range ts {
			for _, y := range sccsOf(int(t)) {
				if stamp[y] != st {
					stamp[y], cnt[y] = st, 0
				}
				cnt[y]++
				if cnt[y] == touch[y+1]-touch[y] {
					lost = append(lost, y)
				}
			}
		}
		for _, s := range ts {
			if devs[s].Reach == Essential || len(lost) > len(sccsOf(int(s))) {
				continue
			}
			st2++
			for _, y := range sccsOf(int(s)) {
				mark[y] = st2
			}
			ok := true
			for _, y := range lost {
				if mark[y] != st2 {
					ok = false
					break
				}
			}
			if ok {
				devs[s].Reach = Useful
				if devs[s].Class != Essential {
					viaA[x] = append(viaA[x], s)
				}
			}
		}
	}

	// Matching class: loops of M' are the signals inside the closure of
	// the state columns alone, read from a maximum matching of A (the
	// network's own, computed once and kept): b works from it with every
	// signal off, a from the matching of [A B].
	hm := c.h.Matching()
	rowMate := make([]int32, n)
	colMate := make([]int32, n+k)
	off := make([]bool, n+k)
	for v := 0; v < n; v++ {
		rowMate[v] = hm.ColMate[v] // row v is matched to the state acting on it
		colMate[v] = hm.RowMate[v]
	}
	for i := 0; i < k; i++ {
		colMate[n+i] = -1
		off[n+i] = true
	}
	b := bip.NewAugOff(c.bg, rowMate, colMate, off)
	markB := b.Mark()
	b.AltReach(b.FreeRows())
	loop := make([]bool, k)
	for i := 0; i < k; i++ {
		loop[i] = !touchesReach(c, b, i)
		if devs[i].Matching != Essential && !loop[i] {
			devs[i].Matching = Useful
		}
	}
	a := bip.NewAug(c.bg, c.m)
	work := func() int64 { return a.Work + b.Work }

	state := make([]uint8, k) // 0 pending, 1 useful, 2 settled useless, 3 unresolved
	useful := 0
	setUseful := func(s int, partners []int32) {
		state[s] = 1
		devs[s].Class = Useful
		if useful < maxPartners && partners != nil {
			for _, t := range partners {
				if int(t) != s {
					devs[s].WithSignals = append(devs[s].WithSignals, int(t))
					devs[s].With = append(devs[s].With, d.Number(int(t)))
				}
			}
		}
		useful++
	}
	for i := 0; i < k; i++ {
		if devs[i].Class == Essential {
			state[i] = 2
		} else if devs[i].Reach == Useless && devs[i].Matching == Useless {
			state[i] = 2
			devs[i].Class = Useless
		}
	}
	over := func() bool { return budget >= 0 && work() > budget }

	// (A): one re-augmentation per component, without its touchers.
	aDone := true
	for x := int32(0); int(x) < comps.Count; x++ {
		if over() {
			aDone = false
			break
		}
		ss := viaA[x]
		if len(ss) == 0 {
			continue
		}
		any := false
		for _, s := range ss {
			if state[s] == 0 {
				any = true
			}
		}
		if !any {
			continue
		}
		m := a.Mark()
		var freed []int32
		for _, t := range touchers(x) {
			if r := a.Disable(int32(n) + t); r >= 0 {
				freed = append(freed, r)
			}
		}
		left := a.AugmentRows(freed)
		for _, s := range ss {
			if state[s] != 0 {
				continue
			}
			if len(left) == 0 || len(left) == 1 && a.CanAugmentCol(int32(n+int(s))) {
				setUseful(int(s), touchers(x))
			}
		}
		a.Undo(m)
	}
	settleUseless := func(s int) {
		state[s] = 2
		devs[s].Class = Useless
	}
	if aDone {
		for i := 0; i < k; i++ {
			if state[i] == 0 && loop[i] {
				settleUseless(i) // neither (A) nor, as a loop of M', (B)
			}
		}
	}

	// (B): the closure of the forced choices Z0 first.
	needB := false
	for i := 0; i < k; i++ {
		if state[i] == 0 && !loop[i] {
			needB = true
		}
	}
	if needB && aDone && !over() {
		for i := 0; i < k; i++ {
			if devs[i].Reach == Essential {
				b.Enable(int32(n + i))
			}
		}
		b.AugmentRows(b.FreeRows())
		b.AltReach(b.FreeRows())
		inCl0 := make([]bool, k)
		for i := 0; i < k; i++ {
			inCl0[i] = devs[i].Reach == Essential || !touchesReach(c, b, i)
		}
		// Components no signal of cl(Z0) touches.
		var open []int32
		for x := int32(0); int(x) < comps.Count; x++ {
			ts := touchers(x)
			if len(ts) == 0 {
				continue
			}
			settled := false
			for _, t := range ts {
				if inCl0[t] {
					settled = true
					break
				}
			}
			if !settled {
				open = append(open, x)
			}
		}
		markZ := b.Mark()
		// One shared choice R first: a signal for each open component not
		// yet settled. Every s outside cl(Z0 + R) (and not chosen) is
		// useful by (B) at once: the components it touches need no
		// choice, and dropping choices only shrinks the closure.
		chosen := make([]bool, k)
		for _, x := range open {
			settled := false
			for _, t := range touchers(x) {
				if col := int32(n) + t; !b.Off[col] || !b.CanAugmentCol(col) {
					settled = true
					break
				}
			}
			if !settled {
				t := touchers(x)[0]
				chosen[t] = true
				b.Enable(int32(n) + t)
				b.AugmentCol(int32(n) + t)
			}
		}
		b.AltReach(b.FreeRows())
		outside := make([]bool, k)
		for i := 0; i < k; i++ {
			outside[i] = !chosen[i] && touchesReach(c, b, i)
		}
		for s := 0; s < k; s++ {
			if state[s] != 0 || loop[s] || inCl0[s] || !outside[s] {
				continue
			}
			var partners []int32
			if useful < maxPartners {
				w, m := b.Work, b.Mark()
				partners = hyperplaneRest(b, n, k, s)
				b.Undo(m)
				b.Work = w
			}
			setUseful(s, partners)
		}
		b.Undo(markZ)
		// The others, one search each.
		for s := 0; s < k && !over(); s++ {
			if state[s] != 0 || loop[s] {
				continue
			}
			if inCl0[s] {
				settleUseless(s) // (B) fails: the forced choices span s
				continue
			}
			var blocks []int32
			for _, x := range open {
				if !touchesComp(sccsOf(s), x) {
					blocks = append(blocks, x)
				}
			}
			ok, done := searchB(b, n, s, blocks, touchers, over)
			if !done {
				state[s] = 3
			} else if !ok {
				settleUseless(s)
			} else {
				var partners []int32
				if useful < maxPartners {
					w := b.Work // the witness is not part of the split's budget
					partners = hyperplaneRest(b, n, k, s)
					b.Work = w
				}
				setUseful(s, partners)
			}
			b.Undo(markZ)
		}
		b.Undo(markB)
	}
	for i := 0; i < k; i++ {
		if state[i] == 0 || state[i] == 3 {
			devs[i].Class = Unresolved
		}
	}
}

// touchesReach reports whether signal i touches a row of the last
// alternating reach of a.
func touchesReach(c *core, a *bip.Aug, i int) bool {
	for _, r := range c.bg.Cols.Row(int32(c.n + i)) {
		if a.InReach(r) {
			return true
		}
	}
	return false
}

func touchesComp(sccs []int32, x int32) bool {
	for _, y := range sccs {
		if y == x {
			return true
		}
	}
	return false
}

// searchB looks for one signal per block (a source component) such that s
// stays outside the closure of the signals switched on: depth-first over
// the blocks, a block being settled when one of its signals is on or
// inside the closure. It reports the answer and whether the search ended
// within the budget. On success the choice is left switched on.
func searchB(a *bip.Aug, n, s int, blocks []int32, touchers func(int32) []int32, over func() bool) (ok, done bool) {
	sc := int32(n + s)
	settled := func(x int32) bool {
		for _, t := range touchers(x) {
			col := int32(n) + t
			if !a.Off[col] || !a.CanAugmentCol(col) {
				return true
			}
		}
		return false
	}
	type level struct {
		j, next, mark int
	}
	var stack []level
	j := 0
	for {
		for j < len(blocks) && settled(blocks[j]) {
			j++
		}
		if over() {
			return false, false
		}
		if j == len(blocks) {
			return true, true
		}
		stack = append(stack, level{j: j, mark: a.Mark()})
		for {
			top := &stack[len(stack)-1]
			ts := touchers(blocks[top.j])
			found := false
			for top.next < len(ts) {
				t := ts[top.next]
				top.next++
				a.Undo(top.mark)
				col := int32(n) + t
				a.Enable(col)
				a.AugmentCol(col)
				if a.CanAugmentCol(sc) {
					found = true
					break
				}
				if over() {
					return false, false
				}
			}
			if found {
				j = top.j + 1
				break
			}
			a.Undo(top.mark)
			stack = stack[:len(stack)-1]
			if len(stack) == 0 {
				return false, true
			}
		}
	}
}

// hyperplaneRest extends the signals switched on, X with s outside its
// closure, to a hyperplane H of M' avoiding s, and returns the signals
// outside H + s: losing them with s breaks the design, losing them alone
// does not. It matches s, then every other signal that an augmenting path
// reaches (each raises the rank by one, so s stays a coloop of the set
// T on), and takes H as the closure of T - s: the signals touching no row
// that an alternating path reaches from the row s leaves free. Cost: one
// augmentation pass and one alternating search.
func hyperplaneRest(a *bip.Aug, n, k, s int) []int32 {
	sc := int32(n + s)
	a.Enable(sc)
	a.AugmentCol(sc)
	var off []int32
	for t := 0; t < k; t++ {
		if col := int32(n + t); t != s && a.Off[col] {
			a.Enable(col)
			off = append(off, int32(t))
		}
	}
	a.AugmentRows(a.FreeRows())
	r := a.Disable(sc)
	a.AltReach([]int32{r})
	var rest []int32
	for _, t := range off {
		col := int32(n) + t
		if a.ColMate[col] >= 0 {
			continue // in T
		}
		for _, x := range a.Rows(col) {
			if a.InReach(x) {
				rest = append(rest, t)
				break
			}
		}
	}
	return rest
}
