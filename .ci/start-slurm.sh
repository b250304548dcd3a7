#!/usr/bin/env bash
# Starts a single-node Slurm (slurmctld and slurmd on this machine) for the scheduler test
# (SlurmJobArrayTests). Debian or Ubuntu, as root. Installs slurm-wlm and munge when missing (apt-get update first),
# starts munged, writes a cgroup-free slurm.conf (works in a container), starts slurmctld and slurmd, and waits until
# the node takes jobs.
#
# Prints, as its last line, either
#   INSPECTION_UPDATE_SLURM=up
# or
#   INSPECTION_UPDATE_SLURM=unavailable: <why>
# and exits 0 in both cases: .ci/run exports the value so that the test runs or says why it skipped.
set -uo pipefail

say_unavailable() {
  echo "INSPECTION_UPDATE_SLURM=unavailable: $*"
  exit 0
}

[ "$(id -u)" = 0 ] || say_unavailable "not root (Slurm's daemons and munged need root to be started here)"

if ! command -v slurmctld >/dev/null || ! command -v slurmd >/dev/null || ! command -v munged >/dev/null; then
  command -v apt-get >/dev/null || say_unavailable "slurm-wlm and munge are not installed and there is no apt-get"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update >/tmp/start-slurm-apt.log 2>&1 || say_unavailable "apt-get update failed (see /tmp/start-slurm-apt.log)"
  apt-get install -y --no-install-recommends slurm-wlm munge >>/tmp/start-slurm-apt.log 2>&1 \
    || say_unavailable "apt-get install slurm-wlm munge failed (see /tmp/start-slurm-apt.log)"
fi

HOST=$(hostname -s)
CPUS=$(nproc)
CONF=/etc/slurm/slurm.conf
LOG=/var/log/slurm

# munge: a key (the package makes one; make it if missing), its folders, the daemon as the munge user.
mkdir -p /etc/munge /var/lib/munge /var/log/munge /run/munge
[ -s /etc/munge/munge.key ] || mungekey --create --keyfile=/etc/munge/munge.key >/dev/null 2>&1 \
  || dd if=/dev/urandom bs=1 count=1024 of=/etc/munge/munge.key 2>/dev/null
chown -R munge:munge /etc/munge /var/lib/munge /var/log/munge /run/munge
chmod 0700 /etc/munge /var/lib/munge /var/log/munge
chmod 0755 /run/munge
chmod 0400 /etc/munge/munge.key
if ! munge -n 2>/dev/null | unmunge >/dev/null 2>&1; then
  runuser -u munge -- /usr/sbin/munged --force >/tmp/start-slurm-munged.log 2>&1 \
    || say_unavailable "munged did not start: $(tail -n 3 /tmp/start-slurm-munged.log | tr '\n' ' ')"
  for _ in $(seq 1 50); do munge -n 2>/dev/null | unmunge >/dev/null 2>&1 && break; sleep 0.2; done
  munge -n 2>/dev/null | unmunge >/dev/null 2>&1 || say_unavailable "munged started but a credential does not round-trip (munge -n | unmunge)"
fi

# A single node; no cgroups (proctrack/linuxproc, task/none), no accounting database: works in a container.
mkdir -p /etc/slurm /var/spool/slurmctld /var/spool/slurmd "$LOG"
cat >"$CONF" <<EOF
# Written by .ci/start-slurm.sh: single-node Slurm for the scheduler test.
ClusterName=iu-ci
SlurmctldHost=$HOST
SlurmUser=root
SlurmdUser=root
AuthType=auth/munge
CredType=cred/munge
MpiDefault=none
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
JobAcctGatherType=jobacct_gather/none
AccountingStorageType=accounting_storage/none
JobCompType=jobcomp/none
SchedulerType=sched/backfill
SelectType=select/cons_tres
SelectTypeParameters=CR_CPU
ReturnToService=2
MinJobAge=600
SlurmctldPidFile=/run/slurmctld.pid
SlurmdPidFile=/run/slurmd.pid
StateSaveLocation=/var/spool/slurmctld
SlurmdSpoolDir=/var/spool/slurmd
SlurmctldLogFile=$LOG/slurmctld.log
SlurmdLogFile=$LOG/slurmd.log
SlurmctldTimeout=60
SlurmdTimeout=60
NodeName=$HOST CPUs=$CPUS State=UNKNOWN
PartitionName=ci Nodes=$HOST Default=YES MaxTime=INFINITE State=UP
EOF
# No cgroup.conf: nothing above uses cgroups.
rm -f /etc/slurm/cgroup.conf

if ! scontrol ping 2>/dev/null | grep -q UP; then
  /usr/sbin/slurmctld >/tmp/start-slurm-slurmctld.log 2>&1 \
    || say_unavailable "slurmctld did not start: $(tail -n 3 "$LOG/slurmctld.log" /tmp/start-slurm-slurmctld.log 2>/dev/null | tr '\n' ' ')"
fi
if ! pgrep -x slurmd >/dev/null; then
  /usr/sbin/slurmd >/tmp/start-slurm-slurmd.log 2>&1 \
    || say_unavailable "slurmd did not start: $(tail -n 3 "$LOG/slurmd.log" /tmp/start-slurm-slurmd.log 2>/dev/null | tr '\n' ' ')"
fi

# Wait until the controller answers and the node is idle (or mixed/allocated by an earlier job).
for _ in $(seq 1 60); do
  state=$(sinfo -h -N -n "$HOST" -o %t 2>/dev/null | head -n 1)
  case "$state" in idle | mix | alloc) break ;; esac
  sleep 1
done
case "$state" in
  idle | mix | alloc) ;;
  down* | drain* | fail*)
    scontrol update NodeName="$HOST" State=RESUME >/dev/null 2>&1
    sleep 2
    state=$(sinfo -h -N -n "$HOST" -o %t 2>/dev/null | head -n 1)
    case "$state" in idle | mix | alloc) ;; *) say_unavailable "node $HOST is '$state' (sinfo); see $LOG/slurmd.log" ;; esac
    ;;
  *) say_unavailable "node $HOST is not up after 60 s (sinfo state '${state:-none}'); see $LOG/slurmctld.log and $LOG/slurmd.log" ;;
esac

# A trivial job must run end to end.
out=$(srun -N1 -n1 -t 1 hostname 2>&1) || say_unavailable "srun hostname failed: $out"
echo "Slurm is up: node $out, $CPUS CPUs, partition ci."
echo "INSPECTION_UPDATE_SLURM=up"
