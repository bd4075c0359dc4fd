#!/usr/bin/env bash
# erg scale benchmark: does the cost of 'erg analyze' grow linearly with the node count?
#
#   bash bench/scale.sh             # from the repository root (or anywhere: it finds the root itself)
#   RUNS=9 bash bench/scale.sh      # more runs per measurement (default 5; the median is reported)
#   SIZES="10000 100000" bash bench/scale.sh   # other node counts (default 10000 50000 100000)
#   REBUILD=1 bash bench/scale.sh   # rebuild cli/target/erg.jar even when it looks current
#
# What it does (see docs/benchmark.md, "Scale"):
#   1. builds cli/target/erg.jar with Maven unless a jar newer than every source is already there;
#   2. writes synthetic transformer-like models of each node count with OnnxWriter
#      (bench/src/ScaleModels.java) into bench/scratch/, and a variant with one If per block;
#   3. times, as whole processes with JVM start, 'java -jar cli/target/erg.jar analyze' on each model
#      and on its If variant (analyze-if), and the analysis plus a device estimate
#      (bench/src/EstimateBench.java, preset generic-45nm), RUNS times each, interleaved; wall time
#      around each process, CPU time (user + sys) and peak RSS from GNU time;
#   4. prints the medians, the time per node, the least-squares line through (nodes, median wall) and
#      whether the largest model stays under the 2 s budget.
# The machine's load average is printed beside the numbers: other work on the 2 cores shows up in the
# wall times (the CPU times are steadier). Scratch files go to bench/scratch/ (gitignored).
set -euo pipefail

source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
runs=${RUNS:-5}
sizes=${SIZES:-"10000 50000 100000"}
budget_ms=${BUDGET_MS:-2000}


# ---- models ------------------------------------------------------------------------------------
if [ ! -f "$work/classes/ScaleModels.class" ] || [ ! -f "$work/classes/EstimateBench.class" ] \
   || [ bench/src/ScaleModels.java -nt "$work/classes/ScaleModels.class" ] \
   || [ bench/src/EstimateBench.java -nt "$work/classes/EstimateBench.class" ] || [ "$jar" -nt "$work/classes/ScaleModels.class" ]; then
  javac -d "$work/classes" -cp "$jar:$testjar" bench/src/ScaleModels.java bench/src/EstimateBench.java
fi
for variant in scale scale_if; do
  missing=""
  for n in $sizes; do
    f="$work/${variant}_$n.onnx"
    if [ ! -f "$f" ] || [ "$work/classes/ScaleModels.class" -nt "$f" ]; then missing+=" $n"; fi
  done
  if [ -n "$missing" ]; then
    say "writing the $variant models:$missing"
    java -cp "$jar:$testjar:$work/classes" ScaleModels "$work" $([ "$variant" = scale_if ] && echo --if) $missing >&2
  fi
done

# Every analysis must succeed, see every node and leave none unmodelled.
for variant in scale scale_if; do
  for n in $sizes; do
    java -jar "$jar" analyze "$work/${variant}_$n.onnx" --dim batch=1 --fail-on-unmodelled --json "$work/${variant}_$n.json" >/dev/null
    got=$(sed -n 's/^    "nodes": \([0-9]*\),$/\1/p' "$work/${variant}_$n.json")
    [ "$got" = "$n" ] || { say "${variant}_$n.onnx: erg saw $got nodes, not $n"; exit 1; }
  done
done

# ---- measurement -------------------------------------------------------------------------------
declare -A wall cpu rss
# measure KEY CMD...: one run; appends wall ms to wall[KEY], user + sys ms to cpu[KEY], peak RSS KiB to rss[KEY].
measure() {
  local key=$1; shift
  local tf="$work/time.txt" t0 t1
  t0=$(date +%s%N)
  if [ "$have_time" = 1 ]; then
    /usr/bin/time -f '%U %S %M' -o "$tf" "$@" >/dev/null
  else
    "$@" >/dev/null
  fi
  t1=$(date +%s%N)
  wall[$key]+="$(( (t1 - t0) / 1000000 )) "
  if [ "$have_time" = 1 ]; then
    read -r u s m < <(tail -n 1 "$tf")
    cpu[$key]+="$(awk -v u="$u" -v s="$s" 'BEGIN { printf "%d", (u + s) * 1000 }') "
    rss[$key]+="$m "
  fi
  return 0
}
median() { tr ' ' '\n' <<<"$1" | grep -v '^$' | sort -n | awk '{a[NR]=$1} END {print a[int((NR+1)/2)]}'; }

say "warm-up"
for n in $sizes; do java -jar "$jar" analyze "$work/scale_$n.onnx" --dim batch=1 >/dev/null; done
load_before=$(cut -d' ' -f1-3 /proc/loadavg)
say "timing: $runs rounds over $(wc -w <<<"$sizes") sizes: analyze, analyze of the If variant, estimate"
for ((i = 0; i < runs; i++)); do
  for n in $sizes; do
    measure "analyze_$n" java -jar "$jar" analyze "$work/scale_$n.onnx" --dim batch=1
    measure "analyze-if_$n" java -jar "$jar" analyze "$work/scale_if_$n.onnx" --dim batch=1
    measure "estimate_$n" java -cp "$jar:$testjar:$work/classes" EstimateBench "$work/scale_$n.onnx"
  done
done
load_after=$(cut -d' ' -f1-3 /proc/loadavg)

# ---- report ------------------------------------------------------------------------------------
sec() { awk -v m="$1" 'BEGIN { printf "%.3f", m / 1000 }'; }
mib() { awk -v k="$1" 'BEGIN { printf "%.0f", k / 1024 }'; }
{
  echo "erg scale benchmark: $(date -u +%Y-%m-%dT%H:%MZ), $(nproc) cores, $(java -version 2>&1 | head -1)"
  echo "median of $runs runs, whole process with JVM start; load average before: $load_before, after: $load_after"
  echo
  printf '%-10s %-9s %10s %12s %10s %9s\n' "command" "nodes" "wall" "us/node" "CPU" "peak RSS"
  for what in analyze analyze-if estimate; do
    for n in $sizes; do
      k="${what}_$n"
      w=$(median "${wall[$k]}")
      line=$(printf '%-10s %-9s %8s s %12s' "$what" "$n" "$(sec "$w")" "$(awk -v w="$w" -v n="$n" 'BEGIN { printf "%.1f", w * 1000 / n }')")
      if [ "$have_time" = 1 ]; then
        line+=$(printf ' %8s s %5s MiB' "$(sec "$(median "${cpu[$k]}")")" "$(mib "$(median "${rss[$k]}")")")
      fi
      echo "$line"
    done
  done
  echo
  for what in analyze analyze-if estimate; do
    pts=""
    for n in $sizes; do pts+="$n $(median "${wall["${what}_$n"]}") "; done
    awk -v what="$what" -v pts="$pts" 'BEGIN {
      k = split(pts, a, " "); m = k / 2
      if (m < 2) { printf "%s: one size only, no line to fit (give SIZES at least two node counts)\n", what; exit }
      for (i = 1; i <= m; i++) { x = a[2*i-1]; y = a[2*i]; sx += x; sy += y; sxx += x*x; sxy += x*y }
      b = (m * sxy - sx * sy) / (m * sxx - sx * sx); c = (sy - b * sx) / m
      for (i = 1; i <= m; i++) { x = a[2*i-1]; y = a[2*i]; f = c + b * x; r = (y - f); ss += r*r; st += (y - sy/m)^2 }
      printf "%s: wall = %.0f ms + %.2f us x nodes (least squares over %d sizes, R^2 = %.3f)\n", what, c, b * 1000, m, (st > 0 ? 1 - ss/st : 1)
    }'
  done
  largest=$(tr ' ' '\n' <<<"$sizes" | grep -v '^$' | sort -n | tail -1)
  lw=$(median "${wall["analyze_$largest"]}")
  if [ "$lw" -lt "$budget_ms" ]; then
    echo "analyze on $largest nodes: $(sec "$lw") s, under the $(sec "$budget_ms") s budget"
  else
    echo "analyze on $largest nodes: $(sec "$lw") s, OVER the $(sec "$budget_ms") s budget (check the load average above)"
  fi
} | tee "$work/scale-results.txt"
