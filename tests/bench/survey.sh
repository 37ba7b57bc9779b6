#!/usr/bin/env bash
# Survey-scale benchmark (a harness, not a test): an invented demo field of N stars run
#   1. on one machine ('run'), with wall time and peak resident memory (GNU time) and the per-stage
#      figures from summary.json (timings_s, peak_memory_mib);
#   2. tiled ('split', every 'tile', 'merge'), locally one tile after another, or through Slurm when
#      SLURM=1 (the generated work/slurm/submit.sh --wait);
# then prints the tiling overhead (split + merge) as a fraction of the single-machine run and checks that
# the merged stars table is byte-identical to the single-machine one.
# Usage: tests/bench/survey.sh [N=1000000] [ORDER=7] [DIR=/tmp/pm-survey-bench]
set -euo pipefail
n=${1:-1000000}; order=${2:-7}; dir=${3:-/tmp/pm-survey-bench}
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
exe=${PHOTOMETALLICITY:-$root/src/Photometallicity.Cli/bin/Release/net10.0/photometallicity}
[ -x "$exe" ] || { echo "build first: dotnet build -c Release ($exe missing)" >&2; exit 2; }
rm -rf "$dir"; mkdir -p "$dir"
timed() { # label, command...: prints "label seconds peak_MiB"
  local label=$1; shift
  /usr/bin/time -f "%e %M" -o "$dir/$label.time" "$@" 2>"$dir/$label.log" || { echo "FAILED: $label (see $dir/$label.log)" >&2; tail -5 "$dir/$label.log" >&2; exit 1; }
  read -r s kib < "$dir/$label.time"
  printf '%-10s %9.1f s %9.0f MiB\n' "$label" "$s" "$((kib / 1024))"
}
echo "== invented field: $n stars"
timed demo "$exe" demo --stars "$n" --out "$dir/field" --inputs-only
echo "== single machine"
timed run "$exe" run "$dir/field/config.json" --out "$dir/single"
/usr/bin/python3 - "$dir/single/summary.json" <<'PY'
import json, sys
s = json.load(open(sys.argv[1]))
p = s.get("provenance", s)
t, m = p.get("timings_s", {}), p.get("peak_memory_mib", {})
for k in t: print(f"  stage {k:<28} {t[k]:9.2f} s, peak so far {m.get(k, float('nan')):9.0f} MiB")
PY
echo "== tiled (order $order)"
timed split "$exe" split "$dir/field/config.json" --order "$order" --out "$dir/work"
tiles=$(/usr/bin/python3 -c "import json,sys; print(len(json.load(open(sys.argv[1]))['tiles']))" "$dir/work/plan.json")
start=$(date +%s.%N)
if [ "${SLURM:-0}" = 1 ]; then
  "$exe" batch "$dir/work" --out "$dir/merged" >/dev/null 2>&1
  timed slurm "$dir/work/slurm/submit.sh" --wait
else
  peak=0
  for ((i = 0; i < tiles; i++)); do
    /usr/bin/time -f "%M" -o "$dir/tile.time" "$exe" tile "$dir/work" --index "$i" 2>>"$dir/tiles.log"
    kib=$(cat "$dir/tile.time"); [ "$kib" -gt "$peak" ] && peak=$kib
  done
  printf '%-10s %9.1f s %9.0f MiB (largest tile; %d tiles one after another)\n' tiles "$(python3 -c "print($(date +%s.%N) - $start)")" "$((peak / 1024))" "$tiles"
  timed merge "$exe" merge "$dir/work" --out "$dir/merged"
fi
run_s=$(cut -d' ' -f1 "$dir/run.time"); split_s=$(cut -d' ' -f1 "$dir/split.time")
merge_s=$([ -f "$dir/merge.time" ] && cut -d' ' -f1 "$dir/merge.time" || echo 0)
echo "tiling overhead (split + merge) / run = $(python3 -c "print(round(($split_s + $merge_s) / $run_s, 3))")"
if cmp -s "$dir/single/stars.csv" "$dir/merged/stars.csv"; then echo "merged stars.csv is byte-identical to the single-machine run"; else echo "MISMATCH: merged stars.csv differs"; exit 1; fi
