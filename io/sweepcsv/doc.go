// Package sweepcsv is the file format of parameter sweeps (structural/sweep):
// one CSV row per measured grid point, with the columns of Columns, the
// first ten a stable contract.
//
// A row's identity, its key (Key), is (model, params, replicate), where
// params lists the point's coordinates as name=value separated by ';' in a
// fixed order, transforms written "+name=value". Files hold a header and
// rows in a canonical order (model, then params compared coordinate by
// coordinate, numbers as numbers, then replicate; Sort), so that shards
// merged (Merge), a single run and a resumed run give the same file. Read
// refuses rows whose numbers contradict each other, with FILE:LINE errors.
package sweepcsv
