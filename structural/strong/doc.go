// Package strong decides strong structural controllability and
// observability: whether a design works for every value of the couplings,
// not only for almost all of them as package structural's answers do, and
// places dedicated actuators and sensors for it.
//
// Edge convention: as everywhere in netsteer, u -> v means u acts on v,
// A[v][u] is an entry of the pattern of dx/dt = A x + B u, y = C x.
//
// The class of systems. The answer depends on which matrices count, so the
// class is part of every question (Class): every listed edge is a nonzero
// entry, unless marked may-be-zero (then it is arbitrary: zero or not);
// every unlisted off-diagonal entry is exactly zero; the unlisted diagonal
// entries (states without a self-loop) are free (FreeDiagonal, the
// default, the widest class), exactly zero (ZeroDiagonal) or nonzero
// (NonzeroDiagonal); entries of B (C) are nonzero on the states a signal
// lists. These are the zero / nonzero / arbitrary patterns of Jia, van
// Waarde, Trentelman & Camlibel (IEEE TAC 66(1), 2021).
//
// Check judges a design with two colourings of the network (zero forcing
// with the colour change rule of Jia et al.): one for the eigenvalue 0 and
// one for every other eigenvalue. It is exact for every class above, in
// O(N + E) time. When the design fails it names the states the colouring
// cannot reach, and builds a witness: integer values for the entries of
// one system of the class, an eigenvalue and a vector that B (C) cannot
// see, confirmed in exact integer arithmetic before it is returned.
//
// Place finds the cheapest dedicated devices for strong structural
// controllability (observability): exact by branch and bound over forts up
// to ExactStates states and a node budget, beyond that a near-linear
// heuristic, with a proved lower bound and the gap.
//
// A strong answer holds for every system of the class, and only for the
// class: a model with a coupling outside it (an edge missing from the
// file, a coupling that can vanish but is not marked) is not covered. Like
// every structural result it is a screening step, no substitute for
// dynamic studies, safety analysis or engineering review.
package strong
