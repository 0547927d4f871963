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

go build -o /tmp/sunsight ./cmd/sunsight

# measure <label> <cmd...>: runs the command under /usr/bin/time -v and sets
# WALL (s) and RSS (MiB) from its report.
measure() {
  local label="$1"; shift
  /usr/bin/time -v -o "$OUT/$label.time" "$@" >"$OUT/$label.out"
  WALL=$(awk -F': ' '/Elapsed \(wall clock\)/ {n=split($2,p,":"); s=0; for(i=1;i<=n;i++) s=s*60+p[i]; print s}' "$OUT/$label.time")
  RSS=$(awk -F': ' '/Maximum resident set size/ {printf "%.1f", $2/1024}' "$OUT/$label.time")
}

declare -A NP_WALL NP_RSS NP_INNER SS_WALL SS_RSS
for alb in none uniform; do
  measure "numpy-$alb" "$PY" bench/reference.py --days "$DAYS" --step 10 --albedo "$alb" --out "$OUT/numpy-$alb.json"
  NP_WALL[$alb]=$WALL; NP_RSS[$alb]=$RSS
  NP_INNER[$alb]=$(awk '/^wall_time_s/ {print $2}' "$OUT/numpy-$alb.out")
done

# ---- sunsight half ------------------------------------------------------
SS_READY=yes
for alb in none uniform; do
  f=bench/year-nadir.yaml; [ "$alb" = uniform ] && f=bench/year-nadir-albedo.yaml
  if [ "$SS_READY" = yes ]; then
    measure "sunsight-$alb" /tmp/sunsight run -quiet "$f"
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
