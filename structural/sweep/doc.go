// Package sweep runs parameter sweeps of driver-node counts over generated
// networks (structural/gen models) and over variants of a given network
// (structural/transform), in parallel, resumable and in shards. Rows are
// kept in the CSV format of io/sweepcsv.
//
// A sweep is a Plan: every combination of the parameter values (model
// parameters, then transforms in order), times replicates. Each grid point
// is one row (a Point). Its identity, the key, is (model, params,
// replicate), where params lists the point's coordinates as name=value
// separated by ';' in a fixed order, transforms written "+name=value". The
// row's seed is a hash of the sweep seed and the key alone (RowSeed), so a
// row is the same whatever the worker count, the shard that ran it or the
// order of the run; all its randomness (the generated network, then each
// transform in order) comes from gen.NewRand(row seed).
//
// Run keeps the rows already in its output file, computes the others and
// rewrites the file atomically at checkpoints, in canonical order, so that
// shards merged (sweepcsv.Merge), a single run and a resumed run give the
// same file; only the seconds column, a wall-clock time, differs between
// runs. Each row costs one network generation and one maximum matching:
// O(N + L) to O(L sqrt N).
//
// Edge convention: u -> v means u acts on v (A[v][u] != 0).
package sweep
