#!/usr/bin/env python3
"""Writes the networkx fixtures of io/netread and what networkx and scipy say
about them (expected.json): states, distinct couplings (an undirected edge is
two, a self-loop one) and N_D = max(N - |M*|, 1), |M*| from
scipy.sparse.csgraph.maximum_bipartite_matching on the coupling pattern.

    python3 gen.py [OUTDIR]     (default: the directory of this script)

Fixed seeds; the networks are invented scenarios. Run once to make the
checked-in files; the Go test runs it again into a temporary directory when
python3 with networkx and scipy is present.
"""
import json
import os
import random
import sys

import networkx as nx
import numpy as np
import scipy.sparse as sp
from scipy.sparse.csgraph import maximum_bipartite_matching

out = sys.argv[1] if len(sys.argv) > 1 else os.path.dirname(os.path.abspath(__file__))
os.makedirs(out, exist_ok=True)
rng = random.Random(11)

AREAS = ["boiler house", "pump station", "north & east"]


def named(g):
    # Names with blanks, an ampersand and a non-ASCII letter, so that the
    # writers' quoting and escaping are exercised.
    names = {}
    for v in g.nodes:
        names[v] = rng.choice(["pump", "valve", "tank", "Füllstand", "flow&temp"]) + " " + str(v)
    return nx.relabel_nodes(g, names)


def annotate(g):
    for v in g.nodes:
        g.nodes[v]["label"] = "Unit " + v.upper()
        g.nodes[v]["group"] = rng.choice(AREAS)
    for e in g.edges(keys=True) if g.is_multigraph() else g.edges:
        g.edges[e]["weight"] = float(rng.choice([0.5, 1, 2, -1.5, 3]))
    return g


def couplings(g):
    """The directed couplings netsteer reads, as index pairs."""
    idx = {v: i for i, v in enumerate(g.nodes)}
    pairs = set()
    for u, v in g.edges():
        pairs.add((idx[u], idx[v]))
        if not g.is_directed():
            pairs.add((idx[v], idx[u]))
    return len(idx), pairs


def n_d(n, pairs):
    if not pairs:
        return n
    rows = [u for u, _ in pairs]
    cols = [v for _, v in pairs]
    a = sp.csr_matrix((np.ones(len(pairs)), (rows, cols)), shape=(n, n))
    m = maximum_bipartite_matching(a, perm_type="column")
    return max(n - int((m >= 0).sum()), 1)


def plain_copy(g, drop):
    h = g.copy()
    for v in h.nodes:
        for k in drop:
            h.nodes[v].pop(k, None)
    return h


expected = {}


def record(name, g, labels=True, groups=True):
    n, pairs = couplings(g)
    expected[name] = {"states": n, "edges": len(pairs), "n_d": n_d(n, pairs),
                      "labels": labels, "groups": groups,
                      "parallel": g.number_of_edges() - len(set(g.edges())) if g.is_multigraph() else 0}


def write_all(base, g):
    nx.write_graphml(g, os.path.join(out, base + ".graphml"))
    record(base + ".graphml", g)
    # GML: networkx names nodes by the label key, so the display label
    # cannot also be an attribute.
    gml = plain_copy(g, ["label"])
    nx.write_gml(gml, os.path.join(out, base + ".gml"))
    record(base + ".gml", gml, labels=False)
    with open(os.path.join(out, base + ".json"), "w", encoding="utf-8") as f:
        json.dump(nx.node_link_data(g), f, ensure_ascii=False)
    record(base + ".json", g)
    if not g.is_multigraph():
        pj = plain_copy(g, ["label", "group"])
        nx.write_pajek(pj, os.path.join(out, base + ".net"))
        record(base + ".net", pj, labels=False, groups=False)


d = named(nx.gnm_random_graph(40, 120, seed=7, directed=True))
d.add_edge("pump 3", "pump 3") if "pump 3" in d else d.add_edge(next(iter(d.nodes)), next(iter(d.nodes)))
d.add_node("spare tank")
d.add_node("spare valve")
write_all("directed", annotate(d))

u = named(nx.gnm_random_graph(25, 50, seed=3))
write_all("undirected", annotate(u))

m = nx.MultiDiGraph()
m.add_edges_from([("a", "b"), ("a", "b"), ("b", "c"), ("c", "a"), ("c", "a"), ("c", "a"), ("d", "d")])
write_all("multi", annotate(m))

with open(os.path.join(out, "expected.json"), "w") as f:
    json.dump(expected, f, indent=1, sort_keys=True)
    f.write("\n")
