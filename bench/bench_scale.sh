#!/usr/bin/env bash
# Peak backend memory of stress_inversion, fisher_mean and orientation_tensor
# over 1,000 groups at 10^6 and 10^7 rows (must agree within a few MB beyond
# what the built-in count(f) grows by in the same run), and
# their speed-up with 2 parallel workers beside the built-in sum's, in the same
# run (bench/scale_memory.py). STRIAE_SCALE_SMALL / STRIAE_SCALE_LARGE change
# the sizes.
set -euo pipefail
cd "$(dirname "$0")"
/usr/bin/python3 scale_memory.py --small "${STRIAE_SCALE_SMALL:-1000000}" --large "${STRIAE_SCALE_LARGE:-10000000}" \
  --check 4 --parallel
