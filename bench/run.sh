#!/usr/bin/env bash
# erg start-up benchmark: how close does 'erg analyze' on a model with 537 MB of embedded weights come
# to a bare JVM that only skims the file, and does its cost grow with the weight bytes?
#
#   bash bench/run.sh            # from the repository root (or anywhere: it finds the root itself)
#   RUNS=9 bash bench/run.sh     # more rounds (default 5; the median is reported)
#   REBUILD=1 bash bench/run.sh  # rebuild the jar and the distribution even when they look current
#   PEER=0 bash bench/run.sh     # leave out the python onnx peer (about 4 s a run)
#
# What it does (see docs/benchmark.md):
#   1. builds cli/target/erg.jar and the distribution dist/target/erg-VERSION/ with Maven unless they
#      are newer than every source, and runs bin/erg once so that it makes its class-data archive;
#   2. writes two models of one structure with OnnxWriter into bench/scratch/: big.onnx (512 MiB of
#      embedded fp32 weights) and small.onnx (the same graph with small layers);
#   3. times, as whole processes with JVM start, RUNS rounds of, interleaved:
#        erg analyze big.onnx, through the launcher bin/erg (class-data archive, short-lived-JVM flags)
#        erg analyze small.onnx, the same
#        java -jar cli/target/erg.jar analyze big.onnx (no launcher)
#        the skim floor: a bare JVM that walks big.onnx's protobuf fields with seeks (bench/src/Skim.java)
#        a plain read of every byte of big.onnx (bench/src/PlainRead.java)
#        the peer: python onnx load + infer_shapes on big.onnx (bench/src/onnx_peer.py)
#      with the files in the page cache (warm), then erg, the skim and the read again with the files'
#      pages dropped before every run (cold);
#   4. prints the medians and the ratios, against the skim floor above all (goal: 2.5 or less).
# bench/ is not a Maven module: 'mvn test' never runs it. Scratch files go to bench/scratch/ (gitignored).
set -euo pipefail

source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
runs=${RUNS:-5}
goal=${GOAL:-2.5}

# ---- models and the reference readers ----------------------------------------------------------
classes="$work/classes"
if [ ! -f "$classes/BenchModels.class" ] || [ ! -f "$classes/Skim.class" ] || [ ! -f "$classes/PlainRead.class" ] \
   || [ bench/src/BenchModels.java -nt "$classes/BenchModels.class" ] || [ bench/src/Skim.java -nt "$classes/Skim.class" ] \
   || [ bench/src/PlainRead.java -nt "$classes/PlainRead.class" ] || [ "$jar" -nt "$classes/BenchModels.class" ]; then
  javac -d "$classes" -cp "$jar:$testjar" bench/src/BenchModels.java bench/src/PlainRead.java bench/src/Skim.java
fi
if [ ! -f "$work/big.onnx" ] || [ ! -f "$work/small.onnx" ] || [ "$classes/BenchModels.class" -nt "$work/big.onnx" ]; then
  say "writing the models"
  java -cp "$jar:$testjar:$classes" BenchModels "$work" >&2
fi
big="$work/big.onnx"
small="$work/small.onnx"
big_bytes=$(stat -c %s "$big")
small_bytes=$(stat -c %s "$small")

# Both analyses must succeed and see the same graph; the launcher must print what the jar prints.
"$erg" analyze "$big" --json "$work/big.json" >/dev/null
"$erg" analyze "$small" --json "$work/small.json" >/dev/null
nodes_of() { sed -n 's/^    "nodes": \([0-9]*\),$/\1/p' "$1"; }
weights_of() { sed -n 's/^    "weightBytes": \([0-9]*\),$/\1/p' "$1" | head -1; }
[ "$(nodes_of "$work/big.json")" = "$(nodes_of "$work/small.json")" ] || { say "the two models differ in structure"; exit 1; }
cmp -s <("$erg" analyze "$big") <(java -jar "$jar" analyze "$big") || { say "bin/erg and erg.jar print different results"; exit 1; }
skim_says=$(java -cp "$protobuf:$classes" Skim "$big")
peer_says=""
[ "$have_py" = 1 ] && peer_says=$("$py" bench/src/onnx_peer.py "$big")

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

erg_big=("$erg" analyze "$big")
erg_small=("$erg" analyze "$small")
jar_big=(java -jar "$jar" analyze "$big")
skim_big=(java -cp "$protobuf:$classes" Skim "$big")
read_big=(java -cp "$classes" PlainRead "$big")
peer_big=("$py" bench/src/onnx_peer.py "$big")

say "warm-up"
for c in erg_big erg_small jar_big skim_big read_big; do declare -n cmd=$c; "${cmd[@]}" >/dev/null; done
# Rounds interleave every measurement, warm and cold, so that a slow spell of the machine touches
# all of them alike and the ratios stay fair.
say "timing: $runs rounds of 5$([ "$have_py" = 1 ] && echo " + 1 peer") warm$([ "$can_evict" = 1 ] && echo " and 3 cold") runs"
load_before=$(cut -d' ' -f1-3 /proc/loadavg)
for ((i = 0; i < runs; i++)); do
  cat "$big" "$small" >/dev/null # warm: both files in the page cache
  measure warm_erg_big "${erg_big[@]}"
  measure warm_skim_big "${skim_big[@]}"
  measure warm_erg_small "${erg_small[@]}"
  measure warm_jar_big "${jar_big[@]}"
  measure warm_read_big "${read_big[@]}"
  if [ "$have_py" = 1 ]; then measure warm_peer_big "${peer_big[@]}"; fi
  if [ "$can_evict" = 1 ]; then # cold: the files' pages dropped before every run
    evict "$big" "$small"; measure cold_erg_big "${erg_big[@]}"
    evict "$big" "$small"; measure cold_skim_big "${skim_big[@]}"
    evict "$big" "$small"; measure cold_read_big "${read_big[@]}"
  fi
done
load_after=$(cut -d' ' -f1-3 /proc/loadavg)
resident=""
if [ "$can_evict" = 1 ] && command -v fincore >/dev/null 2>&1; then
  evict "$big"; "${erg_big[@]}" >/dev/null
  resident=$(fincore -n -b -o RES "$big" | tr -d ' ')
fi

# ---- report ------------------------------------------------------------------------------------
row() { # row LABEL KEY
  local label=$1 key=$2 line
  line=$(printf '%-44s' "$label")
  for s in warm cold; do
    local k="${s}_$key"
    if [ -n "${wall[$k]:-}" ]; then
      line+=$(printf '  %8s s' "$(sec "$(median "${wall[$k]}")")")
      if [ "$have_time" = 1 ]; then line+=$(printf '  %6s s  %5s MiB' "$(sec "$(median "${cpu[$k]}")")" "$(mib "$(median "${rss[$k]}")")"); fi
    elif [ "$s" = cold ] && [ "$can_evict" = 1 ]; then
      line+="           -"
    fi
  done
  printf '%s\n' "$line"
}
m() { median "${wall[$1]}"; }

{
  echo "erg start-up benchmark: $(date -u +%Y-%m-%dT%H:%MZ)"
  machine
  echo "big.onnx   $big_bytes bytes, $(weights_of "$work/big.json") bytes of weights"
  echo "small.onnx $small_bytes bytes, $(weights_of "$work/small.json") bytes of weights, same $(nodes_of "$work/big.json") nodes"
  echo "skim of big.onnx: $skim_says"
  [ -n "$peer_says" ] && echo "peer on big.onnx: $peer_says"
  echo "median of $runs rounds, whole processes with JVM start; load average before: $load_before, after: $load_after"
  echo
  header=$(printf '%-44s  %10s' "" "warm wall"); [ "$have_time" = 1 ] && header+=$(printf '  %8s  %9s' "CPU" "peak RSS")
  if [ "$can_evict" = 1 ]; then
    header+=$(printf '  %10s' "cold wall"); [ "$have_time" = 1 ] && header+=$(printf '  %8s  %9s' "CPU" "peak RSS")
  fi
  echo "$header"
  row "bin/erg analyze big.onnx" erg_big
  row "bin/erg analyze small.onnx" erg_small
  row "java -jar erg.jar analyze big.onnx" jar_big
  row "skim floor: bare JVM walks big.onnx" skim_big
  row "plain read of big.onnx" read_big
  [ "$have_py" = 1 ] && row "peer: python onnx load + infer_shapes" peer_big
  echo
  r=$(ratio "$(m warm_erg_big)" "$(m warm_skim_big)")
  verdict=$(awk -v r="$r" -v g="$goal" 'BEGIN { print (r <= g ? "within" : "OVER") }')
  echo "warm: bin/erg(big) / skim(big) = $r  ($verdict the goal of $goal)"
  echo "warm: erg.jar(big) / skim(big) = $(ratio "$(m warm_jar_big)" "$(m warm_skim_big)")   bin/erg(big) / erg.jar(big) = $(ratio "$(m warm_erg_big)" "$(m warm_jar_big)")"
  echo "warm: bin/erg(big) / bin/erg(small) = $(ratio "$(m warm_erg_big)" "$(m warm_erg_small)")   bin/erg(big) / plain-read(big) = $(ratio "$(m warm_erg_big)" "$(m warm_read_big)")"
  [ "$have_py" = 1 ] && echo "warm: peer(big) / bin/erg(big) = $(ratio "$(m warm_peer_big)" "$(m warm_erg_big)")"
  if [ "$can_evict" = 1 ]; then
    echo "cold: bin/erg(big) / skim(big) = $(ratio "$(m cold_erg_big)" "$(m cold_skim_big)")   bin/erg(big) / plain-read(big) = $(ratio "$(m cold_erg_big)" "$(m cold_read_big)")"
  fi
  if [ -n "$resident" ]; then
    echo "bytes of big.onnx in the page cache after one erg run from cold: $resident of $big_bytes"
  fi
  [ "$can_evict" = 1 ] || echo "(cold runs left out: the page cache could not be dropped for the file here)"
} | tee "$work/results.txt"
