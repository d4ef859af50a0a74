// Package transform builds variants of a network for the vary and sweep
// questions: randomised (degree-preserving swaps, rewiring), thinned (edge
// dropout), attacked or pruned (states removed), looped (self-loops added)
// or replicated (coupled copies). Each variant is a new Network; the
// original is left as it is. Weights, when present, travel with their
// edges; new edges get weight 1. Edge convention as in structural: u -> v
// means u acts on v.
package transform
