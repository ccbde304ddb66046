#!/usr/bin/env bash
# Speed of a sweep: the 20 × 12 pressure × voltage sweep of the example design with the full
# model, on 1 and 2 workers (go test -bench), and the speed-up of 2 workers over 1.
#
#   bench/sweep.sh [extra go test flags, e.g. -count 3]
set -euo pipefail
cd "$(dirname "$0")/.."
out=$(go test -run '^$' -bench 'BenchmarkSweep20x12' -benchtime 1x "$@" ./kinetics/study | tee /dev/stderr)
awk '
/workers=1/ { one = $3 }
/workers=2/ { two = $3 }
END {
	if (one && two) printf "1 worker %.1f s, 2 workers %.1f s, speed-up %.2f×\n", one/1e9, two/1e9, one/two
}' <<<"$out"
