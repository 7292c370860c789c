#!/usr/bin/env bash
# Load and query the invented Harrow Ridge scenario (demo/README.md). Runs
# inside scripts/with-cluster.sh; writes CSV results under demo-out/.
set -euo pipefail
cd "$(dirname "$0")/.."
OUT="$PWD/demo-out"
/usr/bin/python3 demo/generate.py "$OUT"
dropdb --if-exists striae_demo >/dev/null 2>&1 || true
createdb striae_demo
export PGDATABASE=striae_demo
psql -X -q -v ON_ERROR_STOP=1 <<SQL
CREATE EXTENSION striae;
CREATE TABLE mechanism (event_id text PRIMARY KEY, site text, depth_km float8, mechanism fault_slip);
CREATE TABLE field_fault (site text, station text, fault_as_written text);
CREATE TABLE bedding (site text, unit text, bedding plane);
CREATE TABLE lineation_obs (site text, unit text, lineation lineation);
CREATE TABLE stress_truth (site text PRIMARY KEY, sigma1 lineation, sigma3 lineation, shape_ratio float8,
                           older_sigma1 lineation, older_sigma3 lineation, older_shape_ratio float8);
CREATE TABLE fault_slip_obs (site text, station text PRIMARY KEY, fault fault_slip, planted text);
CREATE TABLE focal_event (event_id text PRIMARY KEY, site text, depth_km float8, mechanism fault_slip, listed_plane text);
\copy mechanism FROM '$OUT/mechanisms.csv' WITH (FORMAT csv, HEADER)
\copy field_fault FROM '$OUT/field_faults.csv' WITH (FORMAT csv, HEADER)
\copy bedding FROM '$OUT/bedding.csv' WITH (FORMAT csv, HEADER)
\copy lineation_obs FROM '$OUT/lineations.csv' WITH (FORMAT csv, HEADER)
\copy stress_truth FROM '$OUT/stress_truth.csv' WITH (FORMAT csv, HEADER)
\copy fault_slip_obs FROM '$OUT/fault_slip_data.csv' WITH (FORMAT csv, HEADER)
\copy focal_event FROM '$OUT/stress_mechanisms.csv' WITH (FORMAT csv, HEADER)
SQL
psql -X -v ON_ERROR_STOP=1 -f demo/queries.sql
echo "results written to $OUT/"
ls "$OUT"
bash demo/figures.sh
