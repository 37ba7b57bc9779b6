#!/usr/bin/env bash
# Stops the daemons started by tests/slurm/start.sh, by the process ids in their pid files.
set -uo pipefail

stop_pid_file() {
  local name=$1 file=$2 pid
  [ -s "$file" ] || { echo "$name: no pid file $file"; return 0; }
  pid=$(cat "$file")
  if ! kill -0 "$pid" 2>/dev/null; then echo "$name: pid $pid not running"; rm -f "$file"; return 0; fi
  kill -TERM "$pid"
  for _ in $(seq 1 100); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
  if kill -0 "$pid" 2>/dev/null; then echo "$name: pid $pid still running after 10 s; sending KILL"; kill -KILL "$pid" 2>/dev/null; fi
  rm -f "$file"
  echo "$name: stopped (pid $pid)"
}

stop_pid_file slurmd /run/slurm/slurmd.pid
stop_pid_file slurmctld /run/slurm/slurmctld.pid
stop_pid_file munged /run/munge/munged.pid
exit 0
