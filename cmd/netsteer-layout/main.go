// Command netsteer-layout lays out Graphviz DOT text for "netsteer render"
// and "netsteer report" (see package gvlayout). It is a program of its own
// so that netsteer does not link Graphviz: only drawing pays its start-up.
package main

import (
	"os"

	"github.com/netsteer/netsteer/io/render/gvlayout"
)

func main() { os.Exit(gvlayout.Main(os.Stdin, os.Stdout, os.Stderr, os.Args[1:])) }
