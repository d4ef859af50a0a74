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
//
// Costs are non-negative decimal numbers with at most three decimals and at
// most 10^9; they are held as integers in thousandths (CostScale units per
// 1), so sums are exact. Booleans accept yes/no, y/n, true/false and 1/0,
// in any case; an empty cell takes the default. A state listed with an
// existing device must allow one.
//
// An unknown column is a warning; a bad value, a repeated node or a missing
// node column is an error printed as "FILE:LINE: message" (type
// netread.Error). States of the table that are in no edge of the network
// become isolated states (each needs its own device); Isolated returns a
// warning naming each, since a misspelt name looks the same.
package nodetable
