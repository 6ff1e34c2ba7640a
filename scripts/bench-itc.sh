#!/usr/bin/env bash
# Runs `termwright bench` over the public ITC-2007 curriculum-based course
# timetabling instances (or, with SET=itc2019, the ITC-2019 ones) and keeps
# the table, the JSON results, the solutions and a description of the
# machine in one folder.
#
# Usage: scripts/bench-itc.sh [TIME_LIMIT] [OUT_DIR]
#   TIME_LIMIT  per instance, a Go duration (default 60s)
#   OUT_DIR     where results go (default out/bench-itc-<date>-<time>)
# The instances are read from $TERMWRIGHT_DATA/itc2007 (default
# ../shared/data/itc2007 beside the repository); they are never copied into
# the repository. SEED sets the engine seed (default 1).
set -euo pipefail
cd "$(dirname "$0")/.."

limit="${1:-60s}"
out="${2:-out/bench-itc-$(date +%Y%m%d-%H%M%S)}"
data="${TERMWRIGHT_DATA:-../shared/data}/${SET:-itc2007}"
seed="${SEED:-1}"

if ! compgen -G "$data/*.ctt" >/dev/null && ! compgen -G "$data/*.xml" >/dev/null; then
  echo "bench-itc: no .ctt or .xml files in $data; set TERMWRIGHT_DATA to the folder holding ${SET:-itc2007}/" >&2
  exit 1
fi
if [ -e "$out" ]; then
  echo "bench-itc: $out already exists; give another OUT_DIR" >&2
  exit 1
fi
mkdir -p "$out"

tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT
bin="$tmp/termwright"
go build -o "$bin" ./cmd/termwright

best=()
if [ -f "$data/best-known.csv" ]; then best=(--best "$data/best-known.csv"); fi
cmd=("$bin" bench "$data" --time-limit "$limit" "${best[@]}" --out "$out/sol" --json-out "$out/results.json" --seed "$seed")

{
  echo "date:    $(date -u +%Y-%m-%dT%H:%M:%SZ)"
  echo "commit:  $(git rev-parse --short HEAD 2>/dev/null || echo unknown)"
  echo "go:      $(go version)"
  echo "os:      $(uname -sr)"
  echo "cpu:     $(grep -m1 'model name' /proc/cpuinfo 2>/dev/null | cut -d: -f2- | sed 's/^ *//' || echo unknown)"
  echo "cores:   $(nproc 2>/dev/null || echo unknown)"
  echo "memory:  $(awk '/MemTotal/ {printf "%.1f GiB", $2/1048576}' /proc/meminfo 2>/dev/null || echo unknown)"
  echo "command: termwright bench $data --time-limit $limit ${best[*]} --out $out/sol --json-out $out/results.json --seed $seed"
} > "$out/machine.txt"
cat "$out/machine.txt" >&2

status=0
if [ -x /usr/bin/time ]; then
  # GNU time reports the peak resident set size of the whole run.
  /usr/bin/time -v -o "$out/time.txt" "${cmd[@]}" 2> "$out/stderr.txt" | tee "$out/table.txt" || status=$?
  grep -E "Maximum resident set size|Elapsed \(wall clock\)" "$out/time.txt" >&2 || true
else
  "${cmd[@]}" 2> "$out/stderr.txt" | tee "$out/table.txt" || status=$?
fi
echo "bench-itc: results in $out (table.txt, results.json, sol/, stderr.txt)" >&2
exit "$status"
