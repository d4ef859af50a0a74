package design

import "github.com/netsteer/netsteer/structural"

// Design turns signals read for g into a structural.Design that remembers
// each signal's file line.
func Design(g *structural.Network, signals []Signal) (structural.Design, error) {
	lines := make([]int, len(signals))
	for i, s := range signals {
		lines[i] = s.Line
	}
	return structural.NewDesign(g, States(signals), lines)
}
