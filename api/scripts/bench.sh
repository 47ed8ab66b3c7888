#!/usr/bin/env bash
# `npm run bench`: ensures PostgreSQL, builds shared and api, then runs each benchmark listed in
# BENCHMARKS below (scripts in api/bench/, run with node from the checkout root; each prints its
# own results and exits non-zero when it fails).
# `npm run bench -- <word>...` runs only the benchmarks whose file name contains one of the words
# (e.g. `npm run bench -- import`); with no word, all of them.
set -euo pipefail
# shellcheck source=lib/env.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/env.sh"
cd "$STAVEMARK_ROOT"

# Add each benchmark here as it lands, e.g. "api/bench/marking-desk.mjs".
# The "no benchmarks yet" branch below is only for while this list is empty.
BENCHMARKS=("api/bench/class-import.mjs" "api/bench/marking-saves.mjs" "api/bench/results-at-scale.mjs")

if [ "$#" -gt 0 ]; then
  SELECTED=()
  for b in "${BENCHMARKS[@]}"; do
    for word in "$@"; do
      if [[ "$(basename "$b")" == *"$word"* ]]; then
        SELECTED+=("$b")
        break
      fi
    done
  done
  [ "${#SELECTED[@]}" -gt 0 ] || die "no benchmark in api/scripts/bench.sh matches: $*"
  BENCHMARKS=("${SELECTED[@]}")
fi

timed "npm packages" ensure_npm_packages
timed "PostgreSQL" bash "$STAVEMARK_SCRIPTS/pg.sh" start
for ws in shared api; do
  say "Building $ws"
  timed "build $ws" build_workspace "$ws" || die "the $ws build failed (output above)"
done

if [ "${#BENCHMARKS[@]}" = 0 ]; then
  print_timings
  echo
  echo "no benchmarks yet"
  exit 0
fi

FAILED=0
for b in "${BENCHMARKS[@]}"; do
  [ -f "$b" ] || die "benchmark $b is listed in api/scripts/bench.sh but does not exist"
  say "Benchmark $b"
  timed "bench $(basename "$b")" node "$b" || FAILED=$((FAILED + 1))
done
print_timings
[ "$FAILED" = 0 ] || die "$FAILED benchmark(s) failed"
