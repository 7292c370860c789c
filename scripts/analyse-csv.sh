#!/usr/bin/env bash
# Analyse your own CSV of field faults or focal mechanisms, by group, in one command
# (README, "Your own data in one command"):
#
#   scripts/analyse-csv.sh FILE [--db CONNSTRING] [--out DIR] [--group COLUMN[,COLUMN...]]
#                               [--kind faults|mechanisms] [--resamples N] [--seed S]
#
# Without --db the analysis runs on a throwaway cluster (scripts/with-cluster.sh
# --install: dependencies installed if missing, striae built, the cluster removed
# afterwards); with --db CONNSTRING (a libpq connection string) in that database,
# which must have the striae extension, in temporary tables only. The file's structure
# is checked first, so a file that is not a CSV or lacks the needed columns fails
# before any server starts. Output: DIR (default FILE's name + "-striae"): domains.csv,
# domains.geojson (with lon/lat columns), data.csv, bad_rows.csv, figures/, index.html.
set -euo pipefail
ROOT="$(cd "$(dirname "$0")/.." && pwd)"
PY=/usr/bin/python3   # Debian's, with python3-psycopg
WORKER="$ROOT/scripts/report/analyse_csv.py"
[ -x "$PY" ] || { echo "analyse-csv: $PY is missing: run scripts/install-deps.sh as root" >&2; exit 1; }

"$PY" "$WORKER" --check-only "$@" || exit $?
for a in "$@"; do
  case "$a" in
    --db|--db=*) exec "$PY" "$WORKER" "$@" ;;
  esac
done
bash "$ROOT/scripts/install-deps.sh"
make -s -C "$ROOT" all >/dev/null
exec bash "$ROOT/scripts/with-cluster.sh" --install "$PY" "$WORKER" --create-extension "$@"
