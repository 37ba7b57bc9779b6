#!/usr/bin/env bash
# Starts a single-node Slurm cluster on this machine for CI (no systemd): installs the Debian packages if sbatch
# is missing, starts munged, writes /etc/slurm/slurm.conf for this host, starts slurmctld and slurmd, and waits
# until the node is idle. Needs root. Stop it with tests/slurm/stop.sh.
# On failure it prints the daemons' logs and exits non-zero.
set -euo pipefail

here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
timeout_s=${SLURM_START_TIMEOUT:-60}
log_dir=/var/log/slurm
run_dir=/run/slurm
conf=/etc/slurm/slurm.conf

die() {
  echo "slurm start FAILED: $*" >&2
  for f in /var/log/munge/munged.log "$log_dir/slurmctld.log" "$log_dir/slurmd.log"; do
    [ -r "$f" ] && { echo "--- last lines of $f" >&2; tail -n 30 "$f" >&2; }
  done
  command -v sinfo >/dev/null && { echo "--- sinfo" >&2; sinfo -N -l >&2 || true; }
  exit 1
}

[ "$(id -u)" -eq 0 ] || die "must run as root (it installs packages and starts the daemons)"

if ! command -v sbatch >/dev/null || ! command -v slurmctld >/dev/null || ! command -v slurmd >/dev/null || ! command -v munged >/dev/null; then
  echo "installing slurmctld, slurmd, slurm-client, munge (Debian)"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq || die "apt-get update"
  apt-get install -y -qq --no-install-recommends slurmctld slurmd slurm-client munge >/dev/null || die "apt-get install of the Slurm packages"
fi

# Daemons left over from an earlier start of this script: stop them so the config below is the one in force.
"$here/stop.sh" >/dev/null 2>&1 || true

# --- munge: key, directories, daemon
if [ ! -s /etc/munge/munge.key ]; then
  mkdir -p /etc/munge
  if [ -x /usr/sbin/mungekey ]; then /usr/sbin/mungekey --create --keyfile=/etc/munge/munge.key
  elif command -v create-munge-key >/dev/null; then create-munge-key -f
  else dd if=/dev/urandom of=/etc/munge/munge.key bs=1 count=1024 status=none
  fi
fi
chown munge:munge /etc/munge /etc/munge/munge.key
chmod 0700 /etc/munge
chmod 0400 /etc/munge/munge.key
mkdir -p /run/munge /var/lib/munge /var/log/munge
chown munge:munge /run/munge /var/lib/munge /var/log/munge
chmod 0755 /run/munge
runuser -u munge -- /usr/sbin/munged || die "munged did not start"
for _ in $(seq 1 50); do [ -S /run/munge/munge.socket.2 ] && break; sleep 0.1; done
munge -n | unmunge >/dev/null || die "munge round trip (munge -n | unmunge) failed"

# --- slurm.conf for this one host
host=$(hostname -s)
cpus=$(nproc)
mem_total_mb=$(( $(awk '/^MemTotal:/ {print $2}' /proc/meminfo) / 1024 ))
# Declare a little less than the machine has (the kernel and the daemons need some): 95%, at least 512 MB less.
real_mb=$(( mem_total_mb * 95 / 100 ))
[ $(( mem_total_mb - real_mb )) -ge 512 ] || real_mb=$(( mem_total_mb - 512 ))
mkdir -p /etc/slurm "$log_dir" "$run_dir" /var/spool/slurmctld /var/spool/slurmd
conf_tmp="$conf.$$.tmp"
cat >"$conf_tmp" <<CONF
# Single-node test cluster written by tests/slurm/start.sh.
ClusterName=pmci
SlurmctldHost=${host}(127.0.0.1)
SlurmUser=root
SlurmdUser=root
AuthType=auth/munge
CredType=cred/munge
MpiDefault=none
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
SelectType=select/cons_tres
SelectTypeParameters=CR_Core_Memory
DefMemPerCPU=512
SchedulerType=sched/backfill
ReturnToService=2
JobAcctGatherType=jobacct_gather/none
AccountingStorageType=accounting_storage/none
StateSaveLocation=/var/spool/slurmctld
SlurmdSpoolDir=/var/spool/slurmd
SlurmctldPidFile=${run_dir}/slurmctld.pid
SlurmdPidFile=${run_dir}/slurmd.pid
SlurmctldLogFile=${log_dir}/slurmctld.log
SlurmdLogFile=${log_dir}/slurmd.log
SlurmctldPort=6817
SlurmdPort=6818
NodeName=${host} NodeAddr=127.0.0.1 CPUs=${cpus} RealMemory=${real_mb} State=UNKNOWN
PartitionName=debug Nodes=ALL Default=YES MaxTime=INFINITE State=UP
CONF
mv -f "$conf_tmp" "$conf"
echo "wrote $conf: node $host, $cpus CPUs, RealMemory $real_mb MB (of $mem_total_mb MB)"

# --- daemons (-c: start clean, without the state of earlier runs)
: >"$log_dir/slurmctld.log"; : >"$log_dir/slurmd.log"
/usr/sbin/slurmctld -c || die "slurmctld did not start"
/usr/sbin/slurmd -c || die "slurmd did not start"

deadline=$(( $(date +%s) + timeout_s ))
state=""
while [ "$(date +%s)" -lt "$deadline" ]; do
  state=$(sinfo -h -N -n "$host" -o '%T' 2>/dev/null | head -n 1 || true)
  case "$state" in idle|idle~|mixed|allocated) break ;; esac
  sleep 1
done
case "$state" in
  idle|idle~|mixed|allocated) ;;
  *) die "node $host not idle after ${timeout_s} s (state '${state:-unknown}')" ;;
esac
echo "slurm up: node $host $state, partition debug"
sinfo
