#!/bin/sh
# The stage benchmarks at world size, run once each, against ceilings:
#
#   examples/bench/guard.sh            (CI runs it after the tests)
#
# It writes the benchmark world once (examples/bench/worldgen), runs
# BenchmarkWorldStages (load, pack, figures file), BenchmarkWorldCheck and
# BenchmarkChartsBrief once each, and fails when one takes more CPU time
# (user + system, the cpu-s/op figure) than its ceiling in guard.txt.
# The ceilings are three times what the README's performance table
# quotes for a quiet 2-core machine: CPU time, unlike wall time, hardly
# moves when other work shares the machine, so a ceiling passed means a
# real regression, not a busy runner. Raise a ceiling only with the
# README's figure, in the same commit.
set -eu
here=$(cd "$(dirname "$0")" && pwd)
root=$(cd "$here/../.." && pwd)
world=${PEERPACK_WORLD_DIR:-${TMPDIR:-/tmp}/peerpack-guard-world}
cd "$root"
[ -f "$world/brief.md" ] || go run ./examples/bench/worldgen -o "$world" >/dev/null
out=$(PEERPACK_WORLD_DIR="$world" go test ./internal/build -run '^$' -bench 'WorldStages|WorldCheck|ChartsBrief' -benchtime 1x 2>&1) || {
	echo "$out"
	exit 1
}
echo "$out" | grep '^Benchmark' || true
echo "$out" | awk '
	FNR == NR { if ($1 !~ /^#/ && NF >= 2) ceiling[$1] = $2; next }
	/^Benchmark/ {
		name = $1; sub(/-[0-9]+$/, "", name)
		cpu = ""
		for (i = 2; i < NF; i++) if ($(i + 1) == "cpu-s/op") cpu = $i
		if (!(name in ceiling) || cpu == "") next
		seen[name] = 1
		verdict = (cpu + 0 > ceiling[name] + 0) ? "OVER" : "ok"
		printf "%-40s %8.3f cpu-s  ceiling %6.2f  %s\n", name, cpu, ceiling[name], verdict
		if (verdict == "OVER") bad = 1
	}
	END {
		for (n in ceiling) if (!(n in seen)) { printf "%s did not run\n", n; bad = 1 }
		exit bad
	}' "$here/guard.txt" -
