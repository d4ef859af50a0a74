"""Time the maximum bipartite matching of the comparison libraries.

Usage: python3 peers.py PAIRS.i32 N [RUNS]

PAIRS.i32 holds the workload's edges as little-endian int32 pairs (src, dst),
written by bench/gen. Each library gets its own prebuilt graph; only the
matching call is timed; with RUNS > 1 each library runs that many times and
the fastest is kept. Prints one JSON object on standard output.
"""
import json
import sys
import time

import numpy as np


def main():
    path, n = sys.argv[1], int(sys.argv[2])
    runs = int(sys.argv[3]) if len(sys.argv) > 3 else 1
    pairs = np.fromfile(path, dtype="<i4").reshape(-1, 2)
    src = pairs[:, 0].astype(np.int64)
    dst = pairs[:, 1].astype(np.int64)
    out = {"edges": int(len(src)), "nodes": n}

    import scipy
    import scipy.sparse as sp
    from scipy.sparse.csgraph import maximum_bipartite_matching

    a = sp.csr_matrix((np.ones(len(src), dtype=np.int8), (src, dst)), shape=(n, n))
    a.sum_duplicates()
    best = None
    for _ in range(runs):
        t = time.perf_counter()
        perm = maximum_bipartite_matching(a, perm_type="column")
        d = time.perf_counter() - t
        best = d if best is None else min(best, d)
    out["scipy_match_s"] = best
    out["scipy_matching_size"] = int((perm >= 0).sum())
    out["scipy_version"] = scipy.__version__
    del a, perm

    import igraph

    # Rows (sources) are vertices 0..n-1, columns (targets) n..2n-1.
    g = igraph.Graph(n=2 * n, edges=np.column_stack((src, dst + n)).tolist(), directed=False)
    types = [False] * n + [True] * n
    best = None
    for _ in range(runs):
        t = time.perf_counter()
        m = g.maximum_bipartite_matching(types=types)
        d = time.perf_counter() - t
        best = d if best is None else min(best, d)
    out["igraph_match_s"] = best
    out["igraph_matching_size"] = len(m)
    out["igraph_version"] = igraph.__version__
    print(json.dumps(out))


if __name__ == "__main__":
    main()
