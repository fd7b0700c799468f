#!/usr/bin/env bash
# Cold-start time of `termgate card` on the demo ontology (issue 2: at most 1.5 s median).
# Each run is a new JVM. Usage: src/test/bench-scripts/card-cold-start.sh [runs=9] [extra card arguments…]
# Prints every wall time and the median; the schema cache and the CDS archive are warmed by one untimed run,
# as they are for a user after the first start.
set -euo pipefail
cd "$(dirname "$0")/../../.."
runs="${1:-9}"
shift || true
[ -f target/termgate.jar ] || mvn -B -o -q -DskipTests package
./termgate card "$@" >/dev/null 2>&1   # builds the jar if stale, writes the CDS archive and the schema cache
times=()
for _ in $(seq "$runs"); do
  start=$(date +%s%N)
  ./termgate card "$@" >/dev/null 2>&1
  end=$(date +%s%N)
  times+=($(( (end - start) / 1000000 )))
done
sorted=($(printf '%s\n' "${times[@]}" | sort -n))
echo "termgate card $*: runs (ms): ${times[*]}"
echo "median: ${sorted[$(( runs / 2 ))]} ms over $runs runs; load average: $(cut -d' ' -f1-3 /proc/loadavg)"
