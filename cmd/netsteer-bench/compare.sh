#!/usr/bin/env bash
# Compare netsteer with igraph and scipy on one workload, in one run, and
# print one table.
#
#   bash cmd/netsteer-bench/compare.sh [SIZES] [K]
#
# SIZES: numbers of states, comma-separated (default
# 250000,500000,1000000,2000000,4000000); K: mean total degree (default 10).
#
# Workload: directed Erdos-Renyi networks G(N, L) with mean total degree K,
# L = N*K/2 distinct edges without self-loops (structural/gen,
# gen.Workload("er", N), seed 1: what `netsteer generate` gives users),
# written by netsteer-bench scale as plain text edge lists of integer names,
# with a minimum design (structural.Drivers), every other signal of it (the
# failing design), a node table of random actuator costs 1..1000 and the
# edges as int32 pairs for Python.
#
# The table has one row per command (or library stage) and size: wall and
# CPU seconds (user + system, reading included), peak resident memory,
# bytes per edge, the ratio to drivers on the same network, and per
# command the exponent of a least-squares fit of wall time against edges
# over the sizes; then igraph's and scipy's maximum bipartite matching on
# their own prebuilt graphs (PEER_SIZES, default 1000000). The answers of
# the timed runs are checked against each other: repeated runs, the
# library against the command line, the matching sizes of all three
# libraries. Installs python3-igraph, python3-scipy and time with apt-get
# when they are missing (go test never needs them).
#
# Environment: NETSTEER_BENCH_OUT (default ${TMPDIR:-/tmp}/netsteer-bench)
# holds the files; PEER_SIZES the sizes the peers run at; RUNS (default 1)
# the runs per command and size (the fastest is reported).
set -euo pipefail
cd "$(dirname "$0")/../.."
SIZES=${1:-250000,500000,1000000,2000000,4000000}
K=${2:-10}
OUT=${NETSTEER_BENCH_OUT:-${TMPDIR:-/tmp}/netsteer-bench}
PEER_SIZES=${PEER_SIZES:-1000000}
RUNS=${RUNS:-1}
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
go build -o "$OUT/netsteer-bench" ./cmd/netsteer-bench
CLI=0
if go build -o "$OUT/netsteer" ./cmd/netsteer 2>"$OUT/build-cli.txt"; then
	CLI=1
else
	echo "== cmd/netsteer does not build: the table has the library rows only" >&2
fi

# 1. The library: every stage in a process of its own (netsteer-bench
# scale), which also writes the workload files.
echo "== library stages (netsteer-bench scale)" >&2
"$OUT/netsteer-bench" scale -sizes "$SIZES" -k "$K" -runs "$RUNS" -bin -dir "$OUT" \
	-json "$OUT/scale.json" >"$OUT/scale.txt"

# 2. The command line: one process per command and size, timed by
# /usr/bin/time (wall, user, system, peak RSS). Each entry is
# NAME|ARGUMENTS with {net}, {full}, {half}, {costs} and {targets} standing
# for the workload files and {out} for a scratch output name. {targets} is
# every state that starts line 1, 1001, 2001, ... of the edge list (about
# N/200 states). render and report draw the view they choose for a network
# this large (the control structure).
COMMANDS=(
	"drivers|drivers {net} --format json"
	"drivers --roles|drivers {net} --roles --format json"
	"check (passing)|check {net} --inputs {full} --format json"
	"check (failing)|check {net} --inputs {half} --format json"
	"check --strong|check {net} --inputs {full} --strong --format json"
	"check --targets|check {net} --inputs {half} --targets {targets} --format json"
	"actuators|actuators {net} --format json"
	"actuators (costs)|actuators {net} --node-table {costs} --format json"
	"actuators --targets|actuators {net} --targets {targets} --format json"
	"actuators --survive|actuators {net} --survive device --format json"
	"sensors|sensors {net} --format json"
	"failures|failures {net} --inputs {full} --format json"
	"verify --sample|verify {net} --inputs {full} --sample 500 --trials 1 --seed 1 --format json"
	"render|render {net} -o {out}.svg"
	"report|report {net} -o {out}.html"
)
: >"$OUT/cli.txt"
if [ "$CLI" = 1 ]; then
	echo "== command line (${#COMMANDS[@]} commands)" >&2
	for n in ${SIZES//,/ }; do
		base="$OUT/er-$n-$K-1"
		[ -s "$base.targets" ] || awk 'NR % 1000 == 1 { print $1 }' "$base.edges" | sort -u >"$base.targets"
		for entry in "${COMMANDS[@]}"; do
			name=${entry%%|*}
			args=${entry#*|}
			args=${args//\{net\}/$base.edges}
			args=${args//\{full\}/$base.full.design}
			args=${args//\{half\}/$base.half.design}
			args=${args//\{costs\}/$base.costs.csv}
			args=${args//\{targets\}/$base.targets}
			args=${args//\{out\}/$OUT/cli-out}
			tag=$(echo "$name" | tr -c 'a-z0-9\n' '_')
			for r in $(seq "$RUNS"); do
				# Exit status 1 means "the answer is no" (a failing check).
				/usr/bin/time -f "%e %U %S %M" -o "$OUT/time.txt" "$OUT/netsteer" $args \
					>"$OUT/cli-$tag-$n-$r.json" 2>"$OUT/cli-$tag-$n-$r.err" || [ $? = 1 ]
				# time(1) adds a line "Command exited with non-zero status 1" first.
				echo "$name|$n|$r|$(tail -n 1 "$OUT/time.txt")|$OUT/cli-$tag-$n-$r.json" >>"$OUT/cli.txt"
			done
		done
	done
fi

# 3. The peers: maximum bipartite matching on their own prebuilt graphs.
: >"$OUT/peers.txt"
for n in ${PEER_SIZES//,/ }; do
	pairs="$OUT/er-$n-$K-1.i32"
	[ -s "$pairs" ] || continue
	echo "== igraph and scipy at N=$n (2 runs each)" >&2
	"$PY" cmd/netsteer-bench/peers.py "$pairs" "$n" 2 >"$OUT/peers-$n.json"
	echo "$n|$OUT/peers-$n.json" >>"$OUT/peers.txt"
done

# 4. One table.
"$PY" - "$OUT/scale.json" "$OUT/cli.txt" "$OUT/peers.txt" "$K" <<'PYEOF'
import json, math, os, sys

scale = json.load(open(sys.argv[1]))
cli_lines = [l.rstrip("\n").split("|") for l in open(sys.argv[2]) if l.strip()]
peer_lines = [l.rstrip("\n").split("|") for l in open(sys.argv[3]) if l.strip()]
k = sys.argv[4]
problems = []

def fit(xs, ys):
    """Least-squares slope of log y against log x."""
    if len(xs) < 2:
        return float("nan")
    lx = [math.log(x) for x in xs]
    ly = [math.log(max(y, 1e-6)) for y in ys]
    m = len(xs)
    sx, sy = sum(lx), sum(ly)
    sxx = sum(a * a for a in lx)
    sxy = sum(a * b for a, b in zip(lx, ly))
    return (m * sxy - sx * sy) / (m * sxx - sx * sx)

def untimed(obj):
    """obj without its timing keys (names ending in _s), which differ by design."""
    if isinstance(obj, dict):
        return {k: untimed(v) for k, v in obj.items() if not k.endswith("_s")}
    if isinstance(obj, list):
        return [untimed(v) for v in obj]
    return obj

def find(obj, key):
    """The first value under key anywhere in a decoded JSON value."""
    if isinstance(obj, dict):
        if key in obj:
            return obj[key]
        for v in obj.values():
            r = find(v, key)
            if r is not None:
                return r
    elif isinstance(obj, list):
        for v in obj:
            r = find(v, key)
            if r is not None:
                return r
    return None

rows = []  # (group, name, nodes, edges, wall, cpu, peak bytes or None, answer)
drivers = {}  # nodes -> answer fields of the library drivers stage
for stage, results in scale.items():
    for r in results:
        rows.append(("library", stage, r["nodes"], r["edges"], r["read_s"] + r["stage_s"],
                     r["read_cpu_s"] + r["stage_cpu_s"], r["peak_bytes"], r["answer"]))
        if r["verified"] not in ("ok", "-"):
            problems.append(f"library {stage} at {r['nodes']} states: {r['verified']}")
        if stage == "drivers":
            drivers[r["edges"]] = dict(x.split("=") for x in r["answer"].split())
by_n = {}  # the library's network for each requested size
for r in scale.get("drivers", []):
    by_n[r["nodes"]] = r

# Command-line rows: the fastest run per command and size; every run's
# answer must agree with the others and with the library.
cli = {}
for name, n, run, times, out in cli_lines:
    wall, user, sys_, kb = times.split()
    try:
        # render and report write a picture or a page and a summary in
        # text on standard output; the summary is what runs must agree on.
        ans = open(out).read() if name in ("render", "report") else json.load(open(out))
    except Exception as e:
        problems.append(f"netsteer {name} at N={n}: output is not JSON ({e})")
        ans = None
    key = (name, int(n))
    rec = (float(wall), float(user) + float(sys_), int(kb) * 1024, ans)
    if key in cli:
        if json.dumps(untimed(cli[key][3]), sort_keys=True) != json.dumps(untimed(ans), sort_keys=True):
            problems.append(f"netsteer {name} at N={n}: runs disagree")
        if rec[0] >= cli[key][0]:
            continue
    cli[key] = rec
lib_by_size = sorted(scale.get("drivers", []), key=lambda r: r["nodes"])
sizes = sorted({int(n) for _, n, _, _, _ in cli_lines})
for (name, n), (wall, cpu, peak, ans) in sorted(cli.items()):
    lib = min(lib_by_size, key=lambda r: abs(math.log(r["nodes"] / n))) if lib_by_size else None
    nodes = lib["nodes"] if lib else n
    edges = lib["edges"] if lib else 0
    summary = ""
    if ans is not None and name.startswith("drivers"):
        ms = find(ans, "matching_size")
        summary = f"matching={ms}"
        if lib and ms is not None and str(ms) != drivers[edges]["matching"]:
            problems.append(f"netsteer {name} at N={n}: matching {ms}, library {drivers[edges]['matching']}")
    rows.append(("netsteer", name, nodes, edges, wall, cpu, peak, summary))

# Peer rows: matching alone, on a prebuilt graph (fastest of 2 runs).
for n, path in peer_lines:
    p = json.load(open(path))
    edges = p["edges"]
    for lib in ("igraph", "scipy"):
        size = p[f"{lib}_matching_size"]
        rows.append(("peer", f"{lib} {p[lib + '_version']} matching", p["nodes"], edges,
                     p[f"{lib}_match_s"], p[f"{lib}_match_cpu_s"], None, f"matching={size}"))
        if edges in drivers and str(size) != drivers[edges]["matching"]:
            problems.append(f"{lib} at N={n}: matching {size}, netsteer {drivers[edges]['matching']}")

# Exponents per (group, name); ratios to drivers of the same group and size.
series = {}
for g, name, nodes, edges, wall, cpu, peak, ans in rows:
    series.setdefault((g, name), []).append((edges, wall))
expo = {key: fit([e for e, _ in v], [w for _, w in v]) for key, v in series.items()}
base = {}
for g, name, nodes, edges, wall, cpu, peak, ans in rows:
    if name == "drivers":
        base[(g, edges)] = wall
base_lib = {e: w for (g, e), w in base.items() if g == "library"}

print(f"workload: directed ER G(N, N*{k}/2), structural/gen seed 1, text edge lists")
print(f"machine: {os.cpu_count()} cores, {os.sysconf('SC_PAGE_SIZE') * os.sysconf('SC_PHYS_PAGES') / 2**30:.0f} GiB, "
      f"load average {os.getloadavg()[0]:.1f} {os.getloadavg()[1]:.1f} {os.getloadavg()[2]:.1f} (at the end)")
hdr = f"{'command':28s} {'states':>8s} {'edges':>9s} {'wall s':>7s} {'CPU s':>7s} {'peak MB':>8s} {'B/edge':>7s} {'exp.':>5s} {'ratio':>6s}  answer"
print(hdr)
print("-" * len(hdr))
for g, name, nodes, edges, wall, cpu, peak, ans in sorted(rows, key=lambda r: (r[0] != "netsteer", r[0], r[1], r[3])):
    label = name if g == "netsteer" else (f"lib {name}" if g == "library" else name)
    b = base.get((g, edges)) or base_lib.get(edges)
    ratio = f"{wall / b:6.2f}" if b else f"{'':6s}"
    pk = f"{peak / 2**20:8.0f}" if peak else f"{'':8s}"
    be = f"{peak / edges:7.1f}" if peak and edges else f"{'':7s}"
    e = expo[(g, name)]
    es = f"{e:5.2f}" if not math.isnan(e) else f"{'':5s}"
    print(f"{label:28s} {nodes:8d} {edges:9d} {wall:7.2f} {cpu:7.2f} {pk} {be} {es} {ratio}  {ans}")
print("ratio: wall time over drivers on the same network (peers: over netsteer's drivers process or library stage);")
print("exp.: least-squares exponent of wall time against edges over the sizes; reading is part of every netsteer row")
if problems:
    print("DISAGREEMENT:")
    for p in problems:
        print("  " + p)
    sys.exit(1)
print("answers agree: repeated runs, the independent checks of each stage, and the matching sizes of all libraries")
PYEOF

# Per-edge stage costs on other shapes (static-model scale-free, gamma 2.5
# and 2.1, and a right-and-down grid) at the largest peer size: matching and
# components in thread CPU time (fastest of 3), reading in wall time.
n=${PEER_SIZES##*,}
echo "per edge on other shapes at N=$n (ns/edge; match and components: thread CPU, fastest of 3; read: wall):"
for spec in "er" "sf -gamma 2.5" "sf -gamma 2.1" "grid"; do
	name=$(echo "$spec" | tr -d ' -')
	f="$OUT/$name-$n-$K.edges"
	[ "$spec" = er ] && f="$OUT/er-$n-$K-1.edges"
	[ -s "$f" ] || "$OUT/netsteer-bench" gen -model $spec -n "$n" -k "$K" -seed 1 -o "$f" 2>/dev/null
	"$OUT/netsteer-bench" stages -runs 3 "$f" >"$OUT/shape-stages.json"
	"$PY" - "$OUT/shape-stages.json" "$spec" <<'PYEOF'
import json, sys
d = json.load(open(sys.argv[1]))
e, n = d["edges"], d["nodes"]
ns = lambda x: x / e * 1e9
print(f"  {sys.argv[2]:14s} {n:8d} states {e:9d} edges  match {ns(d['match']['cpu_s']):4.0f}  "
      f"components {ns(d['components']['cpu_s']):4.0f}  read {ns(d['read']['wall_s']):4.0f}")
PYEOF
done
