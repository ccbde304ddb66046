#!/usr/bin/env bash
# Start a one-node Slurm cluster on this machine, for the sharded-sweep test and for trying
# `n2pulse sweep` job arrays by hand. Idempotent: a running cluster is left as it is.
#
#   scripts/slurm/start-local-cluster.sh [start|stop|status]
#
# Needs root. Installs the Debian packages slurm-wlm and munge with apt-get when missing,
# creates the munge key if there is none, writes slurm.conf and all state, spool, log and pid
# files under $N2PULSE_SLURM_DIR (default /tmp/n2pulse-slurm), starts munged, slurmctld and
# slurmd, and waits until sinfo shows the node idle. On success the last line printed is
#   SLURM_CONF=<path>
# which clients (sbatch, sinfo, squeue) need in their environment. `stop` ends the daemons by
# the pids in their pid files.
set -euo pipefail

action=${1:-start}
dir=${N2PULSE_SLURM_DIR:-/tmp/n2pulse-slurm}
conf=$dir/etc/slurm.conf
export SLURM_CONF=$conf
host=$(hostname -s)

say() { echo "start-local-cluster: $*" >&2; }
die() { say "$*"; exit 1; }

alive() { # pid file → running?
	[ -s "$1" ] && kill -0 "$(cat "$1")" 2>/dev/null
}

stop_all() {
	for f in "$dir/run/slurmd.pid" "$dir/run/slurmctld.pid" "$dir/run/munged.pid"; do
		if alive "$f"; then
			pid=$(cat "$f")
			kill "$pid" && say "stopped $(basename "$f" .pid) (pid $pid)"
		fi
		rm -f "$f"
	done
}

status() {
	local ok=0
	for d in munged slurmctld slurmd; do
		if alive "$dir/run/$d.pid"; then say "$d running (pid $(cat "$dir/run/$d.pid"))"; else say "$d not running"; ok=1; fi
	done
	return $ok
}

case $action in
stop) stop_all; exit 0 ;;
status) status; exit $? ;;
start) ;;
*) die "unknown action $action: want start, stop or status" ;;
esac

[ "$(id -u)" = 0 ] || die "needs root (to install packages and run munged and slurmd)"

if ! command -v slurmctld >/dev/null || ! command -v slurmd >/dev/null || ! command -v munged >/dev/null || ! command -v sbatch >/dev/null; then
	command -v apt-get >/dev/null || die "slurm is not installed and there is no apt-get to install it"
	say "installing slurm-wlm and munge"
	export DEBIAN_FRONTEND=noninteractive
	apt-get update -qq >&2 || die "apt-get update failed"
	apt-get install -y -qq slurm-wlm munge >&2 || die "apt-get install slurm-wlm munge failed"
fi
munged_bin=$(command -v munged || echo /usr/sbin/munged)
slurmctld_bin=$(command -v slurmctld || echo /usr/sbin/slurmctld)
slurmd_bin=$(command -v slurmd || echo /usr/sbin/slurmd)

mkdir -p "$dir"/{etc,run,log,state,spool}

# munge: key, runtime directory, daemon as the munge user.
if ! alive "$dir/run/munged.pid"; then
	id munge >/dev/null 2>&1 || die "no munge user: the munge package did not install properly"
	if [ ! -s /etc/munge/munge.key ]; then
		mkdir -p /etc/munge
		dd if=/dev/urandom of=/etc/munge/munge.key bs=1024 count=1 status=none
		chown munge:munge /etc/munge/munge.key
		chmod 0400 /etc/munge/munge.key
		say "created /etc/munge/munge.key"
	fi
	mkdir -p /run/munge /var/log/munge /var/lib/munge
	chown munge:munge /run/munge /var/log/munge /var/lib/munge
	chown munge:munge "$dir/run"
	if ! munge -n 2>/dev/null | unmunge >/dev/null 2>&1; then
		runuser -u munge -- "$munged_bin" --pid-file="$dir/run/munged.pid" --force >&2 || die "munged did not start"
	fi
	chown root:root "$dir/run"
fi
for _ in $(seq 50); do munge -n 2>/dev/null | unmunge >/dev/null 2>&1 && break; sleep 0.1; done
munge -n | unmunge >/dev/null 2>&1 || die "munge does not work (munge -n | unmunge failed)"

# slurm.conf: one node, one partition, everything under $dir.
mem=$(awk '/MemAvailable/ {print int($2/1024*0.8)}' /proc/meminfo)
cat >"$conf.new" <<CONF
ClusterName=n2pulse-local
SlurmctldHost=$host
SlurmUser=root
SlurmdUser=root
AuthType=auth/munge
StateSaveLocation=$dir/state
SlurmdSpoolDir=$dir/spool
SlurmctldPidFile=$dir/run/slurmctld.pid
SlurmdPidFile=$dir/run/slurmd.pid
SlurmctldLogFile=$dir/log/slurmctld.log
SlurmdLogFile=$dir/log/slurmd.log
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
SchedulerType=sched/builtin
SelectType=select/cons_tres
SelectTypeParameters=CR_Core
ReturnToService=2
MpiDefault=none
NodeName=$host CPUs=$(nproc) RealMemory=$mem State=UNKNOWN
PartitionName=main Nodes=$host Default=YES MaxTime=INFINITE State=UP
CONF
if ! cmp -s "$conf.new" "$conf" 2>/dev/null; then
	if alive "$dir/run/slurmctld.pid" || alive "$dir/run/slurmd.pid"; then
		# Only the memory figure moves between calls; a running cluster keeps its config.
		rm -f "$conf.new"
	else
		mv "$conf.new" "$conf"
	fi
else
	rm -f "$conf.new"
fi

alive "$dir/run/slurmctld.pid" || "$slurmctld_bin" -f "$conf" >&2 || die "slurmctld did not start; see $dir/log/slurmctld.log"
alive "$dir/run/slurmd.pid" || "$slurmd_bin" -f "$conf" >&2 || die "slurmd did not start; see $dir/log/slurmd.log"

state=""
for _ in $(seq 60); do
	state=$(sinfo -h -o %T 2>/dev/null | head -n 1 || true)
	case $state in idle | mixed | allocated) break ;; esac
	sleep 0.5
done
case $state in
idle | mixed | allocated) say "node $host $state" ;;
*) die "the node did not become idle (sinfo state '${state:-none}'); see $dir/log" ;;
esac
echo "SLURM_CONF=$conf"
