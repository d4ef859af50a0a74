// Package gen generates random and regular directed networks for
// structural controllability studies: directed Erdős–Rényi G(N, L), the
// directed static scale-free model with separate in- and out-degree
// exponents, directed small-world rings, random regular networks, 2-D
// lattices with chosen edge directions and leader-follower trees.
//
// Conventions. States are numbered 0..N-1 (and named 1..N in networks and
// files) and an edge u -> v means that u acts on v (A[v][u] != 0). Every model keeps all N states, isolated ones
// included. Generators emit each edge once to a Sink (a
// *structural.Builder, the edge collector *Edges, or a file writer) and never emit a self-loop or a
// repeated edge, so the number of edges emitted is the network's L. Mean
// degree <k> is the mean total degree, in plus out, 2L/N (the convention of
// Liu, Slotine & Barabási, Nature 473:167, 2011): a directed network with
// <k> = 4 has twice as many edges as states.
//
// Randomness comes from a *rand.Rand (math/rand/v2); NewRand(seed) gives the
// generator every command uses, so a seed reproduces a network exactly on
// every platform. Memory is O(N + L) in int32 or uint64 words and time is
// near-linear in N + L; no generator allocates per edge.
//
// The package is also the project's benchmark generator: Workload names the
// fixed inputs of every benchmark and of the comparison with other
// libraries (directed ER with <k> = 10, static-model scale-free, grids),
// generated with NewRand(1), so that the figures are measured on the
// networks users get; Edges writes them as edge lists.
package gen
