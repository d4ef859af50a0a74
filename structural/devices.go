package structural

import (
	"errors"
	"strconv"
	"strings"
)

// Cost is an amount of money or effort in thousandths of the user's unit,
// so that costs given with up to three decimals add exactly.
type Cost int64

// Unit is a cost of 1.
const Unit Cost = 1000

// MaxCost is the largest cost accepted for one device.
const MaxCost = Unit * 1_000_000_000

// String writes the cost as a decimal without trailing zeros: 2.5, 3.
func (c Cost) String() string {
	neg := c < 0
	if neg {
		c = -c
	}
	s := strconv.FormatInt(int64(c/Unit), 10)
	if f := c % Unit; f != 0 {
		s += "." + strings.TrimRight(strconv.FormatInt(int64(Unit+f), 10)[1:], "0")
	}
	if neg {
		s = "-" + s
	}
	return s
}

// MarshalJSON writes the cost as a JSON number: 2.5.
func (c Cost) MarshalJSON() ([]byte, error) { return []byte(c.String()), nil }

// ParseCost reads a plain non-negative decimal with at most three
// decimals ("2", "2.5", ".25") up to MaxCost.
func ParseCost(s string) (Cost, error) {
	whole, frac, dot := strings.Cut(s, ".")
	bad := errors.New("structural: a cost is a plain decimal with at most 3 decimals, at most 10^9")
	if whole == "" && (!dot || frac == "") || len(frac) > 3 || len(whole) > 10 {
		return 0, bad
	}
	for _, part := range []string{whole, frac} {
		for i := 0; i < len(part); i++ {
			if part[i] < '0' || part[i] > '9' {
				return 0, bad
			}
		}
	}
	var w int64
	if whole != "" {
		w, _ = strconv.ParseInt(whole, 10, 64)
	}
	f := int64(0)
	for i := 0; i < 3; i++ {
		f *= 10
		if i < len(frac) {
			f += int64(frac[i] - '0')
		}
	}
	c := Cost(w)*Unit + Cost(f)
	if w > int64(MaxCost/Unit) || c > MaxCost {
		return 0, bad
	}
	return c, nil
}

// Devices says where dedicated devices (actuators or sensors, one state
// each) may go and what a new one costs. Every non-nil slice has one entry
// per state.
type Devices struct {
	// Cost is the cost of a new device on each state, at least 0; nil
	// means Unit for every state.
	Cost []Cost
	// Forbidden marks the states that cannot take a device; nil means
	// none.
	Forbidden []bool
	// Existing marks the states that already have a device. Existing
	// devices are kept and cost nothing.
	Existing []bool
}

// Check reports an error when a non-nil slice of d does not have one
// entry per state of g, a cost is negative, or a state both has a device
// and forbids one.
func (d Devices) Check(g *Network) error {
	n := g.N()
	if d.Cost != nil && len(d.Cost) != n || d.Forbidden != nil && len(d.Forbidden) != n || d.Existing != nil && len(d.Existing) != n {
		return errors.New("structural: device table length differs from the number of states")
	}
	for v := 0; v < n; v++ {
		if d.Cost != nil && d.Cost[v] < 0 {
			return &StateError{State: g.Name(int32(v)), Msg: "negative device cost"}
		}
		if d.Existing != nil && d.Existing[v] && d.Forbidden != nil && d.Forbidden[v] {
			return &StateError{State: g.Name(int32(v)), Msg: "has a device but forbids one"}
		}
	}
	return nil
}

// CostOf returns the cost of a new device on v.
func (d Devices) CostOf(v int32) Cost {
	if d.Cost == nil {
		return Unit
	}
	return d.Cost[v]
}

// Allowed reports whether v may take a new device.
func (d Devices) Allowed(v int32) bool { return d.Forbidden == nil || !d.Forbidden[v] }

// Has reports whether v already has a device.
func (d Devices) Has(v int32) bool { return d.Existing != nil && d.Existing[v] }

// Uniform reports whether every allowed state costs the same and no device
// exists yet: the case of the closed-form count.
func (d Devices) Uniform() bool {
	for _, x := range d.Existing {
		if x {
			return false
		}
	}
	first := Cost(-1)
	for v, c := range d.Cost {
		if d.Forbidden != nil && d.Forbidden[v] {
			continue
		}
		if first >= 0 && c != first {
			return false
		}
		first = c
	}
	return true
}
