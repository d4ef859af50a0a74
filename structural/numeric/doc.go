// Package numeric confirms structural controllability and observability
// answers on numbers, and answers the questions the numbers raise: it
// draws values for the free parameters of a network's pattern (or takes
// the model's own weights), measures the controllable subspace of that
// sample exactly over a prime field and in floating point with a margin,
// finds the modes the signals cannot move, says whether they are stable,
// and measures the control effort of a design.
//
// Conventions. An edge u -> v of a structural.Network means that u acts on
// v: the entry A[v][u] is a free nonzero parameter (self-loops included).
// Input j drives the states it lists: B[s][j] is a free nonzero parameter
// for each such state s. Outputs are the rows of C in the same way, and
// observability of (A, C) is controllability of (Aᵀ, Cᵀ). Dense matrices
// are row-major.
//
// One call. Verify takes a network and a Request (the designs, the model's
// values or a seed, limits, the part to verify, the modes and effort
// wanted) and returns one Result: per property the structural verdict
// (structural.Verdict, the keys of a check) with the sampled figures
// beside it (Sample), the warnings the numbers call for as typed data
// (Warning), the standing cautions, and the stage times. Results marshal
// to JSON with snake_case keys; no NaN or Inf reaches JSON; Result.Table
// and Result.ModeTable give CSV rows whose columns are the JSON keys.
// RankDesigns (RankCandidates, PlacementCandidates) ranks equally good
// designs by control effort; GramianEffort measures one dense system.
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
// With the model's own numbers, decimal weights are mapped into GF(p) as
// the fractions they denote (FromFloat). The rank over GF(p) can only fall
// below the rank over the rationals, and only when p divides every maximal
// minor; a shortfall is therefore rechecked over a second prime,
// 2^61 - 31.
//
// Floating point (Float). The margin is the smallest singular value of
// [A - λI, B] over the eigenvalues λ of A (the Popov–Belevitch–Hautus test),
// divided by the Frobenius norm of [A B]; the controllability Gramian of the
// shifted, stable system A - sI comes from the Bartels–Stewart method on a
// real Schur form. Both use gonum's LAPACK.
//
// Modes the signals cannot move (Request.Modes). Their number, with
// multiplicity, is n minus the exact dimension r, so rounding can neither
// invent nor hide one. In reduced echelon form the exact Krylov basis
// gives coordinates to V/C (C the controllable subspace), and A acting on
// V/C is the uncontrollable part of the Kalman decomposition as an exact
// (n-r)×(n-r) matrix over GF(p), with an exact characteristic polynomial.
// The values are computed in floating point, from an orthonormal basis
// that repeats the exact Krylov chains: every eigenvalue that may be
// rational (zero, a diagonal entry, an integer over the common denominator
// of A's entries, the simplest fraction within its error bound), and every
// conjugate pair whose real quadratic may be rational, is tested exactly
// against that polynomial over two primes; a root is then exact, with its
// multiplicity, the number of its left eigenvectors and the states they
// live on. The other modes carry a first-order error bound (condition
// number times the Kalman residual plus rounding), which decides their
// stability or leaves it undecided, and a support by a stated relative
// tolerance (SupportTolerance). A pair (A, B) is stabilizable when every
// such mode is stable (Re λ < 0; |λ| < 1 in discrete time), detectable
// likewise for (A, C). With both designs the four parts of the Kalman
// decomposition are counted exactly (KalmanParts).
//
// Control effort (Request.Effort, Effort). The controllability Gramian W of
// (A, B) gives the worst-case input energy 1/λ_min(W) to reach a unit state
// and the average controllability trace(W) (Pasqualetti, Zampieri & Bullo,
// IEEE TCNS 1(1), 2014): on the infinite horizon for a stable A (the
// Lyapunov equation by Bartels–Stewart, the discrete Stein equation
// through its Cayley transform), on a finite horizon T for any A (Van
// Loan's block exponential, or doubling in discrete time).
//
// Large networks. The exact check costs about r·(E + r·n/2) field operations
// and r·n words of memory; Verify refuses networks above a size limit
// (DefaultMaxStates, 2,000 states) with an estimate of both (SizeError).
// The dense floating-point work (margin, modes, effort) is O(n³) and runs up
// to DefaultMaxFloatStates (1,000 states, to be raised at will: measured
// figures are in the benchmarks); above it the margin is skipped and modes
// or effort are refused with the estimated cost. There are no sparse
// iterative estimates yet. CheckSize gives the same refusals from the
// counts alone, before a network is built. Request.Part (or Around,
// Induced and RestrictDesign) cuts out a connected part of a network to
// verify instead.
//
// Numeric results describe the numbers checked: a model's numbers are
// only as good as its fit (Result.Cautions says so in every result). Like
// the structural results they are a screening step and do not replace
// dynamic studies, safety analysis or engineering review.
package numeric
