// Package netread reads networks from edge lists, Matrix Market coordinate
// files and DOT digraphs into structural.Network values.
//
// Conventions. In an edge list a line "u v" is the edge u -> v: u acts on v.
// In a Matrix Market file the entry (i, j) is A[i][j] != 0, the edge j -> i,
// and states are named by their 1-based indices. In DOT, "u -> v" is the
// edge u -> v. Gzip-compressed input is recognised by its magic bytes,
// whatever the file is called.
//
// Edge lists. Each line is "source target [weight]", the fields separated
// by white space or a comma; names holding a space, comma or quote are
// double-quoted, "" standing for a quote inside. Lines whose first
// non-blank character is '#' or '%' are comments. A leading UTF-8
// byte-order mark is skipped (also inside gzip input). A name may not hold
// a control character (a byte below 0x20 other than tab, or 0x7f), quoted
// or not. The first non-comment line is refused as a CSV header, with a
// message saying so, when its first two fields are source,target, from,to,
// src,dst or tail,head (any case, quoted or not) and it is not exactly
// three fields ending in a number; or when it has exactly three fields and
// the third is weight, value or w (any case). No other line is ever taken
// for a header: an edge between states named, say, "from" and "to" is read
// as an edge when it is not the first line (or carries a numeric weight).
//
// Matrix Market. Coordinate files with pattern, real or integer values and
// general, symmetric or skew-symmetric symmetry are read; symmetric files
// are expanded (an off-diagonal (i, j) also gives (j, i)), skew-symmetric
// ones too with the value negated, and a diagonal entry in a skew-symmetric
// file is an error. The matrix must be square. A stored entry is an edge
// whatever its value: an explicit zero counts as a pattern entry (with
// Options.Weights its weight is 0). Complex, hermitian and dense array
// files are refused. The size line must announce exactly the entries that
// follow, and at most 16 states per entry plus 2^20.
//
// DOT. The file holds one graph, parsed with gonum's DOT parser. Edge
// statements may chain (a -> b -> c) and take subgraphs as operands
// ({a b} -> c stands for a -> c and b -> c); node statements declare
// states, isolated ones included. An undirected graph's "a -- b" is the two
// couplings a -> b and b -> a. The weight attribute, on an edge statement
// or as an "edge [weight=...]" default for the rest of its (sub)graph, must
// be a finite nonzero number. A name is the ID's text: a quoted ID loses
// its quotes and \" becomes ", other IDs (HTML ones <...> included) are
// kept as written; names may not hold line breaks or other control
// characters (tab excepted). Ports are ignored.
// Syntax errors carry the line gonum's parser reports; errors found later
// carry the line of the ID or edge operator at fault. Inputs over
// MaxDOTBytes, braces nested over 1000 deep, edge chains over 100000 steps
// and subgraph operands that expand to far more edges than the file has
// bytes are refused.
//
// Every error is an *Error that prints as "FILE:LINE: message". Limits are
// checked before memory is reserved: a header's claims never size an
// allocation on their own, and a name longer than MaxNameBytes is an error.
package netread
