#!/usr/bin/env bash
# What each of the launcher's JVM settings is worth: erg analyze on big.onnx (start-up) and on the
# 100,000-node transformer-like model, with the launcher's full set and with one setting left out or
# changed at a time, interleaved, as whole processes. Run bench/run.sh and bench/scale.sh first (they
# write the models).
#
#   bash bench/flags.sh           # 5 rounds (RUNS=9 for more)
set -euo pipefail

source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
runs=${RUNS:-5}
big="$work/big.onnx"
large="$work/scale_100000.onnx"
[ -f "$big" ] && [ -f "$large" ] || { say "run bench/run.sh and bench/scale.sh first: they write $big and $large"; exit 1; }

lib="$root/$dist/lib"
cp=$(sed -n 's/^cp=//p' "$dist/bin/erg" | sed "s#\$lib#$lib#g")
jsa=$lib/erg.jsa
[ -f "$jsa" ] || { say "no $jsa: run $erg once"; exit 1; }
cds="-XX:SharedArchiveFile=$jsa -Xshare:auto"
c1="-XX:TieredStopAtLevel=1"
gc="-XX:+UseParallelGC"
perf="-XX:-UsePerfData"
declare -A variant=(
  [launcher]="$cds $c1 $gc $perf"
  [no-archive]="$c1 $gc $perf"
  [no-c1-only]="$cds $gc $perf"
  [serial-gc]="$cds $c1 -XX:+UseSerialGC $perf"
  [g1-gc]="$cds $c1 $perf"
  [perf-data]="$cds $c1 $gc"
  [plain-java]=""
)
order="launcher no-archive no-c1-only serial-gc g1-gc perf-data plain-java"

say "timing: $runs rounds of $(wc -w <<<"$order") settings on 2 models"
load_before=$(cut -d' ' -f1-3 /proc/loadavg)
for ((i = 0; i < runs; i++)); do
  for v in $order; do
    # shellcheck disable=SC2086 # the settings are lists of options
    measure "big_$v" java ${variant[$v]} -cp "$cp" dev.erg.cli.Main analyze "$big"
    # shellcheck disable=SC2086
    measure "large_$v" java ${variant[$v]} -cp "$cp" dev.erg.cli.Main analyze "$large" --dim batch=1
  done
done
load_after=$(cut -d' ' -f1-3 /proc/loadavg)
{
  echo "erg JVM settings: $(date -u +%Y-%m-%dT%H:%MZ)"
  machine
  echo "median of $runs rounds; load average before: $load_before, after: $load_after"
  echo "launcher = $c1 $gc $perf + class-data archive"
  echo
  printf '%-12s %11s %9s %9s   %11s %9s %9s\n' "settings" "big wall" "CPU" "RSS" "100k wall" "CPU" "RSS"
  for v in $order; do
    printf '%-12s %9s s %7s s %5s MiB   %9s s %7s s %5s MiB\n' "$v" \
      "$(sec "$(median "${wall[big_$v]}")")" "$(sec "$(median "${cpu[big_$v]:-0}")")" "$(mib "$(median "${rss[big_$v]:-0}")")" \
      "$(sec "$(median "${wall[large_$v]}")")" "$(sec "$(median "${cpu[large_$v]:-0}")")" "$(mib "$(median "${rss[large_$v]:-0}")")"
  done
} | tee "$work/flags-results.txt"
