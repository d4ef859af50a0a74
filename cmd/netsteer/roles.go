package main

import (
	"bufio"
	"encoding/csv"
	"fmt"
	"io"

	"github.com/netsteer/netsteer/matching"
	"github.com/netsteer/netsteer/structural"
)

// driverRoles are the node and link roles shown by drivers --roles.
type driverRoles struct {
	nodes []structural.Role // per state
	links []structural.Role // per edge, aligned with g.Out.Adj
}

func computeDriverRoles(g *structural.Network, m *matching.Matching) *driverRoles {
	return &driverRoles{nodes: structural.NodeRoles(g, m), links: structural.LinkRoles(g, m)}
}

var nodeRoleOrder = []structural.Role{structural.Critical, structural.Intermittent, structural.Redundant}
var linkRoleOrder = []structural.Role{structural.Critical, structural.Ordinary, structural.Redundant}

// statesWith returns the states of the given role, in index order.
func (r *driverRoles) statesWith(role structural.Role) []int32 {
	var out []int32
	for v, x := range r.nodes {
		if x == role {
			out = append(out, int32(v))
		}
	}
	return out
}

// linksWith returns the edges (source, target) of the given role.
func (r *driverRoles) linksWith(g *structural.Network, role structural.Role) [][2]int32 {
	var out [][2]int32
	for u := 0; u < g.N(); u++ {
		lo := g.Out.Ptr[u]
		for k, v := range g.Out.Row(int32(u)) {
			if r.links[lo+int64(k)] == role {
				out = append(out, [2]int32{int32(u), v})
			}
		}
	}
	return out
}

var nodeRoleMeaning = map[structural.Role]string{
	structural.Critical:     "in every minimum driver set (no incoming edge)",
	structural.Intermittent: "in some minimum driver sets, not all",
	structural.Redundant:    "in no minimum driver set",
}

var linkRoleMeaning = map[structural.Role]string{
	structural.Critical:  "in every maximum matching: removing one raises N_D",
	structural.Ordinary:  "in some maximum matchings, not all",
	structural.Redundant: "in no maximum matching: removing one never changes N_D",
}

func (r *driverRoles) writeText(bw *bufio.Writer, g *structural.Network, perfect bool) {
	fmt.Fprintf(bw, "\nNode roles across all minimum driver sets (Jia et al., Nat. Commun. 2013):\n")
	if perfect {
		fmt.Fprintf(bw, "  (the maximum matching is perfect: no state is ever left unmatched, so all are\n  redundant by this measure, although one signal is still needed)\n")
	}
	for _, role := range nodeRoleOrder {
		ids := r.statesWith(role)
		fmt.Fprintf(bw, "  %-12s %8d  %s\n", role, len(ids), nodeRoleMeaning[role])
		if len(ids) > 0 && role != structural.Redundant {
			fmt.Fprintf(bw, "  %-12s %8s  %s\n", "", "", nameList(g, ids, maxListed))
		}
	}
	fmt.Fprintf(bw, "Link roles across all maximum matchings (Liu, Slotine & Barabasi, Nature 2011):\n")
	for _, role := range linkRoleOrder {
		ls := r.linksWith(g, role)
		fmt.Fprintf(bw, "  %-12s %8d  %s\n", role, len(ls), linkRoleMeaning[role])
		if len(ls) > 0 && role == structural.Critical {
			fmt.Fprintf(bw, "  %-12s %8s  %s\n", "", "", linkList(g, ls, maxListed))
		}
	}
}

// linkList joins up to max edges as "u -> v".
func linkList(g *structural.Network, ls [][2]int32, max int) string {
	s := ""
	for i, l := range ls {
		if i == max {
			s += fmt.Sprintf(" ... and %d more", len(ls)-max)
			break
		}
		if i > 0 {
			s += ", "
		}
		s += g.Name(l[0]) + " -> " + g.Name(l[1])
	}
	return s
}

// writeJSON adds the keys node_roles and link_roles: objects mapping each
// role to its states, or to its edges as [source, target] pairs.
func (r *driverRoles) writeJSON(j *jsonw, g *structural.Network) {
	j.key("node_roles")
	j.w.WriteByte('{')
	for i, role := range nodeRoleOrder {
		if i > 0 {
			j.w.WriteByte(',')
		}
		fmt.Fprintf(j.w, "\n    %q: ", role.String())
		writeNameArray(j.w, r.statesWith(role), g.Name)
	}
	j.w.WriteString("\n  }")
	j.key("link_roles")
	j.w.WriteByte('{')
	var buf []byte
	for i, role := range linkRoleOrder {
		if i > 0 {
			j.w.WriteByte(',')
		}
		fmt.Fprintf(j.w, "\n    %q: [", role.String())
		for k, l := range r.linksWith(g, role) {
			if k > 0 {
				j.w.WriteString(", ")
			}
			j.w.WriteByte('[')
			buf = appendJSONString(buf[:0], g.Name(l[0]))
			j.w.Write(buf)
			j.w.WriteString(", ")
			buf = appendJSONString(buf[:0], g.Name(l[1]))
			j.w.Write(buf)
			j.w.WriteByte(']')
		}
		j.w.WriteByte(']')
	}
	j.w.WriteString("\n  }")
}

// writeCSV writes the roles as rows kind,source,target,role: one per state
// (kind "node", empty target) and one per edge (kind "link").
func (r *driverRoles) writeCSV(w io.Writer, g *structural.Network) error {
	cw := csv.NewWriter(w)
	cw.Write([]string{"kind", "source", "target", "role"})
	for v, role := range r.nodes {
		cw.Write([]string{"node", g.Name(int32(v)), "", role.String()})
	}
	for u := 0; u < g.N(); u++ {
		lo := g.Out.Ptr[u]
		for k, v := range g.Out.Row(int32(u)) {
			cw.Write([]string{"link", g.Name(int32(u)), g.Name(v), r.links[lo+int64(k)].String()})
		}
	}
	cw.Flush()
	return cw.Error()
}
