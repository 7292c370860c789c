#!/usr/bin/env bash
# Benchmarks: each prints a ratio against a baseline measured in the same
# session on the same data. Runs inside scripts/with-cluster.sh.
set -euo pipefail
cd "$(dirname "$0")"
export STRIAE_BENCH_ROWS="${STRIAE_BENCH_ROWS:-1000000}"
for b in bench_*.sh; do
  echo "== bench: $b"
  bash "$b"
done
