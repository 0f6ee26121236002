#!/bin/sh
# Side-by-side bench of `peerpack papers` and the same computation in pandas
# (python3-pandas from Debian, run with /usr/bin/python3; papers_pandas.py). Generates the invented
# world first (`peerpack sample papers`, fixed seed), then times both with
# /usr/bin/time -v (wall clock, CPU, peak memory).
#
#   sh examples/records-bench/run.sh [PAPERS] [DIR]
#
# PAPERS defaults to the world size, 11,300,000 papers (344 fine fields,
# 20,000 institutions, five years; about 52 million citations and three
# affiliations a paper, 0.85 GB of CSV). pandas needs far more memory than
# peerpack at that size; give a smaller PAPERS to compare on a small machine.
set -eu
papers=${1:-11300000}
dir=${2:-/tmp/peerpack-records-bench}
mkdir -p "$dir"
go build -o "$dir/peerpack" ./cmd/peerpack
world="$dir/papers-$papers.csv"
if [ ! -f "$world" ]; then
  "$dir/peerpack" sample papers -o "$world" --papers "$papers" --fields 344 --institutions 20000 --seed 1
fi
ls -l "$world"
echo "== peerpack papers"
/usr/bin/time -v "$dir/peerpack" papers "$world" -o "$dir/go.csv" --baselines-out "$dir/baselines.csv" 2>&1 |
  grep -E "^read|Elapsed|User time|System time|Maximum resident"
echo "== pandas"
/usr/bin/time -v /usr/bin/python3 "$(dirname "$0")/papers_pandas.py" "$world" "$dir/pandas.csv" 2>&1 |
  grep -E "^pandas|Elapsed|User time|System time|Maximum resident"
