// Package structural answers structural controllability and observability
// questions about linear networks known by their wiring.
//
// Conventions. A Network has N states numbered 0..N-1 and keeps each
// state's name verbatim. An edge u -> v means that u acts on v: the entry
// A[v][u] of the state matrix is a free nonzero parameter (Liu, Slotine &
// Barabási, Nature 473:167, 2011, write a_ij != 0 for a link j -> i). A
// self-loop u -> u is a state's own dynamics, a cycle of length one.
// Network.Out lists each state's targets (row u: the v with u -> v) and
// Network.In each state's sources (row v: the u with u -> v), both as int32
// compressed sparse rows with sorted, duplicate-free rows.
//
// An input (a column of B) drives a set of states; a dedicated actuator
// drives one. A design is structurally controllable when, by Lin's theorem,
// every state is reached from some input and there is no dilation: no set S
// of states whose in-neighbours, inputs included, number fewer than |S|.
//
// Structural results hold for almost all values of the free parameters.
// They are a screening step and do not replace dynamic studies, safety
// analysis or engineering review.
package structural
