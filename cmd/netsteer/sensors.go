package main

import (
	"github.com/spf13/pflag"

	"github.com/netsteer/netsteer/io/nodetable"
	"github.com/netsteer/netsteer/structural"
)

var sensorsCmd = &command{
	name:    "sensors",
	summary: "cheapest dedicated sensors that make the network observable",
	usage: `Usage: netsteer sensors [options] NET

Finds the cheapest set of dedicated sensors (each measuring one state) that,
with the sensors already in place, makes the network structurally
observable. It is the dual of "netsteer actuators": the same exact method on
the network with every edge reversed, so sink components (no edge leaves
them) take the place of source components and out-neighbours that of
in-neighbours: every sink component needs a sensor and the states without
one must be matched to distinct out-neighbours.

Without a node table every sensor costs 1 and the answer is the minimum
number m + beta - alpha (Pequito, Kar & Aguiar, IEEE TAC 2016) on the
reversed network. With --node-table FILE the columns sensor_cost, can_sense
and has_sensor give costs, allowed states and existing sensors; the answer
is the least total cost of new sensors, then the fewest (Pequito, Kar &
Aguiar, Automatica 2016), by the minimum-cost flow described under
"netsteer help actuators": O(K E sqrt(N)) for K distinct costs plus
O(R (E + N) log N) for R sink components needing a path.

--roles tells, for each new sensor, whether every cheapest placement has one
there (forced) or which states could take its place at the same cost.

NET is an edge list ("u v" means u acts on v), a Matrix Market file (.mtx)
or a DOT digraph (.dot, .gv); gzip is detected; - reads standard input.

Exit status: 0 when a placement exists, 1 when none does, 2 on error.

Example:
  netsteer sensors testdata/plant/heating.edges
  netsteer sensors --node-table plant-devices.csv --roles --format json plant.edges
`,
	run: func(e *env, c *command, fs *pflag.FlagSet, args []string) int {
		return runPlacement(e, c, fs, args, sensorWords)
	},
}

func init() { register(sensorsCmd) }

var sensorWords = &placeWords{
	device: "sensor", devices: "sensors", property: "structurally observable",
	component: "sink component", reach: "observe", dilation: "contraction",
	neighbours: "out-neighbours", canColumn: "can_sense",
	place: structural.PlaceSensors, count: structural.CountSensors,
	table: (*nodetable.Table).Sensors,
}
