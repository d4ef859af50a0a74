// Package testnet holds the helpers that the tests of the structural
// packages share: small networks from edge lists, and a numeric Kalman rank
// test on random real realisations of a structure (gonum/mat). This is the
// independent route the structural answers are checked against: for almost
// all parameter values the rank of [B AB ... A^(n-1)B] equals its generic
// value, so a random realisation reveals it with probability one.
package testnet
