#!/bin/sh
# The 24-chart comparison of the README's performance table, with public
# tools only (Go, GNU time, Debian's python3-pandas and python3-matplotlib):
#
#   examples/bench/charts.sh [DIR]        (RUNS=3 by default)
#
# It writes the small benchmark world once (examples/bench/worldgen with
# -brief charts: 640 institutions in 12 systems, 24 indicators, 10 years,
# a brief of 24 charts), builds peerpack, then runs, in turn and RUNS
# times each:
#   - peerpack build brief.md -o pack.pdf
#   - examples/bench/charts_peer.py (the same charts with pandas + matplotlib)
# and prints the median wall time, CPU time (user + system) and peak
# resident memory of each, and how many times faster peerpack is. Both
# start from the files on disk and end with a PDF of the 24 charts
# (peerpack's also has its cover, contents and closing notes).
# Timings depend on the machine and on what else runs on it: quote them
# with both, and the load average (printed at the end).
set -eu
here=$(cd "$(dirname "$0")" && pwd)
root=$(cd "$here/../.." && pwd)
dir=${1:-${TMPDIR:-/tmp}/peerpack-charts}
runs=${RUNS:-3}
python=${PYTHON:-/usr/bin/python3}

cd "$root"
mkdir -p "$dir"
[ -f "$dir/values.csv" ] || go run ./examples/bench/worldgen -o "$dir" -institutions 640 -systems 12 -brief charts
go build -o "$dir/peerpack" ./cmd/peerpack
export SOURCE_DATE_EPOCH=1764547200
log="$dir/times.txt"
: >"$log"
i=0
while [ "$i" -lt "$runs" ]; do
	/usr/bin/time -a -o "$log" -f "peerpack %e %U %S %M" \
		"$dir/peerpack" build "$dir/brief.md" -o "$dir/pack.pdf" --quiet
	/usr/bin/time -a -o "$log" -f "matplotlib %e %U %S %M" \
		"$python" "$here/charts_peer.py" "$dir" "$dir/peer.pdf"
	i=$((i + 1))
done

median() { sort -n | awk '{ v[NR] = $1 } END { print (NR % 2) ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2 }'; }
printf '%-10s %10s %10s %12s\n' command "wall (s)" "cpu (s)" "peak (MiB)"
for c in peerpack matplotlib; do
	wall=$(awk -v c="$c" '$1 == c { print $2 }' "$log" | median)
	cpu=$(awk -v c="$c" '$1 == c { print $3 + $4 }' "$log" | median)
	peak=$(awk -v c="$c" '$1 == c { print $5 / 1024 }' "$log" | median)
	printf '%-10s %10.2f %10.2f %12.0f\n' "$c" "$wall" "$cpu" "$peak"
	eval "wall_$c=$wall"
	eval "cpu_$c=$cpu"
done
awk -v a="$wall_matplotlib" -v b="$wall_peerpack" -v c="$cpu_matplotlib" -v d="$cpu_peerpack" -v n="$runs" \
	'BEGIN { printf "peerpack is %.1f times faster than pandas + matplotlib on wall time, %.1f times on CPU time (medians of %s runs)\n", a / b, c / d, n }'
printf 'load average: %s\n' "$(cut -d' ' -f1-3 /proc/loadavg)"
