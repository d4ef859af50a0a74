// Command netsteer-bench holds the tools of the speed comparison with igraph
// and scipy (compare.sh, peers.py beside this file):
//
//	netsteer-bench gen -model er -n 1000000 -k 10 -o er.edges -bin er.i32
//	netsteer-bench stages -runs 3 FILE
//	netsteer-bench scale -sizes 250000,500000,1000000,2000000,4000000
//
// gen writes deterministic synthetic networks (structural/gen, gen.Workload);
// stages times read, match and components in wall and thread CPU time;
// scale runs every library question (drivers, roles, checks, placements)
// on the ER workload at several sizes, each in its own process, and prints
// wall and CPU seconds, peak memory, bytes per edge, the ratio to drivers
// and the fitted exponent of time against edges (see scale_linux.go).
package main

import (
	"fmt"
	"os"
)

func main() {
	if len(os.Args) < 2 {
		fmt.Fprintln(os.Stderr, "usage: netsteer-bench gen|stages|scale [options]")
		os.Exit(2)
	}
	switch os.Args[1] {
	case "gen":
		genMain(os.Args[2:])
	case "stages":
		stagesMain(os.Args[2:])
	case "scale":
		scaleMain(os.Args[2:])
	case "run-stage":
		runStageMain(os.Args[2:])
	default:
		fmt.Fprintf(os.Stderr, "netsteer-bench: unknown tool %q (want gen, stages or scale)\n", os.Args[1])
		os.Exit(2)
	}
}
