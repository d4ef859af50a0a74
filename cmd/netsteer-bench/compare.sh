#!/usr/bin/env bash
# Compare netsteer with igraph and scipy on one workload, in one run.
#
#   bash cmd/netsteer-bench/compare.sh [N] [K]       (default N=1000000, K=10)
#
# Workload: a directed Erdos-Renyi network G(N, L) with N states and mean
# total degree K, L = N*K/2 distinct edges without self-loops (structural/gen,
# gen.Workload("er", N), seed 1: what `netsteer generate` gives users),
# written by netsteer-bench gen as a plain text edge list of integer names,
# plus the same edges as int32 pairs for Python.
# Prints the matching time of each library on its own prebuilt graph, the
# wall time and peak memory of the whole `netsteer drivers FILE --format
# json` process, and the ratios. Installs python3-igraph and python3-scipy
# with apt-get when they are missing (go test never needs them).
# Files go to $NETSTEER_BENCH_OUT (default ${TMPDIR:-/tmp}/netsteer-bench).
set -euo pipefail
cd "$(dirname "$0")/../.."
N=${1:-1000000}
K=${2:-10}
OUT=${NETSTEER_BENCH_OUT:-${TMPDIR:-/tmp}/netsteer-bench}
mkdir -p "$OUT"
PY=/usr/bin/python3

if ! "$PY" -c 'import igraph, scipy, numpy' 2>/dev/null; then
	echo "== installing python3-igraph python3-scipy (apt-get)" >&2
	apt-get update -qq >&2
	DEBIAN_FRONTEND=noninteractive apt-get install -y -qq python3-igraph python3-scipy python3-numpy >&2
fi
if [ ! -x /usr/bin/time ]; then
	echo "== installing time (apt-get)" >&2
	apt-get update -qq >&2
	DEBIAN_FRONTEND=noninteractive apt-get install -y -qq time >&2
fi

echo "== building" >&2
go build -o "$OUT/netsteer" ./cmd/netsteer
go build -o "$OUT/netsteer-bench" ./cmd/netsteer-bench
EDGES="$OUT/er-$N-$K.edges"
PAIRS="$OUT/er-$N-$K.i32"
if [ ! -s "$EDGES" ] || [ ! -s "$PAIRS" ]; then
	echo "== generating $EDGES" >&2
	"$OUT/netsteer-bench" gen -model er -n "$N" -k "$K" -seed 1 -o "$EDGES" -bin "$PAIRS"
fi

# netsteer: three runs, the median by wall time is reported (its matching
# time and memory come from that run). Each peer: two runs, the faster is
# reported. Both choices lean in the peers' favour.
echo "== netsteer drivers (3 runs)" >&2
: >"$OUT/runs.txt"
for i in 1 2 3; do
	/usr/bin/time -v -o "$OUT/time.txt" "$OUT/netsteer" drivers "$EDGES" --format json >"$OUT/drivers-$i.json"
	wall=$(awk -F': ' '/Elapsed \(wall clock\)/ {n=split($2,a,":"); s=0; for(i=1;i<=n;i++) s=s*60+a[i]; print s}' "$OUT/time.txt")
	rss=$(awk -F': ' '/Maximum resident set size/ {print $2}' "$OUT/time.txt")
	echo "$wall $rss $i" >>"$OUT/runs.txt"
done
read -r median medrss medrun < <(sort -n "$OUT/runs.txt" | sed -n 2p)
cp "$OUT/drivers-$medrun.json" "$OUT/drivers-median.json"
maxrss=$(awk 'BEGIN{m=0} {if ($2 > m) m = $2} END {print m}' "$OUT/runs.txt")

echo "== netsteer stages (matching and components 3 times each)" >&2
"$OUT/netsteer-bench" stages -runs 3 "$EDGES" >"$OUT/stages.json"

echo "== igraph and scipy (2 runs each)" >&2
"$PY" cmd/netsteer-bench/peers.py "$PAIRS" "$N" 2 >"$OUT/peers.json"

"$PY" - "$OUT/drivers-median.json" "$OUT/peers.json" "$median" "$maxrss" "$OUT/stages.json" <<'PYEOF'
import json, os, sys
ns = json.load(open(sys.argv[1]))
peers = json.load(open(sys.argv[2]))
wall, rss_kb = float(sys.argv[3]), int(sys.argv[4])
st = json.load(open(sys.argv[5]))
t = ns["timings"]
mw, mc = st["match"]["wall_s"], st["match"]["cpu_s"]
iw, ic = peers["igraph_match_s"], peers["igraph_match_cpu_s"]
sw, sc = peers["scipy_match_s"], peers["scipy_match_cpu_s"]
print(f"workload: directed ER, {peers['nodes']} states, {peers['edges']} edges (text edge list)")
print(f"machine: {os.cpu_count()} cores, {os.sysconf('SC_PAGE_SIZE') * os.sysconf('SC_PHYS_PAGES') / 2**30:.0f} GiB, "
      f"load average {os.getloadavg()[0]:.1f}")
print(f"matching size: netsteer {ns['matching_size']}, igraph {peers['igraph_matching_size']}, scipy {peers['scipy_matching_size']}")
if not (ns["matching_size"] == st["matching_size"] == peers["igraph_matching_size"] == peers["scipy_matching_size"]):
    print("MISMATCH in matching size")
print("netsteer drivers stages, median run (s): " + ", ".join(f"{k[:-2]} {v:.3f}" for k, v in t.items()))
print("matching on a prebuilt graph (fastest run)   wall s    CPU s")
print(f"  netsteer                                 {mw:8.3f} {mc:8.3f}")
print(f"  igraph {peers['igraph_version']:34s}{iw:8.3f} {ic:8.3f}")
print(f"  scipy {peers['scipy_version']:35s}{sw:8.3f} {sc:8.3f}")
print(f"netsteer components (fastest run)         {st['components']['wall_s']:8.3f} {st['components']['cpu_s']:8.3f}")
print(f"ratio matching netsteer/igraph   wall {mw / iw:.3f}  CPU {mc / ic:.3f}  (target <= 0.333)")
print(f"ratio matching netsteer/scipy    wall {mw / sw:.3f}  CPU {mc / sc:.3f}  (target <= 0.167)")
print(f"whole `netsteer drivers --format json` process, median of 3: {wall:.3f} s wall; "
      f"ratio to igraph's matching (wall) {wall / iw:.3f}  (target <= 1)")
print(f"peak RSS {rss_kb / 1024:.0f} MB, largest of 3 runs (target <= 350 MB); "
      f"{rss_kb * 1024 / peers['edges']:.1f} bytes per edge")
PYEOF

# Per-edge cost on other shapes: static-model scale-free (gamma 2.5 and
# 2.1) and a right-and-down square grid with the same number of states,
# against the ER workload: stage times from netsteer-bench stages (matching and
# components in thread CPU time, fastest of 3; reading in wall time) and
# the CPU time (user + system) of the whole drivers process.
echo "per edge on other shapes (ns/edge; match and components: CPU, fastest of 3; read: wall; drivers: whole-process CPU):"
for spec in "er" "sf -gamma 2.5" "sf -gamma 2.1" "grid"; do
	name=$(echo "$spec" | tr -d ' -')
	f="$OUT/$name-$N-$K.edges"
	[ "$spec" = er ] && f="$EDGES"
	[ -s "$f" ] || "$OUT/netsteer-bench" gen -model $spec -n "$N" -k "$K" -seed 1 -o "$f" 2>/dev/null
	"$OUT/netsteer-bench" stages -runs 3 "$f" >"$OUT/shape-stages.json"
	/usr/bin/time -f "%e %U %S" -o "$OUT/time.txt" "$OUT/netsteer" drivers "$f" --format json >/dev/null
	"$PY" - "$OUT/shape-stages.json" "$(cat "$OUT/time.txt")" "$spec" <<'PYEOF'
import json, sys
d = json.load(open(sys.argv[1]))
wall, user, sys_ = map(float, sys.argv[2].split())
e, n = d["edges"], d["nodes"]
ns = lambda x: x / e * 1e9
print(f"  {sys.argv[3]:14s} {n:8d} states {e:9d} edges  match {ns(d['match']['cpu_s']):4.0f}  "
      f"components {ns(d['components']['cpu_s']):4.0f}  read {ns(d['read']['wall_s']):4.0f}  drivers {ns(user + sys_):4.0f}")
PYEOF
done
