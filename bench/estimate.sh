#!/usr/bin/env bash
# How much does estimation add to analysis? A ResNet-50-sized graph, one warm JVM, medians.
#   bash bench/estimate.sh            # from anywhere; ROUNDS=601 for more rounds
set -euo pipefail
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$root"
jar=cli/target/erg.jar
work=bench/scratch
mkdir -p "$work/classes"
if [ ! -f "$jar" ] || [ -n "$(find estimator/src/main cli/src/main -newer "$jar" -type f | head -1)" ]; then
  mvn -q -DskipTests package -pl cli -am
fi
testjar=$(ls estimator/target/erg-estimator-*-tests.jar 2>/dev/null | head -1)
javac -d "$work/classes" -cp "$jar:$testjar" estimator/src/test/java/dev/erg/validation/ResNet50.java bench/src/EstimateOverhead.java
java -cp "$jar:$testjar:$work/classes" EstimateOverhead "$work" "${ROUNDS:-301}"
