package gen

import (
	"strings"
)

// Direction is a set of lattice directions, a bit per compass step.
type Direction uint8

// The four lattice steps. Rows grow downwards, columns to the right.
const (
	Right Direction = 1 << iota
	Left
	Down
	Up
)

var directionNames = []struct {
	d     Direction
	names []string
}{
	{Right, []string{"right", "east"}},
	{Left, []string{"left", "west"}},
	{Down, []string{"down", "south"}},
	{Up, []string{"up", "north"}},
}

// ParseDirections reads a comma- or plus-separated list of right (east),
// left (west), down (south) and up (north), or "all".
func ParseDirections(s string) (Direction, error) {
	var d Direction
	for _, f := range strings.FieldsFunc(s, func(r rune) bool { return r == ',' || r == '+' || r == ' ' }) {
		f = strings.ToLower(f)
		if f == "all" {
			d |= Right | Left | Down | Up
			continue
		}
		found := false
		for _, dn := range directionNames {
			for _, n := range dn.names {
				if n == f {
					d |= dn.d
					found = true
				}
			}
		}
		if !found {
			return 0, errorf("grid direction %q: want right, left, down, up or all", f)
		}
	}
	if d == 0 {
		return 0, errorf("no grid direction given")
	}
	return d, nil
}

// String lists the directions joined by '+', e.g. "right+down".
func (d Direction) String() string {
	var parts []string
	for _, dn := range directionNames {
		if d&dn.d != 0 {
			parts = append(parts, dn.names[0])
		}
	}
	return strings.Join(parts, "+")
}

// Grid emits a 2-D lattice of n states laid out row by row, width states a
// row (the last row may be short), with an edge from every state to its
// lattice neighbour in each chosen direction: right,down makes a
// feed-forward mesh (a process train of parallel lines), all four a meshed
// grid with two-way couplings. Time O(n).
func Grid(n, width int, dirs Direction, sink Sink) error {
	if n < 1 || n > maxStates {
		return errorf("nodes %d out of range [1, %d]", n, maxStates)
	}
	if width < 1 || width > n {
		return errorf("grid width %d out of range [1, %d]", width, n)
	}
	if dirs == 0 {
		return errorf("no grid direction given")
	}
	for i := 0; i < n; i++ {
		c := i % width
		if dirs&Right != 0 && c+1 < width && i+1 < n {
			sink.AddEdge(int32(i), int32(i+1))
		}
		if dirs&Left != 0 && c > 0 {
			sink.AddEdge(int32(i), int32(i-1))
		}
		if dirs&Down != 0 && i+width < n {
			sink.AddEdge(int32(i), int32(i+width))
		}
		if dirs&Up != 0 && i >= width {
			sink.AddEdge(int32(i), int32(i-width))
		}
	}
	return nil
}

// GridEdges returns the number of edges Grid emits.
func GridEdges(n, width int, dirs Direction) int64 {
	if n < 1 || width < 1 || width > n {
		return 0
	}
	full, last := n/width, n%width
	// Horizontal neighbour pairs and vertical ones.
	h := int64(full)*int64(width-1) + int64(max(last-1, 0))
	v := int64(n - width)
	var l int64
	if dirs&Right != 0 {
		l += h
	}
	if dirs&Left != 0 {
		l += h
	}
	if dirs&Down != 0 {
		l += v
	}
	if dirs&Up != 0 {
		l += v
	}
	return l
}
