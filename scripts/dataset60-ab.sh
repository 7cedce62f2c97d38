#!/usr/bin/env bash
# Alternates two builds of the bench on the dataset60 analysis: ROUNDS times each, one process per run, REPS analyses
# per process (the first warms up). Prints each analysis line with the build's label and the load average.
# Usage: scripts/dataset60-ab.sh LABEL_A DIR_A LABEL_B DIR_B [FAMILY [ROUNDS [REPS]]]
#   DIR_* is a checkout whose bench/Hull.Bench is built in Release.
set -euo pipefail
label_a=$1 dir_a=$2 label_b=$3 dir_b=$4 family=${5:-dense} rounds=${6:-3} reps=${7:-3}
run() {
  local label=$1 dir=$2
  local load; load=$(cut -d' ' -f1 /proc/loadavg)
  (cd "$dir" && dotnet bench/Hull.Bench/bin/Release/net10.0/Hull.Bench.dll dataset-once "$family" 100000 "$reps") |
    awk -v l="$label" -v load="$load" '{ print l " (load " load ", run " NR "): " $0 }'
}
for ((r = 1; r <= rounds; r++)); do
  run "$label_a" "$dir_a"
  run "$label_b" "$dir_b"
done
