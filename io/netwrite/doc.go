// Package netwrite writes networks as files the netsteer readers take
// back: edge lists ("u v" a line, u acts on v), Matrix Market coordinate
// files (entry (i, j) for the edge j -> i) and node tables (CSV with a
// header row "node" and one row per state, isolated states included).
//
// An edge list cannot name a state that has no edge, so every network
// written as an edge list gets a node table beside it: reading the pair
// back (netread.Options.States, or the --node-table option of every
// command) restores exactly N states. A Matrix Market file carries N in its
// size line and needs no table; its states are named by their 1-based
// indices, which is how generated networks name them anyway.
//
// A path ending in .gz is written gzip-compressed. Every file goes through
// fileout.Write (a temporary file renamed over the target when complete).
package netwrite
