#!/usr/bin/env bash
# The live run of docs/validation.md, "Calibration on the host": profiles this host, times the reference
# models, calibrates the host profile on three of them and predicts the whole-model latency of the others.
#
#   bash bench/calibrate-host.sh                      # from anywhere; finds the repository root itself
#   FIT="squeezenet1_1.graph.onnx unet_small.graph.onnx lstm_kws.onnx" bash bench/calibrate-host.sh
#   OUT=estimator/src/test/resources/measurements/host-cpu bash bench/calibrate-host.sh   # re-record the test data
#
# Steps (each one a documented command; see docs/measure.md and docs/calibration.md):
#   1. erg host-profile --out $OUT/host-1thread.yaml      (peak MAC rate, cache and DRAM bandwidths)
#   2. bench/measure.sh with OUT=$OUT                      (measurements.csv, measurements.json)
#   3. erg calibrate on the $FIT models' rows              ($OUT/host-1thread.calibrated.yaml)
#   4. erg estimate of every other model on both profiles, and a table of measured, profile and
#      calibrated whole-model latency with the errors, the median and the worst.
# The machine should be otherwise idle: other work on its cores disturbs every figure.
set -euo pipefail

root=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$root"
out=${OUT:-bench/scratch/calibrate-host}
fit=${FIT:-"mobilenet_v2.graph.onnx resnet18.graph.onnx tiny_transformer.graph.onnx"}
models=bench/scratch/models
mkdir -p "$out"

if [ ! -f cli/target/erg.jar ] || [ -n "$(find pom.xml estimator/src/main cli/src/main -newer cli/target/erg.jar -type f 2>/dev/null | head -1)" ]; then
  echo "building cli/target/erg.jar" >&2
  mvn -q -DskipTests package -pl cli -am
fi
OUT="$out" bash bench/measure.sh >/dev/null
java -jar measure/target/erg-measure.jar host-profile --out "$out/host-1thread.yaml" >&2

# The fit set's rows only (comments and header kept): calibrate reads no model it is not given.
fitcsv="$out/fit-rows.csv"
awk -F, -v fit=" $fit " 'NR == 1 || /^#/ || /^model,/ || index(fit, " " $1 " ") { print }' "$out/measurements.csv" >"$fitcsv"
fitpaths=()
for m in $fit; do fitpaths+=("$models/$m"); done
java -jar cli/target/erg.jar calibrate "${fitpaths[@]}" --device "$out/host-1thread.yaml" --measured "$fitcsv" \
  --out "$out/host-1thread.calibrated.yaml" >&2

latency() { # model profile -> whole-model latency in ms
  java -jar cli/target/erg.jar estimate "$1" --device "$2" --top 0 --json "$out/estimate.json" >/dev/null
  grep -m1 '"latencySeconds"' "$out/estimate.json" | sed 's/.*: *//; s/,$//' | awk '{ printf "%.4f", $1 * 1e3 }'
}

printf '| held-out model | measured ms | profile ms | calibrated ms |\n|---|---|---|---|\n'
rows=$(mktemp)
awk -F, '!/^#/ && $1 != "model" && $2 == "" { print $1, $3 }' "$out/measurements.csv" | while read -r m t; do
  case " $fit " in *" $m "*) continue ;; esac
  p=$models/$m
  b=$(latency "$p" "$out/host-1thread.yaml")
  a=$(latency "$p" "$out/host-1thread.calibrated.yaml")
  echo "$m $t $b $a" >>"$rows"
  awk -v m="$m" -v t="$t" -v b="$b" -v a="$a" 'BEGIN { printf "| %s | %.2f | %.2f (%+.0f%%) | %.2f (%+.0f%%) |\n", m, t, b, 100 * (b / t - 1), a, 100 * (a / t - 1) }'
done
awk '
  function abs(x) { return x < 0 ? -x : x }
  { n++; eb[n] = abs($3 / $2 - 1); ea[n] = abs($4 / $2 - 1) }
  function med(a, n,   i, j, t) { for (i = 1; i <= n; i++) for (j = i + 1; j <= n; j++) if (a[j] < a[i]) { t = a[i]; a[i] = a[j]; a[j] = t }
    return n % 2 ? a[(n + 1) / 2] : (a[n / 2] + a[n / 2 + 1]) / 2 }
  function worst(a, n,   i, w) { w = 0; for (i = 1; i <= n; i++) if (a[i] > w) w = a[i]; return w }
  END { if (n) printf "before calibration: median %.0f%%, worst %.0f%%; after: median %.0f%%, worst %.0f%% (%d held-out models)\n",
          100 * med(eb, n), 100 * worst(eb, n), 100 * med(ea, n), 100 * worst(ea, n), n }' "$rows"
rm -f "$rows" "$out/estimate.json"
