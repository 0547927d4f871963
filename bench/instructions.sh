#!/usr/bin/env bash
# Instruction counts of the step loop, which do not vary from run to run the
# way timings do on a shared machine: callgrind (Debian's valgrind) on the
# 10-day reference case on one worker, and on BenchmarkUnits (1 and 10 Monte
# Carlo units, inertial attitude, uniform albedo, noisy drawn sensors).
# Count before and after a change to the loop on the same machine.
# Usage: bash bench/instructions.sh
set -euo pipefail
cd "$(dirname "$0")/.."
OUT="$(mktemp -d)"
trap 'rm -rf "$OUT"' EXIT

if ! command -v valgrind >/dev/null; then
  echo "installing valgrind (apt-get install -y valgrind)" >&2
  apt-get install -y valgrind >/dev/null
fi

go build -o "$OUT/sunsight" ./cmd/sunsight
go test -c -o "$OUT/sim.test" ./scenario/sim

# count <label> <steps> <cmd...>: total instructions, and per step.
count() {
  local label="$1" steps="$2"; shift 2
  # Go's asynchronous preemption signals can upset callgrind; they do not
  # change the work done.
  GODEBUG=asyncpreemptoff=1 valgrind --tool=callgrind --callgrind-out-file="$OUT/cg" "$@" >/dev/null 2>"$OUT/err" || {
    echo "callgrind failed on $label:" >&2; tail -5 "$OUT/err" >&2; exit 1; }
  local ir
  ir=$(awk '/I[ ]+refs:/ {gsub(",", "", $NF); print $NF}' "$OUT/err")
  printf "%-44s %14s instructions %8.0f per step\n" "$label" "$ir" "$(awk -v a="$ir" -v b="$steps" 'BEGIN {print a / b}')"
}

count "reference case, 10 d, one worker" 86401 "$OUT/sunsight" run --quiet --workers 1 --duration 10d bench/year-nadir.yaml
count "BenchmarkUnits/1 (12 d, one pass)" 103681 "$OUT/sim.test" -test.run '^$' -test.bench 'Units/1$' -test.benchtime 1x -test.cpu 1
count "BenchmarkUnits/10 (12 d, one pass)" 103681 "$OUT/sim.test" -test.run '^$' -test.bench 'Units/10' -test.benchtime 1x -test.cpu 1
echo "per step includes each run's set-up (about 80 M instructions for the reference case: the sky lattice and coverage, the eclipse search)"
