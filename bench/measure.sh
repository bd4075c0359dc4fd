#!/usr/bin/env bash
# erg measure on this host: times the reference models in onnxruntime and prints one line per model.
#
#   bash bench/measure.sh                 # from anywhere; finds the repository root itself
#   RUNS=50 WARMUP=10 CLOCK=wall bash bench/measure.sh   (defaults: 50, 10, cpu: the thread's CPU time)
#   SHARED=/path/to/shared/models bash bench/measure.sh
#   OUT=estimator/src/test/resources/measurements/host-cpu bash bench/measure.sh   # re-record the test data
#
# What it does (see docs/measure.md):
#   1. builds measure/target/erg-measure.jar with Maven unless it is newer than every source;
#   2. makes runnable copies of the weight-stripped *.graph.onnx models of the shared model set in
#      bench/scratch/models/ (bench/fill_weights.py: seeded random weights, same file and node names;
#      needs Debian's python3-onnx and python3-numpy) and copies the demo models, which carry weights;
#   3. runs 'erg measure' on every model (1 intra-op thread, graph optimisations off, whole runs timed
#      by the CPU time of the calling thread, which a busy shared machine disturbs less than the wall clock) and writes
#      measurements.csv (the calibration's measurement file) and measurements.json (every run) to $OUT;
#   4. prints per model the median and p90 latency, and the sum of its node medians.
# bench/ is not a Maven module: 'mvn test' never runs it. The tests read the recorded files only.
set -euo pipefail

root=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$root"
jar=measure/target/erg-measure.jar
out=${OUT:-bench/scratch/measure}
runs=${RUNS:-50}
warmup=${WARMUP:-10}
shared=${SHARED:-}
if [ -z "$shared" ]; then
  for c in ../shared/models ../../shared/models ../../../shared/models; do
    if [ -d "$c" ]; then shared=$(cd "$c" && pwd); break; fi
  done
fi
[ -n "$shared" ] && [ -d "$shared" ] || { echo "no shared model folder: set SHARED=..." >&2; exit 2; }

if [ ! -f "$jar" ] || [ -n "$(find pom.xml estimator/src/main cli/src/main measure/src/main measure/pom.xml -newer "$jar" -type f 2>/dev/null | head -1)" ]; then
  echo "building $jar" >&2
  mvn -q -DskipTests package -pl measure -am
fi

models=bench/scratch/models
mkdir -p "$models" "$out"
graphs="squeezenet1_1 mnasnet0_5 resnet18 mobilenet_v2 mobilenet_v2_w0.35_96 shufflenet_v2_x0_5 tiny_transformer unet_small mobilenet_v2.qdq"
list=()
for g in $graphs; do
  if [ ! -f "$models/$g.graph.onnx" ] || [ "$shared/$g.graph.onnx" -nt "$models/$g.graph.onnx" ]; then
    /usr/bin/python3 bench/fill_weights.py "$shared/$g.graph.onnx" "$models" 1 >&2
  fi
  list+=("$models/$g.graph.onnx")
done
for d in feeder_cnn lstm_kws; do
  cp -f "$shared/demo/$d.onnx" "$models/$d.onnx"
  list+=("$models/$d.onnx")
done

java -jar "$jar" measure "${list[@]}" --runs "$runs" --warmup "$warmup" --threads 1 --clock "${CLOCK:-cpu}" --top 0 \
  --csv "$out/measurements.csv" --json "$out/measurements.json" >bench/scratch/measure-console.txt
printf '%-34s %10s %10s %12s %6s\n' model "median ms" "p90 ms" "node sum ms" nodes
grep -B1 "^  model:" bench/scratch/measure-console.txt | awk '
  /^[^ ].* on / { model = $1 }
  /^  model:/ { gsub(/,/, ""); printf "%-34s %10s %10s %12s %6s\n", model, $3, $6, $(NF-1), $(NF-8) }'
echo "written: $out/measurements.csv, $out/measurements.json" >&2
