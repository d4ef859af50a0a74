// Package netread reads networks from edge lists, Matrix Market coordinate
// files and DOT digraphs into structural.Network values.
//
// Conventions. In an edge list a line "u v" is the edge u -> v: u acts on v.
// In a Matrix Market file the entry (i, j) is A[i][j] != 0, the edge j -> i,
// and states are named by their 1-based indices. In DOT, "u -> v" is the
// edge u -> v. Gzip-compressed input is recognised by its magic bytes,
// whatever the file is called.
//
// Every error is an *Error that prints as "FILE:LINE: message". Limits are
// checked before memory is reserved: a header's claims never size an
// allocation on their own, and a name longer than MaxNameBytes is an error.
package netread
