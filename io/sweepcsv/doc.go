// Package sweepcsv runs parameter sweeps of driver-node counts over
// generated networks and variants of a given one, and keeps their rows in
// CSV files that shards, reruns and merges combine safely.
//
// A sweep is a grid: every combination of the parameter values (model
// parameters, then transforms in order), times replicates. Each grid point
// is one row. Its identity, the key, is (model, params, replicate), where
// params lists the point's coordinates as name=value separated by ';' in a
// fixed order, transforms written "+name=value". The row's seed is a hash
// of the sweep seed and the key alone, so a row is the same whatever the
// worker count, the shard that ran it or the order of the run.
//
// Files hold a header and rows in a canonical order (model, then params
// compared coordinate by coordinate, numbers as numbers, then replicate),
// so that shards merged, a single run and a resumed run give the same
// file; only the seconds column, a wall-clock time, differs between runs.
package sweepcsv
