#!/bin/sh
# The world-scale comparison of the README's performance table, with public
# tools only (Go, GNU time, Debian's python3-pandas and python3-matplotlib):
#
#   examples/bench/run.sh [WORLD_DIR]        (RUNS=3 by default)
#
# It writes the benchmark world once (examples/bench/worldgen: 21,500
# institutions, 120 systems, 24 indicators, 10 years, 5.2 million value
# rows), builds peerpack, then runs, in turn and RUNS times each:
#   - peerpack build brief.md -o pack.pdf --figures figures.csv
#   - peerpack check brief.md
#   - examples/bench/peer.py (the same pipeline in pandas + matplotlib)
# and prints the median wall time, CPU time (user + system) and peak
# resident memory of each, and how many times faster peerpack's build is.
# Timings depend on the machine and on what else runs on it: quote them
# with both.
set -eu
here=$(cd "$(dirname "$0")" && pwd)
root=$(cd "$here/../.." && pwd)
world=${1:-${TMPDIR:-/tmp}/peerpack-world}
runs=${RUNS:-3}
python=${PYTHON:-/usr/bin/python3}

cd "$root"
mkdir -p "$world"
[ -f "$world/values.csv" ] || go run ./examples/bench/worldgen -o "$world"
go build -o "$world/peerpack" ./cmd/peerpack
export SOURCE_DATE_EPOCH=1764547200
log="$world/times.txt"
: >"$log"
i=0
while [ "$i" -lt "$runs" ]; do
	/usr/bin/time -a -o "$log" -f "build %e %U %S %M" \
		"$world/peerpack" build "$world/brief.md" -o "$world/pack.pdf" --figures "$world/figures.csv" --quiet
	/usr/bin/time -a -o "$log" -f "check %e %U %S %M" \
		"$world/peerpack" check "$world/brief.md" >/dev/null
	/usr/bin/time -a -o "$log" -f "pandas %e %U %S %M" \
		"$python" "$here/peer.py" "$world" "$world/pandas" >/dev/null
	i=$((i + 1))
done

# Median of each column per command (runs is small: sort and pick).
median() { sort -n | awk '{ v[NR] = $1 } END { print (NR % 2) ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2 }'; }
printf '%-8s %10s %10s %12s\n' command "wall (s)" "cpu (s)" "peak (MiB)"
for c in build check pandas; do
	wall=$(awk -v c="$c" '$1 == c { print $2 }' "$log" | median)
	cpu=$(awk -v c="$c" '$1 == c { print $3 + $4 }' "$log" | median)
	peak=$(awk -v c="$c" '$1 == c { print $5 / 1024 }' "$log" | median)
	printf '%-8s %10.2f %10.2f %12.0f\n' "$c" "$wall" "$cpu" "$peak"
	eval "wall_$c=$wall"
done
awk -v a="$wall_pandas" -v b="$wall_build" -v n="$runs" 'BEGIN { printf "peerpack build is %.1f times faster than pandas + matplotlib (median wall, %s runs)\n", a / b, n }'
