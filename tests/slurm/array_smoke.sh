#!/usr/bin/env bash
# On a running Slurm cluster (tests/slurm/start.sh): the scripts 'batch' writes, run by Slurm with a stand-in
# program, for a plan written by hand. Checks that every tile task runs with its own index, that the merge runs
# after them with the right arguments, and that a failing tile cancels the merge and makes submit.sh --wait fail
# instead of waiting for ever. Independent of 'split', 'tile' and 'merge'. One PASS or FAIL line per check.
set -uo pipefail

exe=${PHOTOMETALLICITY:?set PHOTOMETALLICITY to the built photometallicity executable}
timeout_s=${SMOKE_TIMEOUT:-300}
fails=0
pass() { echo "PASS slurm smoke: $*"; }
fail() { echo "FAIL slurm smoke: $*"; fails=$((fails + 1)); }

tmp=$(mktemp -d "${TMPDIR:-/tmp}/slurm smoke it's.XXXXXX")
trap 'rm -rf "$tmp"' EXIT
fake="$tmp/bin/stand-in program"
mkdir -p "$tmp/bin"
cat >"$fake" <<'SH'
#!/bin/bash
# tile WORKDIR --index N | merge WORKDIR --out DIR
set -eu
case "$1" in
  tile) [ "$3" = --index ] || exit 9
        [ "${FAIL_TILE:-}" = "$4" ] && { echo "stand-in: tile $4 fails on purpose" >&2; exit 3; }
        mkdir -p "$2/ran"; echo "$4" >"$2/ran/tile-$4" ;;
  merge) [ "$3" = --out ] || exit 9
        mkdir -p "$4"; ls "$2/ran" >"$4/tiles-seen" ;;
  *) exit 9 ;;
esac
SH
chmod +x "$fake"

plan() { # plan WORKDIR TILES
  local w=$1 n=$2 i tiles=""
  mkdir -p "$w"
  for ((i = 0; i < n; i++)); do tiles+="${tiles:+,}{\"index\":$i,\"pixel\":$((100 + i)),\"owned_rows\":10,\"broadband_rows\":12,\"narrowband_rows\":8}"; done
  printf '{"kind":"photometallicity tile plan","version":1,"config":"%s/config.json","output_directory":"%s/out","order":4,"margin_arcsec":1.5,"broadband_rows":%d,"narrowband_rows":%d,"tiles":[%s]}\n' \
    "$w" "$w" $((10 * n)) $((8 * n)) "$tiles" >"$w/plan.json"
}

# 1. Three tiles that succeed, then the merge.
ok="$tmp/ok work"
plan "$ok" 3
if "$exe" batch "$ok" --exe "$fake" --out "$tmp/ok merged" --job-name "pm-smoke-$$" >"$tmp/batch.log" 2>&1; then
  if timeout "$timeout_s" "$ok/slurm/submit.sh" --wait; then
    if [ "$(cat "$tmp/ok merged/tiles-seen" 2>/dev/null | tr '\n' ' ')" = "tile-0 tile-1 tile-2 " ]; then
      pass "a 3-task job array ran every tile, then the merge saw all three"
    else
      fail "the merge did not see tiles 0, 1, 2: $(cat "$tmp/ok merged/tiles-seen" 2>/dev/null)"
    fi
  else
    fail "submit.sh --wait failed on tiles that succeed"; tail -n 20 "$ok"/slurm/logs/* 2>/dev/null
  fi
else
  cat "$tmp/batch.log"; fail "batch failed"
fi

# 2. Tile 1 of 2 fails: the merge must never run, and submit.sh --wait must return non-zero.
bad="$tmp/bad work"
plan "$bad" 2
if "$exe" batch "$bad" --exe "$fake" --out "$tmp/bad merged" --job-name "pm-smoke-$$" >"$tmp/batch.log" 2>&1; then
  FAIL_TILE=1 timeout "$timeout_s" "$bad/slurm/submit.sh" --wait
  rc=$?
  if [ "$rc" -eq 124 ]; then fail "submit.sh --wait still waiting after ${timeout_s} s with a failed tile"; scancel --name="pm-smoke-$$-merge" 2>/dev/null
  elif [ "$rc" -eq 0 ]; then fail "submit.sh --wait returned 0 although tile 1 failed"
  elif [ -e "$tmp/bad merged/tiles-seen" ]; then fail "the merge ran although tile 1 failed"
  else pass "a failing tile cancels the merge and submit.sh --wait exits $rc"
  fi
else
  cat "$tmp/batch.log"; fail "batch failed"
fi
[ "$fails" -eq 0 ]
