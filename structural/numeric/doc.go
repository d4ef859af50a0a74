// Package numeric confirms structural controllability and observability
// answers on numbers: it draws values for the free parameters of a network's
// pattern (or takes the model's own weights) and measures the controllable
// subspace of that sample exactly, over a prime field, and in floating point
// with a margin.
//
// Conventions. An edge u -> v of a structural.Network means that u acts on v:
// the entry A[v][u] is a free nonzero parameter (self-loops included). Input
// j drives the states it lists: B[s][j] is a free nonzero parameter for each
// such state s. Outputs are the rows of C in the same way, and observability
// of (A, C) is controllability of (Aᵀ, Cᵀ).
//
// Exact check. Values are drawn uniformly from the nonzero elements of GF(p)
// with p = 2^61 - 1, and the dimension of span{B, AB, A²B, ...} is computed by
// growing Krylov chains with sparse products on the network's int32 CSR and
// elimination against an echelon basis. There is no rounding. The sampled
// dimension never exceeds the generic (structural) one, and by the
// Schwartz–Zippel lemma it falls short with probability at most n²/(p-1) per
// trial.
//
// Floating point. The margin is the smallest singular value of [A - λI, B]
// over the eigenvalues λ of A (the Popov–Belevitch–Hautus test), divided by
// the Frobenius norm of [A B]; the controllability Gramian of the shifted,
// stable system A - sI is computed by the Bartels–Stewart method on a real
// Schur form. Both use gonum's LAPACK.
//
// Numeric results describe one sample of parameters. Like the structural
// results they are a screening step and do not replace dynamic studies,
// safety analysis or engineering review.
package numeric
