#!/usr/bin/env bash
# erg benchmark: does the cost of 'erg analyze' grow with the weight bytes of a model?
#
#   bash bench/run.sh            # from the repository root (or anywhere: it finds the root itself)
#   RUNS=9 bash bench/run.sh     # more runs per measurement (default 5; the median is reported)
#   REBUILD=1 bash bench/run.sh  # rebuild cli/target/erg.jar even when it looks current
#
# What it does (see docs/benchmark.md):
#   1. builds cli/target/erg.jar with Maven unless a jar newer than every source is already there;
#   2. writes two models of one structure with OnnxWriter into bench/scratch/: big.onnx (512 MiB of
#      embedded fp32 weights) and small.onnx (the same graph with small layers);
#   3. times, as whole processes with JVM start: 'java -jar cli/target/erg.jar analyze' on each model
#      and a plain Java program that reads every byte of big.onnx (bench/src/PlainRead.java), each
#      RUNS times, interleaved, with the files in the page cache (warm) and with them evicted before
#      every run (cold); peak RSS comes from GNU time;
#   4. prints the medians and the ratios erg(big)/erg(small) and erg(big)/plain-read(big).
# bench/ is not a Maven module: 'mvn test' never runs it. Scratch files go to bench/scratch/ (gitignored).
set -euo pipefail

source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
runs=${RUNS:-5}


# ---- models and the reference reader -----------------------------------------------------------
if [ ! -f "$work/classes/PlainRead.class" ] || [ ! -f "$work/classes/BenchModels.class" ] \
   || [ bench/src/PlainRead.java -nt "$work/classes/PlainRead.class" ] \
   || [ bench/src/BenchModels.java -nt "$work/classes/BenchModels.class" ] || [ "$jar" -nt "$work/classes/BenchModels.class" ]; then
  javac -d "$work/classes" -cp "$jar:$testjar" bench/src/BenchModels.java bench/src/PlainRead.java
fi
if [ ! -f "$work/big.onnx" ] || [ ! -f "$work/small.onnx" ] || [ "$work/classes/BenchModels.class" -nt "$work/big.onnx" ]; then
  say "writing the models"
  java -cp "$jar:$testjar:$work/classes" BenchModels "$work" >&2
fi
big="$work/big.onnx"
small="$work/small.onnx"
big_bytes=$(stat -c %s "$big")
small_bytes=$(stat -c %s "$small")

# Both analyses must succeed and see the same graph.
java -jar "$jar" analyze "$big" --json "$work/big.json" >/dev/null
java -jar "$jar" analyze "$small" --json "$work/small.json" >/dev/null
nodes_of() { sed -n 's/^    "nodes": \([0-9]*\),$/\1/p' "$1"; }
weights_of() { sed -n 's/^    "weightBytes": \([0-9]*\),$/\1/p' "$1" | head -1; }
[ "$(nodes_of "$work/big.json")" = "$(nodes_of "$work/small.json")" ] || { say "the two models differ in structure"; exit 1; }

# ---- measurement -------------------------------------------------------------------------------
# evict FILE...: drops the files' pages from the page cache (posix_fadvise DONTNEED through GNU dd).
evict() { for f in "$@"; do dd if="$f" iflag=nocache count=0 status=none; done; }
can_evict=0
if command -v fincore >/dev/null 2>&1; then
  evict "$big"
  [ "$(fincore -n -b -o RES "$big" | tr -d ' ')" -lt $((big_bytes / 2)) ] && can_evict=1
else
  evict "$big" 2>/dev/null && can_evict=1
fi

declare -A samples rss
# measure KEY CMD...: one run; appends wall milliseconds to samples[KEY] and peak RSS KiB to rss[KEY].
measure() {
  local key=$1; shift
  local rf="$work/rss.txt" t0 t1
  t0=$(date +%s%N)
  if [ "$have_time" = 1 ]; then
    /usr/bin/time -f %M -o "$rf" "$@" >/dev/null
  else
    "$@" >/dev/null
  fi
  t1=$(date +%s%N)
  samples[$key]+="$(( (t1 - t0) / 1000000 )) "
  [ "$have_time" = 1 ] && rss[$key]+="$(tail -n 1 "$rf") "
  return 0
}
median() { tr ' ' '\n' <<<"$1" | grep -v '^$' | sort -n | awk '{a[NR]=$1} END {print a[int((NR+1)/2)]}'; }

erg_big=(java -jar "$jar" analyze "$big")
erg_small=(java -jar "$jar" analyze "$small")
read_big=(java -cp "$work/classes" PlainRead "$big")

say "warm-up"
"${erg_big[@]}" >/dev/null; "${erg_small[@]}" >/dev/null; "${read_big[@]}" >/dev/null
# Rounds interleave every measurement, warm and cold, so that a slow spell of the machine touches
# all of them alike and the ratios stay fair.
say "timing: $runs rounds of 3 warm$([ "$can_evict" = 1 ] && echo " and 3 cold") runs"
for ((i = 0; i < runs; i++)); do
  cat "$big" "$small" >/dev/null # warm: both files in the page cache
  measure warm_erg_big "${erg_big[@]}"
  measure warm_erg_small "${erg_small[@]}"
  measure warm_read_big "${read_big[@]}"
  if [ "$can_evict" = 1 ]; then # cold: the files' pages dropped before every run
    evict "$big" "$small"; measure cold_erg_big "${erg_big[@]}"
    evict "$big" "$small"; measure cold_erg_small "${erg_small[@]}"
    evict "$big" "$small"; measure cold_read_big "${read_big[@]}"
  fi
done
resident=""
if [ "$can_evict" = 1 ] && command -v fincore >/dev/null 2>&1; then
  evict "$big"; "${erg_big[@]}" >/dev/null
  resident=$(fincore -n -b -o RES "$big" | tr -d ' ')
fi
load=$(cut -d' ' -f1-3 /proc/loadavg)

# ---- report ------------------------------------------------------------------------------------
ms() { awk -v m="$1" 'BEGIN { printf "%.3f", m / 1000 }'; }
mib() { awk -v k="$1" 'BEGIN { printf "%.0f", k / 1024 }'; }
ratio() { awk -v a="$1" -v b="$2" 'BEGIN { printf "%.2f", a / b }'; }
row() { # row LABEL KEY
  local label=$1 key=$2 line
  line=$(printf '%-26s' "$label")
  for s in warm cold; do
    local k="${s}_$key"
    if [ -n "${samples[$k]:-}" ]; then
      line+=$(printf '  %8s s' "$(ms "$(median "${samples[$k]}")")")
      if [ "$have_time" = 1 ]; then line+=$(printf '  %6s MiB' "$(mib "$(median "${rss[$k]}")")"); fi
    fi
  done
  printf '%s\n' "$line"
}

{
  echo "erg benchmark: $(date -u +%Y-%m-%dT%H:%MZ), $(nproc) cores, $(java -version 2>&1 | head -1)"
  echo "big.onnx   $big_bytes bytes, $(weights_of "$work/big.json") bytes of weights"
  echo "small.onnx $small_bytes bytes, $(weights_of "$work/small.json") bytes of weights, same $(nodes_of "$work/big.json") nodes"
  echo "median of $runs runs, whole process with JVM start (wall time; peak RSS from GNU time); load average after: $load"
  echo
  header=$(printf '%-26s' "")
  header+=$(printf '  %10s' "warm wall"); [ "$have_time" = 1 ] && header+=$(printf '  %10s' "warm RSS")
  if [ "$can_evict" = 1 ]; then
    header+=$(printf '  %10s' "cold wall"); [ "$have_time" = 1 ] && header+=$(printf '  %10s' "cold RSS")
  fi
  echo "$header"
  row "erg analyze big.onnx" erg_big
  row "erg analyze small.onnx" erg_small
  row "plain read of big.onnx" read_big
  echo
  for s in warm cold; do
    [ -n "${samples[${s}_erg_big]:-}" ] || continue
    eb=$(median "${samples[${s}_erg_big]}"); es=$(median "${samples[${s}_erg_small]}"); rb=$(median "${samples[${s}_read_big]}")
    echo "$s: erg(big)/erg(small) = $(ratio "$eb" "$es")   erg(big)/plain-read(big) = $(ratio "$eb" "$rb")"
  done
  if [ -n "$resident" ]; then
    echo "bytes of big.onnx in the page cache after one erg run from cold: $resident of $big_bytes"
  fi
  [ "$can_evict" = 1 ] || echo "(cold runs left out: the page cache could not be dropped for the file here)"
} | tee "$work/results.txt"
