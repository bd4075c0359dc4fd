# Shared by the benchmark scripts (sourced, not run): the repository root, the scratch folder, the CLI
# jar and the unpacked distribution rebuilt when stale, GNU time for CPU time and peak RSS, the python
# onnx peer, and the timing helpers.
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$root"
work=bench/scratch
jar=cli/target/erg.jar
mkdir -p "$work/classes"

say() { printf '%s\n' "$*" >&2; }

# ---- tools -------------------------------------------------------------------------------------
# apt_install PACKAGE...: Debian packages, waiting for a dpkg lock that another install holds.
apt_install() {
  command -v apt-get >/dev/null 2>&1 || return 1
  apt-get install -y -qq -o DPkg::Lock::Timeout=300 "$@" >/dev/null 2>&1 \
    || { apt-get update -qq >/dev/null 2>&1 && apt-get install -y -qq -o DPkg::Lock::Timeout=300 "$@" >/dev/null 2>&1; }
}
if [ ! -x /usr/bin/time ]; then
  say "installing GNU time (Debian package 'time') for CPU time and peak RSS"
  apt_install time || say "could not install GNU time: CPU time and peak RSS will be left out"
fi
have_time=0; [ -x /usr/bin/time ] && have_time=1

# The peer: ONNX's own shape inference from Debian's python3-onnx, run by Debian's python (a python3
# earlier on the PATH, e.g. from pyenv, does not see Debian's packages). PEER=0 leaves it out.
py=/usr/bin/python3
have_py=0
if [ "${PEER:-1}" != 0 ]; then
  if ! "$py" -c 'import onnx' >/dev/null 2>&1; then
    say "installing Debian's python3-onnx for the peer (ONNX shape inference)"
    apt_install python3-onnx || say "could not install python3-onnx: the python peer will be left out"
  fi
  "$py" -c 'import onnx' >/dev/null 2>&1 && have_py=1
fi

# ---- build -------------------------------------------------------------------------------------
# The CLI jar (java -jar) and the unpacked distribution (bin/erg, lib/), both from one Maven run.
dist=$(ls -d dist/target/erg-*/ 2>/dev/null | head -1)
dist=${dist%/}
stale=0
if [ ! -f "$jar" ] || [ -z "$dist" ] || [ ! -x "$dist/bin/erg" ] || [ "${REBUILD:-0}" = 1 ]; then
  stale=1
elif [ -n "$(find pom.xml */pom.xml estimator/src/main cli/src/main dist/src/main -newer "$dist/bin/erg" -type f 2>/dev/null | head -1)" ]; then
  stale=1
fi
if [ "$stale" = 1 ]; then
  say "building $jar and the distribution"
  mvn -q -DskipTests package -pl dist -am
  dist=$(ls -d dist/target/erg-*/ | head -1); dist=${dist%/}
else
  say "reusing $jar and $dist"
fi
erg="$dist/bin/erg"
# The launcher makes its class-data archive on its first run; make it now, outside the timings.
"$erg" --version >/dev/null
# OnnxWriter, which writes the benchmark models, ships in the estimator's test-jar.
testjar=$(ls estimator/target/erg-estimator-*-tests.jar 2>/dev/null | head -1)
protobuf=$(ls "$dist"/lib/protobuf-java-*.jar | head -1)

# ---- timing ------------------------------------------------------------------------------------
declare -A wall cpu rss
# measure KEY CMD...: one run with stdout discarded; appends wall ms to wall[KEY], user + sys ms to
# cpu[KEY] and peak RSS KiB to rss[KEY]. A failed run stops the benchmark.
measure() {
  local key=$1; shift
  local tf="$work/time.txt" t0 t1 rc=0
  t0=$(date +%s%N)
  if [ "$have_time" = 1 ]; then
    /usr/bin/time -f '%U %S %M' -o "$tf" "$@" >/dev/null || rc=$?
  else
    "$@" >/dev/null || rc=$?
  fi
  t1=$(date +%s%N)
  if [ "$rc" != 0 ]; then say "failed (exit $rc): $*"; exit 1; fi
  wall[$key]+="$(( (t1 - t0) / 1000000 )) "
  if [ "$have_time" = 1 ]; then
    read -r u s m < <(tail -n 1 "$tf")
    cpu[$key]+="$(awk -v u="$u" -v s="$s" 'BEGIN { printf "%d", (u + s) * 1000 }') "
    rss[$key]+="$m "
  fi
  return 0
}
median() { tr ' ' '\n' <<<"$1" | grep -v '^$' | sort -n | awk '{a[NR]=$1} END {print a[int((NR+1)/2)]}'; }
sec() { awk -v m="$1" 'BEGIN { printf "%.3f", m / 1000 }'; }
mib() { awk -v k="$1" 'BEGIN { printf "%.0f", k / 1024 }'; }
ratio() { awk -v a="$1" -v b="$2" 'BEGIN { printf "%.2f", a / b }'; }
# The machine, for the report's first lines.
machine() {
  echo "$(nproc) cores, $(awk '/MemTotal/ { printf "%.0f GiB", $2 / 1048576 }' /proc/meminfo),"\
    "$(sed -n 's/^model name[[:space:]]*: //p' /proc/cpuinfo | head -1); $(java -version 2>&1 | head -1)"
  if [ "$have_py" = 1 ]; then echo "peer: python3 $("$py" -c 'import onnx, sys; print(sys.version.split()[0] + ", onnx " + onnx.__version__)')"; fi
}
