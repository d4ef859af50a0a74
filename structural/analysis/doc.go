// Package analysis answers the questions of a design review with one call
// each: Drivers (the fewest independent signals and where they go), Check
// (judge a design for controllability and observability, with the cheapest
// completion of a failing one), Place (the cheapest dedicated actuators or
// sensors) and Review (everything a picture or a review page shows).
//
// Each call takes a network and a request and returns one result value:
// structs with json tags, written by encoding/json, whose state lists
// marshal as the states' names. The same key means the same thing in every
// result; property objects (controllability, observability) have one
// shape; every timing key ends in _s. The command line is a thin layer over
// these calls.
//
// Edge convention: u -> v means u acts on v, A[v][u] != 0; an input drives
// states (a column of B), an output senses states (a row of C).
//
// Structural answers hold for almost all values of the free parameters.
// They are a screening step: they do not replace dynamic studies, safety
// analysis, local codes or licensed engineering review.
package analysis
