#!/usr/bin/env bash
# erg scale benchmark: large graphs, against ONNX's own shape inference timed in the same run.
#
#   bash bench/scale.sh             # from the repository root (or anywhere: it finds the root itself)
#   RUNS=9 bash bench/scale.sh      # more rounds (default 5; the median is reported)
#   SIZES="10000 100000" bash bench/scale.sh   # other node counts (default 10000 50000 100000)
#   REBUILD=1 bash bench/scale.sh   # rebuild the jar and the distribution even when they look current
#   PEER=0 bash bench/scale.sh      # leave out the python onnx peer
#
# What it does (see docs/benchmark.md, "Scale"):
#   1. builds cli/target/erg.jar and the distribution dist/target/erg-VERSION/ unless they are current;
#   2. writes three synthetic models of each node count with OnnxWriter (bench/src/ScaleModels.java)
#      into bench/scratch/: transformer-like encoder blocks with Shape -> Gather -> Concat -> Reshape
#      chains (scale_N), the same with one If per block (scale_if_N), and a plain MatMul/Add/Relu chain
#      (chain_N);
#   3. checks that erg analyses each completely and sees N nodes, and that the peer shapes them;
#   4. times RUNS rounds, interleaved, of, per size, as whole processes with JVM start:
#        bin/erg analyze on each model (--dim batch=1)
#        bin/erg estimate scale_N --device preset:generic-45nm
#        java -jar cli/target/erg.jar analyze scale_N (no launcher)
#        the peer: python onnx load + infer_shapes with data propagation, on scale_N and chain_N
#        the skim floor on scale_N (bench/src/Skim.java)
#      wall time around each process, CPU time (user + sys) and peak RSS from GNU time;
#   5. prints the medians, the ratios per size (analyze / peer: goal 1.0 or less; estimate / analyze:
#      goal 1.3 or less) and the least-squares line through (nodes, median wall) per command.
# The load average is printed beside the numbers: other work on the machine shows in wall times.
set -euo pipefail

source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
runs=${RUNS:-5}
sizes=${SIZES:-"10000 50000 100000"}
preset=generic-45nm

# ---- models ------------------------------------------------------------------------------------
classes="$work/classes"
if [ ! -f "$classes/ScaleModels.class" ] || [ ! -f "$classes/Skim.class" ] \
   || [ bench/src/ScaleModels.java -nt "$classes/ScaleModels.class" ] || [ bench/src/Skim.java -nt "$classes/Skim.class" ] \
   || [ "$jar" -nt "$classes/ScaleModels.class" ]; then
  javac -d "$classes" -cp "$jar:$testjar" bench/src/ScaleModels.java bench/src/Skim.java
fi
variants="scale scale_if chain"
for variant in $variants; do
  missing=""
  for n in $sizes; do
    f="$work/${variant}_$n.onnx"
    if [ ! -f "$f" ] || [ "$classes/ScaleModels.class" -nt "$f" ]; then missing+=" $n"; fi
  done
  if [ -n "$missing" ]; then
    say "writing the $variant models:$missing"
    flag=""; [ "$variant" = scale_if ] && flag=--if; [ "$variant" = chain ] && flag=--chain
    java -cp "$jar:$testjar:$classes" ScaleModels "$work" $flag $missing >&2
  fi
done

# Every analysis must succeed, see every node and leave none unmodelled; the peer must shape them.
for variant in $variants; do
  for n in $sizes; do
    "$erg" analyze "$work/${variant}_$n.onnx" --dim batch=1 --fail-on-unmodelled --json "$work/${variant}_$n.json" >/dev/null
    got=$(sed -n 's/^    "nodes": \([0-9]*\),$/\1/p' "$work/${variant}_$n.json")
    [ "$got" = "$n" ] || { say "${variant}_$n.onnx: erg saw $got nodes, not $n"; exit 1; }
  done
done
largest=$(tr ' ' '\n' <<<"$sizes" | grep -v '^$' | sort -n | tail -1)
peer_says=""
if [ "$have_py" = 1 ]; then
  for variant in scale chain; do
    said=$("$py" bench/src/onnx_peer.py "$work/${variant}_$largest.onnx" --data-prop)
    peer_says+="peer on ${variant}_$largest.onnx: $said"$'\n'
    case $said in *"no shape"*) say "the peer did not shape ${variant}_$largest.onnx: $said" ;; esac
  done
fi

# ---- measurement -------------------------------------------------------------------------------
say "warm-up"
for n in $sizes; do "$erg" analyze "$work/scale_$n.onnx" --dim batch=1 >/dev/null; done
load_before=$(cut -d' ' -f1-3 /proc/loadavg)
say "timing: $runs rounds over $(wc -w <<<"$sizes") sizes"
for ((i = 0; i < runs; i++)); do
  for n in $sizes; do
    measure "analyze_$n" "$erg" analyze "$work/scale_$n.onnx" --dim batch=1
    [ "$have_py" = 1 ] && measure "peer_$n" "$py" bench/src/onnx_peer.py "$work/scale_$n.onnx" --data-prop
    measure "estimate_$n" "$erg" estimate "$work/scale_$n.onnx" --dim batch=1 --device "preset:$preset"
    measure "analyze-if_$n" "$erg" analyze "$work/scale_if_$n.onnx" --dim batch=1
    measure "analyze-chain_$n" "$erg" analyze "$work/chain_$n.onnx" --dim batch=1
    [ "$have_py" = 1 ] && measure "peer-chain_$n" "$py" bench/src/onnx_peer.py "$work/chain_$n.onnx" --data-prop
    measure "jar-analyze_$n" java -jar "$jar" analyze "$work/scale_$n.onnx" --dim batch=1
    measure "skim_$n" java -cp "$protobuf:$classes" Skim "$work/scale_$n.onnx"
  done
done
load_after=$(cut -d' ' -f1-3 /proc/loadavg)

# ---- report ------------------------------------------------------------------------------------
commands="analyze estimate analyze-if analyze-chain jar-analyze skim"
[ "$have_py" = 1 ] && commands="analyze peer estimate analyze-if analyze-chain peer-chain jar-analyze skim"
label() {
  case $1 in
    analyze) echo "bin/erg analyze scale" ;;
    peer) echo "peer: python onnx, scale" ;;
    estimate) echo "bin/erg estimate scale" ;;
    analyze-if) echo "bin/erg analyze scale_if" ;;
    analyze-chain) echo "bin/erg analyze chain" ;;
    peer-chain) echo "peer: python onnx, chain" ;;
    jar-analyze) echo "java -jar erg.jar analyze scale" ;;
    skim) echo "skim floor, scale" ;;
  esac
}
m() { median "${wall[$1]}"; }
{
  echo "erg scale benchmark: $(date -u +%Y-%m-%dT%H:%MZ)"
  machine
  printf '%s' "$peer_says"
  echo "median of $runs rounds, whole processes with JVM start; load average before: $load_before, after: $load_after"
  echo
  printf '%-32s %-8s %9s %9s %9s %9s\n' "command" "nodes" "wall" "us/node" "CPU" "peak RSS"
  for what in $commands; do
    for n in $sizes; do
      k="${what}_$n"
      w=$(m "$k")
      line=$(printf '%-32s %-8s %7s s %9s' "$(label "$what")" "$n" "$(sec "$w")" "$(awk -v w="$w" -v n="$n" 'BEGIN { printf "%.1f", w * 1000 / n }')")
      if [ "$have_time" = 1 ]; then
        line+=$(printf ' %7s s %5s MiB' "$(sec "$(median "${cpu[$k]}")")" "$(mib "$(median "${rss[$k]}")")")
      fi
      echo "$line"
    done
  done
  echo
  echo "ratios (wall, medians of the same run):"
  for n in $sizes; do
    line="  $n nodes:"
    [ "$have_py" = 1 ] && line+=" analyze/peer $(ratio "$(m "analyze_$n")" "$(m "peer_$n")"), chain analyze/peer $(ratio "$(m "analyze-chain_$n")" "$(m "peer-chain_$n")"),"
    line+=" estimate/analyze $(ratio "$(m "estimate_$n")" "$(m "analyze_$n")"), analyze/skim $(ratio "$(m "analyze_$n")" "$(m "skim_$n")"), bin/erg/erg.jar $(ratio "$(m "analyze_$n")" "$(m "jar-analyze_$n")")"
    echo "$line"
  done
  if [ "$have_py" = 1 ]; then
    r=$(ratio "$(m "analyze_$largest")" "$(m "peer_$largest")")
    echo "analyze / peer at $largest nodes: $r ($(awk -v r="$r" 'BEGIN { print (r <= 1.0 ? "within" : "OVER") }') the goal of 1.0)"
  fi
  r=$(ratio "$(m "estimate_$largest")" "$(m "analyze_$largest")")
  echo "estimate / analyze at $largest nodes: $r ($(awk -v r="$r" 'BEGIN { print (r <= 1.3 ? "within" : "OVER") }') the goal of 1.3)"
  echo
  for what in $commands; do
    pts=""
    for n in $sizes; do pts+="$n $(m "${what}_$n") "; done
    awk -v what="$(label "$what")" -v pts="$pts" 'BEGIN {
      k = split(pts, a, " "); m = k / 2
      if (m < 2) { printf "%s: one size only, no line to fit\n", what; exit }
      for (i = 1; i <= m; i++) { x = a[2*i-1]; y = a[2*i]; sx += x; sy += y; sxx += x*x; sxy += x*y }
      b = (m * sxy - sx * sy) / (m * sxx - sx * sx); c = (sy - b * sx) / m
      for (i = 1; i <= m; i++) { x = a[2*i-1]; y = a[2*i]; f = c + b * x; r = (y - f); ss += r*r; st += (y - sy/m)^2 }
      printf "%-32s wall = %4.0f ms + %5.2f us x nodes (R^2 %.3f)\n", what, c, b * 1000, (st > 0 ? 1 - ss/st : 1)
    }'
  done
} | tee "$work/scale-results.txt"
