#!/usr/bin/env bash
# What does enforcing the profile schema at load cost? Whole-process `erg estimate` on one small model,
# the same profile given two ways, interleaved: as a built-in preset (checked by the build, not at load)
# and as a file (checked against docs/device-profile.schema.json at load). Medians and their ratio.
#   bash bench/profile-load.sh        # RUNS=41 for more runs
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
runs=${RUNS:-21}
model=estimator/src/test/resources/models/lstm_kws.graph.onnx
[ -f "$model" ] || model=$(ls estimator/src/test/resources/models/*.onnx | head -1)
cp estimator/src/main/resources/dev/erg/device/presets/feeder-npu.yaml "$work/feeder-npu.yaml"
log="$work/profile-load.times"
: > "$log"
for i in $(seq "$runs"); do
  for way in preset file; do
    dev=preset:feeder-npu; [ "$way" = file ] && dev="$work/feeder-npu.yaml"
    if [ "$have_time" = 1 ]; then
      /usr/bin/time -f "$way %e %U %S" -a -o "$log" java -jar "$jar" estimate "$model" --device "$dev" >/dev/null
    else
      s=$(date +%s%N); java -jar "$jar" estimate "$model" --device "$dev" >/dev/null; e=$(date +%s%N)
      echo "$way $(( (e - s) / 1000 ))e-6 0 0" >> "$log"
    fi
  done
done
median() { sort -n | awk '{a[NR]=$1} END {print a[int((NR+1)/2)]}'; }
for way in preset file; do
  wall=$(awk -v w="$way" '$1==w {print $2*1000}' "$log" | median)
  cpu=$(awk -v w="$way" '$1==w {print ($3+$4)*1000}' "$log" | median)
  printf '%-7s median wall %6.0f ms   median CPU (user+sys) %6.0f ms   (%s runs)\n' "$way" "$wall" "$cpu" "$runs"
  eval "wall_$way=$wall cpu_$way=$cpu"
done
awk -v a="$wall_preset" -v b="$wall_file" -v c="$cpu_preset" -v d="$cpu_file" \
  'BEGIN {printf "file / preset: wall %.2fx (+%.0f ms), CPU %.2fx (+%.0f ms)\n", b/a, b-a, d/c, d-c}'
