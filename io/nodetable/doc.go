// Package nodetable reads node tables: per-state facts about where
// dedicated devices (actuators, sensors) may go, what they cost, which
// already exist, and how states are grouped and labelled for drawings.
//
// A node table is a CSV file (RFC 4180 quoting, '#' comment lines) whose
// first row names the columns. Only node is required; the others, in any
// order, are
//
//	node          the state's name, exactly as in the network file
//	actuator_cost cost of a new actuator on the state (default 1)
//	can_actuate   yes or no: may an actuator go there (default yes)
//	has_actuator  yes or no: an actuator is already there (default no)
//	sensor_cost   cost of a new sensor (default 1)
//	can_sense     yes or no (default yes)
//	has_sensor    yes or no (default no)
//	group         plant area or unit, for drawings
//	label         name to show in drawings
//	isolated      yes or no: the state is meant to exist even when no edge of
//	              the network names it (default no)
//
// Costs are non-negative decimal numbers with at most three decimals and at
// most 10^9; they are held as integers in thousandths (CostScale units per
// 1), so sums are exact. Booleans accept yes/no, y/n, true/false and 1/0,
// in any case; an empty cell takes the default. A state listed with an
// existing device must allow one.
//
// An unknown column is a warning; a bad value, a repeated node, a missing
// node column, a name (or label, group) holding a control character and a
// line longer than MaxLineBytes are errors printed as "FILE:LINE: message"
// (type netread.Error); values echoed in messages are clipped.
//
// A row naming a state that is in no edge of the network is most likely a
// misspelt name: pass States(false) to the network reader and Check
// returns an error naming the row and the nearest names of the network.
// Rows with isolated=yes are added as isolated states (each needs its own
// device); a caller that accepts every row passes States(true), and
// Isolated then warns about the rows that were not marked.
//
// Read hashes (SHA-256) and counts the bytes it reads: Table.SHA256 and
// Table.Size certify the table that was used.
package nodetable
