#!/usr/bin/env bash
# Load and query the invented Harrow Ridge district (demo/README.md), then write its
# outputs: CSV results, the per-domain table as CSV and GeoJSON, the figures of each
# site and the district page index.html. Runs inside scripts/with-cluster.sh (make demo).
#
# Environment (for tests; the defaults are the demo):
#   DEMO_OUT    output directory (default demo-out)
#   DEMO_SITES  comma-separated sites: a reduced district (default: all)
#   DEMO_DB     database to (re)create (default striae_demo)
#   DEMO_QUICK  1: skip the long tour of queries (demo/queries.sql)
set -euo pipefail
cd "$(dirname "$0")/.."
start=$(date +%s)
OUT="$(mkdir -p "${DEMO_OUT:-demo-out}" && cd "${DEMO_OUT:-demo-out}" && pwd)"
DB="${DEMO_DB:-striae_demo}"
gen_args=("$OUT")
[ -n "${DEMO_SITES:-}" ] && gen_args+=(--sites "$DEMO_SITES")
/usr/bin/python3 demo/generate.py "${gen_args[@]}"
dropdb --if-exists "$DB" >/dev/null 2>&1 || true
createdb "$DB"
export PGDATABASE="$DB"
psql -X -q -v ON_ERROR_STOP=1 <<SQL
CREATE EXTENSION striae;
CREATE TABLE mechanism (event_id text PRIMARY KEY, site text, depth_km float8, mechanism fault_slip);
CREATE TABLE field_fault (site text, station text, fault_as_written text);
CREATE TABLE bedding (site text, unit text, bedding plane);
CREATE TABLE lineation_obs (site text, unit text, lineation lineation);
CREATE TABLE stress_truth (site text PRIMARY KEY, sigma1 lineation, sigma3 lineation, shape_ratio float8,
                           older_sigma1 lineation, older_sigma3 lineation, older_shape_ratio float8);
CREATE TABLE fold_truth (site text PRIMARY KEY, fold_axis lineation);
CREATE TABLE site (site text PRIMARY KEY, lon float8, lat float8, setting text);
CREATE TABLE fault_slip_obs (site text, station text PRIMARY KEY, fault fault_slip, planted text,
                             map_unit text, age_class text, lon float8, lat float8);
CREATE TABLE focal_event (event_id text PRIMARY KEY, site text, depth_km float8, mechanism fault_slip, listed_plane text,
                          lon float8, lat float8);
\copy mechanism FROM '$OUT/mechanisms.csv' WITH (FORMAT csv, HEADER)
\copy field_fault FROM '$OUT/field_faults.csv' WITH (FORMAT csv, HEADER)
\copy bedding FROM '$OUT/bedding.csv' WITH (FORMAT csv, HEADER)
\copy lineation_obs FROM '$OUT/lineations.csv' WITH (FORMAT csv, HEADER)
\copy stress_truth FROM '$OUT/stress_truth.csv' WITH (FORMAT csv, HEADER)
\copy fold_truth FROM '$OUT/fold_truth.csv' WITH (FORMAT csv, HEADER)
\copy site FROM '$OUT/sites.csv' WITH (FORMAT csv, HEADER)
\copy fault_slip_obs FROM '$OUT/fault_slip_data.csv' WITH (FORMAT csv, HEADER)
\copy focal_event FROM '$OUT/stress_mechanisms.csv' WITH (FORMAT csv, HEADER)
SQL
if [ "${DEMO_QUICK:-0}" != 1 ]; then
  # queries.sql writes its CSV files under demo-out/ (\copy takes no variables)
  [ "$OUT" = "$PWD/demo-out" ] || { echo "demo/run.sh: the full tour writes to demo-out/ only (set DEMO_QUICK=1)" >&2; exit 2; }
  psql -X -v ON_ERROR_STOP=1 -f demo/queries.sql
fi
# The per-domain result, its CSV and its GeoJSON (the one step a GIS view may replace).
psql -X -v ON_ERROR_STOP=1 -f demo/domains.sql
psql -X -q -v ON_ERROR_STOP=1 -c "COPY domain_result TO STDOUT WITH (FORMAT csv, HEADER)" >"$OUT/domains.csv"
psql -X -q -v ON_ERROR_STOP=1 -c "COPY domain_recovery TO STDOUT WITH (FORMAT csv, HEADER)" >"$OUT/domain_recovery.csv"
psql -X -q -v ON_ERROR_STOP=1 -At -f scripts/report/domain_geojson.sql -o "$OUT/domains.geojson"
# The map layers through the GIS views (demo/gis.sql, PostGIS + striae_gis), read by
# GDAL's ogr2ogr over the server connection like any GIS client.
psql -X -v ON_ERROR_STOP=1 -f demo/gis.sql
pgconn="PG:dbname=$DB host=$PGHOST port=$PGPORT user=$PGUSER"
for layer in "domain_stress(geom):domain_points" "domain_stress(shmax_bar):shmax_bars" \
             "mechanism_symbols(compressional):mechanism_quadrants" "mechanism_symbols(disc):mechanism_discs"; do
  rm -f "$OUT/${layer##*:}.geojson"
  ogr2ogr -f GeoJSON "$OUT/${layer##*:}.geojson" "$pgconn" "${layer%:*}"
done
bash demo/figures.sh "$OUT"
/usr/bin/python3 demo/page.py "$OUT" "$(( $(date +%s) - start ))"
