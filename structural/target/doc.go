// Package target answers target-control questions: can a design steer a
// chosen set T of states (zone temperatures, bus voltages, formation
// positions) when the others need not be steered, and which signals, or
// which dedicated actuators at least cost, steer them.
//
// Conventions. As in package structural, an edge u -> v means that u acts
// on v: A[v][u] is a free nonzero parameter. C has one row per target,
// selecting it. The design steers the targets (is structurally target
// controllable, or structurally output controllable for this C) when the
// generic rank of C·K, K = [B, AB, ..., A^(N-1)B], is |T|; that rank is the
// generic target-controllable dimension. Observability questions are asked
// on the transposed network, as in package structural.
//
// What is proved, and by whom.
//
//   - Only the part H of the network that some input reaches and that
//     reaches some target matters: every walk from a driven state to a
//     target stays in H, so C·A^k·B = C_H·A_H^k·B_H.
//   - Upper bounds on the rank: the reached targets; the in-capacity, the
//     largest matching of the targets into distinct in-neighbours or
//     signals (a set T' of targets has rank at most |N(T')|, the states
//     and signals acting on it; König's theorem turns the minimum over T'
//     into a matching); layer cuts; the generic controllable dimension
//     (Hosoe 1980); and the largest linking in the dynamic graph of |H|
//     layers, by the Lindström–Gessel–Viennot lemma, which holds for the
//     shared parameters of a time-invariant A.
//   - Lower bounds: the largest set of vertex-disjoint paths from distinct
//     inputs to distinct targets, which is the generic rank of the
//     transfer matrix (van der Woude, Math. Control Signals Systems 4,
//     1991) and never exceeds the rank of C·K; and the exact rank of C·K
//     for one random sample over GF(2^61-1), which never exceeds the
//     generic rank and reaches it with probability at least 1 - N²/(p-1)
//     (numeric's Schwartz–Zippel bound).
//   - Murota & Poljak ("Note on a graph-theoretic criterion for structural
//     output controllability", IEEE TAC 35(8), 1990) characterise the
//     generic rank of C·K as the largest linking in the dynamic graph. The
//     upper-bound half is proved above; the equality is taken from the
//     literature (the paper was not at hand: the statement is as cited in
//     the issue and in later work) and is cross-checked here, against the
//     Kalman rank, on thousands of random systems, where it always held.
//     Where a lower bound rests on it (a linking found, not a sample or a
//     Lin certificate), results say so: Verdict.ByTheorem, and the proof
//     "dynamic_linking" of a Selection, which occurs only where the part
//     that matters exceeds the sample's size or work limits.
//   - Gao, Liu, D'Souza & Barabási ("Target control of complex networks",
//     Nat. Commun. 5:5415, 2014) prove, for directed trees, that one input
//     steers targets whose distances from it are distinct (k-walk theory),
//     and give the greedy that walkGreedy follows. Minimum input selection
//     for target control is NP-hard (Czeizler, Wu, Gratie, Kanhaiya &
//     Petre, IEEE/ACM TCBB 15(4), 2018).
//   - A design is also proved when Lin's theorem holds on a subnetwork S
//     that contains the targets, every edge from outside S removed:
//     removing edges sets parameters to zero, which cannot raise a rank,
//     and the subnetwork then evolves on its own and steers all of S.
//     Full control of the states that act on the targets (they form such a
//     closed S) is the case that is never worse than today's answer.
//
// The package owns Check (judge a design), Select (fewest signals or
// cheapest actuators for the targets, with lower bounds) and Sample (the
// exact sampled rank of C·K over GF(p), for the verify question).
//
// Structural results hold for almost all values of the parameters. They
// are a screening step and do not replace dynamic studies, safety analysis
// or engineering review.
package target
