// Package names holds the name table of a network: every state's name kept
// verbatim in one byte arena with an open-addressing hash index, so a
// network of 10^7 states costs a few allocations, not one per name; and the
// Interner that fills it while a network is read.
package names
