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
// of (A, C) is controllability of (Aᵀ, Cᵀ). Dense matrices are row-major.
//
// Exact check (Dimension). Values are drawn uniformly from the nonzero
// elements of GF(p), p = 2^61 - 1, and the dimension of span{B, AB, A²B, ...}
// is computed by growing Krylov chains with sparse products on the network's
// int32 CSR and elimination against an echelon basis: no rounding. Why this
// p: it is prime (a Mersenne prime), a product of two elements fits in 122
// bits so that eight of them are summed before one reduction, and the
// Schwartz–Zippel bound below stays under 10^-6 up to a million states.
//
// Why a sample tells the truth. Each minor of the Krylov matrix is a
// polynomial in the parameters. When the generic (structural) dimension is
// r, every minor of size r+1 is the zero polynomial, so no sample, random or
// given, ever exceeds r: a numerically controllable model is structurally
// controllable. Some r×r minor is a nonzero polynomial of degree at most
// r(r+1)/2 <= n² (its columns A^k b have degree k+1), and by the
// Schwartz–Zippel lemma (Schwartz, JACM 27(4), 1980; Zippel, EUROSAM 1979)
// it vanishes at a uniform point of (GF(p)*)^m with probability at most
// n²/(p-1): a random sample reaches the generic dimension with probability
// at least 1 - n²/(p-1) per trial. The lemma needs the minor to stay
// nonzero modulo p, that is p not dividing all of its integer coefficients;
// this is not proved here, but a failure would show as a sample below the
// structural dimension in every trial, which Verify reports, and thousands
// of random patterns in the tests agree exactly.
//
// With the model's own numbers (ExactFromWeights), decimal weights are
// mapped into GF(p) as the fractions they denote. The rank over GF(p) can
// only fall below the rank over the rationals, and only when p divides every
// maximal minor; a shortfall is therefore rechecked over a second prime,
// 2^61 - 31.
//
// Floating point (Float). The margin is the smallest singular value of
// [A - λI, B] over the eigenvalues λ of A (the Popov–Belevitch–Hautus test),
// divided by the Frobenius norm of [A B]; the controllability Gramian of the
// shifted, stable system A - sI comes from the Bartels–Stewart method on a
// real Schur form. Both use gonum's LAPACK.
//
// One call. Verify takes a network and a Request (the designs, the model's
// values or a seed, limits, the part to verify) and returns one Result:
// per property the structural verdict (structural.Verdict, the keys of a
// check) with the sampled figures beside it (Sample), the warnings the
// numbers call for as typed data (Warning), the standing cautions, and the
// stage times. Results marshal to JSON with snake_case keys; no NaN or
// Inf reaches JSON; Result.Table gives the trials as CSV rows whose
// columns are the trials' JSON keys.
//
// Large networks. The exact check costs about r·(E + r·n/2) field operations
// and r·n words of memory; Verify refuses networks above a size limit with an
// estimate of both (SizeError). CheckSize gives the same refusal from the
// counts alone, before a network is built. Request.Part (or Around,
// Induced and RestrictDesign) cuts out a connected part of a network to
// verify instead.
//
// Numeric results describe the numbers checked. Like the structural results
// they are a screening step and do not replace dynamic studies, safety
// analysis or engineering review.
package numeric
