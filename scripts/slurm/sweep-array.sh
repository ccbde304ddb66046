#!/usr/bin/env bash
# A Slurm job array that computes one n2pulse sweep in shards, one shard per array task.
#
#   sbatch scripts/slurm/sweep-array.sh [DESIGN] --vary KEY=FROM:TO:N[:log] [--vary …] [--set …]
#   # when all tasks are done:
#   n2pulse merge shards/* --out merged
#
# Task K of an array of N computes the points i with i mod N = K−1 (n2pulse reads
# SLURM_ARRAY_TASK_ID and SLURM_ARRAY_TASK_COUNT) into shards/K. --resume makes a requeued or
# resubmitted task finish its shard instead of starting over. Environment: N2PULSE is the
# program (default: n2pulse on PATH), OUT the folder of the shard directories (default shards).
#
#SBATCH --job-name=n2pulse-sweep
#SBATCH --array=1-4
#SBATCH --cpus-per-task=1
#SBATCH --output=n2pulse-sweep-%A-%a.log
set -euo pipefail

n2pulse=${N2PULSE:-n2pulse}
out=${OUT:-shards}
: "${SLURM_ARRAY_TASK_ID:?run this script with sbatch as a job array (sbatch --array=1-N)}"

exec "$n2pulse" sweep "$@" \
	--workers "${SLURM_CPUS_PER_TASK:-1}" \
	--out "$out/$SLURM_ARRAY_TASK_ID" \
	--resume --quiet
