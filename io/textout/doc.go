// Package textout writes the results of structural/analysis as text
// reports for people and as CSV for spreadsheets. JSON needs no writer:
// the results marshal themselves.
//
// A text report gives the answer in its first lines, then the details,
// then the cautions. Lines are wrapped to Options.Width, long lists are
// capped unless Options.All is set, names that would read ambiguously are
// quoted as design files accept them, and numbers are written one way
// (plain digits).
package textout
