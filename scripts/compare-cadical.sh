#!/usr/bin/env bash
# Writes CNF files (termwright compile --cnf) for synthetic terms and the
# ITC-2007 instances, decides each with termwright's engine (termwright
# logic sat) and with Debian's cadical, both under the same time limit, and
# prints a table: instance, variables, clauses, seconds of each, ratio.
#
# Usage: scripts/compare-cadical.sh [TIME_LIMIT_SECONDS] [OUT_DIR]
#   TIME_LIMIT_SECONDS  per solver and instance (default 120)
#   OUT_DIR             where the CNF files and table go (default out/compare-cadical-<date>)
# SIZES lists the synthetic sizes in sections (default "300 2000"); SEED the
# generator seed (default 1). The ITC instances are read from
# $TERMWRIGHT_DATA/itc2007 (default ../shared/data/itc2007) when present.
# Needs cadical on PATH (Debian package cadical); the test suite never does.
set -euo pipefail
cd "$(dirname "$0")/.."

limit="${1:-120}"
out="${2:-out/compare-cadical-$(date +%Y%m%d-%H%M%S)}"
sizes="${SIZES:-300 2000}"
seed="${SEED:-1}"
data="${TERMWRIGHT_DATA:-../shared/data}/itc2007"

if ! command -v cadical >/dev/null; then
  echo "compare-cadical: cadical is not installed (apt-get install cadical)" >&2
  exit 1
fi
if [ -e "$out" ]; then
  echo "compare-cadical: $out already exists; give another OUT_DIR" >&2
  exit 1
fi
mkdir -p "$out/cnf"
tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT
bin="$tmp/termwright"
go build -o "$bin" ./cmd/termwright

for n in $sizes; do
  "$bin" generate --csv "$tmp/syn$n" --sections "$n" --seed "$seed" >/dev/null 2>&1
  "$bin" compile "$tmp/syn$n" --cnf -o "$out/cnf/synthetic-$n.cnf" 2>/dev/null
done
if ls "$data"/*.ctt >/dev/null 2>&1; then
  for f in "$data"/*.ctt; do
    "$bin" compile "$f" --cnf -o "$out/cnf/$(basename "$f" .ctt).cnf" 2>/dev/null
  done
fi

# timed CMD...: runs CMD under the limit; prints "SECONDS RESULT".
timed() {
  local t0 t1 res
  t0=$(date +%s.%N)
  res=$(timeout "$limit" "$@" 2>/dev/null | grep -m1 '^s ' | cut -c3- || true)
  t1=$(date +%s.%N)
  [ -n "$res" ] || res=TIMEOUT
  echo "$(echo "$t1 - $t0" | bc -l) $res"
}

{
  echo "date: $(date -u +%Y-%m-%dT%H:%M:%SZ)  commit: $(git rev-parse --short HEAD 2>/dev/null || echo unknown)  $(cadical --version 2>/dev/null | head -1 | sed 's/^/cadical /')"
  echo "cpu: $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2- | sed 's/^ *//'), $(nproc) cores; limit ${limit}s per run"
  printf '%-16s %9s %9s %14s %14s %8s %6s\n' instance vars clauses termwright_s cadical_s ratio load
  for f in "$out"/cnf/*.cnf; do
    name=$(basename "$f" .cnf)
    read -r _ _ vars clauses < <(grep -m1 '^p cnf' "$f")
    load=$(cut -d' ' -f1 /proc/loadavg)
    read -r tw twres < <(timed "$bin" logic sat -q "$f")
    read -r cd cdres < <(timed cadical -q "$f")
    ratio=$(echo "$tw / ($cd + 0.0001)" | bc -l)
    note=""
    [ "$twres" = "$cdres" ] || note="  (answers: termwright $twres, cadical $cdres)"
    printf '%-16s %9d %9d %14.3f %14.3f %8.2f %6s%s\n' "$name" "$vars" "$clauses" "$tw" "$cd" "$ratio" "$load" "$note"
  done
} | tee "$out/table.txt"
