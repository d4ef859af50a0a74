// Package placement finds the cheapest dedicated devices for structural
// controllability and observability: Place (least total cost, then fewest
// devices, honouring forbidden states and existing devices; Pequito, Kar &
// Aguiar, Automatica 2016), Count (the closed form m + beta - alpha with
// unit costs; Pequito, Kar & Aguiar, IEEE TAC 2016), Complete (the
// cheapest additions to a given design) and Placement.Roles (whether each
// new device is forced, and where else it could go).
//
// A dedicated actuator drives one state (a column of B with one nonzero);
// a dedicated sensor measures one (a row of C). Sensors are actuators of
// the transposed network. Edge convention as in structural: u -> v means
// u acts on v, A[v][u] != 0.
package placement
