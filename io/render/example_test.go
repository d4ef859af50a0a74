package render_test

import (
	"fmt"
	"os"

	"github.com/netsteer/netsteer/io/render"
	"github.com/netsteer/netsteer/structural"
)

// A three-state chain needs one driver; its two matched edges form the
// stem that carries control.
func ExampleDOT() {
	b := structural.NewBuilder()
	pump, _ := b.Intern([]byte("pump.speed"))
	flow, _ := b.Intern([]byte("line.flow"))
	level, _ := b.Intern([]byte("tank.level"))
	b.AddEdge(pump, flow)
	b.AddEdge(flow, level)
	g, _ := b.Build(structural.BuildOptions{})
	ds := structural.MinimumDrivers(g)
	in := &render.Input{Net: g, Inputs: ds.Inputs, InputKind: "driver node", Matching: ds.Matching, Title: "chain"}
	v, _ := render.Select(in, render.Options{})
	fmt.Println(v.Desc)
	fmt.Println(render.Summary(in))
	render.DOT(os.Stdout, in, v, "dot")
	// Output:
	// whole network
	// 3 states · 2 edges · 1 driver node
	// digraph "netsteer" {
	//   graph [layout=dot, fontname="Helvetica", fontsize=10, labelloc=t, labeljust=l, outputorder=edgesfirst, bgcolor="#FFFFFF", pad=0.2, rankdir=LR, splines=line, nslimit=1, nslimit1=1, mclimit=0.1, ranksep=0.45, nodesep=0.18];
	//   node [fontname="Helvetica", fontsize=10, shape=ellipse, style=filled, fillcolor="#FFFFFF", color="#333333", fontcolor="#333333", penwidth=1, height=0.3, margin="0.06,0.03"];
	//   edge [color="#9A9A9A", penwidth=0.8, arrowsize=0.6];
	//   s0 [label="pump.speed", tooltip="pump.speed; driven by u1", fillcolor="#56B4E9"];
	//   s1 [label="line.flow", tooltip="line.flow"];
	//   s2 [label="tank.level", tooltip="tank.level"];
	//   u1 [label="u1", shape=circle, fixedsize=true, width=0.42, fillcolor="#E69F00", color="#333333", tooltip="driver node drives pump.speed"];
	//   s0 -> s1 [color="#0072B2", penwidth=2.8, arrowsize=0.8];
	//   s1 -> s2 [color="#0072B2", penwidth=2.8, arrowsize=0.8];
	//   u1 -> s0 [color="#E69F00", penwidth=1.6, style=dashed];
	//   label=<<table border="0" cellborder="0" cellspacing="1" cellpadding="1"><tr><td align="left" balign="left"><font point-size="16"><b>chain</b></font></td></tr><tr><td align="left" balign="left"><font point-size="12">3 states · 2 edges · 1 driver node</font></td></tr><tr><td align="left" balign="left"><font point-size="10" color="#555555">view: whole network</font></td></tr><tr><td align="left"><table border="0" cellborder="0" cellspacing="3" cellpadding="1"><tr><td width="22" height="13" fixedsize="true" bgcolor="#E69F00" color="#333333" border="1"></td><td align="left"><font point-size="10">driver node signal u1, u2, … (dashed arrows)</font></td><td width="10"></td><td width="22" height="13" fixedsize="true" bgcolor="#56B4E9" color="#333333" border="1"></td><td align="left"><font point-size="10">state driven by a driver node</font></td><td width="10"></td><td width="24" height="4" fixedsize="true" bgcolor="#0072B2"></td><td align="left"><font point-size="10">stem: matched edges from an input</font></td><td width="10"></td></tr></table></td></tr></table>>;
	// }
}
