// Package design reads the input and output design files that go with a
// network: one independent input (or output) per non-comment line, the names
// on the line being the states it drives (or senses). A line with one name
// is a dedicated actuator (sensor).
//
// Names are separated by white space or commas and may be double-quoted as
// in an edge list. With weights enabled, a name may carry a value after its
// last colon, "name:value", the actual entry of B (or C). Lines starting with
// '#' or '%' and blank lines are ignored. A leading byte-order mark is
// skipped; a name holding a control character (a byte below 0x20 other than
// tab, or 0x7f) is an error. Every error prints as
// "FILE:LINE: message".
package design
