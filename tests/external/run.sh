#!/usr/bin/env bash
# Checks against outside references, run inside a throwaway cluster
# (scripts/with-cluster.sh sets PGHOST/PGPORT/PGUSER). Each check names its
# source in its own file. Debian's python3 is used (it has python3-numpy).
set -euo pipefail
cd "$(dirname "$0")"
PY=/usr/bin/python3
pass=0
fail=0
for t in check_*; do
  [ -e "$t" ] || continue
  echo "== external: $t"
  if [[ "$t" == *.py ]]; then cmd=("$PY" "$t"); else cmd=(bash "$t"); fi
  if "${cmd[@]}"; then pass=$((pass + 1)); else fail=$((fail + 1)); echo "FAILED: $t"; fi
done
echo "external: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
