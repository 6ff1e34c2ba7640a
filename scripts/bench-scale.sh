#!/usr/bin/env bash
# Synthetic scale benchmark: for each size (sections) runs `termwright scale`
# in its own process under GNU time, so that the peak RSS is per size, and
# keeps the JSON rows, GNU time's report and a table in one folder.
#
# Usage: scripts/bench-scale.sh [SIZES] [TIME_LIMIT] [OUT_DIR]
#   SIZES       comma-separated section counts (default 300,2000,10000)
#   TIME_LIMIT  optimisation time per size, a Go duration (default 60s)
#   OUT_DIR     default out/bench-scale-<date>-<time>
# FIRST_LIMIT bounds the search for the first timetable (default 10m);
# THREADS the parallel searches while optimising (default 1); SEED the
# generator seed (default 1).
set -euo pipefail
cd "$(dirname "$0")/.."

sizes="${1:-300,2000,10000}"
limit="${2:-60s}"
out="${3:-out/bench-scale-$(date +%Y%m%d-%H%M%S)}"
first="${FIRST_LIMIT:-10m}"
threads="${THREADS:-1}"
seed="${SEED:-1}"
if [ -e "$out" ]; then
  echo "bench-scale: $out already exists; give another OUT_DIR" >&2
  exit 1
fi
mkdir -p "$out"
tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT
bin="$tmp/termwright"
go build -o "$bin" ./cmd/termwright
{
  echo "date: $(date -u +%Y-%m-%dT%H:%M:%SZ)  commit: $(git rev-parse --short HEAD 2>/dev/null || echo unknown)  $(go version)"
  echo "cpu: $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2- | sed 's/^ *//'), $(nproc) cores, $(awk '/MemTotal/ {printf "%.1f GiB", $2/1048576}' /proc/meminfo)"
  echo "command: termwright scale --sections N --seed $seed --time-limit $limit --first-limit $first --threads $threads --json"
} | tee "$out/machine.txt" >&2

for n in ${sizes//,/ }; do
  load=$(cut -d' ' -f1-3 /proc/loadavg)
  /usr/bin/time -v -o "$out/time-$n.txt" "$bin" scale --sections "$n" --seed "$seed" --time-limit "$limit" \
    --first-limit "$first" --threads "$threads" --json > "$out/scale-$n.json" 2> "$out/log-$n.txt" || true
  rss=$(awk -F: '/Maximum resident/ {gsub(/ /,"",$2); printf "%.0f MiB", $2/1024}' "$out/time-$n.txt")
  wall=$(awk -F': ' '/Elapsed \(wall/ {print $2}' "$out/time-$n.txt")
  echo "$n sections: load before $load; wall $wall; peak RSS $rss; $(cat "$out/scale-$n.json")" | tee -a "$out/summary.txt"
done
