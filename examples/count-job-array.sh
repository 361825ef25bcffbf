#!/bin/sh
# Count every orbit of the Hénon map up to period 14 in 16 shards, as a Slurm job array.
# Submit:   sbatch examples/count-job-array.sh
# Then:     orbitseal merge henon-parts/part-*.json --out henon-count.json
# Each task runs one deterministic share of the work (pieces j with j mod 16 = task id) and
# writes a partial certificate; merge refuses a set with a missing or repeated shard and
# re-checks the merged certificate with the independent checker.
#SBATCH --job-name=orbitseal-count
#SBATCH --array=0-15
#SBATCH --cpus-per-task=2
#SBATCH --time=02:00:00
#SBATCH --output=henon-parts/log-%a.txt
set -eu
mkdir -p henon-parts
orbitseal count henon --period 14 --upto --region 'x=[-2,2]' --region 'y=[-2,2]' \
  --pieces 8 --workers "${SLURM_CPUS_PER_TASK:-1}" \
  --shard "${SLURM_ARRAY_TASK_ID}/16" --out "henon-parts/part-${SLURM_ARRAY_TASK_ID}.json" --force
