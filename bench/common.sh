# Shared by the benchmark scripts (sourced, not run): the repository root, the scratch folder, the
# CLI jar rebuilt when stale, and GNU time for CPU time and peak RSS.
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$root"
work=bench/scratch
jar=cli/target/erg.jar
mkdir -p "$work/classes"

say() { printf '%s\n' "$*" >&2; }

# ---- tools -------------------------------------------------------------------------------------
if [ ! -x /usr/bin/time ]; then
  say "installing GNU time (Debian package 'time') for CPU time and peak RSS"
  if command -v apt-get >/dev/null 2>&1; then
    (apt-get install -y -qq time >/dev/null 2>&1 || { apt-get update -qq >/dev/null 2>&1 && apt-get install -y -qq time >/dev/null 2>&1; }) \
      || say "could not install GNU time: CPU time and peak RSS will be left out"
  fi
fi
have_time=0; [ -x /usr/bin/time ] && have_time=1

# ---- build -------------------------------------------------------------------------------------
stale=0
if [ ! -f "$jar" ] || [ "${REBUILD:-0}" = 1 ]; then
  stale=1
elif [ -n "$(find pom.xml estimator/pom.xml cli/pom.xml estimator/src/main cli/src/main -newer "$jar" -type f 2>/dev/null | head -1)" ]; then
  stale=1
fi
if [ "$stale" = 1 ]; then
  say "building $jar"
  mvn -q -DskipTests package -pl cli -am
else
  say "reusing $jar"
fi
# OnnxWriter, which writes the benchmark models, ships in the estimator's test-jar.
testjar=$(ls estimator/target/erg-estimator-*-tests.jar 2>/dev/null | head -1)
