// Package structural answers structural controllability and observability
// questions about linear networks known by their wiring.
//
// Conventions. A Network has N states numbered 0..N-1 and keeps each
// state's name verbatim. An edge u -> v means that u acts on v: the entry
// A[v][u] of the state matrix is a free nonzero parameter (Liu, Slotine &
// Barabási, Nature 473:167, 2011, write a_ij != 0 for a link j -> i). A
// self-loop u -> u is a state's own dynamics, a cycle of length one.
// Network.Succ and Network.Out list each state's targets (row u: the v
// with u -> v), Network.Pred and Network.In each state's sources (row v: the
// u with u -> v), both as int32 compressed sparse rows with sorted,
// duplicate-free rows. A built Network never changes; its maximum matching,
// strongly connected components and transpose are computed once, on first
// use.
//
// A Design is a set of independent signals: inputs (columns of B), each
// driving a set of states, or outputs (rows of C), each sensing a set; a
// dedicated actuator (sensor) touches one state. Questions are asked of a
// Property, Controllability or Observability; observability is
// controllability of the transposed network, so one Verdict type and one
// Dilation type serve both. A design is structurally controllable when, by Lin's theorem,
// every state is reached from some input and there is no dilation: no set S
// of states whose in-neighbours, inputs included, number fewer than |S|.
//
// The package owns the network, its matching and components, Lin's test
// (Check), the generic dimension (Dimension), driver nodes (Drivers), node
// and link roles, the cavity prediction and the vocabulary shared by the
// packages below it: States, Design, Devices and Cost. Subpackages:
// placement (cheapest dedicated devices), transform (network variants),
// gen (generators), numeric (checks on sampled or given parameters).
//
// Structural results hold for almost all values of the free parameters.
// They are a screening step and do not replace dynamic studies, safety
// analysis or engineering review.
package structural
