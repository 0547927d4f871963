#!/usr/bin/env bash
# Checks that a change meant only to be faster leaves the outputs the same
# bytes: builds sunsight at REV (a git revision, default HEAD) and from the
# working tree, runs `run --json` of every example and bench scenario
# (3 days, 3 Monte Carlo units; the year cases 5 days; a replay its own
# span) on one and on two
# workers through both, and compares the JSON and the exit status.
# Usage: bash bench/same-outputs.sh [REV]
set -euo pipefail
cd "$(dirname "$0")/.."
REV="${1:-HEAD}"
OUT="$(mktemp -d)"
trap 'git worktree remove --force "$OUT/rev" >/dev/null 2>&1 || true; rm -rf "$OUT"' EXIT

git worktree add --detach "$OUT/rev" "$REV" >/dev/null 2>&1
(cd "$OUT/rev" && go build -o "$OUT/old" ./cmd/sunsight)
go build -o "$OUT/new" ./cmd/sunsight

fail=0
for f in examples/*.yaml bench/*.yaml; do
  span=(--duration 3d)
  case "$f" in *year*) span=(--duration 5d) ;; esac
  grep -q "ephemeris_file" "$f" && span=()
  for w in 1 2; do
    args=(run --quiet --json "${span[@]}" --units 3 --workers "$w" "$f")
    set +e
    "$OUT/old" "${args[@]}" >"$OUT/old.json" 2>/dev/null; ro=$?
    "$OUT/new" "${args[@]}" >"$OUT/new.json" 2>/dev/null; rn=$?
    set -e
    if [ "$ro" = "$rn" ] && cmp -s "$OUT/old.json" "$OUT/new.json"; then
      printf "same     %-48s workers %s exit %s\n" "$f" "$w" "$rn"
    else
      printf "CHANGED  %-48s workers %s exit %s -> %s\n" "$f" "$w" "$ro" "$rn"
      fail=1
    fi
  done
done
exit "$fail"
