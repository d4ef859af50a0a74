"""Time the maximum bipartite matching of the comparison libraries.

Usage: python3 peers.py PAIRS.i32 N [RUNS]

PAIRS.i32 holds the workload's edges as little-endian int32 pairs (src, dst),
written by netsteer-bench gen. Each library gets its own prebuilt graph; only the
matching call is timed, in wall time (perf_counter) and in CPU time of the
calling thread (thread_time; both libraries match in one thread), which
other work on a shared machine disturbs far less. With RUNS > 1 each
library runs that many times and the fastest of each is kept. Prints one
JSON object on standard output.
"""
import json
import sys
import time

import numpy as np


def timed(runs, f):
    """Runs f runs times; returns the least wall and CPU times and f's result."""
    wall = cpu = None
    for _ in range(runs):
        c, t = time.thread_time(), time.perf_counter()
        r = f()
        w, c = time.perf_counter() - t, time.thread_time() - c
        wall = w if wall is None else min(wall, w)
        cpu = c if cpu is None else min(cpu, c)
    return wall, cpu, r


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
    out["scipy_match_s"], out["scipy_match_cpu_s"], perm = timed(
        runs, lambda: maximum_bipartite_matching(a, perm_type="column"))
    out["scipy_matching_size"] = int((perm >= 0).sum())
    out["scipy_version"] = scipy.__version__
    del a, perm

    import igraph

    # Rows (sources) are vertices 0..n-1, columns (targets) n..2n-1.
    g = igraph.Graph(n=2 * n, edges=np.column_stack((src, dst + n)).tolist(), directed=False)
    types = [False] * n + [True] * n
    out["igraph_match_s"], out["igraph_match_cpu_s"], m = timed(
        runs, lambda: g.maximum_bipartite_matching(types=types))
    out["igraph_matching_size"] = len(m)
    out["igraph_version"] = igraph.__version__
    print(json.dumps(out))


if __name__ == "__main__":
    main()
