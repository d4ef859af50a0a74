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
//     output controllability", IEEE TAC 35(8), 1990) are cited for
//     characterising the generic rank of C·K as the largest linking in the
//     dynamic graph. Only the upper-bound half is proved here (above); the
//     paper was not at hand, and the equality, which would make a linking
//     a lower bound, is not used as one: recent work finds graph-theoretic
//     characterisations of target controllability incomplete (Peruzzo,
//     Baggio & Ticozzi, arXiv:2504.17406, 2025) and shows a published
//     graph-theoretic characterisation of the related controllability
//     index failing, giving only upper bounds (Zhang, Cheng, Luo & Xia,
//     arXiv:2502.13368, 2025). A linking found in the dynamic graph
//     (greedy or exact) is reported beside the proved bounds
//     (Verdict.Linking, Bound.ByTheorem) and never decides a verdict:
//     Controllable needs a proved lower bound of |T|, and a sample whose
//     exact rank is below the linking leaves the verdict to the proved
//     bounds, with SampleBelowLinking set. On thousands of random small
//     systems the equality held against the Kalman rank, which is why
//     Select still keeps a walk-greedy design on its linking (proof
//     "dynamic_linking") where the region exceeds the sample's size or
//     work limits, and drops it where a whole sample of it falls short.
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
//   - Select's exact search proves its answer minimal only when it ends
//     with every design it passed over refuted by an upper bound or by a
//     whole sample that falls short (Selection.Unsure, each wrong with
//     probability at most FailureBound); a design left unjudged at a work
//     or size limit (Selection.Stopped) leaves Optimal to the lower bound.
//
// The package owns Check (judge a design), Select (fewest signals or
// cheapest actuators for the targets, with lower bounds) and Sample (the
// exact sampled rank of C·K over GF(p), for the verify question).
//
// Structural results hold for almost all values of the parameters. They
// are a screening step and do not replace dynamic studies, safety analysis
// or engineering review.
package target
