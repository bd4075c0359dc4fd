#!/usr/bin/env bash
# Does a sweep of 64 points cost less than 5 single runs? A real transformer export with a symbolic
# batch dim (ViT-B/16, estimator/src/test/resources/models/exports/dynamic/), the way a user runs erg:
# each figure is a whole `erg check` process, timed in this same run, alternating the two commands,
# median of ROUNDS (default 5) rounds each.
#   bash bench/sweep.sh                # from anywhere; ROUNDS=9 for more rounds
#   POINTS=128 bash bench/sweep.sh     # another sweep length
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
model=estimator/src/test/resources/models/exports/dynamic/vit_b_16.batch.graph.onnx
points=${POINTS:-64}
rounds=${ROUNDS:-5}
now() { date +%s%N; }
run_one() { java -jar "$jar" check "$model" --device preset:feeder-npu --dim batch=1 --no-fail-on-violation --top 0 >/dev/null; }
run_sweep() { java -jar "$jar" check "$model" --device preset:feeder-npu --sweep "batch=1..$points:1" --no-fail-on-violation --top 0 >/dev/null; }
run_one; run_sweep # the page cache holds the jar and the model for both
one=(); sweep=()
for ((i = 0; i < rounds; i++)); do
  t0=$(now); run_one; t1=$(now); run_sweep; t2=$(now)
  one+=($(( (t1 - t0) / 1000000 ))); sweep+=($(( (t2 - t1) / 1000000 )))
done
median() { printf '%s\n' "$@" | sort -n | awk '{a[NR]=$1} END {print a[int((NR + 1) / 2)]}'; }
m1=$(median "${one[@]}"); ms=$(median "${sweep[@]}")
printf 'model            %s\n' "$model"
printf 'one point        %s ms (erg check --dim batch=1; median of %s)\n' "$m1" "$rounds"
printf '%-16s %s ms (erg check --sweep batch=1..%s:1; median of %s)\n' "$points points" "$ms" "$points" "$rounds"
awk -v a="$ms" -v b="$m1" -v n="$points" 'BEGIN { r = a / b; printf "ratio            %.2f (goal: under 5)\n", r; exit (r < 5 ? 0 : 1) }'
