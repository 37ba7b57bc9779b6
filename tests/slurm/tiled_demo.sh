#!/usr/bin/env bash
# End to end on a running Slurm cluster (tests/slurm/start.sh): the invented demo field run once on this machine
# ('demo', which writes the field and runs the whole pipeline) and once tiled ('split' into HEALPix tiles, 'batch',
# the Slurm job array and merge via submit.sh --wait); the star tables of the two runs must be identical byte for
# byte. Prints one PASS or FAIL line per check; exits non-zero if any check failed.
#
# Environment: PHOTOMETALLICITY (required) the built CLI; TILED_DEMO_ORDER HEALPix order of the tiles (default 6:
# the demo field, seed 1, falls in 4 pixels at order 6, checked with the 'healpix' verb); TILED_DEMO_STARS
# (default 20000, the demo's default); TILED_DEMO_TIMEOUT seconds to wait for the jobs (default 600);
# TILED_DEMO_BATCH_ARGS extra options for 'batch' (e.g. "--mem-per-task 1024").
set -uo pipefail

exe=${PHOTOMETALLICITY:?set PHOTOMETALLICITY to the built photometallicity executable}
exe=$(readlink -f "$exe")   # absolute: the nodes run it from the work directory
order=${TILED_DEMO_ORDER:-6}
stars=${TILED_DEMO_STARS:-20000}
timeout_s=${TILED_DEMO_TIMEOUT:-600}
name="pm-tiled-$$"
fails=0
fail() { echo "FAIL tiled Slurm run: $*"; fails=$((fails + 1)); }

tmp=$(mktemp -d "${TMPDIR:-/tmp}/tiled demo.XXXXXX")   # a space in every path, on purpose
trap 'rm -rf "$tmp"' EXIT
demo="$tmp/demo"; work="$tmp/work"; merged="$tmp/merged"

show_logs() {
  for f in "$work"/slurm/logs/*; do [ -f "$f" ] && { echo "--- $f"; tail -n 40 "$f"; }; done
}

finish() {
  if [ "$fails" -eq 0 ]; then echo "PASS tiled Slurm run matches the single-machine run byte for byte"; exit 0; fi
  exit 1
}

echo "== single-machine run: demo --stars $stars"
if ! "$exe" demo --stars "$stars" --out "$demo" >"$tmp/demo.log" 2>&1; then
  tail -n 30 "$tmp/demo.log"; fail "the single-machine demo run failed"; finish
fi
ref="$demo/out"
[ -s "$ref/stars.csv" ] || { fail "the demo wrote no $ref/stars.csv"; finish; }

echo "== split --order $order"
if ! "$exe" split "$demo/config.json" --order "$order" --out "$work" 2>&1; then fail "split failed"; finish; fi
tiles=$(/usr/bin/python3 -c 'import json,sys; print(len(json.load(open(sys.argv[1]))["tiles"]))' "$work/plan.json" 2>/dev/null || echo "?")
echo "plan: $tiles tiles"

echo "== batch"
# shellcheck disable=SC2086
if ! "$exe" batch "$work" --exe "$exe" --out "$merged" --job-name "$name" ${TILED_DEMO_BATCH_ARGS:-} 2>&1; then fail "batch failed"; finish; fi

echo "== submit.sh --wait (timeout ${timeout_s} s)"
start=$(date +%s)
timeout "$timeout_s" "$work/slurm/submit.sh" --wait
rc=$?
echo "jobs took $(( $(date +%s) - start )) s"
if [ "$rc" -ne 0 ]; then
  [ "$rc" -eq 124 ] && { echo "timed out; cancelling"; scancel --name="$name-tiles" 2>/dev/null; scancel --name="$name-merge" 2>/dev/null; squeue 2>/dev/null; }
  show_logs
  fail "the Slurm jobs did not succeed (submit.sh --wait exit code $rc)"; finish
fi

compared=0
for f in stars.csv stars.fits stars.parquet; do
  [ -e "$ref/$f" ] || continue
  compared=$((compared + 1))
  if [ ! -e "$merged/$f" ]; then fail "the merge wrote no $f"; continue; fi
  if cmp "$ref/$f" "$merged/$f"; then echo "same: $f ($(stat -c %s "$ref/$f") bytes)"
  else fail "$f differs from the single-machine run's"; fi
done
[ "$compared" -ge 2 ] || fail "expected the demo to write stars.csv and stars.fits; found $compared of them"
[ "$fails" -eq 0 ] || show_logs
finish
