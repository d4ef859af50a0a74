package main

const formatsHelp = `Network files

An edge "u v" means u acts on v: the entry A[v][u] of the state matrix is a
free nonzero parameter. The format is recognised by the file's content
(gzip, Matrix Market, DOT), then by its extension; --input-format forces
it (any case); - reads standard input.

  edges   one edge per line, "source target [weight]", separated by white
          space or a comma; # and % start comments; quote names holding
          spaces, commas or quotes CSV-style ("feed pump, north")
  mtx     Matrix Market coordinate (pattern, real or integer; general,
          symmetric or skew-symmetric): entry (i, j) is the edge j -> i
  dot     a DOT digraph: u -> v, chains, subgraphs, node statements;
          an undirected graph's a -- b is a two-way coupling

A self-loop "v v" is a state's own dynamics; repeated edges are merged and
counted, and their weights add up. --self-dynamics gives every state a self-loop; --undirected reads
every edge as a two-way coupling. --node-table FILE adds device costs,
allowed and existing devices, groups and labels (see the README).

Bad input stops with one line "FILE:LINE: what is wrong" and exit status 2.
`
