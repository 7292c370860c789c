#!/usr/bin/env bash
# Short form of bench/bench_scale.sh: a GROUP BY with 1,000 groups over 10^5
# and over 10^6 fault-slip rows; stress_inversion, fisher_mean and
# orientation_tensor must reach the same peak backend memory within 4 MB,
# beyond what the built-in count(f) grows by in the same run (their state per
# group is fixed, whatever the row count). Reference: the
# kernel's own accounting of the backend's private memory (/proc/<pid>/status).
set -euo pipefail
cd "$(dirname "$0")/../../bench"
/usr/bin/python3 scale_memory.py --small 100000 --large 1000000 --check 4
