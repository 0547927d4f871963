#!/usr/bin/env bash
# The exit-status contract, checked on the built binary as a CI job would use
# it: a scenario whose target fails exits 3, the same with the target relaxed
# exits 0, bad input exits 2, a write error on stdout exits 1.
set -uo pipefail
cd "$(dirname "$0")/.."
bin=$(mktemp -d)/sunsight
go build -o "$bin" ./cmd/sunsight
work=$(mktemp -d)
trap 'rm -rf "$work" "$(dirname "$bin")"' EXIT
fail=0
expect() { # expect CODE DESCRIPTION COMMAND...
  local want=$1 what=$2; shift 2
  "$@" >"$work/out" 2>"$work/err"
  local got=$?
  if [ "$got" != "$want" ]; then
    echo "FAIL $what: exit $got, want $want"; sed 's/^/  stderr: /' "$work/err"; fail=1
  else
    echo "ok   $what: exit $got"
  fi
}
# The bundled nadir example misses its p95 error target on purpose (about 15° against 5°).
expect 3 "run, a target missed" "$bin" run examples/nadir-6u-sso.yaml --duration 6h --quiet
tail -n 1 "$work/out" | grep -q "^verdict: .* targets failed" || { echo "FAIL the summary does not end with the failed verdict"; fail=1; }
expect 3 "run --json, a target missed" "$bin" run examples/nadir-6u-sso.yaml --duration 6h --quiet --json
sed 's/max_error_p95_deg: 5$/max_error_p95_deg: 40/' examples/nadir-6u-sso.yaml >"$work/pass.yaml"
expect 0 "run, every target met" "$bin" run "$work/pass.yaml" --duration 6h --quiet
expect 2 "run, bad flag value" "$bin" run examples/nadir-6u-sso.yaml --duration soon
expect 2 "check, a missing file" "$bin" check "$work/none.yaml"
if [ -w /dev/full ]; then
  expect 1 "check, stdout on a full device" sh -c "'$bin' check examples/nadir-6u-sso.yaml >/dev/full"
fi
exit $fail
