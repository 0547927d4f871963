#!/usr/bin/env bash
# End-to-end benchmark: the independent numpy reference (bench/reference.py)
# against sunsight on the same reference case, one year at 10 s, with and
# without albedo. Prints wall times, peak RSS and the ratio numpy / sunsight.
# Usage: bash bench/run.sh [days]   (default 365)
set -euo pipefail
cd "$(dirname "$0")/.."
DAYS="${1:-365}"
OUT="$(mktemp -d)"
trap 'rm -rf "$OUT"' EXIT
PY=/usr/bin/python3

if ! [ -x /usr/bin/time ]; then
  echo "installing GNU time (apt-get install -y time)" >&2
  apt-get install -y time >/dev/null
fi

if ! "$PY" -c 'import numpy, erfa' 2>/dev/null; then
  echo "installing the reference's modules (apt-get install -y python3-numpy python3-erfa)" >&2
  apt-get install -y python3-numpy python3-erfa >/dev/null
fi

go build -o /tmp/sunsight ./cmd/sunsight

# measure <label> <cmd...>: runs the command under /usr/bin/time -v and sets
# WALL (s), CPU (user + system, s), PCT (CPU share, %) and RSS (MiB) from
# its report. The command's exit status is kept in STATUS (a missed target
# is not a failure of the benchmark).
measure() {
  local label="$1"; shift
  STATUS=0
  /usr/bin/time -v -o "$OUT/$label.time" "$@" >"$OUT/$label.out" || STATUS=$?
  WALL=$(awk -F': ' '/Elapsed \(wall clock\)/ {n=split($2,p,":"); s=0; for(i=1;i<=n;i++) s=s*60+p[i]; print s}' "$OUT/$label.time")
  CPU=$(awk -F': ' '/User time/ {u=$2} /System time/ {s=$2} END {printf "%.2f", u+s}' "$OUT/$label.time")
  PCT=$(awk -F': ' '/Percent of CPU/ {sub("%","",$2); print $2}' "$OUT/$label.time")
  RSS=$(awk -F': ' '/Maximum resident set size/ {printf "%.1f", $2/1024}' "$OUT/$label.time")
}

# ratio A B: A / B with two decimals.
ratio() { awk -v a="$1" -v b="$2" 'BEGIN {printf "%.2f", (b > 0) ? a / b : 0}'; }

declare -A NP_WALL NP_RSS NP_INNER SS_WALL SS_RSS
for alb in none uniform; do
  measure "numpy-$alb" "$PY" bench/reference.py --days "$DAYS" --step 10 --albedo "$alb" --out "$OUT/numpy-$alb.json"
  if [ "$STATUS" != 0 ]; then echo "bench: the numpy reference failed:" >&2; cat "$OUT/numpy-$alb.time" >&2; exit 1; fi
  NP_WALL[$alb]=$WALL; NP_RSS[$alb]=$RSS
  NP_INNER[$alb]=$(awk '/^wall_time_s/ {print $2}' "$OUT/numpy-$alb.out")
done

# ---- sunsight half ------------------------------------------------------
SS_READY=yes
for alb in none uniform; do
  f=bench/year-nadir.yaml; [ "$alb" = uniform ] && f=bench/year-nadir-albedo.yaml
  if [ "$SS_READY" = yes ]; then
    measure "sunsight-$alb" /tmp/sunsight run --quiet --duration "${DAYS}d" "$f"
    SS_WALL[$alb]=$WALL; SS_RSS[$alb]=$RSS
  else
    SS_WALL[$alb]=NA; SS_RSS[$alb]=NA
  fi
done

echo "reference case, ${DAYS} d at 10 s"
printf "%-8s %14s %14s %12s %14s %14s %12s\n" albedo numpy_wall_s numpy_inner_s numpy_rss_MiB sunsight_wall_s sunsight_rss_MiB ratio
for alb in none uniform; do
  ratio=NA
  if [ "${SS_WALL[$alb]}" != NA ]; then
    ratio=$(awk -v a="${NP_WALL[$alb]}" -v b="${SS_WALL[$alb]}" 'BEGIN {printf "%.2f", (b > 0) ? a / b : 0}')
  fi
  printf "%-8s %14s %14s %12s %14s %14s %12s\n" "$alb" "${NP_WALL[$alb]}" "${NP_INNER[$alb]}" "${NP_RSS[$alb]}" "${SS_WALL[$alb]}" "${SS_RSS[$alb]}" "$ratio"
done
echo "ratio = numpy wall time / sunsight wall time, both whole processes, measured in this run"

# ---- per step, one core: the floor, the engine and its stages ----------
echo
echo "per step on one core (go test -bench, one day of the reference case without albedo)"
go test -run '^$' -bench 'StepLimit|EngineStep|Stages' -benchtime 200x ./scenario/sim >"$OUT/bench.txt"
awk '/ns\/step/ {name=$1; sub(/^Benchmark/, "", name); sub(/-[0-9]+$/, "", name); for (i=1;i<=NF;i++) if ($(i+1)=="ns/step") printf "  %-24s %9.1f ns/step\n", name, $i}' "$OUT/bench.txt"
LIMIT=$(awk '/^BenchmarkStepLimit/ {for (i=1;i<=NF;i++) if ($(i+1)=="ns/step") print $i}' "$OUT/bench.txt")
ENGINE=$(awk '/^BenchmarkEngineStep/ {for (i=1;i<=NF;i++) if ($(i+1)=="ns/step") print $i}' "$OUT/bench.txt")
echo "  engine / floor = $(ratio "$ENGINE" "$LIMIT")"
go test -run '^$' -bench 'Units|UnitLimit' -benchtime 3x ./scenario/sim >"$OUT/units.txt"
U1=$(awk '/^BenchmarkUnits\/1-/ {for (i=1;i<=NF;i++) if ($(i+1)=="ns/step") print $i}' "$OUT/units.txt")
U10=$(awk '/^BenchmarkUnits\/10-/ {for (i=1;i<=NF;i++) if ($(i+1)=="ns/step") print $i}' "$OUT/units.txt")
UMIN=$(awk '/^BenchmarkUnitLimit/ {for (i=1;i<=NF;i++) if ($(i+1)=="ns/unit-step") print $i}' "$OUT/units.txt")
echo "  Monte Carlo, inertial with albedo, one core: 1 unit ${U1} ns/step, 10 units ${U10} ns/step, 10 / 1 = $(ratio "$U10" "$U1")"
# One more unit costs U = (U10 - U1) / 9 per step, the shared part G = U1 - U;
# at the floor of a unit's own arithmetic (BenchmarkUnitLimit) 10 / 1 would be
# (G + 10 Umin) / (G + Umin).
awk -v u1="$U1" -v u10="$U10" -v um="$UMIN" 'BEGIN {u = (u10 - u1) / 9; g = u1 - u;
  printf "  per unit %.0f ns/step against its floor %.0f (BenchmarkUnitLimit), shared %.0f ns/step: 10 / 1 at the floor = %.2f\n", u, um, g, (g + 10 * um) / (g + um)}'

# ---- whole runs side by side: each pair measured back to back ----------
# pair <label> <fileA> <argsA> <fileB> <argsB>: prints both runs and the
# ratio A/B of wall and CPU time.
PAIRS=0
pair() {
  local label="$1" fa="$2" aa="$3" fb="$4" ab="$5"
  PAIRS=$((PAIRS + 1))
  # shellcheck disable=SC2086
  measure "pair$PAIRS-a" /tmp/sunsight run --quiet $aa "$fa"; local wa=$WALL ca=$CPU ra=$RSS
  # shellcheck disable=SC2086
  measure "pair$PAIRS-b" /tmp/sunsight run --quiet $ab "$fb"; local wb=$WALL cb=$CPU rb=$RSS
  printf "%-34s %8s %8s %8s | %8s %8s %8s | %7s %7s\n" "$label" "$wa" "$ca" "$ra" "$wb" "$cb" "$rb" "$(ratio "$wa" "$wb")" "$(ratio "$ca" "$cb")"
}
echo
echo "whole runs, 30 d at 10 s unless named; A then B back to back (wall s, CPU s, peak RSS MiB)"
printf "%-34s %8s %8s %8s | %8s %8s %8s | %7s %7s\n" "A / B" wallA cpuA rssA wallB cpuB rssB wall_A/B cpu_A/B
for att in inertial sun tumble; do
  pair "$att: albedo / none" "bench/month-$att-albedo.yaml" "" "bench/month-$att.yaml" ""
done
pair "inertial albedo: zonal / uniform" bench/month-inertial-albedo-zonal.yaml "" bench/month-inertial-albedo.yaml ""
pair "inertial albedo: grid / uniform" bench/month-inertial-albedo-grid.yaml "" bench/month-inertial-albedo.yaml ""
pair "nadir albedo: j2-numeric / j2-mean" bench/month-nadir-albedo-j2-numeric.yaml "" bench/month-nadir-albedo-j2-mean.yaml ""
pair "inertial albedo: 10 units / 1" bench/month-inertial-albedo-mc.yaml "--units 10" bench/month-inertial-albedo-mc.yaml "--units 1"
pair "24 sensors albedo: 10 y / 1 y" bench/year-24-albedo.yaml "--duration 3650d" bench/year-24-albedo.yaml ""

# ---- sweep: 52 cases on one and on two workers -------------------------
sed 's/^duration: 365d/duration: 10d/' bench/year-nadir.yaml >"$OUT/sweep.yaml"
sweep() {
  measure "sweep-$1" /tmp/sunsight sweep "$OUT/sweep.yaml" --vary orbit.altitude_km=400:1000:50 \
    --vary "orbit.ltan=06:00,09:00,10:30,13:30" --out "$OUT/sweep-$1" --no-plots --workers "$1"
}
sweep 1; W1=$WALL; C1=$CPU
sweep 2; W2=$WALL; C2=$CPU; P2=$PCT
echo
echo "sweep of 52 cases (10 d each): 1 worker ${W1} s wall (${C1} s CPU), 2 workers ${W2} s wall (${C2} s CPU, ${P2} % CPU)"
echo "  speed-up on 2 workers = $(ratio "$W1" "$W2") (the CPU share shows how much of the second core the sweep got)"
echo "load average at the end: $(cut -d' ' -f1-3 /proc/loadavg) (the machine is shared: compare ratios measured in one run)"
